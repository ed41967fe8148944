//go:build !unix

package scenario

import "time"

// cpuTime reports false where the processor time is not known; the
// bounds that use it are then not checked.
func cpuTime() (time.Duration, bool) { return 0, false }
