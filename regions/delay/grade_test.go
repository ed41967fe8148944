package delay

import (
	"math"
	"testing"

	"gainscape/regions/stability"
)

// TestGraderDecayAgreesWithRightmost: on invented stable loops (the
// generator of reference_test.go), the decay rate by bisection on the
// count of the shifted quasi-polynomial equals the distance of the
// rightmost root found by spectral collocation and Newton's method
// (Rightmost) to 1e-7 relative; for a neutral loop with |q_n/p_n| = 1/2
// and L = 1 it is bounded by the chain of roots at ln(1/2) (derived by
// hand: the roots of large modulus approach Re s = ln|q_n/p_n|/L).
func TestGraderDecayAgreesWithRightmost(t *testing.T) {
	rng := newRand(17)
	g := newGrader(12)
	tested := 0
	for i := 0; tested < 60 && i < 1000; i++ {
		f := randomLoop(rng, 1+i%5)
		if v := g.c.Count(f); !v.Stable() {
			continue
		}
		roots, err := Rightmost(f, 2)
		if err != nil {
			continue
		}
		tested++
		want := DecayRate(roots)
		if got := g.Decay(f); math.Abs(got-want) > 1e-7*math.Max(want, 1e-3) {
			t.Errorf("loop %d: decay %.12g, rightmost root %v (%.12g)", i, got, roots[0], want)
		}
	}
	if tested < 40 {
		t.Fatalf("only %d stable loops tested", tested)
	}
	// s + 1 + (0.5·s + 0.1)·e^(−s): the chain sits at ln 0.5 ≈ −0.693.
	f := stability.Function{P: []float64{1, 1}, Q: []float64{0.1, 0.5}, Delay: 1}
	d := g.Decay(f)
	roots, _ := Rightmost(f, 2)
	want := math.Min(DecayRate(roots), math.Ln2)
	if math.Abs(d-want) > 1e-7 {
		t.Errorf("neutral loop: decay %.12g, want %.12g (roots %v)", d, want, roots)
	}
}

// TestGraderDecayAllocatesNothing: the per-node path of the overlays.
func TestGraderDecayAllocatesNothing(t *testing.T) {
	g := newGrader(8)
	fs := benchLoops(3)
	var stable []stability.Function
	for _, f := range fs {
		if g.c.Count(f).Stable() {
			stable = append(stable, f)
		}
	}
	if a := testing.AllocsPerRun(10, func() {
		for _, f := range stable {
			g.Decay(f)
		}
	}); a != 0 {
		t.Errorf("%g allocations per run", a)
	}
}

// The decay rate by bisection against the rightmost roots, on the same
// stable loops: compare ns/op within one run.
func benchDecay(b *testing.B, rightmost bool) {
	g := newGrader(8)
	var fs []stability.Function
	for _, f := range benchLoops(3) {
		if g.c.Count(f).Stable() {
			fs = append(fs, f)
		}
	}
	for i := 0; b.Loop(); i++ {
		f := fs[i%len(fs)]
		if rightmost {
			r, _ := Rightmost(f, gradedRoots)
			DecayRate(r)
		} else {
			g.Decay(f)
		}
	}
}

func BenchmarkDecayBisection(b *testing.B) { benchDecay(b, false) }
func BenchmarkDecayRightmost(b *testing.B) { benchDecay(b, true) }
