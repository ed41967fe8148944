package delay

import "math"

// rootFinder finds the positive real roots of real polynomials of degree
// at most max without allocating: the derivative cascade (the roots of
// c^(j) separate c^(j−1) into monotone pieces, each holding at most one
// root; e.g. J. M. McNamee, Numerical Methods for Roots of Polynomials,
// Part I, Elsevier 2007, Sec. 2.8), each piece solved by Newton's method
// safeguarded by bisection. Descartes' rule of signs settles the common
// cases of no or exactly one positive root without the cascade.
//
// Roots of odd multiplicity are always found; a root of even multiplicity
// (a tangency) is found only where rounding leaves the extremum on the
// zero side, which is all the callers need: they check the extrema, kept
// in crit, that come within rounding of zero.
type rootFinder struct {
	deriv [][]float64 // deriv[j] holds the j-th derivative's coefficients
	a, b  []float64   // roots of the current and the previous level
	crit  []float64   // extrema of the last polynomial solved (roots of c')
}

func newRootFinder(max int) *rootFinder {
	r := &rootFinder{deriv: make([][]float64, max+1)}
	for j := range r.deriv {
		r.deriv[j] = make([]float64, max+1-j)
	}
	r.a = make([]float64, 0, max+1)
	r.b = make([]float64, 0, max+1)
	r.crit = make([]float64, 0, max+1)
	return r
}

// positive returns the distinct positive roots of c (ascending
// coefficients, c[len(c)-1] ≠ 0), ascending, in dst[:0]. The result
// shares no storage with the finder.
func (r *rootFinder) positive(c []float64, dst []float64) []float64 {
	dst = dst[:0]
	r.crit = r.crit[:0]
	d := len(c) - 1
	if d <= 0 {
		return dst
	}
	lo := 0
	for c[lo] == 0 {
		lo++
	}
	// A factor x^lo has only the root 0, which is not positive.
	c = c[lo:]
	d -= lo
	if d == 0 {
		return dst
	}
	bound := rootBound(c)
	switch signChanges(c) {
	case 0:
		return dst
	case 1:
		// Descartes: exactly one positive root, and c(0), c(bound)
		// have opposite signs.
		x := safeNewton(c, 0, bound, c[0], 0.5*bound)
		return append(dst, x)
	}
	copy(r.deriv[0], c)
	for j := 1; j < d; j++ {
		prev, cur := r.deriv[j-1][:d+2-j], r.deriv[j][:d+1-j]
		for k := range cur {
			cur[k] = float64(k+1) * prev[k+1]
		}
	}
	// Level d−1 is linear.
	lin := r.deriv[d-1][:2]
	r.a = r.a[:0]
	if x := -lin[0] / lin[1]; x > 0 && x < bound {
		r.a = append(r.a, x)
	}
	for j := d - 2; j >= 0; j-- {
		p := r.deriv[j][:d+1-j]
		r.b, r.a = r.a, r.b[:0]
		left, fl := 0.0, p[0]
		for i := 0; i <= len(r.b); i++ {
			right := bound
			if i < len(r.b) {
				right = r.b[i]
			}
			fr := horner(p, right)
			switch {
			case fr == 0 && i < len(r.b):
				r.a = append(r.a, right)
			case fl != 0 && (fl < 0) != (fr < 0):
				r.a = append(r.a, safeNewton(p, left, right, fl, 0.5*(left+right)))
			}
			left, fl = right, fr
		}
		if j == 1 {
			r.crit = append(r.crit, r.a...)
		}
	}
	return append(dst, r.a...)
}

// safeNewton returns the root of c in (lo, hi), where c changes sign once
// and c(lo) = flo, starting from x0: Newton steps kept inside a bracket
// that bisection shrinks whenever a step would leave it or converge too
// slowly (W. H. Press et al., Numerical Recipes, 3rd ed., Sec. 9.4,
// rtsafe).
func safeNewton(c []float64, lo, hi, flo, x0 float64) float64 {
	neg := flo < 0 // c < 0 on the lo side of the root
	x := x0
	width := hi - lo
	for it := 0; it < 200; it++ {
		f, df := hornerDeriv(c, x)
		if f == 0 {
			return x
		}
		step := f / df
		if math.Abs(step) <= 4*unit*math.Abs(x) {
			// Converged to rounding: a further step is noise.
			return x - step
		}
		if (f < 0) == neg {
			lo = x
		} else {
			hi = x
		}
		next := x - step
		if !(next > lo && next < hi) || math.Abs(next-x) > 0.5*width {
			next = 0.5 * (lo + hi)
		}
		width = math.Abs(next - x)
		if width <= 2*unit*math.Abs(next) || hi-lo <= 2*unit*hi || next == x {
			return next
		}
		x = next
	}
	return x
}

// rootBound returns Fujiwara's bound 2·max |c_k/c_d|^(1/(d−k)), the
// constant term halved, on the modulus of every root of c (M. Fujiwara,
// Tôhoku Math. J. 10, 1916), made a little larger so that no root sits on
// it: past it the sign of c is that of its leading coefficient. Each term
// is first bounded by a power of two from the exponents alone, within a
// factor two of it, and only the terms that can be the largest are
// computed with a power.
func rootBound(c []float64) float64 {
	d := len(c) - 1
	_, ed := math.Frexp(c[d])
	est := func(k int) int {
		// |c_k/c_d| < 2^(ek − ed + 1), halved for k = 0; ⌈e/j⌉ with Go's
		// division truncating towards zero.
		_, ek := math.Frexp(c[k])
		e := ek - ed + 1
		if k == 0 {
			e--
		}
		j := d - k
		q := e / j
		if e%j != 0 && e > 0 {
			q++
		}
		return q
	}
	top := math.MinInt
	for k := 0; k < d; k++ {
		if c[k] != 0 {
			top = max(top, est(k))
		}
	}
	m := 0.0
	for k := 0; k < d; k++ {
		if c[k] == 0 || est(k) < top-2 {
			continue
		}
		v := math.Abs(c[k] / c[d])
		if k == 0 {
			v /= 2
		}
		m = math.Max(m, math.Pow(v, 1/float64(d-k)))
	}
	return 2.0625 * m
}

// signChanges counts the sign changes in c, zeros skipped.
func signChanges(c []float64) int {
	n, prev := 0, 0.0
	for _, v := range c {
		if v == 0 {
			continue
		}
		if prev != 0 && (v < 0) != (prev < 0) {
			n++
		}
		prev = v
	}
	return n
}

// horner returns c(x).
func horner(c []float64, x float64) float64 {
	v := 0.0
	for k := len(c) - 1; k >= 0; k-- {
		v = v*x + c[k]
	}
	return v
}

// hornerDeriv returns c(x) and c'(x).
func hornerDeriv(c []float64, x float64) (f, df float64) {
	for k := len(c) - 1; k >= 0; k-- {
		df = df*x + f
		f = f*x + c[k]
	}
	return f, df
}

// unit is the unit roundoff of float64, 2^-53.
const unit = 0x1p-53
