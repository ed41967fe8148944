package study

import (
	"fmt"
	"math"

	"gainscape/regions/delay"
	"gainscape/regions/export"
	"gainscape/regions/intervals"
	"gainscape/regions/loop"
	"gainscape/regions/margins"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// The approximate route: a loop with dead time whose delay is replaced by
// the diagonal Padé approximant of order n (delay.Pade), a rational loop
// that the sign array decides. Every study of a loop with dead time runs
// it beside the exact one and says how far it would have misled: the
// point's verdict and ultimate gain (padeProbe), the interval ends
// (padeVary) and the map node by node with the largest displacement of
// the stability edge (comparePade).

// padeLoop returns l with its dead time replaced by the order-n Padé
// approximant: plant N·num_n/(D·den_n), formed exactly from the
// approximant's coefficients.
func padeLoop(l loop.Loop, n int) loop.Loop {
	num, den := delay.Pade(l.Plant.Delay, n)
	l.Plant = loop.Plant{Num: poly.Mul(l.Plant.Num, num), Den: poly.Mul(l.Plant.Den, den)}
	return l
}

// padeOrder returns the order given, or when it is 0 the smallest whose
// phase stays within 1° of the delay's up to omegaL (delay.PadeOrder), and
// whether it was chosen.
func padeOrder(given int, omegaL float64) (int, bool) {
	if given > 0 {
		return given, false
	}
	return delay.PadeOrder(omegaL), true
}

// orderText says which order was used and why.
func orderText(n int, chosen bool, omegaL float64) string {
	how := "as given"
	if chosen {
		how = fmt.Sprintf("chosen for ωL up to %.3g", omegaL)
	}
	s := fmt.Sprintf("Padé order %d (%s; its phase is within 1° of the delay's up to ωL = %.3g)", n, how, delay.PadeRange(n))
	if chosen && omegaL > delay.PadeRange(delay.MaxPadeOrder) {
		s += fmt.Sprintf("; no order up to %d covers ωL = %.3g", delay.MaxPadeOrder, omegaL)
	}
	return s
}

// padeProbe compares the design point with its Padé-approximated loop:
// the sign array's verdict, and the ultimate gain of the approximate
// proportional-only loop against the exact one. The order, when not
// given, covers ωL at the highest of the gain crossovers, the first phase
// crossover, the ultimate frequency and the frequency of the rightmost
// root.
func padeProbe(l loop.Loop, doc *export.Probe, mg margins.Margins, given int) (*export.PadeProbe, error) {
	w := 0.0
	for _, c := range mg.GainCrossings {
		w = math.Max(w, c.Freq)
	}
	if len(mg.PhaseCrossings) > 0 {
		w = math.Max(w, mg.PhaseCrossings[0].Freq)
	}
	if len(doc.Poles) > 0 {
		w = math.Max(w, math.Abs(doc.Poles[0][1]))
	}
	kuExact := math.NaN()
	if doc.Ultimate != nil {
		kuExact = doc.Ultimate.Ku
		w = math.Max(w, 2*math.Pi/doc.Ultimate.Tu)
	}
	L := l.Plant.Delay
	n, chosen := padeOrder(given, w*L)
	pl := padeLoop(l, n)
	f := pl.Function()
	rep := routh.Test{}.Report(f)
	out := &export.PadeProbe{Order: n, Chosen: chosen, OmegaL: w * L, RangeOmegaL: delay.PadeRange(n),
		RHP: rep.Unstable, Stable: rep.Stable()}
	out.Agrees = rep.Unstable == doc.RHP && rep.Stable() == doc.Stable
	ku, _, ok := margins.Ultimate(pl.Plant.Num, pl.Plant.Den, routh.Test{})
	if !ok {
		ku = math.NaN()
	}
	out.Ku, out.KuExact = export.Number(ku), export.Number(kuExact)
	out.KuError = export.Number((ku - kuExact) / kuExact)
	verdict := fmt.Sprintf("the sign array on the approximate loop finds %s in the right half plane (exactly: %s)", rootsText(rep.Unstable), rootsText(doc.RHP))
	if out.Agrees {
		verdict = "the sign array on the approximate loop agrees with the exact verdict"
	}
	out.Note = orderText(n, chosen, w*L) + ": " + verdict
	if out.KuError.Valid() {
		out.Note += fmt.Sprintf("; its ultimate gain %.6g is %+.3g%% off the exact %.6g", ku, 100*float64(out.KuError), kuExact)
	}
	return out, nil
}

// rootsText writes a count of right-half-plane roots.
func rootsText(n int) string {
	switch {
	case n == delay.InfinitelyMany:
		return "infinitely many roots"
	case n == 1:
		return "1 root"
	case n < 0:
		return "an undecided count"
	}
	return fmt.Sprintf("%d roots", n)
}

// padeVary compares the stable intervals of parameter idx over [lo, hi]
// with those of the Padé-approximated loop: the largest distance from an
// end of either list (other than a window end) to the nearest end of the
// other, and that distance relative to the exact end. The order, when not
// given, covers ωL at the highest crossing frequency of an exact end.
func padeVary(l loop.Loop, idx int, lo, hi float64, exact []intervals.Interval, given int) (*export.PadeVary, error) {
	w := 0.0
	var ends []float64
	for _, iv := range exact {
		for _, e := range [2]struct {
			k     float64
			kind  stability.Kind
			omega float64
		}{{iv.Lo, iv.LoKind, iv.LoOmega}, {iv.Hi, iv.HiKind, iv.HiOmega}} {
			if e.kind == intervals.Window {
				continue
			}
			ends = append(ends, e.k)
			if e.kind == stability.Complex {
				w = math.Max(w, e.omega)
			}
		}
	}
	L := l.Plant.Delay
	n, chosen := padeOrder(given, w*L)
	approx, err := intervals.Stable(padeLoop(l, n), idx, lo, hi)
	if err != nil {
		return nil, err
	}
	out := &export.PadeVary{Order: n, Chosen: chosen, OmegaL: w * L, Intervals: []export.Interval{}}
	var others []float64
	for _, iv := range approx {
		out.Intervals = append(out.Intervals, exportInterval(iv))
		if iv.LoKind != intervals.Window {
			others = append(others, iv.Lo)
		}
		if iv.HiKind != intervals.Window {
			others = append(others, iv.Hi)
		}
	}
	largest, at, moved := math.NaN(), math.NaN(), math.NaN()
	consider := func(from, to []float64, fromExact bool) {
		for _, a := range from {
			d, b := nearest(a, to, lo, hi)
			if math.IsNaN(largest) || d > largest {
				largest = d
				at, moved = a, b
				if !fromExact {
					at, moved = b, a
				}
			}
		}
	}
	consider(ends, others, true)
	consider(others, ends, false)
	out.Largest, out.At = export.Number(largest), export.Number(at)
	out.Relative = export.Number(largest / math.Abs(at))
	switch {
	case math.IsNaN(largest):
		out.Note = orderText(n, chosen, w*L) + ": neither loop has an interval end inside the range to compare"
	case largest == 0:
		out.Note = orderText(n, chosen, w*L) + ": the interval ends agree"
	default:
		out.Note = fmt.Sprintf("%s: the end at %.6g moves to %.6g (%+.3g%%)", orderText(n, chosen, w*L), at, moved, 100*(moved-at)/math.Abs(at))
	}
	return out, nil
}

// nearest returns the distance from a to the nearest value in list and
// that value; with an empty list, the distance to the nearer window end,
// which an end must pass to leave the range.
func nearest(a float64, list []float64, lo, hi float64) (float64, float64) {
	best, at := math.Inf(1), math.NaN()
	for _, b := range list {
		if d := math.Abs(a - b); d < best {
			best, at = d, b
		}
	}
	if len(list) == 0 {
		if a-lo < hi-a {
			return a - lo, lo
		}
		return hi - a, hi
	}
	return best, at
}
