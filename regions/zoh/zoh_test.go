package zoh

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gainscape/regions/poly"
)

// closeRel reports whether every coefficient of got is within tol of want
// relative to the largest coefficient of want.
func closeRel(got, want poly.Poly, tol float64) bool {
	if len(got) != len(want) {
		return false
	}
	scale := want.Scale()
	for k := range want {
		if math.Abs(got[k]-want[k]) > tol*scale {
			return false
		}
	}
	return true
}

// TestFirstOrderLag checks G(s) = 1/(s + 1). Derived by hand: the step
// response 1 − e^(−t) sampled gives Z{G/s} = z/(z−1) − z/(z − e^(−T)),
// and (1 − z⁻¹) times that is (1 − e^(−T))/(z − e^(−T)).
func TestFirstOrderLag(t *testing.T) {
	for _, T := range []float64{1e-4, 0.1, 1, 10, 60} {
		num, den, err := Discretise(poly.Poly{1}, poly.Poly{1, 1}, T, 0)
		if err != nil {
			t.Fatal(err)
		}
		a := math.Exp(-T)
		// 1 − e^(−T) written without cancellation. Relative 1e-14: the
		// squarings of the exponential at T = 60 cost about 8 units in the
		// last place.
		if !closeRel(num, poly.Poly{-math.Expm1(-T), 0}, 1e-14) {
			t.Errorf("T = %g: numerator %v, want %v (relative 1e-14)", T, num, -math.Expm1(-T))
		}
		if !closeRel(den, poly.Poly{-a, 1}, 4e-16) {
			t.Errorf("T = %g: denominator %v, want [%g 1]", T, den, -a)
		}
	}
}

// seriesTail returns Σ_{k≥2} w(k)·(−T)^k/k!, summed until the terms no
// longer change the sum: the reference for coefficients that cancel to
// O(T²) for small T.
func seriesTail(T float64, w func(k int) float64) float64 {
	s, term := 0.0, T // term = T^k/k! at k = 1
	for k := 2; k < 200; k++ {
		term *= T / float64(k)
		v := w(k) * term
		if k%2 == 1 {
			v = -v
		}
		if s+v == s && k > 4 {
			break
		}
		s += v
	}
	return s
}

// TestIntegratorWithLag checks K/(s(s + 1)) against the closed form in K.
// Ogata, Discrete-Time Control Systems (from memory), tabulates it as
// K·((T − 1 + e^(−T))·z + (1 − e^(−T) − T·e^(−T)))/((z − 1)(z − e^(−T))).
// Derived by hand here: G(s)/s = 1/s² − 1/s + 1/(s + 1), whose sampled
// inverse transform is Tz/(z−1)² − z/(z−1) + z/(z − a) with a = e^(−T);
// times (z − 1)/z, over the denominator (z − 1)(z − a):
// T(z − a) − (z − 1)(z − a) + (z − 1)² = (T − 1 + a)·z + (1 − a − T·a).
// Both numerator coefficients are Σ_{k≥2} of series in T: T − 1 + e^(−T)
// has terms (−T)^k/k!, and 1 − e^(−T)(1 + T) has terms (k − 1)(−T)^k/k!
// (the coefficient of T^k in e^(−T)(1 + T) is (−1)^k(1 − k)/k!).
func TestIntegratorWithLag(t *testing.T) {
	const K = 2.5
	for _, T := range []float64{1e-4, 0.01, 0.5, 1, 3} {
		num, den, err := Discretise(poly.Poly{K}, poly.Poly{0, 1, 1}, T, 0)
		if err != nil {
			t.Fatal(err)
		}
		a := math.Exp(-T)
		b1 := seriesTail(T, func(int) float64 { return 1 })
		b0 := seriesTail(T, func(k int) float64 { return float64(k - 1) })
		wantNum := poly.Poly{K * b0, K * b1, 0}
		wantDen := poly.Poly{a, -1 - a, 1}
		if !closeRel(num, wantNum, 1e-14) {
			t.Errorf("T = %g: numerator %v, want %v (relative 1e-14)", T, num, wantNum)
		}
		if !closeRel(den, wantDen, 4e-16) {
			t.Errorf("T = %g: denominator %v, want %v", T, den, wantDen)
		}
		if den[0] != a || den[1] != -1-a {
			// (z − 1) is taken exactly for the integrator.
			t.Errorf("T = %g: denominator %v is not (z − 1)(z − e^(−T)) to the last bit", T, den)
		}
	}
}

// eulerian holds the Eulerian polynomials A_n(z), ascending, for the
// powers of an integrator: ZOH{1/sⁿ} = Tⁿ·A_n(z)/(n!·(z − 1)ⁿ), since
// Z{(kT)ⁿ/n!} = Tⁿ·z·A_n(z)/(n!(z − 1)^(n+1)) and the hold multiplies by
// (z − 1)/z. The coefficients are the Eulerian numbers (common practice;
// e.g. G. F. Franklin, J. D. Powell, M. Workman, Digital Control of
// Dynamic Systems, 3rd ed., the table of z-transforms, from memory, for
// n ≤ 3), checked here by their recurrence A(n,k) = (k+1)·A(n−1,k) +
// (n−k)·A(n−1,k−1) in TestEulerianTable.
var eulerian = [][]float64{
	1: {1},
	2: {1, 1},
	3: {1, 4, 1},
	4: {1, 11, 11, 1},
	5: {1, 26, 66, 26, 1},
	6: {1, 57, 302, 302, 57, 1},
	7: {1, 120, 1191, 2416, 1191, 120, 1},
	8: {1, 247, 4293, 15619, 15619, 4293, 247, 1},
}

func TestEulerianTable(t *testing.T) {
	for n := 2; n < len(eulerian); n++ {
		for k := range eulerian[n] {
			v := 0.0
			if k < len(eulerian[n-1]) {
				v += float64(k+1) * eulerian[n-1][k]
			}
			if k >= 1 {
				v += float64(n-k) * eulerian[n-1][k-1]
			}
			if v != eulerian[n][k] {
				t.Fatalf("A(%d,%d) = %g, recurrence gives %g", n, k, eulerian[n][k], v)
			}
		}
	}
}

// TestIntegratorPowers measures the accuracy of the interpolated
// numerator on 1/sⁿ, whose discretisation is known in closed form (see
// eulerian), up to order 8 and over seven decades of T.
func TestIntegratorPowers(t *testing.T) {
	worst := 0.0
	for n := 1; n < len(eulerian); n++ {
		den := make(poly.Poly, n+1)
		den[n] = 1
		for _, T := range []float64{1e-4, 0.01, 0.3, 1, 7} {
			num, dz, err := Discretise(poly.Poly{1}, den, T, 0)
			if err != nil {
				t.Fatal(err)
			}
			c := math.Pow(T, float64(n)) / math.Gamma(float64(n+1))
			want := make(poly.Poly, n+1)
			for k, v := range eulerian[n] {
				want[k] = c * v
			}
			scale := want.Scale()
			for k := range want {
				worst = math.Max(worst, math.Abs(num[k]-want[k])/scale)
			}
			if !closeRel(num, want, 1e-13) {
				t.Errorf("1/s^%d, T = %g: numerator %v, want %v (relative 1e-13)", n, T, num, want)
			}
			if !closeRel(dz, poly.Poly{-1, 1}.Pow(n), 0) {
				t.Errorf("1/s^%d, T = %g: denominator %v, want (z − 1)^%d exactly", n, T, dz, n)
			}
		}
	}
	t.Logf("largest numerator error on 1/s^n, n ≤ 8: %.2g of the largest coefficient", worst)
}

// TestFractionalDelayFirstOrder checks the modified z-transform of
// e^(−Ls)/(s + 1) with 0 < L < T, derived by hand from Discretise's state
// equation with Φ = e^(−T), τ = L: Γ0 = 1 − e^(−(T−τ)),
// Γ1 = e^(−(T−τ))·(1 − e^(−τ)), so
// G(z) = ((1 − e^(−(T−τ)))·z + e^(−(T−τ)) − e^(−T)) / (z·(z − e^(−T))).
// With m = 1 − τ/T this is the form Ogata tabulates for the modified
// z-transform of a first-order lag behind a hold (Discrete-Time Control
// Systems, from memory), and at τ → 0 it tends to the delay-free result.
func TestFractionalDelayFirstOrder(t *testing.T) {
	for _, tc := range []struct{ T, L float64 }{{1, 0.3}, {0.1, 0.025}, {2, 1.999}, {0.5, 1.2}} {
		num, den, err := Discretise(poly.Poly{1}, poly.Poly{1, 1}, tc.T, tc.L)
		if err != nil {
			t.Fatal(err)
		}
		d := math.Floor(tc.L / tc.T)
		tau := tc.L - d*tc.T
		e1 := math.Exp(-(tc.T - tau))
		wantNum := poly.Poly{e1 - math.Exp(-tc.T), -math.Expm1(-(tc.T - tau))}
		wantDen := poly.Mul(poly.Poly{-math.Exp(-tc.T), 1}, monomial(int(d)+1))
		if !closeRel(num, wantNum, 1e-14) {
			t.Errorf("T = %g, L = %g: numerator %v, want %v", tc.T, tc.L, num, wantNum)
		}
		if !closeRel(den, wantDen, 4e-16) {
			t.Errorf("T = %g, L = %g: denominator %v, want %v", tc.T, tc.L, den, wantDen)
		}
	}
}

// TestWholeSampleDelay: L = 0.3 with T = 0.1 is three samples exactly,
// although 0.3/0.1 rounds to 2.9999999999999996; the result is z⁻³ times
// the delay-free model (common practice: a delay of d samples is z^(−d)).
func TestWholeSampleDelay(t *testing.T) {
	n0, d0, err := Discretise(poly.Poly{2}, poly.Poly{0, 1, 1}, 0.1, 0)
	if err != nil {
		t.Fatal(err)
	}
	n3, d3, err := Discretise(poly.Poly{2}, poly.Poly{0, 1, 1}, 0.1, 0.3)
	if err != nil {
		t.Fatal(err)
	}
	if !closeRel(n3, n0, 0) || !closeRel(d3, poly.Mul(d0, monomial(3)), 0) {
		t.Fatalf("delayed %v / %v, want %v / z³·(%v)", n3, d3, n0, d0)
	}
}

// TestStaticGain: a plant without dynamics keeps its gain and only the
// delay shows: 4·e^(−0.25s) at T = 0.1 is 4·z^(−3) (2.5 samples: the
// sample at kT sees the input held from (k − 3)T).
func TestStaticGain(t *testing.T) {
	num, den, err := Discretise(poly.Poly{8}, poly.Poly{2}, 0.1, 0.25)
	if err != nil {
		t.Fatal(err)
	}
	if !closeRel(num, poly.Poly{4}, 0) || !closeRel(den, monomial(3), 0) {
		t.Fatalf("got %v / %v, want 4 / z³", num, den)
	}
}

func TestInputErrors(t *testing.T) {
	tests := []struct {
		name     string
		num, den poly.Poly
		T, L     float64
		want     string
	}{
		{"improper", poly.Poly{0, 0, 1}, poly.Poly{1, 1}, 0.1, 0, "not proper"},
		{"zero denominator", poly.Poly{1}, poly.Poly{0, 0}, 0.1, 0, "denominator is zero"},
		{"zero sample time", poly.Poly{1}, poly.Poly{1, 1}, 0, 0, "sample time"},
		{"negative sample time", poly.Poly{1}, poly.Poly{1, 1}, -1, 0, "sample time"},
		{"NaN sample time", poly.Poly{1}, poly.Poly{1, 1}, math.NaN(), 0, "sample time"},
		{"infinite sample time", poly.Poly{1}, poly.Poly{1, 1}, math.Inf(1), 0, "sample time"},
		{"negative delay", poly.Poly{1}, poly.Poly{1, 1}, 0.1, -0.2, "dead time"},
		{"NaN delay", poly.Poly{1}, poly.Poly{1, 1}, 0.1, math.NaN(), "dead time"},
		{"infinite coefficient", poly.Poly{math.Inf(1)}, poly.Poly{1, 1}, 0.1, 0, "finite"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, _, err := Discretise(tc.num, tc.den, tc.T, tc.L)
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Fatalf("error %v is not an *InputError", err)
			}
			if !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %q does not say %q", err, tc.want)
			}
			if ie.T != tc.T && !(math.IsNaN(ie.T) && math.IsNaN(tc.T)) || len(ie.Den) != len(tc.den) {
				t.Errorf("error does not carry the input: %+v", ie)
			}
		})
	}
}
