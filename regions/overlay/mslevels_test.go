package overlay

import (
	"context"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"gainscape/regions/isoline"
	"gainscape/regions/margins"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// msEvaluatorFor is a fast Ms evaluator for s, on a grid from the loop at
// the window's centre as the map command builds one.
func msEvaluatorFor(t testing.TB, s plane.Setup) *margins.MsEvaluator {
	t.Helper()
	num, den := s.At(0.5*(s.X.Min+s.X.Max), 0.5*(s.Y.Min+s.Y.Max)).Open()
	lo, hi := margins.Loop{Num: num, Den: den}.FrequencyRange()
	ev, err := margins.NewMsEvaluator(lo, hi, margins.DefaultMsPerDecade, max(s.OpenNum.Len(), s.OpenDen.Len()), margins.DefaultMsSteps)
	if err != nil {
		t.Fatal(err)
	}
	return ev
}

// checkLevels compares MsForLevels with ev at every stable node: the
// same side of every level everywhere, the same value where it
// evaluated, and the same iso-lines. It returns the share evaluated.
func checkLevels(t *testing.T, name string, s plane.Setup, levels []float64) float64 {
	t.Helper()
	m := mapOf(t, s)
	ev := msEvaluatorFor(t, s)
	got, evaluated, err := MsForLevels(context.Background(), s, m, ev, levels, 2)
	if err != nil {
		t.Fatal(err)
	}
	full, err := Compute(context.Background(), s, m, Options{Workers: 2, SkipDecay: true, Sensitivity: ev.Ms})
	if err != nil {
		t.Fatal(err)
	}
	stable := 0
	for k, want := range full.Ms {
		if math.IsNaN(want) {
			if !math.IsNaN(got[k]) {
				t.Fatalf("%s: node %d is not stable but has %g", name, k, got[k])
			}
			continue
		}
		stable++
		for _, L := range levels {
			if (got[k] >= L) != (want >= L) {
				t.Fatalf("%s: node (%d, %d): stand-in %g, Ms %g: on different sides of %g", name, k%s.X.N, k/s.X.N, got[k], want, L)
			}
		}
	}
	for _, L := range levels {
		a, b := isoline.Trace(s.X, s.Y, got, L), isoline.Trace(s.X, s.Y, full.Ms, L)
		if !reflect.DeepEqual(a, b) {
			t.Fatalf("%s: iso-lines of %g differ: %d lines against %d", name, L, len(a), len(b))
		}
	}
	if stable == 0 {
		t.Fatalf("%s: no stable node", name)
	}
	return float64(evaluated) / float64(stable)
}

// TestMsForLevelsDemo: the demo pump loop (invented) under PID, kd = 0.5,
// tau = 0.05, at 400×400 nodes with the default levels: identical
// iso-lines with Ms evaluated at a small share of the stable nodes.
func TestMsForLevelsDemo(t *testing.T) {
	s := setupOf(t, []float64{3}, poly.Mul(poly.Mul(poly.Poly{0.5, 1}, poly.Poly{2, 1}), poly.Poly{1, 0.4}.Pow(2)).Descending(),
		"pid", []float64{0, 0, 0.5, 0.05}, plane.Axis{Param: "kp", Min: -0.6, Max: 3.6, N: 400}, plane.Axis{Param: "ki", Min: -0.4, Max: 1.8, N: 400})
	share := checkLevels(t, "demo", s, []float64{1.4, 2})
	if share > 0.15 {
		t.Errorf("Ms evaluated at %.1f%% of the stable nodes", 100*share)
	}
	t.Logf("Ms evaluated at %.2f%% of the stable nodes", 100*share)
}

// TestMsForLevelsRandom: random invented plants under PI and PID, levels
// 1.3, 1.7 and 2.5, compared node by node with full evaluation.
func TestMsForLevelsRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 9))
	for trial := 0; trial < 12; trial++ {
		var poles []complex128
		for range 2 + rng.IntN(3) {
			poles = append(poles, complex(-(0.3+3*rng.Float64()), 0))
		}
		if rng.IntN(2) == 0 {
			wn, z := 1+3*rng.Float64(), 0.1+0.5*rng.Float64()
			poles = append(poles, complex(-z*wn, wn*math.Sqrt(1-z*z)), complex(-z*wn, -wn*math.Sqrt(1-z*z)))
		}
		den := poly.FromRoots(poles)
		num := poly.Poly{den[0] * (0.5 + 2*rng.Float64())}
		fam, vals := "pi", []float64{0, 0}
		if trial%2 == 1 {
			fam, vals = "pid", []float64{0, 0, 0.2 * rng.Float64(), 0.05}
		}
		s := setupOf(t, num.Descending(), den.Descending(), fam, vals,
			plane.Axis{Param: "kp", Min: -0.5, Max: 2 + 4*rng.Float64(), N: 90}, plane.Axis{Param: "ki", Min: -0.2, Max: 0.5 + 2*rng.Float64(), N: 70})
		checkLevels(t, fam, s, []float64{1.3, 1.7, 2.5})
	}
}
