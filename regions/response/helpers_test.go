package response

import (
	"math"
	"testing"

	"gainscape/regions/poly"
)

// p returns the polynomial with the coefficients listed highest power
// first, as the tests write them.
func p(c ...float64) poly.Poly { return poly.FromDescending(c) }

// within reports whether |got − want| ≤ tol·scale.
func within(got, want, tol, scale float64) bool {
	return math.Abs(got-want) <= tol*scale
}

// mustStep runs Step and fails the test on an error.
func mustStep(t testing.TB, l Loop, o Options) *Result {
	t.Helper()
	r, err := Step(l, o)
	if err != nil {
		t.Fatalf("Step(%v): %v", l, err)
	}
	return r
}

// compareTrace checks got against want(t) at every sample to tol times
// scale and returns the largest error found, relative to scale.
func compareTrace(t *testing.T, what string, times, got []float64, want func(float64) float64, tol, scale float64) float64 {
	t.Helper()
	worst := 0.0
	for k, tk := range times {
		e := math.Abs(got[k]-want(tk)) / scale
		if e > worst {
			worst = e
		}
		if e > tol {
			t.Errorf("%s at t = %g: got %.15g, want %.15g (error %.3g of scale %g, tolerance %g)", what, tk, got[k], want(tk), e, scale, tol)
			return e
		}
	}
	return worst
}

// check reports a figure that differs from want by more than tol·scale.
func check(t *testing.T, what string, got, want, tol, scale float64) {
	t.Helper()
	if !within(got, want, tol, scale) {
		t.Errorf("%s = %.15g, want %.15g (tolerance %g × %g)", what, got, want, tol, scale)
	}
}
