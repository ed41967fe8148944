package routh

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
)

// randomRoots returns n roots (conjugate pairs kept together) whose real
// parts are at least margin·|root| away from the imaginary axis, and how
// many lie in the right half plane.
func randomRoots(rng *rand.Rand, n int, margin, spread float64) ([]complex128, int) {
	var roots []complex128
	rhp := 0
	for len(roots) < n {
		mag := math.Exp((2*rng.Float64() - 1) * spread) // e^-spread … e^spread
		re := mag * (margin + (1-margin)*rng.Float64())
		if rng.IntN(2) == 0 {
			re = -re
		}
		if n-len(roots) >= 2 && rng.IntN(2) == 0 {
			im := mag * (0.1 + 2*rng.Float64())
			roots = append(roots, complex(re, im), complex(re, -im))
			if re > 0 {
				rhp += 2
			}
			continue
		}
		roots = append(roots, complex(re, 0))
		if re > 0 {
			rhp++
		}
	}
	return roots, rhp
}

// eigenCount counts right-half-plane roots from gonum's eigenvalues of the
// companion matrix, the independent reference. ok is false when a root
// lies too close to the axis for the reference itself to be trusted.
func eigenCount(t testing.TB, p poly.Poly) (rhp int, ok bool) {
	roots, err := p.Roots()
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range roots {
		if math.Abs(real(r)) < 1e-6*math.Max(1, math.Hypot(real(r), imag(r))) {
			return 0, false
		}
		if real(r) > 0 {
			rhp++
		}
	}
	return rhp, true
}

// TestCountAgreesWithEigenvalues checks the fast path and the full analysis
// against gonum's eigenvalues on 12,000 random polynomials of degree 1 to
// 12 with roots at least 5% of their magnitude from the imaginary axis.
func TestCountAgreesWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	work := make([]float64, WorkLen(12))
	overruled := 0
	for trial := 0; trial < 12000; trial++ {
		n := 1 + trial%12
		roots, built := randomRoots(rng, n, 0.05, 2)
		p := poly.FromRoots(roots).Scaled(math.Exp(rng.Float64()*20-10) * float64(1-2*rng.IntN(2)))
		ref, ok := eigenCount(t, p)
		if !ok {
			t.Fatalf("trial %d: reference root near the axis for roots built away from it", trial)
		}
		if ref != built {
			t.Fatalf("trial %d: eigenvalue count %d differs from construction %d", trial, ref, built)
		}
		got, zeros, st := Count(p, work)
		if st == Decided {
			if got != ref || zeros != 0 {
				t.Fatalf("trial %d: Count = %d (zeros %d), eigenvalues %d; p = %v", trial, got, zeros, ref, p)
			}
		}
		rep := Analyze(p)
		if rep.RHP != ref || rep.JW != 0 {
			t.Fatalf("trial %d: Analyze rhp %d jw %d, eigenvalues %d; p = %v", trial, rep.RHP, rep.JW, ref, p)
		}
		if rep.FromEigenvalues {
			overruled++
		}
	}
	// Analyze confirms its counts against the eigenvalues; the array must
	// have given them itself almost always, or this test proves little.
	if overruled > 12 {
		t.Fatalf("the eigenvalues overruled the sign array in %d of 12000 cases; want at most 12", overruled)
	}
	t.Logf("eigenvalues overruled the sign array in %d of 12000 cases", overruled)
}

// TestAuxiliaryCasesAgreeWithEigenvalues multiplies random polynomials by
// one or two factors s² + ω², which force an all-zero row, and checks the
// right-half-plane count against the eigenvalues of the random factor and
// the frequencies against the ω used. Roots stay within a factor 3 of 1:
// an all-zero row is an exact cancellation, and an array whose rows lose
// many digits to rounding cannot show it in double precision.
func TestAuxiliaryCasesAgreeWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	undecided := 0
	defer func() {
		// Declining to decide is allowed, rarely; a wrong count never is.
		if undecided > 100 {
			t.Errorf("%d of 2000 cases undecided; want at most 100", undecided)
		}
		t.Logf("%d of 2000 cases undecided", undecided)
	}()
	for trial := 0; trial < 2000; trial++ {
		n := 1 + trial%6
		roots, _ := randomRoots(rng, n, 0.1, math.Log(3))
		base := poly.FromRoots(roots)
		ref, ok := eigenCount(t, base)
		if !ok {
			t.Fatal("reference root near the axis")
		}
		omegas := []float64{0.4 + 2*rng.Float64()}
		if trial%3 == 0 {
			omegas = append(omegas, omegas[0]*(1.5+rng.Float64()))
		}
		p := base
		for _, w := range omegas {
			p = poly.Mul(p, poly.Poly{w * w, 0, 1})
		}
		rep := Analyze(p)
		if rep.Undecided {
			undecided++
			continue
		}
		if rep.RHP != ref || rep.JW != 2*len(omegas) {
			for _, r := range rep.Rows {
				t.Log(r.Power, r.Entries, r.Epsilon, r.Auxiliary, r.Aux)
			}
			t.Log(base.Descending(), omegas)
			t.Fatalf("trial %d: rhp %d jw %d; want %d, %d; p = %v", trial, rep.RHP, rep.JW, ref, 2*len(omegas), p)
		}
		if len(rep.Omegas) != len(omegas) {
			t.Fatalf("trial %d: omegas %v; want %v", trial, rep.Omegas, omegas)
		}
		if len(omegas) == 2 && omegas[0] > omegas[1] {
			omegas[0], omegas[1] = omegas[1], omegas[0]
		}
		for i, w := range omegas {
			if math.Abs(rep.Omegas[i]-w) > 1e-7*w {
				t.Fatalf("trial %d: omega %.12g; want %.12g", trial, rep.Omegas[i], w)
			}
		}
	}
}

// TestEpsilonCasesAgreeWithEigenvalues builds polynomials whose array has
// a zero pivot in a non-zero row: with a_n, a_(n-1), a_(n-2) random, the
// choice a_(n-3) = a_(n-1)·a_(n-2)/a_n zeroes the first entry of the
// s^(n-2) row (derived by hand: that entry is
// (a_(n-1)·a_(n-2) − a_n·a_(n-3))/a_(n-1)). Degrees 4 to 12.
func TestEpsilonCasesAgreeWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	checked, undecided, overruled := 0, 0, 0
	for trial := 0; trial < 3000; trial++ {
		n := 4 + trial%9
		desc := make([]float64, n+1)
		for i := range desc {
			desc[i] = (0.5 + rng.Float64()) * float64(1-2*rng.IntN(2))
		}
		desc[3] = desc[1] * desc[2] / desc[0]
		p := poly.FromDescending(desc)
		ref, ok := eigenCount(t, p)
		if !ok {
			continue
		}
		rep := Analyze(p)
		if rep.Undecided {
			undecided++
			continue
		}
		if rep.RHP != ref || rep.JW != 0 {
			t.Fatalf("trial %d: rhp %d jw %d; eigenvalues %d; p = %v", trial, rep.RHP, rep.JW, ref, desc)
		}
		if rep.FromEigenvalues {
			overruled++
		}
		checked++
	}
	if checked < 2500 {
		t.Fatalf("only %d of 3000 cases had a trustworthy reference", checked)
	}
	if undecided > checked/20 {
		t.Fatalf("%d of %d cases undecided; want at most 5%%", undecided, checked)
	}
	if overruled > checked/100 {
		t.Fatalf("the eigenvalues overruled the sign array in %d of %d cases; want at most 1%%", overruled, checked)
	}
	t.Logf("%d of %d cases undecided, %d overruled by the eigenvalues", undecided, checked, overruled)
}

// TestCountIsScaleInvariant checks that zero tests are relative: the same
// polynomial scaled by 1e-150 or 1e+150, or with s rescaled, gives the
// same answer, including the special cases.
func TestCountIsScaleInvariant(t *testing.T) {
	base := []poly.Poly{
		poly.FromDescending([]float64{1, 2, 3, 6, 5, 3}),   // ε rule
		poly.FromDescending([]float64{1, 7, 6, 42, 8, 56}), // all-zero row
		poly.FromDescending([]float64{1, 2, 3, 4, 5}),      // regular
	}
	for _, p := range base {
		want := Analyze(p)
		for _, c := range []float64{1e-150, 1e-20, 1e20, 1e150} {
			got := Analyze(p.Scaled(c))
			if got.RHP != want.RHP || got.JW != want.JW {
				t.Errorf("%v scaled by %g: rhp %d jw %d; want %d %d", p, c, got.RHP, got.JW, want.RHP, want.JW)
			}
		}
	}
}

// TestWideRangeCoefficients checks polynomials whose coefficients span
// many decades because their roots do: zero tests relative to the largest
// coefficient would call the leading coefficient of (s+1000)⁶ zero.
// Expected counts are from the construction (roots given).
func TestWideRangeCoefficients(t *testing.T) {
	tests := []struct {
		name  string
		roots []complex128
		rhp   int
	}{
		{"six fast roots", []complex128{-1000, -1000, -1000, -1000, -1000, -1000}, 0},
		{"slow and fast", []complex128{-1e-3, -1e-3, complex(-2e-3, 1e-3), complex(-2e-3, -1e-3), -1e3, -2e3}, 0},
		{"slow unstable pair among fast", []complex128{complex(1e-4, 1e-3), complex(1e-4, -1e-3), -1e4, -3e4}, 2},
		{"very slow loop", []complex128{-1e-60, complex(-1e-60, 2e-60), complex(-1e-60, -2e-60), 0.5e-60}, 1},
	}
	work := make([]float64, WorkLen(8))
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := poly.FromRoots(tc.roots)
			if got, _, st := Count(p, work); st != Decided || got != tc.rhp {
				t.Errorf("Count = %d (status %d); want %d", got, st, tc.rhp)
			}
			if rep := Analyze(p); rep.RHP != tc.rhp || rep.JW != 0 || rep.DegreeDrop != 0 {
				t.Errorf("Analyze: rhp %d jw %d drop %d; want %d, 0, 0", rep.RHP, rep.JW, rep.DegreeDrop, tc.rhp)
			}
		})
	}
}
