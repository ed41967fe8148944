// Command gainscape maps where a feedback loop is stable in the plane of
// two controller parameters, where that region's edges are, and at which
// frequency the loop oscillates on each edge.
//
// Usage:
//
//	gainscape map [flags]     draw a stability map (no flags: a built-in demo)
//	gainscape help [command]  show help
//	gainscape probe [flags]   margins, poles and robustness of one design point
//
// Run "gainscape help map" or "gainscape help probe" for the flags and
// worked examples.
package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"

	"gainscape/regions/study"
)

// Exit codes: 2 for a problem with what the user gave (flags, files,
// expressions), 1 for a failure of the tool itself, 130 when interrupted
// (128 + SIGINT, the shell convention).
const (
	exitInternal    = 1
	exitUsage       = 2
	exitInterrupted = 130
)

// usageError marks an error caused by the user's input.
type usageError struct{ err error }

func (e usageError) Error() string { return e.err.Error() }
func (e usageError) Unwrap() error { return e.err }

func userErr(format string, a ...any) error { return usageError{fmt.Errorf(format, a...)} }

// caution is printed with every report and written into notes.
const caution = study.Caution

const overview = `gainscape — stability maps of feedback loops in controller-parameter planes

Commands:
  map     draw the stable region of a loop in the plane of two controller
          parameters, its edges and the oscillation frequency along them
  probe   how stable and how robust one design point is: sign array, poles,
          margins, Ms, distance to the nearest edge; or, with --vary, the
          stable intervals of one parameter
  help    show help for a command

With no flags, "gainscape map" draws a built-in demo scenario.
Run "gainscape help map" or "gainscape help probe" for every flag with examples.
`

// stdoutFile is where "-o -" writes the image.
var stdoutFile io.Writer = os.Stdout

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	os.Exit(run(ctx, os.Args[1:], os.Stdout, os.Stderr))
}

// run executes one command line and returns the exit code.
func run(ctx context.Context, args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprint(stderr, overview)
		return exitUsage
	}
	var err error
	switch args[0] {
	case "map":
		err = runMap(ctx, args[1:], stdout, stderr)
	case "probe":
		err = runProbe(ctx, args[1:], stdout)
	case "help", "-h", "--help":
		switch {
		case len(args) > 1 && args[1] == "map":
			fmt.Fprint(stdout, mapHelp)
		case len(args) > 1 && args[1] == "probe":
			fmt.Fprint(stdout, probeHelp)
		default:
			fmt.Fprint(stdout, overview)
		}
		return 0
	default:
		err = userErr("unknown command %q (commands: map, probe, help)", args[0])
	}
	if err == nil {
		return 0
	}
	fmt.Fprintln(stderr, "gainscape:", err)
	if errors.Is(err, context.Canceled) {
		return exitInterrupted
	}
	var ue usageError
	if errors.As(err, &ue) || study.IsInput(err) {
		return exitUsage
	}
	return exitInternal
}
