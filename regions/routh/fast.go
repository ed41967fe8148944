package routh

import "math"

// FastCount returns exactly what Count returns for p, in less time where
// the array is far from any zero, the common case at the nodes of a map.
// work is as for Count; it does not allocate.
//
// Method: the same sign array, computed with the very operations Count
// uses, so that every entry has the value Count would give it bit for
// bit as long as Count sets no entry to zero. In place of Count's error
// bound for every entry (see entryBound) it carries three numbers per
// row, computed once per row: M, a bound on the magnitude of every entry
// of the row; E, a bound on the error bound Count would attach to any
// entry of the row; and P, a bound on the one Count attaches to the
// pivot (kept apart because the pivot's bound, divided by the pivot,
// enters every entry of the next row). Count's test per entry, |d| > e,
// becomes the stronger |d| > E. Where that fails for any entry, or E is
// not finite, FastCount starts again with Count.
//
// Why an acceptance gives Count's answer. By induction over the rows,
// suppose Count has so far set nothing to zero, so that its entries equal
// ours, and that for the two rows in use every entry v satisfies |v| ≤ M
// and Count's bound e ≤ E, the pivot's e ≤ P (for the input rows M is
// the largest magnitude, E = fl(e0·M) and P = fl(e0·|pivot|), while
// Count starts from fl(e0·|q_i|)). For the next row Count computes
// ratioBound(ea0, |r|, eb0, |1/b0|) and entryBound(ex, |r|, ey, |y|, er,
// |x|, |fl(r·y)|); we evaluate the same two functions with every
// argument replaced by one at least as large (P for the pivots' bounds,
// E for the others, M for the magnitudes, fl(|r|·M) for |fl(r·y)|, and
// for P of the new row the actual second entries). Those functions only
// add and multiply non-negative numbers, each operation rounded on its
// own, and rounding to nearest is monotone, so ours are at least Count's.
// When our E is finite so is every term of Count's (a NaN would need an
// infinity times zero, which makes ours infinite or NaN), and so is every
// new entry d, since |fl(x − fl(r·y))| ≤ fl(M_a + fl(|r|·M_b)) and E
// contains u times that. So where every entry passes |d| > E, Count finds
// |d| > e at every entry, zeroes none, meets no zero pivot, finds every
// bound finite, and reads the signs of the same pivots: the same
// right-half-plane count, the same roots at s = 0, Decided. The new M is
// the largest |d| of the row, which is exact.
//
// Limits. E takes the largest entry of a row for every entry, so an entry
// far smaller than the rest of its row fails the test although Count's
// own bound would pass it. That happens when the coefficients spread over
// many decades (gains of 1e12 or 1e-12 on a loop with time constants near
// 1) and in most arrays above degree 16, whose bounds grow from row to
// row. FastCount sends the first kind to Count before any division when
// the spread of the coefficients shows it (spanBits, endSpanBits), and
// the second by its degree; where the bounds fail all the same, it costs
// Count plus the rows it computed.
//
// Speed. Each row of the array waits for the division by the pivot of
// the row before, so one polynomial takes at least a division, two
// products and a difference per row, however little the rest costs.
// Count is at that floor up to degree 8 or so; above it the work per
// entry dominates, and FastCount's entry (a product, a difference and
// one comparison) is about a third of Count's: about 10% faster at
// degree 10, 15 to 25% at 12 to 16. FastCount therefore calls Count for
// degrees below fastMin and above fastMax (see BenchmarkFastDegree* in
// bench_test.go).
func FastCount(p, work []float64) (rhp, zeroRoots int, st Status) {
	if n := len(p) - 1; n < fastMin || n > fastMax {
		return Count(p, work)
	}
	if rhp, st, ok := certified(p, work); ok {
		if st != Decided {
			return 0, 0, st
		}
		return rhp, 0, st
	}
	return Count(p, work)
}

// The degrees for which FastCount tries the bounds per row before Count.
// Below fastMin the extra work per row costs more than the entries save;
// above fastMax the bounds of random well-separated polynomials fail more
// often than not.
const (
	fastMin = 9
	fastMax = 16
)

const signBit = 1 << 63

// The bits of 2^1000 bound the coefficients certified takes: above them
// lie NaN and the infinities, and at most fastMax+1 terms below them
// cannot make the sum of magnitudes in prepare overflow.
const hugeBits = 0x7e70000000000000

// spanBits and endSpanBits are the widest spreads of coefficient sizes
// certified takes, as differences of bit patterns: all coefficients
// within about twelve decades (2^40), and the two lowest within about
// nine decades (2^30) of the largest. Beyond them the bounds per row
// nearly always fail, the second case late in the array: a small
// constant term (a small integral gain, say) passes unchanged down every
// other row while the error bounds grow. On random and PID-loop
// polynomials of degree 9 to 16, 56 of 3038 whose lowest two coefficients
// spanned more than nine decades passed. Going to Count at once then
// costs less than the rows computed until the failure.
const (
	spanBits    = 40 << 52
	endSpanBits = 30 << 52
)

// certified runs the array of q, of degree at least 2, with the bounds
// per row of FastCount, when its first and last coefficients are not
// zero and the sizes of all are within hugeBits, spanBits and
// endSpanBits; Count's own checks before the array (prepare) then pass
// with no root at s = 0 to take out. ok is false where the bounds cannot
// certify Count's answer or q is not such a polynomial; the other results
// are then meaningless.
func certified(q, work []float64) (rhp int, st Status, ok bool) {
	m := len(q) - 1
	h := m/2 + 2
	a, b := work[:h], work[h:2*h]
	// As in Count, only the entry past the end of each first row is read
	// before it is written. The bits of finite non-negative numbers are
	// ordered as the numbers are, which makes the largest magnitude an
	// integer max; a NaN or an infinity has bits above hugeBits.
	a[m/2+1] = 0
	b[(m+1)/2] = 0
	var aBits, bBits uint64
	lowBits := uint64(math.MaxUint64)
	for i := m; i >= 0; i -= 2 {
		a[(m-i)/2] = q[i]
		v := math.Float64bits(q[i]) &^ signBit
		aBits, lowBits = max(aBits, v), min(lowBits, v)
	}
	for i := m - 1; i >= 0; i -= 2 {
		b[(m-1-i)/2] = q[i]
		v := math.Float64bits(q[i]) &^ signBit
		bBits, lowBits = max(bBits, v), min(lowBits, v)
	}
	top := max(aBits, bBits)
	ends := min(math.Float64bits(q[0])&^signBit, math.Float64bits(q[1])&^signBit)
	if q[m] == 0 || q[0] == 0 || top >= hugeBits || top-lowBits > spanBits || top-ends > endSpanBits {
		return 0, 0, false
	}
	const e0 = inputUlps * unit
	ma, mb := math.Float64frombits(aBits), math.Float64frombits(bBits)
	ea, eb := e0*ma, e0*mb
	pa, pb := e0*math.Abs(q[m]), e0*math.Abs(q[m-1])
	// The two pivots in use stay in registers: each row waits for the
	// division by the last one, and a trip through memory would lengthen
	// that wait.
	a0, b0 := a[0], b[0]
	if b0 == 0 {
		return 0, NeedsAnalysis, true
	}
	if (a0 < 0) != (b0 < 0) {
		rhp++
	}
	for k := 1; k < m-1; k++ {
		inv := 1 / b0
		r := a0 * inv
		absR, absB1 := math.Abs(r), math.Abs(b[1])
		er := ratioBound(pa, absR, pb, math.Abs(inv))
		e := entryBound(ea, absR, eb, mb, er, ma, float64(absR*mb))
		pc := entryBound(ea, absR, eb, absB1, er, math.Abs(a[1]), float64(absR*absB1))
		if !(e < math.Inf(1)) {
			return 0, 0, false
		}
		// |d| > E as integers, exact because E is finite and so, then, is d.
		width := (m-k-1)/2 + 1
		dst, src, ys := a[:width], a[1:width+1], b[1:width+1]
		eBits, mBits := math.Float64bits(e), uint64(0)
		for j := range dst {
			d := src[j] - float64(r*ys[j])
			bits := math.Float64bits(d) &^ signBit
			if bits <= eBits {
				return 0, 0, false
			}
			mBits = max(mBits, bits)
			dst[j] = d
		}
		a[width] = 0
		c0 := dst[0]
		if (c0 < 0) != (b0 < 0) {
			rhp++
		}
		a, b, a0, b0 = b, a, b0, c0
		ma, mb = mb, math.Float64frombits(mBits)
		ea, eb = eb, e
		pa, pb = pb, pc
	}
	// The constant coefficient passes unchanged down the last column, so
	// the final pivot, row s^0, is q[0] itself.
	if (q[0] < 0) != (b0 < 0) {
		rhp++
	}
	return rhp, Decided, true
}
