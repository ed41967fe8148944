package margins

import (
	"fmt"
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
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

// circlePoint returns cos and sin of ωT, exactly (−1, 0) at ω = π/T so
// that the top end of a scan lies on the real axis, where L is real.
func (l SampledLoop) circlePoint(w float64) (c, s float64) {
	if w == l.Nyquist() {
		return -1, 0
	}
	s, c = math.Sincos(w * l.T)
	return c, s
}

// evalCircle returns p(c + j·s) by Horner's rule in complex arithmetic
// written out in reals. For |c + j·s| = 1 its error is about n units in
// the last place of Σ|p_k|, which is large relative to |p| only where p
// is small on the circle: near a root on or close to it, or, for fast
// sampling, near z = 1 where the roots crowd (about T^−n times the unit
// roundoff for n roots within about T of z = 1).
func evalCircle(p poly.Poly, c, s float64) (re, im float64) {
	for k := len(p) - 1; k >= 0; k-- {
		re, im = re*c-im*s+p[k], re*s+im*c
	}
	return re, im
}

// At returns L(e^(jωT)); an infinite value at a pole on the circle.
func (l SampledLoop) At(w float64) complex128 {
	c, s := l.circlePoint(w)
	nr, ni := evalCircle(l.Num, c, s)
	dr, di := evalCircle(l.Den, c, s)
	if dr == 0 && di == 0 {
		return complex(math.Inf(1), math.Inf(1))
	}
	return complex(nr, ni) / complex(dr, di)
}

func (l SampledLoop) point(w float64) point {
	c, s := l.circlePoint(w)
	nr, ni := evalCircle(l.Num, c, s)
	dr, di := evalCircle(l.Den, c, s)
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
func (l SampledLoop) ends() (s0, t0, sTop, tTop float64) {
	at := func(z float64) (s, t float64) {
		n, d := l.Num.EvalReal(z), l.Den.EvalReal(z)
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
func (l SampledLoop) top() float64 { return l.Nyquist() }

// endPhaseCrossings implements response: at z = 1 and at z = −1, L is
// real; where it is finite, non-zero and negative, the phase is −180°.
// A crossover at z = −1 is where a real closed-loop root would leave the
// circle through z = −1 if the gain rose (or fell) by the margin.
func (l SampledLoop) endPhaseCrossings() (zero, top []Crossing) {
	at := func(z, w float64) []Crossing {
		n, d := l.Num.EvalReal(z), l.Den.EvalReal(z)
		if d != 0 && n != 0 && n/d < 0 {
			return []Crossing{{Freq: w, Margin: math.Abs(d / n)}}
		}
		return nil
	}
	return at(1, 0), at(-1, l.Nyquist())
}

// equivalentRoots returns the roots of Num, Den and Den + Num mapped to
// their continuous-time equivalents ln(z)/T (principal branch), leaving
// out roots at z = 0, which have none.
func (l SampledLoop) equivalentRoots() []complex128 {
	var out []complex128
	for _, p := range []poly.Poly{l.Num, l.Den, l.Characteristic()} {
		r, err := p.Trim(0).Roots()
		if err != nil {
			continue
		}
		for _, z := range r {
			if z != 0 {
				out = append(out, cmplx.Log(z)/complex(l.T, 0))
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
	roots = l.equivalentRoots()
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
	return measure(l, scanGrid(lo, hi, roots)), nil
}
