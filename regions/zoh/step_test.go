package zoh

import (
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/poly"
)

// continuousStep returns the unit step response of num/den at time t ≥ 0,
// by residues of e^(st)·G(s)/s, a computation that shares nothing with
// Discretise's state model: for poles λ of den other than s = 0, assumed
// simple, the residue is e^(λt)·N(λ)/(λ·D'(λ)); at s = 0 it is G(0) for a
// plant without integrator and t·N(0)/D1(0) + (N/D1)'(0) for a plant
// D = s·D1 with one (the double pole of G(s)/s).
func continuousStep(t testing.TB, num, den poly.Poly, at float64) float64 {
	integrator := den[0] == 0
	d1 := den
	if integrator {
		d1 = den[1:]
	}
	roots, err := d1.Roots()
	if err != nil {
		t.Fatal(err)
	}
	dd := d1.Derivative()
	var y complex128
	for _, l := range roots {
		r := num.Eval(l) / (l * dd.Eval(l))
		if integrator {
			r /= l
		}
		y += r * cmplx.Exp(l*complex(at, 0))
	}
	if !integrator {
		return real(y) + num[0]/den[0]
	}
	n0, n1 := num.EvalReal(0), num.Derivative().EvalReal(0)
	e0, e1 := d1.EvalReal(0), d1.Derivative().EvalReal(0)
	return real(y) + at*n0/e0 + (n1*e0-n0*e1)/(e0*e0)
}

// discreteStep returns the first k samples of the unit step response of
// the pulse transfer function num(z)/den(z), from its difference equation.
func discreteStep(num, den poly.Poly, k int) []float64 {
	m := len(den) - 1
	y := make([]float64, k)
	for j := 0; j < k; j++ {
		s := 0.0
		for i := 0; i <= m; i++ {
			at := j - m + i
			if i < len(num) && at >= 0 {
				s += num[i]
			}
			if i < m && at >= 0 {
				s -= den[i] * y[at]
			}
		}
		y[j] = s / den[m]
	}
	return y
}

// TestStepResponseAtSamples checks the defining property of the zero-order
// hold: the step response of G(z) equals the continuous step response of
// G(s)·e^(−Ls) at the sampling instants (a step is held exactly). All
// plants are invented for this test: minimum and non-minimum phase,
// biproper, unstable, integrating, lightly damped and stiff, with delays
// that are zero, whole and fractional numbers of samples.
func TestStepResponseAtSamples(t *testing.T) {
	tests := []struct {
		name     string
		num, den poly.Poly // descending, as written
		T, L     float64
		// tol bounds the error relative to the largest sample. The
		// difference equation and the residues each round; 1e-12 leaves
		// room for the growth of an unstable or integrating response over
		// 60 steps. With all poles within 2e-3 of z = 1 the difference
		// equation itself amplifies the rounding of the coefficients (the
		// polynomial in z is ill-conditioned there; measured 5e-11).
		tol float64
	}{
		{"three lags", poly.Poly{2, 3}, poly.Poly{1, 5.5, 6.5, 2}, 0.3, 0, 1e-12},
		{"right-half-plane zeros, fractional delay", poly.Poly{1, -1, 2}, poly.Poly{1, 2.6, 2.7, 3}, 0.5, 0.7, 1e-12},
		{"integrator, two samples of delay", poly.Poly{3}, poly.Poly{1, 7, 10, 0}, 0.2, 0.4, 1e-12},
		{"biproper with delay", poly.Poly{1, 3}, poly.Poly{1, 1}, 0.25, 0.1, 1e-12},
		{"unstable pole", poly.Poly{1, 1}, poly.Poly{1, 2.5, -1.5}, 0.1, 0.35, 1e-12},
		{"lightly damped", poly.Poly{4}, poly.Poly{1, 0.02, 4}, 0.4, 0, 1e-12},
		{"stiff", poly.Poly{1, 10}, poly.Poly{1, 1100.1, 100110, 10000}, 0.05, 0.012, 1e-12},
		{"slow sampling", poly.Poly{0.5, 1}, poly.Poly{1, 3, 2}, 4, 6.5, 1e-12},
		{"fast sampling", poly.Poly{1}, poly.Poly{1, 2, 2, 1}, 1e-3, 2.5e-3, 1e-9},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			num, den := poly.FromDescending(tc.num), poly.FromDescending(tc.den)
			nz, dz, err := Discretise(num, den, tc.T, tc.L)
			if err != nil {
				t.Fatal(err)
			}
			const k = 60
			got := discreteStep(nz, dz, k)
			want := make([]float64, k)
			scale := 0.0
			for j := range want {
				at := float64(j)*tc.T - tc.L
				if math.Abs(at) <= 1e-9*tc.T {
					at = 0
				}
				if at >= 0 {
					want[j] = continuousStep(t, num, den, at)
				}
				scale = math.Max(scale, math.Abs(want[j]))
			}
			worst := 0.0
			for j := range want {
				worst = math.Max(worst, math.Abs(got[j]-want[j])/scale)
			}
			if worst > tc.tol {
				t.Errorf("largest step-response error %.3g of the largest sample (tolerance %g)\n got %v\nwant %v", worst, tc.tol, got[:8], want[:8])
			}
			t.Logf("largest error %.2g", worst)
		})
	}
}
