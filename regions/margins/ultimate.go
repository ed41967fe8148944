package margins

import (
	"math"
	"math/cmplx"
	"slices"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Ultimate returns the ultimate gain ku and ultimate period tu (seconds) of
// the plant N/D under proportional control u = k·e: the smallest k > 0 at
// which the closed loop, stable just below k, loses stability through a
// pair of poles crossing the imaginary axis at ±jω_u, with tu = 2π/ω_u.
//
// Method (exact, no search): the characteristic polynomial D + k·N is
// affine in k, and a pole at jω > 0 requires D(jω) + k·N(jω) = 0, so
// k = −D(jω)/N(jω) must be real:
//
//	Im(D(jω)·conj N(jω)) = Di·Nr − Dr·Ni = 0,
//
// where p(jω) = Pr(ω) + j·Pi(ω) splits p into its even part Pr and odd
// part Pi. That expression is an odd polynomial in ω; divided by ω it is a
// polynomial in x = ω² whose real positive roots (gonum eigenvalues,
// polished by Newton's method) are the candidate frequencies, each with
// gain k = −Re(D(jω)·conj N(jω))/|N(jω)|², kept when positive. The gains
// where a real pole crosses at s = 0 (k = −D(0)/N(0)) or the degree drops
// (k = −d_n/n_n when N and D have the same degree) split the positive k
// axis too. Between consecutive candidate gains the number of unstable
// poles is constant; each interval is tested once, at its midpoint, with
// the stability test given. The
// ultimate gain is the first oscillatory candidate with a stable interval
// just below it and an unstable one just above it (a pair that only
// touches the axis is not a loss of stability).
//
// ok is false when there is no such gain: plants of first or second order
// with no zeros (the root locus never reaches the axis), plants whose loop
// is never stable for k > 0, plants for which stability is lost only
// through s = 0 or through infinity (no sustained oscillation), or
// coefficients that are not finite.
func Ultimate(plantNum, plantDen poly.Poly, test stability.Test) (ku, tu float64, ok bool) {
	num, den := plantNum.Clone().Trim(0), plantDen.Clone().Trim(0)
	if !num.Finite() || !den.Finite() || num.Degree() < 0 || den.Degree() < 0 {
		return 0, 0, false
	}
	dr, di := splitJW(den)
	nr, ni := splitJW(num)
	q := poly.Sub(poly.Mul(di, nr), poly.Mul(dr, ni)) // odd in ω
	qx := make(poly.Poly, 0, len(q)/2)
	for j := 1; j < len(q); j += 2 {
		qx = append(qx, q[j])
	}
	qx = qx.Trim(poly.RelTol)

	var cs []cand
	if qx.Degree() > 0 {
		xs, err := qx.Roots()
		if err == nil {
			for _, x := range xs {
				if real(x) <= 0 || math.Abs(imag(x)) > 1e-7*cmplx.Abs(x) {
					continue
				}
				w := math.Sqrt(qx.PolishReal(real(x)))
				a, b := evalJW(den, w)
				c, d := evalJW(num, w)
				n2 := c*c + d*d
				if n2 == 0 {
					continue
				}
				if k := -(a*c + b*d) / n2; k > 0 && !math.IsInf(k, 0) {
					cs = append(cs, cand{k, w})
				}
			}
		}
	}
	if n0 := num.EvalReal(0); n0 != 0 {
		if k := -den.EvalReal(0) / n0; k > 0 {
			cs = append(cs, cand{k, 0})
		}
	}
	if dn, dd := num.Degree(), den.Degree(); dn == dd {
		if k := -den[dd] / num[dn]; k > 0 {
			cs = append(cs, cand{k, 0})
		}
	}
	k, w, ok := firstLoss(cs, stabilityTester{num: num, den: den, test: test})
	if !ok {
		return 0, 0, false
	}
	return k, 2 * math.Pi / w, true
}

// cand is a gain at which a root of the proportional-only loop reaches
// the stability boundary: with w > 0 the frequency of an oscillatory
// crossing, 0 for one that is not (through s = 0, z = 1 or infinity).
type cand struct {
	k, w float64
}

// firstLoss returns the first oscillatory candidate gain at which the
// loop, stable just below it, is unstable just above it, with its
// frequency; ok is false when there is none. Between consecutive
// candidates the count of unstable roots is constant, so each piece is
// tested once.
func firstLoss(cs []cand, st stabilityTester) (k, w float64, ok bool) {
	if len(cs) == 0 {
		return 0, 0, false
	}
	slices.SortFunc(cs, func(a, b cand) int {
		switch {
		case a.k < b.k:
			return -1
		case a.k > b.k:
			return 1
		}
		return 0
	})
	// Merge gains equal to rounding, keeping the lowest crossing frequency
	// of an oscillatory crossing.
	merged := cs[:1]
	for _, c := range cs[1:] {
		last := &merged[len(merged)-1]
		if c.k-last.k <= 1e-9*c.k {
			if c.w > 0 && (last.w == 0 || c.w < last.w) {
				last.w = c.w
			}
			continue
		}
		merged = append(merged, c)
	}
	prev := 0.0
	for i, c := range merged {
		below := 0.5 * (prev + c.k)
		above := 2 * c.k
		if i+1 < len(merged) {
			above = 0.5 * (c.k + merged[i+1].k)
		}
		prev = c.k
		if c.w == 0 {
			continue
		}
		if st.stable(below) && !st.stable(above) {
			return c.k, c.w, true
		}
	}
	return 0, 0, false
}

// splitJW returns polynomials in ω for the real and imaginary parts of
// p(jω): Re has the even coefficients of p with signs +, −, +, … and Im
// the odd ones with signs +, −, +, ….
func splitJW(p poly.Poly) (re, im poly.Poly) {
	re, im = make(poly.Poly, len(p)), make(poly.Poly, len(p))
	for k, c := range p {
		if k%4 >= 2 {
			c = -c
		}
		if k%2 == 0 {
			re[k] = c
		} else {
			im[k] = c
		}
	}
	return re, im
}

// stabilityTester decides whether D + k·N is stable.
type stabilityTester struct {
	num, den poly.Poly
	test     stability.Test
	buf      poly.Poly
	counter  stability.Counter
}

func (s *stabilityTester) stable(k float64) bool {
	n := max(len(s.num), len(s.den))
	if len(s.buf) != n {
		s.buf = make(poly.Poly, n)
		s.counter = s.test.NewCounter(n)
	}
	clear(s.buf)
	copy(s.buf, s.den)
	for i, v := range s.num {
		s.buf[i] += k * v
	}
	c := s.buf.Trim(0)
	return len(c) == n && s.counter.Count(stability.Function{P: c}).Stable()
}
