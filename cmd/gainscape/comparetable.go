package main

import (
	"fmt"
	"io"
	"slices"
	"strings"
	"text/tabwriter"
	"time"

	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/study"
)

// compareTitle is the figure's title: the one given, or the plant or
// plants and the structures compared.
func compareTitle(c *study.Comparison, given string) string {
	if given != "" {
		return given
	}
	var plants, ctrls []string
	for _, p := range c.Panels {
		g := "G(s) = " + p.Map.Plant
		if p.PlantLabel != "" {
			g = p.PlantLabel + " " + g
		}
		if !slices.Contains(plants, g) {
			plants = append(plants, g)
		}
		if name := family.Title(p.Map.Controller); !slices.Contains(ctrls, name) {
			ctrls = append(ctrls, name)
		}
	}
	return strings.Join(plants, "; ") + ": " + andList(ctrls) + " compared"
}

// andList writes "a, b and c".
func andList(v []string) string {
	if len(v) < 2 {
		return strings.Join(v, "")
	}
	return strings.Join(v[:len(v)-1], ", ") + " and " + v[len(v)-1]
}

// num writes a figure to four significant digits, "–" when missing.
func num(v export.Number) string {
	if !v.Valid() {
		return "–"
	}
	return fmt.Sprintf("%.4g", float64(v))
}

// designText writes a design's values in the panel's axes, then any
// other value that differs from the panel's label (the kd of a search
// over kd).
func designText(p *study.PanelResult, values map[string]float64, extra ...string) string {
	if len(values) == 0 {
		return "–"
	}
	names := []string{p.Map.X.Param, p.Map.Y.Param}
	names = append(names, extra...)
	var parts []string
	for _, n := range names {
		if v, ok := values[n]; ok {
			parts = append(parts, fmt.Sprintf("%s=%.4g", n, v))
		}
	}
	return strings.Join(parts, " ")
}

// tableRow is one row of the printed and written tables.
type tableRow struct {
	name string
	load []string // design, Ms, GM, PM, IE, IAE, overshoot, settling
	more []string // best decay design, σ, ζ, Ms, min Ms, Ku, Tu, stable
}

// tableRows lays out the rows of the comparison: one per panel, and one
// more for each search over kd.
func tableRows(c *study.Comparison) []tableRow {
	var rows []tableRow
	for k, p := range c.Panels {
		t := p.Table
		r := tableRow{name: fmt.Sprintf("%d %s", k+1, p.Label)}
		if b := t.BestKi; b.Failed != "" {
			r.load = []string{"none: " + b.Failed, "", "", "", "", "", "", ""}
		} else {
			r.load = []string{designText(p, b.Values), num(b.Ms), num(b.GainMargin), num(b.PhaseMargin), num(b.IE), "–", "–", "–"}
			if p.Response != nil {
				f := p.Response.Figures
				r.load[5], r.load[6], r.load[7] = num(export.Number(f.IAELoad)), num(export.Number(f.Overshoot)), num(export.Number(f.SettlingTime))
			}
			if b.Warning != "" {
				r.load[0] += " (on the window's edge)"
			}
		}
		d := t.BestDecay
		ku, tu := "–", "–"
		if t.Ultimate != nil {
			ku, tu = num(t.Ultimate.Ku), num(t.Ultimate.Tu)
		}
		design := designText(p, d.Values)
		if d.Failed != "" {
			design = "none: " + d.Failed
		} else if d.Warning != "" {
			design += " (on the window's edge)"
		}
		r.more = []string{design, num(d.DecayRate), num(d.MinDamping), num(d.Ms), num(t.MinMs), ku, tu, fmt.Sprintf("%.1f%%", 100*t.StableShare)}
		rows = append(rows, r)
		if og := t.OverKd; og != nil && !p.KdChosen && p.OverKdFrom == 0 {
			name := fmt.Sprintf("%d %s over kd %g…%g", k+1, family.Title(p.Map.Controller), og.Range[0], og.Range[1])
			row := tableRow{name: name}
			if og.Failed != "" {
				row.load = []string{"none: " + og.Failed, "", "", "", "", "", "", ""}
			} else {
				row.load = []string{designText(p, og.Values, "kd"), num(og.Ms), num(og.GainMargin), num(og.PhaseMargin), num(og.IE), "", "", ""}
				if og.Warning != "" {
					row.load[0] += " (at an end of the kd range)"
				}
			}
			rows = append(rows, row)
		}
	}
	return rows
}

var (
	loadHeads = []string{"best load design", "Ms", "GM", "PM (°)", "IE = 1/ki", "IAE load", "overshoot (%)", "settling (2%)"}
	moreHeads = []string{"best decay design", "σ", "ζ", "Ms", "min Ms", "Ku", "Tu", "stable"}
)

// boundText says which bound the searches used.
func boundText(c *study.Comparison) string {
	s := fmt.Sprintf("Ms ≤ %g", c.Bound)
	if c.BoundDefault {
		s += " (the default; --ms-bound sets another)"
	}
	return s
}

// printComparison writes the text report: the plant, each panel's
// window and how it was chosen, the table and the time taken.
func printComparison(w io.Writer, c *study.Comparison, title string, elapsed time.Duration) {
	u := c.Units
	fmt.Fprintln(w, title)
	fmt.Fprintf(w, "bound       %s for every search\n", boundText(c))
	for k, p := range c.Panels {
		x, y := p.Map.X, p.Map.Y
		fmt.Fprintf(w, "panel %d     %s: %s %g…%g × %s %g…%g, %d × %d nodes\n", k+1, p.Label, x.Param, x.Min, x.Max, y.Param, y.Min, y.Max, x.N, y.N)
		if p.Window.AutoX || p.Window.AutoY {
			fmt.Fprintf(w, "            window chosen: %s\n", p.Window.Rule)
		}
		switch {
		case p.OverKdFrom > 0:
			fmt.Fprintf(w, "            best ki over kd: as for panel %d\n", p.OverKdFrom)
		case p.OverKdRule != "":
			fmt.Fprintf(w, "            best ki over kd: %s, the window of each kd chosen likewise\n", p.OverKdRule)
			if og := p.Table.OverKd; og != nil && og.Warning != "" {
				fmt.Fprintf(w, "            warning: %s\n", og.Warning)
			}
		}
	}
	rows := tableRows(c)
	fmt.Fprintf(w, "\nBest load-disturbance design: %s (%s)\n", study.LoadCriterion+", "+boundText(c), "after Åström, Panagopoulos & Hägglund, Automatica 34(5), 1998")
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "panel\t%s\n", strings.Join(loadHeads, "\t"))
	for _, r := range rows {
		fmt.Fprintf(tw, "%s\t%s\n", r.name, strings.Join(r.load, "\t"))
	}
	tw.Flush()
	fmt.Fprintf(w, "(IE and IAE in %s for a unit load step at the plant input; settling time in %s, of the setpoint step; GM a factor)\n", u.TimeLabel(), u.TimeLabel())
	fmt.Fprintf(w, "\nOther figures (best decay with %s; σ in %s; Tu in %s; min Ms over the stable nodes)\n", fmt.Sprintf("Ms ≤ %g", c.Bound), u.Rate(), u.TimeLabel())
	tw = tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "panel\t%s\n", strings.Join(moreHeads, "\t"))
	for _, r := range rows {
		if r.more != nil {
			fmt.Fprintf(tw, "%s\t%s\n", r.name, strings.Join(r.more, "\t"))
		}
	}
	tw.Flush()
	for k, p := range c.Panels {
		if p.ResponseFailed != "" && p.Table.BestKi.Failed == "" {
			fmt.Fprintf(w, "panel %d: no step response: %s\n", k+1, p.ResponseFailed)
		}
	}
	if c.ResponseWindow > 0 {
		fmt.Fprintf(w, "responses   over %.4g %s, the longest window any best design needs (its slowest pole decayed to 0.1%%)\n", c.ResponseWindow, u.TimeLabel())
	}
	nodes := 0
	for _, p := range c.Panels {
		nodes += p.Map.Stats.Nodes
	}
	fmt.Fprintf(w, "\nnodes       %d in %d panels, with windows, searches and responses, in %s\n", nodes, len(c.Panels), elapsed.Round(time.Millisecond))
}

// writeCompareNote writes a Markdown block for a design note: the
// figure, the plant, the two tables with the bound in their headers, the
// criterion's source and the caution.
func writeCompareNote(w io.Writer, c *study.Comparison, title, imageLink, responsesLink string) error {
	var b strings.Builder
	fmt.Fprintf(&b, "### %s\n\n", title)
	if imageLink != "" {
		fmt.Fprintf(&b, "![%s](%s)\n\n", title, imageLink)
	}
	for k, p := range c.Panels {
		x, y := p.Map.X, p.Map.Y
		fmt.Fprintf(&b, "- Panel %d, %s: %s, plant `%s`, window %s %g to %g, %s %g to %g", k+1, p.Label, p.Map.Formula, p.Map.Plant, x.Param, x.Min, x.Max, y.Param, y.Min, y.Max)
		if p.Window.AutoX || p.Window.AutoY {
			b.WriteString(" (chosen automatically)")
		}
		if og := p.Table.OverKd; og != nil && p.OverKdFrom == 0 {
			fmt.Fprintf(&b, "; best ki over kd searched for kd from %g to %g", og.Range[0], og.Range[1])
			if og.Warning != "" {
				fmt.Fprintf(&b, " (%s)", og.Warning)
			}
		}
		b.WriteString("\n")
	}
	fmt.Fprintf(&b, "\n**Best load-disturbance design, %s**: the %s. Criterion after K. J. Åström, H. Panagopoulos and T. Hägglund, Automatica 34(5), 1998.\n\n", boundText(c), study.LoadCriterion)
	rows := tableRows(c)
	mdTable(&b, append([]string{"panel"}, loadHeads...), rows, func(r tableRow) []string { return r.load })
	fmt.Fprintf(&b, "\nIE and IAE in %s for a unit load step at the plant input; overshoot and settling time of a unit setpoint step; GM as a factor.\n\n", c.Units.TimeLabel())
	fmt.Fprintf(&b, "**Other figures** (best decay rate with Ms ≤ %g; σ in %s; smallest Ms over the stable grid nodes; Ku and Tu of the proportional-only loop):\n\n", c.Bound, c.Units.Rate())
	mdTable(&b, append([]string{"panel"}, moreHeads...), rows, func(r tableRow) []string { return r.more })
	if responsesLink != "" {
		fmt.Fprintf(&b, "\n![Step responses of the best load-disturbance designs](%s)\n", responsesLink)
	}
	fmt.Fprintf(&b, "\n> %s\n", caution)
	_, err := io.WriteString(w, b.String())
	return err
}

// mdTable writes a Markdown table of the rows that have cells.
func mdTable(b *strings.Builder, heads []string, rows []tableRow, cells func(tableRow) []string) {
	fmt.Fprintf(b, "| %s |\n|%s\n", strings.Join(heads, " | "), strings.Repeat(" --- |", len(heads)))
	for _, r := range rows {
		if c := cells(r); c != nil {
			fmt.Fprintf(b, "| %s | %s |\n", r.name, strings.Join(c, " | "))
		}
	}
}
