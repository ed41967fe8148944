// Package study does everything the gainscape commands compute: a
// stability map with its edges, overlays and searches (NewMap, then
// MapJob.Run), the report on one design point (Probe) and the stable
// intervals of one parameter (Vary). Its results are typed values that
// the command only prints, draws and writes.
//
// Errors caused by what the user gave are *InputError values naming the
// input; every other error is a failure of the computation.
package study

import (
	"errors"
	"fmt"
)

// Caution is printed with every report and written into notes and data.
const Caution = "Caution: these results describe the linear model given. Validate the design against actuator limits, saturation, noise and model error; safety-related loops follow the applicable codes and a qualified engineer's review."

// Options controls how a study runs; none of it changes the result.
type Options struct {
	// Workers is the number of goroutines; 0 means all cores.
	Workers int
	// Progress, if set, is called at the start of each long stage
	// ("mapping", "overlays") with the number of steps it has; it returns
	// a function to call with the steps done (from several goroutines)
	// and one to call when the stage ends.
	Progress func(stage string, total int) (set func(done int), finish func())
}

func (o Options) stage(name string, total int) (func(int), func()) {
	if o.Progress == nil {
		return nil, func() {}
	}
	set, finish := o.Progress(name, total)
	return set, finish
}

// InputError is a problem with what the user gave. Flag names the
// command-line flag that carries the input (with Value, the offending
// value as given, if it helps), Key the scenario-file key where there is
// one.
type InputError struct {
	Flag, Key string
	Value     string
	Err       error
}

// Error writes the flag, the value and the problem: `--plant "1/(s": ...`.
func (e *InputError) Error() string {
	s := e.Flag
	if e.Value != "" {
		s += " " + e.Value
	}
	return s + ": " + e.Err.Error()
}

// Unwrap returns the underlying problem.
func (e *InputError) Unwrap() error { return e.Err }

// inputErr returns an *InputError with a formatted problem.
func inputErr(flag, key, value, format string, args ...any) error {
	return &InputError{Flag: flag, Key: key, Value: value, Err: fmt.Errorf(format, args...)}
}

// IsInput reports whether err is (or wraps) an *InputError.
func IsInput(err error) bool {
	var ie *InputError
	return errors.As(err, &ie)
}

// Units names the units of a loop whose plant has its time in Time (one
// of scenario.TimeUnits, "s" when empty): frequencies are in rad per that
// unit, decay rates in 1 per it, periods in it. The numbers never change
// with the unit; only their labels do.
type Units struct{ Time string }

// TimeLabel is the unit of time as written in reports: "µs" for "us".
func (u Units) TimeLabel() string {
	switch u.Time {
	case "":
		return "s"
	case "us":
		return "µs"
	}
	return u.Time
}

// Freq is the unit of frequencies, e.g. "rad/s".
func (u Units) Freq() string { return "rad/" + u.TimeLabel() }

// Rate is the unit of decay rates, e.g. "1/s".
func (u Units) Rate() string { return "1/" + u.TimeLabel() }

// Key is the unit of time as data files write it: "s", "ms", "us", "min"
// or "h".
func (u Units) Key() string {
	if u.Time == "" {
		return "s"
	}
	return u.Time
}
