package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// TestImageToStdout checks "-o -": the PNG goes to standard output and the
// report to standard error.
func TestImageToStdout(t *testing.T) {
	dir := t.TempDir()
	stdout, stderr, code := runBinary(t, dir, "map", "--plant", "1/(s+1)^3", "--ctrl", "pi", "--grid", "40x30", "-o", "-")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	if !strings.HasPrefix(stdout, "\x89PNG\r\n\x1a\n") {
		t.Fatalf("stdout does not start with a PNG signature: %q", stdout[:min(len(stdout), 16)])
	}
	if !strings.Contains(stderr, "stable") {
		t.Fatalf("report not on stderr: %q", stderr)
	}
	_, _, code = runBinary(t, dir, "map", "--plant", "1/(s+1)^3", "--grid", "20x20", "-o", "-", "--format", "svg", "--quiet")
	if code != 0 {
		t.Fatal("svg to stdout failed")
	}
}

// TestCSVAndNote checks the design-note exports.
func TestCSVAndNote(t *testing.T) {
	dir := t.TempDir()
	os.Mkdir(filepath.Join(dir, "fig"), 0o755)
	_, stderr, code := runBinary(t, dir, "map", "--plant", "1/(s+1)^3", "--ctrl", "pi", "--x", "kp=-2:8", "--y", "ki=-1:3",
		"--grid", "60x40", "-o", "fig/pi.svg", "--csv", "edges.csv", "--note", "note.md", "--quiet")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	csv, _ := os.ReadFile(filepath.Join(dir, "edges.csv"))
	lines := strings.Split(strings.TrimSpace(string(csv)), "\n")
	if lines[0] != "curve,kind,kp,ki,omega_rad_per_s" || len(lines) < 20 {
		t.Fatalf("csv header %q, %d lines", lines[0], len(lines))
	}
	if !strings.Contains(string(csv), ",complex,") || !strings.Contains(string(csv), ",real,") {
		t.Fatal("csv lacks a complex or a real edge")
	}
	note, _ := os.ReadFile(filepath.Join(dir, "note.md"))
	for _, want := range []string{"](fig/pi.svg)", "1/(s+1)^3", "Stable:", "Caution"} {
		if !strings.Contains(string(note), want) {
			t.Errorf("note lacks %q:\n%s", want, note)
		}
	}
}
