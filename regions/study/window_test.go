package study

import (
	"context"
	"strings"
	"testing"

	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/spec"
)

// TestWindowHoldsTheRegion: the chosen window contains every stable node
// of a map over a window twice as large (same centre, twice the spans)
// on a finer grid than the rule's. The plants are invented, except the
// fourth-order lag, the test plant of Åström, Panagopoulos & Hägglund
// (Automatica 34(5), 1998).
func TestWindowHoldsTheRegion(t *testing.T) {
	tests := []struct {
		name, plant, ctrl string
		fixed             []spec.Value
		x, y              string
		sample            float64
	}{
		{name: "PI on a fourth-order lag", plant: "1/(s+1)^4", ctrl: "pi", x: "kp", y: "ki"},
		{name: "PID kp-ki on the demo pump", plant: "3/((s+0.5)*(s+2)*(0.4*s+1)^2)", ctrl: "pid", fixed: []spec.Value{{Param: "kd", V: 0.5}, {Param: "tau", V: 0.05}}, x: "kp", y: "ki"},
		{name: "PID kp-kd", plant: "1/(s+1)^4", ctrl: "pid", fixed: []spec.Value{{Param: "ki", V: 0.2}, {Param: "tau", V: 0.1}}, x: "kp", y: "kd"},
		{name: "PI with dead time", plant: "2*exp(-1.5*s)/((4*s+1)*(s+1))", ctrl: "pi", x: "kp", y: "ki"},
		{name: "ideal PID with dead time", plant: "2*exp(-1.5*s)/((4*s+1)*(s+1))", ctrl: "pid", fixed: []spec.Value{{Param: "kd", V: 0.3}}, x: "kp", y: "ki"},
		{name: "PI sampled", plant: "1/((s+1)*(0.5*s+1))", ctrl: "pi", x: "kp", y: "ki", sample: 0.2},
		{name: "open-loop unstable", plant: "4/((s-1)*(s+3)*(0.1*s+1))", ctrl: "pi", x: "kp", y: "ki"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			l, err := LoopSpec{Plant: tc.plant, Controller: tc.ctrl, Fixed: tc.fixed, Sample: tc.sample}.Build()
			if err != nil {
				t.Fatal(err)
			}
			w, err := ChooseWindow(context.Background(), l, spec.Axis{Param: tc.x}, spec.Axis{Param: tc.y}, true, true, Options{})
			if err != nil {
				t.Fatal(err)
			}
			if len(w.Cut) > 0 {
				t.Fatalf("window %s cut at %v; the region is bounded", w.Text(), w.Cut)
			}
			t.Logf("%s: %s", w.Text(), w.Rule)
			cx, cy := 0.5*(w.X.Min+w.X.Max), 0.5*(w.Y.Min+w.Y.Max)
			hx, hy := w.X.Max-w.X.Min, w.Y.Max-w.Y.Min
			s, err := plane.NewSetup(l, plane.Axis{Param: tc.x, Min: cx - hx, Max: cx + hx, N: 181}, plane.Axis{Param: tc.y, Min: cy - hy, Max: cy + hy, N: 181})
			if err != nil {
				t.Fatal(err)
			}
			m, err := grid.Evaluate(context.Background(), s, grid.Options{})
			if err != nil {
				t.Fatal(err)
			}
			stable := 0
			for j := 0; j < s.Y.N; j++ {
				for i := 0; i < s.X.N; i++ {
					if !m.StableAt(j*s.X.N + i) {
						continue
					}
					stable++
					if x, y := s.X.At(i), s.Y.At(j); x < w.X.Min || x > w.X.Max || y < w.Y.Min || y > w.Y.Max {
						t.Fatalf("stable node (%g, %g) lies outside the window %s", x, y, w.Text())
					}
				}
			}
			if stable == 0 {
				t.Fatal("no stable node; the test needs some")
			}
		})
	}
}

// TestWindowUnbounded: PI on 1/(s+1)², whose stable region ki > 0,
// ki < 2(1 + kp) (the sign array of s³ + 2s² + (1+kp)s + ki, by hand) is
// unbounded: kp is cut above, the cut is stated, and ki then reaches
// just past the edge within the kp range kept, 2(1 + kp max).
func TestWindowUnbounded(t *testing.T) {
	l, err := LoopSpec{Plant: "1/(s+1)^2", Controller: "pi"}.Build()
	if err != nil {
		t.Fatal(err)
	}
	w, err := ChooseWindow(context.Background(), l, spec.Axis{Param: "kp"}, spec.Axis{Param: "ki"}, true, true, Options{})
	if err != nil {
		t.Fatal(err)
	}
	t.Logf("%s: %s", w.Text(), w.Rule)
	if len(w.Cut) != 1 || w.Cut[0] != "kp above" || !strings.Contains(w.Rule, "cut at") {
		t.Fatalf("cut %v, rule %q", w.Cut, w.Rule)
	}
	edge := 2 * (1 + w.X.Max)
	if w.Y.Max < edge || w.Y.Max > 1.2*edge {
		t.Errorf("ki up to %g; the edge reaches %g within kp ≤ %g", w.Y.Max, edge, w.X.Max)
	}
	// The pad and the rounding to a tick step add at most a tenth of the
	// span beyond the region.
	if sx, sy := w.X.Max-w.X.Min, w.Y.Max-w.Y.Min; w.X.Min > -1 || w.X.Min < -1-0.1*sx || w.Y.Min > 0 || w.Y.Min < -0.1*sy {
		t.Errorf("window %s; the region starts at kp = −1, ki = 0", w.Text())
	}
}

// TestWindowEverywhereMarginal: a PID left at ki = 0 has the integrator's
// root at s = 0 at every point of the kp–kd plane (hand-derived: the
// characteristic polynomial is s·(D + (kd·s + kp)·N)), so the rule
// stops at its first window with an input error that says so, rather
// than growing the window in search of a stable point that cannot exist.
func TestWindowEverywhereMarginal(t *testing.T) {
	l, err := LoopSpec{Plant: "1/(s+1)^4", Controller: "pid"}.Build()
	if err != nil {
		t.Fatal(err)
	}
	_, err = ChooseWindow(context.Background(), l, spec.Axis{Param: "kp"}, spec.Axis{Param: "kd"}, true, true, Options{})
	if err == nil || !IsInput(err) || !strings.Contains(err.Error(), "marginal") || !strings.Contains(err.Error(), "ki = 0") {
		t.Fatalf("error %v; want an input error naming the marginal nodes and ki = 0", err)
	}
}
