package unitcircle

import (
	"math"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
	"gainscape/regions/zoh"
)

// heldPlant discretises num/den (descending) behind a hold.
func heldPlant(t *testing.T, num, den []float64, T float64) (nz, dz poly.Poly) {
	t.Helper()
	nz, dz, err := zoh.Discretise(poly.FromDescending(num), poly.FromDescending(den), T, 0)
	if err != nil {
		t.Fatal(err)
	}
	return nz, dz
}

// edge bisects, between a stable and a non-stable value of a gain, to the
// point where the verdict changes, and returns it with the characteristic
// function there.
func edge(t *testing.T, c stability.Counter, stable, unstable float64, at func(k float64) poly.Poly) (float64, stability.Function) {
	t.Helper()
	if !c.Count(stability.Function{P: at(stable)}).Stable() || c.Count(stability.Function{P: at(unstable)}).Stable() {
		t.Fatalf("bracket %g (stable) … %g (not stable) is wrong", stable, unstable)
	}
	for range 200 {
		mid := (stable + unstable) / 2
		if mid == stable || mid == unstable {
			break
		}
		if c.Count(stability.Function{P: at(mid)}).Stable() {
			stable = mid
		} else {
			unstable = mid
		}
	}
	return stable, stability.Function{P: at(stable)}
}

// TestProportionalGainLimitIntegratorLag: K/(s(s + 1)) behind a hold under
// P control. K. Ogata, Discrete-Time Control Systems (from memory), finds
// the critical gain 2.3925 at T = 1 s from coefficients rounded to four
// digits (0.6321/0.2642). Derived by hand here: with a = e^(−T),
// b1 = T − 1 + a, b0 = 1 − a − T·a (see package zoh's tests),
//
//	P(z) = z² + (K·b1 − 1 − a)·z + (a + K·b0),
//
// and a quadratic z² + c1·z + c0 is stable iff c0 < 1, P(1) > 0, P(−1) > 0
// (Jury's conditions for degree 2, common practice). P(1) = K·T(1 − a)
// gives K > 0 (a real root through z = 1); c0 < 1 gives
// K < (1 − a)/b0, where the roots are a pair on the circle with
// cos θ = −c1/2; P(−1) = 2(1 + a) − K(b1 − b0) gives K < 2(1 + a)/(b1 − b0),
// a root through z = −1. The pair binds for T ≤ 2 and z = −1 at T = 4.
// Exactly, at T = 1, K_max = (1 − e^(−1))/(1 − 2e^(−1)) = 2.39221119….
// As T → 0, (1 − a)/b0 = (2/T)(1 + T/6 + O(T²)): the limit grows without
// bound.
func TestProportionalGainLimitIntegratorLag(t *testing.T) {
	tests := []struct {
		T    float64
		kind stability.Kind
	}{
		{1e-3, stability.Complex}, {0.1, stability.Complex}, {1, stability.Complex},
		{2, stability.Complex}, {4, stability.Alternating},
	}
	for _, tc := range tests {
		T := tc.T
		a := math.Exp(-T)
		b1 := T + math.Expm1(-T)
		b0 := -math.Expm1(-T) - T*a
		want := (1 - a) / b0
		if tc.kind == stability.Alternating {
			want = 2 * (1 + a) / (b1 - b0)
		}
		nz, dz := heldPlant(t, []float64{1}, []float64{1, 1, 0}, T)
		test := Test{T: T}
		c := test.NewCounter(3)
		at := func(k float64) poly.Poly { return family.Characteristic(nz, dz, poly.Poly{k}, poly.Poly{1}) }
		got, f := edge(t, c, 0.5*want, 1.5*want, at)
		// The closed form itself rounds b0, which cancels to T²/2 for
		// small T: relative 1e-9 at T = 1e-3.
		if math.Abs(got-want) > 1e-9*want {
			t.Errorf("T = %g: gain limit %.12g, closed form %.12g", T, got, want)
		}
		cr := test.Classify(f, f)
		if cr.Kind != tc.kind {
			t.Errorf("T = %g: crossing %v, want %v", T, cr.Kind, tc.kind)
		}
		wantOmega := math.Pi / T
		if tc.kind == stability.Complex {
			wantOmega = math.Acos((1+a-want*b1)/2) / T
		}
		if math.Abs(cr.Omega-wantOmega) > 1e-6*wantOmega {
			t.Errorf("T = %g: ω = %.9g, want %.9g", T, cr.Omega, wantOmega)
		}
		if T == 1 {
			t.Logf("T = 1 s: K_max = %.9f (Ogata's rounded coefficients: 2.3925), ω = %.6f rad/s", got, cr.Omega)
		}
		// The lower edge K = 0: a real root at z = 1.
		if v := c.Count(stability.Function{P: at(0)}); v.Boundary != 1 || v.Unstable != 0 {
			t.Errorf("T = %g, K = 0: %+v, want one root on the circle", T, v)
		}
		if k := test.Classify(stability.Function{P: at(1e-12)}, stability.Function{P: at(1e-12)}); k.Kind != stability.Real || k.Omega != 0 {
			t.Errorf("T = %g, K = 1e-12: crossing %+v, want real", T, k)
		}
	}
}

// TestProportionalRangeFirstOrder: K/(s + 1) behind a hold has
// G(z) = (1 − a)/(z − a), a = e^(−T) (package zoh), and under P control
// the single root z = a − K(1 − a). Derived by hand: z < 1 ⇔ K > −1 (the
// root leaves through z = 1, Real), z > −1 ⇔ K < (1 + a)/(1 − a) =
// coth(T/2) (it leaves through z = −1, Alternating, ω = π/T).
func TestProportionalRangeFirstOrder(t *testing.T) {
	for _, T := range []float64{1e-4, 0.1, 1, 5} {
		nz, dz := heldPlant(t, []float64{1}, []float64{1, 1}, T)
		test := Test{T: T}
		c := test.NewCounter(2)
		at := func(k float64) poly.Poly { return family.Characteristic(nz, dz, poly.Poly{k}, poly.Poly{1}) }
		hi := 1 / math.Tanh(T/2)
		upper, fu := edge(t, c, 0, 2*hi, at)
		lower, fl := edge(t, c, 0, -3, at)
		// P(z) = z − a + K(1 − a) carries rounding of about one unit in
		// the last place of a, which moves K by u/(1 − a): 1e-12 of K at
		// T = 1e-4, where the marginal band the test reports is that wide.
		tol := 1e-13 + 100*unit/(1-math.Exp(-T))
		if math.Abs(upper-hi) > tol*hi || math.Abs(lower+1) > tol {
			t.Errorf("T = %g: range (%.15g, %.15g), want (−1, %.15g)", T, lower, upper, hi)
		}
		if k := test.Classify(fu, fu); k.Kind != stability.Alternating || math.Abs(k.Omega-math.Pi/T) > 1e-12*math.Pi/T {
			t.Errorf("T = %g: upper edge %+v, want alternating at π/T", T, k)
		}
		if k := test.Classify(fl, fl); k.Kind != stability.Real || k.Omega != 0 {
			t.Errorf("T = %g: lower edge %+v, want real", T, k)
		}
	}
}

// TestDigitalPITriangle: a backward-difference PI,
// C(z) = ((kp + T·ki)·z − kp)/(z − 1), on the held lag 1/(s + 1),
// G(z) = b/(z − a), a = e^(−T), b = 1 − a. Derived by hand:
//
//	P(z) = (z − 1)(z − a) + b((kp + T·ki)·z − kp)
//	     = z² + (b·kp + b·T·ki − 1 − a)·z + (a − b·kp),
//
// stable iff (Jury's conditions for degree 2, common practice)
//
//	P(1) = b·T·ki > 0                       ki > 0           (z = 1, Real)
//	c0 < 1: a − b·kp < 1                    kp > −1          (pair on the circle)
//	P(−1) = 2(1 + a) − b(2·kp + T·ki) > 0   2·kp + T·ki < 2·coth(T/2)   (z = −1)
//
// (c0 > −1 follows from the first and third). The region is the triangle
// with vertices (−1, 0), (coth(T/2), 0) and (−1, 2(coth(T/2) + 1)/T); on
// the side kp = −1, c0 = 1 and c1 = b·T·ki − 2, so the pair sits at
// cos θ = 1 − b·T·ki/2.
func TestDigitalPITriangle(t *testing.T) {
	const T = 0.5
	a := math.Exp(-T)
	b := 1 - a
	ct := 1 / math.Tanh(T/2)
	nz, dz := heldPlant(t, []float64{1}, []float64{1, 1}, T)
	pi, err := family.Digital("pi", T, family.Backward)
	if err != nil {
		t.Fatal(err)
	}
	test := Test{T: T}
	c := test.NewCounter(3)
	at := func(kp, ki float64) stability.Function {
		cn, cd := family.Controller(pi, []float64{kp, ki})
		return stability.Function{P: family.Characteristic(nz, dz, cn, cd)}
	}
	v1, v2, v3 := [2]float64{-1, 0}, [2]float64{ct, 0}, [2]float64{-1, 2 * (ct + 1) / T}
	centre := [2]float64{(v1[0] + v2[0] + v3[0]) / 3, (v1[1] + v2[1] + v3[1]) / 3}
	sides := []struct {
		name   string
		p, q   [2]float64
		kind   stability.Kind
		omega  func(kp, ki float64) float64
		onEdge bool // the point on the side is exactly representable
	}{
		{"ki = 0", v1, v2, stability.Real, func(_, _ float64) float64 { return 0 }, true},
		{"kp = −1", v1, v3, stability.Complex, func(_, ki float64) float64 { return math.Acos(1-b*T*ki/2) / T }, false},
		{"2kp + T·ki = 2coth(T/2)", v2, v3, stability.Alternating, func(_, _ float64) float64 { return math.Pi / T }, false},
	}
	if !c.Count(at(centre[0], centre[1])).Stable() {
		t.Fatalf("the centre %v of the triangle is not stable", centre)
	}
	for _, s := range sides {
		for _, f := range []float64{0.2, 0.5, 0.8} {
			m := [2]float64{s.p[0] + f*(s.q[0]-s.p[0]), s.p[1] + f*(s.q[1]-s.p[1])}
			// Just inside (towards the centre) and just outside, 1e-6 of
			// the way.
			in := [2]float64{m[0] + 1e-6*(centre[0]-m[0]), m[1] + 1e-6*(centre[1]-m[1])}
			out := [2]float64{m[0] - 1e-6*(centre[0]-m[0]), m[1] - 1e-6*(centre[1]-m[1])}
			if v := c.Count(at(in[0], in[1])); !v.Stable() {
				t.Errorf("%s, %v: just inside %+v", s.name, in, v)
			}
			if v := c.Count(at(out[0], out[1])); v.Class() != stability.ClassUnstable {
				t.Errorf("%s, %v: just outside %+v", s.name, out, v)
			}
			if s.onEdge {
				if v := c.Count(at(m[0], m[1])); v.Class() != stability.ClassMarginal || v.Boundary != 1 {
					t.Errorf("%s, %v: on the edge %+v, want one root on the circle", s.name, m, v)
				}
			}
			k := test.Classify(at(m[0], m[1]), at(m[0], m[1]))
			want := s.omega(m[0], m[1])
			if k.Kind != s.kind || math.Abs(k.Omega-want) > 1e-7*(1+want) {
				t.Errorf("%s, %v: crossing %v at ω = %.9g, want %v at %.9g", s.name, m, k.Kind, k.Omega, s.kind, want)
			}
		}
	}
}
