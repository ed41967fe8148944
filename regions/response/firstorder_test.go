package response

import (
	"math"
	"testing"
)

// First-order plant under P control, invented: G = K/(τs + 1) with
// K = 2, τ = 3, C = kp. Derived by hand in this test: with g = K·kp the
// characteristic polynomial is τs + 1 + g, one pole at −a, a = (1 + g)/τ.
//
//	setpoint: Y/R = g/(τs + 1 + g)     → y(t) = g/(1+g)·(1 − e^(−at))
//	          u = kp·(1 − y)
//	load:     Y/D = K/(τs + 1 + g)     → y(t) = K/(1+g)·(1 − e^(−at))
//
// Both rise monotonically, so the 10% and 90% levels are reached at
// ln(10/9)/a and ln 10/a (rise time ln 9/a), the 2% band is entered at
// ln 50/a, there is no overshoot, and for the load step (e = −y, one
// sign) IE = −K/(1+g)·(T − (1 − e^(−aT))/a) over the window [0, T] and
// IAE = |IE|.
func TestFirstOrderProportional(t *testing.T) {
	const K, tau = 2.0, 3.0
	for _, tc := range []struct {
		name string
		kp   float64
	}{
		{"moderate gain", 0.5},
		{"high gain", 40},
		{"tiny gain", 1e-12},
		{"huge gain", 1e12},
		{"negative gain inside the stable range", -0.3},
	} {
		t.Run(tc.name, func(t *testing.T) {
			g := K * tc.kp
			a := (1 + g) / tau
			l := Loop{PlantNum: p(K), PlantDen: p(tau, 1), CtrlNum: p(tc.kp), CtrlDen: p(1)}
			r := mustStep(t, l, Options{})
			fs, fl := g/(1+g), K/(1+g)
			ys := func(t float64) float64 { return fs * -math.Expm1(-a*t) }
			yl := func(t float64) float64 { return fl * -math.Expm1(-a*t) }
			compareTrace(t, "setpoint y", r.Time, r.Setpoint.Output, ys, 1e-10, math.Abs(fs))
			compareTrace(t, "setpoint u", r.Time, r.Setpoint.Control, func(t float64) float64 { return tc.kp * (1 - ys(t)) }, 1e-10, math.Abs(tc.kp))
			compareTrace(t, "setpoint e", r.Time, r.Setpoint.Error, func(t float64) float64 { return 1 - ys(t) }, 1e-10, 1)
			compareTrace(t, "load y", r.Time, r.Load.Output, yl, 1e-10, fl)
			compareTrace(t, "load u", r.Time, r.Load.Control, func(t float64) float64 { return -ys(t) }, 1e-10, math.Abs(fs))

			f := r.Figures
			T := r.Span.Duration
			check(t, "final setpoint", f.FinalSetpoint, fs, 1e-14, math.Abs(fs))
			check(t, "final load", f.FinalLoad, fl, 1e-14, fl)
			check(t, "rise time", f.RiseTime, math.Log(9)/a, 1e-10, 1/a)
			check(t, "settling time", f.SettlingTime, math.Log(50)/a, 1e-10, 1/a)
			check(t, "overshoot", f.Overshoot, 0, 0, 1)
			check(t, "undershoot", f.Undershoot, 0, 0, 1)
			ie := -fl * (T + math.Expm1(-a*T)/a)
			check(t, "IE load", f.IELoad, ie, 1e-10, math.Abs(ie))
			check(t, "IAE load", f.IAELoad, -ie, 1e-10, math.Abs(ie))
			check(t, "peak load", f.PeakLoad, yl(T), 1e-10, fl)
			check(t, "peak time load", f.PeakTimeLoad, T, 1e-12, T)
			// The window: the one pole decays to 0.1% (ln 1000/a).
			check(t, "window", T, math.Log(1000)/a, 1e-12, T)
		})
	}
}
