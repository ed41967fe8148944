package routh

import "math"

// countBefore is Count as it stood before FastCount was added, kept
// word for word as the straightforward referee of the tests that
// FastCount and the reorganised Count, whose bounds are formed in shared
// functions, return exactly what it returned, on every input.
func countBefore(p, work []float64) (rhp, zeroRoots int, st Status) {
	n := len(p) - 1
	if n < 0 {
		return 0, 0, Undecidable
	}
	// One sum tells whether every coefficient is finite (a NaN or an
	// infinity makes it so) and whether any is non-zero.
	total := 0.0
	for _, v := range p {
		total += math.Abs(v)
	}
	if !(total <= math.MaxFloat64) || total == 0 {
		return 0, 0, Undecidable
	}
	if p[n] == 0 {
		return 0, 0, NeedsAnalysis
	}
	lo := 0
	for p[lo] == 0 {
		lo++
	}
	q := p[lo:]
	m := n - lo
	if m == 0 {
		return 0, lo, Decided
	}
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
		er := (a[1]+absR*eb0)*math.Abs(inv) + 2*unit*absR
		width := 2 * ((m-k-1)/2 + 1)
		for j := 0; j < width; j += 2 {
			x, ex := a[j+2], a[j+3]
			y, ey := b[j+2], b[j+3]
			ry := r * y
			d := x - ry
			e := ex + absR*ey + math.Abs(y)*er + unit*(math.Abs(x)+2*math.Abs(ry))
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
