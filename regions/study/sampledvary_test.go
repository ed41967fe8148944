package study

import (
	"context"
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

// TestVarySampledEdgeCases covers gains near the limits of scale and an
// open-loop unstable plant, each derived by hand in this test from the
// one root of a held first-order plant (see TestVaryFirstOrderAlternating):
// g/(s + 1) puts it at a − K·g(1 − a), so the range is scaled by 1/g;
// 1/(s − 1) is (e^T − 1)/(z − e^T), with the root e^T − K(e^T − 1) inside
// for 1 < K < coth(T/2), entering through z = 1.
func TestVarySampledEdgeCases(t *testing.T) {
	const T = 0.2
	c := 1 / math.Tanh(T/2)
	cases := []struct {
		name, plant string
		lo, hi      float64 // the window
		wantLo      float64
		wantHi      float64
	}{
		{"tiny plant gain", "1e-12/(s+1)", -1e14, 1e14, -1e12, c * 1e12},
		{"huge plant gain", "1e12/(s+1)", -1e-10, 1e-10, -1e-12, c * 1e-12},
		{"open-loop unstable", "1/(s-1)", -5, 50, 1, c},
	}
	for _, cs := range cases {
		t.Run(cs.name, func(t *testing.T) {
			rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: cs.plant, Controller: "p", Sample: T}, Range: spec.Axis{Param: "kp", Min: cs.lo, Max: cs.hi}})
			if err != nil {
				t.Fatal(err)
			}
			if len(rep.Doc.Intervals) != 1 {
				t.Fatalf("%d intervals, want 1", len(rep.Doc.Intervals))
			}
			iv := rep.Doc.Intervals[0]
			// 1e-9 relative: intervals.Accuracy with a margin.
			if math.Abs(iv.Lo-cs.wantLo) > 1e-9*math.Abs(cs.wantLo) || math.Abs(iv.Hi-cs.wantHi) > 1e-9*cs.wantHi ||
				iv.LoKind != "real" || iv.HiKind != "alternating" {
				t.Fatalf("stable for %.12g < K < %.12g (%s to %s), want %.12g < K < %.12g (real to alternating)", iv.Lo, iv.Hi, iv.LoKind, iv.HiKind, cs.wantLo, cs.wantHi)
			}
		})
	}
}

// TestProbeSampledOgata probes K = 1 on K/(s(s+1)) held at T = 1 s: the
// gain margin is the gain limit of ogataLimit (K. Ogata, Discrete-Time
// Control Systems, from memory: 2.3925 from rounded coefficients), at the
// crossing frequency there; the poles are the roots of
// z² − z + (1 − 2/e)·… derived by hand: P(z) = z² + (a − 1)·z... with
// a = e^(−1): b1 = (T − 1 + a) − (1 + a) = −1, b0 = a + 1 − 2a = 1 − a,
// so |z|² = 1 − a and the decay rate is −ln(1 − a)/2.
func TestProbeSampledOgata(t *testing.T) {
	rep, err := Probe(context.Background(), ProbeRequest{Loop: LoopSpec{Plant: "1/(s*(s+1))", Controller: "p", Sample: 1, Fixed: []spec.Value{{Param: "kp", V: 1}}}})
	if err != nil {
		t.Fatal(err)
	}
	d := rep.Doc
	k, _, omega := ogataLimit(1)
	a := math.Exp(-1)
	switch {
	case !d.Stable || d.RHP != 0 || d.CountFrom != "Schur–Cohn recursion" || len(d.SignArray) != 3:
		t.Fatalf("verdict %v (%d outside) by %q with %d rows", d.Stable, d.RHP, d.CountFrom, len(d.SignArray))
	case math.Abs(float64(d.GainMargin)-k) > 1e-9*k || math.Abs(float64(d.PhaseCrossover)-omega) > 1e-8*omega:
		t.Fatalf("gain margin %.10g at ω %.10g, want %.10g at %.10g", float64(d.GainMargin), float64(d.PhaseCrossover), k, omega)
	case d.RootRadius == nil || math.Abs(*d.RootRadius-math.Sqrt(1-a)) > 1e-14:
		t.Fatalf("largest |z| %v, want √(1 − 1/e) = %g", d.RootRadius, math.Sqrt(1-a))
	case math.Abs(float64(d.DecayRate)+math.Log(1-a)/2) > 1e-14:
		t.Fatalf("decay rate %g, want −ln(1 − 1/e)/2 = %g", float64(d.DecayRate), -math.Log(1-a)/2)
	case d.Ultimate == nil || math.Abs(d.Ultimate.Ku-k) > 1e-10*k || d.Ultimate.Kind != "complex" || d.Ultimate.Method == "":
		t.Fatalf("ultimate %+v, want Ku = %g from a pair", d.Ultimate, k)
	case math.Abs(float64(d.MsFreq)) > math.Pi || d.SampleTime != 1:
		t.Fatalf("Ms at ω = %g beyond π/T, sample time %g", float64(d.MsFreq), d.SampleTime)
	}
}
