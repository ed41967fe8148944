package unitcircle

import (
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// stableZPolys returns k random polynomials of degree n with every root
// inside the circle, between 5% and 70% (in ln|z|) from it.
func stableZPolys(n, k int) []poly.Poly {
	rng := rand.New(rand.NewPCG(uint64(n), 3))
	ps := make([]poly.Poly, k)
	for i := range ps {
		roots, _ := randomZRoots(rng, n, 0.05, 0.7)
		for j, r := range roots {
			if cmplx.Abs(r) > 1 {
				roots[j] = 1 / cmplx.Conj(r)
			}
		}
		ps[i] = poly.FromRoots(roots)
	}
	return ps
}

func benchCount(b *testing.B, n int) {
	ps := stableZPolys(n, 256)
	c := Test{T: 1}.NewCounter(n + 1)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		if !c.Count(stability.Function{P: ps[i&255]}).Stable() {
			b.Fatal("not stable")
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

func benchEigen(b *testing.B, n int) {
	ps := stableZPolys(n, 256)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		roots, err := ps[i&255].Roots()
		if err != nil {
			b.Fatal(err)
		}
		for _, r := range roots {
			if cmplx.Abs(r) >= 1 {
				b.Fatal("not stable")
			}
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "nodes/s")
}

// The unit-circle count and the eigenvalue count on the same polynomials,
// so that their ratio can be read from one run.
func BenchmarkCountDegree4(b *testing.B)  { benchCount(b, 4) }
func BenchmarkEigenDegree4(b *testing.B)  { benchEigen(b, 4) }
func BenchmarkCountDegree10(b *testing.B) { benchCount(b, 10) }
func BenchmarkEigenDegree10(b *testing.B) { benchEigen(b, 10) }
func BenchmarkCountDegree20(b *testing.B) { benchCount(b, 20) }
func BenchmarkEigenDegree20(b *testing.B) { benchEigen(b, 20) }
func BenchmarkReportDegree4(b *testing.B) {
	ps := stableZPolys(4, 256)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		Test{T: 1}.Report(stability.Function{P: ps[i&255]})
	}
}
