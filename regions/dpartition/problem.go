package dpartition

import (
	"fmt"
	"math"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Bilinear is a polynomial in s whose coefficients depend bilinearly on the
// two axis parameters x and y:
//
//	A(s) + x·B(s) + y·C(s) + x·y·E(s),
//
// every part in ascending coefficients. A part may be empty. Pe = 0 (and
// Qe = 0) is the affine case: gains and gain-like parameters.
type Bilinear struct {
	A, B, C, E poly.Poly
}

// At returns the polynomial at (x, y).
func (b Bilinear) At(x, y float64) poly.Poly {
	n := max(len(b.A), len(b.B), len(b.C), len(b.E))
	p := make(poly.Poly, n)
	for k := range p {
		p[k] = coef(b.A, k) + x*coef(b.B, k) + y*coef(b.C, k) + x*y*coef(b.E, k)
	}
	return p
}

// degree returns the highest power with a non-zero coefficient in any
// part, or -1 when every part is zero.
func (b Bilinear) degree() int {
	return max(b.A.Degree(), b.B.Degree(), b.C.Degree(), b.E.Degree())
}

// coefficient returns the coefficient of s^k as a bilinear function of
// (x, y).
func (b Bilinear) coefficient(k int) conic {
	return conic{coef(b.A, k), coef(b.B, k), coef(b.C, k), coef(b.E, k)}
}

func (b Bilinear) parts() [4]poly.Poly { return [4]poly.Poly{b.A, b.B, b.C, b.E} }

func (b Bilinear) finite() bool {
	return b.A.Finite() && b.B.Finite() && b.C.Finite() && b.E.Finite()
}

func coef(p poly.Poly, k int) float64 {
	if k < len(p) {
		return p[k]
	}
	return 0
}

// Range is the closed interval [Min, Max] of one parameter.
type Range struct {
	Min, Max float64
}

// Span returns Max − Min.
func (r Range) Span() float64 { return r.Max - r.Min }

func (r Range) valid() bool {
	return r.Min < r.Max && !math.IsInf(r.Min, 0) && !math.IsInf(r.Max, 0) &&
		!math.IsInf(r.Max-r.Min, 0)
}

// Problem is the characteristic function of a loop in the plane of two
// parameters,
//
//	Δ(s; x, y) = P(s; x, y) + Q(s; x, y)·e^(−Delay·s),
//
// over the window X × Y. A loop without dead time has Q zero (or Delay
// zero, when P + Q is taken as its polynomial).
type Problem struct {
	P, Q  Bilinear
	Delay float64
	X, Y  Range
}

// Function returns Δ at one point of the plane, for a stability.Test.
func (p Problem) Function(x, y float64) stability.Function {
	if p.rational() {
		return stability.Function{P: poly.Add(p.P.At(x, y), p.Q.At(x, y))}
	}
	return stability.Function{P: p.P.At(x, y), Q: p.Q.At(x, y), Delay: p.Delay}
}

// rational reports whether Δ is a polynomial: no delay, or no delayed part.
func (p Problem) rational() bool { return p.Delay == 0 || p.Q.degree() < 0 }

// InputError reports a problem the tracer cannot take, with the part of
// the input at fault.
type InputError struct {
	// Field names the input, e.g. "X" or "Delay".
	Field string
	// Value is the offending value as written in the input.
	Value string
	// Reason says what is wrong with it.
	Reason string
}

// Error implements error.
func (e *InputError) Error() string {
	return fmt.Sprintf("dpartition: %s = %s: %s", e.Field, e.Value, e.Reason)
}

func rangeError(field string, r Range) error {
	return &InputError{field, fmt.Sprintf("[%g, %g]", r.Min, r.Max), "the window side must be finite with Min < Max"}
}

// normalized checks p and returns it with the delayed part folded into P
// when there is no delay, so that later code sees one of two shapes: a
// rational loop (Q zero, Delay zero) or a retarded or neutral delay loop.
func (p Problem) normalized() (Problem, error) {
	if !p.X.valid() {
		return p, rangeError("X", p.X)
	}
	if !p.Y.valid() {
		return p, rangeError("Y", p.Y)
	}
	if math.IsNaN(p.Delay) || math.IsInf(p.Delay, 0) || p.Delay < 0 {
		return p, &InputError{"Delay", fmt.Sprint(p.Delay), "the dead time must be finite and not negative"}
	}
	if !p.P.finite() || !p.Q.finite() {
		return p, &InputError{"P, Q", "coefficients", "every coefficient must be a finite number"}
	}
	if p.rational() {
		p.P = Bilinear{poly.Add(p.P.A, p.Q.A), poly.Add(p.P.B, p.Q.B), poly.Add(p.P.C, p.Q.C), poly.Add(p.P.E, p.Q.E)}
		p.Q, p.Delay = Bilinear{}, 0
	}
	n, m := p.P.degree(), p.Q.degree()
	if n < 0 {
		return p, &InputError{"P", "0", "the delay-free part is zero"}
	}
	if m > n {
		return p, &InputError{"Q", fmt.Sprintf("degree %d", m), fmt.Sprintf("the delayed part has a higher degree than the delay-free part (%d): an advanced-type loop has infinitely many unstable roots", n)}
	}
	return p, nil
}

// Side says on which side of a curve, looking along its points in order,
// the loop has fewer roots in the open right half plane.
type Side int8

// The sides.
const (
	// SideUnknown: the side could not be decided (a degenerate point, such
	// as a double root on the boundary).
	SideUnknown Side = iota
	// Left of the direction of travel.
	Left
	// Right of the direction of travel.
	Right
)

// String names the side for reports.
func (s Side) String() string {
	switch s {
	case Left:
		return "left"
	case Right:
		return "right"
	}
	return "unknown"
}

// sideOf returns Left for a positive value, Right for a negative one.
func sideOf(v float64) Side {
	switch {
	case v > 0:
		return Left
	case v < 0:
		return Right
	}
	return SideUnknown
}

// Unbounded is the Change of a neutral-type edge, across which infinitely
// many roots cross at once.
const Unbounded = math.MaxInt32

// Point is one point of an edge curve: the parameter values and the
// frequency ω (rad/s) of the boundary roots there: 0 on a Real edge, NaN
// on an Infinite edge. A Complex curve that ends where ω → ∞ has Omega
// +Inf at that end.
type Point struct {
	X, Y, Omega float64
}

// Curve is one edge inside the window: a polyline of one kind.
type Curve struct {
	Kind   stability.Kind
	Points []Point
	// Fewer is the side, looking along Points in order, with fewer roots
	// in the open right half plane. The points of a Complex curve are in
	// increasing ω, so this is Šiljak's rule.
	Fewer Side
	// Change is the number of roots that cross: 2 on a Complex curve, 1 on
	// a Real or Infinite one, Unbounded on a neutral-type edge, 0 when it
	// cannot be decided.
	Change int
	// Branch numbers the branches of a delay loop's complex edge: the
	// points of branch k have 2πk ≤ ωL ≤ 2π(k+1), a curve being cut where
	// ωL passes a multiple of 2π so that the cut point ends one branch and
	// starts the next. It is 0 for every other curve.
	Branch int
}

// Options tunes the tracer; the zero value gives the defaults.
type Options struct {
	// Chord bounds the distance between a polyline and its curve, in
	// window coordinates where each side has length 1 (so the diagonal is
	// √2). Zero means DefaultChord.
	Chord float64
	// MaxBranches caps the sweep of a delay loop when no frequency bound
	// exists (a neutral-type edge, or a vanishing leading coefficient,
	// inside the window): ωL stops at 2π·MaxBranches. Zero means
	// DefaultMaxBranches.
	MaxBranches int
}

// Defaults for Options.
const (
	DefaultChord       = 1e-3 * math.Sqrt2
	DefaultMaxBranches = 64
)

func (o Options) chord() float64 {
	if o.Chord > 0 {
		return o.Chord
	}
	return DefaultChord
}

func (o Options) maxBranches() int {
	if o.MaxBranches > 0 {
		return o.MaxBranches
	}
	return DefaultMaxBranches
}

// Result is every edge of a problem inside its window.
type Result struct {
	// Curves holds the Real edges first, then the Infinite ones, then the
	// Complex ones in increasing ω of their first points.
	Curves []Curve
	// OmegaMax is the frequency above which no complex edge can meet the
	// window: +Inf for a rational loop, whose curves are followed to
	// ω → ∞; for a delay loop the bound the sweep stopped at.
	OmegaMax float64
	// Complete is false when a delay loop had no frequency bound and the
	// sweep stopped at Options.MaxBranches branches: edges at higher
	// frequencies are missing.
	Complete bool
}

// Times returns the bilinear polynomial b·p: each part multiplied by p.
func (b Bilinear) Times(p poly.Poly) Bilinear {
	mul := func(q poly.Poly) poly.Poly {
		if q.Degree() < 0 {
			return nil
		}
		return poly.Mul(q, p)
	}
	return Bilinear{mul(b.A), mul(b.B), mul(b.C), mul(b.E)}
}

// FeedbackLoop returns the problem of the unity negative-feedback loop
// around the plant N(s)·e^(−Ls)/D(s) and a controller Nc/Dc whose
// coefficients are bilinear in the axis parameters (as family.Split gives
// them): P = Dc·D and Q = Nc·N, or P = Dc·D + Nc·N without delay. The
// products are formed exactly, part by part.
func FeedbackLoop(ctrlNum, ctrlDen Bilinear, plantNum, plantDen poly.Poly, delay float64, x, y Range) Problem {
	p, q := ctrlDen.Times(plantDen), ctrlNum.Times(plantNum)
	if delay == 0 {
		return Problem{P: Bilinear{poly.Add(p.A, q.A), poly.Add(p.B, q.B), poly.Add(p.C, q.C), poly.Add(p.E, q.E)}, X: x, Y: y}
	}
	return Problem{P: p, Q: q, Delay: delay, X: x, Y: y}
}
