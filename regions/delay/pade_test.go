package delay

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// TestPadeCoefficients checks Pade against the approximants written out
// by hand from c_k = (2n−k)!·n!/((2n)!·k!·(n−k)!): n = 1: 1 ∓ x/2; n = 2:
// 1 ∓ x/2 + x²/12; n = 3: 1 ∓ x/2 + x²/10 ∓ x³/120, with x = L·s.
func TestPadeCoefficients(t *testing.T) {
	const L = 0.8
	tests := []struct {
		n    int
		want []float64 // c_k, ascending
	}{
		{0, []float64{1}},
		{1, []float64{1, 1.0 / 2}},
		{2, []float64{1, 1.0 / 2, 1.0 / 12}},
		{3, []float64{1, 1.0 / 2, 1.0 / 10, 1.0 / 120}},
	}
	for _, tt := range tests {
		num, den := Pade(L, tt.n)
		for k, c := range tt.want {
			d := c * math.Pow(L, float64(k))
			nk := d * math.Pow(-1, float64(k))
			if math.Abs(den[k]-d) > 1e-15*d || math.Abs(num[k]-nk) > 1e-15*d {
				t.Errorf("n = %d, k = %d: num %g, den %g, want %g, %g", tt.n, k, num[k], den[k], nk, d)
			}
		}
	}
	// All-pass on the axis: |num(jω)/den(jω)| = 1 (num(s) = den(−s)).
	num, den := Pade(2.5, 12)
	for _, w := range []float64{0.1, 1, 7, 40} {
		s := complex(0, w)
		if g := num.Eval(s) / den.Eval(s); math.Abs(math.Hypot(real(g), imag(g))-1) > 1e-12 {
			t.Errorf("order 12 at ω = %g: |num/den| = %g", w, math.Hypot(real(g), imag(g)))
		}
	}
}

// TestPadeRange checks the measured phase ranges: the first-order value
// against its series, the rule ωL ≤ 1.5·(n − 1) for every order, and
// PadeOrder against PadeRange.
func TestPadeRange(t *testing.T) {
	// Order 1: the phase is −2·atan(x/2), so the error is
	// x − 2·atan(x/2) = x³/12 − x⁵/80 + …; 1° = π/180 gives x ≈ 0.604
	// (series solved by hand to three digits).
	if r := PadeRange(1); math.Abs(r-0.604) > 0.001 {
		t.Errorf("PadeRange(1) = %g, want 0.604", r)
	}
	prev := 0.0
	for n := 1; n <= MaxPadeOrder; n++ {
		r := PadeRange(n)
		if r < 1.5*float64(n-1) || r <= prev {
			t.Errorf("PadeRange(%d) = %g: below 1.5·(n − 1) or not above order %d", n, r, n-1)
		}
		prev = r
	}
	for _, x := range []float64{0.5, 1, 3, 10, 30} {
		n := PadeOrder(x)
		if PadeRange(n) < x || n > 1 && PadeRange(n-1) >= x {
			t.Errorf("PadeOrder(%g) = %d is not the smallest order covering it", x, n)
		}
	}
}

// pOnlyLimit returns the largest kp for which the sign array finds
// (s + 1)·den(s) + kp·num(s) stable, by bisection from a stable kp = 1:
// P control of e^(−s)/(s + 1) with the delay replaced by num/den.
func pOnlyLimit(num, den poly.Poly) float64 {
	stable := func(kp float64) bool {
		p := poly.Add(poly.Mul(poly.Poly{1, 1}, den), num.Scaled(kp))
		return routh.Hurwitz(p, make([]float64, routh.WorkLen(len(p)-1)))
	}
	lo, hi := 1.0, 10.0
	for range 60 {
		mid := 0.5 * (lo + hi)
		if stable(mid) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

// TestPadeGainLimit compares the P-only upper gain limit of e^(−s)/(s + 1)
// from Padé approximants with the exact one, √(α1² + 1) with tan α1 = −α1
// (TestFirstOrderDeadTimeGainRange). By hand for order 1:
// (s + 1)(1 + s/2) + kp·(1 − s/2) = s²/2 + (3 − kp)/2·s + 1 + kp, stable
// for kp < 3: a third above the exact 2.26. Order 3 is within a percent.
func TestPadeGainLimit(t *testing.T) {
	a := alpha1(1, 1)
	exact := math.Sqrt(a*a + 1)
	first := pOnlyLimit(Pade(1, 1))
	if math.Abs(first-3) > 1e-9 || math.Abs(first/exact-1) < 0.3 {
		t.Errorf("order 1 limit %g, want 3 (exact %g)", first, exact)
	}
	third := pOnlyLimit(Pade(1, 3))
	if math.Abs(third/exact-1) > 0.01 {
		t.Errorf("order 3 limit %g, exact %g", third, exact)
	}
	// The delay test itself agrees with the exact limit.
	c := NewCounter(2)
	if v := c.Count(stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{exact * (1 - 1e-9)}, Delay: 1}); v.Unstable != 0 {
		t.Errorf("just below the exact limit: %+v", v)
	}
	t.Logf("P-only limit: exact %.6f, order 1 %.6f (%+.1f%%), order 3 %.6f (%+.3f%%)",
		exact, first, 100*(first/exact-1), third, 100*(third/exact-1))
}

// TestDelayMargin checks P control, kp = 2, of e^(−s)/(s + 1). By hand:
// |L(jω)| = 2/√(1 + ω²) = 1 at ω = √3; the phase there is
// −atan √3 − √3 = −π/3 − √3, so the phase margin is π − π/3 − √3 and the
// delay margin that over √3. At L = 1 plus the margin the loop is on its
// edge: below it stable, above it a pair on the right.
func TestDelayMargin(t *testing.T) {
	num, den := poly.Poly{2}, poly.Poly{1, 1}
	cs := GainCrossovers(num, den, 1)
	if len(cs) != 1 {
		t.Fatalf("crossovers %+v, want one", cs)
	}
	w := math.Sqrt(3)
	pm := math.Pi - math.Atan(w) - w
	if math.Abs(cs[0].Omega-w) > 1e-12 || math.Abs(cs[0].PhaseMargin-pm) > 1e-12 {
		t.Errorf("crossover %+v, want ω = %.15g, φ = %.15g", cs[0], w, pm)
	}
	dm := DelayMargin(num, den, 1)
	if math.Abs(dm-pm/w) > 1e-9 {
		t.Errorf("delay margin %.15g, want %.15g", dm, pm/w)
	}
	c := NewCounter(2)
	for _, tc := range []struct {
		L    float64
		want int
	}{{1 + dm*(1-1e-6), 0}, {1 + dm*(1+1e-6), 2}} {
		if v := c.Count(stability.Function{P: den, Q: num, Delay: tc.L}); v.Unstable != tc.want {
			t.Errorf("L = %.12g: verdict %+v, want %d", tc.L, v, tc.want)
		}
	}
	// A negative phase margin counts from the next crossing of −π.
	if got := (Crossover{Omega: 2, PhaseMargin: -1}).DelayMargin(); math.Abs(got-(2*math.Pi-1)/2) > 1e-15 {
		t.Errorf("negative phase margin: delay margin %g", got)
	}
	if !math.IsInf(DelayMargin(poly.Poly{0.5}, den, 1), 1) {
		t.Error("a loop gain below one has a crossover")
	}
}
