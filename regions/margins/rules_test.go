package margins

import (
	"math"
	"testing"

	"gainscape/regions/routh"
)

// Ku = 8, Tu = 2π/√3 (the plant 1/(s+1)³). ZN PID: Kc = 4.8, Ti = Tu/2,
// Td = Tu/8, so Ki = 4.8·2/Tu and Kd = 4.8·Tu/8.
func TestUltimateCycleRules(t *testing.T) {
	ku, tu, ok := Ultimate(p(1), p(1, 3, 3, 1), routh.Test{})
	if !ok {
		t.Fatal("no ultimate gain")
	}
	rules := UltimateCycleRules(ku, tu)
	want := map[string]Rule{
		"Ziegler-Nichols P":   {Family: "p", Kp: 4},
		"Ziegler-Nichols PI":  {Family: "pi", Kp: 3.6, Ki: 3.6 * 1.2 / tu},
		"Ziegler-Nichols PID": {Family: "pid", Kp: 4.8, Ki: 4.8 * 2 / tu, Kd: 4.8 * tu / 8},
		"Tyreus-Luyben PI":    {Family: "pi", Kp: 8 / 3.2, Ki: 8 / 3.2 / (2.2 * tu)},
		"Tyreus-Luyben PID":   {Family: "pid", Kp: 8 / 2.2, Ki: 8 / 2.2 / (2.2 * tu), Kd: 8 / 2.2 * tu / 6.3},
	}
	if len(rules) != len(want) {
		t.Fatalf("%d rules, want %d", len(rules), len(want))
	}
	for _, r := range rules {
		w, ok := want[r.Name]
		if !ok {
			t.Errorf("unexpected rule %q", r.Name)
			continue
		}
		if r.Family != w.Family || r.Source == "" {
			t.Errorf("%s: family %q source %q", r.Name, r.Family, r.Source)
		}
		for _, g := range [][3]float64{{r.Kp, w.Kp}, {r.Ki, w.Ki}, {r.Kd, w.Kd}} {
			if math.Abs(g[0]-g[1]) > 1e-12*math.Max(1, math.Abs(g[1])) {
				t.Errorf("%s: gains %g %g %g, want %g %g %g", r.Name, r.Kp, r.Ki, r.Kd, w.Kp, w.Ki, w.Kd)
				break
			}
		}
	}
	// Each tuning of this plant gives a stable loop (a sanity check of the
	// conversion to the parallel form, not of the rules).
	for _, r := range rules {
		cn, cd := p(r.Kp), p(1)
		switch r.Family {
		case "pi":
			cn, cd = p(r.Kp, r.Ki), p(1, 0)
		case "pid":
			cn, cd = p(r.Kd, r.Kp, r.Ki), p(1, 0)
		}
		poles, err := Poles(NewLoop(p(1), p(1, 3, 3, 1), cn, cd).Characteristic())
		if err != nil || DecayRate(poles) <= 0 {
			t.Errorf("%s: closed loop not stable (poles %v)", r.Name, poles)
		}
	}
}
