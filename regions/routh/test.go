package routh

import (
	"strconv"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Test is the Routh sign array as a stability.Test, for continuous-time
// loops without dead time: the characteristic function is the polynomial
// Function.P and the boundary is the imaginary axis. Counts come from the
// fast path Count where it certifies the array and from Analyze, with its
// special cases, where it does not.
type Test struct{}

// Name implements stability.Test.
func (Test) Name() string { return "Routh sign array" }

// NewCounter implements stability.Test.
func (Test) NewCounter(n int) stability.Counter {
	return &counter{work: make([]float64, WorkLen(n))}
}

type counter struct{ work []float64 }

// Count implements stability.Counter. The regular case allocates nothing.
func (c *counter) Count(f stability.Function) stability.Verdict {
	p := f.P
	if need := WorkLen(len(p)); len(c.work) < need {
		c.work = make([]float64, need)
	}
	rhp, zeros, st := Count(p, c.work)
	switch st {
	case Decided:
		return stability.Verdict{Unstable: rhp, Boundary: zeros}
	case NeedsAnalysis:
		return Analyze(p).Verdict()
	}
	return stability.Verdict{Unstable: stability.Undecided}
}

// Verdict returns the report's counts as a stability.Verdict.
func (r Report) Verdict() stability.Verdict {
	if r.Undecided {
		return stability.Verdict{Unstable: stability.Undecided}
	}
	return stability.Verdict{Unstable: r.RHP, Boundary: r.JW, Infinite: r.DegreeDrop}
}

// Classify implements stability.Test with ClassifyCrossing.
func (Test) Classify(f stability.Function) stability.Crossing {
	cr := ClassifyCrossing(f.P)
	switch cr.Vanishing {
	case "constant":
		return stability.Crossing{Kind: stability.Real, Omega: 0}
	case "leading":
		return stability.Crossing{Kind: stability.Infinite, Omega: cr.Omega}
	}
	return stability.Crossing{Kind: stability.Complex, Omega: cr.Omega}
}

// Report implements stability.Test with Analyze.
func (Test) Report(f stability.Function) stability.Report {
	ra := Analyze(f.P)
	rep := stability.Report{Verdict: ra.Verdict(), Reason: ra.Reason, Method: "sign array"}
	if ra.FromEigenvalues {
		rep.Method = "eigenvalues"
	}
	for _, r := range ra.Rows {
		rep.Table = append(rep.Table, stability.Row{
			Label: "s^" + itoa(r.Power), Power: r.Power, Entries: r.Entries,
			Epsilon: r.Epsilon, Auxiliary: r.Auxiliary,
		})
	}
	if ra.Aux != nil {
		rep.Auxiliary = poly.Poly(ra.Aux).Clone()
	}
	rep.Omegas = append([]float64{}, ra.Omegas...)
	if ra.DegreeDrop > 0 {
		rep.Notes = append(rep.Notes, "the leading coefficient vanishes: a root has gone to infinity")
	}
	return rep
}

func itoa(n int) string { return strconv.Itoa(n) }
