package poly

import (
	"fmt"
	"math"
	"math/cmplx"
	"sort"
	"testing"
)

// TestArithmetic compares each operation with a result worked by hand.
func TestArithmetic(t *testing.T) {
	for _, tc := range []struct {
		name      string
		got, want Poly
	}{
		// (s+1)(s+2) = s² + 3s + 2, by hand.
		{"Mul", Mul(Poly{1, 1}, Poly{2, 1}), Poly{2, 3, 1}},
		{"Mul by zero polynomial", Mul(Poly{1, 1}, Poly{}), Poly{}},
		{"Add of unequal lengths", Add(Poly{1}, Poly{0, 0, 3}), Poly{1, 0, 3}},
		{"Sub", Sub(Poly{1, 2}, Poly{1, 2, 3}), Poly{0, 0, -3}},
		{"Scaled", Poly{1, -2}.Scaled(-0.5), Poly{-0.5, 1}},
		// (s+1)³ = s³ + 3s² + 3s + 1 (binomial coefficients).
		{"Pow", Poly{1, 1}.Pow(3), Poly{1, 3, 3, 1}},
		{"Pow zero", Poly{5, 1}.Pow(0), Poly{1}},
		{"Derivative", Poly{7, 3, 0, 2}.Derivative(), Poly{3, 0, 6}},
		{"Derivative of a constant", Poly{4}.Derivative(), Poly{}},
		{"FromRoots", FromRoots([]complex128{-1, -2}), Poly{2, 3, 1}},
		// (s − j)(s + j) = s² + 1.
		{"FromRoots conjugate pair", FromRoots([]complex128{1i, -1i}), Poly{1, 0, 1}},
		{"FromDescending", FromDescending([]float64{1, 2, 3}), Poly{3, 2, 1}},
		{"Trim relative", Poly{1, 2, 1e-15}.Trim(RelTol), Poly{1, 2}},
		{"Trim exact zeros only", Poly{1, 0, 0}.Trim(0), Poly{1}},
	} {
		if len(tc.got) != len(tc.want) {
			t.Errorf("%s: %v; want %v", tc.name, tc.got, tc.want)
			continue
		}
		for i := range tc.got {
			if tc.got[i] != tc.want[i] {
				t.Errorf("%s: %v; want %v", tc.name, tc.got, tc.want)
				break
			}
		}
	}
}

func TestDegreeScaleFinite(t *testing.T) {
	if d := (Poly{1, 2, 0, 0}).Degree(); d != 1 {
		t.Errorf("Degree = %d; want 1", d)
	}
	if d := (Poly{0, 0}).Degree(); d != -1 {
		t.Errorf("Degree of zero = %d; want -1", d)
	}
	if s := (Poly{-3, 2}).Scale(); s != 3 {
		t.Errorf("Scale = %g; want 3", s)
	}
	if (Poly{1, math.NaN()}).Finite() || !(Poly{1, 2}).Finite() {
		t.Error("Finite wrong")
	}
	if got := (Poly{2, 3, 1}).Descending(); fmt.Sprint(got) != "[1 3 2]" {
		t.Errorf("Descending = %v", got)
	}
}

func TestEval(t *testing.T) {
	p := Poly{2, 3, 1} // (s+1)(s+2)
	if v := p.EvalReal(-1); v != 0 {
		t.Errorf("p(-1) = %g; want 0", v)
	}
	// p(j) = (1 + j)(2 + j) = 1 + 3j, by hand.
	if v := p.Eval(1i); cmplx.Abs(v-complex(1, 3)) > 1e-15 {
		t.Errorf("p(j) = %v; want 1+3j", v)
	}
}

// TestRootsAgainstKnownFactors checks the eigenvalue roots of products of
// known factors, including a pair on the imaginary axis and a root at
// the origin; roots are compared after sorting.
func TestRootsAgainstKnownFactors(t *testing.T) {
	want := []complex128{-3, -1, 0, complex(0, 2), complex(0, -2), complex(-0.5, 1), complex(-0.5, -1)}
	p := FromRoots(want).Scaled(7)
	got, err := p.Roots()
	if err != nil {
		t.Fatal(err)
	}
	key := func(r []complex128) {
		sort.Slice(r, func(i, j int) bool {
			if math.Abs(real(r[i])-real(r[j])) > 1e-9 {
				return real(r[i]) < real(r[j])
			}
			return imag(r[i]) < imag(r[j])
		})
	}
	key(got)
	key(want)
	for i := range want {
		if cmplx.Abs(got[i]-want[i]) > 1e-9 {
			t.Fatalf("roots %v; want %v", got, want)
		}
	}
	if _, err := (Poly{0, 0}).Roots(); err == nil {
		t.Error("roots of the zero polynomial accepted")
	}
	if _, err := (Poly{1, math.Inf(1)}).Roots(); err == nil {
		t.Error("roots of a non-finite polynomial accepted")
	}
	if r, err := (Poly{4}).Roots(); err != nil || len(r) != 0 {
		t.Errorf("constant: %v %v", r, err)
	}
}

func TestPolish(t *testing.T) {
	// s² + 2 has the roots ±j√2; a rough start converges by Newton's method.
	p := Poly{2, 0, 1}
	r := p.Polish(complex(0.01, 1.4))
	if cmplx.Abs(r-complex(0, math.Sqrt2)) > 1e-14 {
		t.Errorf("Polish = %v; want j√2", r)
	}
	if x := (Poly{-2, 0, 1}).PolishReal(1.4); math.Abs(x-math.Sqrt2) > 1e-15 {
		t.Errorf("PolishReal = %.17g; want √2", x)
	}
}

func TestString(t *testing.T) {
	tests := []struct {
		p    Poly
		want string
	}{
		{Poly{2, 3, 1}, "s^2 + 3·s + 2"},
		{Poly{-1, 0, -2.5}, "-2.5·s^2 - 1"},
		{Poly{}, "0"},
		{Poly{0, 1}, "s"},
	}
	for _, tc := range tests {
		if got := tc.p.String(); got != tc.want {
			t.Errorf("%v.String() = %q; want %q", []float64(tc.p), got, tc.want)
		}
	}
	if got := RootsString([]complex128{-1, complex(-0.5, 2), complex(-0.5, -2)}); got != "-1, -0.5 ± 2j" {
		t.Errorf("RootsString = %q", got)
	}
}

func ExamplePoly_Roots() {
	r, _ := Poly{2, 3, 1}.Roots()
	sort.Slice(r, func(i, j int) bool { return real(r[i]) < real(r[j]) })
	fmt.Printf("%.6g\n", r)
	// Output: [(-2+0i) (-1+0i)]
}
