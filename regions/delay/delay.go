// Package delay decides where the roots of a loop with dead time lie: the
// closed-loop characteristic function
//
//	Δ(s) = P(s) + Q(s)·e^(−L·s),  P = Dc·D, Q = Nc·N,
//
// of a plant N(s)/D(s)·e^(−L·s) under a controller Nc(s)/Dc(s). Δ is a
// quasi-polynomial with infinitely many roots; it is of retarded type when
// deg P > deg Q, of neutral type when deg Q = deg P (an ideal derivative on
// a strictly proper first-order plant), and of advanced type when
// deg Q > deg P.
//
// Test implements stability.Test. Its count is the argument principle
// along the imaginary axis (L. S. Pontryagin, Izv. Akad. Nauk SSSR 6, 1942;
// AMS Translations 1, 1955), evaluated in closed form piece by piece
// instead of by tracking the phase of Δ(jω) on a frequency grid: see
// Counter. Rightmost gives the rightmost roots by spectral collocation of
// the infinitesimal generator, Pade the diagonal Padé approximants of the
// delay and PadeOrder the order a frequency range needs, and
// GainCrossovers and Crossover.DelayMargin the dead time a loop tolerates.
package delay

import (
	"math"

	"gainscape/regions/stability"
)

// InfinitelyMany is the Unstable count of a loop with infinitely many
// roots in the right half plane: a neutral-type loop with
// |q_n/p_n| > 1 (q_n, p_n the leading coefficients of Q and P), a loop on
// the neutral boundary |q_n/p_n| = 1 whose chain of roots approaches the
// imaginary axis from the right, or an advanced-type loop. A finite count
// that reaches it (a retarded loop at a gain of 1e12, say) is reported as
// InfinitelyMany too. It is positive, so Verdict.Class calls such a loop
// unstable.
const InfinitelyMany = math.MaxInt32

// Test is the stability test for loops with dead time. The zero value is
// ready to use.
type Test struct{}

// Name names the method in reports.
func (Test) Name() string { return "argument principle along the imaginary axis" }

// NewCounter returns a Counter for functions whose polynomials P and Q
// have at most n coefficients each.
func (Test) NewCounter(n int) stability.Counter { return NewCounter(n) }

// Classify says how the roots of f, a characteristic function on an edge of
// a stability map to within rounding, cross the imaginary axis: Real where
// Δ(0) vanishes, Complex with the frequency ω where Δ(jω) vanishes,
// Infinite on the neutral boundary |q_n/p_n| = 1. The candidate that comes
// closest to vanishing, relative to the size of its terms, names the
// crossing; ω is refined by Newton's method on Δ itself.
func (Test) Classify(a, b stability.Function) stability.Crossing {
	return NewCounter(max(len(a.P), len(a.Q), len(b.P), len(b.Q))).Classify(a, b)
}

// Report is the full verdict for f, with the dominant part on each band of
// frequencies, the boundary frequencies and notes on the type of the loop.
func (Test) Report(f stability.Function) stability.Report {
	return NewCounter(max(len(f.P), len(f.Q))).Report(f)
}

// NewGrader implements stability.Test: the decay rate alone comes from
// the count of the shifted quasi-polynomial by bisection (see
// grader.Decay), and with the damping from the rightmost roots of the
// quasi-polynomial (Rightmost): the distance of the rightmost one from
// the imaginary axis, the damping the least over the few rightmost
// roots.
func (Test) NewGrader(n int) stability.Grader { return newGrader(n) }

// gradedRoots is how many rightmost roots the grader looks at.
const gradedRoots = 6

// DecayDamping implements stability.Grader.
func (*grader) DecayDamping(f stability.Function) (decay, damping float64) {
	roots, err := Rightmost(f, gradedRoots)
	if err != nil || len(roots) == 0 {
		return math.NaN(), math.NaN()
	}
	return DecayRate(roots), LeastDamping(roots)
}
