package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"gainscape/regions/boundary"
	"gainscape/regions/export"
	"gainscape/regions/plane"
	"gainscape/regions/scenario"
)

// writeCSV writes the boundary polylines, one point per row:
// curve, kind, x, y, omega (empty where undefined).
func writeCSV(w io.Writer, s plane.Setup, curves []boundary.Curve) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"curve", "kind", s.X.Param, s.Y.Param, "omega_rad_per_s"})
	f := func(v float64) string {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return ""
		}
		return strconv.FormatFloat(v, 'g', 12, 64)
	}
	for k, c := range curves {
		for _, p := range c.Points {
			cw.Write([]string{strconv.Itoa(k + 1), string(c.Kind), f(p.X), f(p.Y), f(p.Omega)})
		}
	}
	cw.Flush()
	return cw.Error()
}

// writeNote writes a short Markdown block for a design note: the image,
// the loop, the stable ranges and the caution.
func writeNote(w io.Writer, res *mapResult, sc scenario.Scenario, plant, imageLink string) error {
	s, m, curves := res.setup, res.m, res.curves
	st := m.Stats()
	var b strings.Builder
	fmt.Fprintf(&b, "### Stability map: %s in the %s–%s plane\n\n", strings.ToUpper(s.Family.Name()), s.X.Param, s.Y.Param)
	if imageLink != "" {
		fmt.Fprintf(&b, "![Stability map of %s under %s](%s)\n\n", plant, strings.ToUpper(s.Family.Name()), imageLink)
	}
	fmt.Fprintf(&b, "- Plant: G(s) = `%s`\n", plant)
	fmt.Fprintf(&b, "- Controller: %s", s.Family.Formula())
	if fixed := fixedText(s.Loop, s.XIndex, s.YIndex); fixed != "" {
		fmt.Fprintf(&b, ", with %s", fixed)
	}
	b.WriteString("\n")
	fmt.Fprintf(&b, "- Window: %s from %g to %g, %s from %g to %g, %d × %d nodes\n", s.X.Param, s.X.Min, s.X.Max, s.Y.Param, s.Y.Min, s.Y.Max, s.X.N, s.Y.N)
	if st.Stable > 0 {
		fmt.Fprintf(&b, "- Stable: %.1f%% of the window; stable nodes span %s %.4g to %.4g and %s %.4g to %.4g\n",
			100*st.StableFraction(), s.X.Param, st.XMin, st.XMax, s.Y.Param, st.YMin, st.YMax)
	} else {
		b.WriteString("- Stable: no stable node in the window\n")
	}
	if lo, hi, ok := export.OmegaRange(curves); ok {
		fmt.Fprintf(&b, "- On the complex-pair edges the loop oscillates at ω from %.4g to %.4g rad/s\n", lo, hi)
	}
	if st.Undecided > 0 {
		fmt.Fprintf(&b, "- %d nodes could not be decided by the sign-array test\n", st.Undecided)
	}
	if res.over != nil {
		for _, p := range append(append([]pointInfo(nil), res.over.marks...), res.over.best...) {
			fmt.Fprintf(&b, "- %s at %s = %.4g, %s = %.4g: %s\n", pointName(p), s.X.Param, p.X, s.Y.Param, p.Y, pointFigures(p))
		}
	}
	if len(sc.Overlays.MsLevels) > 0 {
		fmt.Fprintf(&b, "- Ms iso-lines drawn at %s\n", numbersText(sc.Overlays.MsLevels))
	}
	fmt.Fprintf(&b, "\n> %s\n", caution)
	_, err := io.WriteString(w, b.String())
	return err
}
