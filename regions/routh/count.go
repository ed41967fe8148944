// Package routh implements the Routh sign-array test: the number of roots
// of a real polynomial in the open right half plane, and the roots on the
// imaginary axis, without computing any root.
//
// Method: E. J. Routh, "A Treatise on the Stability of a Given State of
// Motion" (1877), in the tabular form found in control textbooks (e.g.
// K. Ogata, Modern Control Engineering, 5th ed., Sec. 5-6; N. S. Nise,
// Control Systems Engineering, Ch. 6). The number of sign changes in the
// first column equals the number of right-half-plane roots.
//
// Count is the fast path for grids: it allocates nothing and handles the
// regular case, a degree drop being flagged and zero roots factored out.
// FastCount returns exactly what Count returns, in less time where the
// array is far from its zeros.
// Analyze handles everything, including the two special cases: a zero
// first-column entry in a non-zero row (the ε rule, with the limit ε → 0+
// taken by carrying every entry as a truncated Laurent series in ε), and an
// all-zero row (replaced by the derivative of the auxiliary polynomial
// formed from the row above, whose roots are the imaginary-axis roots).
package routh

import "math"

// InputTol is the relative size below which Analyze takes a coefficient of
// the input polynomial to be zero: at most InputTol times its balanced
// scale (see balancedScales). It allows for the rounding of forming the
// characteristic polynomial from plant and controller with a wide margin.
// Count itself treats only exact zeros as zero and leaves near-zeros to
// its error bounds.
const InputTol = 1e-13

// unit is the unit roundoff of float64, 2^-53.
const unit = 0x1p-53

// Entries computed inside the array are tested against a running bound on
// their rounding error (J. H. Wilkinson's running error analysis, as in
// N. J. Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed.,
// Sec. 3.3): each entry a − r·b carries a bound built from the bounds of
// a, r and b plus the rounding of the operation itself, and an entry no
// larger than its bound is zero. Input coefficients start with a bound of
// a few units in the last place of themselves. This makes every zero test
// relative to the scale of what produced the entry, however the
// coefficients are scaled.
const inputUlps = 4

// Status says how far Count got.
type Status int8

const (
	// Decided: the count is exact for the regular case.
	Decided Status = iota
	// NeedsAnalysis: a special case occurred (a zero first-column entry, an
	// all-zero row or a vanishing leading coefficient); call Analyze.
	NeedsAnalysis
	// Undecidable: the coefficients are not finite, all zero, or overflow
	// the array; no count can be trusted.
	Undecidable
)

// WorkLen returns the scratch length Count needs for polynomials with up to
// n+1 coefficients: two rows of entries, each entry a value and the
// running bound on its rounding error side by side.
func WorkLen(n int) int { return 4 * (n/2 + 2) }

// Count returns the number of right-half-plane roots of p (ascending
// coefficients) and the number of roots at s = 0, using work (length at
// least WorkLen(len(p)-1)) as scratch. It does not allocate. When the
// status is not Decided the counts are meaningless.
func Count(p, work []float64) (rhp, zeroRoots int, st Status) {
	q, lo, st := prepare(p)
	if st != Decided || len(q) == 1 {
		return 0, lo, st
	}
	m := len(q) - 1
	// Rows are stored as (value, error bound) pairs: a[2j], a[2j+1].
	w := 2 * (m/2 + 2)
	a, b := work[:w], work[w:2*w]
	// Only the entry past the end of each first row is read before it is
	// written, and must be zero.
	a[m-m%2+2], a[m-m%2+3] = 0, 0
	b[m+m%2], b[m+m%2+1] = 0, 0
	const e0 = inputUlps * unit
	for i := m; i >= 0; i -= 2 {
		j := m - i
		a[j], a[j+1] = q[i], e0*math.Abs(q[i])
	}
	for i := m - 1; i >= 0; i -= 2 {
		j := m - 1 - i
		b[j], b[j+1] = q[i], e0*math.Abs(q[i])
	}
	prevNeg := a[0] < 0
	for k := 1; k <= m; k++ {
		// b holds row s^(m-k); its first entry is the pivot.
		b0, eb0 := b[0], b[1]
		if b0 == 0 {
			return 0, 0, NeedsAnalysis
		}
		neg := b0 < 0
		if neg != prevNeg {
			rhp++
		}
		prevNeg = neg
		if k == m-1 {
			// The constant coefficient passes unchanged down the last
			// column, so the final pivot, row s^0, is q[0] itself.
			if (q[0] < 0) != prevNeg {
				rhp++
			}
			break
		}
		// Next row, in place over a: a[j] = a[j+1] − r·b[j+1], r = a[0]/b[0],
		// with error bounds carried alongside. Row s^(m-k-1) has
		// (m-k-1)/2 + 1 meaningful entries; the rest stay zero.
		inv := 1 / b0
		r := a[0] * inv
		absR := math.Abs(r)
		er := ratioBound(a[1], absR, eb0, math.Abs(inv))
		width := 2 * ((m-k-1)/2 + 1)
		for j := 0; j < width; j += 2 {
			x, ex := a[j+2], a[j+3]
			y, ey := b[j+2], b[j+3]
			ry := float64(r * y)
			d := x - ry
			// |fl(r·y)| = fl(|r|·|y|): rounding to nearest is symmetric.
			absY := math.Abs(y)
			e := entryBound(ex, absR, ey, absY, er, math.Abs(x), float64(absR*absY))
			if math.Abs(d) <= e {
				d = 0
			}
			a[j], a[j+1] = d, e
		}
		a[width], a[width+1] = 0, 0
		// The bound sums magnitudes, so it is finite only if every value
		// that entered the entry was.
		if !(a[1] <= math.MaxFloat64) {
			return 0, 0, Undecidable
		}
		a, b = b, a
	}
	return rhp, lo, Decided
}

// ratioBound bounds the error of r = a0·(1/b0) from the bounds ea0 and eb0
// of a0 and b0, |r| and |1/b0|: the error carried in from a0 and b0, and
// the rounding of the division and of the product.
//
// entryBound bounds the error of an entry x − r·y from the bounds ex, ey
// and er of its operands, |r|, |y|, |x| and the computed |r·y|: the errors
// carried in, and the rounding of the product and of the difference.
//
// Both round every operation on its own (the conversions forbid fused
// multiply-adds), and both are sums and products of their non-negative
// arguments, so under rounding to nearest they never decrease when an
// argument grows. FastCount relies on that: passing upper bounds of the
// arguments gives an upper bound of what Count computes.
func ratioBound(ea0, absR, eb0, absInv float64) float64 {
	return float64(float64(ea0+float64(absR*eb0))*absInv) + float64(2*unit*absR)
}

func entryBound(ex, absR, ey, absY, er, absX, absRY float64) float64 {
	return float64(float64(ex+float64(absR*ey))+float64(absY*er)) +
		float64(unit*(absX+float64(2*absRY)))
}

// prepare makes the checks that come before the array: q is p without its
// roots at s = 0, lo how many there were, and a status other than Decided
// (with lo zero) ends the count. Count and FastCount share it, so that
// they reject exactly the same inputs.
func prepare(p []float64) (q []float64, lo int, st Status) {
	// One sum tells whether every coefficient is finite (a NaN or an
	// infinity makes it so) and whether any is non-zero, p being empty
	// included.
	total := 0.0
	for _, v := range p {
		total += math.Abs(v)
	}
	if !(total <= math.MaxFloat64) || total == 0 {
		return nil, 0, Undecidable
	}
	if p[len(p)-1] == 0 {
		return nil, 0, NeedsAnalysis
	}
	for p[lo] == 0 {
		lo++
	}
	return p[lo:], lo, Decided
}

// Hurwitz reports whether every root of p lies in the open left half
// plane, with no root at s = 0 and no drop of degree: the fast count where
// it decides, the full analysis where it does not. work is as for Count.
func Hurwitz(p, work []float64) bool {
	rhp, zeros, st := FastCount(p, work)
	switch st {
	case Decided:
		return rhp == 0 && zeros == 0
	case NeedsAnalysis:
		return Analyze(p).Stable()
	}
	return false
}
