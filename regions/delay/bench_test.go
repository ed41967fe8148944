package delay

import (
	"math"
	"testing"

	"gainscape/regions/stability"
)

// benchLoops returns 64 invented loops with plants of degree n, away from
// edges, for the benchmarks.
func benchLoops(n int) []stability.Function {
	rng := newRand(uint64(40 + n))
	fs := make([]stability.Function, 0, 64)
	for len(fs) < 64 {
		fs = append(fs, randomLoop(rng, n))
	}
	return fs
}

func benchCount(b *testing.B, n int) {
	fs := benchLoops(n)
	c := NewCounter(n + 3)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		if v := c.Count(fs[i&63]); v.Unstable < 0 {
			b.Fatal("undecided")
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

func benchContour(b *testing.B, n int) {
	fs := benchLoops(n)
	for i := 0; b.Loop(); i++ {
		f := fs[i&63]
		contourCount(f, math.Min(1.2*rootRadius(f)+0.5, 60))
	}
}

// The count against the independent reference of the tests, the contour
// integral of Δ'/Δ, on the same loops: compare ns/op within one run.
func BenchmarkCountDegree2(b *testing.B)   { benchCount(b, 2) }
func BenchmarkCountDegree4(b *testing.B)   { benchCount(b, 4) }
func BenchmarkCountDegree8(b *testing.B)   { benchCount(b, 8) }
func BenchmarkContourDegree2(b *testing.B) { benchContour(b, 2) }
func BenchmarkContourDegree4(b *testing.B) { benchContour(b, 4) }
func BenchmarkContourDegree8(b *testing.B) { benchContour(b, 8) }

// TestCountAllocatesNothing checks the per-node path on loops with and
// without cuts, with exact edges and with the neutral type.
func TestCountAllocatesNothing(t *testing.T) {
	c := NewCounter(12)
	fs := append(benchLoops(6), fopdtP(1, 1, 1, -1), fopdtP(1, 1, 1, 1e9),
		stability.Function{P: []float64{1, 1}, Q: []float64{0.5, 0.7}, Delay: 1})
	allocs := testing.AllocsPerRun(20, func() {
		for _, f := range fs {
			c.Count(f)
		}
	})
	if allocs != 0 {
		t.Errorf("Count allocates %g times per run", allocs)
	}
}
