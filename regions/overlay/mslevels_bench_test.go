package overlay

import (
	"context"
	"testing"

	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// demoPlane is the built-in demo (an invented pump loop under PID with
// kd = 0.5, tau = 0.05) on an n×n grid.
func demoPlane(b testing.TB, n int) plane.Setup {
	return setupOf(b, []float64{3}, poly.Mul(poly.Mul(poly.Poly{0.5, 1}, poly.Poly{2, 1}), poly.Poly{1, 0.4}.Pow(2)).Descending(),
		"pid", []float64{0, 0, 0.5, 0.05}, plane.Axis{Param: "kp", Min: -0.6, Max: 3.6, N: n}, plane.Axis{Param: "ki", Min: -0.4, Max: 1.8, N: n})
}

// The Ms grid of the demo at 800×800 for the iso-lines 1.4 and 2: at
// every stable node (Full) and only where the lines need it (Levels), in
// one run; the metric "evaluated" is the share of stable nodes at which
// Ms ran.
func BenchmarkMsGridFull(b *testing.B) {
	s := demoPlane(b, 800)
	m, ev := mapOf(b, s), msEvaluatorFor(b, s)
	for b.Loop() {
		if _, err := Compute(context.Background(), s, m, Options{Workers: 1, SkipDecay: true, Sensitivity: ev.Ms}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkMsGridLevels(b *testing.B) {
	s := demoPlane(b, 800)
	m, ev := mapOf(b, s), msEvaluatorFor(b, s)
	stable := m.Stats().Stable
	evaluated := 0
	for b.Loop() {
		var err error
		if _, evaluated, err = MsForLevels(context.Background(), s, m, ev, []float64{1.4, 2}, 1); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(evaluated)/float64(stable), "evaluated")
}
