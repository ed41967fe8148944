package margins

import (
	"fmt"
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
	"gainscape/regions/unitcircle"
)

// response is what the crossover and peak scans of measure need of a
// loop: its open loop at a frequency, the values at the two ends of the
// frequency range, and the phase crossovers exactly at those ends. Loop
// (continuous time, ω ∈ [0, ∞)) and SampledLoop (ω ∈ [0, π/T]) are the
// two.
type response interface {
	point(w float64) point
	At(w float64) complex128
	// ends returns |S| and |T| at ω = 0 and at the top end.
	ends() (s0, t0, sTop, tTop float64)
	// top is the frequency of the top end.
	top() float64
	// endPhaseCrossings returns the phase crossovers at ω = 0 and at the
	// top end, where L is real.
	endPhaseCrossings() (zero, top []Crossing)
}

// SampledLoop is the open loop L(z) = Num(z)/Den(z) of a unity
// negative-feedback loop sampled every T time units, Num = Nc·N and
// Den = Dc·D in ascending powers of z. Its frequency response is L on the
// unit circle, z = e^(jωT), for 0 ≤ ω ≤ π/T: beyond π/T it repeats
// (mirrored), so the range ends there instead of at infinity. Num and
// Den are expected to have no common root on the circle.
type SampledLoop struct {
	Num, Den poly.Poly
	T        float64
}

// Nyquist returns π/T, the top of the sampled loop's frequency range.
func (l SampledLoop) Nyquist() float64 { return math.Pi / l.T }

// Characteristic returns Den + Num, whose roots are the closed-loop poles
// in z.
func (l SampledLoop) Characteristic() poly.Poly { return poly.Add(l.Den, l.Num) }

// angle returns ωT, exactly π at ω = π/T so that the top end of a scan
// lies on the real axis, where L is real.
func (l SampledLoop) angle(w float64) float64 {
	if w == l.Nyquist() {
		return math.Pi
	}
	return w * l.T
}

// circlePoly is a polynomial in z ready to be evaluated on the unit
// circle: with its Taylor coefficients at z = 1 and z = −1
// (unitcircle.Shift) beside its own.
type circlePoly struct{ p, at1, atM1 poly.Poly }

func newCirclePoly(p poly.Poly) circlePoly {
	c := circlePoly{p: p, at1: make(poly.Poly, len(p)), atM1: make(poly.Poly, len(p))}
	unitcircle.Shift(c.at1, p, 1)
	unitcircle.Shift(c.atM1, p, -1)
	return c
}

// Zones of the circle, by which expansion a point is evaluated.
const (
	zoneDirect   = iota // powers of z
	zoneOne             // powers of δ = z − 1, for θ < π/3
	zoneMinusOne        // powers of ε = z + 1, for θ > 2π/3
)

// circleBase returns the zone of the angle θ ∈ [0, π] and the point of
// its expansion: z = e^(jθ), δ = e^(jθ) − 1 = −2·sin²(θ/2) + j·sin θ or
// ε = e^(jθ) + 1 = 2·cos²(θ/2) + j·sin θ, each formed without
// cancellation (ε = 0 exactly at θ = π).
func circleBase(theta float64) (zone int, re, im float64) {
	switch {
	case theta == math.Pi:
		return zoneMinusOne, 0, 0
	case theta < math.Pi/3:
		h := math.Sin(theta / 2)
		return zoneOne, -2 * h * h, math.Sin(theta)
	case theta > 2*math.Pi/3:
		h := math.Cos(theta / 2)
		return zoneMinusOne, 2 * h * h, math.Sin(theta)
	}
	s, c := math.Sincos(theta)
	return zoneDirect, c, s
}

// eval returns p(e^(jθ)) by Horner's rule in the expansion of θ's zone.
// Far from z = ±1 the plain powers of z serve; near them the Taylor
// expansion about the nearer of the two keeps the digits that the roots
// crowding there (a loop sampled fast) would cancel: its error is about n
// units in the last place of Σ|q_k|·|δ|^k, which shrinks with |δ| as the
// value does.
func (c circlePoly) eval(theta float64) (re, im float64) {
	zone, br, bi := circleBase(theta)
	q := c.p
	switch zone {
	case zoneOne:
		q = c.at1
	case zoneMinusOne:
		q = c.atM1
	}
	for k := len(q) - 1; k >= 0; k-- {
		re, im = re*br-im*bi+q[k], re*bi+im*br
	}
	return re, im
}

// At returns L(e^(jωT)); an infinite value at a pole on the circle.
func (l SampledLoop) At(w float64) complex128 { return l.prepared().At(w) }

// prepared returns the loop ready for many evaluations on the circle.
func (l SampledLoop) prepared() sampledResponse {
	return sampledResponse{SampledLoop: l, num: newCirclePoly(l.Num), den: newCirclePoly(l.Den)}
}

// sampledResponse implements response for a SampledLoop.
type sampledResponse struct {
	SampledLoop
	num, den circlePoly
}

func (r sampledResponse) At(w float64) complex128 {
	th := r.angle(w)
	nr, ni := r.num.eval(th)
	dr, di := r.den.eval(th)
	if dr == 0 && di == 0 {
		return complex(math.Inf(1), math.Inf(1))
	}
	return complex(nr, ni) / complex(dr, di)
}

func (r sampledResponse) point(w float64) point {
	th := r.angle(w)
	nr, ni := r.num.eval(th)
	dr, di := r.den.eval(th)
	return pointOf(nr, ni, dr, di)
}

// pointOf is the scan point of L = N/D from the real and imaginary parts
// of N and D.
func pointOf(nr, ni, dr, di float64) point {
	an, ad := math.Hypot(nr, ni), math.Hypot(dr, di)
	ac := math.Hypot(dr+nr, di+ni)
	return point{
		sinPh: (ni*dr - nr*di) / (an * ad),
		reL:   nr*dr + ni*di,
		logM:  math.Log(an) - math.Log(ad),
		s:     ad / ac,
		t:     an / ac,
	}
}

// ends implements response: |S| and |T| at z = 1 (ω = 0) and z = −1
// (ω = π/T), NaN where Num and Den both vanish.
func (r sampledResponse) ends() (s0, t0, sTop, tTop float64) {
	at := func(z float64) (s, t float64) {
		n, d := r.valuesAt(z)
		if n == 0 && d == 0 {
			return math.NaN(), math.NaN()
		}
		c := math.Abs(n + d)
		return math.Abs(d) / c, math.Abs(n) / c
	}
	s0, t0 = at(1)
	sTop, tTop = at(-1)
	return
}

// top implements response.
func (r sampledResponse) top() float64 { return r.Nyquist() }

// valuesAt returns Num and Den at z = 1 or z = −1, the constant terms of
// their Taylor expansions there (summed as in twice the precision).
func (r sampledResponse) valuesAt(z float64) (n, d float64) {
	if z > 0 {
		return r.num.at1[0], r.den.at1[0]
	}
	return r.num.atM1[0], r.den.atM1[0]
}

// endPhaseCrossings implements response: at z = 1 and at z = −1, L is
// real; where it is finite, non-zero and negative, the phase is −180°.
// A crossover at z = −1 is where a real closed-loop root would leave the
// circle through z = −1 if the gain rose (or fell) by the margin.
func (r sampledResponse) endPhaseCrossings() (zero, top []Crossing) {
	at := func(z, w float64) []Crossing {
		n, d := r.valuesAt(z)
		if d != 0 && n != 0 && n/d < 0 {
			return []Crossing{{Freq: w, Margin: math.Abs(d / n)}}
		}
		return nil
	}
	return at(1, 0), at(-1, r.Nyquist())
}

// minEquivalent is the smallest magnitude, relative to π/T, of a
// continuous equivalent that sets the bottom of the scan: a root that the
// eigenvalues put within rounding of z = 1 (an integrator, 1 − 1e-16)
// would otherwise stretch the scan over a dozen empty decades.
const minEquivalent = 1e-9

// EquivalentRoots returns the roots of Num, Den and Den + Num mapped to
// their continuous-time equivalents ln(z)/T (principal branch), leaving
// out roots at z = 0, which have none, and those within rounding of z = 1
// (see minEquivalent).
func (l SampledLoop) EquivalentRoots() []complex128 {
	var out []complex128
	for _, p := range []poly.Poly{l.Num, l.Den, l.Characteristic()} {
		r, err := p.Trim(0).Roots()
		if err != nil {
			continue
		}
		for _, z := range r {
			if s := cmplx.Log(z) / complex(l.T, 0); z != 0 && cmplx.Abs(s) > minEquivalent*l.Nyquist() {
				out = append(out, s)
			}
		}
	}
	return out
}

// FrequencyRange returns the range that Margins scans: from 1e-3 times
// the smallest non-zero magnitude of the continuous equivalents ln(z)/T
// of the roots of Num, Den and Den + Num (or of π/T, if smaller) up to
// π/T.
func (l SampledLoop) FrequencyRange() (lo, hi float64) {
	lo, hi, _ = l.rangeAndRoots()
	return lo, hi
}

func (l SampledLoop) rangeAndRoots() (lo, hi float64, roots []complex128) {
	hi = l.Nyquist()
	roots = l.EquivalentRoots()
	lo = hi
	for _, r := range roots {
		if m := cmplx.Abs(r); m > 0 && m < lo {
			lo = m
		}
	}
	return 1e-3 * lo, hi, roots
}

// Margins computes the gain and phase margins, every crossover and the
// peaks Ms and Mt of the sampled loop, on 0 ≤ ω ≤ π/T, by the method of
// Loop.Margins with L(e^(jωT)) in place of L(jω): a logarithmic scan of
// FrequencyRange, enriched near the lightly damped continuous equivalents
// of the roots, each sign change refined by Brent's method and each peak
// by golden-section search. The two ends are exact: at ω = 0 (z = 1) and
// at ω = π/T (z = −1) L is real, so a negative L there is a phase
// crossover at that end; Ms and Mt take the values at both ends into
// account instead of the limit ω → ∞. Frequencies are in rad per time
// unit of T.
//
// It returns an error for non-finite coefficients, a zero Den, or a T
// that is not positive and finite.
func (l SampledLoop) Margins() (Margins, error) {
	if !(l.T > 0) || math.IsInf(l.T, 1) {
		return Margins{}, fmt.Errorf("margins: sample time %g is not positive and finite", l.T)
	}
	if !l.Num.Finite() || !l.Den.Finite() {
		return Margins{}, fmt.Errorf("margins: loop coefficients are not finite")
	}
	if l.Den.Degree() < 0 {
		return Margins{}, fmt.Errorf("margins: the loop denominator is zero")
	}
	lo, hi, roots := l.rangeAndRoots()
	return measure(l.prepared(), scanGrid(lo, hi, roots), math.Inf(1)), nil
}
