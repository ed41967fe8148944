package routh

import (
	"math"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// shiftTest finds the decay rate of a polynomial with the sign array
// alone: σ is the largest shift for which p(s − σ), whose roots are those
// of p moved right by σ, is still Hurwitz. The shifted coefficients come
// from the Taylor shift by repeated synthetic division (Horner's scheme
// applied n times, O(n²) operations; e.g. D. E. Knuth, The Art of
// Computer Programming, Vol. 2, Sec. 4.6.4), and σ is bracketed and
// bisected on a Hurwitz test. This is the relative-stability use of the
// Routh criterion (shifting the imaginary axis; e.g. K. Ogata, Modern
// Control Engineering, 5th ed., Sec. 5-6 (from memory)). It allocates
// nothing.
type shiftTest struct {
	q, work []float64
}

func newShiftTest(n int) *shiftTest {
	return &shiftTest{q: make([]float64, n), work: make([]float64, 2*(n/2+1))}
}

// decayRelTol is the bisection stopping width relative to the decay rate;
// decayAbsTol is its floor relative to the size of the roots, for decay
// rates near zero.
const (
	decayRelTol = 1e-10
	decayAbsTol = 1e-13
)

// hurwitz reports whether p(s − σ) has every root in the open left half
// plane.
//
// It is a lean form of the Routh test, not Count: a Hurwitz
// polynomial has coefficients of one sign (A. Stodola's necessary
// condition) and a regular array whose first column keeps that sign, so
// the test may stop at the first coefficient or pivot of the wrong sign
// and needs neither the special cases nor the rounding-error bounds that
// counting roots requires. A wrong answer is possible only for shifts
// within rounding of the decay rate, which moves the result by that much.
// In the same bisection it is 1.4 to 1.6 times faster than Count
// (the overlay package's BenchmarkNode, DecayCount beside DecayShift).
func (t *shiftTest) hurwitz(p poly.Poly, sigma float64) bool {
	q := t.q[:len(p)]
	copy(q, p)
	n := len(q) - 1
	c := -sigma
	for i := 0; i < n; i++ {
		for j := n - 1; j >= i; j-- {
			q[j] += c * q[j+1]
		}
	}
	sign := 1.0
	if q[n] < 0 {
		sign = -1
	}
	for _, v := range q {
		if !(sign*v > 0) {
			return false
		}
	}
	w := n/2 + 1
	a, b := t.work[:w], t.work[w:2*w]
	for j := 0; j < w; j++ {
		a[j], b[j] = 0, 0
		if i := n - 2*j; i >= 0 {
			a[j] = sign * q[i]
		}
		if i := n - 1 - 2*j; i >= 0 {
			b[j] = sign * q[i]
		}
	}
	// a and b are the rows s^(n−k+1) and s^(n−k); form the next row over a.
	for k := 1; k < n; k++ {
		r := a[0] / b[0]
		width := (n-k-1)/2 + 1
		for j := 0; j < width; j++ {
			a[j] = a[j+1] - r*b[j+1]
		}
		a[width] = 0
		if !(a[0] > 0) {
			return false
		}
		a, b = b, a
	}
	return true
}

// decay returns σ = −max Re(root of p) to decayRelTol relative (or
// decayAbsTol of the root size). Leading coefficients that are exactly
// zero are dropped; p must have another.
//
// Bracket: the roots sum to −p[n−1]/p[n], so their largest real part is at
// least the mean, and σ ≤ p[n−1]/(n·p[n]) = m. If p is Hurwitz, σ > 0 and
// m, a mean of root sizes, scales the tolerance; if not, σ ≥ −R with R
// Fujiwara's bound on |root|, 2·max over k of |p[n−k]/p[n]|^(1/k)
// (M. Fujiwara, Tôhoku Math. J. 10, 1916), which is within a factor 2 of
// the largest root and scales the tolerance instead.
func (t *shiftTest) decay(p poly.Poly) float64 {
	p = p.Trim(0)
	n := len(p) - 1
	if n < 1 {
		return math.NaN()
	}
	lo, hi := 0.0, p[n-1]/(float64(n)*p[n])
	floor := decayAbsTol * hi
	if !t.hurwitz(p, 0) {
		r := 0.0
		for k := 1; k <= n; k++ {
			r = math.Max(r, math.Pow(math.Abs(p[n-k]/p[n]), 1/float64(k)))
		}
		lo, hi = -2*r, 0
		floor = decayAbsTol * r
	}
	for hi-lo > math.Max(decayRelTol*math.Abs(lo), floor) {
		m := 0.5 * (lo + hi)
		if t.hurwitz(p, m) {
			lo = m
		} else {
			hi = m
		}
	}
	return 0.5 * (lo + hi)
}

// NewGrader implements stability.Test: the decay rate by the shifted sign
// array (shiftTest), which allocates nothing, and the damping ratio from
// the eigenvalues of the companion matrix, which it needs.
func (Test) NewGrader(n int) stability.Grader {
	return grader{shift: newShiftTest(n), roots: poly.NewFinder(n)}
}

type grader struct {
	shift *shiftTest
	roots *poly.Finder
}

// Decay implements stability.Grader.
func (g grader) Decay(f stability.Function) float64 { return g.shift.decay(f.P) }

// DecayDamping implements stability.Grader.
func (g grader) DecayDamping(f stability.Function) (decay, damping float64) {
	return g.roots.DecayAndDamping(f.P)
}
