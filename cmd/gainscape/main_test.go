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
