package study

import (
	"context"
	"fmt"
	"math"

	"gainscape/regions/export"
	"gainscape/regions/loop"
	"gainscape/regions/margins"
	"gainscape/regions/response"
	"gainscape/regions/stability"
)

// ProbeRequest is one design point: the loop with every parameter value,
// and optionally the names of the two parameters spanning the plane in
// which the distance to the nearest edge is measured (default: the
// family's first two).
type ProbeRequest struct {
	Loop LoopSpec
	X, Y string
	// Pade is the order of the Padé approximant a loop with dead time is
	// compared with; 0 chooses it (padeProbe).
	Pade int
	// Response asks for the step responses of the design point.
	Response bool
}

// ProbeReport is everything probe says about one design point.
type ProbeReport struct {
	// Doc is the probe --json document.
	Doc *export.Probe
	// Formula is the controller's transfer function; Values the design
	// point in the family's order of parameters.
	Formula string
	Values  []Value
	// Units labels frequencies, decay rates and periods.
	Units Units
	// Sampled describes the sampling of a sampled-data loop; nil for a
	// continuous-time one.
	Sampled *Sampling
	// Response holds the step responses when asked for and the loop is
	// stable (Doc.ResponseFailed says why not otherwise).
	Response *response.Result
}

// Probe computes the report for one design point: the stability test's
// verdict and working, the poles, decay rate and damping, gain and phase
// margins, Ms and Mt, the distance to the nearest edge, and the ultimate
// gain and period of the proportional-only loop with the tuning rules
// computed from them.
func Probe(ctx context.Context, req ProbeRequest) (*ProbeReport, error) {
	l, err := req.Loop.Build()
	if err != nil {
		return nil, err
	}
	f := l.Function()
	if !f.P.Finite() || !f.Q.Finite() {
		return nil, inputErr("--set", "fixed", "", "the characteristic polynomial has non-finite coefficients")
	}
	units := Units{req.Loop.TimeUnit}
	doc := &export.Probe{
		Plant: req.Loop.PlantText(), Controller: l.Family.Name(), TimeUnit: units.Key(),
		Values: valueMap(l), Characteristic: f.P.Descending(), Caution: Caution,
	}
	sampling := sampledOf(l, req.Loop)
	if sampling != nil {
		doc.SampleTime, doc.Integral = sampling.T, sampling.Integral
	}
	if !f.Rational() {
		doc.Delay, doc.Delayed = f.Delay, f.Q.Descending()
	}
	rep := l.Test().Report(f)
	if rep.Unstable < 0 {
		return nil, fmt.Errorf("the %s cannot decide this point: %s", l.Test().Name(), rep.Reason)
	}
	probeWorking(doc, rep, f)
	if rep.Auxiliary != nil {
		doc.Aux = rep.Auxiliary.Descending()
	}
	doc.RHP, doc.JW, doc.DegreeDrop, doc.Stable = rep.Unstable, rep.Boundary, rep.Infinite, rep.Stable()
	doc.CountFrom = rep.Method
	doc.JWOmegas = append([]float64{}, rep.Omegas...)

	if err := probePoles(doc, l, f); err != nil {
		return nil, err
	}
	mg, err := loopMargins(l)
	if err != nil {
		return nil, err
	}
	doc.DelayMargin = export.Number(math.NaN())
	if l.Plant.Sample == 0 {
		doc.DelayMargins, doc.DelayMargin = delayMargins(mg)
	}
	doc.GainMargin, doc.PhaseCrossover = export.Number(mg.GainMargin), export.Number(mg.PhaseCrossover)
	doc.GainMargins = []export.GainMargin{}
	for _, c := range mg.PhaseCrossings {
		dir := "rise"
		if c.Margin < 1 {
			dir = "fall"
		}
		doc.GainMargins = append(doc.GainMargins, export.GainMargin{Freq: c.Freq, Factor: c.Margin, DB: margins.DB(c.Margin), Direction: dir})
	}
	doc.Robustness = "the margins and Ms are distances to instability"
	if !doc.Stable {
		doc.Robustness = "the loop is not stable: the margins and Ms describe L(jω) but are no distances to instability"
	}
	if doc.GainMargin.Valid() {
		doc.GainMarginDB = export.Number(margins.DB(mg.GainMargin))
	} else {
		doc.GainMarginDB = export.Number(math.NaN())
	}
	doc.PhaseMargin, doc.GainCrossover = export.Number(mg.PhaseMargin), export.Number(mg.GainCrossover)
	doc.Ms, doc.MsFreq, doc.Mt, doc.MtFreq = export.Number(mg.Ms), export.Number(mg.MsFreq), export.Number(mg.Mt), export.Number(mg.MtFreq)

	if doc.Fragility, err = fragility(ctx, l, req.X, req.Y); err != nil {
		return nil, err
	}
	if doc.Ultimate, err = ultimate(l, sampling); err != nil {
		return nil, err
	}
	if l.Plant.Delay > 0 {
		if doc.Pade, err = padeProbe(l, doc, mg, req.Pade); err != nil {
			return nil, err
		}
	}
	pr := &ProbeReport{Doc: doc, Formula: l.Family.Formula(), Values: valuesOf(l), Units: units, Sampled: sampling}
	if req.Response {
		probeResponse(pr, l)
	}
	return pr, nil
}

// ultimate returns the ultimate gain and period of the proportional-only
// loop and the settings of the ultimate-cycle rules, each checked with
// the loop's stability test; nil when the loop has no ultimate gain. For
// a sampled loop (sampling not nil) the rules set the digital controller
// of the same structure (see ultimateGain).
func ultimate(l loop.Loop, sampling *Sampling) (*export.Ultimate, error) {
	u, err := ultimateGain(l)
	if u == nil || err != nil {
		return nil, err
	}
	ku, tu := u.Ku, u.Tu
	if rhp := openLoopUnstable(l); rhp > 0 {
		u.RulesApply = false
		u.Note = fmt.Sprintf("the plant has %d pole(s) %s; the ultimate-cycle rules were made for plants stable in open loop and do not apply", rhp, unstableSide(l))
	}
	for _, r := range margins.UltimateCycleRules(ku, tu) {
		rule := export.Rule{Name: r.Name, Source: r.Source, Family: r.Family, Kp: r.Kp, Ki: r.Ki, Kd: r.Kd}
		fam, err := ruleFamily(r.Family, sampling)
		if err != nil {
			return nil, err
		}
		rl := loop.New(l.Plant, fam)
		for i, p := range fam.Params() {
			switch p.Name {
			case "kp":
				rl.Values[i] = r.Kp
			case "ki":
				rl.Values[i] = r.Ki
			case "kd":
				rl.Values[i] = r.Kd
			}
		}
		f := rl.Function()
		v := rl.Test().NewCounter(max(len(f.P), len(f.Q))).Count(f)
		rule.Stable, rule.RHP = v.Stable(), max(v.Unstable, 0)
		u.Rules = append(u.Rules, rule)
	}
	return u, nil
}

// openLoopUnstable returns the number of plant poles in the right half
// plane, by the loop's stability test on the plant denominator.
func openLoopUnstable(l loop.Loop) int {
	v := l.Test().NewCounter(len(l.Plant.Den)).Count(stability.Function{P: l.Plant.Den.Clone().Trim(0)})
	return max(v.Unstable, 0)
}
