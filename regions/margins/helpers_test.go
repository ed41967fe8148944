package margins

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
)

// close reports whether got is within rel relative (or rel absolute near
// zero) of want; infinities must match exactly.
func closeTo(got, want, rel float64) bool {
	if math.IsInf(want, 0) || math.IsInf(got, 0) {
		return got == want
	}
	return math.Abs(got-want) <= rel*math.Max(1, math.Abs(want))
}

func check(t *testing.T, what string, got, want, rel float64) {
	t.Helper()
	if !closeTo(got, want, rel) {
		t.Errorf("%s = %.15g, want %.15g (rel tol %g)", what, got, want, rel)
	}
}

// stableRoots returns n roots (conjugate pairs together) in the open left
// half plane with magnitudes in [e^-spread, e^spread] and damping at least
// minDamp.
func stableRoots(rng *rand.Rand, n int, minDamp, spread float64) []complex128 {
	var roots []complex128
	for len(roots) < n {
		mag := math.Exp((2*rng.Float64() - 1) * spread)
		if n-len(roots) >= 2 && rng.IntN(2) == 0 {
			zeta := minDamp + (1-minDamp)*rng.Float64()
			re, im := -mag*zeta, mag*math.Sqrt(1-zeta*zeta)
			roots = append(roots, complex(re, im), complex(re, -im))
			continue
		}
		roots = append(roots, complex(-mag, 0))
	}
	return roots
}

func mustMargins(t *testing.T, l Loop) Margins {
	t.Helper()
	m, err := l.Margins()
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// p is shorthand for a polynomial written highest power first.
func p(c ...float64) poly.Poly { return poly.FromDescending(c) }
