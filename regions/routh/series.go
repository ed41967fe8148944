package routh

import "math"

// samples is one quantity computed three times from slightly perturbed
// inputs. Their spread estimates how many of its digits are meaningful:
// the CESTAC method of stochastic arithmetic (J. Vignes, "Discrete
// stochastic arithmetic for validating results of numerical software",
// Numerical Algorithms 37, 2004). A quantity whose mean is within its
// confidence half-width of zero is a computational zero. Every operation
// is applied to each sample alike, and every zero decision is taken once
// for all three, so the three computations follow the same branches.
type samples [3]float64

// studentT is Student's t for two degrees of freedom at 95%, the value
// CESTAC uses with three samples.
const studentT = 4.303

func (x samples) mean() float64 { return (x[0] + x[1] + x[2]) / 3 }

// isZero reports whether x is a computational zero.
func (x samples) isZero() bool {
	m := x.mean()
	if m == 0 {
		return true
	}
	// Scaled by the largest deviation so that squares cannot underflow.
	dev := 0.0
	for _, v := range x {
		dev = math.Max(dev, math.Abs(v-m))
	}
	if dev == 0 {
		return false
	}
	var ss float64
	for _, v := range x {
		ss += ((v - m) / dev) * ((v - m) / dev)
	}
	sd := dev * math.Sqrt(ss/2)
	return math.Abs(m) <= studentT*sd/math.Sqrt(3)
}

// series is a truncated Laurent series in ε: Σ c[i]·ε^(lo+i). It carries
// the entries of the sign array once the ε rule has been applied, so that
// the sign of every first-column entry is read off as ε → 0+ exactly (the
// sign of its lowest-order non-zero term) instead of by substituting one
// small number.
type series struct {
	lo int
	c  []samples
	// m[i] is the size of the terms of the last operation that formed
	// c[i]: a coefficient whose mean is within roundingUlps units in the
	// last place of m[i] is the rounding residue of an exact cancellation,
	// zero whatever the samples say (perturbing the inputs cannot reveal
	// an algebraic identity, which cancels for every sample alike).
	m []float64
	// doubtful is set when the series' leading order is in question: a
	// coefficient below it had no significant digits under the input
	// perturbations yet was too large, relative to its operands, to be the
	// residue of a cancellation that is exact in the unperturbed problem.
	// It passes to every series computed from this one.
	doubtful bool
}

// roundingUlps is the rounding allowance, in units of the last place of
// the terms that formed a coefficient, of the zero test.
const roundingUlps = 256

// arith does series arithmetic with a fixed number of kept terms, set by
// Analyze from the degree so that cancelled leading orders cannot exhaust it.
type arith struct {
	terms int
	// overflow is set when a value in the array is not finite.
	overflow *bool
}

// lossLimit is the largest size, relative to the terms that formed it,
// that a coefficient without significant digits may have and still be
// taken for zero: up to about thirteen decimal digits lost to cancellation.
const lossLimit = 1e-3

func (ar arith) zero() series {
	return series{c: make([]samples, ar.terms), m: make([]float64, ar.terms)}
}

// monomial returns v·ε^order.
func (ar arith) monomial(v samples, order int) series {
	s := ar.zero()
	s.c[0], s.m[0], s.lo = v, math.Abs(v.mean()), order
	return ar.norm(s)
}

func (s series) isZero() bool {
	for _, v := range s.c {
		if v != (samples{}) {
			return false
		}
	}
	return true
}

// sign is the sign of s as ε → 0+.
func (s series) sign() int {
	v, _ := s.lead()
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}

// lead returns the mean of the lowest-order non-zero coefficient and its
// order.
func (s series) lead() (float64, int) {
	for i, v := range s.c {
		if v != (samples{}) {
			return v.mean(), s.lo + i
		}
	}
	return 0, 0
}

// at returns the coefficient of ε^k and the size of its terms.
func (s series) at(k int) (samples, float64) {
	i := k - s.lo
	if i < 0 || i >= len(s.c) {
		return samples{}, 0
	}
	return s.c[i], s.m[i]
}

// norm clears computational zeros and shifts s so that c[0] is its
// lowest non-zero term.
func (ar arith) norm(s series) series {
	firstDoubt := len(s.c)
	for i, v := range s.c {
		mean := math.Abs(v.mean())
		switch {
		case !(mean <= math.MaxFloat64):
			*ar.overflow = true
		case mean <= roundingUlps*unit*s.m[i]:
			s.c[i], s.m[i] = samples{}, 0
		case v.isZero():
			if mean > lossLimit*s.m[i] && i < firstDoubt {
				firstDoubt = i
			}
			s.c[i], s.m[i] = samples{}, 0
		}
	}
	f := 0
	for f < len(s.c) && s.c[f] == (samples{}) {
		f++
	}
	if firstDoubt < f {
		s.doubtful = true
	}
	if f == len(s.c) {
		s.lo = 0
		return s
	}
	if f > 0 {
		copy(s.c, s.c[f:])
		copy(s.m, s.m[f:])
		clear(s.c[len(s.c)-f:])
		clear(s.m[len(s.m)-f:])
		s.lo += f
	}
	return s
}

func (ar arith) sub(a, b series) series {
	lo := min(a.lo, b.lo)
	if a.isZero() {
		lo = b.lo
	} else if b.isZero() {
		lo = a.lo
	}
	r := ar.zero()
	r.lo = lo
	r.doubtful = a.doubtful || b.doubtful
	for i := range r.c {
		x, _ := a.at(lo + i)
		y, _ := b.at(lo + i)
		for k := range x {
			r.c[i][k] = x[k] - y[k]
		}
		r.m[i] = math.Abs(x.mean()) + math.Abs(y.mean())
	}
	return ar.norm(r)
}

func (ar arith) mul(a, b series) series {
	r := ar.zero()
	if a.isZero() || b.isZero() {
		return r
	}
	r.lo = a.lo + b.lo
	r.doubtful = a.doubtful || b.doubtful
	for n := range r.c {
		for i := 0; i <= n; i++ {
			x, y := a.c[i], b.c[n-i]
			for k := range x {
				r.c[n][k] += x[k] * y[k]
			}
			r.m[n] += math.Abs(x.mean() * y.mean())
		}
	}
	return ar.norm(r)
}

// div returns a/b by long division of series; b must not be zero.
func (ar arith) div(a, b series) series {
	r := ar.zero()
	if a.isZero() {
		return r
	}
	r.lo = a.lo - b.lo
	r.doubtful = a.doubtful || b.doubtful
	b0 := math.Abs(b.c[0].mean())
	for n := range r.c {
		v, m := a.c[n], math.Abs(a.c[n].mean())
		for j := 1; j <= n; j++ {
			for k := range v {
				v[k] -= b.c[j][k] * r.c[n-j][k]
			}
			m += math.Abs(b.c[j].mean() * r.c[n-j].mean())
		}
		for k := range v {
			r.c[n][k] = v[k] / b.c[0][k]
		}
		r.m[n] = m / b0
	}
	return ar.norm(r)
}
