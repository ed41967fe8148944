package overlay

import (
	"math"

	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// prober evaluates the loop of a setup at arbitrary points of the plane,
// for the searches that refine a grid result. It is not safe for
// concurrent use.
type prober struct {
	setup   plane.Setup
	e       *evaluator
	counter stability.Counter
}

func newProber(s plane.Setup) *prober {
	return &prober{setup: s, e: newEvaluator(s), counter: s.NewCounter()}
}

// function returns the characteristic function at (x, y) in scratch space.
func (pr *prober) function(x, y float64) stability.Function { return pr.setup.Function(pr.e.buf, x, y) }

// count returns the number of right-half-plane roots at (x, y), as the
// stability map counts them.
func (pr *prober) count(x, y float64) int { return pr.counter.Count(pr.function(x, y)).Unstable }

// stable reports whether the loop at (x, y) has every root in the open
// left half plane and no drop of degree.
func (pr *prober) stable(x, y float64) bool { return pr.counter.Count(pr.function(x, y)).Stable() }

// decay returns the decay rate at (x, y) by the grader's cheapest exact
// method (the shifted test, for a rational or delayed loop; it is
// negative where the loop is unstable), for the searches that need no
// damping ratio.
func (pr *prober) decay(x, y float64) float64 { return pr.e.grader.Decay(pr.function(x, y)) }

// decayAndDamping returns the decay rate and smallest damping ratio at
// (x, y) from the eigenvalues; the decay rate is negative where the loop
// is unstable, which lets the searches step across the boundary and back.
func (pr *prober) decayAndDamping(x, y float64) (float64, float64) {
	return pr.e.grader.DecayDamping(pr.function(x, y))
}

// ms returns the sensitivity evaluator's value at (x, y), NaN without one.
func (pr *prober) ms(f Sensitivity, x, y float64) float64 {
	if f == nil {
		return math.NaN()
	}
	return f(pr.setup.OpenLoop(pr.e.buf, x, y))
}

// Optimum is a design point chosen by BestDecay or BestIntegral, with the
// quantities there.
type Optimum struct {
	X, Y float64
	// Decay and Damping are the decay rate and smallest damping ratio at
	// the point; Ms is the sensitivity evaluator's value, NaN without one.
	Decay, Damping, Ms float64
	// Objective is the value the criterion maximised.
	Objective float64
	// Criterion names the criterion in words, for reports.
	Criterion string
}

// describe fills the quantities of o at its point.
func (pr *prober) describe(o Optimum, f Sensitivity) Optimum {
	o.Decay, o.Damping = pr.decayAndDamping(o.X, o.Y)
	o.Ms = pr.ms(f, o.X, o.Y)
	return o
}
