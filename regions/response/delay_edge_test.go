package response

import (
	"errors"
	"math"
	"math/cmplx"
	"strings"
	"testing"
)

// The ultimate gain of the plant of fopdtLoop under P control. Derived by
// hand in this test (and given in this form by Silva, Datta &
// Bhattacharyya, PID Controllers for Time-Delay Systems, Birkhäuser
// 2005; recalled): a root at s = jω needs kp·K·e^(−jωL) = −(1 + jωτ),
// so with α = ωL the phase gives tan α = −(τ/L)·α, α in (π/2, π), and
// the magnitude kp = (τ/(K·L))·√(α² + (L/τ)²). Below it the dominant
// roots of 1 + kp·K·e^(−Ls)/(τs + 1) are near ±jα/L; above it the loop
// is unstable.
func TestDelayUltimateGain(t *testing.T) {
	a, b := math.Pi/2+1e-9, math.Pi
	for b-a > 1e-15 {
		m := (a + b) / 2
		if math.Tan(m)+fopdtTau/fopdtL*m < 0 {
			a = m
		} else {
			b = m
		}
	}
	alpha := (a + b) / 2
	ku := fopdtTau / (fopdtK * fopdtL) * math.Hypot(alpha, fopdtL/fopdtTau)

	r := mustStep(t, fopdtLoop([]float64{0.95 * ku}, []float64{1}), Options{})
	dom := r.Poles[0]
	if real(dom) >= 0 || real(dom) < -0.2 || math.Abs(math.Abs(imag(dom))-alpha/fopdtL) > 0.05*alpha/fopdtL {
		t.Errorf("dominant root at 0.95·ku: %v, want just left of ±j%g", dom, alpha/fopdtL)
	}
	// Each reported root is a root of the quasi-polynomial itself.
	for _, s := range r.Poles {
		f := complex(fopdtTau, 0)*s + 1 + complex(0.95*ku*fopdtK, 0)*cmplx.Exp(-complex(fopdtL, 0)*s)
		if cmplx.Abs(f) > 1e-12*(cmplx.Abs(s)+1) {
			t.Errorf("Δ(%v) = %v, want 0", s, f)
		}
	}
	if _, err := Step(fopdtLoop([]float64{1.05 * ku}, []float64{1}), Options{}); !errors.Is(err, ErrUnstable) {
		t.Errorf("kp = 1.05·ku: %v, want %v", err, ErrUnstable)
	}
}

// Dead-time loops outside the method's reach are refused with the loop
// in the message (invented plants).
func TestDelayRefused(t *testing.T) {
	for _, tc := range []struct {
		name string
		l    Loop
	}{
		{"ideal derivative", Loop{PlantNum: p(1), PlantDen: p(1, 1), CtrlNum: p(0.2, 1), CtrlDen: p(1), Delay: 0.5}},
		{"biproper plant", Loop{PlantNum: p(1, 2), PlantDen: p(1, 1), CtrlNum: p(1), CtrlDen: p(1, 0), Delay: 0.5}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Step(tc.l, Options{})
			if err == nil || !strings.Contains(err.Error(), "e^(−0.5s)") {
				t.Errorf("Step(%v) = %v, want an error naming the loop", tc.l, err)
			}
		})
	}
}

// A dead time shorter than one step of the window is taken by its Padé
// approximant; the figures must agree with the method of steps run with
// a step equal to the delay (allowed by raising MaxSamples). Invented
// loop: G = e^(−Ls)/(s + 1) under C = 1 + 1/s, L = 4e-4, on a window of
// 25 000 delays.
func TestShortDelayPade(t *testing.T) {
	const L = 4e-4
	l := Loop{PlantNum: p(1), PlantDen: p(1, 1), CtrlNum: p(1, 1), CtrlDen: p(1, 0), Delay: L}
	o := Options{Duration: 25000 * L}
	short := mustStep(t, l, o)
	o.MaxSamples = 30000
	steps := mustStep(t, l, o)
	if !strings.Contains(short.Method, "Padé") || !strings.Contains(steps.Method, "method of steps") {
		t.Fatalf("methods %q and %q, want Padé and the method of steps", short.Method, steps.Method)
	}
	a, b := short.Figures, steps.Figures
	for _, f := range []struct {
		name     string
		got, ref float64
	}{
		{"IE load", a.IELoad, b.IELoad}, {"IAE load", a.IAELoad, b.IAELoad},
		{"peak load", a.PeakLoad, b.PeakLoad}, {"peak time load", a.PeakTimeLoad, b.PeakTimeLoad},
		{"overshoot", a.Overshoot, b.Overshoot}, {"rise time", a.RiseTime, b.RiseTime},
		{"settling time", a.SettlingTime, b.SettlingTime}, {"IAE setpoint", a.IAESetpoint, b.IAESetpoint},
	} {
		check(t, f.name, f.got, f.ref, 1e-8, math.Max(math.Abs(f.ref), 1))
	}
}
