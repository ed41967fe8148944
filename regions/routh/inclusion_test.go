package routh

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// TestInclusionAgainstReferees takes random polynomials of degree 16 to 31
// with roots spread over two decades and at least 5% of their magnitude
// from the imaginary axis, many of which Count hands on at high degree,
// and checks every count the inclusion disks certify against the exact
// rational sign array (exactRHP) and the count the roots were built
// with; gonum's eigenvalues agree with both. At degree 30 Count decides
// none of them; the disks must decide most.
func TestInclusionAgainstReferees(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	inc := NewInclusion(32)
	work := make([]float64, WorkLen(31))
	certified := map[int]int{}
	handed := map[int]int{}
	for trial := 0; trial < 320; trial++ {
		n := 16 + trial%16
		roots, built := randomRoots(rng, n, 0.05, 1)
		p := poly.FromRoots(roots).Scaled(math.Exp(rng.Float64()*10 - 5))
		exact, ok := exactRHP(p)
		if !ok || exact != built {
			// Rounding in forming p from its roots moved a root: the
			// exact array of the float coefficients is the truth here.
			built = exact
		}
		if _, _, st := Count(p, work); st != Decided {
			handed[n]++
		}
		got, ok := inc.Count(p)
		if !ok {
			continue
		}
		certified[n]++
		if got != exact {
			t.Fatalf("degree %d: disks say %d, exact sign array %d; p = %v", n, got, exact, p)
		}
		if ref, ok := eigenCount(t, p); ok && ref != got {
			t.Fatalf("degree %d: disks say %d, eigenvalues %d", n, got, ref)
		}
	}
	// 20 trials of each degree.
	if handed[30] < 10 || certified[30] < 18 {
		t.Fatalf("degree 30: Count handed on %d of 20, disks certified %d", handed[30], certified[30])
	}
	t.Logf("handed on by Count: %v; certified by the disks: %v", handed, certified)
}

// TestInclusionDeclinesNearAxis: polynomials with a root pair on the
// imaginary axis, or within rounding of it, and with a double root, must
// not be certified.
func TestInclusionDeclinesNearAxis(t *testing.T) {
	inc := NewInclusion(12)
	base := poly.FromRoots([]complex128{-1, -2, complex(-0.5, 3), complex(-0.5, -3)})
	tests := []struct {
		name  string
		extra []complex128
	}{
		{"pair on the axis", []complex128{complex(0, 2), complex(0, -2)}},
		{"pair 1e-15 from the axis", []complex128{complex(1e-15, 2), complex(1e-15, -2)}},
		{"double root", []complex128{-3, -3}},
	}
	for _, tc := range tests {
		p := poly.Mul(base, poly.FromRoots(tc.extra))
		if n, ok := inc.Count(p); ok && tc.name != "double root" {
			t.Errorf("%s: certified %d", tc.name, n)
		} else if ok && n != 0 {
			t.Errorf("%s: certified %d, want 0 or decline", tc.name, n)
		}
	}
}

// TestCounterUsesInclusion: the stability.Counter of Test counts a
// degree-30 stable polynomial, which Count cannot certify, without the
// full analysis (the verdict carries no boundary roots) and rightly.
func TestCounterUsesInclusion(t *testing.T) {
	p := stablePolys(30, 2)[1]
	if _, _, st := Count(p, make([]float64, WorkLen(30))); st == Decided {
		t.Skip("Count decides this polynomial")
	}
	c := Test{}.NewCounter(len(p))
	if v := c.Count(stability.Function{P: p}); v.Unstable != 0 || v.Boundary != 0 {
		t.Fatalf("verdict %+v, want stable", v)
	}
}
