package expr

import (
	"math"

	"gainscape/regions/poly"
)

// bounded is a polynomial computed in floating point together with a
// bound on the rounding in each coefficient: mag[k] is what p[k] would be
// if every number that went into it were replaced by its magnitude. The
// rounding error in p[k] is at most a small multiple of the unit roundoff
// times mag[k] (the standard bound for sums of products; see Higham,
// Accuracy and Stability of Numerical Algorithms, ch. 3). That lets the
// parser tell a polynomial that is zero because its terms cancel, such as
// 0.1+0.2-0.3, from one that is merely small, such as 1e-20, with a test
// relative to the coefficients' own scale instead of a fixed epsilon.
type bounded struct {
	p, mag poly.Poly
}

// constant returns the polynomial c.
func constant(c float64) bounded {
	return bounded{poly.Poly{c}, poly.Poly{math.Abs(c)}}
}

// variable returns the polynomial s.
func variable() bounded {
	return bounded{poly.Poly{0, 1}, poly.Poly{0, 1}}
}

// size returns len(p)-1, the degree the representation allows for. After
// trimmed it is the degree, except for the zero polynomial.
func (a bounded) size() int { return len(a.p) - 1 }

func (a bounded) plus(b bounded) bounded {
	return bounded{poly.Add(a.p, b.p), poly.Add(a.mag, b.mag)}.trimmed()
}

func (a bounded) minus(b bounded) bounded {
	return bounded{poly.Sub(a.p, b.p), poly.Add(a.mag, b.mag)}.trimmed()
}

func (a bounded) times(b bounded) bounded {
	return bounded{poly.Mul(a.p, b.p), poly.Mul(a.mag, b.mag)}.trimmed()
}

// negated returns -a. It subtracts from zero rather than scaling by -1 so
// that zero coefficients stay +0 and never print as "-0".
func (a bounded) negated() bounded {
	return bounded{poly.Sub(nil, a.p), a.mag}
}

func (a bounded) pow(k int) bounded {
	return bounded{a.p.Pow(k), a.mag.Pow(k)}.trimmed()
}

// trimmed drops leading coefficients that are exactly zero, as left by
// exact cancellation in s-s or (s+1)-s, keeping at least one coefficient.
// The polynomial is unchanged; only len(p)-1 becomes its degree, which the
// degree limit and the callers rely on.
func (a bounded) trimmed() bounded {
	n := len(a.p)
	for n > 1 && a.p[n-1] == 0 {
		n--
	}
	return bounded{a.p[:n], a.mag[:n]}
}

// isZero reports whether every coefficient is within rounding of zero,
// judged against its own bound with the tolerance poly.RelTol.
func (a bounded) isZero() bool {
	for k, v := range a.p {
		if math.Abs(v) > poly.RelTol*a.mag[k] {
			return false
		}
	}
	return true
}

// finite reports whether every coefficient and bound is a finite number.
func (a bounded) finite() bool { return a.p.Finite() && a.mag.Finite() }

// ratio is a rational function num/den, times the dead time factor of
// the expression when delayed is set. Common factors are never cancelled;
// see Parse.
type ratio struct {
	num, den bounded
	delayed  bool
}

func polynomial(a bounded) ratio { return ratio{num: a, den: constant(1)} }

// sameDen reports whether a and b have the same denominator, coefficient
// for coefficient. Exact equality is enough here: it only decides whether
// a sum can keep one copy of a denominator that was typed twice (as in
// 1/s + 2/s), and when it fails the general formula is still correct.
func sameDen(a, b ratio) bool {
	if len(a.den.p) != len(b.den.p) {
		return false
	}
	for k, v := range a.den.p {
		if v != b.den.p[k] {
			return false
		}
	}
	return true
}

// sumSizes returns the sizes of the numerator and denominator of a±b.
func sumSizes(a, b ratio) (num, den int) {
	if sameDen(a, b) {
		return max(a.num.size(), b.num.size()), a.den.size()
	}
	return max(a.num.size()+b.den.size(), b.num.size()+a.den.size()), a.den.size() + b.den.size()
}

// sum returns a+b, or a-b when subtract is set.
func sum(a, b ratio, subtract bool) ratio {
	combine := bounded.plus
	if subtract {
		combine = bounded.minus
	}
	if sameDen(a, b) {
		return ratio{num: combine(a.num, b.num), den: a.den}
	}
	return ratio{num: combine(a.num.times(b.den), b.num.times(a.den)), den: a.den.times(b.den)}
}

// product returns a·b; the parser allows at most one delayed factor.
func product(a, b ratio) ratio {
	return ratio{a.num.times(b.num), a.den.times(b.den), a.delayed || b.delayed}
}

// quotient returns a/b as (a.num·b.den)/(a.den·b.num). The caller has
// checked that b.num is not zero and that b carries no delay.
func quotient(a, b ratio) ratio {
	return ratio{a.num.times(b.den), a.den.times(b.num), a.delayed}
}

func (a ratio) negated() ratio { return ratio{a.num.negated(), a.den, a.delayed} }

// pow returns a^k; the caller has checked that a carries no delay unless
// k is 1.
func (a ratio) pow(k int) ratio { return ratio{a.num.pow(k), a.den.pow(k), a.delayed} }

func (a ratio) finite() bool { return a.num.finite() && a.den.finite() }
