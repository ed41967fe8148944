package margins

import (
	"fmt"
	"math"

	"gainscape/regions/poly"
)

// MsEvaluator computes Ms = max over ω of |1/(1+L(jω))| for many loops on
// one fixed logarithmic frequency grid, allocating nothing per call. It is
// meant for drawing Ms contours over maps of many nodes: build one for the
// map (NewMsEvaluator, with a range from Loop.FrequencyRange of a nominal
// loop, widened as needed) and call Ms at every node.
//
// Method: for every grid frequency ω_i the evaluator stores the real
// weights ω_i^k·σ_k, with σ_k = +1, +1, −1, −1, … for k = 0, 1, 2, 3, …,
// so that p(jω_i) = Σ_{k even} p_k·w_ik + j·Σ_{k odd} p_k·w_ik: one
// multiply-add per coefficient, with no complex arithmetic. |S|² =
// |Den|²/|Den+Num|² is compared on the grid without square roots; the
// largest grid value is then refined by Steps golden-section steps on the
// bracket of its two neighbouring grid points (Horner's rule off the
// grid), and compared with the exact values at ω = 0 and ω → ∞.
//
// Accuracy relative to Loop.Margins (which refines every local maximum to
// 1e-10 in ln ω on a grid of 100 points per decade): with the defaults (40
// points per decade, 12 steps) and a peak inside the evaluator's range,
// the largest relative difference seen on 300 random stable loops was
// 4e-6 (plant damping ≥ 0.1) and 3e-5 (plant damping ≥ 0.01); the tests
// require 1e-3. Its errors are one-sided: every value it compares is a
// value of |S|, so it never reports more than the supremum (up to
// rounding). It reports less when the peak lies outside [wmin, wmax]
// (except at ω = 0 and ω → ∞, which are evaluated exactly), when the peak
// is narrower than the grid spacing (a closed-loop pair of damping ζ makes
// a peak of relative width about 2ζ; 40 points per decade is a spacing of
// 6%), or when two peaks lie within a grid spacing of each other.
//
// An MsEvaluator is read-only after construction and safe for concurrent
// use by many goroutines.
type MsEvaluator struct {
	w      []float64 // grid frequencies, ascending
	lw     []float64 // ln w
	pw     []float64 // len(w)×stride weights: pw[i*stride+k] = ω_i^k·σ_k
	stride int       // largest coefficient count accepted
	steps  int       // golden-section steps
	// delay is the dead time of the loops, and rot[2i], rot[2i+1] the
	// cosine and sine of ω_i·delay (nil without dead time); see
	// NewMsEvaluatorDelay.
	delay float64
	rot   []float64
}

// DefaultMsPerDecade and DefaultMsSteps are the grid density and
// golden-section refinement suggested for NewMsEvaluator.
const (
	DefaultMsPerDecade = 40
	DefaultMsSteps     = 12
)

// NewMsEvaluator returns an evaluator on a logarithmic grid from wmin to
// wmax (rad/s, 0 < wmin < wmax) with perDecade points per decade, for
// loops whose Num and Den have at most maxLen coefficients each, refining
// the peak with steps golden-section steps. Each step shrinks the bracket
// (two grid spacings) by 0.618.
func NewMsEvaluator(wmin, wmax float64, perDecade, maxLen, steps int) (*MsEvaluator, error) {
	return NewMsEvaluatorNear(wmin, wmax, perDecade, maxLen, steps, nil)
}

// NewMsEvaluatorNear is NewMsEvaluator with the grid enriched near every
// lightly damped root in roots (damping below 0.3), as Margins enriches
// its own: a resonance of the plant puts a peak in |S| narrower than any
// affordable logarithmic spacing, and a grid that misses it reports too
// small an Ms. Pass the roots of the plant's numerator and denominator.
func NewMsEvaluatorNear(wmin, wmax float64, perDecade, maxLen, steps int, roots []complex128) (*MsEvaluator, error) {
	if !(wmin > 0 && wmax > wmin && !math.IsInf(wmax, 0)) {
		return nil, fmt.Errorf("margins: Ms grid needs 0 < wmin < wmax < Inf, have [%g, %g]", wmin, wmax)
	}
	if perDecade < 1 || maxLen < 1 || steps < 0 {
		return nil, fmt.Errorf("margins: Ms grid needs perDecade ≥ 1, maxLen ≥ 1, steps ≥ 0")
	}
	w := enrichedGrid(wmin, wmax, perDecade, roots)
	if len(w) < 3 {
		w = logGrid(wmin, wmax, 3)
	}
	return newMsGrid(w, maxLen, steps), nil
}

// newMsGrid returns an evaluator without dead time on the frequencies w.
func newMsGrid(w []float64, maxLen, steps int) *MsEvaluator {
	n := len(w)
	e := &MsEvaluator{
		w:      w,
		lw:     make([]float64, n),
		pw:     make([]float64, n*maxLen),
		stride: maxLen,
		steps:  steps,
	}
	for i, x := range e.w {
		e.lw[i] = math.Log(x)
		row := e.pw[i*maxLen : (i+1)*maxLen]
		pk := 1.0
		for k := range row {
			if k%4 >= 2 {
				row[k] = -pk
			} else {
				row[k] = pk
			}
			pk *= x
		}
	}
	return e
}

// Len returns the number of grid frequencies.
func (e *MsEvaluator) Len() int { return len(e.w) }

// Ms returns max over ω ≥ 0 of |Den(jω)/(Den(jω)+Num(jω))| for the loop
// L = num/den (with Num(jω)·e^(−jωL) for an evaluator built with a dead
// time L, NewMsEvaluatorDelay); +Inf when the closed loop has a pole on the grid or at
// ω = 0 exactly. It allocates nothing. It panics if num or den has more
// coefficients than the evaluator was built for.
func (e *MsEvaluator) Ms(num, den poly.Poly) float64 {
	ms, _ := e.Peak(num, den)
	return ms
}

// Peak is Ms with the grid frequency at which |S| was largest on the
// grid: Ms is at least |S| there, whatever the refinement added.
func (e *MsEvaluator) Peak(num, den poly.Poly) (ms, w float64) {
	if len(num) > e.stride || len(den) > e.stride {
		panic(fmt.Sprintf("margins: Ms called with %d and %d coefficients, evaluator built for %d", len(num), len(den), e.stride))
	}
	best, bi := -1.0, 0
	ln, ld := len(num), len(den)
	for i := range e.w {
		row := e.pw[i*e.stride : i*e.stride+e.stride]
		var nr, ni, dr, di float64
		k := 0
		for ; k+1 < ln; k += 2 {
			nr += num[k] * row[k]
			ni += num[k+1] * row[k+1]
		}
		if k < ln {
			nr += num[k] * row[k]
		}
		k = 0
		for ; k+1 < ld; k += 2 {
			dr += den[k] * row[k]
			di += den[k+1] * row[k+1]
		}
		if k < ld {
			dr += den[k] * row[k]
		}
		if e.rot != nil {
			c, s := e.rot[2*i], e.rot[2*i+1]
			nr, ni = nr*c+ni*s, ni*c-nr*s
		}
		cr, ci := dr+nr, di+ni
		// |S|² = |D|²/|C|²; square roots wait until the maximum is known.
		s2 := (dr*dr + di*di) / (cr*cr + ci*ci)
		if s2 > best {
			best, bi = s2, i
		}
	}
	ms = math.Sqrt(best)
	w = e.w[bi]
	if e.steps > 0 && len(e.w) >= 3 {
		a, b := e.lw[max(bi-1, 0)], e.lw[min(bi+1, len(e.w)-1)]
		if v := e.goldenS(num, den, a, b); v > ms {
			ms = v
		}
	}
	// Ends: ω = 0 and ω → ∞.
	var n0, d0 float64
	if ln > 0 {
		n0 = num[0]
	}
	if ld > 0 {
		d0 = den[0]
	}
	if n0 != 0 || d0 != 0 {
		if s0 := math.Abs(d0) / math.Abs(d0+n0); s0 > ms {
			ms = s0
		}
	}
	if sInf, _ := limitWithDelay(num, den, e.delay); sInf > ms {
		ms = sInf
	}
	return ms, w
}

// goldenS maximises |S| over ln ω in [a, b] with e.steps golden-section
// steps, returning the best value seen.
func (e *MsEvaluator) goldenS(num, den poly.Poly, a, b float64) float64 {
	const g = 0.6180339887498949
	c, d := b-g*(b-a), a+g*(b-a)
	l := Loop{Num: num, Den: den, Delay: e.delay}
	fc, fd := l.sAbs(math.Exp(c)), l.sAbs(math.Exp(d))
	for i := 0; i < e.steps; i++ {
		if fc >= fd {
			b, d, fd = d, c, fc
			c = b - g*(b-a)
			fc = l.sAbs(math.Exp(c))
		} else {
			a, c, fc = c, d, fd
			d = a + g*(b-a)
			fd = l.sAbs(math.Exp(d))
		}
	}
	return max(fc, fd)
}

// sAbs returns |S(jω)| = |Den|/|Den+Num·e^(−jωL)| at ω.
func (l Loop) sAbs(w float64) float64 {
	nr, ni, dr, di := l.response(w)
	return math.Hypot(dr, di) / math.Hypot(dr+nr, di+ni)
}
