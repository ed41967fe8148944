package spec

import (
	"fmt"
	"strings"
	"unicode"
)

// ParseAxisOrName reads an axis that may leave its range to be chosen:
// "name=min:max" as ParseAxis reads it (ranged is true), or a bare
// parameter name "kp" (ranged is false, Min and Max zero), for which the
// caller picks the window.
func ParseAxisOrName(s string) (a Axis, ranged bool, err error) {
	if strings.Contains(s, "=") {
		a, err = ParseAxis(s)
		return a, err == nil, err
	}
	name := strings.ToLower(strings.TrimSpace(s))
	if !IsName(name) {
		return Axis{}, false, fmt.Errorf("%q: expected a parameter name such as kp, or name=min:max such as kp=0:20", s)
	}
	return Axis{Param: name}, false, nil
}

// IsName reports whether s can name a controller parameter: a lower-case
// letter followed by lower-case letters, digits or '_'.
func IsName(s string) bool {
	if s == "" {
		return false
	}
	for i, r := range s {
		switch {
		case r >= 'a' && r <= 'z':
		case i > 0 && (unicode.IsDigit(r) && r < 0x80 || r == '_'):
		default:
			return false
		}
	}
	return true
}
