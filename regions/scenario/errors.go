package scenario

import (
	"strconv"
	"strings"
)

// Error is a scenario value that cannot be used, or a file that cannot be
// read as a scenario. Every error Decode, Load and Validate return is an
// *Error or, from Validate, several joined with errors.Join.
type Error struct {
	// File is the scenario file name; empty when the scenario did not
	// come from a file (Validate).
	File string
	// Line is the 1-based line of the key in File, 0 when unknown.
	Line int
	// Key is the dotted key, e.g. "axes.grid"; empty for the file as a
	// whole.
	Key string
	// Flag is the command-line flag that sets the same value, without
	// dashes, when there is one.
	Flag string
	// Msg says what is wrong and what was expected.
	Msg string
}

// Error returns the message in the form
//
//	scenario file "tank.toml", line 7: axes.grid: "400by300": expected ...
//	axes.grid (--grid): 5000 rows; each axis takes 2 to 4000 nodes
func (e *Error) Error() string {
	var b strings.Builder
	if e.File != "" {
		b.WriteString("scenario file ")
		b.WriteString(strconv.Quote(e.File))
		if e.Line > 0 {
			b.WriteString(", line ")
			b.WriteString(strconv.Itoa(e.Line))
		}
		b.WriteString(": ")
	}
	if e.Key != "" {
		b.WriteString(e.Key)
		if e.Flag != "" {
			b.WriteString(" (--" + e.Flag + ")")
		}
		b.WriteString(": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}
