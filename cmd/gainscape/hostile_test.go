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

// keepContent is the content of the file every failing case names as
// one of its outputs: it must be byte-identical afterwards.
const keepContent = "an existing file that a failed run must leave alone\n"

// hostileCase is one bad or extreme command line. setup, if set, makes
// files in the case's directory first. want are substrings of stderr;
// code is the exit code wanted (0 for a run that must succeed).
type hostileCase struct {
	name  string
	args  []string
	setup func(t *testing.T, dir string)
	code  int
	want  []string
	// cpu bounds the user and system time of the run.
	cpu time.Duration
}

// TestHostileInputs runs the built command on each bad or extreme input
// and checks the exit code, that stderr is one to three lines naming the
// flag or key and the value, that no Go panic trace appears, that no
// temporary file is left and that a file that was there is unchanged.
func TestHostileInputs(t *testing.T) {
	pi := []string{"map", "--plant", "1/(s+1)^3", "--ctrl", "pi", "--grid", "20x15"}
	with := func(extra ...string) []string { return append(append([]string(nil), pi...), extra...) }
	nested := "schema = 1\n[overlays]\nmarks = [" + strings.Repeat("{a=", 5000) + "1" + strings.Repeat("}", 5000) + "]\n"
	many := func(n int) string {
		parts := make([]string, n)
		for i := range parts {
			parts[i] = "1." + strings.Repeat("0", i%5) + "1"
		}
		return strings.Join(parts, ",")
	}
	scenario := func(name, body string) func(*testing.T, string) {
		return func(t *testing.T, dir string) {
			if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
				t.Fatal(err)
			}
		}
	}
	plantFile := "schema = 1\n[loop]\nplant = \"1/(s+1)^3\"\ncontroller = \"pi\"\n[axes]\ngrid = \"20x15\"\n"
	tests := []hostileCase{
		// What the user types wrong.
		{name: "syntax error", args: []string{"map", "--plant", "2*(s+1"}, code: 2, want: []string{"--plant", "column 7", `")"`}},
		{name: "improper plant", args: []string{"map", "--plant", "(s+1)^2/(s+3)"}, code: 2, want: []string{"not proper"}},
		{name: "zero denominator", args: []string{"map", "--num", "1", "--den", "0, 0"}, code: 2, want: []string{"--den", "zero"}},
		{name: "NaN coefficient", args: []string{"map", "--num", "1", "--den", "1, NaN"}, code: 2, want: []string{"--den", "NaN"}},
		{name: "zero numerator", args: []string{"map", "--plant", "0/(s+1)"}, code: 2, want: []string{"--plant", "zero"}},
		{name: "empty plant", args: []string{"map", "--plant", ""}, code: 2, want: []string{"--plant", "empty"}},
		{name: "plant given twice", args: []string{"map", "--plant", "1/(s+1)", "--num", "1", "--den", "1,1"}, code: 2, want: []string{"one way"}},
		{name: "unknown controller", args: []string{"map", "--plant", "1/(s+1)", "--ctrl", "pidd"}, code: 2, want: []string{"--ctrl", "pidd"}},
		{name: "unknown axis parameter", args: with("--x", "kd=0:1"), code: 2, want: []string{"kd"}},
		{name: "same axis twice", args: with("--x", "kp=0:1", "--y", "kp=0:2"), code: 2, want: []string{"kp"}},
		{name: "axis also fixed", args: with("--set", "kp=1"), code: 2, want: []string{"--set", "kp", "axis"}},
		{name: "set twice with two values", args: with("--set", "kp=1", "--set", "kp=2"), code: 2, want: []string{"--set", "kp=1", "kp=2"}},
		{name: "min above max", args: with("--x", "kp=5:1"), code: 2, want: []string{"--x", "kp=5:1"}},
		{name: "grid too small", args: []string{"map", "--plant", "1/(s+1)", "--grid", "1x10"}, code: 2, want: []string{"--grid", "1x10"}},
		{name: "grid too large", args: []string{"map", "--plant", "1/(s+1)", "--grid", "5000x10"}, code: 2, want: []string{"--grid", "5000"}},
		{name: "unknown flag", args: []string{"map", "--plnt", "1/(s+1)"}, code: 2, want: []string{"plnt", "--plant"}},
		{name: "unknown command", args: []string{"mpa"}, code: 2, want: []string{"mpa", "map"}},
		{name: "negative workers", args: with("--workers", "-2"), code: 2, want: []string{"--workers", "-2"}},
		{name: "NaN fixed value", args: []string{"map", "--plant", "1/(s+1)", "--set", "kd=NaN"}, code: 2, want: []string{"--set", "NaN"}},
		{name: "infinite axis end", args: with("--x", "kp=0:Inf"), code: 2, want: []string{"--x", "finite"}},
		{name: "overflowing plant", args: []string{"map", "--plant", "1e400/(s+1)"}, code: 2, want: []string{"--plant"}},
		{name: "unknown search", args: with("--best", "fastest"), code: 2, want: []string{"--best", "fastest"}},
		{name: "mark off the plane", args: with("--mark", "kp=1"), code: 2, want: []string{"--mark", "ki"}},
		{name: "mark at another fixed value", args: []string{"map", "--plant", "1/(s+1)^3", "--ctrl", "pid", "--set", "kd=1", "--grid", "20x15", "--mark", "kp=2,ki=0.4,kd=2"}, code: 2, want: []string{"--mark", "kd"}},
		{name: "bad size", args: with("--size", "1600x1200"), code: 2, want: []string{"--size"}},
		{name: "bad dpi", args: with("--dpi", "5"), code: 2, want: []string{"--dpi", "5"}},
		{name: "bad time unit", args: with("--time-unit", "fortnight"), code: 2, want: []string{"--time-unit", "fortnight"}},
		{name: "bad format", args: with("-o", "-", "--format", "gif"), code: 2, want: []string{"--format", "gif"}},
		{name: "format against extension", args: with("--format", "PNG", "-o", "x.svg"), code: 2, want: []string{"--format", "x.svg"}},
		{name: "bad level list", args: with("--ms-levels", "1.4,two"), code: 2, want: []string{"--ms-levels", "two"}},
		{name: "extra argument", args: with("stray"), code: 2, want: []string{"stray"}},
		// Crashes and hangs.
		{name: "absurd worker count", args: with("--workers", "9223372036854775807", "-o", "w.png", "--quiet"), code: 0, cpu: 20 * time.Second},
		{name: "a billion workers", args: with("--workers", "1000000000", "-o", "w.png", "--quiet"), code: 0, cpu: 20 * time.Second},
		{name: "window below float spacing", args: with("--x", "kp=1:1.000000000000001"), code: 2, want: []string{"--x"}, cpu: 5 * time.Second},
		{name: "window of huge values below spacing", args: with("--x", "kp=1e15:1000000000000001"), code: 2, want: []string{"--x"}, cpu: 5 * time.Second},
		{name: "window whose width overflows", args: with("--x", "kp=-1e308:1e308"), code: 2, want: []string{"--x"}, cpu: 5 * time.Second},
		{name: "degree over the limit", args: []string{"map", "--plant", "1/(s+1)^45", "--ctrl", "pi"}, code: 2, want: []string{"--plant", "degree"}, cpu: 5 * time.Second},
		{name: "too many levels", args: with("--ms-levels", many(500)), code: 2, want: []string{"ms"}, cpu: 5 * time.Second},
		{name: "too many marks", args: func() []string {
			a := with()
			for i := 0; i < 1000; i++ {
				a = append(a, "--mark", "kp=1,ki=0.2")
			}
			return a
		}(), code: 2, want: []string{"mark"}, cpu: 5 * time.Second},
		{name: "deeply nested scenario", args: []string{"map", "--scenario", "deep.toml"}, setup: scenario("deep.toml", nested), code: 2, want: []string{"deep.toml"}, cpu: 5 * time.Second},
		// Output files.
		{name: "image and data on one file", args: with("-o", "same.json", "--data", "same.json"), code: 2, want: []string{"same.json"}},
		{name: "two outputs through a link", args: with("--data", "a.json", "--note", "b.md"), setup: func(t *testing.T, dir string) {
			os.WriteFile(filepath.Join(dir, "a.json"), nil, 0o644)
			os.Symlink("a.json", filepath.Join(dir, "b.md"))
		}, code: 2, want: []string{"same file"}},
		{name: "image is the saved scenario", args: with("-o", "x.png", "--save-scenario", "x.png"), code: 2, want: []string{"x.png"}},
		{name: "data over the input scenario", args: []string{"map", "--scenario", "in.json", "--data", "in.json"}, setup: scenario("in.json", plantFile), code: 2, want: []string{"in.json", "input"}},
		{name: "data is a named pipe", args: with("--data", "pipe.json"), setup: func(t *testing.T, dir string) {
			if err := syscall.Mkfifo(filepath.Join(dir, "pipe.json"), 0o644); err != nil {
				t.Skip("no named pipes here:", err)
			}
		}, code: 2, want: []string{"--data", "named pipe"}},
		{name: "data is a directory", args: with("--data", "dir.json"), setup: func(t *testing.T, dir string) { os.Mkdir(filepath.Join(dir, "dir.json"), 0o755) }, code: 2, want: []string{"--data", "directory"}},
		{name: "data directory missing", args: with("--data", "nowhere/m.json"), code: 2, want: []string{"--data", "nowhere"}},
		{name: "image directory missing", args: with("-o", "nowhere/map.png"), code: 2, want: []string{"--out", "nowhere"}},
		{name: "two outputs on standard output", args: with("-o", "-", "--data", "-"), code: 2, want: []string{"standard output"}},
		{name: "scenario directory missing", args: with("--save-scenario", "nowhere/s.toml"), code: 2, want: []string{"--save-scenario", "nowhere"}},
		// Scenario files are data.
		{name: "scenario image outside its folder", args: []string{"map", "--scenario", "sub/s.toml"}, setup: func(t *testing.T, dir string) {
			os.Mkdir(filepath.Join(dir, "sub"), 0o755)
			scenario("sub/s.toml", plantFile+"[output]\nimage = \"/tmp/gainscape-escape.png\"\n")(t, dir)
		}, code: 2, want: []string{"s.toml", "output.image", "allow-outside-paths"}},
		{name: "scenario data climbing out", args: []string{"map", "--scenario", "sub/s.toml"}, setup: func(t *testing.T, dir string) {
			os.Mkdir(filepath.Join(dir, "sub"), 0o755)
			scenario("sub/s.toml", plantFile+"[output]\ndata = \"../x.json\"\n")(t, dir)
		}, code: 2, want: []string{"s.toml", "output.data"}},
		{name: "unknown fixed parameter in a file", args: []string{"map", "--scenario", "f.toml"}, setup: scenario("f.toml", plantFile+"[fixed]\nzz = 1\n"), code: 2, want: []string{"f.toml", "line", "fixed.zz"}},
		{name: "plant syntax error in a file", args: []string{"map", "--scenario", "p.toml"}, setup: scenario("p.toml", "schema = 1\n[loop]\nplant = \"1/(s+1\"\ncontroller = \"pi\"\n"), code: 2, want: []string{"p.toml", "loop.plant"}},
		{name: "bad mark in a file", args: []string{"map", "--scenario", "m.toml"}, setup: scenario("m.toml", plantFile+"[overlays]\nmarks = [\"kp=1\"]\n"), code: 2, want: []string{"m.toml", "overlays.marks"}},
		{name: "unknown search in a file", args: []string{"map", "--scenario", "b.toml"}, setup: scenario("b.toml", plantFile+"[overlays]\nbest = [\"fastest\"]\n"), code: 2, want: []string{"b.toml", "fastest"}},
		{name: "empty image means none", args: []string{"map", "--scenario", "e.toml", "--quiet"}, setup: scenario("e.toml", plantFile+"[output]\nimage = \"\"\n"), code: 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) { runHostile(t, tc) })
	}
}

func runHostile(t *testing.T, tc hostileCase) {
	dir := t.TempDir()
	if tc.setup != nil {
		tc.setup(t, dir)
	}
	keep := filepath.Join(dir, "keep.png")
	args := tc.args
	if tc.code != 0 {
		// A failing run that also names an existing image must leave it.
		if err := os.WriteFile(keep, []byte(keepContent), 0o644); err != nil {
			t.Fatal(err)
		}
		if !contains(args, "-o") && !contains(args, "--scenario") && args[0] == "map" {
			args = append(append([]string(nil), args...), "-o", "keep.png")
		}
	}
	before := listDir(t, dir)
	cmd := exec.Command(binary, args...)
	cmd.Dir = dir
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	err := cmd.Run()
	code := 0
	if ee, ok := err.(*exec.ExitError); ok {
		code = ee.ExitCode()
	} else if err != nil {
		t.Fatal(err)
	}
	msg := stderr.String()
	if code != tc.code {
		t.Fatalf("exit code %d; want %d (stderr %q)", code, tc.code, msg)
	}
	if strings.Contains(msg, "panic") || strings.Contains(msg, "goroutine ") {
		t.Fatalf("a Go panic: %s", msg)
	}
	if tc.code != 0 {
		if n := len(strings.Split(strings.TrimSpace(msg), "\n")); n < 1 || n > 3 || strings.TrimSpace(msg) == "" {
			t.Fatalf("stderr has %d lines; want one to three: %q", n, msg)
		}
		for _, w := range tc.want {
			if !strings.Contains(msg, w) {
				t.Errorf("stderr %q does not contain %q", msg, w)
			}
		}
		if b, err := os.ReadFile(keep); err != nil || string(b) != keepContent {
			t.Errorf("the existing image was changed or removed (%v)", err)
		}
		if after := listDir(t, dir); strings.Join(after, ",") != strings.Join(before, ",") {
			t.Errorf("files before %v, after %v", before, after)
		}
	}
	for _, name := range listDir(t, dir) {
		if strings.HasPrefix(filepath.Base(name), ".") {
			t.Errorf("temporary file left: %s", name)
		}
	}
	if tc.cpu > 0 {
		if ru, ok := cmd.ProcessState.SysUsage().(*syscall.Rusage); ok {
			used := time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
			if used > tc.cpu {
				t.Errorf("used %v of CPU; the bound is %v", used, tc.cpu)
			}
		}
	}
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// listDir returns every path under dir, relative, sorted.
func listDir(t *testing.T, dir string) []string {
	t.Helper()
	var out []string
	filepath.Walk(dir, func(p string, info os.FileInfo, err error) error {
		if err == nil && p != dir {
			rel, _ := filepath.Rel(dir, p)
			out = append(out, rel)
		}
		return nil
	})
	return out
}

// TestSignals sends SIGINT, SIGTERM and SIGHUP to a run while it computes
// and while it writes: it must stop promptly, exit with 128 + the signal
// number, say it was interrupted, leave no file behind and leave an
// existing output as it was.
func TestSignals(t *testing.T) {
	signals := []syscall.Signal{syscall.SIGINT, syscall.SIGTERM, syscall.SIGHUP}
	for _, sig := range signals {
		for _, phase := range []string{"computing", "writing"} {
			t.Run(phase+" "+sig.String(), func(t *testing.T) {
				dir := t.TempDir()
				keep := filepath.Join(dir, "big.png")
				os.WriteFile(keep, []byte(keepContent), 0o644)
				cmd := exec.Command(binary, "map", "--plant", "3/((s+0.5)*(s+2)*(0.4*s+1)^2)", "--ctrl", "pid", "--set", "kd=0.5,tau=0.05",
					"--grid", "2500x2500", "--decay", "-o", "big.png", "--data", "big.json", "--quiet")
				cmd.Dir = dir
				var stderr bytes.Buffer
				cmd.Stderr = &stderr
				if err := cmd.Start(); err != nil {
					t.Fatal(err)
				}
				if phase == "computing" {
					time.Sleep(300 * time.Millisecond)
				} else if !waitForTemp(dir, 120*time.Second) {
					cmd.Process.Kill()
					t.Fatal("the run never started writing")
				}
				if err := cmd.Process.Signal(sig); err != nil {
					t.Fatal(err)
				}
				done := make(chan error, 1)
				go func() { done <- cmd.Wait() }()
				select {
				case <-done:
				case <-time.After(30 * time.Second):
					cmd.Process.Kill()
					t.Fatal("the command did not stop after the signal")
				}
				if code, want := cmd.ProcessState.ExitCode(), 128+int(sig); code != want {
					t.Fatalf("exit code %d; want %d (stderr %q)", code, want, stderr.String())
				}
				if !strings.Contains(stderr.String(), "interrupted") || strings.Contains(stderr.String(), "context canceled") {
					t.Errorf("stderr %q", stderr.String())
				}
				if got := listDir(t, dir); len(got) != 1 || got[0] != "big.png" {
					t.Errorf("files after the signal: %v", got)
				}
				if b, _ := os.ReadFile(keep); string(b) != keepContent {
					t.Error("the existing image was changed")
				}
			})
		}
	}
}

// waitForTemp waits until a temporary output file appears in dir.
func waitForTemp(dir string, limit time.Duration) bool {
	end := time.Now().Add(limit)
	for time.Now().Before(end) {
		entries, _ := os.ReadDir(dir)
		for _, e := range entries {
			if strings.HasPrefix(e.Name(), ".") {
				return true
			}
		}
		time.Sleep(5 * time.Millisecond)
	}
	return false
}
