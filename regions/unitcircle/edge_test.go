package unitcircle

import (
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

func verdictOf(c stability.Counter, p poly.Poly) stability.Verdict {
	return c.Count(stability.Function{P: p})
}

// TestEdgeCases covers the special polynomials of the test, each invented
// here with its roots stated.
func TestEdgeCases(t *testing.T) {
	circle20 := make(poly.Poly, 21) // z^20 − 1: the 20th roots of unity
	circle20[0], circle20[20] = -1, 1
	power20 := func(r float64) poly.Poly { // (z − r)^20, rounded
		p := poly.Poly{1}
		for range 20 {
			p = poly.Mul(p, poly.Poly{-r, 1})
		}
		return p
	}
	ring := func(r float64) poly.Poly { // z^20 − r^20: 20 roots on |z| = r
		p := make(poly.Poly, 21)
		p[0], p[20] = -math.Pow(r, 20), 1
		return p
	}
	tests := []struct {
		name string
		p    poly.Poly
		want stability.Verdict
	}{
		{"constant", poly.Poly{3}, stability.Verdict{}},
		{"roots at z = 0 only", poly.Poly{0, 0, 0, 2}, stability.Verdict{}},
		{"exact degree drop", poly.Poly{-0.25, 1, 0}, stability.Verdict{Infinite: 1}},
		{"two exact degree drops and a root outside", poly.Poly{-3, 1, 0, 0}, stability.Verdict{Unstable: 1, Infinite: 2}},
		// Only an exact zero is a root at infinity; 1e-20 is a root near
		// −1e19, outside.
		{"tiny leading coefficient", poly.Poly{0.1, 1, 1e-20}, stability.Verdict{Unstable: 1}},
		{"small leading coefficient", poly.Poly{0.1, 1, 1e-6}, stability.Verdict{Unstable: 1}},
		{"scaled by 1e-12", poly.FromDescending([]float64{1e-12, -1.2e-12, 0.07e-12, 0.3e-12, -0.08e-12}), stability.Verdict{}},
		{"scaled by 1e12", poly.FromDescending([]float64{1e12, -1.3e12, -0.08e12, 0.24e12}), stability.Verdict{Unstable: 1}},
		{"20th roots of unity", circle20, stability.Verdict{Boundary: 20}},
		{"20-fold root at 0.5", power20(0.5), stability.Verdict{}},
		// Rounded to double precision, (z − 0.9)^20 has roots from about
		// 0.6 to 1.2 (gonum eigenvalues) and a mapped constant coefficient
		// (1/10)^20 against terms near 10^5: its coefficients do not tell
		// where its roots lie.
		{"20-fold root at 0.9", power20(0.9), stability.Verdict{Unstable: stability.Undecided}},
		{"20 roots on |z| = 0.95", ring(0.95), stability.Verdict{}},
		{"20 roots on |z| = 1.02", ring(1.02), stability.Verdict{Unstable: 20}},
		// (z − 1)(z + 1)(z² − z + 1)·z: every kind of root on the circle and
		// one at the origin.
		{"all three kinds on the circle", poly.Mul(poly.Mul(poly.Poly{-1, 0, 1}, poly.Poly{1, -1, 1}), poly.Poly{0, 1}), stability.Verdict{Boundary: 4}},
		{"non-finite", poly.Poly{1, math.NaN()}, stability.Verdict{Unstable: stability.Undecided}},
		{"zero", poly.Poly{0, 0}, stability.Verdict{Unstable: stability.Undecided}},
	}
	c := Test{T: 1}.NewCounter(21)
	for _, tc := range tests {
		if v := verdictOf(c, tc.p); v != tc.want {
			t.Errorf("%s: %+v, want %+v", tc.name, v, tc.want)
		}
	}
	rep := Test{T: 2}.Report(stability.Function{P: circle20})
	if len(rep.Omegas) != 11 || rep.Omegas[0] != 0 || math.Abs(rep.Omegas[10]-math.Pi/2) > 1e-12 {
		t.Errorf("20th roots of unity at T = 2: ω = %v, want 11 values kπ/20 from 0 to π/2", rep.Omegas)
	}
}

// TestAlgebraicLoop: the biproper plant (s + 3)/(s + 1) has direct
// feedthrough G(∞) = 1 after the hold (package zoh: numZ's leading
// coefficient is the feedthrough), so under P control the characteristic
// polynomial's leading coefficient is 1 + K (derived by hand), which
// vanishes at K = −1: no causal loop, a root at z = ∞, and outside the
// circle on both sides.
func TestAlgebraicLoop(t *testing.T) {
	const T = 0.2
	nz, dz := heldPlant(t, []float64{1, 3}, []float64{1, 1}, T)
	test := Test{T: T}
	c := test.NewCounter(2)
	at := func(k float64) poly.Poly { return family.Characteristic(nz, dz, poly.Poly{k}, poly.Poly{1}) }
	if v := verdictOf(c, at(-1)); v.Infinite != 1 || v.Unstable != 0 {
		t.Errorf("K = −1: %+v, want the root at infinity", v)
	}
	for _, k := range []float64{-1.01, -0.99} {
		if v := verdictOf(c, at(k)); v.Unstable != 1 {
			t.Errorf("K = %g: %+v, want one root outside", k, v)
		}
	}
	if k := test.Classify(stability.Function{P: at(-1 + 1e-13)}, stability.Function{P: at(-1 + 1e-13)}); k.Kind != stability.Infinite {
		t.Errorf("K = −1 + 1e-13: crossing %+v, want infinite", k)
	}
}

// TestOpenLoopUnstable: K/(s − 1) behind a hold is (e^T − 1)/(z − e^T)
// (the same derivation as for 1/(s + 1) with a = e^T), so under P control
// the root is z = e^T − K(e^T − 1); derived by hand it is inside iff
// 1 < K < (e^T + 1)/(e^T − 1) = coth(T/2): a real edge at K = 1 and an
// alternating one above.
func TestOpenLoopUnstable(t *testing.T) {
	for _, T := range []float64{0.5, 3} {
		nz, dz := heldPlant(t, []float64{1}, []float64{1, -1}, T)
		test := Test{T: T}
		c := test.NewCounter(2)
		at := func(k float64) poly.Poly { return family.Characteristic(nz, dz, poly.Poly{k}, poly.Poly{1}) }
		hi := 1 / math.Tanh(T/2)
		mid := (1 + hi) / 2
		lo, fl := edge(t, c, mid, 0, at)
		up, fu := edge(t, c, mid, 2*hi, at)
		if math.Abs(lo-1) > 1e-12 || math.Abs(up-hi) > 1e-12*hi {
			t.Errorf("T = %g: range (%.15g, %.15g), want (1, %.15g)", T, lo, up, hi)
		}
		if k := test.Classify(fl, fl); k.Kind != stability.Real {
			t.Errorf("T = %g: lower edge %+v", T, k)
		}
		if k := test.Classify(fu, fu); k.Kind != stability.Alternating {
			t.Errorf("T = %g: upper edge %+v", T, k)
		}
	}
}

// TestFastAndSlowSampling: 1/(s + 1)³ under P control is stable for
// K < 8 in continuous time (Routh, common practice), the pair crossing at
// ω = √3. Sampled at T = 1e-4 the hold's lag of ωT/2 lowers the limit by
// a relative 1e-4 or so, so it lies in (7.99, 8), crossing near √3. At
// T = 50 the plant has settled within one sample: G(z) ≈ 1/z³·(z³ …)
// reduces to the static gain behind a delay of one sample, G(z) ≈ 1/z
// (the step response is 1 at every sample after the first), so the
// limit tends to 1 (a root through z = −1) and the counts must agree with
// the eigenvalues.
func TestFastAndSlowSampling(t *testing.T) {
	nz, dz := heldPlant(t, []float64{1}, []float64{1, 3, 3, 1}, 1e-4)
	test := Test{T: 1e-4}
	c := test.NewCounter(4)
	at := func(k float64) poly.Poly { return family.Characteristic(nz, dz, poly.Poly{k}, poly.Poly{1}) }
	k, f := edge(t, c, 4, 12, at)
	if !(k > 7.99 && k < 8) {
		t.Errorf("T = 1e-4: limit %.9g, want in (7.99, 8)", k)
	}
	if cr := test.Classify(f, f); cr.Kind != stability.Complex || math.Abs(cr.Omega-math.Sqrt(3)) > 1e-3 {
		t.Errorf("T = 1e-4: crossing %+v, want complex near √3", cr)
	}

	nz, dz = heldPlant(t, []float64{1}, []float64{1, 3, 3, 1}, 50)
	slow := Test{T: 50}
	c = slow.NewCounter(4)
	at = func(k float64) poly.Poly { return family.Characteristic(nz, dz, poly.Poly{k}, poly.Poly{1}) }
	k, f = edge(t, c, 0.5, 2, at)
	if math.Abs(k-1) > 1e-9 {
		t.Errorf("T = 50: limit %.12g, want 1", k)
	}
	if cr := slow.Classify(f, f); cr.Kind != stability.Alternating {
		t.Errorf("T = 50: crossing %+v, want alternating", cr)
	}
	for _, g := range []float64{1e-12, 0.3, 0.99, 1.01, 7, 1e12} {
		ref, ok := eigenOutside(t, at(g))
		if v := verdictOf(c, at(g)); ok && v.Unstable != ref {
			t.Errorf("T = 50, K = %g: %+v, eigenvalues %d outside", g, v, ref)
		}
	}
}

// TestNonMinimumPhase sweeps P control of the invented plant
// (1 − s)/((s + 1)(s + 2)) sampled at T = 0.3 and checks every count
// against the eigenvalues, negative gains included.
func TestNonMinimumPhase(t *testing.T) {
	nz, dz := heldPlant(t, []float64{-1, 1}, []float64{1, 3, 2}, 0.3)
	c := Test{T: 0.3}.NewCounter(3)
	for k := -6.0; k <= 6; k += 0.0625 {
		p := family.Characteristic(nz, dz, poly.Poly{k}, poly.Poly{1})
		ref, ok := eigenOutside(t, p)
		if v := verdictOf(c, p); ok && v.Unstable != ref {
			t.Errorf("K = %g: %+v, eigenvalues %d outside", k, v, ref)
		}
	}
}

// TestClassifyOnTheCircle classifies polynomials with roots exactly on
// the circle (invented): z² − 1.5z + 0.5 (1 and 0.5),
// z² + 1.5z + 0.5 (−1 and −0.5), z³ − 1.5z² + 1.5z − 0.5 (e^(±jπ/3), 0.5).
func TestClassifyOnTheCircle(t *testing.T) {
	const T = 0.25
	test := Test{T: T}
	tests := []struct {
		p     poly.Poly
		kind  stability.Kind
		omega float64
	}{
		{poly.Poly{0.5, -1.5, 1}, stability.Real, 0},
		{poly.Poly{0.5, 1.5, 1}, stability.Alternating, math.Pi / T},
		{poly.Poly{-0.5, 1.5, -1.5, 1}, stability.Complex, math.Pi / 3 / T},
	}
	for _, tc := range tests {
		k := test.Classify(stability.Function{P: tc.p}, stability.Function{P: tc.p})
		if k.Kind != tc.kind || math.Abs(k.Omega-tc.omega) > 1e-12*(1+tc.omega) {
			t.Errorf("%v: %+v, want %v at %g", tc.p, k, tc.kind, tc.omega)
		}
	}
	if k := test.Classify(stability.Function{P: poly.Poly{2}}, stability.Function{P: poly.Poly{2}}); k.Kind != stability.None {
		t.Errorf("constant: %+v", k)
	}
	if k := test.Classify(stability.Function{P: poly.Poly{0.5, 1, 0}}, stability.Function{P: poly.Poly{0.5, 1, 0}}); k.Kind != stability.Infinite {
		t.Errorf("exact degree drop: %+v", k)
	}
	// The angle of the pair is read from the root, polished: compare with
	// the exact e^(jπ/3).
	if d := cmplx.Abs(cmplx.Rect(1, math.Pi/3) - complex(0.5, math.Sqrt(3)/2)); d > 1e-15 {
		t.Fatalf("reference root off by %g", d)
	}
}

func TestNewRejectsBadSampleTimes(t *testing.T) {
	for _, T := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		if _, err := New(T); err == nil {
			t.Errorf("New(%g) accepted", T)
		}
	}
	if tt, err := New(0.1); err != nil || tt.T != 0.1 {
		t.Errorf("New(0.1) = %+v, %v", tt, err)
	}
}

func TestMisusePanics(t *testing.T) {
	cases := map[string]func(){
		"delayed part": func() {
			Test{T: 1}.NewCounter(3).Count(stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{1}, Delay: 1})
		},
		"too long":          func() { Test{T: 1}.NewCounter(2).Count(stability.Function{P: poly.Poly{1, 1, 1}}) },
		"zero sample time":  func() { Test{}.Report(stability.Function{P: poly.Poly{1, 1}}) },
		"grader too short ": func() { _, _ = NewGrader(2, 1).Grade(poly.Poly{1, 1, 1}) },
	}
	for name, f := range cases {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s did not panic", name)
				}
			}()
			f()
		}()
	}
}
