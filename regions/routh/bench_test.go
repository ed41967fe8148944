package routh

import (
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// stablePolys returns k random Hurwitz polynomials of degree n.
func stablePolys(n, k int) []poly.Poly {
	rng := rand.New(rand.NewPCG(uint64(n), 7))
	ps := make([]poly.Poly, k)
	for i := range ps {
		roots, _ := randomRoots(rng, n, 0.05, 1)
		for j := range roots {
			if real(roots[j]) > 0 {
				roots[j] = complex(-real(roots[j]), imag(roots[j]))
			}
		}
		ps[i] = poly.FromRoots(roots)
	}
	return ps
}

func benchCount(b *testing.B, n int) {
	ps := stablePolys(n, 256)
	work := make([]float64, WorkLen(n))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; b.Loop(); i++ {
		if _, _, st := Count(ps[i&255], work); st != Decided {
			b.Fatal("undecided")
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

func benchEigen(b *testing.B, n int) {
	ps := stablePolys(n, 256)
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; b.Loop(); i++ {
		if _, err := ps[i&255].Roots(); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

// The sign-array test and the eigenvalue check on the same polynomials, so
// that their ratio can be read from one run.
func BenchmarkCountDegree5(b *testing.B)  { benchCount(b, 5) }
func BenchmarkEigenDegree5(b *testing.B)  { benchEigen(b, 5) }
func BenchmarkCountDegree10(b *testing.B) { benchCount(b, 10) }
func BenchmarkEigenDegree10(b *testing.B) { benchEigen(b, 10) }
func BenchmarkAnalyzeDegree5(b *testing.B) {
	ps := stablePolys(5, 256)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		Analyze(ps[i&255])
	}
}

// Degree 20 and 30: at 30 Count hands most random stable polynomials on,
// and the counter decides them with the inclusion disks; the analysis
// they would otherwise take is timed beside.
func BenchmarkCountDegree20(b *testing.B) { benchCount(b, 20) }
func BenchmarkEigenDegree20(b *testing.B) { benchEigen(b, 20) }
func BenchmarkEigenDegree30(b *testing.B) { benchEigen(b, 30) }
func BenchmarkCounterDegree30(b *testing.B) {
	ps := stablePolys(30, 256)
	c := Test{}.NewCounter(31)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		if v := c.Count(stability.Function{P: ps[i&255]}); v.Unstable != 0 {
			b.Fatal("unstable")
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}
func BenchmarkAnalyzeDegree30(b *testing.B) {
	ps := stablePolys(30, 16)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		Analyze(ps[i&15])
	}
}
