package margins

import (
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/zoh"
)

// benchLoops returns 256 stable random loops (see randomLoop).
func benchLoops(b *testing.B) []Loop {
	rng := rand.New(rand.NewPCG(21, 22))
	var ls []Loop
	for len(ls) < 256 {
		if l, ok := randomLoop(b, rng, 0.1); ok {
			ls = append(ls, l)
		}
	}
	return ls
}

// Per-node cost of the fast evaluator on a map-sized grid: 8 decades at
// the default density (321 frequencies).
func BenchmarkMsEvaluator(b *testing.B) {
	ls := benchLoops(b)
	ev, err := NewMsEvaluator(1e-4, 1e4, DefaultMsPerDecade, 9, DefaultMsSteps)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		l := ls[i&255]
		ev.Ms(l.Num, l.Den)
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

// The refined route, for comparison: everything Margins computes.
func BenchmarkMarginsRefined(b *testing.B) {
	ls := benchLoops(b)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		if _, err := ls[i&255].Margins(); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

func stableCharPolys(n int) []poly.Poly {
	rng := rand.New(rand.NewPCG(uint64(n), 23))
	ps := make([]poly.Poly, 256)
	for i := range ps {
		ps[i] = poly.FromRoots(stableRoots(rng, n, 0.05, 1))
	}
	return ps
}

func benchEigenDecay(b *testing.B, n int) {
	ps := stableCharPolys(n)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		poles, err := Poles(ps[i&255])
		if err != nil {
			b.Fatal(err)
		}
		DecayRate(poles)
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

// Decay rate per node by the two routes, on the same polynomials.
func BenchmarkDecayEigenDegree3(b *testing.B)  { benchEigenDecay(b, 3) }
func BenchmarkDecayEigenDegree5(b *testing.B)  { benchEigenDecay(b, 5) }
func BenchmarkDecayEigenDegree10(b *testing.B) { benchEigenDecay(b, 10) }

// sampledBenchLoop is an invented held third-order lag under a gain, the
// loop of the sampled benchmarks.
func sampledBenchLoop(b *testing.B) SampledLoop {
	nz, dz, err := zoh.Discretise(poly.Poly{2}, poly.FromDescending([]float64{1, 3, 3, 1}), 0.1, 0)
	if err != nil {
		b.Fatal(err)
	}
	return SampledLoop{Num: nz.Scaled(1.5), Den: dz, T: 0.1}
}

// BenchmarkSampledMsEvaluator and BenchmarkSampledMargins compare the
// per-node Ms of a sampled map with the probe's full scan of the same
// loop; read them as a ratio within one run.
func BenchmarkSampledMsEvaluator(b *testing.B) {
	l := sampledBenchLoop(b)
	lo, _ := l.FrequencyRange()
	ev, err := NewSampledMsEvaluator(l.T, lo, DefaultMsPerDecade, len(l.Den), DefaultMsSteps, l.EquivalentRoots())
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		ev.Ms(l.Num, l.Den)
	}
}

func BenchmarkSampledMargins(b *testing.B) {
	l := sampledBenchLoop(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := l.Margins(); err != nil {
			b.Fatal(err)
		}
	}
}
