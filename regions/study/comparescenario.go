package study

import (
	"fmt"
	"math"

	"gainscape/regions/export"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
)

// CompareRequestOf turns a validated compare scenario into the request
// Compare takes: each panel on the shared plant unless it has its own,
// with the shared sample time unless it sets one, and its axes as given
// (a bare name, or none, leaves the range to the window rule). Errors are
// *InputError values naming the scenario key.
func CompareRequestOf(c scenario.Compare) (CompareRequest, error) {
	req := CompareRequest{Columns: c.Settings.Columns, Rows: c.Settings.Rows, MsBound: c.Settings.MsBound,
		MsLevels: c.Settings.MsLevels, Decay: c.Settings.Decay}
	if len(c.Settings.KdRange) == 2 {
		req.KdRange = &[2]float64{c.Settings.KdRange[0], c.Settings.KdRange[1]}
	}
	for i, p := range c.Panels {
		key := fmt.Sprintf("panels.%d", i+1)
		ls := LoopSpec{Plant: c.Loop.Plant, Num: c.Loop.Numerator, Den: c.Loop.Denominator, Controller: p.Controller,
			Fixed: p.Fixed, TimeUnit: c.Loop.TimeUnit, Sample: c.Loop.Sample, Integral: c.Loop.Integral}
		if p.Plant != "" || p.Numerator != nil {
			ls.Plant, ls.Num, ls.Den = p.Plant, p.Numerator, p.Denominator
		}
		if p.HasSample {
			ls.Sample = p.Sample
		}
		ps := PanelSpec{Loop: ls, PlantLabel: p.PlantLabel}
		var err error
		if ps.X, ps.AutoX, err = panelAxis(p.X, key+".x"); err != nil {
			return req, err
		}
		if ps.Y, ps.AutoY, err = panelAxis(p.Y, key+".y"); err != nil {
			return req, err
		}
		req.Panels = append(req.Panels, ps)
	}
	return req, nil
}

// panelAxis reads a panel's axis: "" for the structure's default, a name
// for a chosen range, or name=min:max.
func panelAxis(text, key string) (spec.Axis, bool, error) {
	if text == "" {
		return spec.Axis{}, true, nil
	}
	a, ranged, err := spec.ParseAxisOrName(text)
	if err != nil {
		return a, false, &InputError{Flag: "--x", Key: key, Value: text, Err: err}
	}
	return a, !ranged, nil
}

// Data returns the compare --data document, titled title.
func (c *Comparison) Data(title string) *export.Compare {
	doc := &export.Compare{Title: title, TimeUnit: c.Units.Key(), MsBound: c.Bound, Criterion: LoadCriterion, Source: LoadSource,
		ResponseWindow: export.Number(c.ResponseWindow), Caution: Caution}
	if c.ResponseWindow == 0 {
		doc.ResponseWindow = export.Number(math.NaN())
	}
	for _, pr := range c.Panels {
		cut := pr.Window.Cut
		if cut == nil {
			cut = []string{}
		}
		p := export.ComparePanel{Region: pr.Map.Data(), Label: pr.Label, PlantLabel: pr.PlantLabel, Sample: pr.Sample,
			Window: export.WindowChoice{AutoX: pr.Window.AutoX, AutoY: pr.Window.AutoY, Rule: pr.Window.Rule, Cut: cut},
			Table:  pr.Table, ResponseFailed: pr.ResponseFailed}
		if pr.Response != nil {
			f := pr.Response.Figures
			p.Responses = &f
		}
		doc.Panels = append(doc.Panels, p)
	}
	return doc
}
