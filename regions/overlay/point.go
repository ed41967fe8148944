package overlay

import (
	"math"

	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// prober evaluates the loop of a setup at arbitrary points of the plane,
// for the searches that refine a grid result. It is not safe for
// concurrent use.
type prober struct {
	setup   plane.Setup
	pencil  plane.Pencil
	e       *evaluator
	counter *grid.Counter
	work    []float64
}

func newProber(s plane.Setup) *prober {
	pc := s.Pencil()
	return &prober{
		setup:   s,
		pencil:  pc,
		e:       newEvaluator(pc, newOpenLoop(s)),
		counter: grid.NewCounter(pc.Len()),
		work:    make([]float64, routh.WorkLen(pc.Len())),
	}
}

// poly returns the characteristic polynomial at (x, y) in scratch space.
func (pr *prober) poly(x, y float64) poly.Poly { return pr.pencil.EvalInto(pr.e.p, x, y) }

// count returns the number of right-half-plane roots at (x, y), as the
// stability map counts them (grid.Counter).
func (pr *prober) count(x, y float64) int { return pr.counter.Count(pr.poly(x, y)) }

// stable reports whether the loop at (x, y) has every root in the open
// left half plane and no drop of degree.
func (pr *prober) stable(x, y float64) bool {
	return routh.Hurwitz(pr.poly(x, y), pr.work)
}

// decayAndDamping returns the decay rate and smallest damping ratio at
// (x, y) from the eigenvalues; the decay rate is negative where the loop
// is unstable, which lets the searches step across the boundary and back.
func (pr *prober) decayAndDamping(x, y float64) (float64, float64) {
	return pr.e.poles.decayAndDamping(pr.poly(x, y))
}

// ms returns the sensitivity evaluator's value at (x, y), NaN without one.
func (pr *prober) ms(f Sensitivity, x, y float64) float64 {
	if f == nil {
		return math.NaN()
	}
	return f(pr.e.openLoop(x, y))
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
