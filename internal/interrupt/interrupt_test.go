//go:build unix

package interrupt

import (
	"bufio"
	"context"
	"errors"
	"math/rand/v2"
	"os"
	"os/exec"
	"os/signal"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestWatchInProcess sends each signal to the test process itself while
// Watch holds it, which signal.Notify turns into a delivery on Watch's
// channel rather than the end of the process.
func TestWatchInProcess(t *testing.T) {
	for _, s := range signals {
		t.Run(s.name, func(t *testing.T) {
			ctx, stop := Watch(context.Background(), time.Hour, nil)
			defer stop()
			if Cause(ctx) != nil {
				t.Fatal("cancelled before any signal")
			}
			if err := syscall.Kill(os.Getpid(), s.sig); err != nil {
				t.Fatal(err)
			}
			<-ctx.Done()
			e := Cause(ctx)
			if e == nil || e.Signal != s.sig {
				t.Fatalf("cause %v; want %s", context.Cause(ctx), s.name)
			}
			if want := "interrupted by " + s.name; e.Error() != want {
				t.Errorf("message %q; want %q", e.Error(), want)
			}
			if !errors.Is(ctx.Err(), context.Canceled) {
				t.Errorf("ctx.Err() = %v", ctx.Err())
			}
		})
	}
}

// TestStopIsNoInterrupt checks that stopping the watch cancels the
// context without a signal cause.
func TestStopIsNoInterrupt(t *testing.T) {
	ctx, stop := Watch(context.Background(), time.Hour, nil)
	stop()
	stop()
	<-ctx.Done()
	if e := Cause(ctx); e != nil {
		t.Fatalf("cause %v after stop", e)
	}
}

// TestExitCodes checks the shell convention, 128 plus the signal number
// (common practice; the numbers are those of Linux and the BSDs).
func TestExitCodes(t *testing.T) {
	for _, c := range []struct {
		sig  syscall.Signal
		code int
		name string
	}{{syscall.SIGINT, 130, "SIGINT"}, {syscall.SIGTERM, 143, "SIGTERM"}, {syscall.SIGHUP, 129, "SIGHUP"}, {syscall.Signal(10), 138, "signal 10"}} {
		e := &Error{Signal: c.sig}
		if e.ExitCode() != c.code || Name(c.sig) != c.name {
			t.Errorf("signal %d: code %d, name %q; want %d, %q", c.sig, e.ExitCode(), Name(c.sig), c.code, c.name)
		}
	}
}

// TestChildInterrupted signals a child writing through a safefile plan,
// in each mode and with each signal, and checks the exit code, the
// message, that the file it would have replaced is byte-identical and
// that no temporary file or new output is left.
func TestChildInterrupted(t *testing.T) {
	for _, mode := range []string{"prompt", "stuck", "twice"} {
		for _, s := range signals {
			t.Run(mode+"/"+s.name, func(t *testing.T) {
				dir := t.TempDir()
				keep := filepath.Join(dir, "keep.png")
				os.WriteFile(keep, []byte(keptContent), 0o644)
				childMode := mode
				if mode == "twice" {
					childMode = "deaf"
				}
				cmd, lines, stderr := startChild(t, childMode, dir)
				awaitLine(t, lines, "ready")
				cmd.Process.Signal(s.sig)
				if mode == "twice" {
					// Two signals sent at once may reach the child as one.
					awaitLine(t, lines, "cancelled")
					cmd.Process.Signal(s.sig)
				}
				code := waitChild(t, cmd)
				checkInterrupted(t, code, s.sig, stderr.String(), mode != "prompt")
				if b, _ := os.ReadFile(keep); string(b) != keptContent {
					t.Errorf("keep.png is %q; want it unchanged", b)
				}
				entries, _ := os.ReadDir(dir)
				if len(entries) != 1 {
					t.Errorf("directory holds %v; want keep.png alone", names(entries))
				}
			})
		}
	}
}

// TestChildChurn signals a child that makes, writes, commits and aborts
// plans in a tight loop, at a moment chosen at random, many times over,
// so that signals fall between every pair of steps: after each, no
// temporary file may remain.
func TestChildChurn(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for i := range 12 {
		dir := t.TempDir()
		os.WriteFile(filepath.Join(dir, "keep.png"), []byte(keptContent), 0o644)
		cmd, lines, stderr := startChild(t, "churn", dir)
		awaitLine(t, lines, "ready")
		// The delay only spreads the moments the signal lands at; nothing
		// is measured.
		time.Sleep(time.Duration(r.IntN(20000)) * time.Microsecond)
		sig := signals[i%len(signals)].sig
		cmd.Process.Signal(sig)
		checkInterrupted(t, waitChild(t, cmd), sig, stderr.String(), false)
		entries, _ := os.ReadDir(dir)
		for _, e := range entries {
			if strings.HasSuffix(e.Name(), ".tmp") {
				t.Errorf("run %d: temporary file %s left", i, e.Name())
			}
		}
	}
}

// startChild starts the test binary as a child in mode; lines delivers
// what it prints.
func startChild(t *testing.T, mode, dir string) (*exec.Cmd, chan string, *strings.Builder) {
	t.Helper()
	cmd := exec.Command(os.Args[0])
	cmd.Env = append(os.Environ(), childMode+"="+mode, childDir+"="+dir)
	stderr := new(strings.Builder)
	cmd.Stderr = stderr
	out, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	lines := make(chan string, 16)
	go func() {
		sc := bufio.NewScanner(out)
		for sc.Scan() {
			lines <- sc.Text()
		}
		close(lines)
	}()
	return cmd, lines, stderr
}

// awaitLine waits for the child to print want.
func awaitLine(t *testing.T, lines chan string, want string) {
	t.Helper()
	for l := range lines {
		if l == want {
			return
		}
	}
	t.Fatalf("the child ended without printing %q", want)
}

// waitChild waits for the child and returns its exit code. The deadline
// only keeps a broken child from hanging the test run.
func waitChild(t *testing.T, cmd *exec.Cmd) int {
	t.Helper()
	done := make(chan struct{})
	go func() { cmd.Wait(); close(done) }()
	select {
	case <-done:
	case <-time.After(time.Minute):
		cmd.Process.Kill()
		<-done
		t.Fatal("the child did not end after the signal")
	}
	return cmd.ProcessState.ExitCode()
}

// checkInterrupted checks the exit code and, when the child ended on its
// own rather than being ended by Watch, its message.
func checkInterrupted(t *testing.T, code int, sig syscall.Signal, stderr string, ended bool) {
	t.Helper()
	e := &Error{Signal: sig}
	if code != e.ExitCode() {
		t.Errorf("exit code %d; want %d (stderr %q)", code, e.ExitCode(), stderr)
	}
	if !ended && !strings.Contains(stderr, e.Error()) {
		t.Errorf("stderr %q; want %q", stderr, e.Error())
	}
}

func names(entries []os.DirEntry) []string {
	var out []string
	for _, e := range entries {
		out = append(out, e.Name())
	}
	return out
}

// TestIgnoredSignalStaysIgnored starts the child with SIGHUP ignored, as
// nohup does, and checks that a hangup then neither stops it nor kills
// it, while SIGTERM still does.
func TestIgnoredSignalStaysIgnored(t *testing.T) {
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "keep.png"), []byte(keptContent), 0o644)
	signal.Ignore(syscall.SIGHUP)
	cmd, lines, stderr := startChild(t, "prompt", dir)
	signal.Reset(syscall.SIGHUP)
	awaitLine(t, lines, "ready")
	cmd.Process.Signal(syscall.SIGHUP)
	cmd.Process.Signal(syscall.SIGTERM)
	checkInterrupted(t, waitChild(t, cmd), syscall.SIGTERM, stderr.String(), false)
}
