package scenario

import (
	"fmt"
	"slices"
	"strings"

	"gainscape/regions/spec"
)

// Validate checks that the comparison is complete and consistent in
// itself, as Scenario.Validate does for a map: a plant for every panel
// (shared or its own, one way only), 1 to 9 panels each naming a
// controller, axes the flags can carry, a grid within bounds, an Ms
// bound of 0 or at least 1, a kd range of two finite values from low to
// high, and output files with the extensions of their kinds. Each
// problem is an *Error placed where the value was given.
func (c Compare) Validate() error {
	v := validator{origins: c.Origins}
	shared := c.Loop.Plant != "" || c.Loop.Numerator != nil || c.Loop.Denominator != nil
	if shared {
		l := c.Loop
		l.Controller = "shared"
		l.validate(&v)
	} else {
		v.text("loop.plant", c.Loop.Plant)
		if !slices.Contains(TimeUnits, c.Loop.TimeUnit) {
			v.add("loop.time_unit", "%s is not a unit of time; use one of %s", quoteShort(c.Loop.TimeUnit), strings.Join(TimeUnits, ", "))
		}
	}
	switch {
	case len(c.Panels) == 0:
		v.add("panels", "no panel; give at least one [[panels]] table with a controller")
	case len(c.Panels) > maxPanels:
		v.add("panels", "%d panels; a comparison draws at most %d", len(c.Panels), maxPanels)
	}
	for i, p := range c.Panels {
		p.validate(&v, fmt.Sprintf("panels.%d", i+1), shared)
	}
	s := c.Settings
	if s.Columns != 0 || s.Rows != 0 {
		for _, n := range []int{s.Columns, s.Rows} {
			if n < 2 || n > spec.MaxNodesPerAxis {
				v.add("compare.grid", "%dx%d: each axis takes 2 to %d nodes", s.Columns, s.Rows, spec.MaxNodesPerAxis)
				break
			}
		}
	}
	if !finite(s.MsBound) || (s.MsBound != 0 && s.MsBound < 1) {
		v.add("compare.ms_bound", "%s: expected 0 (the default 1.4) or a bound of at least 1, since Ms is at least 1", formatNumber(s.MsBound))
	}
	v.levels("compare.ms_levels", s.MsLevels, "Ms is at least 1", func(x float64) bool { return x >= 1 })
	if s.KdRange != nil && (len(s.KdRange) != 2 || !finite(s.KdRange[0]) || !finite(s.KdRange[1]) || s.KdRange[0] > s.KdRange[1]) {
		v.add("compare.kd_range", "%s: expected two finite numbers, low then high, such as [0, 4]", formatList(s.KdRange))
	}
	if s.FigureColumns < 0 || s.FigureColumns > maxPanels {
		v.add("compare.columns", "%d: expected 0 (chosen) to %d panels per row", s.FigureColumns, maxPanels)
	}
	c.Output.validate(&v)
	return joinReported(c.Origins[""].File, v.errs)
}

func (p Panel) validate(v *validator, key string, shared bool) {
	own := p.Plant != "" || p.Numerator != nil || p.Denominator != nil
	switch {
	case !own && !shared:
		v.add(key, "no plant: give the shared plant in [loop], or this panel's own plant")
	case p.Plant != "" && (p.Numerator != nil || p.Denominator != nil):
		v.add(key+".plant", "%s is given together with coefficient lists; give the plant one way only", quoteShort(p.Plant))
	case own && p.Plant == "":
		v.coefficients(key+".numerator", "numerator", p.Numerator)
		v.coefficients(key+".denominator", "denominator", p.Denominator)
	}
	v.text(key+".plant", p.Plant)
	v.text(key+".plant_label", p.PlantLabel)
	if strings.TrimSpace(p.Controller) == "" {
		v.add(key+".controller", "no controller; give one such as \"pid\"")
	}
	v.text(key+".controller", p.Controller)
	if p.HasSample && (!finite(p.Sample) || p.Sample < 0) {
		v.add(key+".sample", "%s: a sample time is a positive number, or 0 for a continuous-time controller", formatNumber(p.Sample))
	}
	v.values(key+".fixed", p.Fixed, true)
	for _, a := range []struct{ key, text string }{{key + ".x", p.X}, {key + ".y", p.Y}} {
		if a.text == "" {
			continue
		}
		if _, _, err := spec.ParseAxisOrName(a.text); err != nil {
			v.add(a.key, "%v", err)
		}
	}
}

func (o CompareOutput) validate(v *validator) {
	for _, p := range []struct {
		key, val, kind string
		exts           []string
	}{
		{"output.image", o.Image, "an image", imageExtensions},
		{"output.data", o.Data, "a data file", []string{".json"}},
		{"output.note", o.Note, "a note", []string{".md", ".txt"}},
		{"output.responses", o.Responses, "an image", imageExtensions},
	} {
		v.path(p.key, p.val, p.kind, p.exts)
	}
	v.looks(o.Title, o.WidthCm, o.HeightCm, o.DPI, true)
}

// compareOutputKeys are the keys of a comparison's output files.
var compareOutputKeys = []string{"output.image", "output.data", "output.note", "output.responses"}

func (o *CompareOutput) path(key string) *string {
	switch key {
	case "output.image":
		return &o.Image
	case "output.data":
		return &o.Data
	case "output.note":
		return &o.Note
	case "output.responses":
		return &o.Responses
	}
	panic("scenario: no output key " + key)
}

// ResolvePaths makes the output paths a compare file gave relative to
// its folder and keeps them inside it unless allowOutside, as
// Scenario.ResolvePaths does.
func (c *Compare) ResolvePaths(allowOutside bool) error {
	resolved := c.Output
	if err := resolveOutputs(c.Origins, compareOutputKeys, resolved.path, allowOutside); err != nil {
		return err
	}
	c.Output = resolved
	return nil
}

// Where names the value of key as messages about it should (see
// Scenario.Where).
func (c Compare) Where(key string) string {
	at, _ := c.Origins.origin(key)
	return place(at, key)
}
