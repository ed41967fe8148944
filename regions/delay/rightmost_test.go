package delay

import (
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// TestRightmostScalarEquation checks Rightmost on s + a·e^(−Ls) = 0, whose
// roots are exactly s = W_k(−a·L)/L over the branches of the Lambert W
// function (L·s·e^(L·s) = −a·L; Corless et al. 1996, Sec. 1), the real
// part falling with |k|. For −a·L < −1/e every branch is complex, W_k and
// W_(−k−1) conjugate: the six rightmost roots are the branches 0, 1, 2 and
// their conjugates.
func TestRightmostScalarEquation(t *testing.T) {
	for _, tc := range []struct{ a, L float64 }{{1, 1}, {2.5, 1}, {0.5, 2}, {0.8, 0.5}, {3, 4}} {
		f := stability.Function{P: poly.Poly{0, 1}, Q: poly.Poly{tc.a}, Delay: tc.L}
		got, err := Rightmost(f, 6)
		if err != nil {
			t.Fatalf("a = %g, L = %g: %v", tc.a, tc.L, err)
		}
		if len(got) != 6 {
			t.Fatalf("a = %g, L = %g: %d roots: %v", tc.a, tc.L, len(got), got)
		}
		for k := 0; k < 3; k++ {
			w, ok := lambertW(k, complex(-tc.a*tc.L, 0))
			if !ok {
				t.Fatalf("W_%d(%g) not found", k, -tc.a*tc.L)
			}
			want := w / complex(tc.L, 0)
			if want = complex(real(want), math.Abs(imag(want))); cmplx.Abs(got[2*k]-want) > 1e-10*cmplx.Abs(want) {
				t.Errorf("a = %g, L = %g: root %d = %v, Lambert W gives %v", tc.a, tc.L, 2*k, got[2*k], want)
			}
			if got[2*k+1] != cmplx.Conj(got[2*k]) {
				t.Errorf("a = %g, L = %g: root %d = %v is not the conjugate of %v", tc.a, tc.L, 2*k+1, got[2*k+1], got[2*k])
			}
		}
		// Decay rate −Re W_0/L; for a = 1, L = 1 that is 0.3181315 (W_0(−1)
		// = −0.3181315 + 1.3372357j, Corless et al. 1996; from memory).
		if tc.a == 1 && tc.L == 1 && math.Abs(DecayRate(got)-0.3181315) > 1e-7 {
			t.Errorf("decay rate %g, want 0.3181315", DecayRate(got))
		}
	}
}

// TestRightmostRandomLoops checks Rightmost on invented loops against the
// count: no root lies right of the decay-rate line, at least one on it,
// and each returned root is a root of Δ to within rounding.
func TestRightmostRandomLoops(t *testing.T) {
	rng := newRand(21)
	c := NewCounter(10)
	for i := range 40 {
		f := randomLoop(rng, 1+i%5)
		got, err := Rightmost(f, 4)
		if err != nil {
			t.Errorf("case %d: %v for %+v", i, err, f)
			continue
		}
		for _, r := range got {
			d, size := evalDelta(f, r)
			if cmplx.Abs(d) > 1e-11*size {
				t.Errorf("case %d: |Δ(%v)| = %g against terms of %g", i, r, cmplx.Abs(d), size)
			}
		}
		alpha := DecayRate(got)
		eps := 1e-7 * (1 + math.Abs(alpha))
		if v := c.Count(Shift(f, -alpha+eps)); v.Unstable != 0 {
			t.Errorf("case %d: %d roots right of −decay rate %g: %+v", i, v.Unstable, alpha, got)
		}
		if v := c.Count(Shift(f, -alpha-eps)); v.Unstable < 1 {
			t.Errorf("case %d: no root at the decay-rate line %g", i, alpha)
		}
		if z := LeastDamping(got); z > 1 || z < -1 {
			t.Errorf("case %d: damping %g out of [−1, 1]", i, z)
		}
	}
}

// TestRightmostNeutral checks the neutral PD loop of TestNeutralIdealPD
// with kp = 0.8, kd = 0.2: the chain abscissa is ln 0.2 (L = 1), and the
// roots returned lie right of it and are roots of Δ (Rightmost confirms
// the count right of the last one itself). With kp = kd = 0.5,
// Δ = (s + 1)(1 + 0.5·e^(−s)) by hand: the roots are −1 and
// −ln 2 + j(2k + 1)π, none right of the chain abscissa.
func TestRightmostNeutral(t *testing.T) {
	if got, err := Rightmost(stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{0.5, 0.5}, Delay: 1}, 3); err != nil || len(got) != 0 {
		t.Errorf("kp = kd = 0.5: roots %v, error %v; want none", got, err)
	}
	f := stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{0.8, 0.2}, Delay: 1}
	chain, neutralType := ChainAbscissa(f)
	if !neutralType || math.Abs(chain-math.Log(0.2)) > 1e-15 {
		t.Fatalf("chain abscissa %g, %v", chain, neutralType)
	}
	got, err := Rightmost(f, 3)
	if err != nil {
		t.Fatal(err)
	}
	if len(got) < 3 {
		t.Fatalf("roots %v, want at least 3", got)
	}
	for _, r := range got {
		d, size := evalDelta(f, r)
		if real(r) <= chain || cmplx.Abs(d) > 1e-11*size {
			t.Errorf("root %v: residual %g, chain at %g", r, cmplx.Abs(d)/size, chain)
		}
	}
	if _, err := Rightmost(stability.Function{P: poly.Poly{1, 1}, Q: poly.Poly{0.5, 2}, Delay: 1}, 3); err == nil {
		t.Error("no error for |q_n/p_n| > 1")
	}
}

// TestShift checks Shift against Δ(s + a) evaluated directly on an
// invented loop; TestRightmostRandomLoops checks its counts.
func TestShift(t *testing.T) {
	f := stability.Function{P: poly.Poly{2, -1, 0.5, 1}, Q: poly.Poly{0.3, 1.2}, Delay: 0.7}
	for _, a := range []float64{-1.5, 0.25, 2} {
		g := Shift(f, a)
		for _, s := range []complex128{0.3 + 1i, -2 + 0.5i, 4i} {
			want, _ := evalDelta(f, s+complex(a, 0))
			got, size := evalDelta(g, s)
			if cmplx.Abs(got-want) > 1e-13*size {
				t.Errorf("a = %g, s = %v: shifted %v, direct %v", a, s, got, want)
			}
		}
	}
}
