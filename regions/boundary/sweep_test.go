package boundary

import (
	"context"
	"math"
	"slices"
	"testing"

	"gainscape/regions/dpartition"
	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// tripleLag is PI on 1/(s+1)³ over kp −2…8, ki −1…3. Derived by hand: the
// characteristic polynomial is s⁴ + 3s³ + 3s² + (1+kp)s + ki; at s = jω
// its real part ω⁴ − 3ω² + ki and imaginary part (1+kp)ω − 3ω³ vanish on
// kp = 3ω² − 1, ki = 3ω² − ω⁴; a root is at s = 0 where ki = 0.
func tripleLag(t *testing.T, nx, ny int) plane.Setup {
	t.Helper()
	l := loop.Loop{Plant: loop.Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 3, 3, 1}}, Family: family.ProportionalIntegral{}, Values: []float64{0, 0}}
	s, err := plane.NewSetup(l, plane.Axis{Param: "kp", Min: -2, Max: 8, N: nx}, plane.Axis{Param: "ki", Min: -1, Max: 3, N: ny})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestSweepOnHandDerivedCurve checks every point of the swept edges of the
// triple lag against the hand-derived curves, and that the cross-check of
// a full grid finds every change of count explained.
func TestSweepOnHandDerivedCurve(t *testing.T) {
	s := tripleLag(t, 61, 41)
	sw, ok, err := TraceSweep(context.Background(), s)
	if err != nil || !ok {
		t.Fatalf("sweep: %v, %v", ok, err)
	}
	kinds := map[stability.Kind]int{}
	for _, c := range sw.Curves {
		kinds[c.Kind]++
		for _, p := range c.Points {
			switch c.Kind {
			case stability.Complex:
				w2 := p.Omega * p.Omega
				// The points are computed from ω: exact to rounding.
				if math.Abs(3*w2-1-p.X) > 1e-9*10 || math.Abs(3*w2-w2*w2-p.Y) > 1e-9*4 {
					t.Fatalf("complex point %+v is off the hand-derived curve", p)
				}
			case stability.Real:
				if p.Y != 0 || p.Omega != 0 {
					t.Fatalf("real point %+v is off ki = 0", p)
				}
			default:
				t.Fatalf("unexpected %v edge", c.Kind)
			}
		}
	}
	if kinds[stability.Complex] == 0 || kinds[stability.Real] == 0 {
		t.Fatalf("edges %v", kinds)
	}
	m, err := grid.Evaluate(context.Background(), s, grid.Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	fp := sw.Footprint(s.X, s.Y)
	if n := fp.Check(m); n != 0 {
		t.Fatalf("%d grid edges unexplained", n)
	}
	// Every grid edge with a change of count lies in a touched cell.
	nx := s.X.N
	for j := 0; j < s.Y.N; j++ {
		for i := 0; i+1 < nx; i++ {
			if m.Count(i, j) == m.Count(i+1, j) {
				continue
			}
			below, above := j > 0 && fp.Touched[(j-1)*(nx-1)+i], j+1 < s.Y.N && fp.Touched[j*(nx-1)+i]
			if !below && !above {
				t.Fatalf("count changes from node (%d, %d) to its right, in no touched cell", i, j)
			}
		}
	}
}

// TestCheckFindsDisagreement removes each curve in turn, and then turns
// the side of the complex one: the cross-check must then report grid
// edges it cannot explain.
func TestCheckFindsDisagreement(t *testing.T) {
	s := tripleLag(t, 41, 31)
	sw, _, err := TraceSweep(context.Background(), s)
	if err != nil {
		t.Fatal(err)
	}
	m, err := grid.Evaluate(context.Background(), s, grid.Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	for k := range sw.Curves {
		less := &Sweep{Chord: sw.Chord}
		for c := range sw.Curves {
			if c != k {
				less.Curves = append(less.Curves, sw.Curves[c])
				less.fewer = append(less.fewer, sw.fewer[c])
				less.change = append(less.change, sw.change[c])
			}
		}
		if n := less.Footprint(s.X, s.Y).Check(m); n == 0 {
			t.Errorf("curve %d (%v) removed: no grid edge unexplained", k, sw.Curves[k].Kind)
		}
	}
	turned := *sw
	turned.fewer = append([]dpartition.Side(nil), sw.fewer...)
	for c, cv := range sw.Curves {
		if cv.Kind == stability.Complex {
			turned.fewer[c] = dpartition.Left + dpartition.Right - sw.fewer[c]
		}
	}
	if n := turned.Footprint(s.X, s.Y).Check(m); n == 0 {
		t.Error("complex edge's side turned: no grid edge unexplained")
	}
}

// TestProblemOf checks the problem built for a loop with dead time: P is
// Dc·D and Q is Nc·N, the very pencils of the setup, with the plant's
// dead time; a sampled loop has none.
func TestProblemOf(t *testing.T) {
	l := loop.Loop{Plant: loop.Plant{Num: poly.Poly{2}, Den: poly.Poly{1, 4}, Delay: 1.5}, Family: family.ProportionalIntegral{}, Values: []float64{0, 0}}
	s, err := plane.NewSetup(l, plane.Axis{Param: "kp", Min: 0, Max: 2, N: 5}, plane.Axis{Param: "ki", Min: 0, Max: 1, N: 5})
	if err != nil {
		t.Fatal(err)
	}
	pr, ok := ProblemOf(s)
	if !ok || pr.Delay != 1.5 || pr.X.Max != 2 || pr.Y.Max != 1 {
		t.Fatalf("problem %+v, %v", pr, ok)
	}
	// Hand-derived: Dc·D = s·(4s + 1); Nc·N = 2·(kp·s + ki).
	at := pr.Function(0.5, 0.25)
	if !slices.Equal(at.P, poly.Poly{0, 1, 4}) || !slices.Equal(at.Q, poly.Poly{0.5, 1}) {
		t.Fatalf("Δ at (0.5, 0.25): P %v, Q %v", at.P, at.Q)
	}
	if !Affine(s) {
		t.Error("PI in (kp, ki) not affine")
	}
	l.Plant.Delay, l.Plant.Sample = 0, 0.1
	if s, err = plane.NewSetup(l, s.X, s.Y); err != nil {
		t.Fatal(err)
	}
	if _, ok := ProblemOf(s); ok {
		t.Error("a sampled loop has a D-partition problem in s")
	}
}
