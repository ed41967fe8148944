package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"gainscape/regions/family"
	"gainscape/regions/scenario"
	"gainscape/regions/study"
)

// writeCSV writes the boundary polylines, one point per row:
// curve, kind, x, y, omega (empty where undefined).
func writeCSV(w io.Writer, res *study.MapResult) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"curve", "kind", res.X.Param, res.Y.Param, "omega_rad_per_" + res.Units.Key()})
	f := func(v float64) string {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return ""
		}
		return strconv.FormatFloat(v, 'g', 12, 64)
	}
	for k, c := range res.Curves {
		for _, p := range c.Points {
			cw.Write([]string{strconv.Itoa(k + 1), c.Kind.String(), f(p.X), f(p.Y), f(p.Omega)})
		}
	}
	cw.Flush()
	return cw.Error()
}

// writeNote writes a short Markdown block for a design note: the image,
// the loop, the stable ranges and the caution.
func writeNote(w io.Writer, res *study.MapResult, sc scenario.Scenario, imageLink string) error {
	st := res.Stats
	x, y := res.X, res.Y
	name := family.Title(res.Controller)
	var b strings.Builder
	fmt.Fprintf(&b, "### Stability map: %s in the %s–%s plane\n\n", name, x.Param, y.Param)
	if imageLink != "" {
		fmt.Fprintf(&b, "![Stability map of %s under %s](%s)\n\n", res.Plant, name, imageLink)
	}
	fmt.Fprintf(&b, "- Plant: G(s) = `%s`\n", res.Plant)
	fmt.Fprintf(&b, "- Controller: %s", res.Formula)
	if fixed := study.ValuesText(res.Fixed); fixed != "" {
		fmt.Fprintf(&b, ", with %s", fixed)
	}
	b.WriteString("\n")
	if res.Sampled != nil {
		fmt.Fprintf(&b, "- Sampling: %s\n", res.Sampled.Text(res.Units))
	}
	fmt.Fprintf(&b, "- Window: %s from %g to %g, %s from %g to %g, %d × %d nodes\n", x.Param, x.Min, x.Max, y.Param, y.Min, y.Max, x.N, y.N)
	if st.Stable > 0 {
		fmt.Fprintf(&b, "- Stable: %.1f%% of the window; stable nodes span %s %.4g to %.4g and %s %.4g to %.4g\n",
			100*st.StableFraction(), x.Param, st.XMin, st.XMax, y.Param, st.YMin, st.YMax)
	} else {
		b.WriteString("- Stable: no stable node in the window\n")
	}
	if st.Marginal > 0 {
		fmt.Fprintf(&b, "- Marginal: %d nodes have a root %s (on an edge, not stable)\n", st.Marginal, boundaryWhere(res))
	}
	for _, e := range res.Compare {
		fmt.Fprintf(&b, "- Gain limit, %s: stable for %s at %s = %.4g\n", e.Label(res.Units), e.LimitText(x.Param, res.Units), y.Param, e.LimitY)
	}
	if lo, hi, ok := res.OmegaRange(); ok {
		fmt.Fprintf(&b, "- On the complex-pair edges the loop oscillates at ω from %s to %.4g %s\n", lowOmegaText(lo), hi, res.Units.Freq())
	}
	if st.Undecided > 0 {
		fmt.Fprintf(&b, "- %d nodes could not be decided by the stability test\n", st.Undecided)
	}
	for _, l := range deadTimeLines(res) {
		fmt.Fprintf(&b, "- %s: %s\n", strings.ToUpper(l[0][:1])+l[0][1:], l[1])
	}
	for _, p := range points(res) {
		if p.Failed != "" {
			fmt.Fprintf(&b, "- %s: none found (%s)\n", pointName(p), p.Failed)
			continue
		}
		fmt.Fprintf(&b, "- %s at %s = %.4g, %s = %.4g: %s", pointName(p), x.Param, float64(p.X), y.Param, float64(p.Y), pointFigures(p, res.Units))
		if p.Warning != "" {
			fmt.Fprintf(&b, "; %s", p.Warning)
		}
		b.WriteString("\n")
	}
	if len(sc.Overlays.MsLevels) > 0 {
		fmt.Fprintf(&b, "- Ms iso-lines drawn at %s\n", numbersText(sc.Overlays.MsLevels))
	}
	fmt.Fprintf(&b, "\n> %s\n", caution)
	_, err := io.WriteString(w, b.String())
	return err
}
