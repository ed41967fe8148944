package margins

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
)

func TestTaylorShift(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for n := 0; n < 10; n++ {
		q := make(poly.Poly, n+1)
		for i := range q {
			q[i] = rng.NormFloat64()
		}
		c := rng.NormFloat64()
		s := q.Clone()
		taylorShift(s, c)
		for _, x := range []float64{-1.3, 0, 0.7, 2} {
			if got, want := s.EvalReal(x), q.EvalReal(x+c); math.Abs(got-want) > 1e-11*(1+math.Abs(want)) {
				t.Errorf("n=%d: shifted(%g) = %g, want q(%g) = %g", n, x, got, x+c, want)
			}
		}
	}
}

// TestDecayBySignTestMatchesEigenvalues: 500 random stable polynomials of
// degree 2 to 10, built from random stable roots (magnitudes in
// [e^-1.5, e^1.5], damping at least 0.02, random leading coefficient),
// and some unstable ones; the sign-test decay rate must equal −max Re of
// the eigenvalue poles within 1e-6.
func TestDecayBySignTestMatchesEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	work := make([]float64, DecayWorkLen(10))
	worst := 0.0
	for trial := 0; trial < 600; trial++ {
		n := 2 + trial%9
		roots := stableRoots(rng, n, 0.02, 1.5)
		if trial >= 500 { // unstable: move one root (or pair) right
			for i := range roots[:1] {
				roots[i] = complex(-real(roots[i]), imag(roots[i]))
			}
			if imag(roots[0]) != 0 {
				roots[1] = complex(-real(roots[1]), imag(roots[1]))
			}
		}
		c := poly.FromRoots(roots).Scaled(math.Exp(4*rng.Float64()-2) * float64(1-2*rng.IntN(2)))
		poles, err := Poles(c)
		if err != nil {
			t.Fatal(err)
		}
		want := DecayRate(poles)
		got := DecayBySignTest(c, work)
		worst = max(worst, math.Abs(got-want))
		if math.Abs(got-want) > 1e-6 {
			t.Errorf("trial %d (degree %d): sign test %.12g, eigenvalues %.12g; roots %v", trial, n, got, want, roots)
		}
	}
	t.Logf("largest difference %.3g", worst)
}

func TestDecayBySignTestSpecial(t *testing.T) {
	if d := DecayBySignTest(poly.Poly{4}, nil); !math.IsInf(d, 1) {
		t.Errorf("constant: %g", d)
	}
	if d := DecayBySignTest(poly.Poly{0, 0}, nil); !math.IsNaN(d) {
		t.Errorf("zero: %g", d)
	}
	if d := DecayBySignTest(poly.Poly{0, 0, 3}, nil); d != 0 {
		t.Errorf("3s²: %g", d)
	}
	// s(s + 1): a root at the origin, decay 0.
	if d := DecayBySignTest(poly.Poly{0, 1, 1}, nil); math.Abs(d) > 1e-10 {
		t.Errorf("s(s+1): %g", d)
	}
	// s² + 4: imaginary pair, decay 0.
	if d := DecayBySignTest(poly.Poly{4, 0, 1}, nil); math.Abs(d) > 1e-10 {
		t.Errorf("s²+4: %g", d)
	}
	// (s + 2)³: a triple root, decay 2 (to the accuracy a triple root
	// allows, about (1e-16)^(1/3)).
	if d := DecayBySignTest(poly.Poly{8, 12, 6, 1}, nil); math.Abs(d-2) > 1e-4 {
		t.Errorf("(s+2)³: %g", d)
	}
	// Exactly zero leading coefficients ignored: (s + 3) padded.
	if d := DecayBySignTest(poly.Poly{3, 1, 0, 0}, nil); math.Abs(d-3) > 1e-10 {
		t.Errorf("s+3 padded: %g", d)
	}
	work := make([]float64, DecayWorkLen(5))
	c := poly.FromRoots([]complex128{-1, -2, complex(-0.3, 2), complex(-0.3, -2), -5})
	if a := testing.AllocsPerRun(20, func() { DecayBySignTest(c, work) }); a != 0 {
		t.Errorf("%g allocations per call", a)
	}
}
