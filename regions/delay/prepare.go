package delay

import (
	"fmt"
	"math"

	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// prepare scales f, forms E, finds the cuts and the values of Δ's parts
// there. It returns false when the verdict is already final (a loop
// without delay, or input no count can be given for).
func (c *Counter) prepare(f stability.Function) bool {
	r := &c.res
	if len(f.P) > c.max || len(f.Q) > c.max {
		panic(fmt.Sprintf("delay: Counter for %d coefficients given P with %d and Q with %d", c.max, len(f.P), len(f.Q)))
	}
	if !(f.Delay >= 0) || math.IsInf(f.Delay, 1) {
		r.undecided("the delay is not a finite non-negative number")
		return false
	}
	P, Q := trimTop(f.P), trimTop(f.Q)
	if !finite(P) || !finite(Q) {
		r.undecided("coefficients are not finite numbers")
		return false
	}
	switch {
	case len(Q) == 0:
		c.signArray(f.P)
		return false
	case f.Delay == 0:
		s := c.sum[:max(len(f.P), len(f.Q))]
		for k := range s {
			s[k] = coef(f.P, k) + coef(f.Q, k)
		}
		c.signArray(s)
		return false
	case len(P) == 0:
		// Δ = Q·e^(−Ls) has the roots of Q.
		c.signArray(Q)
		return false
	}
	// Exact zero leading coefficients of P are roots gone to infinity, as
	// the sign array counts a degree drop.
	r.v.Infinite = len(f.P) - len(P)
	// A common factor s^z of P and Q is exact: z roots at s = 0.
	z := 0
	for P[z] == 0 && Q[z] == 0 {
		z++
	}
	r.v.Boundary, r.zeroRoots = z, z
	P, Q = P[z:], Q[z:]
	n, m := len(P)-1, len(Q)-1
	switch {
	case m > n:
		r.form = advanced
	case m == n:
		r.form = neutral
	default:
		r.form = retarded
	}
	if !c.scale(P, Q, f.Delay) {
		r.undecided("the coefficients span more than double precision can scale")
		return false
	}
	p, q := c.p[:len(P)], c.q[:len(Q)]
	r.n = n
	tol := roundTol(n)
	if r.form == neutral {
		r.ratio = math.Abs(q[n]) / math.Abs(p[n])
		r.onChain = math.Abs(r.ratio-1) <= tol
		if r.onChain {
			r.v.Infinite++
		}
	}
	if math.Abs(p[0]+q[0]) <= tol*(math.Abs(p[0])+math.Abs(q[0])) {
		// Δ(0) is zero within rounding: count the root at s = 0 on the
		// boundary and make it exact, which moves P by rounding only.
		r.zeroNear = true
		r.v.Boundary++
		p[0] = -q[0]
	}
	c.formE(p, q)
	degE := max(len(p), len(q)) - 1
	if r.onChain {
		// |p_n| = |q_n|: the leading coefficient of E is rounding.
		c.e[degE] = 0
		degE--
		if degE >= 0 && math.Abs(c.e[degE]) <= tol*c.ea[degE] {
			r.undecided("on the neutral boundary, the side from which the chain of roots approaches the axis rests on rounding")
		}
	}
	for degE >= 0 && c.e[degE] == 0 {
		degE--
	}
	r.degE = degE
	c.xs = c.xs[:0]
	if degE > 0 {
		c.xs = c.rf.positive(c.e[:degE+1], c.xs)
	}
	c.cross = c.cross[:0]
	for _, x := range c.xs {
		c.cross = append(c.cross, math.Sqrt(x))
	}
	c.rp, c.ip = split(p, c.rp, c.ip)
	c.rq, c.iq = split(q, c.rq, c.iq)
	c.zp = c.zeros(c.ip, c.zp)
	c.zq = c.zeros(c.iq, c.zq)
	c.bandTypes(degE)
	c.evalCuts()
	if degE > 0 && len(c.rf.crit) > 0 {
		c.checkTangencies(degE)
	}
	return !r.done
}

// signArray sets the verdict for the polynomial p with the Routh sign
// array: the fast count, or the full analysis for its special cases.
func (c *Counter) signArray(p []float64) {
	r := &c.res
	r.form, r.done = rational, true
	rhp, zeros, st := routh.Count(p, c.work)
	switch st {
	case routh.Decided:
		r.v = stability.Verdict{Unstable: rhp, Boundary: zeros}
		return
	case routh.Undecidable:
		r.undecided("the sign array cannot be formed: the coefficients are zero or overflow")
		return
	}
	rep := routh.Analyze(p)
	if rep.Undecided {
		r.undecided(rep.Reason)
		return
	}
	r.v = stability.Verdict{Unstable: rep.RHP, Boundary: rep.JW, Infinite: rep.DegreeDrop}
}

// scale copies P and Q into c.p and c.q with s = ρ·t, ρ = 2^e chosen from
// the extreme coefficients of P so that its roots are of order one, and a
// common power of two that brings the largest coefficient near one. Both
// are exact. It falls back to ρ = 1 if the frequency scaling would
// overflow or underflow a coefficient.
func (c *Counter) scale(P, Q []float64, L float64) bool {
	n := len(P) - 1
	lo := 0
	for P[lo] == 0 {
		lo++
	}
	e := 0
	if n > lo {
		_, e1 := math.Frexp(P[lo])
		_, e2 := math.Frexp(P[n])
		e = int(math.Round(float64(e1-e2) / float64(n-lo)))
	}
	p, q := c.p[:len(P)], c.q[:len(Q)]
	for try := 0; try < 2; try++ {
		top := math.MinInt
		for _, f := range [2][]float64{P, Q} {
			for k, v := range f {
				if v != 0 {
					_, x := math.Frexp(v)
					top = max(top, x+k*e)
				}
			}
		}
		// Multiplying by powers of two is exact unless a value leaves the
		// range of normal numbers, which the check catches.
		ok := true
		step, m0 := math.Ldexp(1, e), math.Ldexp(1, -top)
		for _, pair := range [2][2][]float64{{P, p}, {Q, q}} {
			m := m0
			for k, v := range pair[0] {
				w := v * m
				pair[1][k] = w
				ok = ok && math.Abs(w) <= math.MaxFloat64 && (w == 0) == (v == 0) && (w == 0 || math.Abs(w) >= 0x1p-1022)
				m *= step
			}
		}
		if ok {
			c.res.nq = len(Q) - 1
			c.res.rhoExp = e
			c.res.delay = L * step
			return !math.IsInf(c.res.delay, 0) && c.res.delay > 0
		}
		e = 0
	}
	return false
}

// formE sets c.e to the coefficients of E(x) = |P(jω)|² − |Q(jω)|² in
// x = ω², and c.ea to the sums of the magnitudes of their terms. From
// P(jω)·P(−jω) = Σ p_i p_k j^(i+k) (−1)^k ω^(i+k), the coefficient of x^m
// is Σ over i + k = 2m of (−1)^(m+k) p_i p_k.
func (c *Counter) formE(p, q []float64) {
	for m := range max(len(p), len(q)) {
		vp, ap := magSquare(p, m)
		vq, aq := magSquare(q, m)
		c.e[m], c.ea[m] = vp-vq, ap+aq
	}
}

// magSquare returns the coefficient of x^m in |F(jω)|² and the sum of the
// magnitudes of its terms: f_m² + 2·Σ_(k<m) (−1)^(m+k) f_k f_(2m−k).
func magSquare(f []float64, m int) (v, mag float64) {
	fm := coef(f, m)
	v, mag = fm*fm, fm*fm
	for k := max(0, 2*m-(len(f)-1)); k < m; k++ {
		t := 2 * f[k] * f[2*m-k]
		mag += math.Abs(t)
		if (m+k)%2 == 1 {
			t = -t
		}
		v += t
	}
	return v, mag
}

// split returns the even and odd parts of F(jω) = R + jI as polynomials
// in x = ω²: R = re(x), I = ω·im(x), re_m = (−1)^m f_2m, im_m = (−1)^m
// f_(2m+1). Exact zero leading coefficients are trimmed.
func split(f []float64, re, im []float64) ([]float64, []float64) {
	re, im = re[:(len(f)+1)/2], im[:len(f)/2]
	for m := range re {
		re[m] = f[2*m]
		if m%2 == 1 {
			re[m] = -re[m]
		}
	}
	for m := range im {
		im[m] = f[2*m+1]
		if m%2 == 1 {
			im[m] = -im[m]
		}
	}
	return trimTop(re), trimTop(im)
}

// zeros returns the positive zeros ω of ω·im(ω²), ascending, in dst.
func (c *Counter) zeros(im []float64, dst []float64) []float64 {
	dst = dst[:0]
	if len(im) < 2 {
		return dst
	}
	dst = c.rf.positive(im, dst)
	for i, x := range dst {
		dst[i] = math.Sqrt(x)
	}
	return dst
}

// bandTypes sets typeQ for each band between cuts from the sign of E at
// its middle (in x), or of its leading coefficient past the last cut.
// Where E is within rounding of zero it compares |P| and |Q| directly.
func (c *Counter) bandTypes(degE int) {
	k := len(c.cross)
	e, ea := c.e[:max(degE+1, 0)], c.ea[:max(degE+1, 0)]
	for i := 0; i <= k; i++ {
		if i == k {
			c.typeQ[i] = degE < 0 || e[degE] < 0
			continue
		}
		lo := 0.0
		if i > 0 {
			lo = c.xs[i-1]
		}
		x := 0.5 * (lo + c.xs[i])
		v := horner(e, x)
		if math.Abs(v) > roundTol(c.res.n)*horner(ea, x) {
			c.typeQ[i] = v < 0
			continue
		}
		w := math.Sqrt(x)
		c.typeQ[i] = abs2(evalPart(c.rq, c.iq, w)) > abs2(evalPart(c.rp, c.ip, w))
	}
}

// evalCuts evaluates the parts of Δ at every cut and decides which cuts
// carry a root on the axis.
func (c *Counter) evalCuts() {
	r := &c.res
	tol := roundTol(r.n)
	p, q := c.scaledP(), c.scaledQ()
	for i, w := range c.cross {
		at := &c.atCut[i]
		s, co := math.Sincos(w * r.delay)
		ex := complex(co, -s)
		at.p = evalPart(c.rp, c.ip, w)
		qv := evalPart(c.rq, c.iq, w)
		at.qe = qv * ex
		at.d = at.p + at.qe
		at.boundary, at.dd = false, 0
		aP, aQ := magnitude(p, w), magnitude(q, w)
		ad := abs(at.d)
		at.size = ad / (aP + aQ)
		if at.size > 1e-6 {
			continue
		}
		jw := complex(0, w)
		at.dd = evalDeriv(p, jw) + (evalDeriv(q, jw)-complex(r.delay, 0)*qv)*ex
		// The cut itself is rounded: δx from the slope of E.
		x := w * w
		_, de := hornerDeriv(c.e[:r.degE+1], x)
		dx := 1e-6 * x
		if de != 0 {
			dx = math.Min(dx, tol*horner(c.ea[:r.degE+1], x)/math.Abs(de))
		}
		if ad > tol*(aP+aQ)+abs(at.dd)*dx/(2*w) {
			continue
		}
		at.boundary = true
		r.v.Boundary += 2
		if abs(at.dd) <= tol*(magnitudeDeriv(p, w)+magnitudeDeriv(q, w)+r.delay*aQ) {
			r.undecided("two roots meet on the imaginary axis to within rounding")
		}
	}
}

// checkTangencies looks at the extrema of E that touch zero within
// rounding: there |P| and |Q| meet without crossing, and if the phases are
// opposed as well two roots meet on the axis, which rounding decides.
func (c *Counter) checkTangencies(degE int) {
	r := &c.res
	tol := roundTol(r.n)
	for _, x := range c.rf.crit {
		if math.Abs(horner(c.e[:degE+1], x)) > tol*horner(c.ea[:degE+1], x) {
			continue
		}
		w := math.Sqrt(x)
		s, co := math.Sincos(w * r.delay)
		pv, qv := evalPart(c.rp, c.ip, w), evalPart(c.rq, c.iq, w)
		d := pv + qv*complex(co, -s)
		if abs(d) <= math.Sqrt(tol)*(magnitude(c.scaledP(), w)+magnitude(c.scaledQ(), w)) {
			r.undecided("two roots meet on the imaginary axis to within rounding")
			return
		}
	}
}

// scaledP returns the scaled P of the last analysis.
func (c *Counter) scaledP() []float64 { return c.p[:c.res.n+1] }

// scaledQ returns the scaled Q of the last analysis.
func (c *Counter) scaledQ() []float64 { return c.q[:c.res.nq+1] }
