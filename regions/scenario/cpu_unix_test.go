//go:build unix

package scenario

import (
	"syscall"
	"time"
)

// cpuTime returns the processor time the process has used, user and
// system, and true; heavy cases are bounded by it rather than by the
// clock, which a loaded machine stretches.
func cpuTime() (time.Duration, bool) {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0, false
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano()), true
}
