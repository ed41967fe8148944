package grid

import (
	"context"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// TestCertifiedSafetyNet gives EvaluateCertified no touched cell at all on
// a map that has edges (PI on 1/(s+1)³, whose stable region is bounded by
// ki = 0 and a complex-pair edge, derived by hand in package boundary's
// tests): the sparse lattice then finds several counts in the one region,
// which is evaluated in full, so the map still equals full evaluation and
// the conflict is reported. With the window inside the stable region and
// no edge near, the lattice alone labels the map.
func TestCertifiedSafetyNet(t *testing.T) {
	l := loop.Loop{Plant: loop.Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 3, 3, 1}}, Family: family.ProportionalIntegral{}, Values: []float64{0, 0}}
	tests := []struct {
		name          string
		x, y          plane.Axis
		wantConflicts int
		wantAll       bool
	}{
		{"edges missed", plane.Axis{Param: "kp", Min: -2, Max: 8, N: 70}, plane.Axis{Param: "ki", Min: -1, Max: 3, N: 50}, 1, true},
		// kp = 3ω² − 1, ki = 3ω² − ω⁴ stays outside [1, 2] × [0.2, 0.6]
		// and ki > 0: stable throughout.
		{"no edge", plane.Axis{Param: "kp", Min: 1, Max: 2, N: 70}, plane.Axis{Param: "ki", Min: 0.2, Max: 0.6, N: 50}, 0, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := plane.NewSetup(l, tc.x, tc.y)
			if err != nil {
				t.Fatal(err)
			}
			full, err := Evaluate(context.Background(), s, Options{Workers: 2})
			if err != nil {
				t.Fatal(err)
			}
			m, conflicts, err := EvaluateCertified(context.Background(), s, make([]bool, (tc.x.N-1)*(tc.y.N-1)), Options{Workers: 2})
			if err != nil {
				t.Fatal(err)
			}
			for k := range full.RHP {
				if m.RHP[k] != full.RHP[k] || m.Axis[k] != full.Axis[k] {
					t.Fatalf("node %d: %d/%d, full evaluation %d/%d", k, m.RHP[k], m.Axis[k], full.RHP[k], full.Axis[k])
				}
			}
			if conflicts != tc.wantConflicts || (m.Evaluated == len(m.RHP)) != tc.wantAll {
				t.Fatalf("%d conflicts, %d of %d nodes evaluated", conflicts, m.Evaluated, len(m.RHP))
			}
			if !tc.wantAll && full.Stats().Stable != len(full.RHP) {
				t.Fatal("the window is not all stable")
			}
		})
	}
}
