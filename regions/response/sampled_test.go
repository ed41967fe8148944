package response

import (
	"math"
	"testing"
)

// Sampled plant G(z) = K/(z − a) under P control, invented: K = 0.5,
// a = 0.8, T = 0.1. Derived by hand in this test: y_{k+1} = a·y_k + K·u_k
// and u_k = kp·(r_k − y_k) give y_{k+1} = b·y_k + K·kp·r_k with the
// closed-loop pole b = a − K·kp, so from y₀ = 0
//
//	setpoint: y_k = K·kp·(1 − b^k)/(1 − b),   load: y_k = K·(1 − b^k)/(1 − b),
//
// and IE over N samples, T·Σ_{k<N} e_k with e = −y under the load, is
// −T·K/(1 − b)·(N − (1 − b^N)/(1 − b)). For 0 < b < 1 the responses rise
// monotonically; for b < 0 they alternate about the final value and the
// largest sample is y₁ = K·kp, an overshoot of 100·|b| percent.
func TestSampledFirstOrderProportional(t *testing.T) {
	const K, a, T = 0.5, 0.8, 0.1
	for _, tc := range []struct {
		name string
		kp   float64
	}{
		{"monotone", 1},
		{"alternating", 2.4},
		{"tiny gain", 1e-12},
	} {
		t.Run(tc.name, func(t *testing.T) {
			b := a - K*tc.kp
			l := Loop{PlantNum: p(K), PlantDen: p(1, -a), CtrlNum: p(tc.kp), CtrlDen: p(1), Period: T}
			r := mustStep(t, l, Options{})
			fs, fl := K*tc.kp/(1-b), K/(1-b)
			step := func(t float64) int { return int(math.Round(t / T)) }
			ys := func(t float64) float64 { return fs * (1 - math.Pow(b, float64(step(t)))) }
			yl := func(t float64) float64 { return fl * (1 - math.Pow(b, float64(step(t)))) }
			compareTrace(t, "setpoint y", r.Time, r.Setpoint.Output, ys, 1e-13, fs)
			compareTrace(t, "setpoint u", r.Time, r.Setpoint.Control, func(t float64) float64 { return tc.kp * (1 - ys(t)) }, 1e-13, tc.kp)
			compareTrace(t, "load y", r.Time, r.Load.Output, yl, 1e-13, fl)

			f := r.Figures
			N := float64(r.Span.Samples)
			check(t, "final setpoint", f.FinalSetpoint, fs, 1e-15, fs)
			check(t, "final load", f.FinalLoad, fl, 1e-15, fl)
			ie := -T * fl * (N - (1-math.Pow(b, N))/(1-b))
			check(t, "IE load", f.IELoad, ie, 1e-13, -ie)
			check(t, "IAE load", f.IAELoad, -ie, 1e-13, -ie)
			// The window: the pole's mode decays to 0.1%, |b|^N ≤ 1e-3.
			if got := math.Pow(math.Abs(b), N); got > 1e-3 || math.Pow(math.Abs(b), N-1) <= 1e-3 && b > 0 {
				t.Errorf("window of %d samples leaves |b|^N = %g", r.Span.Samples, got)
			}
			if b > 0 {
				check(t, "overshoot", f.Overshoot, 0, 0, 1)
				// First samples at or beyond 10%, 90% of the final value and
				// the first sample from which all stay within 2%: the least
				// k with b^k ≤ 0.9, ≤ 0.1 and ≤ 0.02.
				first := func(level float64) float64 { return math.Ceil(math.Log(level)/math.Log(b)-1e-12) * T }
				check(t, "rise time", f.RiseTime, first(0.1)-first(0.9), 1e-12, T)
				check(t, "settling time", f.SettlingTime, first(0.02), 1e-12, T)
			} else {
				check(t, "overshoot", f.Overshoot, -100*b, 1e-11, 100)
				check(t, "peak time", f.PeakTimeSetpoint, T, 1e-15, T)
			}
		})
	}
}

// Sampled PI, invented plant G(z) = 0.5/(z − 0.8), T = 0.1, controller
// C(z) = kp + ki·T·z/(z − 1) (backward-rectangle integral), kp = 1,
// ki = 2. Derived by hand in this test: the load error has z-transform
// E(z) = −(N·Dc/Δ)·z/(z − 1) with Dc = z − 1, so Σ_{k≥0} e_k = E(1) =
// −N(1)/Δ(1), and Δ(1) = Nc(1)·N(1) = ki·T·N(1); hence T·Σ e_k = −1/ki,
// the sampled form of Åström & Hägglund's IE = 1/ki.
func TestSampledPIIntegratedError(t *testing.T) {
	const K, a, T, kp, ki = 0.5, 0.8, 0.1, 1.0, 2.0
	l := Loop{PlantNum: p(K), PlantDen: p(1, -a), CtrlNum: p(kp+ki*T, -kp), CtrlDen: p(1, -1), Period: T}
	r := mustStep(t, l, Options{DecayTo: 1e-15})
	check(t, "IE load", r.Figures.IELoad, -1/ki, 1e-12, 1/ki)
	check(t, "final setpoint", r.Figures.FinalSetpoint, 1, 1e-14, 1)
	check(t, "final load", r.Figures.FinalLoad, 0, 0, 1)
	if n := len(r.Time); math.Abs(r.Setpoint.Output[n-1]-1) > 1e-13 || math.Abs(r.Load.Output[n-1]) > 1e-13 {
		t.Errorf("samples at the end of the window: setpoint %g, load %g; want 1 and 0", r.Setpoint.Output[n-1], r.Load.Output[n-1])
	}
}
