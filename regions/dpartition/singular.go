package dpartition

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// parallelTol is the largest sine of the angle, on the imaginary axis,
// between the column of A and the common direction of the columns of B and
// C at which a frequency of a singular pencil is taken as a crossing: the
// root of [A, C] was polished to rounding, so a genuine crossing is far
// inside it, while a root brought by C(jω) = 0 alone is far outside.
const parallelTol = 1e-8

// singularLines returns the complex edges of a singular affine pencil: one
// whose columns B(jω) and C(jω) are real multiples of one another at every
// ω, so that the 2×2 system of the edge is rank-deficient everywhere. It
// has a solution only where A(jω) is parallel to them too, at isolated
// frequencies ω₀, and each gives a whole line of crossings
//
//	a + b·x + c·y = 0,  with A = a·u, B = b·u, C = c·u at jω₀.
//
// For PID at fixed kp in the (kd, ki) plane (B = s²·N, C = N, A = s·D +
// kp·s·N for the plant N/D) this is the characterisation of Silva, Datta
// & Bhattacharyya: the crossing frequencies solve kp = −Re[1/G(jω)] and
// each gives the line ki = ω²·kd + ω·Im[1/G(jω)].
//
// The side: off the line the root at jω₀ moves by
// ds = −(B·dx + C·dy)/Δ_s = −(b·dx + c·dy)·u/Δ_s, Δ_s = ∂Δ/∂s, so it enters
// the left half plane on the side where b·dx + c·dy has the sign of
// Re(u·conj Δ_s), an affine function along the line.
func (pc *pencil) singularLines(pr Problem, w window, end, tol float64) ([]Curve, error) {
	cand := &pc.x.c[0] // [A, C]
	if pr.P.C.Degree() < 0 && pr.Q.C.Degree() < 0 {
		cand = &pc.y.c[0] // [A, B]
	}
	var omegas []float64
	if pc.delay == 0 {
		nus, err := positiveRoots(cand.even)
		if err != nil {
			return nil, err
		}
		for _, nu := range nus {
			omegas = append(omegas, math.Sqrt(nu))
		}
	} else {
		omegas = pc.sweep(func(f *freq, v []float64) { v[0] = cand.at(f) }, 1, end)
	}
	omegas = dedupe(omegas)
	var out []Curve
	for _, om := range omegas {
		if om <= 0 {
			continue
		}
		f := newFreq(om, pc.delay)
		var cm [4]component
		pc.components(&f, &cm)
		u := cm[partB]
		if c := cm[partC]; math.Hypot(c.re, c.im) > math.Hypot(u.re, u.im) {
			u = c
		}
		nu := math.Hypot(u.re, u.im)
		a := cm[partA]
		if nu == 0 || math.Abs(a.re*u.im-a.im*u.re) > parallelTol*nu*math.Hypot(a.re, a.im) {
			continue
		}
		u.re, u.im = u.re/nu, u.im/nu
		dot := func(v component) float64 { return v.re*u.re + v.im*u.im }
		line := conic{dot(a), dot(cm[partB]), dot(cm[partC]), 0}
		// u in the complex plane: the second component carries Im/ω.
		uc := complex(u.re, om*u.im)
		side := func(k int) float64 {
			return real(uc * cmplx.Conj(slopeAt(pr.P.parts()[k], pr.Q.parts()[k], pr.Delay, om)))
		}
		other := conic{side(partA), side(partB), side(partC), 0}
		out = append(out, w.fixedCurves(line, other, om, stability.Complex, 2, pc.branch(om), tol)...)
	}
	return out, nil
}

// slopeAt returns d/ds of P(s) + Q(s)·e^(−Ls) at s = jω.
func slopeAt(p, q poly.Poly, delay, omega float64) complex128 {
	s := complex(0, omega)
	d := p.Derivative().Eval(s)
	if q.Degree() >= 0 {
		d += (q.Derivative().Eval(s) - complex(delay, 0)*q.Eval(s)) * cmplx.Exp(-complex(0, omega*delay))
	}
	return d
}
