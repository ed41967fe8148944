package interrupt_test

import (
	"context"
	"fmt"
	"os"
	"syscall"

	"gainscape/internal/interrupt"
	"gainscape/internal/safefile"
)

// A command watches for the signals, runs with the context and, on its
// way out, reports an interrupt by the signal's name and exit code.
func ExampleWatch() {
	ctx, stop := interrupt.Watch(context.Background(), interrupt.DefaultGrace, safefile.AbortAll)
	defer stop()
	exit := func(err error) int {
		if e := interrupt.Cause(ctx); e != nil {
			fmt.Fprintln(os.Stdout, "gainscape:", e)
			return e.ExitCode()
		}
		if err != nil {
			return 1
		}
		return 0
	}
	fmt.Println(exit(nil))

	e := &interrupt.Error{Signal: syscall.SIGTERM}
	fmt.Println(e, e.ExitCode())
	// Output:
	// 0
	// interrupted by SIGTERM 143
}
