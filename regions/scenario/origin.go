package scenario

import (
	"fmt"
	"strconv"
	"strings"
)

// Origin is where one value of a scenario was given: a line of a
// scenario file or a command-line flag.
type Origin struct {
	// File is the scenario file: the path given to Load, or the name
	// given to Decode.
	File string
	// Line is the 1-based line of the key in File; 0 when unknown.
	Line int
	// Flag is the command-line flag that gave the value, without dashes.
	Flag string
}

// Origins maps each key whose value was given to where it was given. Keys
// are dotted, as in the file: "axes.grid", "fixed.kd", "overlays.marks".
// The entry of the empty key, when present, is the scenario file itself:
// keys the file leaves out, which keep their defaults, are reported
// against it.
type Origins map[string]Origin

// origin returns where key was given, or the file for a key left out;
// an index such as "[2]" in the key is ignored.
func (o Origins) origin(key string) (Origin, bool) {
	if i := strings.IndexByte(key, '['); i >= 0 {
		key = key[:i]
	}
	if at, ok := o[key]; ok {
		return at, true
	}
	return Origin{File: o[""].File}, false
}

// Given reports whether the key's value was given, by a file or a flag,
// rather than left at its default.
func (s Scenario) Given(key string) bool {
	_, ok := s.Origins.origin(key)
	return ok
}

// Where names the value of key as a message about it should: by the flag
// that gave it ("--grid"), by the file, line and key that gave it
// (`scenario file "tank.toml", line 9: axes.grid`), or by the key alone
// when neither is known.
func (s Scenario) Where(key string) string {
	at, _ := s.Origins.origin(key)
	return place(at, key)
}

// Errorf returns an *Error about the value of key, placed as Where places
// it. The command uses it for the problems only it can find, such as a
// plant expression that does not parse or a mark off the plane.
func (s Scenario) Errorf(key, format string, args ...any) error {
	at, _ := s.Origins.origin(key)
	return &Error{File: at.File, Line: at.Line, Key: key, Flag: at.Flag, Msg: fmt.Sprintf(format, args...)}
}

// place writes where a value was given, for the start of a message.
func place(at Origin, key string) string {
	if at.Flag != "" {
		return "--" + at.Flag
	}
	var b strings.Builder
	if at.File != "" {
		b.WriteString("scenario file ")
		b.WriteString(strconv.Quote(at.File))
		if at.Line > 0 {
			b.WriteString(", line ")
			b.WriteString(strconv.Itoa(at.Line))
		}
		if key != "" {
			b.WriteString(": ")
		}
	}
	b.WriteString(key)
	return b.String()
}
