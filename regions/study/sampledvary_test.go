package study

import (
	"math"
	"testing"

	"gainscape/regions/spec"
)

// ogataLimit is the P-only gain limit of K/(s(s+1)) behind a zero-order
// hold with sample time T, and the kind and frequency of the crossing
// there. Derived by hand in this test: with a = e^(−T),
//
//	G(z) = ((T − 1 + a)·z + (1 − a − T·a)) / ((z − 1)(z − a)),
//	P(z) = z² + (K(T − 1 + a) − (1 + a))·z + a + K(1 − a − T·a).
//
// A second-order P(z) = z² + b1·z + b0 is stable exactly when |b0| < 1,
// P(1) > 0 and P(−1) > 0 (the Jury conditions). P(1) = K·T(1 − a) > 0
// gives K > 0; b0 < 1 gives K < (1 − a)/(1 − a − T·a), where a complex
// pair reaches the circle at cos θ = −b1/2; P(−1) > 0 gives
// K < 2(1 + a)/(T(1 + a) − 2(1 − a)), where a real root reaches z = −1.
// The smaller bound is the limit: the pair for small T, the alternating
// root for large T (they cross near T = 3.3).
func ogataLimit(T float64) (k float64, alternating bool, omega float64) {
	a := math.Exp(-T)
	kc := (1 - a) / (1 - a - T*a)
	ka := 2 * (1 + a) / (T*(1+a) - 2*(1-a))
	if ka < kc {
		return ka, true, math.Pi / T
	}
	b1 := kc*(T-1+a) - (1 + a)
	return kc, false, math.Acos(-b1/2) / T
}

// TestVaryOgataGainLimit checks the stable range of a proportional gain
// on K/(s(s+1)) under a zero-order hold against the textbook value and
// the hand derivation of ogataLimit. K. Ogata, Discrete-Time Control
// Systems (2nd ed.), the Jury-test example of this loop at T = 1 s (from
// memory): K < 2.3925 with the coefficients rounded to four digits
// (0.2642K < 0.6321); exactly, (1 − e^(−1))/(1 − 2e^(−1)) = 2.392211191…
func TestVaryOgataGainLimit(t *testing.T) {
	const textbook = 2.3925 // Ogata, from memory, rounded coefficients
	exact := (1 - math.Exp(-1)) / (1 - 2*math.Exp(-1))
	if math.Abs(exact-2.392211191) > 1e-9 || math.Abs(exact-textbook) > 5e-4 {
		t.Fatalf("the hand-derived limit %.10g does not agree with the textbook's %g", exact, textbook)
	}
	prev := 0.0
	for _, T := range []float64{4, 2, 1, 0.5, 0.1, 0.01} {
		rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: "1/(s*(s+1))", Controller: "p", Sample: T}, Range: spec.Axis{Param: "kp", Min: 0, Max: 1000}})
		if err != nil {
			t.Fatal(err)
		}
		if len(rep.Intervals) != 1 {
			t.Fatalf("T = %g: %d intervals, want 1", T, len(rep.Intervals))
		}
		k, alt, omega := ogataLimit(T)
		iv := rep.Doc.Intervals[0]
		// Interval ends are accurate to 1e-10 relative (intervals.Accuracy).
		if iv.Lo != 0 || iv.LoKind != "real" || math.Abs(iv.Hi-k) > 1e-9*k {
			t.Fatalf("T = %g: stable for %g < K < %g (%s to %s), want 0 < K < %.10g", T, iv.Lo, iv.Hi, iv.LoKind, iv.HiKind, k)
		}
		wantKind := "complex"
		if alt {
			wantKind = "alternating"
		}
		if iv.HiKind != wantKind || math.Abs(float64(iv.HiOmega)-omega) > 1e-7*omega {
			t.Fatalf("T = %g: upper end %s at ω %g, want %s at ω %.8g", T, iv.HiKind, float64(iv.HiOmega), wantKind, omega)
		}
		if T == 1 && math.Abs(iv.Hi-exact) > 1e-9 {
			t.Fatalf("T = 1: limit %.10g, want %.10g", iv.Hi, exact)
		}
		// As T → 0 the limit grows like 2/T (expand a = e^(−T)): without
		// bound, and never smaller for a faster sample.
		if !(iv.Hi > prev) {
			t.Fatalf("T = %g: limit %g is not above the limit %g of the slower sample before", T, iv.Hi, prev)
		}
		if T <= 0.1 && math.Abs(iv.Hi*T/2-1) > T {
			t.Fatalf("T = %g: limit %g is not near 2/T = %g", T, iv.Hi, 2/T)
		}
		prev = iv.Hi
	}
}

// TestVaryFirstOrderAlternating checks the P-only range of K/(s + 1)
// under a zero-order hold. Derived by hand in this test: G(z) =
// (1 − a)/(z − a) with a = e^(−T), so the one closed-loop root is
// z = a − K(1 − a); |z| < 1 exactly for −1 < K < (1 + a)/(1 − a) =
// coth(T/2). The root leaves through z = 1 at K = −1 and through z = −1
// at K = coth(T/2), where the output alternates every sample.
func TestVaryFirstOrderAlternating(t *testing.T) {
	for _, T := range []float64{1e-3, 0.1, 0.5, 2, 20} {
		rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: "1/(s+1)", Controller: "p", Sample: T}, Range: spec.Axis{Param: "kp", Min: -5, Max: 1e5}})
		if err != nil {
			t.Fatal(err)
		}
		if len(rep.Intervals) != 1 {
			t.Fatalf("T = %g: %d intervals, want 1", T, len(rep.Intervals))
		}
		want := 1 / math.Tanh(T/2)
		iv := rep.Doc.Intervals[0]
		// 1e-9 relative: intervals.Accuracy with a margin.
		if math.Abs(iv.Lo+1) > 1e-9 || iv.LoKind != "real" || math.Abs(iv.Hi-want) > 1e-9*want || iv.HiKind != "alternating" {
			t.Fatalf("T = %g: stable for %.12g < K < %.12g (%s to %s), want −1 < K < %.12g (real to alternating)", T, iv.Lo, iv.Hi, iv.LoKind, iv.HiKind, want)
		}
		if math.Abs(float64(iv.HiOmega)-math.Pi/T) > 1e-12*math.Pi/T {
			t.Fatalf("T = %g: ω at z = −1 is %g, want π/T = %g", T, float64(iv.HiOmega), math.Pi/T)
		}
		if rep.Doc.SampleTime != T || rep.Doc.Integral != "backward" {
			t.Fatalf("T = %g: document says sample time %g, integral %q", T, rep.Doc.SampleTime, rep.Doc.Integral)
		}
	}
}
