package response

import (
	"math"
	"testing"
)

// First-order plant under PI control, invented: G = K/(τs + 1), K = 2,
// τ = 3, C = kp + ki/s = (kp·s + ki)/s. Derived by hand in this test:
//
//	Δ = τs² + (1 + K·kp)s + K·ki
//	setpoint: Y/R = K(kp·s + ki)/Δ,   load: Y/D = K·s/Δ.
//
// With 2σ = (1 + K·kp)/τ and σ² + ω² = K·ki/τ (complex poles −σ ± jω),
// partial fractions of Y(s) = Y/R·1/s = 1/s + (αs + β)/((s+σ)² + ω²)
// give α = −1, β = K·kp/τ − 2σ, so
//
//	y(t) = 1 − e^(−σt)·cos ωt + B·e^(−σt)·sin ωt,   B = (K·kp/τ − σ)/ω,
//
// and the load response is y(t) = K/(τω)·e^(−σt)·sin ωt. Then
// ∫₀^∞ y = K/(τ(σ² + ω²)) = 1/ki, so IE = −1/ki (e = −y), and since
// each half period of |sin| carries e^(−σπ/ω) times the previous,
// ∫₀^∞ |y| = (1/ki)·coth(σπ/(2ω)).
//
// With real poles p₁ ≠ p₂ the residues give
//
//	y(t) = 1 + Σᵢ (K/τ)(kp·pᵢ + ki)/(pᵢ(pᵢ − pⱼ))·e^(pᵢt),
//	load y(t) = (K/τ)(e^(p₁t) − e^(p₂t))/(p₁ − p₂) > 0,
//
// so the load error keeps one sign and IAE = |IE| = 1/ki.
func TestFirstOrderPI(t *testing.T) {
	const K, tau = 2.0, 3.0
	for _, tc := range []struct {
		name    string
		kp, ki  float64
		complex bool
		// tPeakTol is the relative tolerance of the load peak time: a
		// stationary point is located by the root of the slope, whose
		// rounding error over the curvature sets it. With poles 1e12
		// apart the slope is a sum of terms far larger than itself near
		// the peak (measured: 1e-5 and 1e-6 of the peak time).
		tPeakTol float64
	}{
		{"oscillating", 1, 1, true, 1e-9},
		{"lightly damped", 0.2, 3, true, 1e-9},
		{"overdamped", 4, 0.2, false, 1e-9},
		// Poles near −0.5 and −6.7e11, near −1/3 and −2e-12.
		{"huge gains", 1e12, 5e11, false, 1e-4},
		{"tiny gains", 1e-12, 1e-12, false, 1e-4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			l := Loop{PlantNum: p(K), PlantDen: p(tau, 1), CtrlNum: p(tc.kp, tc.ki), CtrlDen: p(1, 0)}
			b1, b0 := (1+K*tc.kp)/tau, K*tc.ki/tau
			var ys, yl func(float64) float64
			var iaeInf, tPeak float64
			if tc.complex {
				s := b1 / 2
				w := math.Sqrt(b0 - s*s)
				B := (K*tc.kp/tau - s) / w
				ys = func(t float64) float64 { return 1 - math.Exp(-s*t)*(math.Cos(w*t)-B*math.Sin(w*t)) }
				yl = func(t float64) float64 { return K / (tau * w) * math.Exp(-s*t) * math.Sin(w*t) }
				iaeInf = 1 / tc.ki / math.Tanh(s*math.Pi/(2*w))
				// The load peak: d/dt e^(−σt)·sin ωt = 0 at tan ωt = ω/σ.
				tPeak = math.Atan2(w, s) / w

				// First maximum of the setpoint response: y' ∝ sin(ωt + φ)
				// with tan φ = (σ + Bω)/(ω − Bσ), so t_p = (π − φ)/ω.
				r := mustStep(t, l, Options{})
				phi := math.Atan2(s+B*w, w-B*s)
				tp := (math.Pi - phi) / w
				check(t, "peak time", r.Figures.PeakTimeSetpoint, tp, 1e-8, tp)
				check(t, "overshoot", r.Figures.Overshoot, 100*(ys(tp)-1), 1e-10, 100)
			} else {
				// The larger root by the formula, the smaller from the
				// product of the roots, which keeps its digits.
				p2 := (-b1 - math.Sqrt(b1*b1-4*b0)) / 2
				p1 := b0 / p2
				c1 := K / tau * (tc.kp*p1 + tc.ki) / (p1 * (p1 - p2))
				c2 := K / tau * (tc.kp*p2 + tc.ki) / (p2 * (p2 - p1))
				ys = func(t float64) float64 { return 1 + c1*math.Exp(p1*t) + c2*math.Exp(p2*t) }
				yl = func(t float64) float64 { return K / tau * (math.Exp(p1*t) - math.Exp(p2*t)) / (p1 - p2) }
				iaeInf = 1 / tc.ki
				// The load peak: p₁e^(p₁t) = p₂e^(p₂t) at t = ln(p₂/p₁)/(p₁ − p₂),
				// inside the first step for the huge gains.
				tPeak = math.Log(p2/p1) / (p1 - p2)
			}
			r := mustStep(t, l, Options{})
			compareTrace(t, "setpoint y", r.Time, r.Setpoint.Output, ys, 1e-10, 1)
			peak := math.Max(math.Abs(r.Figures.PeakLoad), 1e-300)
			compareTrace(t, "load y", r.Time, r.Load.Output, yl, 1e-10, peak)
			check(t, "final setpoint", r.Figures.FinalSetpoint, 1, 0, 1)
			check(t, "final load", r.Figures.FinalLoad, 0, 0, 1)
			check(t, "peak load", r.Figures.PeakLoad, yl(tPeak), 1e-12, yl(tPeak))
			check(t, "peak time load", r.Figures.PeakTimeLoad, tPeak, tc.tPeakTol, tPeak)

			// A window long enough for the slowest mode to fall to 1e-13
			// leaves a tail below 1e-12 of the integrals.
			long := mustStep(t, l, Options{DecayTo: 1e-14})
			check(t, "IE load (long window)", long.Figures.IELoad, -1/tc.ki, 1e-11, 1/tc.ki)
			check(t, "IAE load (long window)", long.Figures.IAELoad, iaeInf, 1e-11, iaeInf)
			if long.Figures.IAELoad < math.Abs(long.Figures.IELoad)*(1-1e-15) {
				t.Errorf("IAE %g < |IE| %g", long.Figures.IAELoad, long.Figures.IELoad)
			}
			if !tc.complex {
				check(t, "IAE = |IE| without sign change", long.Figures.IAELoad, -long.Figures.IELoad, 1e-12, 1/tc.ki)
			}
		})
	}
}
