package study

import (
	"context"
	"fmt"
	"math"

	"gainscape/regions/export"
	"gainscape/regions/family"
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
	char := l.Characteristic()
	if !char.Finite() {
		return nil, inputErr("--set", "fixed", "", "the characteristic polynomial has non-finite coefficients")
	}
	units := Units{req.Loop.TimeUnit}
	doc := &export.Probe{
		Plant: req.Loop.PlantText(), Controller: l.Family.Name(), TimeUnit: units.Key(),
		Values: valueMap(l), Characteristic: char.Descending(), Caution: Caution,
	}
	rep := l.Test().Report(l.Function())
	if rep.Unstable < 0 {
		return nil, fmt.Errorf("the sign-array test cannot decide this point: %s", rep.Reason)
	}
	for _, r := range rep.Table {
		doc.SignArray = append(doc.SignArray, export.SignRow{Power: r.Power, Entries: r.Entries, Epsilon: r.Epsilon, Auxiliary: r.Auxiliary})
	}
	if rep.Auxiliary != nil {
		doc.Aux = rep.Auxiliary.Descending()
	}
	doc.RHP, doc.JW, doc.DegreeDrop, doc.Stable = rep.Unstable, rep.Boundary, rep.Infinite, rep.Stable()
	doc.CountFrom = rep.Method
	doc.JWOmegas = append([]float64{}, rep.Omegas...)

	poles, err := margins.Poles(char)
	if err != nil {
		return nil, err
	}
	for _, p := range poles {
		doc.Poles = append(doc.Poles, [2]float64{real(p), imag(p)})
	}
	doc.DecayRate, doc.MinDamping = margins.DecayRate(poles), margins.MinDamping(poles)

	num, den := l.Open()
	mg, err := margins.Loop{Num: num, Den: den}.Margins()
	if err != nil {
		return nil, err
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
	doc.Ms, doc.MsFreq, doc.Mt, doc.MtFreq = mg.Ms, export.Number(mg.MsFreq), mg.Mt, export.Number(mg.MtFreq)

	if doc.Fragility, err = fragility(ctx, l, req.X, req.Y); err != nil {
		return nil, err
	}
	if doc.Ultimate, err = ultimate(l); err != nil {
		return nil, err
	}
	pr := &ProbeReport{Doc: doc, Formula: l.Family.Formula(), Values: valuesOf(l), Units: units}
	if req.Response {
		probeResponse(pr, l)
	}
	return pr, nil
}

// ultimate returns the ultimate gain and period of the proportional-only
// loop and the settings of the ultimate-cycle rules, each checked with
// the loop's stability test; nil when the loop has no ultimate gain.
func ultimate(l loop.Loop) (*export.Ultimate, error) {
	ku, tu, ok := margins.Ultimate(l.Plant.Num, l.Plant.Den, l.Test())
	if !ok {
		return nil, nil
	}
	u := &export.Ultimate{Ku: ku, Tu: tu, RulesApply: true}
	if rhp := openLoopUnstable(l); rhp > 0 {
		u.RulesApply = false
		u.Note = fmt.Sprintf("the plant has %d pole(s) in the right half plane; the ultimate-cycle rules were made for plants stable in open loop and do not apply", rhp)
	}
	for _, r := range margins.UltimateCycleRules(ku, tu) {
		rule := export.Rule{Name: r.Name, Source: r.Source, Family: r.Family, Kp: r.Kp, Ki: r.Ki, Kd: r.Kd}
		fam, err := family.Lookup(r.Family)
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
		v := rl.Test().NewCounter(len(rl.Characteristic())).Count(rl.Function())
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
