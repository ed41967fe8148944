package study

import (
	"context"
	"fmt"
	"math"
	"strconv"

	"gainscape/regions/export"
	"gainscape/regions/loop"
	"gainscape/regions/spec"
)

// tableOf reads a panel's row of the table from its map: the best-ki and
// best-decay points the searches found under the bound, the smallest Ms
// of the stable nodes, the ultimate gain and period and the stable
// share. hasKi is false for a structure without integral action, whose
// best-ki entry says so.
func tableOf(res *MapResult, l loop.Loop, bound float64, hasKi bool) export.CompareTable {
	nan := export.Number(math.NaN())
	t := export.CompareTable{
		BestKi:      noBestKi(""),
		BestDecay:   export.BestDecay{Values: map[string]float64{}, DecayRate: nan, MinDamping: nan, Ms: nan},
		MinMs:       nan,
		MinMsAt:     map[string]float64{},
		StableShare: res.Stats.StableFraction(),
		Ultimate:    ultimatePoint(l),
	}
	if !hasKi {
		t.BestKi.Failed = "the structure has no integral action: a load step leaves a steady error"
	}
	ov := res.Overlays
	if ov == nil {
		return t
	}
	for _, p := range ov.Best {
		switch p.Label {
		case "best " + BestIntegral:
			t.BestKi = bestKiOf(l, p)
		case "best " + BestDecay:
			t.BestDecay = export.BestDecay{Values: p.Values, DecayRate: p.Decay, MinDamping: p.Damping, Ms: p.Ms, Failed: p.Failed, Warning: p.Warning}
		}
	}
	if ov.Ms != nil {
		k := -1
		for i, v := range ov.Ms.Values {
			if !math.IsNaN(v) && (k < 0 || v < ov.Ms.Values[k]) {
				k = i
			}
		}
		if k >= 0 {
			t.MinMs = export.Number(ov.Ms.Values[k])
			t.MinMsAt = map[string]float64{res.X.Param: res.X.At(k % res.X.N), res.Y.Param: res.Y.At(k / res.X.N)}
		}
	}
	return t
}

// noBestKi is a best-ki entry that failed for the reason given.
func noBestKi(reason string) export.BestKi {
	nan := export.Number(math.NaN())
	return export.BestKi{Values: map[string]float64{}, Ms: nan, GainMargin: nan, PhaseMargin: nan, IE: nan, Failed: reason}
}

// bestKiOf completes the best-ki point p of loop l with its gain and
// phase margins and IE = 1/ki.
func bestKiOf(l loop.Loop, p export.Point) export.BestKi {
	nan := export.Number(math.NaN())
	b := export.BestKi{Values: p.Values, Ms: p.Ms, GainMargin: nan, PhaseMargin: nan, IE: nan, Failed: p.Failed, Warning: p.Warning}
	if p.Failed != "" {
		return b
	}
	if ki := p.Values["ki"]; ki > 0 {
		b.IE = export.Number(1 / ki)
	}
	at, err := withValues(l, p.Values)
	if err != nil {
		return b
	}
	if mg, err := loopMargins(at); err == nil {
		b.GainMargin, b.PhaseMargin = export.Number(mg.GainMargin), export.Number(mg.PhaseMargin)
	}
	return b
}

// ultimatePoint returns the ultimate gain and period of the
// proportional-only loop, as probe reports them (ultimateGain): from
// margins.Ultimate for a continuous loop, from the D-partition of the
// quasi-polynomial for one with dead time and from the crossing of the
// unit circle for a sampled one. Nil when there is no ultimate gain.
func ultimatePoint(l loop.Loop) *export.UltimatePoint {
	ul, err := ultimateGain(l)
	if err != nil || ul == nil {
		return nil
	}
	return &export.UltimatePoint{Ku: export.Number(ul.Ku), Tu: export.Number(ul.Tu)}
}

// The search for the best-ki design over kd: kdSamples values spread
// evenly over the range, then golden-section search (J. Kiefer,
// "Sequential minimax search for a maximum", Proc. AMS 4(3), 1953) for
// kdRefine steps in the two intervals beside the best sample. Each value
// is the best ki of the plane at that kd, on a kdColumns × kdRows map
// over the window ChooseWindow picks for it. The best ki need not be
// unimodal in kd; a peak narrower than the spacing of the samples can be
// missed.
const (
	kdSamples = 9
	kdRefine  = 14
	kdColumns = 121
	kdRows    = 91
)

// kdRange returns the range of the search over kd and how it was
// chosen: the given one, or 0 to twice the kd scale of the window rule.
func kdRange(l loop.Loop, given *[2]float64) ([2]float64, string) {
	if given != nil {
		return *given, fmt.Sprintf("kd from %g to %g, as given", given[0], given[1])
	}
	sc := parameterScale(l, "kd", loopScales(l))
	hi := roundSignificant(2*sc.Value, 3)
	return [2]float64{0, hi}, fmt.Sprintf("kd from 0 to %g, twice its scale %s", hi, sc.From)
}

// roundSignificant rounds v to n significant digits.
func roundSignificant(v float64, n int) float64 {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', n, 64), 64)
	return r
}

// bestOverKd searches kd over rng for the largest best ki with Ms ≤
// bound in the panel's plane, the other fixed values as given.
func bestOverKd(ctx context.Context, ps PanelSpec, rng [2]float64, bound float64, opt Options) (*export.OverGain, error) {
	type eval struct {
		kd, ki float64
		point  export.BestKi
	}
	evals := 0
	at := func(kd float64) (eval, error) {
		evals++
		ls := ps.Loop
		ls.Fixed = withValue(ls.Fixed, "kd", kd)
		l, err := ls.Build()
		if err != nil {
			return eval{}, err
		}
		w, err := ChooseWindow(ctx, l, spec.Axis{Param: ps.X.Param}, spec.Axis{Param: ps.Y.Param}, true, true, opt)
		if err != nil {
			return eval{kd: kd, ki: math.Inf(-1), point: noBestKi(err.Error())}, nil
		}
		sc := panelScenario(ls, w, kdColumns, kdRows)
		sc.Overlays.Best, sc.Overlays.MsBound, sc.Overlays.MsLevels = []string{BestIntegral}, bound, nil
		job, err := NewMap(sc)
		if err != nil {
			return eval{}, err
		}
		res, err := job.Run(ctx, Options{Workers: opt.Workers})
		if err != nil {
			return eval{}, err
		}
		b := bestKiOf(l, res.Overlays.Best[0])
		ki := math.Inf(-1)
		if b.Failed == "" {
			ki = b.Values["ki"]
		}
		return eval{kd, ki, b}, nil
	}
	lo, hi := rng[0], rng[1]
	n := kdSamples
	if hi <= lo {
		n = 1
	}
	var samples []eval
	best := -1
	for i := range n {
		kd := lo
		if n > 1 {
			kd = lo + float64(i)*(hi-lo)/float64(n-1)
		}
		e, err := at(kd)
		if err != nil {
			return nil, err
		}
		samples = append(samples, e)
		if best < 0 || e.ki > samples[best].ki {
			best = i
		}
	}
	top := samples[best]
	if n > 1 && !math.IsInf(top.ki, -1) {
		a, b := samples[max(best-1, 0)].kd, samples[min(best+1, n-1)].kd
		g := (math.Sqrt(5) - 1) / 2
		p, q := b-g*(b-a), a+g*(b-a)
		ep, err := at(p)
		if err != nil {
			return nil, err
		}
		eq, err := at(q)
		if err != nil {
			return nil, err
		}
		for range kdRefine {
			for _, e := range []eval{ep, eq} {
				if e.ki > top.ki {
					top = e
				}
			}
			if ep.ki >= eq.ki {
				b, q, eq = q, p, ep
				p = b - g*(b-a)
				if ep, err = at(p); err != nil {
					return nil, err
				}
			} else {
				a, p, ep = p, q, eq
				q = a + g*(b-a)
				if eq, err = at(q); err != nil {
					return nil, err
				}
			}
		}
		for _, e := range []eval{ep, eq} {
			if e.ki > top.ki {
				top = e
			}
		}
	}
	og := &export.OverGain{Param: "kd", Range: rng, Samples: evals, BestKi: top.point}
	if n > 1 && og.Failed == "" && (top.kd == lo || top.kd == hi) && og.Warning == "" {
		og.Warning = fmt.Sprintf("kd = %g is an end of the range searched: the best may lie beyond it; widen --kd-range", top.kd)
	}
	return og, nil
}

// withValue returns vals with name set to v, replacing a value given.
func withValue(vals []spec.Value, name string, v float64) []spec.Value {
	out := make([]spec.Value, 0, len(vals)+1)
	for _, x := range vals {
		if x.Param != name {
			out = append(out, x)
		}
	}
	return append(out, spec.Value{Param: name, V: v})
}
