//go:build unix

package interrupt

import (
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"testing"
	"time"

	"gainscape/internal/safefile"
)

// The tests run this test binary again as a child: a small command that
// writes files through a safefile plan while the test signals it. The
// environment variable childMode selects what the child does; childDir
// is where it writes.
const (
	childMode = "GAINSCAPE_INTERRUPT_CHILD"
	childDir  = "GAINSCAPE_INTERRUPT_DIR"
)

// keptContent is the content of the file the child would replace.
const keptContent = "the earlier map, which must survive"

func TestMain(m *testing.M) {
	if mode := os.Getenv(childMode); mode != "" {
		os.Exit(child(mode, os.Getenv(childDir)))
	}
	os.Exit(m.Run())
}

// child runs one mode and returns its exit code:
//
//   - "prompt": the producer writes until the context stops it; the
//     child cleans up and exits as a command does;
//   - "stuck": the producer ignores the context and never returns, so
//     Watch must clean up and end the process after a short grace;
//   - "deaf": as stuck, with a grace too long to wait for, so that only
//     a second signal ends it;
//   - "churn": plans are made, written, committed and aborted in a loop
//     until a signal, so that the signal lands at any step.
//
// It prints "ready" once a temporary file exists, and "cancelled" when
// the signal has cancelled its context.
func child(mode, dir string) int {
	grace := time.Minute
	if mode == "stuck" {
		grace = 50 * time.Millisecond
	}
	ctx, stop := Watch(context.Background(), grace, safefile.AbortAll)
	defer stop()
	go func() {
		<-ctx.Done()
		fmt.Println("cancelled")
	}()
	err := func() error {
		if mode == "churn" {
			return churn(ctx, dir)
		}
		p := safefile.NewPlan()
		defer p.Abort()
		img := p.Add("--out", filepath.Join(dir, "keep.png"))
		data := p.Add("--data", filepath.Join(dir, "new.json"))
		if err := p.Check(); err != nil {
			return err
		}
		if err := data.Write(ctx, func(w io.Writer) error { _, err := io.WriteString(w, "{}"); return err }); err != nil {
			return err
		}
		err := img.Write(ctx, func(w io.Writer) error {
			buf := make([]byte, 4096)
			for i := 0; ; i++ {
				if _, err := w.Write(buf); err != nil {
					return err
				}
				if i == 100 {
					fmt.Println("ready")
					if mode == "stuck" || mode == "deaf" {
						select {}
					}
				}
			}
		})
		if err != nil {
			return err
		}
		return p.Commit()
	}()
	if e := Cause(ctx); e != nil {
		fmt.Fprintln(os.Stderr, "child:", e)
		return e.ExitCode()
	}
	fmt.Fprintln(os.Stderr, "child: not interrupted:", err)
	return 1
}

// churn writes small plans of two outputs until ctx is cancelled.
func churn(ctx context.Context, dir string) error {
	for i := 0; ctx.Err() == nil; i++ {
		p := safefile.NewPlan()
		a := p.Add("--out", filepath.Join(dir, "keep.png"))
		b := p.Add("--data", filepath.Join(dir, "churn"+strconv.Itoa(i%3)+".json"))
		if err := p.Check(); err != nil {
			return err
		}
		if i == 0 {
			fmt.Println("ready")
		}
		content := func(w io.Writer) error { _, err := io.WriteString(w, keptContent); return err }
		if err := a.Write(ctx, content); err != nil {
			return err
		}
		if err := b.Write(ctx, content); err != nil {
			return err
		}
		if i%2 == 0 {
			p.Abort()
		} else if err := p.Commit(); err != nil {
			return err
		}
	}
	return ctx.Err()
}
