// Command gainscape maps where a feedback loop is stable in the plane of
// two controller parameters, where that region's edges are, and at which
// frequency the loop oscillates on each edge.
//
// Usage:
//
//	gainscape map [flags]     draw a stability map (no flags: a built-in demo)
//	gainscape probe [flags]   margins, poles and robustness of one design point
//	gainscape compare [flags] controller structures side by side
//	gainscape help [command]  show help
//	gainscape version         show the version
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
	"runtime/debug"
	"strings"

	"github.com/spf13/pflag"

	"gainscape/internal/interrupt"
	"gainscape/internal/safefile"
	"gainscape/regions/scenario"
	"gainscape/regions/study"
)

// version is the version of this build.
const version = "0.9.0"

// Exit codes: 2 for a problem with what the user gave (flags, files,
// expressions), 1 for a failure of the tool itself, 128 + the signal
// number when interrupted (the shell convention).
const (
	exitInternal = 1
	exitUsage    = 2
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
  map      draw the stable region of a loop in the plane of two controller
           parameters, its edges and the oscillation frequency along them
  probe    how stable and how robust one design point is: sign array, poles,
           margins, Ms, distance to the nearest edge; or, with --vary, the
           stable intervals of one parameter
  compare  controller structures side by side: one figure of panels, one
           table of comparable figures, the step responses of the best designs
  help     show help for a command
  version  show the version

With no flags, "gainscape map" draws a built-in demo scenario.
Run "gainscape help map", "gainscape help probe" or "gainscape help compare" for every flag with examples.
`

// commands are the subcommands, for help and for suggestions on a typo.
var commands = []string{"map", "probe", "compare", "help", "version"}

// memoryLimit is the heap size past which the collector works harder
// rather than letting the heap double: a 4000×4000 map with every
// overlay and its data holds about half a gigabyte live, and the whole
// process stays within the 1 GB the help promises.
const memoryLimit = 800 << 20

func main() {
	if os.Getenv("GOMEMLIMIT") == "" {
		debug.SetMemoryLimit(memoryLimit)
	}
	var ctx context.Context
	// When the run does not stop within the grace period of a signal,
	// the watch removes the temporary files and ends the process itself;
	// it still says why.
	cleanup := func() {
		safefile.AbortAll()
		if ie := interrupt.Cause(ctx); ie != nil {
			fmt.Fprintln(os.Stderr, "gainscape:", ie.Error()+"; no file was written or changed")
		}
	}
	ctx, stop := interrupt.Watch(context.Background(), interrupt.DefaultGrace, cleanup)
	code := run(ctx, os.Args[1:], os.Stdout, os.Stderr)
	stop()
	os.Exit(code)
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
	case "compare":
		err = runCompare(ctx, args[1:], stdout, stderr)
	case "help", "-h", "--help":
		topic := ""
		if len(args) > 1 {
			topic = args[1]
		}
		return printHelp(stdout, stderr, topic)
	case "version", "--version":
		fmt.Fprintln(stdout, "gainscape", version)
		return 0
	default:
		err = userErr("unknown command %q%s (commands: %s)", args[0], suggest(args[0], commands), strings.Join(commands, ", "))
	}
	return report(ctx, err, stderr)
}

// printHelp prints the help of topic, or the overview.
func printHelp(stdout, stderr io.Writer, topic string) int {
	switch topic {
	case "map":
		fmt.Fprint(stdout, mapHelp)
	case "probe":
		fmt.Fprint(stdout, probeHelp)
	case "compare":
		fmt.Fprint(stdout, compareHelp)
	case "", "help", "version":
		fmt.Fprint(stdout, overview)
	default:
		fmt.Fprintf(stderr, "gainscape: no help for %q%s\n", topic, suggest(topic, commands))
		return exitUsage
	}
	return 0
}

// errHelp reports that the user asked a command for its help.
var errHelp = errors.New("help")

// report prints err, if any, and returns the exit code.
func report(ctx context.Context, err error, stderr io.Writer) int {
	if ie := interrupt.Cause(ctx); ie != nil {
		fmt.Fprintln(stderr, "gainscape:", ie.Error()+"; no file was written or changed")
		return ie.ExitCode()
	}
	if err == nil || errors.Is(err, errHelp) {
		return 0
	}
	fmt.Fprintln(stderr, "gainscape:", firstLines(err))
	var ue usageError
	var se *scenario.Error
	if errors.As(err, &ue) || study.IsInput(err) || errors.As(err, &se) {
		return exitUsage
	}
	return exitInternal
}

// firstLines returns the message of err, at most three lines.
func firstLines(err error) string {
	lines := strings.Split(err.Error(), "\n")
	if len(lines) > 3 {
		lines = lines[:3]
	}
	return strings.Join(lines, "\n")
}

// parseFlags parses args into fs, turning -h and --help into errHelp
// after printing help, and flag errors into usage errors that suggest
// the nearest flag.
func parseFlags(fs *pflag.FlagSet, args []string, help string, stdout io.Writer) error {
	fs.BoolP("help", "h", false, "print this help")
	if err := fs.Parse(args); err != nil {
		msg := err.Error()
		if name, ok := strings.CutPrefix(msg, "unknown flag: --"); ok {
			var names []string
			fs.VisitAll(func(f *pflag.Flag) { names = append(names, f.Name) })
			msg += suggest(name, names)
		}
		return userErr("%s (see gainscape help %s)", msg, fs.Name())
	}
	if h, _ := fs.GetBool("help"); h {
		fmt.Fprint(stdout, help)
		return errHelp
	}
	if fs.NArg() > 0 {
		return userErr("unexpected argument %q (see gainscape help %s)", fs.Arg(0), fs.Name())
	}
	return nil
}

// suggest returns "; did you mean X?" for the candidate nearest word, if
// one is near enough to be a typing slip, or "".
func suggest(word string, candidates []string) string {
	best, dist := "", len(word)/2+1
	for _, c := range candidates {
		if d := editDistance(strings.ToLower(word), c); d < dist {
			best, dist = c, d
		}
	}
	if best == "" {
		return ""
	}
	if strings.HasPrefix(word, "-") || len(candidates) > len(commands) {
		return fmt.Sprintf("; did you mean --%s?", best)
	}
	return fmt.Sprintf("; did you mean %q?", best)
}

// editDistance is the optimal-string-alignment distance between a and b:
// the Levenshtein distance with the swap of two neighbouring letters
// counted as one edit, the commonest typing slip ("mpa" for "map").
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	// d[i][j] is the distance between ra[:i] and rb[:j].
	d := make([][]int, len(ra)+1)
	for i := range d {
		d[i] = make([]int, len(rb)+1)
		d[i][0] = i
	}
	for j := range d[0] {
		d[0][j] = j
	}
	for i := 1; i <= len(ra); i++ {
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			d[i][j] = min(d[i-1][j]+1, d[i][j-1]+1, d[i-1][j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				d[i][j] = min(d[i][j], d[i-2][j-2]+1)
			}
		}
	}
	return d[len(ra)][len(rb)]
}
