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

func benchCount(b *testing.B, n int)  { benchSignArray(b, stablePolys(n, 256), Count) }
func benchFast(b *testing.B, n int)   { benchSignArray(b, stablePolys(n, 256), FastCount) }
func benchBefore(b *testing.B, n int) { benchSignArray(b, stablePolys(n, 256), countBefore) }

// benchSignArray counts the polynomials of ps in turn, ps holding 256 of
// them, and reports the time per polynomial as ns/node.
func benchSignArray(b *testing.B, ps []poly.Poly, count func(p, work []float64) (int, int, Status)) {
	n := 0
	for _, p := range ps {
		n = max(n, len(p)-1)
	}
	work := make([]float64, WorkLen(n))
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; b.Loop(); i++ {
		if _, _, st := count(ps[i&255], work); st != Decided {
			b.Fatal("undecided")
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N), "ns/node")
}

func benchEigen(b *testing.B, n int) { benchRoots(b, stablePolys(n, 256)) }

// benchRoots computes the roots of the 256 polynomials of ps in turn with
// gonum's eigenvalues, the reference the sign array is measured against.
func benchRoots(b *testing.B, ps []poly.Poly) {
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; b.Loop(); i++ {
		if _, err := ps[i&255].Roots(); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N), "ns/node")
}

// FastCount, Count, Count as it was before FastCount (countBefore) and
// the eigenvalue check on the same polynomials, so that their ratios can
// be read from one run. Degrees 8, 12 and 16 show where FastCount's
// bounds per row start and stop paying (fastMin, fastMax); at degrees 5,
// 8 and 20 FastCount calls Count.
func BenchmarkFastDegree5(b *testing.B)    { benchFast(b, 5) }
func BenchmarkCountDegree5(b *testing.B)   { benchCount(b, 5) }
func BenchmarkBeforeDegree5(b *testing.B)  { benchBefore(b, 5) }
func BenchmarkEigenDegree5(b *testing.B)   { benchEigen(b, 5) }
func BenchmarkFastDegree8(b *testing.B)    { benchFast(b, 8) }
func BenchmarkCountDegree8(b *testing.B)   { benchCount(b, 8) }
func BenchmarkFastDegree10(b *testing.B)   { benchFast(b, 10) }
func BenchmarkCountDegree10(b *testing.B)  { benchCount(b, 10) }
func BenchmarkBeforeDegree10(b *testing.B) { benchBefore(b, 10) }
func BenchmarkEigenDegree10(b *testing.B)  { benchEigen(b, 10) }
func BenchmarkFastDegree12(b *testing.B)   { benchFast(b, 12) }
func BenchmarkCountDegree12(b *testing.B)  { benchCount(b, 12) }
func BenchmarkFastDegree16(b *testing.B)   { benchFast(b, 16) }
func BenchmarkCountDegree16(b *testing.B)  { benchCount(b, 16) }

// pidGrid returns the characteristic polynomials of an invented PID loop
// of pidCharacteristic at 256 nodes of the kp × ki plane, kd = 0.5, with
// kp and ki scaled by scale and ki from 0.05·scale up so that no node has
// a root at s = 0.
func pidGrid(plant poly.Poly, scale float64) []poly.Poly {
	ps := make([]poly.Poly, 0, 256)
	for i := range 16 {
		for j := range 16 {
			ps = append(ps, pidCharacteristic(plant, scale*(-1+0.5*float64(i)), scale*(0.05+0.1*float64(j)), 0.5))
		}
	}
	return ps
}

// The nodes of a map: the invented PID loops of degree 6 and 10, and the
// second with kp and ki scaled by 1e-12, where the coefficients spread
// too far for FastCount's bounds per row and it goes to Count.
func BenchmarkFastPIDDegree6(b *testing.B)  { benchSignArray(b, pidGrid(plantFour, 1), FastCount) }
func BenchmarkCountPIDDegree6(b *testing.B) { benchSignArray(b, pidGrid(plantFour, 1), Count) }
func BenchmarkEigenPIDDegree6(b *testing.B) { benchRoots(b, pidGrid(plantFour, 1)) }
func BenchmarkFastPIDDegree10(b *testing.B) { benchSignArray(b, pidGrid(plantEight, 1), FastCount) }
func BenchmarkCountPIDDegree10(b *testing.B) {
	benchSignArray(b, pidGrid(plantEight, 1), Count)
}
func BenchmarkBeforePIDDegree10(b *testing.B) {
	benchSignArray(b, pidGrid(plantEight, 1), countBefore)
}
func BenchmarkEigenPIDDegree10(b *testing.B) { benchRoots(b, pidGrid(plantEight, 1)) }
func BenchmarkFastPIDDegree10TinyGains(b *testing.B) {
	benchSignArray(b, pidGrid(plantEight, 1e-12), FastCount)
}
func BenchmarkCountPIDDegree10TinyGains(b *testing.B) {
	benchSignArray(b, pidGrid(plantEight, 1e-12), Count)
}

// Degree 20 and 30: at 30 Count hands most random stable polynomials on,
// and the counter decides them with the inclusion disks; the analysis
// they would otherwise take is timed beside.
func BenchmarkFastDegree20(b *testing.B)   { benchFast(b, 20) }
func BenchmarkCountDegree20(b *testing.B)  { benchCount(b, 20) }
func BenchmarkBeforeDegree20(b *testing.B) { benchBefore(b, 20) }
func BenchmarkEigenDegree20(b *testing.B)  { benchEigen(b, 20) }
func BenchmarkEigenDegree30(b *testing.B)  { benchEigen(b, 30) }
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
