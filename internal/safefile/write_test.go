//go:build unix

package safefile

import (
	"bytes"
	"context"
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"testing"
)

// text returns a producer writing s.
func text(s string) func(io.Writer) error {
	return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
}

// noTemporaries fails the test if dir holds a temporary file.
func noTemporaries(t *testing.T, dir string) {
	t.Helper()
	entries, _ := os.ReadDir(dir)
	for _, e := range entries {
		if strings.HasSuffix(e.Name(), ".tmp") {
			t.Errorf("temporary file %s left in the directory", e.Name())
		}
	}
}

func readFile(t *testing.T, path string) string {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// TestCommit writes three outputs, one through a symbolic link and one
// to standard output, and checks contents, permissions and that the link
// stays a link.
func TestCommit(t *testing.T) {
	dir := t.TempDir()
	t.Chdir(dir)
	old := syscall.Umask(0o027)
	defer syscall.Umask(old)
	os.WriteFile("target.json", []byte("old"), 0o600)
	os.Chmod("target.json", 0o600)
	os.Symlink("target.json", "link.json")
	var stdout bytes.Buffer
	p := NewPlan()
	p.Stdout = &stdout
	img, data, csv := p.Add("--out", "-"), p.Add("--data", "link.json"), p.Add("--csv", "new.csv")
	if err := p.Check(); err != nil {
		t.Fatal(err)
	}
	for _, w := range []struct {
		o *Output
		s string
	}{{img, "image"}, {data, "data"}, {csv, strings.Repeat("row\n", 200000)}} {
		if err := w.o.Write(context.Background(), text(w.s)); err != nil {
			t.Fatal(err)
		}
	}
	if stdout.Len() != 0 || readFile(t, "target.json") != "old" {
		t.Fatal("an output was put in place before Commit")
	}
	if err := p.Commit(); err != nil {
		t.Fatal(err)
	}
	if stdout.String() != "image" || readFile(t, "target.json") != "data" || readFile(t, "new.csv") != strings.Repeat("row\n", 200000) {
		t.Fatal("contents differ from what was written")
	}
	if fi, _ := os.Lstat("link.json"); fi.Mode()&os.ModeSymlink == 0 {
		t.Error("the symbolic link was replaced by a file")
	}
	// The replaced file keeps its permissions; the new one has 0666
	// less the umask 027, like any file the user creates.
	for _, c := range []struct {
		path string
		mode os.FileMode
	}{{"target.json", 0o600}, {"new.csv", 0o640}} {
		if fi, _ := os.Stat(c.path); fi.Mode().Perm() != c.mode {
			t.Errorf("%s has mode %v; want %v", c.path, fi.Mode().Perm(), c.mode)
		}
	}
	noTemporaries(t, dir)
	p.Abort() // after Commit: nothing to do
	if readFile(t, "new.csv") == "" {
		t.Error("Abort after Commit removed an output")
	}
}

// TestFailedPlanLeavesFiles fails a plan in each way it can fail after
// Check and checks that every existing output is byte-identical, that
// standard output received nothing, that no temporary file is left and
// that the error names the output.
func TestFailedPlanLeavesFiles(t *testing.T) {
	stop := errors.New("renderer failed")
	tests := []struct {
		name     string
		run      func(t *testing.T, p *Plan, outs []*Output) error
		wantName string
		wantErr  string
	}{
		{"second producer fails", func(t *testing.T, p *Plan, outs []*Output) error {
			outs[0].Write(context.Background(), text("new a"))
			return outs[1].Write(context.Background(), func(w io.Writer) error { io.WriteString(w, "half"); return stop })
		}, "--data", "renderer failed"},
		{"cancelled while writing", func(t *testing.T, p *Plan, outs []*Output) error {
			ctx, cancel := context.WithCancelCause(context.Background())
			return outs[0].Write(ctx, func(w io.Writer) error {
				w.Write(make([]byte, 3*chunk))
				cancel(errors.New("interrupted by SIGTERM"))
				_, err := w.Write(make([]byte, 3*chunk))
				return err
			})
		}, "--out", "interrupted by SIGTERM"},
		{"cancelled before writing", func(t *testing.T, p *Plan, outs []*Output) error {
			ctx, cancel := context.WithCancelCause(context.Background())
			cancel(errors.New("interrupted by SIGINT"))
			return outs[0].Write(ctx, text("x"))
		}, "--out", "interrupted by SIGINT"},
		{"aborted before Commit", func(t *testing.T, p *Plan, outs []*Output) error {
			for _, o := range outs {
				o.Write(context.Background(), text("new"))
			}
			p.Abort()
			return p.Commit()
		}, "", "abandoned"},
		{"target replaced by a directory meanwhile", func(t *testing.T, p *Plan, outs []*Output) error {
			for _, o := range outs {
				o.Write(context.Background(), text("new"))
			}
			os.Remove("c.csv")
			os.Mkdir("c.csv", 0o755)
			t.Cleanup(func() { os.Remove("c.csv"); os.WriteFile("c.csv", []byte("earlier c"), 0o644) })
			return p.Commit()
		}, "--csv", "is a directory"},
		{"standard output fails", func(t *testing.T, p *Plan, outs []*Output) error {
			for _, o := range outs {
				o.Write(context.Background(), text("new"))
			}
			p.Stdout = failingWriter{}
			return p.Commit()
		}, "--note", "pipe closed"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			t.Chdir(dir)
			for _, n := range []string{"a.png", "b.json", "c.csv"} {
				os.WriteFile(n, []byte("earlier "+n[:1]), 0o644)
			}
			before := snapshot(t, dir)
			var stdout bytes.Buffer
			p := NewPlan()
			p.Stdout = &stdout
			outs := []*Output{p.Add("--out", "a.png"), p.Add("--data", "b.json"), p.Add("--csv", "c.csv"), p.Add("--note", "-")}
			if err := p.Check(); err != nil {
				t.Fatal(err)
			}
			err := tc.run(t, p, outs)
			if tc.wantName != "" {
				checkMessage(t, err, tc.wantName, tc.wantErr)
			} else if err == nil || !strings.Contains(err.Error(), tc.wantErr) {
				t.Errorf("error %v; want one containing %q", err, tc.wantErr)
			}
			if err := p.Commit(); err == nil {
				t.Error("Commit of a failed plan succeeded")
			}
			p.Abort()
			if tc.name != "target replaced by a directory meanwhile" {
				if after := snapshot(t, dir); after != before {
					t.Errorf("directory changed:\nbefore %s\nafter  %s", before, after)
				}
			}
			noTemporaries(t, dir)
			if stdout.Len() != 0 {
				t.Errorf("standard output received %q", stdout.String())
			}
		})
	}
}

type failingWriter struct{}

func (failingWriter) Write([]byte) (int, error) { return 0, errors.New("pipe closed") }

// TestAbortAllWhileWriting aborts every plan from another goroutine
// while producers are writing and while others create their temporary
// files, as an interrupt does, and checks that no temporary file
// survives and that no plan can start writing afterwards.
func TestAbortAllWhileWriting(t *testing.T) {
	defer func() { live.Lock(); live.closed = false; live.Unlock() }()
	dir := t.TempDir()
	started := make(chan struct{})
	var wg sync.WaitGroup
	const writers = 20
	errs := make([]error, writers)
	for i := range writers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			p := NewPlan()
			o := p.Add("--data", filepath.Join(dir, "out"+strings.Repeat("x", i)+".json"))
			if err := p.Check(); err != nil {
				errs[i] = err
				return
			}
			errs[i] = o.Write(context.Background(), func(w io.Writer) error {
				if i == 0 {
					close(started)
				}
				for range 8 {
					if _, err := w.Write(make([]byte, chunk)); err != nil {
						return err
					}
				}
				return nil
			})
			if errs[i] == nil {
				errs[i] = p.Commit()
			}
		}()
	}
	<-started
	AbortAll()
	wg.Wait()
	noTemporaries(t, dir)
	p := NewPlan()
	p.Add("--out", filepath.Join(dir, "late.png"))
	if err := p.Check(); !errors.Is(err, errClosed) {
		t.Errorf("a plan after AbortAll: %v; want %v", err, errClosed)
	}
	noTemporaries(t, dir)
	// Each plan either finished before the abort, leaving its output, or
	// failed, leaving none.
	for i, err := range errs {
		_, serr := os.Stat(filepath.Join(dir, "out"+strings.Repeat("x", i)+".json"))
		if (err == nil) != (serr == nil) {
			t.Errorf("plan %d: error %v, output present %v", i, err, serr == nil)
		}
	}
}

// TestWriteFunction checks the one-output Write.
func TestWriteFunction(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "out.txt")
	if err := Write(path, text("one")); err != nil {
		t.Fatal(err)
	}
	err := Write(path, func(w io.Writer) error { io.WriteString(w, "partial"); return errors.New("stopped") })
	if err == nil || !strings.Contains(err.Error(), path) || readFile(t, path) != "one" {
		t.Fatalf("error %v, content %q; want an error naming %s and the earlier file", err, readFile(t, path), path)
	}
	noTemporaries(t, dir)
	if err := Write(filepath.Join(dir, "missing", "x.txt"), text("")); err == nil || !strings.Contains(err.Error(), "does not exist") {
		t.Fatalf("missing directory: error %v", err)
	}
}

// TestMisuse checks that the programmer errors panic.
func TestMisuse(t *testing.T) {
	dir := t.TempDir()
	tests := []struct {
		name string
		do   func(p *Plan, o *Output)
	}{
		{"Write before Check", func(p *Plan, o *Output) { o.Write(context.Background(), text("")) }},
		{"Check twice", func(p *Plan, o *Output) { p.Check(); p.Check() }},
		{"Add after Check", func(p *Plan, o *Output) { p.Check(); p.Add("--csv", "x") }},
		{"Write twice", func(p *Plan, o *Output) {
			p.Check()
			o.Write(context.Background(), text(""))
			o.Write(context.Background(), text(""))
		}},
		{"Commit with an output not written", func(p *Plan, o *Output) { p.Check(); p.Commit() }},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := NewPlan()
			defer p.Abort()
			o := p.Add("--data", filepath.Join(dir, "m.json"))
			defer func() {
				if recover() == nil {
					t.Error("no panic")
				}
			}()
			tc.do(p, o)
		})
	}
}

// TestLongName checks that a target with a name near the file-system
// limit still gets a temporary file.
func TestLongName(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, strings.Repeat("é", 120)+".json") // 245 bytes
	if err := Write(path, text("x")); err != nil {
		t.Fatal(err)
	}
	noTemporaries(t, dir)
}

// TestWrapHidesTemporaryFile checks that an operating-system error on
// the temporary file is reported with the output's name and path only.
func TestWrapHidesTemporaryFile(t *testing.T) {
	err := wrapOS("--data", "m.json", &os.PathError{Op: "write", Path: "/d/.m.json.abc.tmp", Err: syscall.ENOSPC})
	checkMessage(t, err, "--data", "no space left")
	if !errors.Is(err, syscall.ENOSPC) {
		t.Error("the cause is lost")
	}
}
