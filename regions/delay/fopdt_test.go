package delay

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// fopdtP returns the characteristic function of P control, gain kp, on the
// first-order plant with dead time k·e^(−Ls)/(Ts + 1):
// Δ(s) = Ts + 1 + kp·k·e^(−Ls).
func fopdtP(k, T, L, kp float64) stability.Function {
	return stability.Function{P: poly.Poly{1, T}, Q: poly.Poly{kp * k}, Delay: L}
}

// alpha1 returns the root of tan α = −(T/L)·α in (π/2, π), by bisection on
// sin α + (T/L)·α·cos α, which is the equation times cos α < 0 there: it
// is 1 at π/2 and −(T/L)·π at π.
func alpha1(T, L float64) float64 {
	lo, hi := math.Pi/2, math.Pi
	for range 200 {
		mid := 0.5 * (lo + hi)
		if math.Sin(mid)+T/L*mid*math.Cos(mid) > 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi)
}

// TestFirstOrderDeadTimeGainRange checks the P-only stabilising range of
// k·e^(−Ls)/(Ts + 1),
//
//	−1/k < kp < (T/(k·L))·√(α1² + (L/T)²),
//
// α1 ∈ (π/2, π) the root of tan α = −(T/L)·α (G. J. Silva, A. Datta and
// S. P. Bhattacharyya, PID Controllers for Time-Delay Systems, Birkhäuser
// 2005, the first-order case of the P controller chapter; recalled), on
// invented plants. Derivation of the upper end, by hand: at s = jω,
// jωT + 1 + K·e^(−jωL) = 0 with K = kp·k splits into K·cos ωL = −1 and
// K·sin ωL = ωT, so tan ωL = −ωT, i.e. tan α = −(T/L)·α for α = ωL, and
// K = √(1 + (ωT)²) = (T/L)·√(α² + (L/T)²): the pair crosses at ω = α1/L.
// The lower end is Δ(0) = 1 + K = 0, a real root through s = 0.
func TestFirstOrderDeadTimeGainRange(t *testing.T) {
	plants := []struct {
		name    string
		k, T, L float64
	}{
		{"unit lag, unit delay", 1, 1, 1},
		{"slow lag, short delay", 2.5, 4, 0.7},
		{"fast lag, long delay", 0.3, 0.5, 3},
		{"delay a hundredth of the lag", 1.7, 10, 0.1},
	}
	const rel = 1e-8
	var test Test
	for _, pl := range plants {
		t.Run(pl.name, func(t *testing.T) {
			a := alpha1(pl.T, pl.L)
			upper := pl.T / (pl.k * pl.L) * math.Sqrt(a*a+(pl.L/pl.T)*(pl.L/pl.T))
			lower := -1 / pl.k
			c := NewCounter(2)
			cases := []struct {
				name string
				kp   float64
				want int
			}{
				{"just above the lower end", lower * (1 - rel), 0},
				{"just below the lower end", lower * (1 + rel), 1},
				{"middle", 0.5 * (lower + upper), 0},
				{"just below the upper end", upper * (1 - rel), 0},
				{"just above the upper end", upper * (1 + rel), 2},
			}
			for _, tc := range cases {
				v := c.Count(fopdtP(pl.k, pl.T, pl.L, tc.kp))
				if v.Unstable != tc.want || v.Boundary != 0 || v.Infinite != 0 {
					t.Errorf("%s: kp = %.17g: verdict %+v, want %d unstable", tc.name, tc.kp, v, tc.want)
				}
			}
			if f := fopdtP(pl.k, pl.T, pl.L, lower); test.Classify(f, f).Kind != stability.Real {
				x := test.Classify(f, f)
				t.Errorf("at kp = −1/k: crossing %+v, want real", x)
			}
			fu := fopdtP(pl.k, pl.T, pl.L, upper)
			x := test.Classify(fu, fu)
			// ω is a root of Δ(jω) refined to a few units in the last
			// place; the edge itself carries the rounding of α1.
			if x.Kind != stability.Complex || math.Abs(x.Omega-a/pl.L) > 1e-9*a/pl.L {
				t.Errorf("at the upper end: crossing %+v, want complex at ω = %.15g", x, a/pl.L)
			}
		})
	}
}
