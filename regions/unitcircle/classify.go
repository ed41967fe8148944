package unitcircle

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// farLimit is the largest 1/|z| of a root taken to be on its way to
// infinity. Bisection onto an edge where the leading coefficient vanishes
// leaves that root beyond about 1e10; a root of a million is merely fast
// and outside.
const farLimit = 1e-6

// Classify implements stability.Test by what changes between a and b, the
// two ends of a bisection across an edge: a real root passes through
// z = 1 exactly when P(1) changes sign (Real, ω = 0), through z = −1
// exactly when P(−1) does (Alternating, ω = π/T), and to infinity when
// the leading coefficient does; these signs are exact for coefficients
// formed exactly, so rounding cannot make them up. Otherwise, and when a
// and b are one point on the edge, the point halfway is classified by its
// roots (classifyAt).
func (t Test) Classify(a, b stability.Function) stability.Crossing {
	checkFunction(a)
	checkFunction(b)
	t.check()
	at := func(c poly.Poly, k int) float64 {
		if k < len(c) {
			return c[k]
		}
		return 0
	}
	n := max(len(a.P), len(b.P))
	mid := make(poly.Poly, n)
	for k := range mid {
		mid[k] = 0.5 * (at(a.P, k) + at(b.P, k))
	}
	changes := func(u, v float64) bool { return u*v < 0 || (u == 0) != (v == 0) }
	top := n - 1
	for top > 0 && at(a.P, top) == 0 && at(b.P, top) == 0 {
		top--
	}
	switch {
	case changes(a.P.EvalReal(1), b.P.EvalReal(1)):
		return stability.Crossing{Kind: stability.Real, Omega: 0}
	case changes(a.P.EvalReal(-1), b.P.EvalReal(-1)):
		return stability.Crossing{Kind: stability.Alternating, Omega: math.Pi / t.T}
	case top > 0 && changes(at(a.P, top), at(b.P, top)):
		return stability.Crossing{Kind: stability.Infinite, Omega: math.NaN()}
	}
	return t.classifyAt(stability.Function{P: mid})
}

// classifyAt classifies a polynomial that lies on an edge of a stability
// map to within rounding. It finds the roots of P (gonum
// eigenvalues of the companion matrix, the nearest one polished by
// Newton's method on P) and names the crossing after the root nearest the
// circle, the distance of a root z being |ln|z||:
//
//   - a real root near z = 1 is Real (ω = 0),
//   - a real root near z = −1 is Alternating (ω = π/T),
//   - a complex pair near e^(±jθ) is Complex (ω = θ/T, θ ∈ (0, π)),
//
// unless the leading coefficient is exactly zero or a root is nearer
// infinity than any root is to the circle (1/|z| below farLimit and below
// every distance to the circle): then the kind is Infinite (ω = NaN), a
// loop without causal solution (see the package comment). A constant
// polynomial has no crossing (None).
func (t Test) classifyAt(f stability.Function) stability.Crossing {
	none := stability.Crossing{Kind: stability.None, Omega: math.NaN()}
	infinite := stability.Crossing{Kind: stability.Infinite, Omega: math.NaN()}
	p := f.P.Trim(0)
	if len(p) <= 1 {
		if len(f.P) > 1 && len(p) == 1 {
			return infinite
		}
		return none
	}
	if len(p) < len(f.P) {
		return infinite
	}
	roots, err := p.Roots()
	if err != nil {
		return none
	}
	best, bestDist, far := -1, math.Inf(1), math.Inf(1)
	for i, r := range roots {
		m := cmplx.Abs(r)
		if m == 0 {
			continue
		}
		far = math.Min(far, 1/m)
		if d := math.Abs(math.Log(m)); d < bestDist {
			best, bestDist = i, d
		}
	}
	if best < 0 {
		return none
	}
	if far < farLimit && far < bestDist {
		return infinite
	}
	r := roots[best]
	if imag(r) == 0 {
		// The eigenvalue solver returns real roots with zero imaginary part
		// exactly; Newton's method on the real polynomial keeps them real.
		if p.PolishReal(real(r)) > 0 {
			return stability.Crossing{Kind: stability.Real, Omega: 0}
		}
		return stability.Crossing{Kind: stability.Alternating, Omega: math.Pi / t.T}
	}
	theta := math.Abs(cmplx.Phase(p.Polish(r)))
	return stability.Crossing{Kind: stability.Complex, Omega: theta / t.T}
}
