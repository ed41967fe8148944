package overlay

import (
	"context"
	"testing"

	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// Per-node costs, all on the stable nodes of the same two maps, so that the
// ratios can be read from one run:
//
//	go test -run '^$' -bench Node -cpu 1 ./regions/overlay
//
// "Small" is a filtered PID on 1/(s+1)³ (characteristic degree 5); "Large"
// is a filtered PID on a seventh-order plant (degree 9).
//
// Measured in one run (median of three, -cpu 1, on a shared 2-core
// machine), ns per node:
//
//	                                Small   Large
//	grid.Counter.Count (NodeCount)     56     103
//	decay, lean shift test (Shift)   2460    3850
//	decay, routh.Count shift (Count) 3450    6190
//	decay+damping, eigenvalues       3460    9880  (7 / 13 allocations)
//	poly.Roots (mat.Eigen)           4490   11960  (18 / 24 allocations)
//	Compute, decay only              2090    4010  (no allocation per node)
//	Compute, decay and damping       3420   10080
//
// The shifted sign test is 1.4 (Small) to 2.6 (Large) times faster than
// the eigenvalues and allocates nothing, so Compute uses it for the decay
// rate alone; when the damping ratio is asked for, the eigenvalues are
// needed anyway and give the decay rate with it. The overlay costs about
// 40 stability counts per stable node.

// smallSetup is the "Small" map of the benchmarks.
func smallSetup(b testing.TB) plane.Setup {
	return setupOf(b, []float64{1}, []float64{1, 3, 3, 1}, "pid", []float64{1, 0.5, 0.5, 0.05},
		plane.Axis{Param: "kp", Min: 0, Max: 6, N: 40}, plane.Axis{Param: "ki", Min: 0.05, Max: 3, N: 40})
}

// largeSetup is the "Large" map of the benchmarks.
func largeSetup(b testing.TB) plane.Setup {
	den := poly.FromRoots([]complex128{-1, -1.5, -2, -0.5 + 1i, -0.5 - 1i, -3 + 2i, -3 - 2i})
	return setupOf(b, []float64{2, 4}, den.Descending(), "pid", []float64{1, 0.5, 0.5, 0.05},
		plane.Axis{Param: "kp", Min: 0, Max: 10, N: 40}, plane.Axis{Param: "ki", Min: 0.05, Max: 5, N: 40})
}

func benchNodes(b *testing.B, setup func(testing.TB) plane.Setup, f func(p poly.Poly)) {
	ps := stablePolys(b, setup(b))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; b.Loop(); i++ {
		f(ps[i%len(ps)])
	}
}

func benchCount(b *testing.B, setup func(testing.TB) plane.Setup) {
	s := setup(b)
	c := s.NewCounter()
	benchNodes(b, setup, func(p poly.Poly) { c.Count(stability.Function{P: p}) })
}

func benchShift(b *testing.B, setup func(testing.TB) plane.Setup) {
	g := routh.Test{}.NewGrader(setup(b).Char.Len())
	benchNodes(b, setup, func(p poly.Poly) { g.Decay(stability.Function{P: p}) })
}

func benchEigen(b *testing.B, setup func(testing.TB) plane.Setup) {
	f := poly.NewFinder(setup(b).Char.Len())
	benchNodes(b, setup, func(p poly.Poly) { f.DecayAndDamping(p) })
}

func benchRoots(b *testing.B, setup func(testing.TB) plane.Setup) {
	benchNodes(b, setup, func(p poly.Poly) { p.Roots() })
}

// benchCompute reports Compute's time per stable node.
func benchCompute(b *testing.B, setup func(testing.TB) plane.Setup, damping bool) {
	s := setup(b)
	m := mapOf(b, s)
	stable := 0
	for _, c := range m.RHP {
		if c == 0 {
			stable++
		}
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		if _, err := Compute(context.Background(), s, m, Options{Workers: 1, Damping: damping}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*stable), "ns/node")
}

// BenchmarkNode compares the per-node costs of the overlay routes on a
// small and a large plane, in one run.
func BenchmarkNode(b *testing.B) {
	setups := []struct {
		name  string
		setup func(testing.TB) plane.Setup
	}{{"Small", smallSetup}, {"Large", largeSetup}}
	for _, st := range setups {
		for _, m := range []struct {
			name string
			run  func(*testing.B, func(testing.TB) plane.Setup)
		}{
			{"Count", benchCount}, {"DecayShift", benchShift}, {"DecayEigen", benchEigen},
			{"PolyRoots", benchRoots},
			{"Compute", func(b *testing.B, s func(testing.TB) plane.Setup) { benchCompute(b, s, false) }},
			{"ComputeDamp", func(b *testing.B, s func(testing.TB) plane.Setup) { benchCompute(b, s, true) }},
		} {
			b.Run(m.name+st.name, func(b *testing.B) { m.run(b, st.setup) })
		}
	}
}
