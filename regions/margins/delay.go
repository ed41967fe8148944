package margins

import (
	"fmt"
	"math"
	"slices"

	"gainscape/regions/poly"
)

// Dead time in the loop.
//
// A dead time L multiplies the open loop by e^(−jωL): it turns the phase
// by −ωL and leaves the gain alone. Every frequency response of this
// package goes through Loop.response, which rotates Num(jω) by that
// phase, so the margins, the crossovers, Ms and Mt of a loop with dead
// time are those of N(jω)e^(−jωL)/D(jω) itself, not of an approximant.
//
// Two things change with the delay. The phase keeps turning as ω grows,
// so it crosses −180° without end: the scan adds equally spaced points so
// that the delay turns the phase by at most π/8 from one to the next
// (delayStep), up to a frequency top past which the crossings no longer
// matter: twice the highest frequency at which |L| is still 1e-3 on the
// logarithmic grid (a gain margin of 60 dB), and at least 4π/L, so that
// the first two turns of the delay are always covered; never beyond the
// scanned range, and with at most maxDelayPoints added points (top is
// lowered to keep to it). Phase crossovers above top are not looked for,
// and of those found only the lowest maxListed are listed. And
// the limits as ω → ∞ of |S| and |T| become upper limits when Num and Den
// have the same degree (the neutral type): |S(jω)| then keeps swinging
// between |a|/(|a| + |b|) and |a|/(|a| − |b|), a and b the leading
// coefficients of Den and Num, and the supremum is the upper one.

// delayStep is the largest turn of the phase, in radians, that the dead
// time makes between two consecutive points of the scan.
const delayStep = math.Pi / 8

// relevantGain is the loop gain |L| below which phase crossovers of a loop
// with dead time stop being scanned for (a gain margin of 60 dB).
const relevantGain = 1e-3

// maxDelayPoints caps the equally spaced points added for a dead time.
const maxDelayPoints = 100000

// response returns the real and imaginary parts of Num(jω)·e^(−jωL) and
// of Den(jω). It does not allocate.
func (l Loop) response(w float64) (nr, ni, dr, di float64) {
	nr, ni = evalJW(l.Num, w)
	dr, di = evalJW(l.Den, w)
	if l.Delay != 0 {
		nr, ni = rotate(nr, ni, w*l.Delay)
	}
	return nr, ni, dr, di
}

// rotate returns (re + j·im)·e^(−j·phase).
func rotate(re, im, phase float64) (float64, float64) {
	s, c := math.Sincos(phase)
	return re*c + im*s, im*c - re*s
}

// scan returns the frequencies Margins evaluates, and the frequency up to
// which phase crossovers are reported: +Inf without dead time.
func (l Loop) scan(lo, hi float64, roots []complex128) ([]float64, float64) {
	w := scanGrid(lo, hi, roots)
	if l.Delay == 0 {
		return w, math.Inf(1)
	}
	top := 4 * math.Pi / l.Delay
	for _, x := range w {
		nr, ni := evalJW(l.Num, x)
		dr, di := evalJW(l.Den, x)
		if math.Hypot(nr, ni) >= relevantGain*math.Hypot(dr, di) {
			top = max(top, 2*x)
		}
	}
	top = min(top, hi)
	extra := linearPoints(lo, top, delayStep/l.Delay)
	if len(extra) > 0 {
		top = min(top, extra[len(extra)-1])
	}
	w = append(w, extra...)
	slices.Sort(w)
	return slices.Compact(w), top
}

// linearPoints returns points step apart over [lo, top], starting where
// a logarithmic grid of perDecade points per decade becomes coarser than
// step, at most maxDelayPoints of them.
func linearPoints(lo, top, step float64) []float64 {
	start := max(lo, step/(math.Pow(10, 1.0/perDecade)-1))
	if !(start < top) {
		return nil
	}
	n := min(int((top-start)/step)+1, maxDelayPoints)
	out := make([]float64, n)
	for i := range out {
		out[i] = start + float64(i)*step
	}
	return out
}

// maxListed is the most phase crossovers listed for a loop with dead
// time, the lowest in frequency: above them the gain margins only grow
// for a loop whose gain falls with frequency, and a person reads a
// dozen.
const maxListed = 12

// listed returns the phase crossovers Margins lists: for a loop with dead
// time the lowest maxListed of them, once the reported gain margin has
// been chosen among all.
func (l Loop) listed(cs []Crossing) []Crossing {
	if l.Delay == 0 || len(cs) <= maxListed {
		return cs
	}
	return cs[:maxListed]
}

// below returns the crossings at frequencies up to top.
func below(cs []Crossing, top float64) []Crossing {
	out := cs[:0]
	for _, c := range cs {
		if c.Freq <= top {
			out = append(out, c)
		}
	}
	return out
}

// limitWithDelay returns the limits as ω → ∞ of |S| and |T| for the loop
// num/den·e^(−jωL), or their upper limits where the dead time makes them
// swing (see the notes above): +Inf when |b| ≥ |a| for equal degrees, a
// neutral loop with infinitely many unstable roots.
func limitWithDelay(num, den poly.Poly, delay float64) (s, t float64) {
	dn, dd := num.Degree(), den.Degree()
	if delay == 0 || dn != dd {
		return limitAtInfinity(num, den)
	}
	a, b := math.Abs(den[dd]), math.Abs(num[dn])
	if b >= a {
		return math.Inf(1), math.Inf(1)
	}
	return a / (a - b), b / (a - b)
}

// NewMsEvaluatorDelay is NewMsEvaluatorNear for loops with dead time
// delay (in the time unit of the frequencies): the numerator is turned by
// e^(−jω_iL) at every grid frequency ω_i, from a table of cosines and
// sines built here, and the grid gets equally spaced points wherever the
// logarithmic spacing would let the delay turn the phase by more than
// π/8 between two of them, at most maxDelayPoints of them (above that,
// the upper end of the equally spaced part is lowered: narrow peaks of
// |S| at higher frequencies may be read low). With delay 0 it is
// NewMsEvaluatorNear.
func NewMsEvaluatorDelay(wmin, wmax float64, perDecade, maxLen, steps int, roots []complex128, delay float64) (*MsEvaluator, error) {
	if !(delay >= 0) || math.IsInf(delay, 1) {
		return nil, fmt.Errorf("margins: Ms grid for a dead time of %g, which is not a finite non-negative number", delay)
	}
	e, err := NewMsEvaluatorNear(wmin, wmax, perDecade, maxLen, steps, roots)
	if err != nil || delay == 0 {
		return e, err
	}
	step := delayStep / delay
	start := max(wmin, step/(math.Pow(10, 1.0/float64(perDecade))-1))
	var extra []float64
	for i := 0; i < maxDelayPoints && start+float64(i)*step < wmax; i++ {
		extra = append(extra, start+float64(i)*step)
	}
	w := slices.Compact(slices.Sorted(slices.Values(append(append([]float64(nil), e.w...), extra...))))
	e = newMsGrid(w, maxLen, steps)
	e.delay = delay
	e.rot = make([]float64, 2*len(w))
	for i, x := range w {
		e.rot[2*i+1], e.rot[2*i] = math.Sincos(x * delay)
	}
	return e, nil
}
