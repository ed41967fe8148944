package unitcircle

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// TestPencilCandidatesByHand checks pencils derived by hand in this test.
// z² + k·z + 0.5: the product of the roots is 0.5, so no pair is ever on
// the circle; a real root is at z = 1 where 1.5 + k = 0 and at z = −1
// where 1.5 − k = 0. z² − z + k: a pair on the circle where |z|² = k = 1,
// at cos θ = 1/2; z = 1 at k = 0, z = −1 at k = −2. (1 + k)·z² + 1: the
// leading coefficient vanishes at k = −1, z = ±1 are roots at k = −2, and
// at k = 0 the pair ±j lies on the circle (θ = π/2).
func TestPencilCandidatesByHand(t *testing.T) {
	type want struct {
		k     float64
		kind  stability.Kind
		theta float64
	}
	cases := []struct {
		name string
		a, b poly.Poly
		want []want
	}{
		{"no pair", poly.Poly{0.5, 0, 1}, poly.Poly{0, 1, 0}, []want{{-1.5, stability.Real, 0}, {1.5, stability.Alternating, math.Pi}}},
		{"pair at π/3", poly.Poly{0, -1, 1}, poly.Poly{1, 0, 0}, []want{{0, stability.Real, 0}, {-2, stability.Alternating, math.Pi}, {1, stability.Complex, math.Pi / 3}}},
		{"leading coefficient", poly.Poly{1, 0, 1}, poly.Poly{0, 0, 1}, []want{{-2, stability.Real, 0}, {-2, stability.Alternating, math.Pi}, {-1, stability.Infinite, math.NaN()}, {0, stability.Complex, math.Pi / 2}}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got := PencilCandidates(c.a, c.b)
			if len(got) != len(c.want) {
				t.Fatalf("candidates %v, want %v", got, c.want)
			}
			for _, w := range c.want {
				found := false
				for _, g := range got {
					if g.Kind == w.kind && math.Abs(g.K-w.k) <= 1e-14 && (math.IsNaN(w.theta) == math.IsNaN(g.Theta)) && (math.IsNaN(w.theta) || math.Abs(g.Theta-w.theta) <= 1e-14) {
						found = true
					}
				}
				if !found {
					t.Errorf("missing %v at k = %g, θ = %g in %v", w.kind, w.k, w.theta, got)
				}
			}
		})
	}
}

// outsideByEigen counts roots of p outside the unit circle from gonum's
// eigenvalues, the independent reference, and the smallest | |z| − 1 |.
func outsideByEigen(t *testing.T, p poly.Poly) (int, float64) {
	t.Helper()
	roots, err := p.Trim(0).Roots()
	if err != nil {
		t.Fatal(err)
	}
	n, near := 0, math.Inf(1)
	for _, r := range roots {
		if cmplx.Abs(r) > 1 {
			n++
		}
		near = math.Min(near, math.Abs(cmplx.Abs(r)-1))
	}
	return n, near
}

// TestPencilCandidatesComplete checks on invented random pencils that
// every complex candidate puts a root on the circle at its angle, and
// that wherever the eigenvalue count of roots outside the circle changes
// along k a candidate lies nearby.
func TestPencilCandidatesComplete(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for trial := 0; trial < 40; trial++ {
		n := 2 + rng.IntN(7)
		a, b := make(poly.Poly, n+1), make(poly.Poly, n+1)
		for i := range a {
			a[i] = rng.NormFloat64()
			b[i] = rng.NormFloat64()
		}
		a[n] = 1 + rng.Float64()
		b[n] = 0 // a monic-like pencil with no drop of degree
		cs := PencilCandidates(a, b)
		at := func(k float64) poly.Poly { return poly.Add(a, b.Scaled(k)) }
		for _, c := range cs {
			if c.Kind != stability.Complex {
				continue
			}
			roots, _ := at(c.K).Roots()
			z := cmplx.Exp(complex(0, c.Theta))
			best := math.Inf(1)
			for _, r := range roots {
				best = math.Min(best, cmplx.Abs(r-z))
			}
			// A simple root on the circle is found by the eigenvalues to
			// about 1e-12; 1e-7 allows for nearly double roots.
			if best > 1e-7 {
				t.Fatalf("trial %d: candidate k = %g, θ = %g, but the nearest root is %g from e^(jθ)", trial, c.K, c.Theta, best)
			}
		}
		ks := make([]float64, len(cs))
		for i, c := range cs {
			ks[i] = c.K
		}
		slices.Sort(ks)
		const steps = 1500
		prev, _ := outsideByEigen(t, at(-10))
		for i := 1; i <= steps; i++ {
			k0, k1 := -10+20*float64(i-1)/steps, -10+20*float64(i)/steps
			cur, near := outsideByEigen(t, at(k1))
			if cur != prev && near > 1e-9 {
				j, _ := slices.BinarySearch(ks, k0)
				if j == len(ks) || ks[j] > k1+1e-9 {
					t.Fatalf("trial %d: the count outside changes from %d to %d between k = %g and %g, where no candidate lies (%v)", trial, prev, cur, k0, k1, ks)
				}
			}
			prev = cur
		}
	}
}
