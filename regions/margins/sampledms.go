package margins

import (
	"fmt"
	"math"

	"gainscape/regions/poly"
	"gainscape/regions/unitcircle"
)

// SampledMsEvaluator computes Ms = max over 0 ≤ ω ≤ π/T of
// |1/(1 + L(e^(jωT)))| for many loops sampled every T on one fixed
// frequency grid, allocating nothing per call for loops of up to
// stackLen coefficients: the sampled counterpart of MsEvaluator, for Ms
// over the maps of sampled loops.
//
// Method: every grid frequency ω_i stores the real and imaginary parts
// of the powers b^k of the point at which its zone of the circle is
// expanded (see circleBase): z = e^(jθ), δ = z − 1 = 2·sin(θ/2)·e^(j(θ+π)/2)
// or ε = z + 1 = 2·cos(θ/2)·e^(jθ/2), θ = ω_i·T, each power from its
// magnitude and angle (no recurrence, so no error builds up with k).
// Per call Num and Den are expanded about z = 1 and z = −1
// (unitcircle.Shift), and p at ω_i is two multiply-adds per coefficient
// of the zone's expansion, which keeps the digits a loop sampled fast
// would lose near z = 1. |S|² = |Den|²/|Den + Num|² is compared on the
// grid without square roots; the largest grid value is refined by Steps
// golden-section steps in ln ω on the bracket of its two neighbours, and
// compared with the exact values at z = 1 (ω = 0) and z = −1 (ω = π/T).
//
// Its errors are those of MsEvaluator: one-sided (it never reports more
// than the supremum, up to rounding), small for peaks inside the grid and
// wider than its spacing; the tests bound its difference from
// SampledLoop.Margins. It is read-only after construction and safe for
// concurrent use.
type SampledMsEvaluator struct {
	T      float64
	w, lw  []float64
	zone   []int8
	pw     []float64 // len(w)×2·stride: real and imaginary parts of b^k, interleaved
	stride int
	steps  int
}

// stackLen is the most coefficients for which Ms keeps its expansions on
// the stack; longer loops allocate them.
const stackLen = 32

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
	// The grid is the continuous evaluator's, up to π/T: the same checks,
	// the same enrichment.
	grid, err := NewMsEvaluatorNear(wmin, math.Pi/T, perDecade, 1, 0, roots)
	if err != nil {
		return nil, err
	}
	if maxLen < 1 || steps < 0 {
		return nil, fmt.Errorf("margins: Ms grid needs maxLen ≥ 1, steps ≥ 0")
	}
	w := grid.w
	e := &SampledMsEvaluator{T: T, w: w, lw: grid.lw, zone: make([]int8, len(w)), pw: make([]float64, 2*maxLen*len(w)), stride: maxLen, steps: steps}
	l := SampledLoop{T: T}
	for i, x := range w {
		th := l.angle(x)
		zone, _, _ := circleBase(th)
		e.zone[i] = int8(zone)
		// The base as magnitude and angle: z = e^(jθ), δ and ε as above.
		mag, arg := 1.0, th
		switch zone {
		case zoneOne:
			mag, arg = 2*math.Sin(th/2), (th+math.Pi)/2
		case zoneMinusOne:
			mag, arg = 2*math.Cos(th/2), th/2
			if th == math.Pi {
				mag = 0
			}
		}
		row := e.pw[2*maxLen*i : 2*maxLen*(i+1)]
		m := 1.0
		for k := 0; k < maxLen; k++ {
			s, c := math.Sincos(float64(k) * arg)
			row[2*k], row[2*k+1] = m*c, m*s
			m *= mag
		}
	}
	return e, nil
}

// Len returns the number of grid frequencies.
func (e *SampledMsEvaluator) Len() int { return len(e.w) }

// Ms returns max over 0 ≤ ω ≤ π/T of |Den/(Den + Num)| on the unit
// circle for the sampled loop L = num/den (ascending powers of z); +Inf
// when the closed loop has a pole on the grid or at z = ±1 exactly. It
// allocates nothing for loops of up to stackLen coefficients. It panics
// if num or den has more coefficients than the evaluator was built for.
func (e *SampledMsEvaluator) Ms(num, den poly.Poly) float64 {
	if len(num) > e.stride || len(den) > e.stride {
		panic(fmt.Sprintf("margins: Ms called with %d and %d coefficients, evaluator built for %d", len(num), len(den), e.stride))
	}
	var stack [4][stackLen]float64
	buf := func(i, n int) poly.Poly {
		if n <= stackLen {
			return stack[i][:n]
		}
		return make(poly.Poly, n)
	}
	cn := circlePoly{p: num, at1: buf(0, len(num)), atM1: buf(1, len(num))}
	cd := circlePoly{p: den, at1: buf(2, len(den)), atM1: buf(3, len(den))}
	unitcircle.Shift(cn.at1, num, 1)
	unitcircle.Shift(cn.atM1, num, -1)
	unitcircle.Shift(cd.at1, den, 1)
	unitcircle.Shift(cd.atM1, den, -1)
	best, bi := -1.0, 0
	for i := range e.w {
		row := e.pw[2*e.stride*i : 2*e.stride*(i+1)]
		qn, qd := cn.p, cd.p
		switch e.zone[i] {
		case zoneOne:
			qn, qd = cn.at1, cd.at1
		case zoneMinusOne:
			qn, qd = cn.atM1, cd.atM1
		}
		var nr, ni, dr, di float64
		for k, v := range qn {
			nr += v * row[2*k]
			ni += v * row[2*k+1]
		}
		for k, v := range qd {
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
		l := SampledLoop{T: e.T}
		f := func(lw float64) float64 {
			th := l.angle(math.Exp(lw))
			nr, ni := cn.eval(th)
			dr, di := cd.eval(th)
			return math.Hypot(dr, di) / math.Hypot(dr+nr, di+ni)
		}
		if _, v := goldenMax(f, e.lw[max(bi-1, 0)], e.lw[min(bi+1, len(e.w)-1)], 0, e.steps); v > ms {
			ms = v
		}
	}
	for _, ends := range [2][2]float64{{cn.at1[0], cd.at1[0]}, {cn.atM1[0], cd.atM1[0]}} {
		n, d := ends[0], ends[1]
		if n == 0 && d == 0 {
			continue
		}
		if s := math.Abs(d) / math.Abs(d+n); s > ms {
			ms = s
		}
	}
	return ms
}
