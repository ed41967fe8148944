package response

import (
	"math"
	"sort"
)

// Levels of the rise time (common practice: 10% to 90% of the final
// value).
const (
	riseLow  = 0.1
	riseHigh = 0.9
)

// figures computes the design figures from the output waves of the two
// steps and their exact final values.
//
// For continuous loops every crossing and extremum is found between
// samples: the Hermite cubic through the sampled values and exact
// slopes brackets it, and the exact evaluator refines it to rounding
// (crossings by safeguarded Newton, extrema by Illinois on the slope).
// A crossing or extremum that neither the samples nor the cubic show,
// two sign changes closer together than the cubic resolves within one
// step, is missed. Sampled loops take the samples as they are.
func figures(ys, yl wave, finalSetpoint, finalLoad, band float64) Figures {
	nan := math.NaN()
	f := Figures{FinalSetpoint: finalSetpoint, FinalLoad: finalLoad,
		Overshoot: nan, Undershoot: nan, RiseTime: nan, SettlingTime: nan}
	dir := 1.0
	if finalSetpoint < 0 {
		dir = -1
	}
	f.PeakTimeSetpoint, f.PeakSetpoint = extreme(ys, dir)
	if finalSetpoint != 0 {
		mag := math.Abs(finalSetpoint)
		f.Overshoot = max(0, 100*dir*(f.PeakSetpoint-finalSetpoint)/mag)
		_, low := extreme(ys, -dir)
		f.Undershoot = max(0, -100*dir*low/mag)
		f.RiseTime = firstReach(ys, riseHigh*finalSetpoint, dir) - firstReach(ys, riseLow*finalSetpoint, dir)
		f.SettlingTime = settle(ys, finalSetpoint, band*mag)
	}
	f.IAESetpoint = absArea(ys.affine(1, -1))
	n := yl.steps()
	f.IAELoad = absArea(yl)
	f.IELoad = -yl.run[n]
	tHi, hi := extreme(yl, 1)
	tLo, lo := extreme(yl, -1)
	f.PeakTimeLoad, f.PeakLoad = tHi, hi
	if -lo > hi {
		f.PeakTimeLoad, f.PeakLoad = tLo, lo
	}
	return f
}

// firstReach returns the first time at which dir·(v − level) ≥ 0, NaN if
// the window never gets there.
func firstReach(w wave, level, dir float64) float64 {
	g := func(v float64) float64 { return dir * (v - level) }
	for k, v := range w.v {
		if g(v) >= 0 {
			if k == 0 || w.at == nil {
				return float64(k) * w.h
			}
			th := w.crossing(k-1, level, 0, w.v[k-1]-level, 1, v-level)
			return (float64(k-1) + th) * w.h
		}
		if k == w.steps() || w.at == nil {
			continue
		}
		tr := w.turns[k]
		for i, th := range tr.at[:tr.n] {
			if g(tr.v[i]) < 0 {
				continue
			}
			if vt, _, _ := w.at(k, th); g(vt) >= 0 {
				th = w.crossing(k, level, 0, v-level, th, vt-level)
				return (float64(k) + th) * w.h
			}
		}
	}
	return math.NaN()
}

// settle returns the first time after which |v − center| ≤ band up to
// the end of the window: NaN if the last sample is outside the band, 0 if
// no sample is.
func settle(w wave, center, band float64) float64 {
	n := w.steps()
	out := func(v float64) bool { return math.Abs(v-center) > band }
	if out(w.v[n]) {
		return math.NaN()
	}
	edge := func(v float64) float64 { return center + math.Copysign(band, v-center) }
	for k := n - 1; k >= 0; k-- {
		if out(w.v[k]) {
			if w.at == nil {
				return float64(k+1) * w.h
			}
			l := edge(w.v[k])
			th := w.crossing(k, l, 0, w.v[k]-l, 1, w.v[k+1]-l)
			return (float64(k) + th) * w.h
		}
		if w.at == nil {
			continue
		}
		tr := w.turns[k]
		for i := tr.n - 1; i >= 0; i-- {
			th := tr.at[i]
			if !out(tr.v[i]) {
				continue
			}
			if vt, _, _ := w.at(k, th); out(vt) {
				l := edge(vt)
				th = w.crossing(k, l, th, vt-l, 1, w.v[k+1]-l)
				return (float64(k) + th) * w.h
			}
		}
	}
	return 0
}

// maxCandidates bounds the steps examined for a hidden extremum beyond
// the two next to the best sample.
const maxCandidates = 8

// extreme returns the time and value of the maximum of dir·v over the
// window.
func extreme(w wave, dir float64) (t, v float64) {
	best := 0
	for k, x := range w.v {
		if dir*x > dir*w.v[best] {
			best = k
		}
	}
	t, v = float64(best)*w.h, w.v[best]
	if w.at == nil {
		return t, v
	}
	type cand struct {
		k   int
		top float64
	}
	var cands []cand
	for k := 0; k < w.steps(); k++ {
		top := math.Inf(-1)
		if k == best-1 || k == best {
			top = math.Inf(1)
		} else {
			tr := w.turns[k]
			for _, cv := range tr.v[:tr.n] {
				top = max(top, dir*cv)
			}
			if top <= dir*v {
				continue
			}
		}
		cands = append(cands, cand{k, top})
	}
	sort.SliceStable(cands, func(i, j int) bool { return cands[i].top > cands[j].top })
	if len(cands) > maxCandidates {
		cands = cands[:maxCandidates]
	}
	for _, c := range cands {
		if tk, vk, ok := w.peakIn(c.k, dir); ok && dir*vk > dir*v {
			t, v = tk, vk
		}
	}
	return t, v
}

// peakIn returns the largest interior maximum of dir·v within step k, if
// the exact slopes at the ends and at the critical points of the cubic
// show one.
func (w wave) peakIn(k int, dir float64) (t, v float64, ok bool) {
	tr := w.turns[k]
	th := []float64{0}
	s := []float64{w.sR[k]}
	for _, c := range tr.at[:tr.n] {
		_, sc, _ := w.at(k, c)
		th, s = append(th, c), append(s, sc)
	}
	th, s = append(th, 1), append(s, w.sL[k+1])
	for i := 0; i+1 < len(th); i++ {
		if !(dir*s[i] > 0 && dir*s[i+1] < 0) {
			continue
		}
		x := w.stationary(k, th[i], s[i], th[i+1], s[i+1], (th[i]+th[i+1])/2)
		vx, _, _ := w.at(k, x)
		if !ok || dir*vx > dir*v {
			t, v, ok = (float64(k)+x)*w.h, vx, true
		}
	}
	return t, v, ok
}

// absArea returns ∫|v| over the window. Continuous loops: the window is
// cut at every sample and at every sign change (found as in figures),
// and the exact running integral gives each piece, so that the sum of
// the magnitudes of the pieces is exact to rounding. Sampled loops:
// h·Σ_{k<N}|v[k]|.
func absArea(w wave) float64 {
	n := w.steps()
	total := 0.0
	if w.at == nil {
		for _, x := range w.v[:n] {
			total += math.Abs(x)
		}
		return total * w.h
	}
	for k := 0; k < n; k++ {
		f0, f1 := w.v[k], w.v[k+1]
		var cuts []float64
		switch {
		case f0*f1 < 0:
			cuts = []float64{w.crossing(k, 0, 0, f0, 1, f1)}
		case f0*f1 > 0:
			tr := w.turns[k]
			for i, th := range tr.at[:tr.n] {
				if tr.v[i]*f0 >= 0 {
					continue
				}
				if vt, _, _ := w.at(k, th); vt*f0 < 0 {
					cuts = []float64{w.crossing(k, 0, 0, f0, th, vt), w.crossing(k, 0, th, vt, 1, f1)}
					break
				}
			}
		}
		prev := w.run[k]
		for _, th := range cuts {
			_, _, r := w.at(k, th)
			total += math.Abs(r - prev)
			prev = r
		}
		total += math.Abs(w.run[k+1] - prev)
	}
	return total
}
