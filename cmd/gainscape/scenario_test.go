package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestScenarioRoundTrip draws a map from flags with --save-scenario, then
// re-draws it from the saved file alone: the --data JSON must be
// identical, overlays included.
func TestScenarioRoundTrip(t *testing.T) {
	dir := t.TempDir()
	_, stderr, code := runBinary(t, dir, "map", "--plant", "1/(s+1)^3", "--ctrl", "pid", "--set", "kd=0.8,tau=0.1",
		"--x", "kp=0:6", "--y", "ki=0:2.5", "--grid", "70x50", "--decay", "--damping-levels", "0.5",
		"--ms-levels", "1.5", "--mark", "kp=1,ki=0.3", "--best", "decay,ki", "--ms-bound", "1.6",
		"-o", "first.svg", "--data", "first.json", "--save-scenario", "fig.toml", "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	_, stderr, code = runBinary(t, dir, "map", "--scenario", "fig.toml", "-o", "second.svg", "--data", "second.json", "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	a, _ := os.ReadFile(filepath.Join(dir, "first.json"))
	b, _ := os.ReadFile(filepath.Join(dir, "second.json"))
	if len(a) == 0 || !bytes.Equal(a, b) {
		t.Fatalf("data differ after the scenario round trip (%d and %d bytes)", len(a), len(b))
	}
	for _, want := range []string{`"decay_rate"`, `"min_damping"`, `"ms"`, `"best"`, `"marks"`} {
		if !strings.Contains(string(a), want) {
			t.Errorf("data lack %s", want)
		}
	}
}

// TestScenarioErrors: a broken scenario file is a usage error naming it.
func TestScenarioErrors(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "bad.toml"), []byte("schema = 1\n[loop]\nplant = \"1/(s+1)\"\ncontroler = \"pi\"\n"), 0o644)
	_, stderr, code := runBinary(t, dir, "map", "--scenario", "bad.toml")
	if code != exitUsage || !strings.Contains(stderr, "bad.toml") || !strings.Contains(stderr, "controler") {
		t.Fatalf("exit %d, stderr %q", code, stderr)
	}
	_, stderr, code = runBinary(t, dir, "map", "--scenario", "missing.toml")
	if code != exitUsage || !strings.Contains(stderr, "missing.toml") {
		t.Fatalf("exit %d, stderr %q", code, stderr)
	}
}
