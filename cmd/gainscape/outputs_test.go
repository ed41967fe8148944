package main

import (
	"bytes"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestInterruptLeavesNoFile interrupts a large map midway: the command
// must stop promptly with exit code 130 and leave no file behind.
func TestInterruptLeavesNoFile(t *testing.T) {
	dir := t.TempDir()
	cmd := exec.Command(binary, "map", "--grid", "4000x4000", "-o", "big.png", "--data", "big.json")
	cmd.Dir = dir
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	time.Sleep(400 * time.Millisecond)
	if err := cmd.Process.Signal(syscall.SIGINT); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	select {
	case <-done:
	case <-time.After(20 * time.Second):
		cmd.Process.Kill()
		t.Fatal("the command did not stop after an interrupt")
	}
	if code := cmd.ProcessState.ExitCode(); code != 128+int(syscall.SIGINT) {
		t.Fatalf("exit code %d; want %d (stderr %q)", code, 128+int(syscall.SIGINT), stderr.String())
	}
	if entries, _ := os.ReadDir(dir); len(entries) != 0 {
		t.Fatalf("files left after the interrupt: %v", entries)
	}
}

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
