package response

import (
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/poly"
)

// residueStep returns the step response of M/Δ at time t > 0 by partial
// fractions over the roots of Δ from gonum's eigenvalue solver (simple
// roots assumed): y(t) = M(0)/Δ(0) + Σᵢ M(pᵢ)/(pᵢ·Δ'(pᵢ))·e^(pᵢt). It
// shares nothing with the matrix exponential it checks.
func residueStep(t testing.TB, m, delta poly.Poly) func(float64) float64 {
	roots, err := delta.Roots()
	if err != nil {
		t.Fatal(err)
	}
	d1 := delta.Derivative()
	res := make([]complex128, len(roots))
	for i, r := range roots {
		res[i] = m.Eval(r) / (r * d1.Eval(r))
	}
	final := m.EvalReal(0) / delta.EvalReal(0)
	return func(tt float64) float64 {
		s := complex(final, 0)
		for i, r := range roots {
			s += res[i] * cmplx.Exp(r*complex(tt, 0))
		}
		return real(s)
	}
}

// The invented plant G = 1.5/((2s + 1)(0.5s + 1)) under the filtered PID
// of package family, kp = 2, ki = 1, kd = 0.5, tau = 0.1: a closed loop of
// degree 4. Checked against partial fractions (residueStep) and against a
// classical fourth-order Runge–Kutta integration of the physical
// equations written here:
//
//	plant:      y'' + 2.5·y' + y = 1.5·(u + d)
//	controller: u = kp·e + ki·∫e + kd·(e − z)/tau,  z' = (e − z)/tau,  e = r − y
//
// (z is e through the filter 1/(tau·s + 1), so (e − z)/tau is
// s/(tau·s + 1) applied to e).
func TestSecondOrderPlantPID(t *testing.T) {
	const kp, ki, kd, tau = 2.0, 1.0, 0.5, 0.1
	num, den := family.Controller(family.PID{}, []float64{kp, ki, kd, tau})
	l := Loop{PlantNum: p(1.5), PlantDen: p(1, 2.5, 1), CtrlNum: num, CtrlDen: den}
	r := mustStep(t, l, Options{})
	delta := family.Characteristic(l.PlantNum, l.PlantDen, num, den)

	ys := residueStep(t, poly.Mul(num, l.PlantNum), delta)
	yl := residueStep(t, poly.Mul(l.PlantNum, den), delta)
	us := residueStep(t, poly.Mul(num, l.PlantDen), delta)
	compareTrace(t, "setpoint y vs residues", r.Time[1:], r.Setpoint.Output[1:], ys, 1e-11, 1)
	compareTrace(t, "setpoint u vs residues", r.Time[1:], r.Setpoint.Control[1:], us, 1e-11, math.Abs(r.Setpoint.Control[0]))
	compareTrace(t, "load y vs residues", r.Time[1:], r.Load.Output[1:], yl, 1e-11, math.Abs(r.Figures.PeakLoad))
	// u jumps at t = 0+ to the high-frequency gain of C: kp + kd/tau.
	check(t, "u(0+)", r.Setpoint.Control[0], kp+kd/tau, 1e-12, kp+kd/tau)

	for _, step := range []struct {
		name string
		r, d float64
		got  []float64
	}{{"setpoint", 1, 0, r.Setpoint.Output}, {"load", 0, 1, r.Load.Output}} {
		want := rk4PID(step.r, step.d, kp, ki, kd, tau, r.Span.Step, 50, r.Span.Samples)
		compareTrace(t, step.name+" y vs Runge–Kutta", r.Time, step.got, func(tt float64) float64 {
			return want[int(math.Round(tt/r.Span.Step))]
		}, 1e-10, 1)
	}
}

// rk4PID integrates the physical equations of TestSecondOrderPlantPID by
// the classical Runge–Kutta method with m substeps per sample and
// returns y at the samples 0 … n.
func rk4PID(r, d, kp, ki, kd, tau, h float64, m, n int) []float64 {
	f := func(x [4]float64) [4]float64 {
		y, yd, integ, z := x[0], x[1], x[2], x[3]
		e := r - y
		u := kp*e + ki*integ + kd*(e-z)/tau
		return [4]float64{yd, 1.5*(u+d) - 2.5*yd - y, e, (e - z) / tau}
	}
	axpy := func(x, k [4]float64, a float64) [4]float64 {
		for i := range x {
			x[i] += a * k[i]
		}
		return x
	}
	out := make([]float64, n+1)
	var x [4]float64
	dt := h / float64(m)
	for k := 1; k <= n; k++ {
		for j := 0; j < m; j++ {
			k1 := f(x)
			k2 := f(axpy(x, k1, dt/2))
			k3 := f(axpy(x, k2, dt/2))
			k4 := f(axpy(x, k3, dt))
			for i := range x {
				x[i] += dt / 6 * (k1[i] + 2*k2[i] + 2*k3[i] + k4[i])
			}
		}
		out[k] = x[0]
	}
	return out
}
