package delay

import (
	"math"

	"gainscape/regions/stability"
)

// grader grades points of a map of a loop with dead time, reusing its
// scratch space; see Test.NewGrader.
type grader struct {
	c    *Counter
	p, q []float64 // the shifted parts
}

func newGrader(n int) *grader {
	n = max(n, 1)
	return &grader{c: NewCounter(n), p: make([]float64, n), q: make([]float64, n)}
}

// Bisection of the decay rate: the bracket is grown or shrunk by
// decayGrowth from 1 at most decayTries times, then halved until it is
// decayTol wide relative to its ends.
const (
	decayGrowth = 4
	decayTries  = 40
	decayTol    = 1e-9
)

// Decay implements stability.Grader: the largest σ for which
// Δ(s − σ) = P(s − σ) + e^(Lσ)·Q(s − σ)·e^(−Ls) (Shift of f by −σ) has
// no root in the closed right half plane by the count, found by
// bisection to 1e-9 relative: −max Re s over the roots of f, the
// rightmost root's distance from the axis. For a neutral loop the shift
// raises |q_n/p_n| by e^(Lσ), so the chain of roots at
// Re s = ln|q_n/p_n|/L bounds σ as it should. A count that rounding
// decides counts as a root, so σ is never overstated by it. The
// coefficients are shifted by Horner's synthetic division into the
// grader's own buffers: it allocates nothing for a stable loop. For a
// loop that is not stable the rightmost roots give the (negative) rate,
// as DecayDamping does; NaN when the bracket cannot be found (a σ beyond
// 4^40).
func (g *grader) Decay(f stability.Function) float64 {
	if !g.clear(f, 0) {
		d, _ := g.DecayDamping(f)
		return d
	}
	lo, hi := 0.0, 1.0
	tries := 0
	for ; tries < decayTries && g.clear(f, hi); tries++ {
		lo, hi = hi, hi*decayGrowth
	}
	if tries == decayTries {
		return math.NaN()
	}
	if lo == 0 {
		// Shrink towards 0 for a slow loop, so that the bisection starts
		// from a bracket of its own scale.
		for d := hi / decayGrowth; tries < 2*decayTries; tries++ {
			if g.clear(f, d) {
				lo = d
				break
			}
			hi, d = d, d/decayGrowth
		}
	}
	for hi-lo > decayTol*hi {
		m := 0.5 * (lo + hi)
		if g.clear(f, m) {
			lo = m
		} else {
			hi = m
		}
	}
	return 0.5 * (lo + hi)
}

// clear reports whether f shifted by −σ has every root strictly left of
// the imaginary axis, by the count.
func (g *grader) clear(f stability.Function, sigma float64) bool {
	p, q := g.p[:len(f.P)], g.q[:len(f.Q)]
	shiftInto(p, f.P, -sigma)
	shiftInto(q, f.Q, -sigma)
	if len(q) > 0 && f.Delay != 0 {
		e := math.Exp(f.Delay * sigma)
		for k := range q {
			q[k] *= e
		}
	}
	return g.c.Count(stability.Function{P: p, Q: q, Delay: f.Delay}).Stable()
}

// shiftInto writes the coefficients of p(s + a) into dst (len(p)) by
// Horner's synthetic division, as taylorShift does, without allocating.
func shiftInto(dst, p []float64, a float64) {
	copy(dst, p)
	n := len(dst)
	for i := 0; i < n; i++ {
		for j := n - 2; j >= i; j-- {
			dst[j] += a * dst[j+1]
		}
	}
}
