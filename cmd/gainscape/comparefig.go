package main

import (
	"fmt"
	"strings"

	"gonum.org/v1/plot/vg"

	"gainscape/regions/export"
	"gainscape/regions/scenario"
	"gainscape/regions/study"
	"gainscape/render"
)

// panelsFigure assembles the figure of the panels: each drawn as map
// draws it, titled with its structure and fixed values, the best points
// marked by name alone (their figures are in the table).
func panelsFigure(c *study.Comparison, sc scenario.Compare, title string) render.Panels {
	fig := render.Panels{Title: title, Columns: sc.Settings.FigureColumns, DPI: sc.Output.DPI,
		Width: vg.Length(sc.Output.WidthCm) * vg.Centimeter, Height: vg.Length(sc.Output.HeightCm) * vg.Centimeter}
	fig.Notes = []string{fmt.Sprintf("Best points under %s: ki, the largest integral gain (best load-disturbance design); σ, the fastest decay.", boundNote(c))}
	fig.MarkLegend = "best point (ki or σ)"
	for _, p := range c.Panels {
		msc := scenario.Default()
		msc.Output.Title = p.Label
		msc.Overlays.Decay = sc.Settings.Decay
		msc.Overlays.MsLevels = sc.Settings.MsLevels
		f := figureOf(p.Map, msc, "")
		f.Marks = nil
		var best []export.Point
		if p.Map.Overlays != nil {
			best = p.Map.Overlays.Best
		}
		for _, b := range best {
			if b.Failed != "" {
				continue
			}
			name := "ki"
			if b.Label == "best "+study.BestDecay {
				name = "σ"
			}
			f.Marks = append(f.Marks, render.Mark{X: float64(b.X), Y: float64(b.Y), Label: name})
		}
		fig.Maps = append(fig.Maps, f)
	}
	return fig
}

// boundNote is the bound in a figure's note.
func boundNote(c *study.Comparison) string { return fmt.Sprintf("Ms ≤ %g", c.Bound) }

// responsesFigure assembles the figure of the step responses of every
// panel's best-ki design on shared axes.
func responsesFigure(c *study.Comparison, sc scenario.Compare, title string) (render.Responses, error) {
	fig := render.Responses{Title: "Step responses of the best load-disturbance designs: " + title, TimeUnit: c.Units.TimeLabel(), DPI: sc.Output.DPI,
		Width: vg.Length(sc.Output.WidthCm) * vg.Centimeter, Height: vg.Length(sc.Output.HeightCm) * vg.Centimeter}
	fig.Notes = []string{fmt.Sprintf("Each panel's design of largest ki with %s; unit steps of the setpoint and of a load at the plant input.", boundNote(c))}
	for k, p := range c.Panels {
		if p.Response == nil {
			continue
		}
		r := p.Response
		fig.Series = append(fig.Series, render.Series{Label: fmt.Sprintf("%d %s: %s", k+1, p.Label, designText(p, p.Table.BestKi.Values)),
			Time: r.Time, Setpoint: r.Setpoint.Output, Load: r.Load.Output})
	}
	var missing []string
	for k, p := range c.Panels {
		if p.Response == nil {
			missing = append(missing, fmt.Sprintf("panel %d (%s)", k+1, p.ResponseFailed))
		}
	}
	if len(missing) > 0 {
		fig.Notes = append(fig.Notes, "Not shown: "+strings.Join(missing, "; ")+".")
	}
	if len(fig.Series) == 0 {
		return fig, userErr("no panel has a best load-disturbance design to draw: %s", strings.Join(missing, "; "))
	}
	return fig, nil
}
