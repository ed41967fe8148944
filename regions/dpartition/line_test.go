package dpartition

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// checkLineCounts confirms the crossings of a rational LineProblem by
// gonum eigenvalue counts between them: the count just above each
// crossing minus the count just below is its Delta, and between two
// crossings the count does not change.
func checkLineCounts(t *testing.T, lp LineProblem, cs []Crossing) {
	t.Helper()
	count := func(k float64) int {
		p := poly.Add(poly.Add(lp.P.A, lp.P.B.Scaled(k)), poly.Add(lp.Q.A, lp.Q.B.Scaled(k)))
		n, ok := eigenCount(t, p)
		if !ok {
			t.Fatalf("k = %g: a root on the axis between crossings", k)
		}
		return n
	}
	ks := []float64{lp.K.Min}
	for _, c := range cs {
		ks = append(ks, c.K)
	}
	ks = append(ks, lp.K.Max)
	for i, c := range cs {
		lo, hi := (ks[i]+ks[i+1])/2, (ks[i+1]+ks[i+2])/2
		if d := count(hi) - count(lo); d != c.Delta {
			t.Errorf("crossing %+v: count changes by %d between k = %g and %g", c, d, lo, hi)
		}
	}
}

func TestLineCrossings(t *testing.T) {
	cases := []struct {
		name string
		lp   LineProblem
		want []Crossing // NaN Omega for Infinite
	}{
		// Δ = (s+1)³ + k (derived by hand): real at k = −1; at jω,
		// Im = 3ω − ω³ = 0 gives ω = √3 and k = −(1 − 3ω²) = 8.
		{"P on 1/(s+1)³", LineProblem{P: Affine{A: poly.Poly{1, 3, 3, 1}, B: poly.Poly{1}}, K: Range{-5, 20}},
			[]Crossing{{-1, 0, stability.Real, -1, 0}, {8, math.Sqrt(3), stability.Complex, 2, 0}}},
		// Δ = (1 + k)·s² + 2s + 1 (derived by hand): the leading
		// coefficient vanishes at k = −1; the large root −2/(1 + k) is in
		// the right half plane below it.
		{"degree drop", LineProblem{P: Affine{A: poly.Poly{1, 2, 1}, B: poly.Poly{0, 0, 1}}, K: Range{-3, 3}},
			[]Crossing{{-1, math.NaN(), stability.Infinite, -1, 0}}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			res, err := Crossings(tc.lp, Options{})
			if err != nil {
				t.Fatal(err)
			}
			if len(res.Crossings) != len(tc.want) {
				t.Fatalf("crossings %+v, want %+v", res.Crossings, tc.want)
			}
			for i, c := range res.Crossings {
				w := tc.want[i]
				if c.Kind != w.Kind || c.Delta != w.Delta || !near(c.K, w.K, 1e-12) ||
					!(near(c.Omega, w.Omega, 1e-12) || math.IsNaN(c.Omega) && math.IsNaN(w.Omega)) {
					t.Errorf("crossing %+v, want %+v", c, w)
				}
			}
			checkLineCounts(t, tc.lp, res.Crossings)
		})
	}
}

// Along kp on the plants of TestHardPlants and the island: every count
// change between crossings is the crossing's Delta, by gonum eigenvalues.
func TestLineAgainstEigenvalues(t *testing.T) {
	num, den := islandPlant()
	cases := []struct {
		name     string
		num, den poly.Poly
		k        Range
	}{
		{"island plant", num, den, Range{-10, 200}},
		{"unstable", poly.Poly{1}, poly.Mul(poly.Poly{-1, 1}, poly.Poly{6, 5, 1}), Range{-10, 100}},
		{"non-minimum phase", poly.Poly{1, -1}, poly.FromDescending([]float64{1, 6, 11, 6}), Range{-10, 100}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			lp := LineProblem{P: Affine{A: tc.den, B: tc.num}, K: tc.k}
			res, err := Crossings(lp, Options{})
			if err != nil {
				t.Fatal(err)
			}
			if len(res.Crossings) == 0 {
				t.Fatal("no crossing: the case tests nothing")
			}
			checkLineCounts(t, lp, res.Crossings)
		})
	}
}

// Ideal derivative on 2·e^(−0.5s)/(3s + 1): Δ = 3s + 1 + 2·kd·s·e^(−0.5s) is
// neutral, with a chain of roots crossing where |2·kd/3| = 1 (derived by
// hand). Past ±1.5 complex pairs cross at ever higher frequencies, so the
// sweep has no bound and stops at its branch cap; inside (−1.4, 1.4) it
// has one, and no crossing.
func TestLineNeutral(t *testing.T) {
	lp := LineProblem{P: Affine{A: poly.Poly{1, 3}}, Q: Affine{B: poly.Poly{0, 2}}, Delay: 0.5, K: Range{-3, 3}}
	res, err := Crossings(lp, Options{MaxBranches: 8})
	if err != nil {
		t.Fatal(err)
	}
	if res.Complete {
		t.Fatal("complete, want the sweep capped")
	}
	var inf []Crossing
	for _, c := range res.Crossings {
		switch c.Kind {
		case stability.Infinite:
			inf = append(inf, c)
		case stability.Complex:
			// Below −1.5 pairs leave as kd rises, above 1.5 they enter.
			if !(c.K < -1.5 && c.Delta == -2 || c.K > 1.5 && c.Delta == 2) {
				t.Errorf("complex crossing %+v", c)
			}
		default:
			t.Errorf("crossing %+v, want none of this kind", c)
		}
	}
	if len(inf) != 2 || inf[0].K != -1.5 || inf[0].Delta != -Unbounded || inf[1].K != 1.5 || inf[1].Delta != Unbounded {
		t.Fatalf("neutral crossings %+v, want −1.5 (chain leaving) and 1.5 (chain entering)", inf)
	}
	lp.K = Range{-1.4, 1.4}
	if res, err = Crossings(lp, Options{}); err != nil || !res.Complete || len(res.Crossings) != 0 {
		t.Fatalf("inside the neutral limits: %+v, %v; want complete and no crossing", res, err)
	}
}
