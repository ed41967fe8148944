package main

import (
	"encoding/json"
	"math"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
)

// binary is the command built once for the tests that run it as a user
// would.
var binary string

func TestMain(m *testing.M) {
	dir, err := os.MkdirTemp("", "gainscape-test")
	if err != nil {
		panic(err)
	}
	binary = filepath.Join(dir, "gainscape")
	if out, err := exec.Command("go", "build", "-o", binary, ".").CombinedOutput(); err != nil {
		panic(string(out))
	}
	code := m.Run()
	os.RemoveAll(dir)
	os.Exit(code)
}

func runBinary(t *testing.T, dir string, args ...string) (stdout, stderr string, code int) {
	t.Helper()
	cmd := exec.Command(binary, args...)
	cmd.Dir = dir
	var out, errb strings.Builder
	cmd.Stdout, cmd.Stderr = &out, &errb
	err := cmd.Run()
	if ee, ok := err.(*exec.ExitError); ok {
		code = ee.ExitCode()
	} else if err != nil {
		t.Fatal(err)
	}
	return out.String(), errb.String(), code
}

// TestBadInputs runs the built command on each kind of bad input and
// checks the one-line message, the exit code 2 and that no file is left.
func TestBadInputs(t *testing.T) {
	tests := []struct {
		name string
		args []string
		want []string // substrings of the error line
	}{
		{"syntax error", []string{"--plant", "2*(s+1"}, []string{"--plant", "column 7", `")"`}},
		{"improper plant", []string{"--plant", "(s+1)^2/(s+3)"}, []string{"not proper"}},
		{"zero denominator", []string{"--num", "1", "--den", "0, 0"}, []string{"--den"}},
		{"NaN coefficient", []string{"--num", "1", "--den", "1, NaN"}, []string{"--den", "NaN"}},
		{"empty numerator", []string{"--num", "", "--den", "1, 1"}, []string{"--plant", "--num"}},
		{"plant given twice", []string{"--plant", "1/(s+1)", "--num", "1", "--den", "1,1"}, []string{"one way"}},
		{"unknown controller", []string{"--plant", "1/(s+1)", "--ctrl", "pidd"}, []string{"--ctrl", "pidd"}},
		{"unknown axis parameter", []string{"--plant", "1/(s+1)", "--ctrl", "pi", "--x", "kd=0:1"}, []string{"--x", "kd"}},
		{"same axis twice", []string{"--plant", "1/(s+1)", "--ctrl", "pi", "--x", "kp=0:1", "--y", "kp=0:2"}, []string{"kp"}},
		{"axis also fixed", []string{"--plant", "1/(s+1)", "--ctrl", "pi", "--set", "kp=1"}, []string{"--set", "kp", "axis"}},
		{"min above max", []string{"--plant", "1/(s+1)", "--x", "kp=5:1"}, []string{"--x", "kp=5:1"}},
		{"grid too small", []string{"--plant", "1/(s+1)", "--grid", "1x10"}, []string{"--grid", "1x10"}},
		{"grid too large", []string{"--plant", "1/(s+1)", "--grid", "5000x10"}, []string{"--grid", "5000"}},
		{"unknown extension", []string{"--plant", "1/(s+1)", "-o", "map.jpg"}, []string{"--out", "map.jpg"}},
		{"missing directory", []string{"--plant", "1/(s+1)", "-o", "nowhere/map.png"}, []string{"--out", "nowhere"}},
		{"missing data directory", []string{"--plant", "1/(s+1)", "--data", "nowhere/m.json"}, []string{"--data", "nowhere"}},
		{"unknown flag", []string{"--plnt", "1/(s+1)"}, []string{"plnt"}},
		{"negative workers", []string{"--plant", "1/(s+1)", "--workers", "-2"}, []string{"--workers", "-2"}},
		{"NaN fixed value", []string{"--plant", "1/(s+1)", "--set", "kd=NaN"}, []string{"--set", "NaN"}},
		{"infinite axis end", []string{"--plant", "1/(s+1)", "--x", "kp=0:Inf"}, []string{"--x", "finite"}},
		{"overflowing plant", []string{"--plant", "1e400/(s+1)"}, []string{"--plant"}},
		{"unknown best search", []string{"--plant", "1/(s+1)", "--best", "fastest"}, []string{"--best", "fastest"}},
		{"mark off the plane", []string{"--plant", "1/(s+1)", "--ctrl", "pi", "--mark", "kp=1"}, []string{"--mark", "ki"}},
		{"bad size", []string{"--plant", "1/(s+1)", "--size", "1600x1200"}, []string{"--size"}},
		{"bad format", []string{"--plant", "1/(s+1)", "-o", "-", "--format", "gif"}, []string{"--format", "gif"}},
		{"bad level list", []string{"--plant", "1/(s+1)", "--ms-levels", "1.4,two"}, []string{"--ms-levels", "two"}},
		{"scenario directory missing", []string{"--plant", "1/(s+1)", "--save-scenario", "nowhere/s.toml"}, []string{"--save-scenario", "nowhere"}},
		{"extra argument", []string{"--plant", "1/(s+1)", "stray"}, []string{"stray"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			_, stderr, code := runBinary(t, dir, append([]string{"map"}, tc.args...)...)
			if code != exitUsage {
				t.Fatalf("exit code %d; want %d (stderr %q)", code, exitUsage, stderr)
			}
			lines := strings.Split(strings.TrimSpace(stderr), "\n")
			if len(lines) != 1 {
				t.Fatalf("stderr has %d lines; want one: %q", len(lines), stderr)
			}
			for _, w := range tc.want {
				if !strings.Contains(stderr, w) {
					t.Errorf("stderr %q does not contain %q", stderr, w)
				}
			}
			if entries, _ := os.ReadDir(dir); len(entries) != 0 {
				t.Errorf("files left behind: %v", entries)
			}
		})
	}
}

// TestScalingWarning: coefficients spanning hundreds of decades draw a
// warning on stderr but still produce a map.
func TestScalingWarning(t *testing.T) {
	_, stderr, code := runBinary(t, t.TempDir(), "map", "--plant", "1e-120/(s+1e-60)^3", "--ctrl", "pi", "--grid", "20x20", "-o", "w.png", "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	_, stderr, _ = runBinary(t, t.TempDir(), "map", "--plant", "1e-120/(s+1e-60)^3", "--ctrl", "pi", "--grid", "20x20", "-o", "w.png")
	if !strings.Contains(stderr, "warning") || !strings.Contains(stderr, "rescaling") {
		t.Fatalf("no scaling warning: %q", stderr)
	}
}

// TestDemoRun runs the command with no plant, as a new user would.
func TestDemoRun(t *testing.T) {
	dir := t.TempDir()
	stdout, stderr, code := runBinary(t, dir, "map", "--grid", "80x60", "--data", "demo.json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	for _, want := range []string{"invented demo", "stable", "gainscape-demo.png", "Caution"} {
		if !strings.Contains(stdout, want) {
			t.Errorf("summary lacks %q:\n%s", want, stdout)
		}
	}
	if fi, err := os.Stat(filepath.Join(dir, "gainscape-demo.png")); err != nil || fi.Size() == 0 {
		t.Fatalf("demo image missing: %v", err)
	}
	b, err := os.ReadFile(filepath.Join(dir, "demo.json"))
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		X struct {
			Param    string
			Min, Max float64
			N        int
		}
		RHP        [][]int
		Boundaries []struct {
			Kind   string
			Points [][3]*float64
		}
	}
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	if doc.X.Param != "kp" || doc.X.N != 80 || len(doc.RHP) != 60 || len(doc.RHP[0]) != 80 {
		t.Fatalf("unexpected shape: x %+v, rhp %d rows", doc.X, len(doc.RHP))
	}
	kinds := map[string]bool{}
	for _, b := range doc.Boundaries {
		kinds[b.Kind] = true
		for _, p := range b.Points {
			if p[0] == nil || p[1] == nil || (b.Kind != "infinite" && (p[2] == nil || math.IsNaN(*p[2]))) {
				t.Fatalf("bad point %v in %s boundary", p, b.Kind)
			}
		}
	}
	if !kinds["real"] || !kinds["complex"] {
		t.Fatalf("boundary kinds %v; the demo has real and complex edges", kinds)
	}
}
