package margins

import (
	"encoding/json"
	"fmt"
	"math"

	"gainscape/regions/poly"
)

// Crossing is one crossover frequency with the margin it gives.
type Crossing struct {
	// Freq is the frequency in rad/s.
	Freq float64 `json:"freq"`
	// Margin is the gain margin (a factor) at a phase crossover, or the
	// phase margin (degrees) at a gain crossover.
	Margin float64 `json:"margin"`
}

// Margins are the classical robustness figures of one loop.
type Margins struct {
	// GainMargin is 1/|L(jω)| at the reported phase crossover, as a factor
	// (DB converts); +Inf when arg L never reaches −180°. With several
	// phase crossovers the reported one is the nearest to 0 dB, that is
	// the smallest |log GM|: the smallest margin whether it is exhausted
	// by raising the gain (GM > 1) or by lowering it (GM < 1, a
	// conditionally stable loop).
	GainMargin float64
	// PhaseCrossover is the frequency (rad/s) of GainMargin; NaN if none.
	PhaseCrossover float64
	// PhaseMargin is 180° + arg L(jω) at the reported gain crossover
	// (|L| = 1), in degrees, wrapped into (−180°, 180°]; +Inf when |L|
	// never equals 1. With several gain crossovers the reported one has
	// the smallest |PhaseMargin|.
	PhaseMargin float64
	// GainCrossover is the frequency (rad/s) of PhaseMargin; NaN if none.
	GainCrossover float64
	// PhaseCrossings lists every phase crossover (arg L = −180°, that is
	// Im L = 0 with Re L < 0), ascending, with its gain margin. A crossing
	// at ω = 0 (L(0) real negative) is included. A loop with dead time has
	// infinitely many: the lowest twelve are listed (see delay.go).
	PhaseCrossings []Crossing
	// GainCrossings lists every gain crossover (|L| = 1), ascending, with
	// its phase margin.
	GainCrossings []Crossing
	// Ms = max over ω ≥ 0 of |S(jω)|, S = 1/(1+L), and MsFreq where it
	// peaks; Mt = max |T(jω)|, T = L/(1+L), and MtFreq. A frequency of
	// +Inf means the supremum is the limit as ω → ∞ (for a strictly
	// proper L, |S| → 1). They are computed for unstable loops too, where
	// they mean little.
	Ms, MsFreq float64
	Mt, MtFreq float64
}

// DB returns 20·log10(x), the decibel value of a gain factor (+Inf for
// +Inf).
func DB(x float64) float64 { return 20 * math.Log10(x) }

// Finite reports whether x is an ordinary number: not ±Inf (an infinite
// margin) and not NaN (a frequency that does not exist).
func Finite(x float64) bool { return !math.IsInf(x, 0) && !math.IsNaN(x) }

// Nullable returns &x for a finite x and nil otherwise, so that
// encoding/json writes infinite margins and missing frequencies as null
// (it refuses ±Inf and NaN).
func Nullable(x float64) *float64 {
	if !Finite(x) {
		return nil
	}
	return &x
}

// MarshalJSON writes m with non-finite numbers as null. Infinite margins
// and frequencies become null too: a reader tells "infinite margin" from
// the null margin and "peak at ω → ∞" from a null frequency beside a
// non-null peak.
func (m Margins) MarshalJSON() ([]byte, error) {
	type cr struct {
		Freq   *float64 `json:"freq"`
		Margin *float64 `json:"margin"`
	}
	list := func(cs []Crossing) []cr {
		out := make([]cr, len(cs))
		for i, c := range cs {
			out[i] = cr{Nullable(c.Freq), Nullable(c.Margin)}
		}
		return out
	}
	return json.Marshal(struct {
		GainMargin     *float64 `json:"gain_margin"`
		GainMarginDB   *float64 `json:"gain_margin_db"`
		PhaseCrossover *float64 `json:"phase_crossover"`
		PhaseMargin    *float64 `json:"phase_margin_deg"`
		GainCrossover  *float64 `json:"gain_crossover"`
		PhaseCrossings []cr     `json:"phase_crossings"`
		GainCrossings  []cr     `json:"gain_crossings"`
		Ms             *float64 `json:"ms"`
		MsFreq         *float64 `json:"ms_freq"`
		Mt             *float64 `json:"mt"`
		MtFreq         *float64 `json:"mt_freq"`
	}{
		Nullable(m.GainMargin), Nullable(DB(m.GainMargin)), Nullable(m.PhaseCrossover),
		Nullable(m.PhaseMargin), Nullable(m.GainCrossover),
		list(m.PhaseCrossings), list(m.GainCrossings),
		Nullable(m.Ms), Nullable(m.MsFreq), Nullable(m.Mt), Nullable(m.MtFreq),
	})
}

// Tolerances of the crossover search.
const (
	// rootTol is the relative tolerance in ω to which each bracket is
	// refined by Brent's method.
	rootTol = 1e-12
	// residualTol is the largest |sin(arg L + 180°)| (phase) or |ln|L||
	// (gain) accepted at a refined crossing. A bracket whose sign change
	// comes from a jump (a pole or zero on the imaginary axis inside it)
	// converges to the jump, where the residual is large, and is dropped.
	residualTol = 1e-6
)

// Margins computes gain and phase margins, every crossover, and the peaks
// Ms and Mt.
//
// Crossovers: the frequencies of FrequencyRange are scanned on a
// logarithmic grid of 100 points per decade, enriched with points across
// the resonance of every root of Num, Den or Den+Num whose damping is
// below 0.3. Phase crossovers are sign changes of
// sin(arg L) = Im(N·conj D)/(|N||D|) with Re L < 0; gain crossovers are
// sign changes of ln|L| = ln|N| − ln|D|. Both functions are continuous
// wherever N(jω) and D(jω) are non-zero, so every sign change brackets a
// crossing, which Brent's method refines to 1e-12 relative in ω. A
// crossing where the function touches zero without changing sign (a
// tangency) is not found, nor one beyond the scanned range; and a band on
// which the phase stays exactly at −180° (as for k/s²) is not a crossing.
//
// Peaks: |S| and |T| are evaluated as |Den|/|Den+Num| and |Num|/|Den+Num|
// on the same grid, which stays finite for integrators (S → 0 and T → 1 as
// ω → 0 when Den(0) = 0), and at the two ends ω = 0 and ω → ∞ exactly.
// Each interior local maximum of the grid values is refined by
// golden-section search in ln ω on the bracket formed by its two
// neighbouring grid points, to 1e-10 in ln ω; the largest of the refined
// peaks and the two ends is reported.
//
// A loop with dead time is scanned on a finer grid, and its phase
// crossovers are listed only up to a frequency past which they no longer
// matter: see Loop.Delay's notes in delay.go.
//
// It returns an error for non-finite coefficients, a zero Den or a dead
// time that is negative or not finite.
func (l Loop) Margins() (Margins, error) {
	if !l.Num.Finite() || !l.Den.Finite() {
		return Margins{}, fmt.Errorf("margins: loop coefficients are not finite")
	}
	if l.Den.Degree() < 0 {
		return Margins{}, fmt.Errorf("margins: the loop denominator is zero")
	}
	if !(l.Delay >= 0) || math.IsInf(l.Delay, 1) {
		return Margins{}, fmt.Errorf("margins: the dead time %g is not a finite non-negative number", l.Delay)
	}
	lo, hi, roots := l.rangeAndRoots()
	w, top := l.scan(lo, hi, roots)
	m := measure(l, w, top)
	m.PhaseCrossings = l.listed(m.PhaseCrossings)
	return m, nil
}

// measure scans the response r on the frequencies w (ascending) for its
// crossovers and peaks, as Loop.Margins describes; phase crossovers above
// top (+Inf: none) are not taken.
func measure(r response, w []float64, top float64) Margins {
	ev := make([]point, len(w))
	for i, x := range w {
		ev[i] = r.point(x)
	}
	m := Margins{
		GainMargin: math.Inf(1), PhaseCrossover: math.NaN(),
		PhaseMargin: math.Inf(1), GainCrossover: math.NaN(),
	}
	m.PhaseCrossings = below(phaseCrossings(r, w, ev), top)
	m.GainCrossings = gainCrossings(r, w, ev)
	for _, c := range m.PhaseCrossings {
		if math.Abs(math.Log(c.Margin)) < math.Abs(math.Log(m.GainMargin)) {
			m.GainMargin, m.PhaseCrossover = c.Margin, c.Freq
		}
	}
	for _, c := range m.GainCrossings {
		if math.Abs(c.Margin) < math.Abs(m.PhaseMargin) {
			m.PhaseMargin, m.GainCrossover = c.Margin, c.Freq
		}
	}
	m.Ms, m.MsFreq = peak(r, w, ev, false)
	m.Mt, m.MtFreq = peak(r, w, ev, true)
	return m
}

// point holds what the scan needs at one frequency.
type point struct {
	sinPh float64 // sin(arg L): Im(N·conj D)/(|N||D|); NaN where N or D vanish
	reL   float64 // sign carrier of Re L: Re(N·conj D)
	logM  float64 // ln|L|
	s, t  float64 // |S|, |T|
}

func (l Loop) point(w float64) point {
	return pointOf(l.response(w))
}

// phaseCrossings finds every ω with arg L = −180°.
func phaseCrossings(r response, w []float64, ev []point) []Crossing {
	out, top := r.endPhaseCrossings()
	f := func(x float64) float64 { return r.point(x).sinPh }
	for _, x := range signChanges(w, ev, func(p point) float64 { return p.sinPh }, f) {
		p := r.point(x)
		if math.Abs(p.sinPh) <= residualTol && p.reL < 0 {
			out = append(out, Crossing{Freq: x, Margin: math.Exp(-p.logM)})
		}
	}
	return append(out, top...)
}

// endPhaseCrossings implements response: ω = 0 is a phase crossover when
// L(0) is real, finite, non-zero and negative.
func (l Loop) endPhaseCrossings() (zero, top []Crossing) {
	if n0, d0 := l.Num.EvalReal(0), l.Den.EvalReal(0); d0 != 0 && n0 != 0 && n0/d0 < 0 {
		zero = []Crossing{{Freq: 0, Margin: math.Abs(d0 / n0)}}
	}
	return zero, nil
}

// gainCrossings finds every ω with |L| = 1.
func gainCrossings(r response, w []float64, ev []point) []Crossing {
	var out []Crossing
	f := func(x float64) float64 { return r.point(x).logM }
	for _, x := range signChanges(w, ev, func(p point) float64 { return p.logM }, f) {
		if math.Abs(f(x)) > residualTol {
			continue
		}
		lj := r.At(x)
		pm := 180 + math.Atan2(imag(lj), real(lj))*180/math.Pi
		if pm > 180 {
			pm -= 360
		}
		out = append(out, Crossing{Freq: x, Margin: pm})
	}
	return out
}

// signChanges returns, ascending, the zeros of f bracketed by consecutive
// grid values of opposite sign (get reads the value from a grid point),
// each refined by Brent's method. A value exactly zero at a grid point
// between two values of opposite sign is a zero there. Non-finite values
// break the chain of comparisons.
func signChanges(w []float64, ev []point, get func(point) float64, f func(float64) float64) []float64 {
	var out []float64
	for i := 0; i+1 < len(w); i++ {
		a, b := get(ev[i]), get(ev[i+1])
		if !Finite(a) || !Finite(b) {
			continue
		}
		switch {
		case a*b < 0:
			out = append(out, brent(f, w[i], w[i+1], a, b))
		case b == 0 && a != 0 && i+2 < len(w):
			if c := get(ev[i+2]); Finite(c) && c*a < 0 {
				out = append(out, w[i+1])
			}
		}
	}
	return out
}

// brent returns a zero of f in [a, b], where fa = f(a) and fb = f(b) have
// opposite signs, to a relative tolerance rootTol in the abscissa: Brent's
// method (R. P. Brent, Algorithms for Minimization without Derivatives,
// 1973, ch. 4, procedure zero), which combines bisection, the secant rule
// and inverse quadratic interpolation and never does worse than bisection.
func brent(f func(float64) float64, a, b, fa, fb float64) float64 {
	c, fc := a, fa
	d := b - a
	e := d
	for it := 0; it < 200; it++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol := 2*0x1p-53*math.Abs(b) + 0.5*rootTol*math.Abs(b)
		m := 0.5 * (c - b)
		if math.Abs(m) <= tol || fb == 0 {
			return b
		}
		if math.Abs(e) >= tol && math.Abs(fa) > math.Abs(fb) {
			var p, q float64
			s := fb / fa
			if a == c {
				p = 2 * m * s
				q = 1 - s
			} else {
				q0 := fa / fc
				r := fb / fc
				p = s * (2*m*q0*(q0-r) - (b-a)*(r-1))
				q = (q0 - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < min(3*m*q-math.Abs(tol*q), math.Abs(e*q)) {
				e, d = d, p/q
			} else {
				d, e = m, m
			}
		} else {
			d, e = m, m
		}
		a, fa = b, fb
		if math.Abs(d) > tol {
			b += d
		} else if m > 0 {
			b += tol
		} else {
			b -= tol
		}
		fb = f(b)
	}
	return b
}

// peak returns the largest value of |S| (or of |T| when comp is set) over
// ω ≥ 0 and where it occurs: the grid's interior local maxima refined by
// golden-section search, and the exact values at ω = 0 and at the top
// end (ω → ∞, or π/T for a sampled loop).
func peak(r response, w []float64, ev []point, comp bool) (best, at float64) {
	get := func(p point) float64 { return p.s }
	if comp {
		get = func(p point) float64 { return p.t }
	}
	best, at = math.Inf(-1), math.NaN()
	for i, p := range ev {
		if v := get(p); v > best {
			best, at = v, w[i]
		}
	}
	f := func(lw float64) float64 { return get(r.point(math.Exp(lw))) }
	for i := 1; i+1 < len(ev); i++ {
		v := get(ev[i])
		if !(v > get(ev[i-1]) && v >= get(ev[i+1])) {
			continue
		}
		x, fx := goldenMax(f, math.Log(w[i-1]), math.Log(w[i+1]), 1e-10, 100)
		if fx > best {
			best, at = fx, math.Exp(x)
		}
	}
	s0, t0, s1, t1 := r.ends()
	zero, inf := s0, s1
	if comp {
		zero, inf = t0, t1
	}
	if zero > best || math.IsInf(zero, 1) {
		best, at = zero, 0
	}
	if inf > best {
		best, at = inf, r.top()
	}
	return best, at
}

// top implements response: the scan of a continuous-time loop ends at
// ω → ∞.
func (Loop) top() float64 { return math.Inf(1) }

// ends returns |S| and |T| at ω = 0 and in the limit ω → ∞. A value that
// is undefined (Num and Den both vanishing at 0) is NaN, which never wins a
// comparison.
func (l Loop) ends() (s0, t0, sInf, tInf float64) {
	n0, d0 := l.Num.EvalReal(0), l.Den.EvalReal(0)
	c0 := math.Abs(n0 + d0)
	s0, t0 = math.Abs(d0)/c0, math.Abs(n0)/c0
	if n0 == 0 && d0 == 0 {
		s0, t0 = math.NaN(), math.NaN()
	}
	sInf, tInf = limitWithDelay(l.Num, l.Den, l.Delay)
	return
}

// limitAtInfinity returns lim |S| and lim |T| as ω → ∞.
func limitAtInfinity(num, den poly.Poly) (s, t float64) {
	dn, dd := num.Degree(), den.Degree()
	switch {
	case dn < dd:
		return 1, 0
	case dn > dd:
		return 0, 1
	}
	a, b := den[dd], num[dn]
	c := math.Abs(a + b)
	return math.Abs(a) / c, math.Abs(b) / c
}

// goldenMax maximises f on [a, b] by golden-section search (J. Kiefer,
// 1953), shrinking the bracket by 0.618 per evaluation until it is at most
// tol wide or steps evaluations have been made. It returns the best
// abscissa evaluated and its value. f is assumed unimodal on [a, b]; if it
// is not, the result is still a value of f inside the bracket.
func goldenMax(f func(float64) float64, a, b, tol float64, steps int) (x, fx float64) {
	const g = 0.6180339887498949 // (√5 − 1)/2
	c, d := b-g*(b-a), a+g*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < steps && b-a > tol; i++ {
		if fc >= fd {
			b, d, fd = d, c, fc
			c = b - g*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + g*(b-a)
			fd = f(d)
		}
	}
	if fc >= fd {
		return c, fc
	}
	return d, fd
}
