package scenario

import (
	"reflect"
	"slices"
	"strings"
	"testing"

	"gainscape/regions/spec"
)

// flagsGiven returns a given function for Override reporting names.
func flagsGiven(names ...string) func(string) bool {
	return func(flag string) bool { return slices.Contains(names, flag) }
}

// fromFlags is a scenario as a command might fill it from its flags,
// different from tank in every field.
func fromFlags() Scenario {
	return Scenario{
		Loop:  Loop{Plant: "2/(s+1)^2", Numerator: []float64{2}, Denominator: []float64{1, 2, 1}, Controller: "pi", TimeUnit: "min", Sample: 0.5, Integral: "forward", Prewarp: 3, Pade: 4},
		Axes:  Axes{X: spec.Axis{Param: "ki", Min: 0, Max: 1}, Y: spec.Axis{Param: "kd", Min: 0, Max: 2}, Columns: 50, Rows: 60},
		Fixed: []spec.Value{{Param: "tau", V: 0.05}, {Param: "kp", V: 3}},
		Overlays: Overlays{Decay: false, DecayLevels: []float64{9}, DampingLevels: []float64{0.9}, MsLevels: []float64{3},
			Marks: [][]spec.Value{{{Param: "ki", V: 0.1}}}, Best: []string{"ms"}, MsBound: 1.2, CompareSamples: []float64{0.1}},
		Output: Output{Image: "f.png", Data: "f.json", CSV: "f.csv", Note: "f.md", Title: "from flags", WidthCm: 1, HeightCm: 1, DPI: 72},
	}
}

// TestOverride checks which fields each flag replaces.
func TestOverride(t *testing.T) {
	tests := []struct {
		name  string
		flags []string
		want  func(s *Scenario)
	}{
		{"no flags keeps the file", nil, func(*Scenario) {}},
		{"flags without a key are ignored", []string{"workers", "quiet", "scenario"}, func(*Scenario) {}},
		{"plant replaces coefficient lists", []string{"plant"}, func(s *Scenario) { s.Loop.Plant = "2/(s+1)^2" }},
		{"coefficient lists replace the plant", []string{"num", "den"}, func(s *Scenario) {
			s.Loop.Plant, s.Loop.Numerator, s.Loop.Denominator = "", []float64{2}, []float64{1, 2, 1}
		}},
		{"one list alone still clears the plant", []string{"num"}, func(s *Scenario) {
			s.Loop.Plant, s.Loop.Numerator = "", []float64{2}
		}},
		{"set changes only the parameters it names", []string{"set"}, func(s *Scenario) {
			s.Fixed = []spec.Value{{Param: "kd", V: 1.5}, {Param: "tau", V: 0.05}, {Param: "kp", V: 3}}
		}},
		{"axes and grid", []string{"x", "y", "grid"}, func(s *Scenario) {
			s.Axes = fromFlags().Axes
		}},
		{"marks and searches replace the lists", []string{"mark", "best", "ms-bound"}, func(s *Scenario) {
			s.Overlays.Marks, s.Overlays.Best, s.Overlays.MsBound = fromFlags().Overlays.Marks, []string{"ms"}, 1.2
		}},
		{"outputs", []string{"out", "data", "csv", "note", "title", "ctrl"}, func(s *Scenario) {
			o := fromFlags().Output
			s.Output.Image, s.Output.Data, s.Output.CSV, s.Output.Note, s.Output.Title = o.Image, o.Data, o.CSV, o.Note, o.Title
			s.Loop.Controller = "pi"
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, want := tank(), tank()
			tc.want(&want)
			got.Override(fromFlags(), flagsGiven(tc.flags...))
			if !reflect.DeepEqual(noOrigins(got), want) {
				t.Fatalf("got  %+v\nwant %+v", got, want)
			}
		})
	}
}

// TestOverrideFlagsEachChangeSomething checks that every flag Override
// lists takes effect on its own, so the list and the code agree.
func TestOverrideFlagsEachChangeSomething(t *testing.T) {
	for _, flag := range OverrideFlags() {
		s := tank()
		s.Override(fromFlags(), flagsGiven(flag))
		if reflect.DeepEqual(noOrigins(s), tank()) {
			t.Errorf("flag %q changed nothing", flag)
		}
	}
}

// TestOverrideDoesNotShareFlagsStorage checks that merging --set into the
// file's values leaves the flags' scenario unchanged.
func TestOverrideDoesNotShareFlagsStorage(t *testing.T) {
	o := fromFlags()
	s := Scenario{}
	s.Override(o, flagsGiven("set"))
	s.Fixed[0].V = 99
	if o.Fixed[0].V != 0.05 {
		t.Fatal("changing the result changed the flags' scenario")
	}
}

// TestOverrideRecordsOrigins checks that the flags given become the
// origins of their keys, that the file's other origins stay, and that
// the scenario Override was given is not changed through a shared map.
func TestOverrideRecordsOrigins(t *testing.T) {
	src := "schema = 1\n[loop]\nplant = \"1/(s+1)\"\n[axes]\ngrid = \"40x30\"\nx = \"kp=0:2\"\n[fixed]\nkd = 1\n"
	file, err := Decode(strings.NewReader(src), "lag.toml")
	if err != nil {
		t.Fatal(err)
	}
	s := file
	s.Override(fromFlags(), flagsGiven("grid", "num", "set", "size"))
	for _, c := range []struct {
		key  string
		want Origin
	}{
		{"axes.grid", Origin{Flag: "grid"}},
		{"axes.x", Origin{File: "lag.toml", Line: 6}},
		{"fixed.kd", Origin{File: "lag.toml", Line: 8}},
		{"fixed.tau", Origin{Flag: "set"}},
		{"fixed.kp", Origin{Flag: "set"}},
		{"loop.numerator", Origin{Flag: "num"}},
		{"output.height_cm", Origin{Flag: "size"}},
	} {
		if got := s.Origins[c.key]; got != c.want {
			t.Errorf("%s: origin %+v; want %+v", c.key, got, c.want)
		}
	}
	if _, ok := s.Origins["loop.plant"]; ok {
		t.Error("the file's plant keeps its origin after --num replaced it")
	}
	if file.Origins["axes.grid"].Flag != "" {
		t.Error("Override changed the origins of the scenario it was given")
	}
}
