package scenario

import (
	"bytes"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"gainscape/regions/spec"
)

// tank returns a complete scenario. The plant is invented for these
// tests: a heated tank, a first-order lag with a sensor lag and a
// transport delay approximated by a first-order Padé factor.
func tank() Scenario {
	s := Default()
	s.Loop.Plant = "0.8*(1-2*s)/((12*s+1)*(s+1)*(1+2*s))"
	s.Axes.X = spec.Axis{Param: "kp", Min: 0, Max: 6}
	s.Axes.Y = spec.Axis{Param: "ki", Min: 0, Max: 0.8}
	s.Axes.Columns, s.Axes.Rows = 400, 300
	s.Fixed = []spec.Value{{Param: "kd", V: 1.5}, {Param: "tau", V: 0.2}}
	s.Overlays = Overlays{
		Decay:         true,
		DecayLevels:   []float64{0.02, 0.05, 0.1},
		DampingLevels: []float64{0.3, 0.7},
		MsLevels:      []float64{1.4, 2},
		Marks:         [][]spec.Value{{{Param: "kp", V: 2}, {Param: "ki", V: 0.15}}, {{Param: "ki", V: 0.3}, {Param: "kp", V: 1}}},
		Best:          []string{"decay", "ki"},
		MsBound:       1.6,
	}
	s.Output = Output{Image: "tank.svg", Data: "tank.json", CSV: "tank.csv", Note: "tank.md",
		Title: "Heated tank, PID", WidthCm: 18, HeightCm: 13.5, DPI: 300}
	return s
}

// negativeZero is −0; the constant -0.0 in Go source is +0.
var negativeZero = math.Copysign(0, -1)

// TestRoundTrip encodes scenarios and decodes the text back, which must
// give the same Scenario.
func TestRoundTrip(t *testing.T) {
	tests := []struct {
		name   string
		modify func(*Scenario)
	}{
		{"defaults with a plant expression", func(s *Scenario) { *s = Default(); s.Loop.Plant = "1/(s+1)^3" }},
		{"every key set", func(*Scenario) {}},
		{"plant as coefficient lists", func(s *Scenario) {
			s.Loop.Plant = ""
			s.Loop.Numerator = []float64{-1.6, 0.8}
			s.Loop.Denominator = []float64{24, 38, 15, 1}
		}},
		{"numbers that need every digit, exponents and a negative zero", func(s *Scenario) {
			s.Loop.Plant = ""
			s.Loop.Numerator = []float64{1.0 / 3, 1e-300, 5e-324, negativeZero}
			s.Loop.Denominator = []float64{1234567, 1e21, math.MaxFloat64, math.SmallestNonzeroFloat64}
			s.Axes.X = spec.Axis{Param: "k", Min: -1e-9, Max: 2.5e6}
			s.Fixed = []spec.Value{{Param: "z", V: negativeZero}, {Param: "p", V: 0.1 + 0.2}}
			s.Overlays.MsBound = negativeZero
		}},
		{"strings with quotes, escapes, control characters and non-ASCII", func(s *Scenario) {
			s.Output.Title = "tank \"A\" \\ 60 °C\tζ ≥ 0.7\nline two\x01\x7f\b\f\r"
			s.Output.Image = `C:\maps\tank map.png`
			s.Output.Note = "notes/été.md"
			s.Overlays.Best = []string{"ki"}
		}},
		{"empty lists and no fixed values", func(s *Scenario) {
			s.Fixed = nil
			s.Overlays = Overlays{}
			s.Output.Data, s.Output.CSV, s.Output.Note, s.Output.Title = "", "", "", ""
		}},
		{"a plant with dead time and a Padé order", func(s *Scenario) {
			s.Loop.Plant = "2*exp(-1.5*s)/((4*s+1)*(s+1))"
			s.Loop.Pade = 5
		}},
		{"smallest and largest grid", func(s *Scenario) {
			s.Axes.Columns, s.Axes.Rows = 2, spec.MaxNodesPerAxis
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s := tank()
			tc.modify(&s)
			var b bytes.Buffer
			if err := Encode(&b, s); err != nil {
				t.Fatalf("Encode: %v", err)
			}
			got, err := Decode(bytes.NewReader(b.Bytes()), "roundtrip.toml")
			if err != nil {
				t.Fatalf("Decode: %v\nfile:\n%s", err, b.String())
			}
			if !reflect.DeepEqual(noOrigins(got), s) {
				t.Fatalf("round trip changed the scenario\n got %+v\nwant %+v\nfile:\n%s", got, s, b.String())
			}
			for i, x := range s.Loop.Numerator {
				if math.Signbit(x) != math.Signbit(got.Loop.Numerator[i]) {
					t.Errorf("numerator[%d]: sign of %v lost", i, x)
				}
			}
		})
	}
}

// TestEncodeHeader checks the header comment that says what the file is
// and how to re-run it.
func TestEncodeHeader(t *testing.T) {
	var b bytes.Buffer
	if err := Encode(&b, tank()); err != nil {
		t.Fatal(err)
	}
	first := strings.SplitN(b.String(), "\n", 3)
	if !strings.HasPrefix(first[0], "# gainscape scenario") {
		t.Errorf("first line %q; want a comment saying what the file is", first[0])
	}
	if first[1] != "# Re-run it with: gainscape map --scenario FILE" {
		t.Errorf("second line %q; want the re-run command", first[1])
	}
}

// TestEncodeRefusesInvalid checks that Encode writes nothing for a
// scenario Validate rejects, so every file it writes can be re-run.
func TestEncodeRefusesInvalid(t *testing.T) {
	s := tank()
	s.Axes.Rows = 1
	var b bytes.Buffer
	err := Encode(&b, s)
	if err == nil || !strings.Contains(err.Error(), "axes.grid") {
		t.Fatalf("error %v; want one naming axes.grid", err)
	}
	if b.Len() != 0 {
		t.Fatalf("wrote %d bytes for an invalid scenario", b.Len())
	}
}

// TestSaveLoad writes through a file and reads it back, and checks that a
// failed save leaves the earlier file as it was and no temporary file.
func TestSaveLoad(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	path := "tank.toml"
	s := tank()
	if err := Save(path, s); err != nil {
		t.Fatal(err)
	}
	got, err := Load(path)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(noOrigins(got), s) {
		t.Fatalf("Load(Save(s)) = %+v; want %+v", got, s)
	}
	text, _ := os.ReadFile(path)
	if !strings.Contains(string(text), "gainscape map --scenario tank.toml\n") {
		t.Errorf("header does not name the file:\n%s", text)
	}

	bad := s
	bad.Output.WidthCm = math.NaN()
	if err := Save(path, bad); err == nil {
		t.Fatal("Save wrote an invalid scenario")
	}
	after, _ := os.ReadFile(path)
	if !bytes.Equal(after, text) {
		t.Error("a failed Save changed the earlier file")
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("%d entries in the directory after a failed Save; want only the scenario", len(entries))
	}
	if err := Save(filepath.Join(dir, "missing", "x.toml"), s); err == nil {
		t.Error("Save into a missing directory succeeded")
	}
}

// TestDecodeForms checks the alternative spellings the schema accepts and
// the defaults of keys left out.
func TestDecodeForms(t *testing.T) {
	tests := []struct {
		name string
		src  string
		want func(*Scenario)
	}{
		{"only the schema gives the defaults", "schema = 1\n", func(*Scenario) {}},
		{"axis as a table", "schema = 1\n[axes]\nx = {param = \"kd\", min = -1, max = 2.5}\n",
			func(s *Scenario) { s.Axes.X = spec.Axis{Param: "kd", Min: -1, Max: 2.5} }},
		{"axis as a flag string", "schema = 1\n[axes]\nx = \"kd=-1:2.5\"\n",
			func(s *Scenario) { s.Axes.X = spec.Axis{Param: "kd", Min: -1, Max: 2.5} }},
		{"marks as tables keep the file's order", "schema = 1\n[overlays]\nmarks = [{kp = 2, ki = 0.5}, {kp = 1, ki = 3}]\n",
			func(s *Scenario) {
				s.Overlays.Marks = [][]spec.Value{{val("kp", 2), val("ki", 0.5)}, {val("kp", 1), val("ki", 3)}}
			}},
		{"marks as an array of tables", "schema = 1\n[[overlays.marks]]\nkp = 2\nki = 0.5\n[[overlays.marks]]\nkp = 1\n",
			func(s *Scenario) { s.Overlays.Marks = [][]spec.Value{{val("kp", 2), val("ki", 0.5)}, {val("kp", 1)}} }},
		{"marks as strings and tables mixed", "schema = 1\n[overlays]\nmarks = [\"ki=0.5, kp=2\", {kp = 1}]\n",
			func(s *Scenario) { s.Overlays.Marks = [][]spec.Value{{val("ki", 0.5), val("kp", 2)}, {val("kp", 1)}} }},
		{"fixed values keep the file's order", "schema = 1\n[fixed]\ntau = 0.1\nkd = 2\n",
			func(s *Scenario) { s.Fixed = []spec.Value{val("tau", 0.1), val("kd", 2)} }},
		{"an empty ms_levels turns the default off", "schema = 1\n[overlays]\nms_levels = []\n",
			func(s *Scenario) { s.Overlays.MsLevels = nil }},
		{"integers where numbers are expected", "schema = 1\n[output]\nwidth_cm = 20\n[loop]\nnumerator = [1]\ndenominator = [1, 3, 3, 1]\n",
			func(s *Scenario) {
				s.Output.WidthCm = 20
				s.Loop.Numerator, s.Loop.Denominator = []float64{1}, []float64{1, 3, 3, 1}
			}},
		{"inline tables and comments", "schema = 1 # version\nloop = {plant = \"1/s\", controller = \"pi\"}\n",
			func(s *Scenario) { s.Loop.Plant, s.Loop.Controller = "1/s", "pi" }},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			want := Default()
			tc.want(&want)
			got, err := Decode(strings.NewReader(tc.src), "forms.toml")
			if err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(noOrigins(got), want) {
				t.Fatalf("got  %+v\nwant %+v", got, want)
			}
		})
	}
}

// val is a parameter value, for short test tables.
func val(name string, x float64) spec.Value { return spec.Value{Param: name, V: x} }

// noOrigins returns s without its origins, for comparing scenarios by
// their values.
func noOrigins(s Scenario) Scenario {
	s.Origins = nil
	return s
}
