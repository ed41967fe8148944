package routh

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// counted runs count on p with a scratch buffer of exactly WorkLen filled
// with junk, followed by guard slots that must stay untouched.
func counted(t testing.TB, count func(p, work []float64) (int, int, Status), p []float64) [3]int {
	t.Helper()
	n := WorkLen(max(len(p)-1, 0))
	work := make([]float64, n+guardLen)
	for i := range work {
		work[i] = -7.25
	}
	r, z, st := count(p, work[:n])
	for i, v := range work[n:] {
		if v != -7.25 {
			t.Fatalf("wrote past WorkLen, at slot %d, for %v", i, p)
		}
	}
	return [3]int{r, z, int(st)}
}

// sameAsBefore checks that Count and FastCount return for p exactly what
// countBefore returns, counts and status alike, and that the bounds per
// row, at any degree from 2 up, accept only where they give that answer
// too. It reports whether they accepted.
func sameAsBefore(t testing.TB, p []float64) (accepted bool) {
	t.Helper()
	want := counted(t, countBefore, p)
	if got := counted(t, Count, p); got != want {
		t.Fatalf("Count(%v) = %v; before %v", p, got, want)
	}
	if got := counted(t, FastCount, p); got != want {
		t.Fatalf("FastCount(%v) = %v; Count before %v", p, got, want)
	}
	q, lo, st := prepare(p)
	if st != Decided || len(q) <= 2 {
		return false
	}
	rhp, st, ok := certified(q, make([]float64, WorkLen(len(q)-1)))
	got := [3]int{rhp, lo, int(st)}
	if st != Decided {
		got = [3]int{0, 0, int(st)}
	}
	if ok && got != want {
		t.Fatalf("bounds per row accepted %v with %v; Count before %v", p, got, want)
	}
	return ok
}

// randomCoefficients returns a polynomial of degree n whose coefficients
// have random signs and magnitudes spread evenly in log scale over
// 1e-12…1e12.
func randomCoefficients(rng *rand.Rand, n int) poly.Poly {
	p := make(poly.Poly, n+1)
	for i := range p {
		p[i] = math.Pow(10, 24*rng.Float64()-12) * float64(1-2*rng.IntN(2))
	}
	return p
}

// TestFastCountMatchesCountOnRandomPolynomials compares the paths on
// random polynomials of degree 1 to 40: coefficients of any sign and
// size, where the array meets every special case, and polynomials built
// from random roots (some in the right half plane) scaled by 1e-12…1e12,
// where the bounds per row should decide most of them.
func TestFastCountMatchesCountOnRandomPolynomials(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	fromRoots, fast := 0, 0
	for trial := range 6000 {
		n := 1 + trial%40
		var p poly.Poly
		if trial%2 == 0 {
			p = randomCoefficients(rng, n)
		} else {
			roots, _ := randomRoots(rng, n, 0.02, 1.5)
			p = poly.FromRoots(roots).Scaled(math.Pow(10, 24*rng.Float64()-12))
			fromRoots++
		}
		if sameAsBefore(t, p) && trial%2 == 1 && n >= 2 && n <= 12 {
			fast++
		}
	}
	// Up to degree 12 the roots stay within a factor e³ of each other,
	// and the bounds per row must carry the count nearly always, or the
	// fast path is not what these tests exercise.
	if lowDegree := fromRoots * 11 / 40; fast < lowDegree*9/10 {
		t.Errorf("bounds per row decided %d of %d polynomials of degree 2 to 12 built from roots", fast, lowDegree)
	}
}

// TestFastCountMatchesCountOnSpecialCases compares the paths where the
// array has exact or nearly exact zeros, or no meaning at all.
func TestFastCountMatchesCountOnSpecialCases(t *testing.T) {
	axisPair := func(w float64) poly.Poly { return poly.Poly{w * w, 0, 1} }
	stable := poly.FromRoots([]complex128{-1, -2, complex(-0.5, 3), complex(-0.5, -3)})
	// With a_n, a_(n-1), a_(n-2) given, a_(n-3) = a_(n-1)·a_(n-2)/a_n
	// zeroes the first entry of row s^(n-2) (by hand, as in
	// TestEpsilonCasesAgreeWithEigenvalues).
	eps := poly.FromDescending([]float64{2, 3, 5, 3 * 5 / 2.0, 1, 4, 2})
	nearEps := poly.FromDescending([]float64{2, 3, 5, 3*5/2.0 + 1e-14, 1, 4, 2})
	tests := []struct {
		name string
		p    poly.Poly
	}{
		{"empty", poly.Poly{}},
		{"constant", poly.Poly{3}},
		{"zero polynomial", poly.Poly{0, 0, 0}},
		{"first order", poly.Poly{2, 1}},
		{"first order, huge ratio", poly.Poly{1e-300, 1e300}},
		{"second order, unstable", poly.Poly{-1, 3, 1}},
		{"pair on the axis", poly.Mul(stable, axisPair(2))},
		{"two pairs on the axis", poly.Mul(poly.Mul(stable, axisPair(0.7)), axisPair(3))},
		{"pair on the axis alone", poly.Mul(axisPair(1.5), axisPair(4))},
		{"even, with roots at s = 0", poly.Mul(poly.Poly{0, 0, 1}, poly.Mul(poly.Mul(axisPair(1), axisPair(2)), poly.Mul(axisPair(3), axisPair(5))))},
		{"near pair on the axis", poly.Mul(stable, poly.Poly{4, 1e-12, 1})},
		{"zero pivot, epsilon rule", eps},
		{"near zero pivot", nearEps},
		{"root at s = 0", poly.Mul(stable, poly.Poly{0, 1})},
		{"three roots at s = 0", poly.Mul(stable, poly.Poly{0, 0, 0, 1})},
		{"degree drop", append(stable.Clone(), 0)},
		{"leading coefficient tiny", append(stable.Clone(), 1e-300)},
		{"zero inner coefficient", poly.Poly{1, 2, 0, 4, 1}},
		{"(s+1)^8", poly.FromRoots([]complex128{-1, -1, -1, -1, -1, -1, -1, -1})},
		{"wide range, (s+1000)^6", poly.FromRoots([]complex128{-1000, -1000, -1000, -1000, -1000, -1000})},
		{"NaN coefficient", poly.Poly{1, math.NaN(), 2}},
		{"infinite coefficient", poly.Poly{1, math.Inf(1), 2}},
		{"sum overflows", poly.Poly{1.5e308, 1, 1.5e308}},
		{"entries overflow", poly.Poly{1e300, 1e-300, 1e300, 1e-300, 1}},
		{"subnormal coefficients", poly.Poly{5e-324, 1e-310, 1e-320, 2e-315}},
		{"negative zero", poly.Poly{1, math.Copysign(0, -1), 3, 1}},
	}
	// Times a stable factor of degree 6, the same special cases reach the
	// degrees at which FastCount tries its bounds per row.
	lift := poly.FromRoots([]complex128{-1, -2, complex(-0.3, 1), complex(-0.3, -1), -4, -0.5})
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			sameAsBefore(t, tc.p)
			if len(tc.p) > 0 {
				sameAsBefore(t, poly.Mul(tc.p, lift))
			}
		})
	}
}

// Two invented plants, 3/D(s): four lags of time constants 1, 0.5, 0.2
// and 0.05, and the same four each twice.
var (
	plantFour  = lags(1, 0.5, 0.2, 0.05)
	plantEight = lags(1, 1, 0.5, 0.5, 0.2, 0.2, 0.05, 0.05)
)

// lags returns the product of the factors T·s + 1.
func lags(ts ...float64) poly.Poly {
	d := poly.Poly{1}
	for _, t := range ts {
		d = poly.Mul(d, poly.Poly{1, t})
	}
	return d
}

// pidCharacteristic returns the characteristic polynomial of the plant
// 3/den under the PID controller (kd·s² + kp·s + ki)/(s·(0.01s+1)),
// formed exactly as s·(0.01s+1)·den(s) + 3·(kd·s² + kp·s + ki): degree 6
// with plantFour, 10 with plantEight.
func pidCharacteristic(den poly.Poly, kp, ki, kd float64) poly.Poly {
	return poly.Add(poly.Mul(poly.Poly{0, 1, 0.01}, den), poly.Poly{3 * ki, 3 * kp, 3 * kd})
}

// TestFastCountMatchesCountOnPIDGrid compares the paths at every node of
// a kp × ki grid over the invented PID loops, ki = 0 (a root at s = 0)
// and negative kp included, at three values of kd and with kp and ki
// scaled by 1, 1e-12 and 1e12. Scaled, the coefficients span up to 17
// decades and so do the entries of a row: the bounds per row, which take
// the largest entry for all, then hand many nodes to Count (at degree 10
// nearly all), and only the unscaled grids must be decided by them.
func TestFastCountMatchesCountOnPIDGrid(t *testing.T) {
	for _, plant := range []poly.Poly{plantFour, plantEight} {
		for _, scale := range []float64{1, 1e-12, 1e12} {
			nodes, fast := 0, 0
			for _, kd := range []float64{0, 0.5, 4} {
				for i := range 41 {
					for j := range 31 {
						kp, ki := scale*(-2+0.75*float64(i)), scale*0.05*float64(j)
						if sameAsBefore(t, pidCharacteristic(plant, kp, ki, kd)) {
							fast++
						}
						nodes++
					}
				}
			}
			t.Logf("degree %d, gains scaled by %g: bounds per row decided %d of %d nodes", len(plant)+1, scale, fast, nodes)
			if scale == 1 && fast < nodes*99/100 {
				t.Errorf("degree %d, gains scaled by %g: bounds per row decided %d of %d nodes; want at least 99%%", len(plant)+1, scale, fast, nodes)
			}
		}
	}
}

// TestFastCountAgreesWithEigenvalues checks the fast path against gonum's
// eigenvalues, the outside reference, on random polynomials of degree 1
// to 16 whose roots are at least 5% of their magnitude from the
// imaginary axis.
func TestFastCountAgreesWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	work := make([]float64, WorkLen(16))
	decided := 0
	for trial := range 3000 {
		n := 1 + trial%16
		roots, built := randomRoots(rng, n, 0.05, 1)
		p := poly.FromRoots(roots).Scaled(math.Exp(rng.Float64()*20 - 10))
		ref, ok := eigenCount(t, p)
		if !ok || ref != built {
			t.Fatalf("trial %d: reference %d (trusted %v), construction %d", trial, ref, ok, built)
		}
		got, zeros, st := FastCount(p, work)
		if st != Decided {
			continue
		}
		decided++
		if got != ref || zeros != 0 {
			t.Fatalf("trial %d: FastCount %d (zeros %d), eigenvalues %d; p = %v", trial, got, zeros, ref, p)
		}
	}
	if decided < 2900 {
		t.Fatalf("FastCount decided only %d of 3000", decided)
	}
}

// TestFastCountAllocatesNothing checks the per-node paths for allocation.
func TestFastCountAllocatesNothing(t *testing.T) {
	ps := stablePolys(8, 8)
	work := make([]float64, WorkLen(8))
	c := Test{}.NewCounter(9)
	for name, f := range map[string]func(){
		"FastCount": func() { FastCount(ps[3], work) },
		"counter":   func() { c.Count(stability.Function{P: ps[5]}) },
	} {
		if n := testing.AllocsPerRun(100, f); n != 0 {
			t.Errorf("%s: %v allocations per run; want 0", name, n)
		}
	}
}

// FuzzFastCount reads each input three ways and checks, every time, that
// Count and FastCount return exactly what countBefore returns and that
// the bounds per row accept only with that answer: as coefficients
// (deg%13 is the degree and c0…c12 the coefficients, highest power
// first, any values at all); as the well-conditioned polynomial whose
// roots are the pairs in c (see wellConditioned), where the bounds per
// row should accept; and as that polynomial times s² + c12², whose array
// has an all-zero row in exact arithmetic and near-zero entries after
// rounding.
func FuzzFastCount(f *testing.F) {
	f.Add(uint8(6), 1.0, 2.0, 3.0, 6.0, 5.0, 3.0, 1.0, 0.0, 0.0, 0.0, 0.0, 0.0, 2.0)
	f.Add(uint8(8), 1.0, 7.0, 6.0, 42.0, 8.0, 56.0, 0.5, 0.25, 3.0, 0.0, 0.0, 0.0, 1.5)
	f.Add(uint8(12), -1.0, 0.3, 2.0, -0.1, 0.7, 0.7, 5.0, 1e-12, 1e12, 3.0, -2.0, 1.0, 1e-3)
	f.Add(uint8(10), 1.0, math.NaN(), 2.0, math.Inf(1), 0.0, 1e300, 1e-300, 5e-324, 0.0, 1.0, 1.0, 1.0, 0.0)
	f.Fuzz(func(t *testing.T, deg uint8,
		c0, c1, c2, c3, c4, c5, c6, c7, c8, c9, c10, c11, c12 float64) {
		c := []float64{c0, c1, c2, c3, c4, c5, c6, c7, c8, c9, c10, c11, c12}
		sameAsBefore(t, poly.FromDescending(c[:int(deg)%13+1]))
		p, _, _ := wellConditioned(c[:2*(1+int(deg)%6)], c12)
		sameAsBefore(t, p)
		if w := c12; finiteValue(w) && math.Abs(w) < 1e100 {
			sameAsBefore(t, poly.Mul(p, poly.Poly{w * w, 0, 1}))
		}
	})
}
