package study

import (
	"context"
	"fmt"
	"math"

	"gainscape/regions/export"
	"gainscape/regions/margins"
)

// ProbeRequest is one design point: the loop with every parameter value,
// and optionally the names of the two parameters spanning the plane in
// which the distance to the nearest edge is measured (default: the
// family's first two).
type ProbeRequest struct {
	Loop LoopSpec
	X, Y string
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
	if ku, tu, ok := margins.Ultimate(l.Plant.Num, l.Plant.Den, l.Test()); ok {
		u := &export.Ultimate{Ku: ku, Tu: tu}
		for _, r := range margins.UltimateCycleRules(ku, tu) {
			u.Rules = append(u.Rules, export.Rule{Name: r.Name, Source: r.Source, Family: r.Family, Kp: r.Kp, Ki: r.Ki, Kd: r.Kd})
		}
		doc.Ultimate = u
	}
	return &ProbeReport{Doc: doc, Formula: l.Family.Formula(), Values: valuesOf(l), Units: units}, nil
}
