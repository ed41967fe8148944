package scenario

import (
	"errors"
	"fmt"
)

// Error is a scenario value that cannot be used, or a file that cannot be
// read as a scenario. Every error Decode, Load, Validate and ResolvePaths
// return is an *Error or several joined with errors.Join, at most three.
type Error struct {
	// File is the scenario file that gave the value; empty when it did
	// not come from a file.
	File string
	// Line is the 1-based line of the key in File, 0 when unknown.
	Line int
	// Key is the dotted key, e.g. "axes.grid"; empty for the file as a
	// whole.
	Key string
	// Flag is the command-line flag that gave the value, without
	// dashes; empty when no flag did.
	Flag string
	// Msg says what is wrong and what was expected.
	Msg string
}

// Error returns the message placed where the value was given:
//
//	scenario file "tank.toml", line 7: axes.grid: "400by300": expected ...
//	--grid: 1x300 has 1 columns; each axis takes 2 to 4000 nodes
//	axes.grid: 1x300 has 1 columns; each axis takes 2 to 4000 nodes
func (e *Error) Error() string {
	p := place(Origin{File: e.File, Line: e.Line, Flag: e.Flag}, e.Key)
	if p == "" {
		return e.Msg
	}
	return p + ": " + e.Msg
}

// maxReported is how many problems an error reports: a message stays
// within three lines, and the first problems are the ones to fix first.
const maxReported = 3

// joinReported joins errs, keeping the first two and counting the rest
// in a third when there are more than maxReported; file names the file
// of that count.
func joinReported(file string, errs []error) error {
	if len(errs) > maxReported {
		more := &Error{File: file, Msg: fmt.Sprintf("and %d more problems", len(errs)-maxReported+1)}
		errs = append(errs[:maxReported-1:maxReported-1], more)
	}
	return errors.Join(errs...)
}
