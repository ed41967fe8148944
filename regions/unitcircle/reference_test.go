package unitcircle

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
	"gainscape/regions/zoh"
)

// randomZRoots returns n roots (conjugate pairs kept together) whose
// magnitudes r satisfy |ln r| ≥ margin, with |ln r| ≤ spread, and how many
// lie outside the unit circle.
func randomZRoots(rng *rand.Rand, n int, margin, spread float64) ([]complex128, int) {
	var roots []complex128
	outside := 0
	for len(roots) < n {
		l := margin + (spread-margin)*rng.Float64()
		if rng.IntN(2) == 0 {
			l = -l
		}
		r := math.Exp(l)
		if n-len(roots) >= 2 && rng.IntN(2) == 0 {
			th := math.Pi * (0.02 + 0.96*rng.Float64())
			z := cmplx.Rect(r, th)
			roots = append(roots, z, cmplx.Conj(z))
			if l > 0 {
				outside += 2
			}
			continue
		}
		if rng.IntN(2) == 0 {
			r = -r
		}
		roots = append(roots, complex(r, 0))
		if l > 0 {
			outside++
		}
	}
	return roots, outside
}

// eigenOutside counts roots outside the unit circle from gonum's
// eigenvalues of the companion matrix (poly.Roots), the independent
// reference; ok is false when a root is within 1e-6 of the circle, too
// close for the reference itself.
func eigenOutside(t testing.TB, p poly.Poly) (outside int, ok bool) {
	roots, err := p.Roots()
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range roots {
		m := cmplx.Abs(r)
		if math.Abs(m-1) < 1e-6 {
			return 0, false
		}
		if m > 1 {
			outside++
		}
	}
	return outside, true
}

// TestCountAgreesWithEigenvalues checks the count on 20,000 random
// polynomials of degree 1 to 20 with roots at least 3% (in ln|z|) from the
// circle, scaled by factors from 1e-10 to 1e10 of either sign, against the
// construction and the eigenvalues; it reports how often each stage
// decided.
func TestCountAgreesWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	c := newCounter(21)
	var stages [4]int
	const trials = 20000
	for trial := range trials {
		n := 1 + trial%20
		roots, built := randomZRoots(rng, n, 0.03, 1.2)
		p := poly.FromRoots(roots).Scaled(math.Pow(10, 20*rng.Float64()-10) * float64(1-2*rng.IntN(2)))
		ref, ok := eigenOutside(t, p)
		if !ok || ref != built {
			t.Fatalf("trial %d: eigenvalues give %d (ok %v) for %d built", trial, ref, ok, built)
		}
		v, stage := c.count(stability.Function{P: p})
		stages[stage]++
		if v.Unstable != ref || v.Boundary != 0 || v.Infinite != 0 {
			t.Fatalf("trial %d: Count = %+v, eigenvalues %d outside; p = %v", trial, v, ref, p)
		}
	}
	t.Logf("of %d: %d decided by the recursion, %d by the sign array of the mapped polynomial, %d by the full analysis",
		trials, stages[byRecursion], stages[bySignArray], stages[byAnalysis])
}

// TestSampledLoopsAgreeWithEigenvalues builds random invented loops: a
// plant of order 1 to 5 with random real and complex poles (stable and
// unstable), a zero or two, a random dead time, sampled behind a hold at a
// random period, under a digital P or PI controller with gains of either
// sign across six decades; the count must match the eigenvalues wherever
// they are clear of the circle.
func TestSampledLoopsAgreeWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	counter := Test{T: 1}.NewCounter(40)
	pi, err := family.Digital("pi", 1, family.Backward)
	if err != nil {
		t.Fatal(err)
	}
	checked, skipped := 0, 0
	for trial := range 3000 {
		order := 1 + trial%5
		var poles []complex128
		for len(poles) < order {
			re := -math.Exp(3*rng.Float64() - 2)
			if rng.IntN(5) == 0 {
				re = -re / 3
			}
			if order-len(poles) >= 2 && rng.IntN(2) == 0 {
				im := math.Exp(2*rng.Float64() - 1)
				poles = append(poles, complex(re, im), complex(re, -im))
				continue
			}
			poles = append(poles, complex(re, 0))
		}
		den := poly.FromRoots(poles)
		num := poly.Poly{1}
		if order > 1 && rng.IntN(2) == 0 {
			num = poly.Poly{2*rng.Float64() - 0.5, 1}
		}
		T := math.Exp(4*rng.Float64() - 3) // 0.05 … 2.7
		L := 0.0
		if rng.IntN(2) == 0 {
			L = 2 * T * rng.Float64()
		}
		nz, dz, err := zoh.Discretise(num, den, T, L)
		if err != nil {
			t.Fatal(err)
		}
		gain := math.Pow(10, 6*rng.Float64()-4) * float64(1-2*rng.IntN(2))
		var ch poly.Poly
		if rng.IntN(2) == 0 {
			ch = family.Characteristic(nz, dz, poly.Poly{gain}, poly.Poly{1})
		} else {
			// The digital PI made for T = 1 with ki·T folded: pass ki/T so
			// the loop has ki at its own sample time.
			cn, cd := family.Controller(pi, []float64{gain, gain * rng.Float64() / T})
			ch = family.Characteristic(nz, dz, cn, cd)
		}
		ref, ok := eigenOutside(t, ch)
		if !ok {
			skipped++
			continue
		}
		checked++
		v := counter.Count(stability.Function{P: ch})
		if v.Unstable != ref || v.Boundary != 0 || v.Infinite != 0 {
			t.Fatalf("trial %d: Count = %+v, eigenvalues %d outside; P = %v", trial, v, ref, ch)
		}
	}
	t.Logf("%d loops checked, %d skipped with a root within 1e-6 of the circle", checked, skipped)
}
