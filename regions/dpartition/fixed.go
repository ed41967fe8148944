package dpartition

import (
	"math"

	"gainscape/regions/stability"
)

// fixedCurves returns the arcs of the conic edge = 0 inside the window as
// curves of one kind and frequency. The side of fewer unstable roots comes
// from other, a second bilinear function that says where the crossing
// roots go: on every such edge the roots cross into the left half plane
// on the side where the derivative of edge along the normal, times other,
// is positive (each case is derived where it is called). Arcs are cut
// where other vanishes, since the side changes there.
func (w window) fixedCurves(edge, other conic, omega float64, kind stability.Kind, change, branch int, tol float64) []Curve {
	var out []Curve
	for _, a := range w.arcs(edge, other, omega, tol) {
		i := len(a) / 2
		j := max(i-1, 0)
		if i == j {
			i = min(j+1, len(a)-1)
		}
		// The tangent along the arc and its left normal (−t_y, t_x).
		tx, ty := a[i].X-a[j].X, a[i].Y-a[j].Y
		m := midpoint(a[i], a[j])
		gx, gy := edge.gradient(m.X, m.Y)
		v := (-gx*ty + gy*tx) * other.at(m.X, m.Y)
		c := change
		side := sideOf(v)
		if side == SideUnknown {
			c = 0
		}
		out = append(out, Curve{Kind: kind, Points: a, Fewer: side, Change: c, Branch: branch})
	}
	return out
}

// fixedEdges returns the edges that do not depend on ω.
//
// Real: Δ(0; x, y) = 0. Near it a real root is s ≈ −Δ(0)/Δ'(0), with
// Δ'(0) = dΔ/ds at s = 0, so the root lies in the left half plane on the
// side where Δ(0) has the sign of Δ'(0). One root crosses.
//
// Infinite, retarded or rational loop (deg Q < n = deg P): p_n(x, y) = 0,
// the leading coefficient of the delay-free part. Near it the large root
// is s ≈ −p_(n−1)/p_n, in the left half plane where p_n has the sign of
// p_(n−1). One root crosses; for a delay loop this holds when
// deg Q ≤ n − 2 (the delayed part is negligible beside p_(n−1)·s^(n−1)
// where the root is, far in the right half plane); with deg Q = n − 1 the
// loop turns neutral there and the count change is not stated (Change 0).
//
// Infinite, neutral loop (deg Q = n): a chain of roots lies asymptotically
// at Re s = ln|q_n/p_n|/L, so infinitely many roots cross where
// |q_n/p_n| = 1, i.e. on p_n − q_n = 0 and on p_n + q_n = 0; the side with
// |p_n| > |q_n| has fewer. On p_n ∓ q_n = 0 the derivative of
// p_n² − q_n² along the normal is that of p_n ∓ q_n times p_n ± q_n.
// There p_n = 0 alone is no edge: the loop is of advanced type on both
// sides.
func (w window) fixedEdges(pr Problem, tol float64) []Curve {
	zero := pr.P.coefficient(0).add(pr.Q.coefficient(0))
	slope := pr.P.coefficient(1).add(pr.Q.coefficient(1)).add(pr.Q.coefficient(0).scale(-pr.Delay))
	out := w.fixedCurves(zero, slope, 0, stability.Real, 1, 0, tol)
	n := pr.P.degree()
	if n < 1 {
		return out
	}
	pn, qn := pr.P.coefficient(n), pr.Q.coefficient(n)
	nan := math.NaN()
	switch m := pr.Q.degree(); {
	case m == n:
		out = append(out, w.fixedCurves(pn.add(qn.scale(-1)), pn.add(qn), nan, stability.Infinite, Unbounded, 0, tol)...)
		out = append(out, w.fixedCurves(pn.add(qn), pn.add(qn.scale(-1)), nan, stability.Infinite, Unbounded, 0, tol)...)
	default:
		change := 1
		if m == n-1 {
			change = 0
		}
		cs := w.fixedCurves(pn, pr.P.coefficient(n-1), nan, stability.Infinite, change, 0, tol)
		for i := range cs {
			if change == 0 {
				cs[i].Fewer, cs[i].Change = SideUnknown, 0
			}
		}
		out = append(out, cs...)
	}
	return out
}
