package scenario

import (
	"bytes"
	"strings"
	"testing"
)

// compareFile is a comparison of an invented plant under PI and PID,
// with a worn plant under a digital PI.
const compareFile = `schema = 1

[loop]
plant = "1/(s+1)^4"

[compare]
grid = "120x90"
ms_bound = 1.6
kd_range = [0, 3]

[[panels]]
controller = "pi"

[[panels]]
controller = "pid"
fixed = {tau = 0.05, kd = 0.5}
x = "kp"
y = "ki=0:2"

[[panels]]
controller = "pi"
plant = "0.7/(s+1)^4"
plant_label = "worn"
sample = 0.5

[output]
image = "cmp.svg"
responses = "cmp-steps.png"
`

func TestDecodeCompare(t *testing.T) {
	c, err := DecodeCompare(strings.NewReader(compareFile), "cmp.toml")
	if err != nil {
		t.Fatal(err)
	}
	if err := c.Validate(); err != nil {
		t.Fatal(err)
	}
	if len(c.Panels) != 3 || c.Panels[1].Controller != "pid" || c.Panels[1].X != "kp" || c.Panels[1].Y != "ki=0:2" {
		t.Fatalf("panels %+v", c.Panels)
	}
	if f := c.Panels[1].Fixed; len(f) != 2 || f[0].Param != "kd" || f[0].V != 0.5 || f[1].Param != "tau" {
		t.Errorf("fixed %+v", f)
	}
	if p := c.Panels[2]; !p.HasSample || p.Sample != 0.5 || p.PlantLabel != "worn" || c.Panels[0].HasSample {
		t.Errorf("panel 3 %+v", p)
	}
	s := c.Settings
	if s.Columns != 120 || s.Rows != 90 || s.MsBound != 1.6 || len(s.KdRange) != 2 || len(s.MsLevels) != 2 {
		t.Errorf("settings %+v", s)
	}
	if c.Output.Image != "cmp.svg" || c.Output.Responses != "cmp-steps.png" || c.Output.DPI != 200 {
		t.Errorf("output %+v", c.Output)
	}
	if at := c.Origins["panels.3.plant_label"]; at.Line != 23 {
		t.Errorf("panels.3.plant_label at line %d; want 23", at.Line)
	}
}

func TestCompareErrors(t *testing.T) {
	tests := []struct {
		name, edit, from, want string
	}{
		{"unknown panel key", `plant_label = "worn"`, `plant_label = "worn"` + "\nctrl = \"pi\"", `line 24: panels.3.ctrl: unknown key; a [[panels]] table holds controller`},
		{"upper case", `controller = "pi"` + "\n\n[[panels]]\ncontroller = \"pid\"", `Controller = "pi"` + "\n\n[[panels]]\ncontroller = \"pid\"", `write "controller"`},
		{"wrong type in a panel", `x = "kp"`, `x = 3`, `line 17: panels.2.x: expected a string`},
		{"bad kd range", `kd_range = [0, 3]`, `kd_range = [3, 0]`, `compare.kd_range: [3, 0]: expected two finite numbers`},
		{"small bound", `ms_bound = 1.6`, `ms_bound = 0.5`, `compare.ms_bound: 0.5`},
		{"bad axis", `y = "ki=0:2"`, `y = "ki=2:0"`, `line 18: panels.2.y:`},
		{"no plant", `plant = "1/(s+1)^4"`, `time_unit = "s"`, `panels.1: no plant`},
		{"responses not an image", `responses = "cmp-steps.png"`, `responses = "cmp-steps.json"`, `output.responses: "cmp-steps.json": an image takes the extension`},
		{"unknown table", `[output]`, "[outputs]", `outputs: unknown key; the top level holds schema, loop, compare, panels, output`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			text := strings.Replace(compareFile, tc.edit, tc.from, 1)
			if text == compareFile {
				t.Fatalf("edit %q not found", tc.edit)
			}
			c, err := DecodeCompare(strings.NewReader(text), "cmp.toml")
			if err == nil {
				err = c.Validate()
			}
			if err == nil || !strings.Contains(err.Error(), tc.want) || !strings.Contains(err.Error(), "cmp.toml") {
				t.Fatalf("error %v; want one naming the file and containing %q", err, tc.want)
			}
		})
	}
}

// TestComparePathsStayInside: a compare file's outputs are taken from
// its folder and may not leave it.
func TestComparePathsStayInside(t *testing.T) {
	dir := t.TempDir()
	text := strings.Replace(compareFile, `image = "cmp.svg"`, `image = "../cmp.svg"`, 1)
	c, err := DecodeCompare(strings.NewReader(text), dir+"/cmp.toml")
	if err != nil {
		t.Fatal(err)
	}
	if err := c.ResolvePaths(false); err == nil || !strings.Contains(err.Error(), "climbs out") {
		t.Fatalf("error %v", err)
	}
	c.Output.Image = "cmp.svg"
	if err := c.ResolvePaths(false); err != nil || c.Output.Responses != dir+"/cmp-steps.png" {
		t.Fatalf("%v, responses at %q", err, c.Output.Responses)
	}
}

// FuzzDecodeCompare checks that DecodeCompare and Validate never panic
// or run long, and that every error is made of *Error values naming the
// file, at most three.
func FuzzDecodeCompare(f *testing.F) {
	f.Add([]byte(compareFile))
	for _, s := range nestingSeeds() {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		start, ok := cpuTime()
		c, err := DecodeCompare(bytes.NewReader(data), "fuzz.toml")
		if err == nil {
			err = c.Validate()
		}
		if end, _ := cpuTime(); ok && end-start > decodeBudget {
			t.Errorf("DecodeCompare took %v of processor time", end-start)
		}
		if err != nil {
			checkFuzzError(t, err)
		}
	})
}
