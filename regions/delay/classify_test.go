package delay

import (
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// scaledQ returns f with Q multiplied by k: the loop gain as a parameter.
func scaledQ(f stability.Function, k float64) stability.Function {
	return stability.Function{P: f.P, Q: poly.Poly(f.Q).Scaled(k), Delay: f.Delay}
}

// TestClassifyOnRandomEdges finds edges of random invented loops by
// bisection on the loop gain between two counts and checks Classify
// there against the counts on either side: a change by one is a real
// root through s = 0, by two a pair through ±jω, and then Δ(jω) must
// vanish to within the bisection (the reference is Δ itself).
func TestClassifyOnRandomEdges(t *testing.T) {
	rng := newRand(31)
	c := NewCounter(10)
	var test Test
	edges := map[stability.Kind]int{}
	for i := range 60 {
		f := randomLoop(rng, 1+i%5)
		prev, prevK := c.Count(scaledQ(f, 0.05)).Unstable, 0.05
		for k := 0.1; k < 6 && prev >= 0; k += 0.05 {
			n := c.Count(scaledQ(f, k)).Unstable
			if n < 0 || n == prev {
				prev, prevK = n, k
				continue
			}
			lo, hi := prevK, k
			for range 80 {
				mid := 0.5 * (lo + hi)
				if c.Count(scaledQ(f, mid)).Unstable == prev {
					lo = mid
				} else {
					hi = mid
				}
			}
			g := scaledQ(f, 0.5*(lo+hi))
			x := test.Classify(g, g)
			switch d := n - prev; {
			case d == 1 || d == -1:
				if x.Kind != stability.Real {
					t.Errorf("case %d, gain %g: count %d → %d, crossing %+v, want real", i, lo, prev, n, x)
				}
			case d == 2 || d == -2:
				dv, size := evalDelta(g, complex(0, x.Omega))
				if x.Kind != stability.Complex || cmplx.Abs(dv) > 1e-9*size {
					t.Errorf("case %d, gain %g: count %d → %d, crossing %+v with |Δ(jω)|/size %g", i, lo, prev, n, x, cmplx.Abs(dv)/size)
				}
			}
			edges[x.Kind]++
			prev, prevK = n, k
		}
	}
	t.Logf("edges found: %v", edges)
	if edges[stability.Real] < 3 || edges[stability.Complex] < 20 {
		t.Errorf("edges found: %v", edges)
	}
}

// TestReport checks the report on an exact edge, a pair on the axis, a
// neutral loop and a loop without delay.
func TestReport(t *testing.T) {
	var test Test
	rep := test.Report(fopdtP(1, 1, 1, -1))
	if rep.Verdict != (stability.Verdict{Boundary: 1}) || len(rep.Omegas) != 1 || rep.Omegas[0] != 0 ||
		!strings.Contains(rep.Method, "argument principle") || len(rep.Table) == 0 || !strings.Contains(strings.Join(rep.Notes, " "), "retarded") {
		t.Errorf("edge at kp = −1: %+v", rep)
	}
	// s + (π/2)·e^(−s): the pair ±jπ/2 (TestExactBoundaryPoints).
	rep = test.Report(stability.Function{P: poly.Poly{0, 1}, Q: poly.Poly{math.Pi / 2}, Delay: 1})
	if rep.Boundary != 2 || len(rep.Omegas) != 1 || math.Abs(rep.Omegas[0]-math.Pi/2) > 1e-12 {
		t.Errorf("pair on the axis: %+v", rep)
	}
	rep = test.Report(stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{0.5, 1}, Delay: 1})
	if rep.Infinite != 1 || !strings.Contains(strings.Join(rep.Notes, " "), "neutral boundary") {
		t.Errorf("neutral boundary: %+v", rep)
	}
	rep = test.Report(stability.Function{P: poly.Poly{2, 3, 1}})
	if !strings.Contains(rep.Method, "sign array") || len(rep.Table) != 3 || rep.Verdict != (stability.Verdict{}) {
		t.Errorf("no delay: %+v", rep)
	}
	rep = test.Report(stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{1}, Delay: -1})
	if rep.Unstable != stability.Undecided || rep.Reason == "" {
		t.Errorf("negative delay: %+v", rep)
	}
	if test.Name() == "" {
		t.Error("no name")
	}
}
