package margins

import (
	"fmt"
	"math"

	"gainscape/regions/poly"
)

// SampledMsEvaluator computes Ms = max over 0 ≤ ω ≤ π/T of
// |1/(1 + L(e^(jωT)))| for many loops sampled every T on one fixed
// frequency grid, allocating nothing per call: the sampled counterpart of
// MsEvaluator, for Ms over the maps of sampled loops.
//
// Method: for every grid frequency ω_i it stores the unit-circle weights
// cos(k·ω_i·T) and sin(k·ω_i·T), each from math.Sincos of its own angle
// (no recurrence, so no error builds up with k), so that
// p(e^(jω_iT)) = Σ p_k·cos(kω_iT) + j·Σ p_k·sin(kω_iT): two multiply-adds
// per coefficient. |S|² = |Den|²/|Den + Num|² is compared on the grid
// without square roots; the largest grid value is refined by Steps
// golden-section steps in ln ω on the bracket of its two neighbours
// (Horner's rule on the circle), and compared with the exact values at
// z = 1 (ω = 0) and z = −1 (ω = π/T).
//
// Its errors are those of MsEvaluator: one-sided (it never reports more
// than the supremum, up to rounding), small for peaks inside the grid and
// wider than its spacing; the tests bound its difference from
// SampledLoop.Margins. It is read-only after construction and safe for
// concurrent use.
type SampledMsEvaluator struct {
	T      float64
	w, lw  []float64
	cs     []float64 // len(w)×2·stride: cos and sin of k·ω_i·T, interleaved
	stride int
	steps  int
}

// NewSampledMsEvaluator returns an evaluator for loops sampled every T
// on a logarithmic grid from wmin to π/T (0 < wmin < π/T) with perDecade
// points per decade, enriched near every lightly damped root in roots
// (continuous equivalents ln(z)/T, as SampledLoop.Margins enriches its
// scan), for loops whose Num and Den have at most maxLen coefficients,
// refining the peak by steps golden-section steps.
func NewSampledMsEvaluator(T, wmin float64, perDecade, maxLen, steps int, roots []complex128) (*SampledMsEvaluator, error) {
	if !(T > 0) || math.IsInf(T, 1) {
		return nil, fmt.Errorf("margins: sample time %g is not positive and finite", T)
	}
	wmax := math.Pi / T
	if !(wmin > 0 && wmin < wmax) {
		return nil, fmt.Errorf("margins: sampled Ms grid needs 0 < wmin < π/T = %g, have %g", wmax, wmin)
	}
	if perDecade < 1 || maxLen < 1 || steps < 0 {
		return nil, fmt.Errorf("margins: Ms grid needs perDecade ≥ 1, maxLen ≥ 1, steps ≥ 0")
	}
	w := enrichedGrid(wmin, wmax, perDecade, roots)
	if len(w) < 3 {
		w = logGrid(wmin, wmax, 3)
	}
	e := &SampledMsEvaluator{T: T, w: w, lw: make([]float64, len(w)), cs: make([]float64, 2*maxLen*len(w)), stride: maxLen, steps: steps}
	for i, x := range w {
		e.lw[i] = math.Log(x)
		row := e.cs[2*maxLen*i : 2*maxLen*(i+1)]
		for k := 0; k < maxLen; k++ {
			s, c := math.Sincos(float64(k) * x * T)
			row[2*k], row[2*k+1] = c, s
		}
	}
	return e, nil
}

// Len returns the number of grid frequencies.
func (e *SampledMsEvaluator) Len() int { return len(e.w) }

// Ms returns max over 0 ≤ ω ≤ π/T of |Den/(Den + Num)| on the unit
// circle for the sampled loop L = num/den (ascending powers of z); +Inf
// when the closed loop has a pole on the grid or at z = ±1 exactly. It
// allocates nothing. It panics if num or den has more coefficients than
// the evaluator was built for.
func (e *SampledMsEvaluator) Ms(num, den poly.Poly) float64 {
	if len(num) > e.stride || len(den) > e.stride {
		panic(fmt.Sprintf("margins: Ms called with %d and %d coefficients, evaluator built for %d", len(num), len(den), e.stride))
	}
	best, bi := -1.0, 0
	for i := range e.w {
		row := e.cs[2*e.stride*i : 2*e.stride*(i+1)]
		var nr, ni, dr, di float64
		for k, v := range num {
			nr += v * row[2*k]
			ni += v * row[2*k+1]
		}
		for k, v := range den {
			dr += v * row[2*k]
			di += v * row[2*k+1]
		}
		cr, ci := dr+nr, di+ni
		if s2 := (dr*dr + di*di) / (cr*cr + ci*ci); s2 > best {
			best, bi = s2, i
		}
	}
	ms := math.Sqrt(best)
	if e.steps > 0 {
		l := SampledLoop{Num: num, Den: den, T: e.T}
		f := func(lw float64) float64 { return l.point(math.Exp(lw)).s }
		if _, v := goldenMax(f, e.lw[max(bi-1, 0)], e.lw[min(bi+1, len(e.w)-1)], 0, e.steps); v > ms {
			ms = v
		}
	}
	for _, z := range [2]float64{1, -1} {
		n, d := num.EvalReal(z), den.EvalReal(z)
		if n == 0 && d == 0 {
			continue
		}
		if s := math.Abs(d) / math.Abs(d+n); s > ms {
			ms = s
		}
	}
	return ms
}
