// Package plane sets up a two-parameter view of a loop: which controller
// parameters are the axes, the values of the others, and the closed-loop
// characteristic function and open loop written as exact functions of the
// two axis values, built once for a whole map.
package plane

import (
	"fmt"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Axis is one parameter swept over [Min, Max] in N equally spaced nodes.
type Axis struct {
	Param string  `json:"param"`
	Min   float64 `json:"min"`
	Max   float64 `json:"max"`
	N     int     `json:"n"`
}

// At returns node i: Min + i·(Max−Min)/(N−1).
func (a Axis) At(i int) float64 {
	return a.Min + float64(i)*(a.Max-a.Min)/float64(a.N-1)
}

// Span returns Max − Min.
func (a Axis) Span() float64 { return a.Max - a.Min }

// Setup is a loop viewed in the plane of two of its controller
// parameters, with its characteristic function and open loop as exact
// functions of the two axis values.
type Setup struct {
	loop.Loop
	X, Y           Axis
	XIndex, YIndex int // positions of X.Param and Y.Param in Family.Params()
	// Char is the characteristic polynomial Dc·D + Nc·N over the plane.
	Char Pencil
	// OpenNum and OpenDen are the open-loop numerator Nc·N and
	// denominator Dc·D over the plane.
	OpenNum, OpenDen Pencil
	test             stability.Test
}

// NewSetup checks that the axis parameters exist and differ, and returns
// the setup with its pencils built. l gives every parameter's value; those
// of the axes are ignored.
func NewSetup(l loop.Loop, x, y Axis) (Setup, error) {
	xi, err := family.Index(l.Family, x.Param)
	if err != nil {
		return Setup{}, err
	}
	yi, err := family.Index(l.Family, y.Param)
	if err != nil {
		return Setup{}, err
	}
	if xi == yi {
		return Setup{}, fmt.Errorf("both axes sweep %q; choose two different parameters", x.Param)
	}
	if err := l.Check(); err != nil {
		return Setup{}, err
	}
	s := Setup{Loop: l, X: x, Y: y, XIndex: xi, YIndex: yi, test: l.Test()}
	s.OpenNum, s.OpenDen, s.Char = build(l, xi, yi)
	return s, nil
}

// Test returns the stability test of the setup's loop.
func (s Setup) Test() stability.Test { return s.test }

// NewCounter returns a stability counter sized for the setup, for one
// goroutine.
func (s Setup) NewCounter() stability.Counter { return s.test.NewCounter(s.Len()) }

// Scratch holds one goroutine's coefficient buffers for evaluating a setup
// at points of its plane.
type Scratch struct {
	p, num, den poly.Poly
}

// NewScratch returns buffers sized for s.
func (s Setup) NewScratch() *Scratch {
	return &Scratch{p: make(poly.Poly, s.Char.Len()), num: make(poly.Poly, s.OpenNum.Len()), den: make(poly.Poly, s.OpenDen.Len())}
}

// Function returns the characteristic function at (x, y) in sc's
// buffers, valid until sc is used again: the characteristic polynomial,
// or for a loop with dead time P = Dc·D and Q = Nc·N of
// Δ(s) = P(s) + Q(s)·e^(−Ls). It does not allocate.
func (s Setup) Function(sc *Scratch, x, y float64) stability.Function {
	if L := s.Plant.Delay; L > 0 {
		return stability.Function{P: s.OpenDen.EvalInto(sc.den, x, y), Q: s.OpenNum.EvalInto(sc.num, x, y), Delay: L}
	}
	return stability.Function{P: s.Char.EvalInto(sc.p, x, y)}
}

// Len returns the largest number of coefficients of a polynomial the
// setup's functions hold, for sizing counters and graders.
func (s Setup) Len() int { return max(s.Char.Len(), s.OpenNum.Len(), s.OpenDen.Len()) }

// OpenLoop returns the open-loop numerator and denominator at (x, y) in
// sc's buffers, without leading coefficients that are exactly zero (such
// as the s² coefficient of an ideal PID's denominator). It does not
// allocate.
func (s Setup) OpenLoop(sc *Scratch, x, y float64) (num, den poly.Poly) {
	return s.OpenNum.EvalInto(sc.num, x, y).Trim(0), s.OpenDen.EvalInto(sc.den, x, y).Trim(0)
}

// At returns the loop at (x, y) of the plane.
func (s Setup) At(x, y float64) loop.Loop { return s.With(s.XIndex, x, s.YIndex, y) }

// Pencil is a polynomial as an exact function of the two axis values:
// p(s; x, y) = A(s) + x·B(s) + y·C(s) + x·y·E(s). All four share one
// length.
type Pencil struct {
	A, B, C, E poly.Poly
}

// build writes the open loop Nc·N, Dc·D and the characteristic
// polynomial Dc·D + Nc·N of l as Pencils over parameters xi and yi. Every
// coefficient of a controller is a multi-affine form of its parameters
// (family.Form), so family.Split writes Nc and Dc exactly as
// A + x·B + y·C + x·y·E, each term multiplied only by the fixed values it
// contains; each part is then multiplied by the plant polynomial, so no
// coefficient is formed by differencing evaluations and a small plant
// gain keeps all its digits. With xi = yi the result is a line A + x·B
// along one parameter (C and E are zero).
func build(l loop.Loop, xi, yi int) (num, den, char Pencil) {
	tf := l.Family.Transfer()
	na, nb, nc, ne := family.Split(tf.Num, l.Values, xi, yi)
	da, db, dc, de := family.Split(tf.Den, l.Values, xi, yi)
	times := func(a, b, c, e, plant poly.Poly) Pencil {
		return Pencil{A: poly.Mul(a, plant), B: poly.Mul(b, plant), C: poly.Mul(c, plant), E: poly.Mul(e, plant)}
	}
	num = times(na, nb, nc, ne, l.Plant.Num)
	den = times(da, db, dc, de, l.Plant.Den)
	char = Pencil{A: poly.Add(den.A, num.A), B: poly.Add(den.B, num.B), C: poly.Add(den.C, num.C), E: poly.Add(den.E, num.E)}
	return num.trimmed(), den.trimmed(), char.trimmed()
}

// trimmed pads the four parts to one length and drops top coefficients
// that are exactly zero in all four: a structure that lacks a term (an
// ideal derivative) simply has a lower degree.
func (p Pencil) trimmed() Pencil {
	n := max(len(p.A), len(p.B), len(p.C), len(p.E))
	pad := func(q poly.Poly) poly.Poly { r := make(poly.Poly, n); copy(r, q); return r }
	p = Pencil{A: pad(p.A), B: pad(p.B), C: pad(p.C), E: pad(p.E)}
	for n > 0 && p.A[n-1] == 0 && p.B[n-1] == 0 && p.C[n-1] == 0 && p.E[n-1] == 0 {
		n--
	}
	return Pencil{A: p.A[:n], B: p.B[:n], C: p.C[:n], E: p.E[:n]}
}

// Line is the characteristic polynomial along one parameter k with every
// other parameter fixed: p(s; k) = A(s) + k·B(s), A and B of one length.
type Line struct {
	A, B poly.Poly
}

// NewLine returns the characteristic polynomial of l along parameter
// param, formed exactly as the setups' pencils are.
func NewLine(l loop.Loop, param int) Line {
	_, _, pc := build(l, param, param)
	return Line{A: pc.A, B: pc.B}
}

// NewOpenLines returns the open-loop numerator Nc·N and denominator Dc·D
// of l along parameter param, formed exactly as NewLine forms the
// characteristic polynomial: the parts of a loop with dead time,
// Δ(s; k) = Dc·D + Nc·N·e^(−Ls).
func NewOpenLines(l loop.Loop, param int) (num, den Line) {
	pn, pd, _ := build(l, param, param)
	return Line{A: pn.A, B: pn.B}, Line{A: pd.A, B: pd.B}
}

// Len returns the number of coefficients of the pencil's polynomials.
func (p Pencil) Len() int { return len(p.A) }

// EvalInto writes the polynomial at (x, y) into dst, which must have
// length p.Len(), and returns it. It does not allocate.
func (p Pencil) EvalInto(dst poly.Poly, x, y float64) poly.Poly {
	xy := x * y
	for k := range dst {
		dst[k] = p.A[k] + x*p.B[k] + y*p.C[k] + xy*p.E[k]
	}
	return dst
}

// Eval returns the polynomial at (x, y).
func (p Pencil) Eval(x, y float64) poly.Poly {
	return p.EvalInto(make(poly.Poly, p.Len()), x, y)
}
