package response

import (
	"errors"
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/poly"
)

// Loops at the edges of what Step serves, each against a reference
// derived by hand (in the comment of the case) or by partial fractions
// (residueStep).
func TestEdgeLoops(t *testing.T) {
	for _, tc := range []struct {
		name string
		l    Loop
		// ys and yl are the setpoint and load responses of y, nil to use
		// partial fractions over the roots of Δ.
		ys, yl func(float64) float64
		fs, fl float64 // final values
		y0     float64 // y(0+) of the setpoint step
	}{
		{
			// G = 1/s, C = 2: Δ = s + 2, Y/R = 2/(s+2), Y/D = 1/(s+2).
			// The load error persists (no integrator before the load):
			// final load 1/kp.
			name: "integrating plant",
			l:    Loop{PlantNum: p(1), PlantDen: p(1, 0), CtrlNum: p(2), CtrlDen: p(1)},
			ys:   func(t float64) float64 { return -math.Expm1(-2 * t) },
			yl:   func(t float64) float64 { return -math.Expm1(-2*t) / 2 },
			fs:   1, fl: 0.5,
		},
		{
			// G = 1/(s − 1), C = 3: Δ = s + 2, Y/R = 3/(s+2).
			name: "open-loop unstable plant",
			l:    Loop{PlantNum: p(1), PlantDen: p(1, -1), CtrlNum: p(3), CtrlDen: p(1)},
			ys:   func(t float64) float64 { return 1.5 * -math.Expm1(-2*t) },
			yl:   func(t float64) float64 { return 0.5 * -math.Expm1(-2*t) },
			fs:   1.5, fl: 0.5,
		},
		{
			// G = (1 − s)/(s + 1)², C = 0.5: Δ = s² + 1.5s + 1.5.
			name: "non-minimum-phase plant",
			l:    Loop{PlantNum: p(-1, 1), PlantDen: p(1, 2, 1), CtrlNum: p(0.5), CtrlDen: p(1)},
			fs:   1.0 / 3, fl: 2.0 / 3,
		},
		{
			// G = 1/((s+1)(s+2)), ideal PD C = 3 + 2s.
			name: "ideal derivative",
			l:    Loop{PlantNum: p(1), PlantDen: p(1, 3, 2), CtrlNum: p(2, 3), CtrlDen: p(1)},
			fs:   0.6, fl: 0.2,
		},
		{
			// G = 2/(s+1)³, ideal PID C = (0.5s² + s + 0.3)/s.
			name: "ideal PID",
			l:    Loop{PlantNum: p(2), PlantDen: p(1, 3, 3, 1), CtrlNum: p(0.5, 1, 0.3), CtrlDen: p(1, 0)},
			fs:   1, fl: 0,
		},
		{
			// G = (s + 2)/(s + 1) and a lead C = 2(s + 1)/(s + 5), both
			// biproper: y jumps at once to C·G/(1 + C·G) at infinity, 2/3.
			name: "biproper plant and controller",
			l:    Loop{PlantNum: p(1, 2), PlantDen: p(1, 1), CtrlNum: p(2, 2), CtrlDen: p(1, 5)},
			fs:   4.0 / 9, fl: 10.0 / 9, y0: 2.0 / 3,
		},
		{
			// G = 2, C = 3: no dynamics, y = 6/7 at once, load y = 2/7.
			name: "static loop",
			l:    Loop{PlantNum: p(2), PlantDen: p(1), CtrlNum: p(3), CtrlDen: p(1)},
			ys:   func(float64) float64 { return 6.0 / 7 },
			yl:   func(float64) float64 { return 2.0 / 7 },
			fs:   6.0 / 7, fl: 2.0 / 7, y0: 6.0 / 7,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r := mustStep(t, tc.l, Options{})
			cl := newClosedLoop(tc.l)
			ys, yl := tc.ys, tc.yl
			if ys == nil {
				ys, yl = residueStep(t, cl.setpointY, cl.delta), residueStep(t, cl.loadY, cl.delta)
			}
			compareTrace(t, "setpoint y", r.Time[1:], r.Setpoint.Output[1:], ys, 1e-11, 1)
			compareTrace(t, "load y", r.Time[1:], r.Load.Output[1:], yl, 1e-11, 1)
			check(t, "y(0+)", r.Setpoint.Output[0], tc.y0, 1e-14, 1)
			check(t, "final setpoint", r.Figures.FinalSetpoint, tc.fs, 1e-15, 1)
			check(t, "final load", r.Figures.FinalLoad, tc.fl, 1e-15, 1)
		})
	}
}

// The non-minimum-phase loop of TestEdgeLoops first moves the wrong way.
// Its undershoot is found here from the partial-fraction response by a
// golden-section search for the minimum on [0, 2] (independent of the
// package's refinement).
func TestNonMinimumPhaseUndershoot(t *testing.T) {
	l := Loop{PlantNum: p(-1, 1), PlantDen: p(1, 2, 1), CtrlNum: p(0.5), CtrlDen: p(1)}
	r := mustStep(t, l, Options{})
	cl := newClosedLoop(l)
	y := residueStep(t, cl.setpointY, cl.delta)
	a, b := 0.0, 2.0
	g := (math.Sqrt(5) - 1) / 2
	for b-a > 1e-12 {
		c, d := b-g*(b-a), a+g*(b-a)
		if y(c) < y(d) {
			b = d
		} else {
			a = c
		}
	}
	low := y((a + b) / 2)
	if low >= 0 {
		t.Fatalf("reference minimum %g is not below zero", low)
	}
	check(t, "undershoot", r.Figures.Undershoot, -100*low/(1.0/3), 1e-9, 100)
	if r.Setpoint.Output[1] >= 0 {
		t.Errorf("y(h) = %g, want the wrong way (below zero)", r.Setpoint.Output[1])
	}
}

// With an ideal derivative the controller output holds an impulse. For
// G = 1/((s+1)(s+2)) and C = kp + kd·s, derived by hand in this test:
// Nc·D = kd·s³ + (3kd + kp)s² + (2kd + 3kp)s + 2kp divided by
// Δ = s² + (3 + kd)s + 2 + kp leaves the quotient kd·s + (kp − kd²), so
// u = kd·δ(t) + (kp − kd²) + … at t = 0+. (Directly: the impulse kd·δ
// through G gives y(0+) = 0 and y'(0+) = kd, so u(0+) = kp·1 − kd·kd.)
func TestIdealDerivativeImpulse(t *testing.T) {
	const kp, kd = 3.0, 2.0
	num, den := family.Controller(family.ProportionalDerivative{}, []float64{kp, kd})
	r := mustStep(t, Loop{PlantNum: p(1), PlantDen: p(1, 3, 2), CtrlNum: num, CtrlDen: den}, Options{})
	if len(r.Setpoint.ControlImpulse) != 1 {
		t.Fatalf("impulses %v, want one of weight kd", r.Setpoint.ControlImpulse)
	}
	check(t, "impulse weight", r.Setpoint.ControlImpulse[0], kd, 1e-15, kd)
	check(t, "u(0+)", r.Setpoint.Control[0], kp-kd*kd, 1e-14, kp)
	if len(r.Load.ControlImpulse) != 0 {
		t.Errorf("load step: impulses %v, want none (u = −T·d is proper)", r.Load.ControlImpulse)
	}
}

// High-order loops with poles known in closed form (derived by hand in
// this test): G = 1/(s+1)^n under P has Δ = (s+1)^n + kp, whose roots are
// pₖ = −1 + kp^(1/n)·e^(jπ(2k+1)/n), k = 0 … n−1, all simple, and
// Δ'(p) = n(p+1)^(n−1); the partial fractions of kp/(s·Δ) then give
// y(t) = kp/(1 + kp) + Σₖ kp·e^(pₖt)/(pₖ·n(pₖ+1)^(n−1)). The loop is
// stable for kp < sec(π/n)^n.
func TestHighOrderAnalyticPoles(t *testing.T) {
	for _, tc := range []struct {
		name string
		n    int
		kp   float64
		tol  float64
	}{
		{"degree 10", 10, 1.2, 1e-11},
		{"degree 20", 20, 1.1, 1e-12},
	} {
		t.Run(tc.name, func(t *testing.T) {
			den := poly.Poly{1, 1}.Pow(tc.n)
			r := mustStep(t, Loop{PlantNum: p(1), PlantDen: den, CtrlNum: p(tc.kp), CtrlDen: p(1)}, Options{})
			rho := math.Pow(tc.kp, 1/float64(tc.n))
			poles := make([]complex128, tc.n)
			for k := range poles {
				poles[k] = -1 + cmplx.Rect(rho, math.Pi*float64(2*k+1)/float64(tc.n))
			}
			want := func(t float64) float64 {
				s := complex(tc.kp/(1+tc.kp), 0)
				for _, pk := range poles {
					s += complex(tc.kp, 0) * cmplx.Exp(pk*complex(t, 0)) / (pk * complex(float64(tc.n), 0) * cmplx.Pow(pk+1, complex(float64(tc.n-1), 0)))
				}
				return real(s)
			}
			compareTrace(t, "setpoint y", r.Time, r.Setpoint.Output, want, tc.tol, 1)
			// The window follows the slowest pair: σ = 1 − ρ·cos(π/n).
			sigma := 1 - rho*math.Cos(math.Pi/float64(tc.n))
			check(t, "slowest decay", r.Span.SlowestDecay, sigma, 1e-9, sigma)
		})
	}
}

// Loops Step must refuse, invented.
func TestRefusedLoops(t *testing.T) {
	for _, tc := range []struct {
		name   string
		l      Loop
		target error
	}{
		{"unstable: 1/(s+1)³ beyond its ultimate gain 8", Loop{PlantNum: p(1), PlantDen: p(1, 3, 3, 1), CtrlNum: p(9), CtrlDen: p(1)}, ErrUnstable},
		{"on the edge: 1/(s+1)³ at its ultimate gain 8", Loop{PlantNum: p(1), PlantDen: p(1, 3, 3, 1), CtrlNum: p(8), CtrlDen: p(1)}, ErrUnstable},
		{"open-loop unstable plant not stabilised", Loop{PlantNum: p(1), PlantDen: p(1, -1), CtrlNum: p(0.5), CtrlDen: p(1)}, ErrUnstable},
		{"root at the origin: 1/(s − 1) under kp = 1", Loop{PlantNum: p(1), PlantDen: p(1, -1), CtrlNum: p(1), CtrlDen: p(1)}, ErrUnstable},
		{"double integrator under P", Loop{PlantNum: p(1), PlantDen: p(1, 0, 0), CtrlNum: p(1), CtrlDen: p(1)}, ErrUnstable},
		{"ill-posed: 1 + C·G = 0 at infinity", Loop{PlantNum: p(1, 1), PlantDen: p(1, 2), CtrlNum: p(-1), CtrlDen: p(1)}, ErrUnstable},
		// The leading coefficient of Δ, 1·1 − (1 − 1e-15)·1, is a few
		// rounding errors of its two terms: its sign and size are noise.
		{"nearly ill-posed", Loop{PlantNum: p(1, 1), PlantDen: p(1, 2), CtrlNum: p(-1 + 1e-15), CtrlDen: p(1)}, ErrUndecided},
		{"PI with no integral gain path: ki = 0 leaves a root at 0", Loop{PlantNum: p(1), PlantDen: p(1, 1), CtrlNum: p(1, 0), CtrlDen: p(1, 0)}, ErrUnstable},
		{"improper plant", Loop{PlantNum: p(1, 0, 0), PlantDen: p(1, 1), CtrlNum: p(1), CtrlDen: p(1, 3)}, nil},
		{"zero denominator", Loop{PlantNum: p(1), PlantDen: p(0), CtrlNum: p(1), CtrlDen: p(1)}, nil},
		{"not a number", Loop{PlantNum: p(math.NaN()), PlantDen: p(1, 1), CtrlNum: p(1), CtrlDen: p(1)}, nil},
		{"negative dead time", Loop{PlantNum: p(1), PlantDen: p(1, 1), CtrlNum: p(1), CtrlDen: p(1), Delay: -1}, nil},
		// Sampled: G(z) = 0.5/(z − 0.8) under kp has its pole at
		// b = 0.8 − 0.5·kp.
		{"sampled: b = −1.2 outside the unit circle", Loop{PlantNum: p(0.5), PlantDen: p(1, -0.8), CtrlNum: p(4), CtrlDen: p(1), Period: 0.1}, ErrUnstable},
		{"sampled: b = −1 on the circle", Loop{PlantNum: p(0.5), PlantDen: p(1, -0.8), CtrlNum: p(3.6), CtrlDen: p(1), Period: 0.1}, ErrUnstable},
		// A zero plant and an integrating controller leave a double pole
		// at z = 1.
		{"sampled: poles at z = 1", Loop{PlantNum: p(0), PlantDen: p(1, -1), CtrlNum: p(1), CtrlDen: p(1, -1), Period: 0.1}, ErrUnstable},
		{"sampled: non-causal controller", Loop{PlantNum: p(0.5), PlantDen: p(1, -0.8), CtrlNum: p(1, 0.2), CtrlDen: p(1), Period: 0.1}, nil},
		{"sampled: dead time given as Delay", Loop{PlantNum: p(0.5), PlantDen: p(1, -0.8), CtrlNum: p(1), CtrlDen: p(1), Period: 0.1, Delay: 0.2}, nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Step(tc.l, Options{})
			if err == nil {
				t.Fatalf("Step(%v) succeeded, want an error", tc.l)
			}
			if tc.target != nil && !errors.Is(err, tc.target) {
				t.Errorf("Step(%v) = %v, want %v", tc.l, err, tc.target)
			}
			if testing.Verbose() {
				t.Log(err)
			}
		})
	}
}
