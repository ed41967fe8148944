package response

import (
	"math"
	"strings"
	"testing"
)

// fopdt is the invented first-order plant with dead time used by the
// tests below: G = K·e^(−Ls)/(τs + 1), K = 1, τ = 1, L = 0.5.
const fopdtK, fopdtTau, fopdtL = 1.0, 1.0, 0.5

func fopdtLoop(ctrlNum, ctrlDen []float64) Loop {
	return Loop{PlantNum: p(fopdtK), PlantDen: p(fopdtTau, 1), CtrlNum: p(ctrlNum...), CtrlDen: p(ctrlDen...), Delay: fopdtL}
}

// Under P control the method of steps can be done by hand (derived in
// this test). With a = 1/τ and g = K·kp, y' = a(−y + K·w), w(t) = v(t − L);
// under the load step v = 1 − kp·y:
//
//	[0, L):   y = 0
//	[L, 2L):  y = K(1 − e^(−a(t−L)))
//	[2L, 3L): w = 1 − g(1 − e^(−a(t−2L))), so
//	          y' = −a·y + a·K(1 − g) + a·K·g·e^(−a(t−2L)) and
//	          y = K(1 − g) + K(g − e^(−aL) + a·g·(t − 2L))·e^(−a(t−2L))
//
// and the setpoint response is kp times it (Y/R ÷ Y/D = C = kp).
func TestDelayProportionalByHand(t *testing.T) {
	const kp = 0.8
	a, g, L, K := 1/fopdtTau, fopdtK*kp, fopdtL, fopdtK
	yl := func(t float64) float64 {
		switch {
		case t < L:
			return 0
		case t < 2*L:
			return K * -math.Expm1(-a*(t-L))
		}
		return K*(1-g) + K*(g-math.Exp(-a*L)+a*g*(t-2*L))*math.Exp(-a*(t-2*L))
	}
	ys := func(t float64) float64 { return kp * yl(t) }
	r := mustStep(t, fopdtLoop([]float64{kp}, []float64{1}), Options{})
	n := 0
	for n < len(r.Time) && r.Time[n] <= 3*L*(1+1e-12) {
		n++
	}
	compareTrace(t, "setpoint y", r.Time[:n], r.Setpoint.Output[:n], ys, 1e-10, 1)
	compareTrace(t, "load y", r.Time[:n], r.Load.Output[:n], yl, 1e-10, 1)
	// u jumps to kp at t = 0+ and stays there until the plant answers.
	compareTrace(t, "setpoint u", r.Time[:n], r.Setpoint.Control[:n], func(t float64) float64 { return kp * (1 - ys(t)) }, 1e-10, kp)
	check(t, "final setpoint", r.Figures.FinalSetpoint, g/(1+g), 1e-15, 1)
	check(t, "final load", r.Figures.FinalLoad, K/(1+g), 1e-15, 1)
	if !strings.Contains(r.Method, "method of steps") {
		t.Errorf("method %q, want the method of steps", r.Method)
	}
	// The dead time delays the first 10% crossing by at least L.
	if r.Figures.RiseTime <= 0 || r.Figures.PeakTimeSetpoint < L {
		t.Errorf("rise time %g, peak time %g", r.Figures.RiseTime, r.Figures.PeakTimeSetpoint)
	}
}

// The PI loop on the same plant, kp = 0.6, ki = 0.8 (invented, stable),
// by the method of steps with m = 4, 8, 16, 32 steps per dead time
// against m = 256: the error must fall by about 2⁴ per halving of the
// step (the Hermite cubic of the delayed input is the only
// approximation). Then against an independent integration: classical
// Runge–Kutta written here (rk4Delay), with 2048 steps per delay.
func TestDelayConvergence(t *testing.T) {
	const kp, ki, D = 0.6, 0.8, 12.0
	l := fopdtLoop([]float64{kp, ki}, []float64{1, 0})
	run := func(m int) *Result {
		return mustStep(t, l, Options{Duration: D, Samples: int(D / fopdtL * float64(m))})
	}
	fine := run(256)
	var errs []float64
	for _, m := range []int{4, 8, 16, 32} {
		r := run(m)
		stride := 256 / m
		worst := 0.0
		for k := range r.Time {
			worst = math.Max(worst, math.Abs(r.Setpoint.Output[k]-fine.Setpoint.Output[k*stride]))
			worst = math.Max(worst, math.Abs(r.Load.Output[k]-fine.Load.Output[k*stride]))
		}
		errs = append(errs, worst)
	}
	for i := 1; i < len(errs); i++ {
		if ratio := errs[i-1] / errs[i]; ratio < 10 || ratio > 25 {
			t.Errorf("error %g → %g on halving the step: ratio %g, want about 16", errs[i-1], errs[i], ratio)
		}
	}
	if errs[len(errs)-1] > 1e-8 {
		t.Errorf("error with 32 steps per delay %g, want below 1e-8", errs[len(errs)-1])
	}

	const perDelay = 2048
	for _, step := range []struct {
		name string
		r, d float64
		got  []float64
	}{{"setpoint", 1, 0, fine.Setpoint.Output}, {"load", 0, 1, fine.Load.Output}} {
		ref := rk4Delay(fopdtK, fopdtTau, fopdtL, step.r, step.d, kp, ki, perDelay, int(D/fopdtL))
		compareTrace(t, step.name+" y vs Runge–Kutta", fine.Time, step.got, func(tt float64) float64 {
			return ref[int(math.Round(tt/fopdtL*perDelay))]
		}, 1e-10, 1)
	}
}

// rk4Delay integrates the PI loop on the plant K·e^(−Ls)/(τs + 1),
//
//	y' = (−y + K·w)/τ,  z' = e = r − y,  v = kp·e + ki·z + d,  w(t) = v(t − L),
//
// by classical Runge–Kutta with m steps per dead time over delays dead
// times, and returns y on that grid. The delayed input inside a step
// comes from the Hermite cubic of v over the step one delay earlier,
// with the one-sided slopes v' = −kp·y' + ki·e at its ends (w jumps at
// t = L, so y' does).
func rk4Delay(K, tau, L, r, d, kp, ki float64, m, delays int) []float64 {
	n := m * delays
	h := L / float64(m)
	y, z := make([]float64, n+1), make([]float64, n+1)
	v := func(i int) float64 { return kp*(r-y[i]) + ki*z[i] + d }
	// slopes of v just after (R) and before (L) sample i.
	vR, vL := make([]float64, n+1), make([]float64, n+1)
	input := func(i int, c float64) float64 {
		j := i - m
		if j < 0 {
			return 0
		}
		p0, p1 := v(j), v(j+1)
		m0, m1 := h*vR[j], h*vL[j+1]
		return p0 + c*(m0+c*((3*(p1-p0)-2*m0-m1)+c*(2*(p0-p1)+m0+m1)))
	}
	f := func(yy, zz, w float64) (float64, float64) { return (-yy + K*w) / tau, r - yy }
	for i := 0; i <= n; i++ {
		wr, wl := input(i, 0), 0.0
		if i > 0 {
			wl = input(i-1, 1)
		}
		ydR, _ := f(y[i], z[i], wr)
		ydL, _ := f(y[i], z[i], wl)
		vR[i] = -kp*ydR + ki*(r-y[i])
		vL[i] = -kp*ydL + ki*(r-y[i])
		if i == n {
			break
		}
		w0, wm, w1 := input(i, 0), input(i, 0.5), input(i, 1)
		k1y, k1z := f(y[i], z[i], w0)
		k2y, k2z := f(y[i]+h/2*k1y, z[i]+h/2*k1z, wm)
		k3y, k3z := f(y[i]+h/2*k2y, z[i]+h/2*k2z, wm)
		k4y, k4z := f(y[i]+h*k3y, z[i]+h*k3z, w1)
		y[i+1] = y[i] + h/6*(k1y+2*k2y+2*k3y+k4y)
		z[i+1] = z[i] + h/6*(k1z+2*k2z+2*k3z+k4z)
	}
	return y
}

// IE = −1/ki holds with dead time too: Δ(0) = Nc(0)·N(0) whatever L.
func TestDelayIntegratedError(t *testing.T) {
	const kp, ki = 0.6, 0.8
	r := mustStep(t, fopdtLoop([]float64{kp, ki}, []float64{1, 0}), Options{DecayTo: 1e-12})
	check(t, "IE load", r.Figures.IELoad, -1/ki, 1e-9, 1/ki)
	check(t, "final setpoint", r.Figures.FinalSetpoint, 1, 0, 1)
	if r.Figures.IAELoad < -r.Figures.IELoad {
		t.Errorf("IAE %g < |IE| %g", r.Figures.IAELoad, -r.Figures.IELoad)
	}
}

// Dead-time loops unlike the one of fopdtLoop, against rk4Delay with 1024
// steps per delay. Invented: an open-loop unstable plant 1/(s − 1)
// (K = −1, τ = −1 in rk4Delay's form) with L = 0.2 under PI; a loop
// whose gain never reaches the bandwidth floor of 0.1, so that its
// dominant root comes from the plant pole.
func TestDelayAgainstRungeKutta(t *testing.T) {
	for _, tc := range []struct {
		name           string
		K, tau, L      float64
		kp, ki         float64
		delays, perRef int
	}{
		{"open-loop unstable plant", -1, -1, 0.2, 2, 0.5, 150, 1024},
		{"low loop gain", 0.05, 1, 0.5, 1, 0, 20, 1024},
	} {
		t.Run(tc.name, func(t *testing.T) {
			l := Loop{PlantNum: p(tc.K), PlantDen: p(tc.tau, 1), CtrlNum: p(tc.kp, tc.ki), CtrlDen: p(1, 0), Delay: tc.L}
			if tc.ki == 0 {
				l.CtrlNum, l.CtrlDen = p(tc.kp), p(1)
			}
			D := float64(tc.delays) * tc.L
			r := mustStep(t, l, Options{Duration: D, Samples: tc.delays * 64})
			for _, step := range []struct {
				name string
				r, d float64
				got  []float64
			}{{"setpoint", 1, 0, r.Setpoint.Output}, {"load", 0, 1, r.Load.Output}} {
				ref := rk4Delay(tc.K, tc.tau, tc.L, step.r, step.d, tc.kp, tc.ki, tc.perRef, tc.delays)
				scale := 0.0
				for _, v := range ref {
					scale = math.Max(scale, math.Abs(v))
				}
				compareTrace(t, step.name+" y", r.Time, step.got, func(tt float64) float64 {
					return ref[int(math.Round(tt/tc.L*float64(tc.perRef)))]
				}, 1e-9, scale)
			}
		})
	}
}
