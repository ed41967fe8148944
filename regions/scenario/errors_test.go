package scenario

import (
	"errors"
	"fmt"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"gainscape/regions/spec"
)

// TestDecodeErrors checks that each kind of bad file gives an *Error
// naming the file and the key at fault, with the line where the reader
// knows it, and saying what was expected.
func TestDecodeErrors(t *testing.T) {
	tests := []struct {
		name string
		src  string
		key  string // Error.Key of the (first) error
		line int    // Error.Line; 0 when unknown
		msg  string // part of the message
	}{
		{"schema missing", "[loop]\nplant = \"1/s\"\n", "schema", 0, "missing"},
		{"schema from the future", "schema = 2\n", "schema", 1, "version 2 is unknown"},
		{"schema as a string", "schema = \"1\"\n", "schema", 1, `expected the integer 1, found the string "1"`},
		{"schema as a float", "schema = 1.0\n", "schema", 1, "expected the integer 1, found the number 1"},
		{"TOML syntax", "schema = 1\n[loop]\nplant = \"1/s\n", "", 3, "TOML syntax"},
		{"duplicate key", "schema = 1\n[loop]\nplant = \"1/s\"\nplant = \"2/s\"\n", "", 4, "TOML syntax"},
		{"unknown key in a table", "schema = 1\n[loop]\nplnt = \"1/s\"\n", "loop.plnt", 3, "[loop] holds plant, numerator"},
		{"unknown top-level key", "schema = 1\ncolour = \"red\"\n", "colour", 2, "the top level holds schema"},
		{"unknown table", "schema = 1\n[colours]\nmap = \"red\"\n", "colours", 2, "unknown key"},
		{"key in the wrong case", "schema = 1\n[axes]\nGrid = \"10x10\"\n", "axes.Grid", 3, `write "axes.grid"`},
		{"schema in the wrong case", "Schema = 1\n", "Schema", 1, `write "schema"`},
		{"table in the wrong case", "schema = 1\n[Loop]\nplant = \"1/s\"\n", "Loop", 2, `write "loop"`},
		{"string expected", "schema = 1\n[loop]\nplant = 3\n", "loop.plant", 3, "expected a string, found the integer 3"},
		{"number expected", "schema = 1\n[output]\nwidth_cm = \"16cm\"\n", "output.width_cm", 3, `expected a number, found the string "16cm"`},
		{"boolean expected", "schema = 1\n[overlays]\ndecay = \"yes\"\n", "overlays.decay", 3, "expected true or false"},
		{"array expected", "schema = 1\n[overlays]\nms_levels = 1.4\n", "overlays.ms_levels", 3, "expected an array of numbers"},
		{"array element", "schema = 1\n\n[overlays]\nms_levels = [1.4, \"2\"]\n", "overlays.ms_levels", 4, `element 2: expected a number, found the string "2"`},
		{"strings expected", "schema = 1\n[overlays]\nbest = [\"decay\", 3]\n", "overlays.best", 3, "element 2: expected a string"},
		{"date where a number goes", "schema = 1\n[overlays]\nms_bound = 2024-01-01\n", "overlays.ms_bound", 3, "found a date or time"},
		{"table expected", "schema = 1\naxes = \"kp=0:1\"\n", "axes", 0, "expected a table [axes], found a string"},
		{"array of tables for a table", "schema = 1\n[[output]]\nimage = \"a.png\"\n", "output", 0, "found an array of tables"},
		{"value where a table goes inside", "schema = 1\n[loop.plant]\nnum = 1\n", "loop.plant", 2, "expected a string, found a table"},
		{"bad grid", "schema = 1\n[axes]\ngrid = \"400by300\"\n", "axes.grid", 3, `such as "400x300"`},
		{"grid too fine", "schema = 1\n[axes]\ngrid = \"400x5000\"\n", "axes.grid", 3, "5000 nodes"},
		{"axis without a range", "schema = 1\n[axes]\nx = \"kp\"\n", "axes.x", 3, "name=min:max"},
		{"axis range reversed", "schema = 1\n[axes]\ny = \"ki=8:0\"\n", "axes.y", 3, "must be below"},
		{"axis table missing max", "schema = 1\n[axes]\nx = {param = \"kp\", min = 0}\n", "axes.x", 3, `no key "max"`},
		{"axis table with an extra key", "schema = 1\n[axes]\nx = {param = \"kp\", min = 0, max = 1, step = 0.1}\n", "axes.x", 3, `unknown key "step"`},
		{"axis table wrong type", "schema = 1\n[axes]\nx = {param = \"kp\", min = \"0\", max = 1}\n", "axes.x", 3, "min: expected a number"},
		{"axis as a number", "schema = 1\n[axes]\nx = 20\n", "axes.x", 3, `such as "kp=0:20"`},
		{"fixed value not a number", "schema = 1\n[fixed]\nkd = \"0.5\"\n", "fixed.kd", 3, "expected a number"},
		{"fixed nested table", "schema = 1\n[fixed.kd]\nvalue = 1\n", "fixed.kd", 2, "found a table"},
		{"mark string malformed", "schema = 1\n[overlays]\nmarks = [\"kp:2\"]\n", "overlays.marks", 3, "point 1"},
		{"mark table value", "schema = 1\n[overlays]\nmarks = [{kp = 2}, {kp = \"x\"}]\n", "overlays.marks", 3, "point 2: kp: expected a number"},
		{"mark neither string nor table", "schema = 1\n[overlays]\nmarks = [2]\n", "overlays.marks", 3, "point 1: expected a string"},
		{"marks not an array", "schema = 1\n[overlays]\nmarks = \"kp=2\"\n", "overlays.marks", 3, "expected an array of points"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Decode(strings.NewReader(tc.src), "bad.toml")
			if err == nil {
				t.Fatal("no error")
			}
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v is %T; want *Error", err, err)
			}
			if e.File != "bad.toml" || e.Key != tc.key || e.Line != tc.line {
				t.Errorf("file %q key %q line %d; want %q, %q, %d (%v)", e.File, e.Key, e.Line, "bad.toml", tc.key, tc.line, err)
			}
			msg := err.Error()
			if !strings.Contains(msg, tc.msg) || !strings.Contains(msg, `"bad.toml"`) || !strings.Contains(msg, tc.key) {
				t.Errorf("message %q; want the file, the key %q and %q", msg, tc.key, tc.msg)
			}
		})
	}
}

// TestDecodeReportsAllUnknownKeys checks that unknown keys are reported
// together, outermost only.
func TestDecodeReportsAllUnknownKeys(t *testing.T) {
	src := "schema = 1\nzoom = 2\n[loop]\nplnt = \"1/s\"\n[extra]\na = 1\n[extra.deeper]\nb = 2\n"
	_, err := Decode(strings.NewReader(src), "f.toml")
	msg := err.Error()
	for _, want := range []string{"zoom", "loop.plnt", "extra: unknown key"} {
		if !strings.Contains(msg, want) {
			t.Errorf("message %q lacks %q", msg, want)
		}
	}
	if strings.Contains(msg, "extra.a") || strings.Contains(msg, "extra.deeper") {
		t.Errorf("message %q reports keys under an unknown table", msg)
	}
}

// TestDecodeRejectsLargeInput checks the size bound.
func TestDecodeRejectsLargeInput(t *testing.T) {
	src := "schema = 1\n" + strings.Repeat("# padding\n", maxFileSize/10+1)
	if _, err := Decode(strings.NewReader(src), "big.toml"); err == nil || !strings.Contains(err.Error(), "larger than") {
		t.Fatalf("error %v; want a size error", err)
	}
}

// TestLoadMissingFile checks that the error names the path.
func TestLoadMissingFile(t *testing.T) {
	path := filepath.Join(t.TempDir(), "none.toml")
	_, err := Load(path)
	if err == nil || !strings.Contains(err.Error(), path) || !strings.Contains(err.Error(), "cannot be opened") {
		t.Fatalf("error %v; want one naming %s", err, path)
	}
}

// TestValidateErrors checks each structural rule on a scenario that
// breaks it, and that the message names the key and the value. The
// scenario has no origins, so no file or flag is named.
func TestValidateErrors(t *testing.T) {
	one := math.Nextafter(1, 2) - 1
	tests := []struct {
		name   string
		modify func(*Scenario)
		key    string
		msg    string // part of the message, often the value
	}{
		{"plant given two ways", func(s *Scenario) { s.Loop.Numerator, s.Loop.Denominator = []float64{1}, []float64{1, 1} },
			"loop.plant", "one way only"},
		{"no plant", func(s *Scenario) { s.Loop.Plant = "" }, "loop.plant", "no plant given"},
		{"blank plant", func(s *Scenario) { s.Loop.Plant = "  " }, "loop.plant", `"  " is blank`},
		{"numerator without denominator", func(s *Scenario) { s.Loop.Plant, s.Loop.Numerator = "", []float64{1} },
			"loop.denominator", "[] is empty"},
		{"coefficient not finite", func(s *Scenario) {
			s.Loop.Plant, s.Loop.Numerator, s.Loop.Denominator = "", []float64{1}, []float64{1, math.NaN()}
		}, "loop.denominator", "[1, nan]: coefficient 2"},
		{"denominator zero", func(s *Scenario) {
			s.Loop.Plant, s.Loop.Numerator, s.Loop.Denominator = "", []float64{1}, []float64{0, 0}
		}, "loop.denominator", "every coefficient is zero"},
		{"no controller", func(s *Scenario) { s.Loop.Controller = "" }, "loop.controller", "no controller family"},
		{"Padé order too high", func(s *Scenario) { s.Loop.Pade = 31 }, "loop.pade", "31 is not an order"},
		{"Padé order negative", func(s *Scenario) { s.Loop.Pade = -1 }, "loop.pade", "-1 is not an order"},
		{"grid too coarse", func(s *Scenario) { s.Axes.Columns = 1 }, "axes.grid", "1x300 has 1 columns"},
		{"grid too fine", func(s *Scenario) { s.Axes.Rows = 5000 }, "axes.grid", "5000 rows"},
		{"axis reversed", func(s *Scenario) { s.Axes.X.Min = 7 }, "axes.x", "kp=7:6"},
		{"axis not finite", func(s *Scenario) { s.Axes.Y.Max = math.Inf(1) }, "axes.y", "ki=0:inf"},
		{"axis without a name", func(s *Scenario) { s.Axes.X.Param = "" }, "axes.x", "not a parameter name"},
		{"axis name with upper case", func(s *Scenario) { s.Axes.X.Param = "Kp" }, "axes.x", `"Kp"`},
		{"same parameter on both axes", func(s *Scenario) { s.Axes.Y.Param = "kp" }, "axes.y", "both axes sweep kp"},
		{"window too narrow for its ends", func(s *Scenario) { s.Axes.X.Min, s.Axes.X.Max = 1, 1.000000000000001 },
			"axes.x", "kp=1:1.000000000000001: the window is too narrow"},
		{"window too narrow for the grid", func(s *Scenario) { s.Axes.X.Min, s.Axes.X.Max = 1, 1+2000*one },
			"axes.x", "between neighbouring nodes of 400"},
		{"window width overflows", func(s *Scenario) { s.Axes.Y.Min, s.Axes.Y.Max = -1e308, 1e308 }, "axes.y", "too wide"},
		{"window nodes overflow", func(s *Scenario) { s.Axes.Y.Min, s.Axes.Y.Max = -1e306, 1e306 }, "axes.y", "times 299 cells overflows"},
		{"fixed value not finite", func(s *Scenario) { s.Fixed[0].V = math.NaN() }, "fixed.kd", "kd = nan"},
		{"fixed value twice", func(s *Scenario) { s.Fixed[1].Param = "kd" }, "fixed.kd", "kd is given twice"},
		{"fixed axis parameter", func(s *Scenario) { s.Fixed[0].Param = "ki" }, "fixed.ki", "swept by axes.y"},
		{"too many fixed values", func(s *Scenario) {
			for i := range MaxFixed {
				s.Fixed = append(s.Fixed, val(fmt.Sprintf("p%d", i), 1))
			}
		}, "fixed", fmt.Sprintf("%d values; a scenario fixes at most %d", MaxFixed+2, MaxFixed)},
		{"decay level not finite", func(s *Scenario) { s.Overlays.DecayLevels[1] = math.Inf(-1) },
			"overlays.decay_levels", "level 2 is not a finite"},
		{"damping level above 1", func(s *Scenario) { s.Overlays.DampingLevels = []float64{1.5} },
			"overlays.damping_levels", "level 1.5 is out of range"},
		{"Ms level below 1", func(s *Scenario) { s.Overlays.MsLevels = []float64{0.5} }, "overlays.ms_levels", "Ms is at least 1"},
		{"too many levels", func(s *Scenario) { s.Overlays.MsLevels = make([]float64, 500) },
			"overlays.ms_levels", "500 levels; an overlay draws at most 16"},
		{"Ms bound below 1", func(s *Scenario) { s.Overlays.MsBound = 0.5 }, "overlays.ms_bound", "0.5"},
		{"Ms bound not finite", func(s *Scenario) { s.Overlays.MsBound = math.NaN() }, "overlays.ms_bound", "nan"},
		{"empty mark", func(s *Scenario) { s.Overlays.Marks[1] = nil }, "overlays.marks[2]", "no values"},
		{"mark name invalid", func(s *Scenario) { s.Overlays.Marks[0][0].Param = "k p" }, "overlays.marks[1]", `"k p"`},
		{"too many marks", func(s *Scenario) { s.Overlays.Marks = make([][]spec.Value, 1000) },
			"overlays.marks", "1000 points; a map marks at most 26"},
		{"unknown search", func(s *Scenario) { s.Overlays.Best = []string{"fastest"} }, "overlays.best[1]",
			`"fastest" is not a search; the searches are decay and ki`},
		{"search in the wrong case", func(s *Scenario) { s.Overlays.Best = []string{"Decay"} }, "overlays.best[1]", `"Decay" is not a search`},
		{"search named twice", func(s *Scenario) { s.Overlays.Best = []string{"decay", "decay"} }, "overlays.best[2]", "twice"},
		{"search blank", func(s *Scenario) { s.Overlays.Best = []string{" "} }, "overlays.best[1]", `" " is not a search`},
		{"image of an unknown type", func(s *Scenario) { s.Output.Image = "map.jpg" }, "output.image", `"map.jpg": an image takes the extension .png or .svg or .pdf`},
		{"image without an extension", func(s *Scenario) { s.Output.Image = "map" }, "output.image", `"map"`},
		{"data that is not JSON", func(s *Scenario) { s.Output.Data = "map.png" }, "output.data", "a data file takes the extension .json"},
		{"CSV without its extension", func(s *Scenario) { s.Output.CSV = "edges.txt" }, "output.csv", ".csv"},
		{"note of an unknown type", func(s *Scenario) { s.Output.Note = "note.doc" }, "output.note", ".md or .txt"},
		{"path with a NUL", func(s *Scenario) { s.Output.Image = "a\x00.png" }, "output.image", "NUL"},
		{"width zero", func(s *Scenario) { s.Output.WidthCm = 0 }, "output.width_cm", "0 cm"},
		{"height in millimetres", func(s *Scenario) { s.Output.HeightCm = 500 }, "output.height_cm", "500 cm is outside"},
		{"title not UTF-8", func(s *Scenario) { s.Output.Title = "tank \xff" }, "output.title", "not valid UTF-8"},
		{"title too long", func(s *Scenario) { s.Output.Title = strings.Repeat("ω", 201) }, "output.title", "201 characters"},
	}
	if err := tank().Validate(); err != nil {
		t.Fatalf("the base scenario does not validate: %v", err)
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s := tank()
			tc.modify(&s)
			err := s.Validate()
			if err == nil {
				t.Fatal("no error")
			}
			var e *Error
			if !errors.As(err, &e) {
				t.Fatalf("error %v holds no *Error", err)
			}
			msg := err.Error()
			if !strings.HasPrefix(msg, tc.key+": ") || !strings.Contains(msg, tc.msg) {
				t.Errorf("message %q; want it to start with %q and contain %q", msg, tc.key, tc.msg)
			}
			if n := strings.Count(msg, "\n"); n > 2 {
				t.Errorf("message has %d lines", n+1)
			}
		})
	}
}

// TestValidateAccepts checks values at the edges of the rules, which
// must pass.
func TestValidateAccepts(t *testing.T) {
	tests := []struct {
		name   string
		modify func(*Scenario)
	}{
		{"no image", func(s *Scenario) { s.Output.Image = "" }},
		{"image to standard output", func(s *Scenario) { s.Output.Image = "-" }},
		{"extensions in upper case", func(s *Scenario) { s.Output.Image, s.Output.Data, s.Output.Note = "M.PNG", "D.Json", "N.TXT" }},
		{"PDF image", func(s *Scenario) { s.Output.Image = "map.pdf" }},
		{"as many levels, marks and fixed values as allowed", func(s *Scenario) {
			s.Overlays.MsLevels = make([]float64, MaxLevels)
			for i := range s.Overlays.MsLevels {
				s.Overlays.MsLevels[i] = 1 + float64(i)/10
			}
			s.Overlays.Marks = nil
			for i := range MaxMarks {
				s.Overlays.Marks = append(s.Overlays.Marks, []spec.Value{val("kp", float64(i))})
			}
			s.Fixed = nil
			for i := range MaxFixed {
				s.Fixed = append(s.Fixed, val(fmt.Sprintf("p%d", i), 1))
			}
		}},
		{"every search", func(s *Scenario) { s.Overlays.Best = Searches() }},
		{"huge gains well resolved", func(s *Scenario) { s.Axes.X.Min, s.Axes.X.Max = 1e12, 1e12+1e6 }},
		{"longest title", func(s *Scenario) { s.Output.Title = strings.Repeat("ω", MaxTitleRunes) }},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s := tank()
			tc.modify(&s)
			if err := s.Validate(); err != nil {
				t.Fatal(err)
			}
		})
	}
}

// TestValidateReportsProblems checks that problems in different tables
// are all reported, up to three, and counted beyond.
func TestValidateReportsProblems(t *testing.T) {
	s := tank()
	s.Loop.Controller = ""
	s.Axes.Rows = 0
	s.Output.WidthCm = -1
	msg := s.Validate().Error()
	for _, key := range []string{"loop.controller", "axes.grid", "output.width_cm"} {
		if !strings.Contains(msg, key) {
			t.Errorf("message %q lacks %s", msg, key)
		}
	}
	s.Fixed = append(s.Fixed, spec.Value{Param: "KI", V: 1})
	msg = s.Validate().Error()
	if lines := strings.Split(msg, "\n"); len(lines) != 3 || lines[2] != "and 2 more problems" {
		t.Errorf("message %q; want two problems and a count of the others", msg)
	}
}
