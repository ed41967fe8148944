package delay

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// lambertCount returns the number of right-half-plane roots of
// s + 1 + K·e^(−s), K > 1: from (s + 1)·e^(s+1) = −K·e the roots are
// s = W_k(−K·e) − 1 over all branches k (derived by hand; Corless et al.
// 1996 for W), branch k ≥ 0 and its conjugate branch −k−1 giving a pair.
// Re W_k falls as k grows (Re W_k ≈ ln|z| − ln(2πk) for large k), so the
// last branch with Re W_k > 1 is found by bisection on k. ok is false if
// some W_k was not found or that branch is within 1e-6 of the axis.
func lambertCount(K float64) (n int, ok bool) {
	z := complex(-K*math.E, 0)
	right := func(k int) (bool, bool) {
		w, ok := lambertW(k, z)
		return real(w) > 1, ok && math.Abs(real(w)-1) > 1e-6
	}
	if r, ok := right(0); !r {
		return 0, ok
	}
	lo, hi := 0, int(K) // Re W_k < 1 for k ≥ K
	for hi-lo > 1 {
		mid := lo + (hi-lo)/2
		r, ok := right(mid)
		if !ok {
			return 0, false
		}
		if r {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 2 * (lo + 1), true
}

// branchCount is lambertCount from the branch relation instead: W_k
// satisfies w + ln w = ln(K·e) + iπ + 2πik (Corless et al. 1996, Sec. 4),
// and on the line Re w = 1, w = 1 + iy, the real part gives |1 + iy| = K,
// y = √(K² − 1), and the imaginary part y + atan y = (2k + 1)π. So the
// branches with Re W_k > 1 are those with k < (y + atan y − π)/(2π), and
// N = 2·⌊(y + atan y + π)/(2π)⌋ (derived by hand). This needs no W_k and
// holds for any K > 1; ok is false within 1e-3 of a jump of the floor.
func branchCount(K float64) (int, bool) {
	y := math.Sqrt(K*K - 1)
	v := (y + math.Atan(y) + math.Pi) / (2 * math.Pi)
	return 2 * int(math.Floor(v)), math.Abs(v-math.Round(v)) > 1e-3
}

// TestHugeAndTinyGains checks counts at gains far from one.
func TestHugeAndTinyGains(t *testing.T) {
	c := NewCounter(3)
	// Up to 1e6 the branches of W are evaluated; beyond, the phase of the
	// root nearest the axis is known to about 1e-4 only, which the branch
	// relation still resolves.
	for _, K := range []float64{30, 1e3, 1e6, 1e9, 1e12} {
		want, ok := branchCount(K)
		if !ok {
			t.Fatalf("K = %g: the branch count is at a jump", K)
		}
		if K <= 1e6 {
			if n, ok := lambertCount(K); !ok || n != want {
				t.Fatalf("K = %g: Lambert W count %d (decided %v), branch relation %d", K, n, ok, want)
			}
		}
		// A finite count of InfinitelyMany or more is reported as
		// InfinitelyMany (K = 1e12 has about 3.2e11 roots on the right).
		if v := c.Count(fopdtP(1, 1, 1, K)); v.Unstable != min(want, InfinitelyMany) {
			t.Errorf("K = %g on e^(−s)/(s + 1): verdict %+v, Lambert W count %d", K, v, want)
		}
	}
	tests := []struct {
		name string
		f    stability.Function
		want int
	}{
		// A loop gain of 1e-12 leaves the open-loop poles where they are:
		// −1 for (s + 1), +1 for (s − 1) (derived by hand).
		{"tiny gain, stable lag", fopdtP(1, 1, 1, 1e-12), 0},
		{"tiny gain, unstable lag", stability.Function{P: poly.Poly{-1, 1}, Q: poly.Poly{1e-12}, Delay: 1}, 1},
		// PI on e^(−s)/(s + 1) with kp = 0.5 and ki = ±1e-12: the root
		// the integrator brings sits at s ≈ −ki/(1 + kp), just left of 0
		// for ki > 0 and just right for ki < 0 (first order in ki, by
		// hand); the other roots are those of the P loop with kp = 0.5,
		// which is stable (TestFirstOrderDeadTimeGainRange).
		{"tiny positive integral gain", stability.Function{P: poly.Poly{0, 1, 1}, Q: poly.Poly{1e-12, 0.5}, Delay: 1}, 0},
		{"tiny negative integral gain", stability.Function{P: poly.Poly{0, 1, 1}, Q: poly.Poly{-1e-12, 0.5}, Delay: 1}, 1},
		// Coefficients scaled by 1e12 or 1e-12 together have the same roots.
		{"scaled up", stability.Function{P: poly.Poly{1e12, 1e12}, Q: poly.Poly{2e12}, Delay: 1}, 0},
		{"scaled down", stability.Function{P: poly.Poly{1e-12, 1e-12}, Q: poly.Poly{3e-12}, Delay: 1}, 2},
	}
	for _, tt := range tests {
		if v := c.Count(tt.f); v.Unstable != tt.want || v.Boundary != 0 {
			t.Errorf("%s: verdict %+v, want %d", tt.name, v, tt.want)
		}
	}
}

// TestFastAndSlowTimeScales checks that counts do not depend on the unit
// of time: substituting s = λ·t maps the roots of Δ(s) = P(s) + Q(s)·e^(−Ls)
// to those of P(λt) + Q(λt)·e^(−λL·t), with the same signs of their real
// parts, so the counts agree for λ = 1e-6 and 1e6 (derived by hand).
func TestFastAndSlowTimeScales(t *testing.T) {
	rng := newRand(9)
	c := NewCounter(10)
	for i := range 60 {
		f := randomLoop(rng, 1+i%6)
		want := c.Count(f)
		for _, lambda := range []float64{1e-6, 1e6} {
			g := stability.Function{P: timeScaled(f.P, lambda), Q: timeScaled(f.Q, lambda), Delay: f.Delay * lambda}
			if v := c.Count(g); v != want {
				t.Errorf("case %d, λ = %g: verdict %+v, unscaled %+v", i, lambda, v, want)
			}
		}
	}
}

// timeScaled returns p(λ·t): the coefficient of t^k is p_k·λ^k.
func timeScaled(p poly.Poly, lambda float64) poly.Poly {
	out := make(poly.Poly, len(p))
	for k, v := range p {
		out[k] = v * math.Pow(lambda, float64(k))
	}
	return out
}

// TestLongDelaysAndHighDegrees checks Count against the contour integral
// for delays of 10 to 40 (ωL spanning many turns before the last cut) and
// for plants of degree 10 and 20.
func TestLongDelaysAndHighDegrees(t *testing.T) {
	rng := newRand(13)
	c := NewCounter(24)
	check := func(name string, f stability.Function) bool {
		R := 1.2*rootRadius(f) + 0.5
		if R > 40 || axisClearance(f, R) < 1e-3 {
			return false
		}
		want, ok := contourCount(f, R)
		if !ok {
			t.Errorf("%s: the reference integral did not close for %+v", name, f)
			return false
		}
		if v := c.Count(f); v.Unstable != want || v.Boundary != 0 {
			t.Errorf("%s: verdict %+v, contour integral %d, for %+v", name, v, want, f)
		}
		return true
	}
	used := 0
	for i := range 30 {
		f := randomLoop(rng, 1+i%4)
		f.Delay = 10 + 30*rng.Float64()
		if check("long delay", f) {
			used++
		}
	}
	for range 12 {
		if check("degree 10", randomLoop(rng, 10)) {
			used++
		}
	}
	for range 4 {
		if check("degree 20", randomLoop(rng, 20)) {
			used++
		}
	}
	if used < 30 {
		t.Errorf("only %d cases compared", used)
	}
}

// TestWithoutDelay checks that a loop with no delayed part, or a delay of
// zero, gets the sign array's verdict, and that the counter panics when
// given more coefficients than it was made for.
func TestWithoutDelay(t *testing.T) {
	c := NewCounter(4)
	// (s − 1)(s² + s + 1) = s³ − 1: one root on the right (by hand).
	if v := c.Count(stability.Function{P: poly.Poly{-1, 0, 0, 1}}); v != (stability.Verdict{Unstable: 1}) {
		t.Errorf("s³ − 1: verdict %+v", v)
	}
	// P + Q = s² + 3s + 2 with a delay of 0: stable.
	if v := c.Count(stability.Function{P: poly.Poly{1, 2, 1}, Q: poly.Poly{1, 1}}); v != (stability.Verdict{}) {
		t.Errorf("s² + 3s + 2: verdict %+v", v)
	}
	// An advanced-type loop: Q of higher degree than P.
	if v := c.Count(stability.Function{P: poly.Poly{1}, Q: poly.Poly{1, 1}, Delay: 1}); v.Unstable != InfinitelyMany {
		t.Errorf("advanced type: verdict %+v", v)
	}
	if v := c.Count(stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{1}, Delay: math.NaN()}); v.Unstable != stability.Undecided {
		t.Errorf("delay NaN: verdict %+v", v)
	}
	defer func() {
		if recover() == nil {
			t.Error("no panic for a function larger than the counter")
		}
	}()
	c.Count(stability.Function{P: make(poly.Poly, 5), Q: poly.Poly{1}, Delay: 1})
}
