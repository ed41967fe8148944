package delay

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// TestNeutralIdealPD checks the neutral-type boundary of the ideal PD
// controller kp + kd·s on e^(−s)/(s + 1), an invented plant:
// Δ(s) = s + 1 + (kp + kd·s)·e^(−s). Derivation by hand: for large |s|
// a root satisfies e^(−s) = −(s + 1)/(kd·s + kp) → −1/kd, so
// e^(−Re s) → 1/|kd| and Re s → ln|kd|: a chain of infinitely many roots
// in the right half plane when |kd| > 1, in the left when |kd| < 1. On
// |kd| = 1 the chain approaches the axis; with kd = 1 the roots satisfy
// |e^(−s)| = |s + 1|/|s + kp|, which is above 1 along the axis when
// |kp| < 1 (the chain lies to the left) and below 1 when |kp| > 1 (to the
// right). With kd = 1 and |kp| < 1, |P(jω)|² − |Q(jω)|² = 1 − kp² > 0
// everywhere, so P dominates the whole axis, arg Δ(jω) goes from 0 to
// π/2 and N = 1/2 − (π/2)/π = 0.
func TestNeutralIdealPD(t *testing.T) {
	pd := func(kp, kd float64) stability.Function {
		return stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{kp, kd}, Delay: 1}
	}
	c := NewCounter(2)
	for _, tc := range []struct {
		name   string
		kp, kd float64
	}{
		{"kd above 1", 0.5, 1.2},
		{"kd below −1", 0.5, -1.05},
		{"kd just above 1", 0.3, 1 + 1e-9},
		{"on the boundary, chain from the right", 2, 1},
	} {
		if v := c.Count(pd(tc.kp, tc.kd)); v.Unstable != InfinitelyMany || v.Class() != stability.ClassUnstable {
			t.Errorf("%s: kp = %g, kd = %g: verdict %+v, want infinitely many unstable roots", tc.name, tc.kp, tc.kd, v)
		}
	}
	if v := c.Count(pd(0.5, 1)); v != (stability.Verdict{Infinite: 1}) {
		t.Errorf("on the boundary with the chain from the left: verdict %+v, want {0 0 1}", v)
	}
	// Inside |kd| < 1 the count is finite; it is checked against the
	// contour integral, whose radius bound allows for |q_n| < |p_n|.
	for _, tc := range []struct{ kp, kd float64 }{{0.5, 0.5}, {0.5, -0.9}, {3, 0.3}, {-2, 0.8}, {1.5, -0.6}} {
		f := pd(tc.kp, tc.kd)
		want, ok := contourCount(f, 1.2*rootRadius(f)+0.5)
		if !ok {
			t.Fatalf("kp = %g, kd = %g: the reference integral did not close", tc.kp, tc.kd)
		}
		if v := c.Count(f); v.Unstable != want {
			t.Errorf("kp = %g, kd = %g: verdict %+v, contour integral %d", tc.kp, tc.kd, v, want)
		}
	}
	if f := pd(0.5, 1); (Test{}).Classify(f, f).Kind != stability.Infinite {
		t.Errorf("Classify on |kd| = 1: not infinite")
	}
}

// TestUnstableFirstOrderPlant checks P control of the invented unstable
// plant e^(−Ls)/(Ts − 1): Δ(s) = Ts − 1 + K·e^(−Ls). Derivation by hand
// with the Nyquist criterion: the open loop K·e^(−Ls)/(Ts − 1) has one
// pole in the right half plane, so the closed loop is stable iff the plot
// encircles −1 once counter-clockwise. It starts at −K, so K > 1 is
// needed; it then crosses the unit circle once, at ω_c = √(K² − 1)/T,
// with phase −ω_c·L − (π − atan(ω_c·T)), and must do so above the
// negative real axis: ω_c·L < atan(ω_c·T). As atan(u)/u < 1 falls from 1,
// some K works iff L < T (recalled as a known result in the delay
// literature; derived here).
func TestUnstableFirstOrderPlant(t *testing.T) {
	loop := func(T, L, K float64) stability.Function {
		return stability.Function{P: poly.Poly{-1, T}, Q: poly.Poly{K}, Delay: L}
	}
	stable := func(T, L, K float64) bool {
		wc := math.Sqrt(K*K-1) / T
		return K > 1 && wc*L < math.Atan(wc*T)
	}
	c := NewCounter(2)
	for _, pl := range []struct{ T, L float64 }{{2, 1}, {1, 0.5}, {5, 4.5}, {1, 1.2}, {1, 3}} {
		nStable := 0
		for K := 0.5; K < 8; K += 0.0137 {
			v := c.Count(loop(pl.T, pl.L, K))
			if v.Unstable < 0 || v.Boundary != 0 {
				t.Fatalf("T = %g, L = %g, K = %g: verdict %+v", pl.T, pl.L, K, v)
			}
			if got := v.Unstable == 0; got != stable(pl.T, pl.L, K) {
				t.Errorf("T = %g, L = %g, K = %g: %d unstable roots, hand derivation says stable = %v", pl.T, pl.L, K, v.Unstable, !got)
			}
			if v.Unstable == 0 {
				nStable++
			}
		}
		if (nStable > 0) != (pl.L < pl.T) {
			t.Errorf("T = %g, L = %g: %d stable gains, want some iff L < T", pl.T, pl.L, nStable)
		}
	}
}

// TestExactBoundaryPoints checks points exactly on an edge: the root on
// the axis is counted on the boundary, not as unstable.
func TestExactBoundaryPoints(t *testing.T) {
	c := NewCounter(3)
	tests := []struct {
		name string
		f    stability.Function
		want stability.Verdict
	}{
		// kp = −1/k exactly: Δ(0) = 1 + kp·k = 0 (derived by hand).
		{"real root at s = 0", fopdtP(1, 1, 1, -1), stability.Verdict{Boundary: 1}},
		{"real root at s = 0, k = 4", fopdtP(4, 2, 0.5, -0.25), stability.Verdict{Boundary: 1}},
		// PI with ki = 0 on e^(−s)/(s + 1): P = s(s + 1), Q = kp·s share
		// the factor s exactly; the rest is the P loop with kp = 0.7,
		// inside the range of TestFirstOrderDeadTimeGainRange.
		{"integral gain zero", stability.Function{P: poly.Poly{0, 1, 1}, Q: poly.Poly{0, 0.7}, Delay: 1}, stability.Verdict{Boundary: 1}},
		// Δ = s + (π/2)·e^(−s): at s = jπ/2, jπ/2 + (π/2)·(−j) = 0, a
		// pair on the axis to within the rounding of π/2 (derived by
		// hand). This is the scalar delay equation at a = π/2, the edge
		// of its stable range 0 < a·L < π/2 (R. Bellman and K. L.
		// Cooke, Differential-Difference Equations, Academic Press
		// 1963, Ch. 13; recalled).
		{"pair on the axis", stability.Function{P: poly.Poly{0, 1}, Q: poly.Poly{math.Pi / 2}, Delay: 1}, stability.Verdict{Boundary: 2}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if v := c.Count(tt.f); v != tt.want {
				t.Errorf("verdict %+v, want %+v", v, tt.want)
			}
		})
	}
}

// TestScalarDelayEquation checks s + a·e^(−Ls) = 0 around its stable range
// 0 < a·L < π/2 (Bellman and Cooke, Ch. 13, recalled; the upper end
// follows as in TestExactBoundaryPoints): no root on the right inside,
// one real root for a < 0, a pair beyond π/2, and a further pair past
// each 2π in a·L (the pair k crosses at ω = (π/2 + 2πk)/L, a·L = π/2 + 2πk).
func TestScalarDelayEquation(t *testing.T) {
	c := NewCounter(2)
	for _, L := range []float64{0.01, 1, 37} {
		for _, tc := range []struct {
			aL   float64
			want int
		}{{-0.5, 1}, {1e-6, 0}, {1.5, 0}, {1.6, 2}, {7.8, 2}, {7.9, 4}, {14.1, 4}, {14.2, 6}} {
			f := stability.Function{P: poly.Poly{0, 1}, Q: poly.Poly{tc.aL / L}, Delay: L}
			if v := c.Count(f); v.Unstable != tc.want || v.Boundary != 0 {
				t.Errorf("L = %g, a·L = %g: verdict %+v, want %d", L, tc.aL, v, tc.want)
			}
		}
	}
}

// TestTinyDelayAgreesWithSignArray checks that a delay of 1e-9 changes no
// count of the random loops: Δ → P + Q as L → 0, and the roots the delay
// adds lie near Re s = −ln(1/L)/L. The reference is the sign array of
// P + Q (package routh).
func TestTinyDelayAgreesWithSignArray(t *testing.T) {
	rng := newRand(5)
	c := NewCounter(10)
	direct := NewCounter(10)
	for i := range 300 {
		f := randomLoop(rng, 1+i%6)
		f.Delay = 1e-9
		sum := poly.Add(f.P, f.Q)
		if len(trimTop(f.Q)) == len(trimTop(f.P)) {
			continue // the neutral case adds roots of P + Q's own degree
		}
		want := direct.Count(stability.Function{P: sum})
		if v := c.Count(f); v != want {
			t.Errorf("case %d: verdict %+v with L = 1e-9, sign array of P + Q %+v", i, v, want)
		}
	}
}
