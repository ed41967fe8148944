// Package spec reads the small value languages of the command line:
// an axis "kp=0:20", a list of fixed values "kd=0.5,tau=0", a grid size
// "400x300" and a design point "kp=2,ki=0.8". Every error quotes the
// text it was given.
package spec

import (
	"fmt"
	"strconv"
	"strings"
)

// Axis is a parsed "name=min:max".
type Axis struct {
	Param    string
	Min, Max float64
}

// ParseAxis reads "name=min:max" with min < max, both finite, and a
// window that floating point can resolve with a single cell (see
// CheckWindow; the grid size is checked where it is known).
func ParseAxis(s string) (Axis, error) {
	name, rng, ok := strings.Cut(s, "=")
	name = strings.TrimSpace(name)
	if !ok || name == "" {
		return Axis{}, fmt.Errorf("%q: expected name=min:max, e.g. kp=0:20", s)
	}
	lo, hi, ok := strings.Cut(rng, ":")
	if !ok {
		return Axis{}, fmt.Errorf("%q: expected a range min:max after %q", s, name+"=")
	}
	a := Axis{Param: strings.ToLower(name)}
	var err error
	if a.Min, err = number(lo); err != nil {
		return Axis{}, fmt.Errorf("%q: minimum: %v", s, err)
	}
	if a.Max, err = number(hi); err != nil {
		return Axis{}, fmt.Errorf("%q: maximum: %v", s, err)
	}
	if !(a.Min < a.Max) {
		return Axis{}, fmt.Errorf("%q: minimum %g must be below maximum %g", s, a.Min, a.Max)
	}
	if err := CheckWindow(a, 2); err != nil {
		return Axis{}, fmt.Errorf("%q: %v", s, err)
	}
	return a, nil
}

// Value is one parsed "name=value".
type Value struct {
	Param string
	V     float64
}

// ParseValues reads "name=value,name=value" (commas or spaces between
// pairs). Repeating a name is an error.
func ParseValues(s string) ([]Value, error) {
	var out []Value
	seen := map[string]bool{}
	for _, part := range strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ' ' || r == ';' }) {
		name, val, ok := strings.Cut(part, "=")
		name = strings.ToLower(strings.TrimSpace(name))
		if !ok || name == "" {
			return nil, fmt.Errorf("%q: expected name=value, e.g. kd=0.5", part)
		}
		v, err := number(val)
		if err != nil {
			return nil, fmt.Errorf("%q: %v", part, err)
		}
		if seen[name] {
			return nil, fmt.Errorf("%q: %s is given twice", s, name)
		}
		seen[name] = true
		out = append(out, Value{name, v})
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("%q: expected name=value pairs, e.g. kd=0.5,tau=0", s)
	}
	return out, nil
}

// MaxNodesPerAxis caps each grid dimension. A 4000×4000 map holds 16 M
// nodes: 16 MB of counts plus overlay grids of 128 MB each, about the
// most a laptop handles comfortably; finer detail is better had by
// zooming the window.
const MaxNodesPerAxis = 4000

// ParseGrid reads "NXxNY" (or one number for both), each 2…MaxNodesPerAxis.
func ParseGrid(s string) (nx, ny int, err error) {
	a, b, ok := strings.Cut(strings.ToLower(strings.TrimSpace(s)), "x")
	if !ok {
		b = a
	}
	if nx, err = gridCount(a); err != nil {
		return 0, 0, fmt.Errorf("%q: %v", s, err)
	}
	if ny, err = gridCount(b); err != nil {
		return 0, 0, fmt.Errorf("%q: %v", s, err)
	}
	return nx, ny, nil
}

func gridCount(s string) (int, error) {
	n, err := strconv.Atoi(strings.TrimSpace(s))
	if err != nil {
		return 0, fmt.Errorf("%q is not a whole number of nodes", s)
	}
	if n < 2 || n > MaxNodesPerAxis {
		return 0, fmt.Errorf("%d nodes is outside 2…%d per axis", n, MaxNodesPerAxis)
	}
	return n, nil
}

func number(s string) (float64, error) {
	s = strings.TrimSpace(s)
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", s)
	}
	if !finite(v) {
		return 0, fmt.Errorf("%q is not a finite number", s)
	}
	return v, nil
}
