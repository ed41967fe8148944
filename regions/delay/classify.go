package delay

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// Classify says which roots cross the imaginary axis between a and b, the
// two ends of a bisection across an edge (or one point on it); see
// Test.Classify. A real root crosses through s = 0 exactly when
// Δ(0) = P(0) + Q(0) changes sign, and the neutral edge is where
// |p_n| − |q_n| does; both signs are exact for coefficients formed
// exactly. Otherwise the point halfway is classified by the cuts of the
// count: the frequency where Δ(jω) comes nearest zero.
func (c *Counter) Classify(a, b stability.Function) stability.Crossing {
	if a.Rational() && b.Rational() {
		return routh.Test{}.Classify(withoutDelay(a), withoutDelay(b))
	}
	changes := func(u, v float64) bool { return u*v < 0 || (u == 0) != (v == 0) }
	if changes(coef(a.P, 0)+coef(a.Q, 0), coef(b.P, 0)+coef(b.Q, 0)) {
		return stability.Crossing{Kind: stability.Real, Omega: 0}
	}
	if neutral := func(f stability.Function) float64 {
		P, Q := trimTop(f.P), trimTop(f.Q)
		if len(P) != len(Q) || len(P) == 0 {
			return 1
		}
		return math.Abs(P[len(P)-1]) - math.Abs(Q[len(Q)-1])
	}; changes(neutral(a), neutral(b)) {
		return stability.Crossing{Kind: stability.Infinite, Omega: math.NaN()}
	}
	return c.classifyAt(midway(a, b))
}

// withoutDelay returns the polynomial of a function without dead time.
func withoutDelay(f stability.Function) stability.Function {
	if f.Delay == 0 && len(f.Q) > 0 {
		return stability.Function{P: poly.Add(f.P, f.Q)}
	}
	return stability.Function{P: f.P}
}

// midway returns the function halfway between a and b (equal delays).
func midway(a, b stability.Function) stability.Function {
	half := func(p, q poly.Poly) poly.Poly {
		out := make(poly.Poly, max(len(p), len(q)))
		for k := range out {
			out[k] = 0.5 * (coef(p, k) + coef(q, k))
		}
		return out
	}
	return stability.Function{P: half(a.P, b.P), Q: half(a.Q, b.Q), Delay: a.Delay}
}

// classifyAt classifies f, a function that lies on an edge to within
// rounding.
func (c *Counter) classifyAt(f stability.Function) stability.Crossing {
	if f.Rational() {
		return routh.Test{}.Classify(withoutDelay(f), withoutDelay(f))
	}
	c.res = result{}
	c.prepare(f)
	if len(trimTop(f.P)) == 0 {
		q := stability.Function{P: f.Q}
		return routh.Test{}.Classify(q, q)
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
