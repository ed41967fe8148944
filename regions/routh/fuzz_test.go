package routh

import (
	"math"
	"math/cmplx"
	"testing"
	"time"

	"gainscape/regions/poly"
)

// FuzzCount reads each input two ways.
//
// As coefficients: deg%13 is the degree and c0…c12 the coefficients,
// highest power first, with any values at all (NaN, ±Inf, huge, tiny,
// zero). Count and Analyze must return promptly without panicking, Count
// must stay within its scratch buffer, and every count they report must
// be possible: no negative counts, no more roots than the degree.
//
// As roots: 1 + deg%6 of the pairs (c0, c1), (c2, c3), … are roots re+j·im
// (a conjugate pair when im ≠ 0), moved into a well-conditioned range:
// magnitudes in [0.1, 10], so within a factor 100 of each other, and real
// parts at least 5% of the magnitude from the imaginary axis, the margin
// TestCountAgreesWithEigenvalues uses; c12 scales the polynomial. Moving
// roots onto the edges of that range makes repeated roots and roots
// mirrored through the origin common, which random sampling never gives.
// Count, when Decided, and Analyze must then agree with the
// right-half-plane count of gonum's eigenvalues, and Analyze must find no
// imaginary-axis root.
//
// The seed corpus, with the special cases of the array, is in
// testdata/fuzz/FuzzCount.
func FuzzCount(f *testing.F) {
	f.Fuzz(func(t *testing.T, deg uint8,
		c0, c1, c2, c3, c4, c5, c6, c7, c8, c9, c10, c11, c12 float64) {
		c := []float64{c0, c1, c2, c3, c4, c5, c6, c7, c8, c9, c10, c11, c12}
		checkAnyInput(t, poly.FromDescending(c[:int(deg)%13+1]))
		p, roots, want := wellConditioned(c[:2*(1+int(deg)%6)], c12)
		checkAgainstEigenvalues(t, p, roots, want)
	})
}

// guardLen is the number of slots past WorkLen that Count must not touch.
const guardLen = 8

// checkAnyInput runs Count and Analyze on arbitrary coefficients.
func checkAnyInput(t *testing.T, p poly.Poly) {
	n := len(p) - 1
	work := make([]float64, WorkLen(n)+guardLen)
	guard := work[WorkLen(n):]
	for i := range guard {
		guard[i] = -7.25
	}
	start := time.Now()
	rhp, zeros, st := Count(p, work[:WorkLen(n)])
	rep := Analyze(p)
	// Both are a few hundred operations for degree 12; seconds mean a
	// loop that does not end for this input.
	if d := time.Since(start); d > 2*time.Second {
		t.Errorf("Count and Analyze took %v on %v", d, p)
	}
	for i, v := range guard {
		if v != -7.25 {
			t.Fatalf("Count wrote past WorkLen(%d), at slot %d, for %v", n, i, p)
		}
	}
	if st == Decided && (rhp < 0 || zeros < 0 || rhp+zeros > n) {
		t.Fatalf("Count(%v) = %d right-half-plane and %d zero roots for degree %d", p, rhp, zeros, n)
	}
	if rep.Undecided {
		return
	}
	if rep.RHP < 0 || rep.JW < 0 || rep.DegreeDrop < 0 || rep.RHP+rep.JW+rep.DegreeDrop > rep.Degree {
		t.Fatalf("Analyze(%v): rhp %d, jw %d, degree drop %d for degree %d", p, rep.RHP, rep.JW, rep.DegreeDrop, rep.Degree)
	}
	if len(rep.Omegas) > rep.JW {
		t.Fatalf("Analyze(%v): %d frequencies %v for %d imaginary-axis roots", p, len(rep.Omegas), rep.Omegas, rep.JW)
	}
	for i, w := range rep.Omegas {
		if !(w >= 0) || math.IsInf(w, 0) || (i > 0 && !(w > rep.Omegas[i-1])) {
			t.Fatalf("Analyze(%v): frequencies %v are not finite, non-negative and ascending", p, rep.Omegas)
		}
	}
}

// wellConditioned builds the polynomial whose roots are the pairs in c,
// moved into magnitudes [0.1, 10] and at least 5% of their magnitude from
// the imaginary axis, times a scale taken from c12; want is the number of
// right-half-plane roots by construction.
func wellConditioned(c []float64, c12 float64) (p poly.Poly, roots []complex128, want int) {
	for i := 0; i+1 < len(c); i += 2 {
		re, im := c[i], c[i+1]
		if !finiteValue(re) || !finiteValue(im) {
			re, im = -1, 0
		}
		r := math.Hypot(re, im)
		if r == 0 || math.IsInf(r, 0) {
			re, im, r = -1, 0, 1
		}
		mag := math.Min(math.Max(r, 0.1), 10)
		re, im = re/r*mag, im/r*mag
		if math.Abs(re) < 0.05*mag {
			re = math.Copysign(0.05*mag, re)
			im = math.Copysign(math.Sqrt(mag*mag-re*re), im)
		}
		if re > 0 {
			want++
		}
		roots = append(roots, complex(re, im))
		if im != 0 {
			roots = append(roots, complex(re, -im))
			if re > 0 {
				want++
			}
		}
	}
	scale := 1.0
	if finiteValue(c12) && c12 != 0 {
		scale = math.Copysign(math.Min(math.Max(math.Abs(c12), 1e-100), 1e100), c12)
	}
	return poly.FromRoots(roots).Scaled(scale), roots, want
}

// checkAgainstEigenvalues compares Count and Analyze with gonum's
// eigenvalues and with the count by construction. Messages give the
// coefficients highest power first and the roots they were built from.
func checkAgainstEigenvalues(t *testing.T, p poly.Poly, roots []complex128, want int) {
	ref, ok := eigenCount(t, p)
	if !ok {
		t.Fatalf("reference root near the axis for roots built away from it; p = %v; roots %s", p.Descending(), poly.RootsString(roots))
	}
	if ref != want {
		t.Fatalf("eigenvalue count %d differs from construction %d; p = %v; roots %s", ref, want, p.Descending(), poly.RootsString(roots))
	}
	work := make([]float64, WorkLen(len(p)-1))
	if got, zeros, st := Count(p, work); st == Decided && (got != ref || zeros != 0) {
		t.Fatalf("Count = %d (zeros %d), eigenvalues %d; p = %v; roots %s", got, zeros, ref, p.Descending(), poly.RootsString(roots))
	}
	rep := Analyze(p)
	if rep.Undecided && clustered(roots) {
		// Repeated or mirrored roots make the array lose every digit of
		// some entry under rounding-size perturbations; declining to
		// decide is then a correct answer, a wrong count is not.
		return
	}
	if rep.Undecided || rep.RHP != ref || rep.JW != 0 {
		t.Fatalf("Analyze rhp %d jw %d (undecided %v %s), eigenvalues %d; p = %v; roots %s",
			rep.RHP, rep.JW, rep.Undecided, rep.Reason, ref, p.Descending(), poly.RootsString(roots))
	}
}

// clustered reports whether two roots coincide, or mirror each other
// about the imaginary axis, to within 1e-6 of their magnitude.
func clustered(roots []complex128) bool {
	for i, a := range roots {
		for _, b := range roots[i+1:] {
			tol := 1e-6 * math.Max(cmplx.Abs(a), cmplx.Abs(b))
			if cmplx.Abs(a-b) <= tol || cmplx.Abs(a+cmplx.Conj(b)) <= tol {
				return true
			}
		}
	}
	return false
}

func finiteValue(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
