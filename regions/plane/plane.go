// Package plane sets up a two-parameter view of a loop: which controller
// parameters are the axes, the values of the others, and the closed-loop
// characteristic polynomial written as an exact function of the two axis
// values.
package plane

import (
	"fmt"

	"gainscape/regions/family"
	"gainscape/regions/poly"
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

// Loop is a plant N/D under a controller family with parameter values.
type Loop struct {
	PlantNum, PlantDen poly.Poly
	Family             family.Family
	Values             []float64 // one per Family.Params(), in order
}

// Characteristic returns the closed-loop characteristic polynomial at the
// loop's parameter values, without leading coefficients that are exactly
// zero: a structure that lacks a term (an ideal derivative, tau = 0) has a
// lower degree, not a root at infinity.
func (l Loop) Characteristic() poly.Poly {
	cn, cd := family.Controller(l.Family, l.Values)
	return family.Characteristic(l.PlantNum, l.PlantDen, cn, cd).Trim(0)
}

// With returns a copy of l whose parameters xi and yi are set to x and y.
func (l Loop) With(xi int, x float64, yi int, y float64) Loop {
	v := append([]float64(nil), l.Values...)
	v[xi], v[yi] = x, y
	l.Values = v
	return l
}

// Setup is a loop viewed in the plane of two of its controller parameters.
type Setup struct {
	Loop
	X, Y           Axis
	XIndex, YIndex int // positions of X.Param and Y.Param in Family.Params()
}

// NewSetup checks that the axis parameters exist and differ, and returns the
// setup. values gives every parameter's value; those of the axes are ignored.
func NewSetup(l Loop, x, y Axis) (Setup, error) {
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
	if len(l.Values) != len(l.Family.Params()) {
		return Setup{}, fmt.Errorf("%d parameter values for controller %q with %d parameters", len(l.Values), l.Family.Name(), len(l.Family.Params()))
	}
	return Setup{Loop: l, X: x, Y: y, XIndex: xi, YIndex: yi}, nil
}

// Pencil is the characteristic polynomial as an exact function of the two
// axis values: p(s; x, y) = A(s) + x·B(s) + y·C(s) + x·y·E(s).
// All four share one length, the largest degree plus one.
type Pencil struct {
	A, B, C, E poly.Poly
}

// Pencil returns the characteristic polynomial of the setup as a Pencil.
// Because every family's characteristic polynomial is affine in each
// parameter alone (the family.Family contract), evaluating it at the four
// corners (0,0), (1,0), (0,1), (1,1) determines A, B, C and E exactly up
// to rounding.
func (s Setup) Pencil() Pencil {
	at := func(x, y float64) poly.Poly { return s.With(s.XIndex, x, s.YIndex, y).Characteristic() }
	p00, p10, p01, p11 := at(0, 0), at(1, 0), at(0, 1), at(1, 1)
	n := max(len(p00), len(p10), len(p01), len(p11))
	pad := func(p poly.Poly) poly.Poly { q := make(poly.Poly, n); copy(q, p); return q }
	p00, p10, p01, p11 = pad(p00), pad(p10), pad(p01), pad(p11)
	pc := Pencil{A: p00, B: make(poly.Poly, n), C: make(poly.Poly, n), E: make(poly.Poly, n)}
	for k := 0; k < n; k++ {
		pc.B[k] = p10[k] - p00[k]
		pc.C[k] = p01[k] - p00[k]
		pc.E[k] = p11[k] - p10[k] - p01[k] + p00[k]
	}
	return pc
}

// Len returns the number of coefficients of the pencil's polynomials.
func (p Pencil) Len() int { return len(p.A) }

// EvalInto writes the characteristic polynomial at (x, y) into dst, which
// must have length p.Len(), and returns it. It does not allocate.
func (p Pencil) EvalInto(dst poly.Poly, x, y float64) poly.Poly {
	xy := x * y
	for k := range dst {
		dst[k] = p.A[k] + x*p.B[k] + y*p.C[k] + xy*p.E[k]
	}
	return dst
}

// Eval returns the characteristic polynomial at (x, y).
func (p Pencil) Eval(x, y float64) poly.Poly {
	return p.EvalInto(make(poly.Poly, p.Len()), x, y)
}
