package overlay

import (
	"context"
	"math"
	"strings"
	"testing"

	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

func gridsOf(t *testing.T, s plane.Setup, opt Options) *Grids {
	t.Helper()
	g, err := Compute(context.Background(), s, mapOf(t, s), opt)
	if err != nil {
		t.Fatal(err)
	}
	return g
}

// TestBestDecayHandDerived checks the refined maximum of the decay rate
// against a bound that is attained.
func TestBestDecayHandDerived(t *testing.T) {
	// Derived by hand: plant 1/(s(s+3)) under PI gives
	// p = s³ + 3s² + kp·s + ki. The roots sum to −3, so the largest real
	// part is at least −1 and σ ≤ 1 everywhere. σ = 1 is attained exactly
	// when every root has real part −1: p = (s+1)((s+1)² + β²), i.e.
	// kp = 3 + β², ki = 1 + β², the ray ki = kp − 2 with kp ≥ 3. The ki
	// axis is offset so that no node lies on the ray.
	s := setupOf(t, []float64{1}, []float64{1, 3, 0}, "pi", []float64{0, 0},
		plane.Axis{Param: "kp", Min: 0, Max: 6, N: 31}, plane.Axis{Param: "ki", Min: 0.05, Max: 4.05, N: 21})
	g := gridsOf(t, s, Options{})
	nodeBest := math.Inf(-1)
	for _, v := range g.Decay {
		if v > 1+1e-9 {
			t.Fatalf("node decay %.12g exceeds the bound 1", v)
		}
		if !math.IsNaN(v) {
			nodeBest = math.Max(nodeBest, v)
		}
	}
	o, err := BestDecay(s, g, Options{Sensitivity: sweepMs}, 0)
	if err != nil {
		t.Fatal(err)
	}
	if o.Objective < 1-1e-6 || o.Objective > 1+1e-9 || o.Objective < nodeBest {
		t.Errorf("objective %.12g; want 1 within 1e-6, and at least the best node %.12g", o.Objective, nodeBest)
	}
	if math.Abs(o.Y-(o.X-2)) > 1e-3 || o.X < 3-1e-3 {
		t.Errorf("point (%g, %g) is not on the ray ki = kp − 2, kp ≥ 3", o.X, o.Y)
	}
	if math.Abs(o.Decay-o.Objective) > 1e-12 || math.IsNaN(o.Damping) || math.IsNaN(o.Ms) {
		t.Errorf("values at the point: %+v", o)
	}
}

// coefficient returns p[i], or 0 beyond its length.
func coefficient(p poly.Poly, i int) float64 {
	if i < len(p) {
		return p[i]
	}
	return 0
}

// TestBestIntegralCircle checks the constrained search with a stand-in for
// Ms whose contour is known exactly.
func TestBestIntegralCircle(t *testing.T) {
	// Derived by hand: plant 1/(s+1) under PI has num = kp·s + ki and
	// p = s² + (1+kp)·s + ki, stable for kp > −1, ki > 0. The stand-in
	// 1 + √((kp−1)² + ki²) ≤ 3 is the disc of radius 2 about (1, 0), so
	// the largest ki is 2, at kp = 1. No node lies at kp = 1 or ki = 2.
	circle := func(num, den poly.Poly) float64 {
		return 1 + math.Hypot(coefficient(num, 1)-1, coefficient(num, 0))
	}
	tests := []struct {
		name string
		x, y plane.Axis
	}{
		{"ki on y", plane.Axis{Param: "kp", Min: -0.93, Max: 3.07, N: 37}, plane.Axis{Param: "ki", Min: 0.05, Max: 2.55, N: 26}},
		{"ki on x", plane.Axis{Param: "ki", Min: 0.05, Max: 2.55, N: 26}, plane.Axis{Param: "kp", Min: -0.93, Max: 3.07, N: 37}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s := setupOf(t, []float64{1}, []float64{1, 1}, "pi", []float64{0, 0}, tc.x, tc.y)
			opt := Options{Sensitivity: circle}
			o, err := BestIntegral(s, gridsOf(t, s, opt), opt, 3)
			if err != nil {
				t.Fatal(err)
			}
			kp, ki := o.X, o.Y
			if tc.x.Param == "ki" {
				kp, ki = ki, kp
			}
			// Tolerances: ki from bisection to 1e-10 of the axis span; kp
			// from a golden-section search on a flat top, where a height
			// error e moves kp by about 2√e.
			if math.Abs(o.Objective-2) > 1e-8 || math.Abs(ki-2) > 1e-8 || math.Abs(kp-1) > 1e-3 {
				t.Errorf("optimum kp = %.10g, ki = %.10g, objective %.10g; want 1, 2, 2", kp, ki, o.Objective)
			}
			if o.Ms > 3 {
				t.Errorf("Ms stand-in %g above the bound", o.Ms)
			}
		})
	}
}

// TestBestIntegralWithMs checks the search with a true Ms on a loop where
// the optimum is not known in closed form: the point must meet the bound,
// be stable, beat every feasible node, and lie on the contour (ki a little
// higher breaks the bound).
func TestBestIntegralWithMs(t *testing.T) {
	// Ms ≤ 1.4 is a usual robustness target (common practice).
	const bound = 1.4
	s := setupOf(t, []float64{1}, []float64{1, 3, 3, 1}, "pi", []float64{0, 0},
		plane.Axis{Param: "kp", Min: 0, Max: 2, N: 21}, plane.Axis{Param: "ki", Min: 0.02, Max: 1.02, N: 26})
	opt := Options{Sensitivity: sweepMs}
	g := gridsOf(t, s, opt)
	o, err := BestIntegral(s, g, opt, bound)
	if err != nil {
		t.Fatal(err)
	}
	pr := newProber(s)
	if !pr.stable(o.X, o.Y) || pr.ms(sweepMs, o.X, o.Y) > bound {
		t.Fatalf("optimum (%g, %g) unstable or above the bound: %+v", o.X, o.Y, o)
	}
	for k, v := range g.Ms {
		if v <= bound && s.Y.At(k/s.X.N) > o.Objective {
			t.Fatalf("feasible node ki = %g beats the optimum %g", s.Y.At(k/s.X.N), o.Objective)
		}
	}
	if up := o.Y * (1 + 1e-6); pr.stable(o.X, up) && pr.ms(sweepMs, o.X, up) <= bound {
		t.Errorf("ki = %g is still feasible: the optimum %+v is not on the contour", up, o)
	}
}

// TestBestIntegralFixedKi checks that a fixed ki is the objective and the
// feasible node with the smallest Ms is chosen.
func TestBestIntegralFixedKi(t *testing.T) {
	s := setupOf(t, []float64{1}, []float64{1, 3, 3, 1}, "pid", []float64{0, 0.3, 0, 0.05},
		plane.Axis{Param: "kp", Min: 0.2, Max: 2, N: 10}, plane.Axis{Param: "kd", Min: 0, Max: 1.5, N: 8})
	opt := Options{Sensitivity: sweepMs}
	g := gridsOf(t, s, opt)
	o, err := BestIntegral(s, g, opt, 2)
	if err != nil {
		t.Fatal(err)
	}
	least := math.Inf(1)
	for _, v := range g.Ms {
		if v <= 2 {
			least = math.Min(least, v)
		}
	}
	if math.Abs(o.Objective-0.3) > 1e-15 || math.Abs(o.Ms-least) > 1e-12*least {
		t.Errorf("got %+v; want objective 0.3 and Ms %g", o, least)
	}
}

// TestBestErrors checks the user errors of both searches.
func TestBestErrors(t *testing.T) {
	unstable := setupOf(t, []float64{1}, []float64{1, -1}, "pi", []float64{0, 0},
		plane.Axis{Param: "kp", Min: -3, Max: -1.5, N: 5}, plane.Axis{Param: "ki", Min: 0.1, Max: 1, N: 5})
	pd := setupOf(t, []float64{1}, []float64{1, 1}, "pd", []float64{0, 0},
		plane.Axis{Param: "kp", Min: 0, Max: 1, N: 5}, plane.Axis{Param: "kd", Min: 0, Max: 1, N: 5})
	pi := setupOf(t, []float64{1}, []float64{1, 1}, "pi", []float64{0, 0},
		plane.Axis{Param: "kp", Min: 0, Max: 1, N: 5}, plane.Axis{Param: "ki", Min: 0.1, Max: 1, N: 5})
	opt := Options{Sensitivity: sweepMs}
	tests := []struct {
		name string
		run  func() error
		want string
	}{
		{"no stable node for decay", func() error { _, err := BestDecay(unstable, gridsOf(t, unstable, opt), opt, 0); return err }, "no stable node"},
		{"no stable node for ki", func() error { _, err := BestIntegral(unstable, gridsOf(t, unstable, opt), opt, 2); return err }, "no stable node"},
		{"family without ki", func() error { _, err := BestIntegral(pd, gridsOf(t, pd, opt), opt, 2); return err }, "ki"},
		{"negative bound", func() error { _, err := BestIntegral(pi, gridsOf(t, pi, opt), opt, -1); return err }, "-1"},
		{"bound below every Ms", func() error { _, err := BestIntegral(pi, gridsOf(t, pi, opt), opt, 0.5); return err }, "0.5"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if err := tc.run(); err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Fatalf("error %v; want one containing %q", err, tc.want)
			}
		})
	}
}
