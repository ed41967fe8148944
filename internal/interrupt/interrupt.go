// Package interrupt turns the signals that ask a command to stop into
// the cancellation of a context: SIGINT from the terminal, SIGTERM from a
// supervisor or a build tool, SIGHUP from a terminal that closed. The
// context's cause names the signal, so the command can say "interrupted
// by SIGTERM" and end with the shell's exit code for it, 128 plus the
// signal number.
//
// A command that stops promptly when its context is cancelled does its
// own cleanup on the way out. For one that does not, because it is in a
// step that cannot look at the context, Watch runs a cleanup function and
// ends the process itself a grace period after the first signal, or at
// once at a second one.
package interrupt

import (
	"context"
	"errors"
	"os"
	"os/signal"
	"strconv"
	"sync"
	"syscall"
	"time"
)

// Error is the cause of a context that a signal cancelled.
type Error struct {
	Signal syscall.Signal
}

// Error returns "interrupted by SIGTERM" and the like.
func (e *Error) Error() string { return "interrupted by " + Name(e.Signal) }

// ExitCode returns 128 plus the signal number, the code a shell gives a
// process ended by the signal: 130 for SIGINT, 143 for SIGTERM, 129 for
// SIGHUP.
func (e *Error) ExitCode() int { return 128 + int(e.Signal) }

// signals are the signals Watch catches, with their names.
var signals = []struct {
	sig  syscall.Signal
	name string
}{{syscall.SIGINT, "SIGINT"}, {syscall.SIGTERM, "SIGTERM"}, {syscall.SIGHUP, "SIGHUP"}}

// Signals returns the signals Watch catches: SIGINT, SIGTERM and SIGHUP.
func Signals() []os.Signal {
	out := make([]os.Signal, len(signals))
	for i, s := range signals {
		out[i] = s.sig
	}
	return out
}

// Name returns the conventional name of one of Signals, such as
// "SIGTERM", or "signal N" for another.
func Name(sig syscall.Signal) string {
	for _, s := range signals {
		if s.sig == sig {
			return s.name
		}
	}
	return "signal " + strconv.Itoa(int(sig))
}

// DefaultGrace is how long Watch lets a command wind down on its own
// after the first signal before ending it: enough to finish writing a
// chunk and remove temporary files, short enough that a user or a build
// tool does not wonder whether the signal arrived.
const DefaultGrace = 2 * time.Second

// Watch returns a copy of parent that the first SIGINT, SIGTERM or SIGHUP
// cancels, with an *Error naming the signal as its cause. From then on
// the command is expected to stop, clean up and exit with the error's
// ExitCode. If it is still running grace after the first signal, or when
// a second signal arrives, Watch calls cleanup (which may be nil) and
// ends the process with that exit code; a further signal during cleanup
// ends it at once.
//
// A signal the process was started with ignored, as nohup ignores SIGHUP
// and a shell ignores SIGINT for a job in the background, stays ignored:
// catching it would undo the user's choice.
//
// Calling stop releases the signals and cancels the context; it is safe
// to call more than once.
func Watch(parent context.Context, grace time.Duration, cleanup func()) (ctx context.Context, stop func()) {
	ctx, cancel := context.WithCancelCause(parent)
	sigs := make(chan os.Signal, len(signals))
	for _, s := range Signals() {
		if !signal.Ignored(s) {
			signal.Notify(sigs, s)
		}
	}
	done := make(chan struct{})
	go watch(sigs, done, cancel, grace, cleanup)
	var once sync.Once
	return ctx, func() {
		once.Do(func() {
			signal.Stop(sigs)
			close(done)
			cancel(context.Canceled)
		})
	}
}

// watch cancels on the first signal and ends the process at the second
// or when the grace period is over.
func watch(sigs chan os.Signal, done chan struct{}, cancel context.CancelCauseFunc, grace time.Duration, cleanup func()) {
	var first *Error
	var overdue <-chan time.Time
	for {
		select {
		case <-done:
			return
		case s := <-sigs:
			if first != nil {
				end(first, sigs, cleanup)
			}
			sig, _ := s.(syscall.Signal)
			first = &Error{Signal: sig}
			cancel(first)
			overdue = time.After(grace)
		case <-overdue:
			end(first, sigs, cleanup)
		}
	}
}

// end runs cleanup and ends the process with e's exit code; a signal
// during cleanup ends it at once.
func end(e *Error, sigs chan os.Signal, cleanup func()) {
	go func() {
		<-sigs
		os.Exit(e.ExitCode())
	}()
	if cleanup != nil {
		cleanup()
	}
	os.Exit(e.ExitCode())
}

// Cause returns the *Error of the signal that cancelled ctx, or nil if no
// signal did. A command asks it on its way out: the error it is returning
// may be a plain context.Canceled from code that does not know why.
func Cause(ctx context.Context) *Error {
	var e *Error
	if errors.As(context.Cause(ctx), &e) {
		return e
	}
	return nil
}
