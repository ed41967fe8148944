package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"gonum.org/v1/plot/vg"

	"gainscape/regions/boundary"
	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/isoline"
	"gainscape/regions/margins"
	"gainscape/regions/overlay"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
	"gainscape/render"
)

// defaultKiBound is the Ms limit of the ki search when the scenario sets
// none: the tight end of the usual robustness band 1.4–2.0 (common
// practice).
const defaultKiBound = 1.4

// overlays are the quantities computed over the stable region.
type overlays struct {
	grids *overlay.Grids
	marks []pointInfo
	best  []pointInfo
}

// pointInfo is a marked or found design point with its figures.
type pointInfo struct {
	Label     string             `json:"label"`
	Criterion string             `json:"criterion,omitempty"`
	Values    map[string]float64 `json:"values"`
	X         float64            `json:"x"`
	Y         float64            `json:"y"`
	Stable    bool               `json:"stable"`
	Decay     export.Number      `json:"decay_rate"`
	Damping   export.Number      `json:"min_damping"`
	Ms        export.Number      `json:"ms"`
}

// compute evaluates the map, its edges and the overlays the scenario asks
// for.
func compute(ctx context.Context, job plane.Setup, sc scenario.Scenario, f mapFlags, stderr io.Writer) (*mapResult, error) {
	bar := newProgress(stderr, "mapping", job.Y.N, f.quiet)
	m, err := grid.Evaluate(ctx, job, grid.Options{Workers: f.workers, Progress: bar.set})
	bar.finish()
	if err != nil {
		return nil, err
	}
	curves, err := boundary.Trace(ctx, job, m, f.workers)
	if err != nil {
		return nil, err
	}
	res := &mapResult{setup: job, m: m, curves: curves, demo: f.demoLabel}
	ov := sc.Overlays
	wantMs := len(ov.MsLevels) > 0 || slices.Contains(ov.Best, bestIntegral)
	if !ov.Decay && len(ov.DecayLevels) == 0 && len(ov.DampingLevels) == 0 && !wantMs && len(ov.Best) == 0 && len(ov.Marks) == 0 {
		return res, nil
	}
	opt := overlay.Options{Workers: f.workers, Damping: len(ov.DampingLevels) > 0}
	if wantMs {
		ev, err := msEvaluator(job)
		if err != nil {
			return nil, err
		}
		opt.Sensitivity = ev.Ms
	}
	bar = newProgress(stderr, "overlays", job.Y.N, f.quiet)
	opt.Progress = bar.set
	g, err := overlay.Compute(ctx, job, m, opt)
	bar.finish()
	if err != nil {
		return nil, err
	}
	res.over = &overlays{grids: g}
	for k, mk := range ov.Marks {
		p, err := markPoint(job, mk)
		if err != nil {
			return nil, err
		}
		p.Label = string(rune('A' + k%26))
		res.over.marks = append(res.over.marks, p)
	}
	for _, b := range ov.Best {
		var o overlay.Optimum
		var err error
		switch b {
		case bestDecay:
			o, err = overlay.BestDecay(job, g, opt)
		case bestIntegral:
			bound := ov.MsBound
			if bound == 0 {
				bound = defaultKiBound
			}
			o, err = overlay.BestIntegral(job, g, opt, bound)
		}
		if err != nil {
			return nil, userErr("--best %s: %v", b, err)
		}
		p, _ := pointAt(job, o.X, o.Y)
		p.Label, p.Criterion = "best "+b, o.Criterion
		res.over.best = append(res.over.best, p)
	}
	return res, nil
}

// msEvaluator returns a fast Ms evaluator whose frequency grid covers the
// loop at the centre of the window.
func msEvaluator(job plane.Setup) (*margins.MsEvaluator, error) {
	centre := job.With(job.XIndex, 0.5*(job.X.Min+job.X.Max), job.YIndex, 0.5*(job.Y.Min+job.Y.Max))
	cn, cd := family.Controller(centre.Family, centre.Values)
	lo, hi := margins.NewLoop(centre.PlantNum, centre.PlantDen, cn, cd).FrequencyRange()
	// The plant's own resonances are the same at every node; the grid is
	// enriched around them so that no narrow peak of |S| is missed.
	var roots []complex128
	for _, p := range []poly.Poly{centre.PlantNum, centre.PlantDen} {
		if r, err := p.Trim(0).Roots(); err == nil {
			roots = append(roots, r...)
		}
	}
	return margins.NewMsEvaluatorNear(lo, hi, margins.DefaultMsPerDecade, overlay.OpenLoopLen(job), margins.DefaultMsSteps, roots)
}

// markPoint places a --mark in the plane: it must give both axis
// parameters; others it gives change the loop at that point only.
func markPoint(job plane.Setup, vals []spec.Value) (pointInfo, error) {
	x, y := math.NaN(), math.NaN()
	loop := job.Loop
	loop.Values = append([]float64(nil), loop.Values...)
	for _, v := range vals {
		i, err := family.Index(loop.Family, v.Param)
		if err != nil {
			return pointInfo{}, userErr("--mark %s=%g: %v", v.Param, v.V, err)
		}
		loop.Values[i] = v.V
		switch i {
		case job.XIndex:
			x = v.V
		case job.YIndex:
			y = v.V
		}
	}
	if math.IsNaN(x) || math.IsNaN(y) {
		return pointInfo{}, userErr("--mark %s: give both %s and %s", valuesList(vals), job.X.Param, job.Y.Param)
	}
	job.Loop = loop
	return pointAt(job, x, y)
}

// pointAt describes the loop at (x, y) of the plane.
func pointAt(job plane.Setup, x, y float64) (pointInfo, error) {
	l := job.With(job.XIndex, x, job.YIndex, y)
	p := pointInfo{Values: fixedMap(l), X: x, Y: y}
	poles, err := margins.Poles(l.Characteristic())
	if err != nil {
		return p, err
	}
	p.Decay, p.Damping = export.Number(margins.DecayRate(poles)), export.Number(margins.MinDamping(poles))
	p.Stable = margins.DecayRate(poles) > 0
	cn, cd := family.Controller(l.Family, l.Values)
	mg, err := margins.NewLoop(l.PlantNum, l.PlantDen, cn, cd).Margins()
	p.Ms = export.Number(math.NaN())
	if err == nil && p.Stable {
		p.Ms = export.Number(mg.Ms)
	}
	return p, nil
}

// figureOf assembles what the image shows.
func figureOf(res *mapResult, sc scenario.Scenario, plant string) render.Figure {
	job := res.setup
	title := sc.Output.Title
	if title == "" {
		title = fmt.Sprintf("G(s) = %s under %s", plant, strings.ToUpper(job.Family.Name()))
	}
	note := job.Family.Formula()
	if fixed := fixedText(job.Loop, job.XIndex, job.YIndex); fixed != "" {
		note += "; fixed: " + fixed
	}
	notes := []string{note}
	if res.demo != "" {
		notes = append(notes, res.demo)
	}
	fig := render.Figure{Map: res.m, Curves: res.curves, Title: title, Notes: notes,
		Width: vg.Length(sc.Output.WidthCm) * vg.Centimeter, Height: vg.Length(sc.Output.HeightCm) * vg.Centimeter}
	if res.over == nil {
		return fig
	}
	g, ov := res.over.grids, sc.Overlays
	field := func(v []float64, name string) *render.Field {
		return &render.Field{XAxis: g.XAxis, YAxis: g.YAxis, Values: v, Name: name}
	}
	decay := field(g.Decay, "decay rate σ (1/s)")
	if ov.Decay {
		fig.Shade = decay
	}
	if len(ov.DecayLevels) > 0 {
		fig.Contours = append(fig.Contours, render.ContourSet{Field: decay, Levels: ov.DecayLevels, Name: "σ"})
	}
	if len(ov.DampingLevels) > 0 && g.Damping != nil {
		fig.Contours = append(fig.Contours, render.ContourSet{Field: field(g.Damping, "damping ratio ζ"), Levels: ov.DampingLevels, Name: "ζ"})
	}
	if len(ov.MsLevels) > 0 && g.Ms != nil {
		fig.Contours = append(fig.Contours, render.ContourSet{Field: field(g.Ms, "Ms"), Levels: ov.MsLevels, Name: "Ms"})
	}
	for _, p := range append(append([]pointInfo(nil), res.over.marks...), res.over.best...) {
		fig.Marks = append(fig.Marks, render.Mark{X: p.X, Y: p.Y, Label: markLabel(p)})
	}
	return fig
}

// markLabel is the text beside a marked point: its name, decay rate and Ms.
func markLabel(p pointInfo) string {
	if !p.Stable {
		return p.Label + ": unstable"
	}
	s := fmt.Sprintf("%s: σ=%.3g", p.Label, float64(p.Decay))
	if !math.IsNaN(float64(p.Ms)) {
		s += fmt.Sprintf(", Ms=%.3g", float64(p.Ms))
	}
	return s
}

// dataOf assembles the JSON document: the map, its edges and every
// overlay the image draws.
func dataOf(res *mapResult, sc scenario.Scenario, plant string) *export.Region {
	job := res.setup
	doc := export.NewRegion(res.m, res.curves)
	doc.Plant, doc.Controller = plant, job.Family.Name()
	doc.Fixed = fixedMap(job.Loop, job.XIndex, job.YIndex)
	if res.over == nil {
		return doc
	}
	g, ov := res.over.grids, sc.Overlays
	layers := map[string]any{}
	add := func(name string, v []float64, levels []float64) {
		if v == nil {
			return
		}
		// The iso-lines are traced by the same routine the image uses, so
		// the data hold exactly the lines drawn.
		contours := []map[string]any{}
		for _, level := range levels {
			lines := isoline.Trace(g.XAxis, g.YAxis, v, level)
			if lines == nil {
				lines = []isoline.Line{}
			}
			contours = append(contours, map[string]any{"level": level, "lines": lines})
		}
		layers[name] = map[string]any{"values": rowsOf(v, g.XAxis.N, g.YAxis.N), "levels": nonNil(levels), "contours": contours}
	}
	add("decay_rate", g.Decay, ov.DecayLevels)
	add("min_damping", g.Damping, ov.DampingLevels)
	add("ms", g.Ms, ov.MsLevels)
	doc.Extra = map[string]any{"overlays": layers, "marks": nonNilPoints(res.over.marks), "best": nonNilPoints(res.over.best)}
	return doc
}

// rowsOf lays a row-major slice out as rows, row 0 at y = min, NaN as null.
func rowsOf(v []float64, nx, ny int) [][]export.Number {
	rows := make([][]export.Number, ny)
	for j := range rows {
		rows[j] = make([]export.Number, nx)
		for i := range rows[j] {
			rows[j][i] = export.Number(v[j*nx+i])
		}
	}
	return rows
}

func nonNil(v []float64) []float64 {
	if v == nil {
		return []float64{}
	}
	return v
}

func nonNilPoints(p []pointInfo) []pointInfo {
	if p == nil {
		return []pointInfo{}
	}
	return p
}

// valuesList writes values as --mark takes them.
func valuesList(vals []spec.Value) string {
	parts := make([]string, len(vals))
	for i, v := range vals {
		parts[i] = fmt.Sprintf("%s=%g", v.Param, v.V)
	}
	return strings.Join(parts, ",")
}
