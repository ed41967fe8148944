package unitcircle

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// TestGradeRoots checks the s-plane equivalents s = ln(z)/T on roots
// whose grades are derived by hand (T = 0.5).
func TestGradeRoots(t *testing.T) {
	const T = 0.5
	ln := math.Log
	tests := []struct {
		name    string
		zs      []complex128
		radius  float64
		damping float64
	}{
		// s = ln(0.5)/T, real and negative: ζ = 1.
		{"real inside", []complex128{0.5}, 0.5, 1},
		// s = (ln 0.5 + jπ)/T: ζ = ln 2/√(ln²2 + π²).
		{"negative real", []complex128{-0.5}, 0.5, ln(2) / math.Hypot(ln(2), math.Pi)},
		// 0.8·e^(±jπ/4): ζ = −ln 0.8/√(ln²0.8 + (π/4)²); the 0.3 root has ζ = 1.
		{"pair", []complex128{cmplx.Rect(0.8, math.Pi/4), cmplx.Rect(0.8, -math.Pi/4), 0.3}, 0.8, -ln(0.8) / math.Hypot(ln(0.8), math.Pi/4)},
		// s = 0 at z = 1: undamped.
		{"on the circle at 1", []complex128{1, 0.2}, 1, 0},
		// s = ln(1.2)/T > 0: ζ = −1.
		{"outside", []complex128{1.2}, 1.2, -1},
		// z = 0 is an infinitely fast mode.
		{"deadbeat", []complex128{0, 0}, 0, 1},
		{"no roots", nil, 0, 1},
	}
	for _, tc := range tests {
		g := GradeRoots(tc.zs, T)
		wantDecay := -ln(tc.radius) / T
		if math.Abs(g.Radius-tc.radius) > 1e-15 || math.Abs(g.Damping-tc.damping) > 1e-15 ||
			!(g.Decay == wantDecay || math.Abs(g.Decay-wantDecay) <= 1e-14*math.Abs(wantDecay)) {
			t.Errorf("%s: %+v, want radius %g, decay %g, damping %g", tc.name, g, tc.radius, wantDecay, tc.damping)
		}
	}
}

// TestGraderMatchesRoots compares the allocation-free Grader with the
// grades of gonum's eigenvalues through poly.Roots (mat.Eigen) on random
// invented polynomials.
func TestGraderMatchesRoots(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	gr := NewGrader(13, 0.2)
	for trial := range 500 {
		roots, _ := randomZRoots(rng, 1+trial%12, 0.02, 1)
		p := poly.FromRoots(roots).Scaled(3 * rng.Float64())
		got, err := gr.Grade(p)
		if err != nil {
			t.Fatal(err)
		}
		ref, err := p.Roots()
		if err != nil {
			t.Fatal(err)
		}
		want := GradeRoots(ref, 0.2)
		if math.Abs(got.Radius-want.Radius) > 1e-9 || math.Abs(got.Damping-want.Damping) > 1e-7 {
			t.Fatalf("trial %d: %+v, eigenvalues give %+v", trial, got, want)
		}
	}
	if _, err := gr.Grade(poly.Poly{0, 0}); err == nil {
		t.Error("the zero polynomial was graded")
	}
}

// TestNoAllocations: the counter's first two stages allocate nothing; the
// Grader allocates less than poly.Roots (only gonum's Dlahqr allocates).
func TestNoAllocations(t *testing.T) {
	c := newCounter(8)
	gr := NewGrader(8, 0.1)
	regular := stability.Function{P: poly.FromDescending([]float64{1, -1.2, 0.07, 0.3, -0.08})}
	var deg14 poly.Poly
	rng := rand.New(rand.NewPCG(1, 1))
	for {
		roots, _ := randomZRoots(rng, 7, 0.02, 1)
		deg14 = poly.FromRoots(roots)
		if _, st := c.count(stability.Function{P: deg14}); st == bySignArray {
			break
		}
	}
	for name, f := range map[string]func(){
		"recursion":  func() { c.Count(regular) },
		"sign array": func() { c.Count(stability.Function{P: deg14}) },
	} {
		if n := testing.AllocsPerRun(100, f); n != 0 {
			t.Errorf("%s: %g allocations per count", name, n)
		}
	}
	g := testing.AllocsPerRun(100, func() { _, _ = gr.Grade(regular.P) })
	r := testing.AllocsPerRun(100, func() { _, _ = regular.P.Roots() })
	if g >= r {
		t.Errorf("the Grader allocates %g times per polynomial, poly.Roots %g", g, r)
	}
}
