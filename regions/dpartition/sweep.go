package dpartition

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
)

// Step control of the delay sweep. The functions whose sign changes mark
// the critical frequencies are sums of products of the parts' polynomials
// and of cos ωL, sin ωL (and, for the bilinear discriminant, of cos 2ωL,
// sin 2ωL). The step keeps ωL from moving more than phaseStep between two
// samples, and is at most polyStep times the distance from jω to the
// nearest root of a part, the scale on which a polynomial factor changes.
const (
	phaseStep = math.Pi / 16
	polyStep  = 0.2
)

// sweeper holds what the step control of a delay sweep needs.
type sweeper struct {
	delay float64
	roots []complex128 // non-zero roots of the parts
	scale float64      // a typical frequency of the parts, 1 if none
}

// addRoots records the non-zero roots of p for step control.
func (sw *sweeper) addRoots(p poly.Poly) error {
	if p.Degree() < 1 {
		return nil
	}
	rs, err := p.Roots()
	if err != nil {
		return err
	}
	for _, r := range rs {
		if r != 0 {
			sw.roots = append(sw.roots, r)
			sw.scale = math.Max(sw.scale, cmplx.Abs(r))
		}
	}
	return nil
}

// step returns the sweep step at ω.
func (sw *sweeper) step(omega float64) float64 {
	h := phaseStep / sw.delay
	for _, r := range sw.roots {
		h = math.Min(h, polyStep*cmplx.Abs(complex(0, omega)-r))
	}
	return math.Max(h, 1e-12*math.Max(omega, sw.scale))
}

// watcher evaluates at one frequency the functions a sweep watches.
type watcher func(f *freq, out []float64)

// sweep steps ω from 0 to end and returns every frequency where one of the
// n watched functions changes sign, located by bisection with false
// position to full precision, and every sample where one is exactly zero.
// A pair of sign changes closer together than one step is not seen: the
// limit of any sampled search, kept small by the step control.
func (sw *sweeper) sweep(watch watcher, n int, end float64) []float64 {
	var out []float64
	v0, v1, vm := make([]float64, n), make([]float64, n), make([]float64, n)
	f := newFreq(0, sw.delay)
	watch(&f, v0)
	for lo := 0.0; lo < end; {
		hi := math.Min(end, lo+sw.step(lo))
		f = newFreq(hi, sw.delay)
		watch(&f, v1)
		for i := range v1 {
			switch {
			case v1[i] == 0:
				out = append(out, hi)
			case v0[i] != 0 && (v0[i] < 0) != (v1[i] < 0):
				out = append(out, sw.refine(watch, vm, i, lo, hi, v0[i], v1[i]))
			}
			if v1[i] != 0 {
				v0[i] = v1[i]
			}
		}
		lo = hi
	}
	return out
}

// refine locates the sign change of function i in (lo, hi) by the
// Illinois variant of false position, halving every eighth step, until the
// bracket is a few units of rounding wide.
func (sw *sweeper) refine(watch watcher, v []float64, i int, lo, hi, flo, fhi float64) float64 {
	side := 0
	for it := 0; it < 200 && hi-lo > 4e-16*hi; it++ {
		m := (lo*fhi - hi*flo) / (fhi - flo)
		if !(m > lo && m < hi) || it%8 == 7 {
			m = lo + (hi-lo)/2
		}
		f := newFreq(m, sw.delay)
		watch(&f, v)
		fm := v[i]
		switch {
		case fm == 0:
			return m
		case (fm < 0) == (flo < 0):
			lo, flo = m, fm
			if side == -1 {
				fhi /= 2
			}
			side = -1
		default:
			hi, fhi = m, fm
			if side == 1 {
				flo /= 2
			}
			side = 1
		}
	}
	return lo + (hi-lo)/2
}

// branchBounds returns the frequencies ωL = 2πk below end, k ≥ 1.
func (sw *sweeper) branchBounds(end float64) []float64 {
	var out []float64
	for k := 1; ; k++ {
		b := 2 * math.Pi * float64(k) / sw.delay
		if b >= end {
			return out
		}
		out = append(out, b)
	}
}

// events is the number of functions the edge sweep watches.
const events = 9

// eventValues evaluates at f the functions whose sign changes mark a
// critical frequency of the edge: the leading coefficient and the
// discriminant of each quadratic (its denominator when it is linear), the
// quadratic at each window side, and, for a bilinear pencil, y₀ − y₁ of
// the two solutions in increasing x. The last catches the frequency where
// the two solutions pass through the same x at different y: the
// discriminant only touches zero there, without a sign change, while the
// order of the solutions in x swaps, so y₀ − y₁ jumps in sign. (For a
// rational loop the touching zero is a double root of the discriminant's
// polynomial, found with the others.)
func (pc *pencil) eventValues(f *freq, w window, out []float64) {
	k := 0
	for _, side := range [2]struct {
		q *quadratic
		r Range
	}{{&pc.x, w.x}, {&pc.y, w.y}} {
		v0, v1, v2 := side.q.values(f)
		if side.q.deg == 2 {
			out[k], out[k+1] = v2, v1*v1-4*v2*v0
		} else {
			out[k], out[k+1] = v1, 1
		}
		for i, s := range [2]float64{side.r.Min, side.r.Max} {
			out[k+2+i] = (v2*s+v1)*s + v0
		}
		k += 4
	}
	out[8] = 1
	if pc.sheets == 2 {
		var sols [2]solution
		if pc.solve(f, false, &sols) == 2 {
			out[8] = sols[0].y - sols[1].y
		}
	}
}

// delayCriticals returns the critical frequencies of a delay loop's edge in
// [0, end]: the sign changes of the watched functions (between two of
// them every solution keeps its count and stays inside the window or
// outside it), the branch boundaries, 0 and end.
func (pc *pencil) delayCriticals(w window, end float64) []float64 {
	out := pc.sweep(func(f *freq, v []float64) { pc.eventValues(f, w, v) }, events, end)
	out = append(out, pc.branchBounds(end)...)
	return dedupe(append(out, 0, end))
}

// frequencyBound returns Ω such that no complex edge of a delay loop meets
// the window at any ω > Ω, and whether such a bound exists.
//
// At a crossing, P(jω) = −Q(jω)·e^(−jωL), so |P(jω)| = |Q(jω)|. Let n be
// the degree of P. With p_k(x, y), q_k(x, y) the coefficients of s^k,
// bilinear in (x, y),
//
//	|P(jω)| − |Q(jω)| ≥ (|p_n| − |q_n|)·ωⁿ − Σ_{k<n} (|p_k| + |q_k|)·ω^k,
//
// where q_n = 0 for a retarded loop (deg Q < n). A bilinear function takes
// its extreme magnitudes over a rectangle at the corners (it is affine
// along each side and each line parallel to one), so over the window
// |p_n| ≥ μ_P, |q_n| ≤ μ_Q and |p_k| + |q_k| ≤ c_k with corner values. If
// μ = μ_P − μ_Q > 0 the right side is positive for every ω above the
// single positive root Ω of μ·ωⁿ = Σ c_k·ω^k (one sign change: Descartes),
// and no point of the window can be on the edge there. μ ≤ 0 happens only
// when p_n changes sign in the window (a root escapes to infinity: the
// delay-free degree drops) or, for a neutral loop, when |q_n/p_n| can reach
// 1 (a neutral-type edge); then the edge reaches arbitrarily high
// frequencies and there is no bound.
func frequencyBound(pr Problem) (float64, bool) {
	w := window{pr.X, pr.Y}
	n := pr.P.degree()
	mu := pr.P.coefficient(n).minAbs(w)
	if pr.Q.degree() == n {
		mu -= pr.Q.coefficient(n).maxAbs(w)
	}
	if !(mu > 0) {
		return 0, false
	}
	c := make([]float64, n)
	for k := range c {
		c[k] = (pr.P.coefficient(k).maxAbs(w) + pr.Q.coefficient(k).maxAbs(w)) / mu
	}
	// g(ω) = 1 − Σ c_k·ω^(k−n) increases with ω. At
	// hi = max_k (n·c_k)^(1/(n−k)) every term is at most 1/n, so g ≥ 0.
	g := func(om float64) float64 {
		s := 1.0
		for k, ck := range c {
			s -= ck * math.Pow(om, float64(k-n))
		}
		return s
	}
	hi := 0.0
	for k, ck := range c {
		if ck > 0 {
			hi = math.Max(hi, math.Pow(float64(n)*ck, 1/float64(n-k)))
		}
	}
	if hi == 0 {
		return 0, true
	}
	lo := 0.0
	for it := 0; it < 200 && hi-lo > 1e-15*hi; it++ {
		m := lo + (hi-lo)/2
		if g(m) >= 0 {
			hi = m
		} else {
			lo = m
		}
	}
	return hi, true
}
