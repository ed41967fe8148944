package delay

import (
	"fmt"
	"math"

	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// Counter counts the roots of delay loops of one size, reusing its scratch
// space: Count allocates nothing. It is not safe for concurrent use; give
// each goroutine its own.
//
// Method. By the argument principle over the right half disc of radius
// R → ∞, with the conjugate symmetry of Δ, the number of right-half-plane
// roots is
//
//	N = n/2 − Θ/π,  Θ = the continuous change of arg Δ(jω), ω from 0 to ∞,
//
// n = deg P, when Δ has no imaginary-axis root and the loop is retarded or
// neutral with |q_n/p_n| < 1 (L. S. Pontryagin 1942; for the retarded case
// this is the closed formula of G. Stépán, Retarded Dynamical Systems,
// Longman 1989, Ch. 2). Θ is not tracked on a frequency grid, whose
// step would have to follow the rotation of e^(−jωL). Instead the axis is
// cut where |P(jω)| = |Q(jω)|: the positive roots x = ω² of the polynomial
// E(x) = |P(jω)|² − |Q(jω)|², whose coefficients are formed exactly from
// those of P and Q. Between two cuts one part dominates strictly. Where P
// does, Δ = P·(1 + w) with |w| < 1, so 1 + w stays in the right half plane
// and the change of arg Δ is the change of arg P plus the difference of
// the principal values Arg(Δ/P) at the ends. Where Q does, it is the
// change of arg Q, minus L times the length of the band (the phase of
// e^(−jωL), exactly), plus the difference of Arg(Δ/(Q·e^(−jωL))). The
// phase of each polynomial is unwrapped exactly at the zeros of its
// imaginary part. Past the last cut P dominates, the asymptotic phase of
// Δ is that of P, and the end terms at R cancel between the axis and the
// arc. The cost depends on the degrees only, not on the delay or the
// gains.
//
// Roots on the axis lie where |P| = |Q| with Δ = 0 (or at s = 0). A cut
// where Δ(jω) is zero to within the rounding of its evaluation and of the
// cut itself counts a pair on the boundary, passed by an indentation into
// the right half plane, so that Unstable counts the roots strictly to the
// right; so does Δ(0) zero to within rounding, for s = 0.
//
// Neutral type: |q_n/p_n| > 1 gives infinitely many right-half-plane roots
// (InfinitelyMany). |q_n/p_n| = 1 to within rounding is the neutral
// boundary: Infinite is 1, and the chain of roots approaches the axis from
// the side the next coefficient of E decides (from the right:
// InfinitelyMany; from the left: the finite count). An advanced-type loop
// has InfinitelyMany.
//
// The verdict is Undecided only when rounding decides it: two roots meet
// on the axis (a multiple axis root or a tangency of |P| and |Q| with the
// phases opposed), P and Q share an imaginary-axis root, the side of the
// neutral root chain rests on a rounded coefficient, or the phase does not
// close to an integer count. Coefficients are scaled by powers of two in
// magnitude and frequency first, which is exact.
type Counter struct {
	max            int
	p, q           []float64 // scaled P and Q
	e, ea          []float64 // E and the magnitudes of its terms
	rp, ip, rq, iq []float64 // even and odd parts of P(jω), Q(jω) in x = ω²
	xs             []float64 // roots of E in x
	cross          []float64 // cuts, scaled frequencies
	zp, zq         []float64 // positive zeros of Im P(jω), Im Q(jω)
	typeQ          []bool    // band i is dominated by Q
	bandTheta      []float64 // change of arg Δ over band i, for reports
	atCut          []cut     // values at each cut
	sum            []float64 // P + Q for a loop without delay
	work           []float64 // sign-array scratch
	rf             *rootFinder
	res            result
}

// cut holds the values of the parts of Δ at one cut ω, where |P| = |Q|.
type cut struct {
	p, qe, d complex128 // P(jω), Q(jω)·e^(−jωL), Δ(jω)
	dd       complex128 // Δ'(jω), for boundary cuts
	boundary bool
	size     float64 // |Δ|/(|P| + |Q|)
}

// form is the type of a quasi-polynomial.
type form int8

const (
	unknown  form = iota // not reached: the input cannot be analysed
	rational             // no delayed part: the sign array decides
	retarded
	neutral
	advanced
)

// result is what one analysis found, in the scaled variables.
type result struct {
	v         stability.Verdict
	form      form
	rhoExp    int     // frequency scale ρ = 2^rhoExp: s = ρ·t
	delay     float64 // the delay in the scaled variable t
	n, nq     int     // degrees of the scaled P and Q
	degE      int     // degree of E
	ratio     float64 // |q_n/p_n| for neutral type
	onChain   bool    // on the neutral boundary
	zeroNear  bool    // Δ(0) is zero within rounding
	zeroRoots int     // exact roots at s = 0 (a factor s^z of P and Q)
	swept     bool    // the band table holds the last sweep
	theta     float64
	reason    string
	done      bool // v is final
}

// NewCounter returns a Counter for functions whose P and Q have at most n
// coefficients each.
func NewCounter(n int) *Counter {
	n = max(n, 1)
	half := n/2 + 1
	return &Counter{
		max: n,
		p:   make([]float64, n), q: make([]float64, n),
		e: make([]float64, n), ea: make([]float64, n),
		rp: make([]float64, half), ip: make([]float64, half),
		rq: make([]float64, half), iq: make([]float64, half),
		xs: make([]float64, 0, n), cross: make([]float64, 0, n),
		zp: make([]float64, 0, half), zq: make([]float64, 0, half),
		typeQ: make([]bool, n+1), bandTheta: make([]float64, n+1), atCut: make([]cut, n),
		sum:  make([]float64, n),
		work: make([]float64, routh.WorkLen(n)),
		rf:   newRootFinder(n),
	}
}

// Count returns the verdict for f. It allocates nothing, except where a
// loop without delay needs the full sign-array analysis.
func (c *Counter) Count(f stability.Function) stability.Verdict {
	c.analyse(f)
	return c.res.v
}

// roundTol is the relative size of the rounding in forming and evaluating
// the parts of Δ for polynomials of degree n: a few dozen units in the
// last place of the terms per coefficient.
func roundTol(n int) float64 { return 64 * float64(n+2) * unit }

func (r *result) undecided(reason string) {
	r.v = stability.Verdict{Unstable: stability.Undecided}
	r.reason, r.done = reason, true
}

// analyse fills c.res for f.
func (c *Counter) analyse(f stability.Function) {
	c.res = result{}
	r := &c.res
	if !c.prepare(f) {
		return
	}
	if r.form == advanced {
		r.v.Unstable, r.done = InfinitelyMany, true
		return
	}
	if r.form == neutral && r.ratio > 1 && !r.onChain {
		r.v.Unstable, r.done = InfinitelyMany, true
		return
	}
	if r.onChain && r.n == 0 {
		// p0 + q0·e^(−Ls) with |p0| = |q0|: every root is on the axis.
		r.v.Boundary, r.done = InfinitelyMany, true
		return
	}
	if c.typeQ[len(c.cross)] {
		// Past the last cut Q dominates: on the neutral boundary, the
		// root chain approaches the axis from the right.
		r.v.Unstable, r.done = InfinitelyMany, true
		return
	}
	c.sweep()
}

// sweep adds up Θ band by band and sets the count.
func (c *Counter) sweep() {
	r := &c.res
	theta := 0.0
	k := len(c.cross)
	for i := 0; i <= k; i++ {
		a, b := 0.0, math.Inf(1)
		if i > 0 {
			a = c.cross[i-1]
		}
		if i < k {
			b = c.cross[i]
		}
		q := c.typeQ[i]
		before := theta
		d, ok := c.polyArg(q, a, b)
		if !ok {
			r.undecided("P and Q share a root on the imaginary axis")
			return
		}
		theta += d
		if q {
			theta -= r.delay * (b - a)
		}
		start, ok := c.endTerm(q, i-1, true)
		end, ok2 := c.endTerm(q, i, false)
		if !ok || !ok2 {
			r.undecided("a root at s = 0 is multiple to within rounding")
			return
		}
		theta += end - start
		if i < k && c.atCut[i].boundary {
			theta += math.Pi
		}
		c.bandTheta[i] = theta - before
	}
	r.theta, r.swept = theta, true
	nr := float64(r.n)/2 - theta/math.Pi
	if r.zeroNear {
		nr -= 0.5
	}
	n := math.Round(nr)
	if math.Abs(nr-n) > 0.25 || n < 0 {
		r.undecided(fmt.Sprintf("the phase along the imaginary axis does not close to a whole count (%.3g)", nr))
		return
	}
	if n >= InfinitelyMany {
		n = InfinitelyMany
	}
	r.v.Unstable = int(n)
}

// endTerm returns Arg(Δ/F) at the start (cut index i, −1 for ω = 0) or
// the end (cut index i, len(cross) for ω = ∞) of a band dominated by
// F = P, or F = Q·e^(−jωL) when q is set. At a boundary cut it is the
// limit along the axis towards the cut, and at ω = 0 with Δ(0) = 0 the
// limit as ω → 0+.
func (c *Counter) endTerm(q bool, i int, start bool) (float64, bool) {
	r := &c.res
	switch {
	case i >= len(c.cross):
		return 0, true
	case i < 0:
		p, qq := c.scaledP(), c.scaledQ()
		f0 := p[0]
		if q {
			f0 = qq[0]
		}
		if !r.zeroNear {
			return argOf(complex((p[0]+qq[0])*f0, 0)), true
		}
		// Δ'(0) = p1 + q1 − L·q0.
		d1 := coef(p, 1) + coef(qq, 1) - r.delay*qq[0]
		size := math.Abs(coef(p, 1)) + math.Abs(coef(qq, 1)) + r.delay*math.Abs(qq[0])
		if math.Abs(d1) <= roundTol(r.n)*size {
			return 0, false
		}
		return math.Copysign(math.Pi/2, d1*f0), true
	}
	at := &c.atCut[i]
	f := at.p
	if q {
		f = at.qe
	}
	if !at.boundary {
		return argOf(at.d * conj(f)), true
	}
	// Δ(jω) ≈ j·Δ'(jω_c)·(ω − ω_c) next to the cut.
	dir := complex(0, 1) * at.dd
	if !start {
		dir = -dir
	}
	return argOf(dir * conj(f)), true
}

// coef returns p[k], or 0 past the end of p.
func coef(p []float64, k int) float64 {
	if k < len(p) {
		return p[k]
	}
	return 0
}

func conj(z complex128) complex128 { return complex(real(z), -imag(z)) }

func argOf(z complex128) float64 { return math.Atan2(imag(z), real(z)) }
