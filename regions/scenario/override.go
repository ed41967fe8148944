package scenario

import "gainscape/regions/spec"

// overrides lists, for each flag of the map command that has a key, how
// its value replaces the file's. The order is that of the command's help.
var overrides = []struct {
	flag  string
	apply func(s *Scenario, o *Scenario)
}{
	{"num", func(s, o *Scenario) { s.Loop.Numerator = o.Loop.Numerator }},
	{"den", func(s, o *Scenario) { s.Loop.Denominator = o.Loop.Denominator }},
	{"plant", func(s, o *Scenario) { s.Loop.Plant = o.Loop.Plant }},
	{"ctrl", func(s, o *Scenario) { s.Loop.Controller = o.Loop.Controller }},
	{"set", func(s, o *Scenario) { s.Fixed = mergeValues(s.Fixed, o.Fixed) }},
	{"x", func(s, o *Scenario) { s.Axes.X = o.Axes.X }},
	{"y", func(s, o *Scenario) { s.Axes.Y = o.Axes.Y }},
	{"grid", func(s, o *Scenario) { s.Axes.Columns, s.Axes.Rows = o.Axes.Columns, o.Axes.Rows }},
	{"out", func(s, o *Scenario) { s.Output.Image = o.Output.Image }},
	{"data", func(s, o *Scenario) { s.Output.Data = o.Output.Data }},
	{"csv", func(s, o *Scenario) { s.Output.CSV = o.Output.CSV }},
	{"note", func(s, o *Scenario) { s.Output.Note = o.Output.Note }},
	{"title", func(s, o *Scenario) { s.Output.Title = o.Output.Title }},
	{"size", func(s, o *Scenario) { s.Output.WidthCm, s.Output.HeightCm = o.Output.WidthCm, o.Output.HeightCm }},
	{"decay", func(s, o *Scenario) { s.Overlays.Decay = o.Overlays.Decay }},
	{"decay-levels", func(s, o *Scenario) { s.Overlays.DecayLevels = o.Overlays.DecayLevels }},
	{"damping-levels", func(s, o *Scenario) { s.Overlays.DampingLevels = o.Overlays.DampingLevels }},
	{"ms-levels", func(s, o *Scenario) { s.Overlays.MsLevels = o.Overlays.MsLevels }},
	{"mark", func(s, o *Scenario) { s.Overlays.Marks = o.Overlays.Marks }},
	{"best", func(s, o *Scenario) { s.Overlays.Best = o.Overlays.Best }},
	{"ms-bound", func(s, o *Scenario) { s.Overlays.MsBound = o.Overlays.MsBound }},
}

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
// holds for it replaces the value in s. given is typically the Changed
// method of the command's pflag.FlagSet; o is a Scenario filled from the
// flags (the fields of flags not given are not read).
//
// Two flags act on more than their own field. Any of --plant, --num and
// --den replaces the whole plant, so a file's expression does not clash
// with coefficient lists from the command line. --set changes only the
// parameters it names; the file's other fixed values stay. --mark and
// --best replace the file's lists.
//
// The intended order is Load, then Override, then Validate:
//
//	s, err := scenario.Load(path)
//	...
//	s.Override(fromFlags, flags.Changed)
//	if err := s.Validate(); err != nil { ... }
func (s *Scenario) Override(o Scenario, given func(flag string) bool) {
	if given("plant") || given("num") || given("den") {
		s.Loop.Plant, s.Loop.Numerator, s.Loop.Denominator = "", nil, nil
	}
	for _, ov := range overrides {
		if given(ov.flag) {
			ov.apply(s, &o)
		}
	}
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
