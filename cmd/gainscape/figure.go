package main

import (
	"fmt"
	"math"

	"gonum.org/v1/plot/vg"

	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/scenario"
	"gainscape/regions/study"
	"gainscape/render"
)

// figureOf assembles what the image shows from the computed map.
func figureOf(res *study.MapResult, sc scenario.Scenario, demoLabel string) render.Figure {
	title := sc.Output.Title
	if title == "" {
		title = fmt.Sprintf("G(s) = %s under %s", res.Plant, family.Title(res.Controller))
		if res.Delay > 0 {
			title += fmt.Sprintf(" (dead time %g %s)", res.Delay, res.Units.TimeLabel())
		}
	}
	note := res.Formula
	if fixed := study.ValuesText(res.Fixed); fixed != "" {
		note += "; fixed: " + fixed
	}
	notes := []string{note}
	if res.Sampled != nil {
		notes = append(notes, res.Sampled.Text(res.Units))
	}
	if demoLabel != "" {
		notes = append(notes, demoLabel)
	}
	fig := render.Figure{Map: res.Map, Curves: res.Curves, Title: title, Notes: notes, FreqUnit: res.Units.Freq(),
		Width: vg.Length(sc.Output.WidthCm) * vg.Centimeter, Height: vg.Length(sc.Output.HeightCm) * vg.Centimeter, DPI: sc.Output.DPI}
	if res.Sampled != nil {
		fig.Sample = res.Sampled.T
	}
	if len(res.Compare) > 0 {
		fig.OwnLabel = "continuous"
		if res.Sampled != nil {
			fig.OwnLabel = fmt.Sprintf("T = %g %s", res.Sampled.T, res.Units.TimeLabel())
		}
		for _, e := range res.Compare {
			if e.Own {
				continue
			}
			fig.Compare = append(fig.Compare, render.EdgeSet{Label: e.Label(res.Units), Curves: e.Curves})
		}
	}
	for i, bs := range res.Branches {
		for k, b := range bs {
			if b > 0 {
				p := res.Curves[i].Points[k]
				fig.LaterBranches = append(fig.LaterBranches, render.BranchPoint{X: p.X, Y: p.Y})
			}
		}
	}
	ov := res.Overlays
	if ov == nil {
		return fig
	}
	if ov.Decay != nil && sc.Overlays.Decay {
		fig.Shade = &render.Field{XAxis: ov.XAxis, YAxis: ov.YAxis, Values: ov.Decay.Values, Name: "decay rate σ (" + res.Units.Rate() + ")"}
	}
	// Each quantity keeps its look whatever else is drawn: Ms the first,
	// damping the second, decay rate the third.
	for _, c := range []struct {
		layer *study.Layer
		name  string
		look  int
	}{{ov.Decay, "σ", 2}, {ov.Damping, "ζ", 1}, {ov.Ms, "Ms", 0}} {
		if c.layer != nil && len(c.layer.Levels) > 0 {
			fig.Contours = append(fig.Contours, render.ContourSet{Levels: c.layer.Levels, Lines: c.layer.Lines, Name: c.name, Look: c.look})
		}
	}
	for _, p := range append(append([]export.Point(nil), ov.Marks...), ov.Best...) {
		if p.Failed == "" {
			fig.Marks = append(fig.Marks, render.Mark{X: float64(p.X), Y: float64(p.Y), Label: markLabel(p)})
		}
	}
	return fig
}

// markLabel is the text beside a marked point: its name, decay rate and Ms.
func markLabel(p export.Point) string {
	if !p.Stable {
		return p.Label + ": unstable"
	}
	s := fmt.Sprintf("%s: σ=%.3g", p.Label, float64(p.Decay))
	if !math.IsNaN(float64(p.Ms)) {
		s += fmt.Sprintf(", Ms=%.3g", float64(p.Ms))
	}
	return s
}
