package margins

import (
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/poly"
)

// Poles of a polynomial built from known roots come back sorted by real
// part, slowest first. For the roots below: max Re = −0.5, so the decay
// rate is 0.5; the least damped pair −0.5 ± 4j has ζ = 0.5/√16.25.
func TestPolesFromRoots(t *testing.T) {
	roots := []complex128{-3, complex(-0.5, 4), complex(-0.5, -4), -1, complex(-2, 1), complex(-2, -1)}
	c := poly.FromRoots(roots).Scaled(2.5)
	got, err := Poles(c)
	if err != nil {
		t.Fatal(err)
	}
	want := []complex128{complex(-0.5, 4), complex(-0.5, -4), -1, complex(-2, 1), complex(-2, -1), -3}
	if len(got) != len(want) {
		t.Fatalf("%d poles, want %d", len(got), len(want))
	}
	for i := range want {
		if cmplx.Abs(got[i]-want[i]) > 1e-12 {
			t.Errorf("pole %d = %v, want %v", i, got[i], want[i])
		}
	}
	check(t, "decay rate", DecayRate(got), 0.5, 1e-12)
	check(t, "min damping", MinDamping(got), 0.5/math.Sqrt(16.25), 1e-12)
}

func TestDampingSpecialCases(t *testing.T) {
	cases := []struct {
		poles       []complex128
		decay, damp float64
	}{
		{nil, math.Inf(1), 1},
		{[]complex128{-2}, 2, 1},
		{[]complex128{0, -1}, 0, 0},
		{[]complex128{complex(0, 3), complex(0, -3)}, 0, 0},
		{[]complex128{1, -5}, -1, -1},
		{[]complex128{complex(1, 1), complex(1, -1)}, -1, -1 / math.Sqrt2},
	}
	for _, c := range cases {
		if d := DecayRate(c.poles); d != c.decay && !closeTo(d, c.decay, 1e-15) {
			t.Errorf("DecayRate(%v) = %g, want %g", c.poles, d, c.decay)
		}
		check(t, "MinDamping", MinDamping(c.poles), c.damp, 1e-15)
	}
	if r, err := Poles(poly.Poly{3}); err != nil || len(r) != 0 {
		t.Errorf("Poles(3) = %v, %v", r, err)
	}
	if _, err := Poles(poly.Poly{0, 0}); err == nil {
		t.Error("Poles of the zero polynomial gave no error")
	}
	// Exactly zero leading coefficients are dropped.
	if r, _ := Poles(poly.Poly{2, 1, 0}); len(r) != 1 || r[0] != -2 {
		t.Errorf("Poles(s + 2 with a zero s² term) = %v", r)
	}
}
