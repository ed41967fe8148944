package study

import (
	"math"
	"testing"

	"gainscape/regions/spec"
)

// TestStepResponseFirstOrderPI: the invented first-order plant
// G = 2/(3s + 1) under PI with kp = ki = 1, solved by hand. The
// characteristic polynomial is s(3s + 1) + 2(s + 1) = 3s² + 3s + 2, poles
// −σ ± jω with σ = 1/2, ω² = 2/3 − 1/4 = 5/12.
//
//	setpoint: Y = 2(s+1)/(s(3s²+3s+2)) = 1/s − (s + 1/3)/((s+σ)² + ω²)
//	          y(t) = 1 − e^(−σt)(cos ωt − (1/6)/ω · sin ωt)
//	load:     Y = G/(1+CG)·1/s = 2/(3s²+3s+2)
//	          y(t) = (2/3)/ω · e^(−σt) sin ωt, ∫y = (2/3)/(σ²+ω²) = 1 = 1/ki
//
// The study's response must follow both to rounding, end at the final
// values 1 and 0, and integrate the load error to −1/ki.
func TestStepResponseFirstOrderPI(t *testing.T) {
	l, err := LoopSpec{Plant: "2/(3*s+1)", Controller: "pi", Fixed: []spec.Value{{Param: "kp", V: 1}, {Param: "ki", V: 1}}}.Build()
	if err != nil {
		t.Fatal(err)
	}
	r, err := StepResponse(l, 40)
	if err != nil {
		t.Fatal(err)
	}
	sigma, omega := 0.5, math.Sqrt(5.0/12)
	for k, tk := range r.Time {
		e := math.Exp(-sigma * tk)
		ys := 1 - e*(math.Cos(omega*tk)-(1.0/6)/omega*math.Sin(omega*tk))
		yl := (2.0 / 3) / omega * e * math.Sin(omega*tk)
		if math.Abs(r.Setpoint.Output[k]-ys) > 1e-12 || math.Abs(r.Load.Output[k]-yl) > 1e-12 {
			t.Fatalf("t = %g: y %g and %g; by hand %g and %g", tk, r.Setpoint.Output[k], r.Load.Output[k], ys, yl)
		}
	}
	f := r.Figures
	if f.FinalSetpoint != 1 || f.FinalLoad != 0 {
		t.Errorf("final values %g, %g; want 1 and 0", f.FinalSetpoint, f.FinalLoad)
	}
	// Over 40 time units e^(−σt) is down to 2e-9.
	if math.Abs(f.IELoad+1) > 1e-8 {
		t.Errorf("IE %.12g; want −1/ki = −1", f.IELoad)
	}
	if _, err := StepResponse(l.Set(1, -1), 0); err == nil || !IsInput(err) {
		t.Errorf("an unstable design (ki < 0) gave %v; want an input error", err)
	}
}
