package delay

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// Classify says how the roots of f cross the imaginary axis, f lying on an
// edge of a stability map to within rounding; see Test.Classify.
func (c *Counter) Classify(f stability.Function) stability.Crossing {
	if f.Rational() {
		p := poly.Poly(f.P)
		if f.Delay == 0 && len(f.Q) > 0 {
			p = poly.Add(f.P, f.Q)
		}
		return fromSignArray(routh.ClassifyCrossing(p))
	}
	c.res = result{}
	c.prepare(f)
	if len(trimTop(f.P)) == 0 {
		return fromSignArray(routh.ClassifyCrossing(poly.Poly(f.Q)))
	}
	// Each candidate is measured relative to the size of its terms, so
	// that the three are comparable: how nearly Δ(0) vanishes, how nearly
	// Δ(jω) vanishes at a cut, and how nearly |q_n| equals |p_n|.
	best := stability.Crossing{Kind: stability.Real, Omega: 0}
	p0, q0 := coef(f.P, 0), coef(f.Q, 0)
	bestSize := 0.0
	if s := math.Abs(p0) + math.Abs(q0); s > 0 {
		bestSize = math.Abs(p0+q0) / s
	}
	rho := math.Ldexp(1, c.res.rhoExp)
	for i, w := range c.cross {
		if s := c.atCut[i].size; s < bestSize {
			best, bestSize = stability.Crossing{Kind: stability.Complex, Omega: w * rho}, s
		}
	}
	P, Q := trimTop(f.P), trimTop(f.Q)
	if len(P) == len(Q) {
		a, b := math.Abs(P[len(P)-1]), math.Abs(Q[len(Q)-1])
		if s := math.Abs(a-b) / (a + b); s < bestSize {
			best = stability.Crossing{Kind: stability.Infinite, Omega: math.NaN()}
		}
	}
	if best.Kind == stability.Complex {
		if r, ok := Newton(f, complex(0, best.Omega)); ok && math.Abs(imag(r)-best.Omega) <= 1e-3*best.Omega {
			best.Omega = math.Abs(imag(r))
		}
	}
	return best
}

// fromSignArray turns the sign array's classification into a Crossing.
func fromSignArray(x routh.Crossing) stability.Crossing {
	switch x.Vanishing {
	case "constant":
		return stability.Crossing{Kind: stability.Real, Omega: 0}
	case "leading":
		return stability.Crossing{Kind: stability.Infinite, Omega: math.NaN()}
	}
	return stability.Crossing{Kind: stability.Complex, Omega: x.Omega}
}

// newtonSteps caps Newton's method on Δ.
const newtonSteps = 40

// Newton refines an approximate root s0 of the characteristic function f
// by Newton's method on Δ(s) = P(s) + Q(s)·e^(−Ls) itself, with
// Δ'(s) = P'(s) + (Q'(s) − L·Q(s))·e^(−Ls). It stops when a step no longer
// reduces |Δ| and reports whether the result is a root: |Δ| at most a few
// hundred units in the last place of the size |P| + |Q·e^(−Ls)| of its
// terms. It allocates nothing.
func Newton(f stability.Function, s0 complex128) (complex128, bool) {
	s := s0
	d, size := evalDelta(f, s)
	best := cmplx.Abs(d)
	for it := 0; it < newtonSteps && best > 0; it++ {
		dd := evalDeltaDeriv(f, s)
		if dd == 0 {
			break
		}
		next := s - d/dd
		nd, nsize := evalDelta(f, next)
		if !(cmplx.Abs(nd) < best) {
			break
		}
		s, d, size, best = next, nd, nsize, cmplx.Abs(nd)
	}
	return s, best <= 256*float64(len(f.P)+len(f.Q))*unit*size
}

// evalDelta returns Δ(s) and |P(s)| + |Q(s)·e^(−Ls)|.
func evalDelta(f stability.Function, s complex128) (complex128, float64) {
	p := poly.Poly(f.P).Eval(s)
	q := poly.Poly(f.Q).Eval(s) * cmplx.Exp(-complex(f.Delay, 0)*s)
	return p + q, cmplx.Abs(p) + cmplx.Abs(q)
}

// evalDeltaDeriv returns Δ'(s).
func evalDeltaDeriv(f stability.Function, s complex128) complex128 {
	e := cmplx.Exp(-complex(f.Delay, 0) * s)
	q := poly.Poly(f.Q).Eval(s)
	return evalDeriv(f.P, s) + (evalDeriv(f.Q, s)-complex(f.Delay, 0)*q)*e
}
