package scenario

import (
	"maps"

	"gainscape/regions/spec"
)

// overrides lists, for each flag of the map command that has a key, the
// keys it gives and how its value replaces the file's. The order is that
// of the command's help. The keys of --set are those of the parameters
// it names.
var overrides = []struct {
	flag  string
	keys  []string
	apply func(s *Scenario, o *Scenario)
}{
	{"num", []string{"loop.numerator"}, func(s, o *Scenario) { s.Loop.Numerator = o.Loop.Numerator }},
	{"den", []string{"loop.denominator"}, func(s, o *Scenario) { s.Loop.Denominator = o.Loop.Denominator }},
	{"plant", []string{"loop.plant"}, func(s, o *Scenario) { s.Loop.Plant = o.Loop.Plant }},
	{"ctrl", []string{"loop.controller"}, func(s, o *Scenario) { s.Loop.Controller = o.Loop.Controller }},
	{"time-unit", []string{"loop.time_unit"}, func(s, o *Scenario) { s.Loop.TimeUnit = o.Loop.TimeUnit }},
	{"sample", []string{"loop.sample"}, func(s, o *Scenario) { s.Loop.Sample = o.Loop.Sample }},
	{"integral", []string{"loop.integral"}, func(s, o *Scenario) { s.Loop.Integral = o.Loop.Integral }},
	{"prewarp", []string{"loop.prewarp"}, func(s, o *Scenario) { s.Loop.Prewarp = o.Loop.Prewarp }},
	{"pade", []string{"loop.pade"}, func(s, o *Scenario) { s.Loop.Pade = o.Loop.Pade }},
	{"set", nil, func(s, o *Scenario) { s.Fixed = mergeValues(s.Fixed, o.Fixed) }},
	{"x", []string{"axes.x"}, func(s, o *Scenario) { s.Axes.X = o.Axes.X }},
	{"y", []string{"axes.y"}, func(s, o *Scenario) { s.Axes.Y = o.Axes.Y }},
	{"grid", []string{"axes.grid"}, func(s, o *Scenario) { s.Axes.Columns, s.Axes.Rows = o.Axes.Columns, o.Axes.Rows }},
	{"out", []string{"output.image"}, func(s, o *Scenario) { s.Output.Image = o.Output.Image }},
	{"data", []string{"output.data"}, func(s, o *Scenario) { s.Output.Data = o.Output.Data }},
	{"csv", []string{"output.csv"}, func(s, o *Scenario) { s.Output.CSV = o.Output.CSV }},
	{"note", []string{"output.note"}, func(s, o *Scenario) { s.Output.Note = o.Output.Note }},
	{"title", []string{"output.title"}, func(s, o *Scenario) { s.Output.Title = o.Output.Title }},
	{"size", []string{"output.width_cm", "output.height_cm"}, func(s, o *Scenario) {
		s.Output.WidthCm, s.Output.HeightCm = o.Output.WidthCm, o.Output.HeightCm
	}},
	{"dpi", []string{"output.dpi"}, func(s, o *Scenario) { s.Output.DPI = o.Output.DPI }},
	{"decay", []string{"overlays.decay"}, func(s, o *Scenario) { s.Overlays.Decay = o.Overlays.Decay }},
	{"decay-levels", []string{"overlays.decay_levels"}, func(s, o *Scenario) { s.Overlays.DecayLevels = o.Overlays.DecayLevels }},
	{"damping-levels", []string{"overlays.damping_levels"}, func(s, o *Scenario) { s.Overlays.DampingLevels = o.Overlays.DampingLevels }},
	{"ms-levels", []string{"overlays.ms_levels"}, func(s, o *Scenario) { s.Overlays.MsLevels = o.Overlays.MsLevels }},
	{"mark", []string{"overlays.marks"}, func(s, o *Scenario) { s.Overlays.Marks = o.Overlays.Marks }},
	{"best", []string{"overlays.best"}, func(s, o *Scenario) { s.Overlays.Best = o.Overlays.Best }},
	{"ms-bound", []string{"overlays.ms_bound"}, func(s, o *Scenario) { s.Overlays.MsBound = o.Overlays.MsBound }},
	{"compare-samples", []string{"overlays.compare_samples"}, func(s, o *Scenario) { s.Overlays.CompareSamples = o.Overlays.CompareSamples }},
}

// OutsidePathsFlag is the name, without dashes, of the command's flag
// that lets a scenario file write outside its own folder: the allowOutside
// of ResolvePaths. Messages refusing such a path name it.
const OutsidePathsFlag = "allow-outside-paths"

// OverrideFlags returns the long names of the flags Override consults,
// without dashes. Flags that change how a map is computed or reported but
// not the map itself, such as --workers and --quiet, have no key.
func OverrideFlags() []string {
	names := make([]string, len(overrides))
	for i, o := range overrides {
		names[i] = o.flag
	}
	return names
}

// Override applies the command line to a scenario read from a file: for
// every flag in OverrideFlags for which given(flag) is true, the value o
// holds for it replaces the value in s, and Origins records the flag as
// the origin of its keys, so that a problem with the value is reported
// against the flag and not the file. A flag given with an empty value
// counts as given: an empty --plant is then refused by Validate, not
// replaced by a default. given is typically the Changed method of the
// command's pflag.FlagSet; o is a Scenario filled from the flags (the
// fields of flags not given are not read).
//
// Two flags act on more than their own field. Any of --plant, --num and
// --den replaces the whole plant, so a file's expression does not clash
// with coefficient lists from the command line. --set changes only the
// parameters it names; the file's other fixed values stay. --mark and
// --best replace the file's lists.
//
// The intended order is Load, then Override, then ResolvePaths and
// Validate:
//
//	s, err := scenario.Load(path)
//	...
//	s.Override(fromFlags, flags.Changed)
//	if err := s.ResolvePaths(allowOutside); err != nil { ... }
//	if err := s.Validate(); err != nil { ... }
func (s *Scenario) Override(o Scenario, given func(flag string) bool) {
	origins := maps.Clone(s.Origins)
	if origins == nil {
		origins = Origins{}
	}
	if given("plant") || given("num") || given("den") {
		s.Loop.Plant, s.Loop.Numerator, s.Loop.Denominator = "", nil, nil
		for _, k := range []string{"loop.plant", "loop.numerator", "loop.denominator"} {
			delete(origins, k)
		}
	}
	for _, ov := range overrides {
		if !given(ov.flag) {
			continue
		}
		ov.apply(s, &o)
		keys := ov.keys
		if ov.flag == "set" {
			for _, v := range o.Fixed {
				keys = append(keys, "fixed."+v.Param)
			}
		}
		for _, k := range keys {
			origins[k] = Origin{Flag: ov.flag}
		}
	}
	s.Origins = origins
}

// mergeValues returns base with the values of top replacing those of the
// same name and the others appended, in order.
func mergeValues(base, top []spec.Value) []spec.Value {
	out := append([]spec.Value(nil), base...)
next:
	for _, t := range top {
		for i := range out {
			if out[i].Param == t.Param {
				out[i].V = t.V
				continue next
			}
		}
		out = append(out, t)
	}
	return out
}
