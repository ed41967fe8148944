package scenario

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
	"unicode/utf8"

	"gainscape/regions/spec"
)

// Validate checks that s is complete and consistent in itself: the plant
// given one way only, names that the flags can carry, ranges in order,
// grid sizes within 2…spec.MaxNodesPerAxis, every number finite and every
// string valid UTF-8. It does not look up the controller family or its
// parameters; the command does that when it builds the loop. Each
// problem is an *Error naming the key, the flag that sets the same value
// and the value; several are joined with errors.Join.
func (s Scenario) Validate() error {
	var v validator
	s.Loop.validate(&v)
	s.Axes.validate(&v)
	v.values("fixed", "set", s.Fixed)
	axes := map[string]string{s.Axes.X.Param: "axes.x", s.Axes.Y.Param: "axes.y"}
	for _, f := range s.Fixed {
		if key, ok := axes[f.Param]; ok && f.Param != "" {
			v.add("fixed."+f.Param, "set", "%s is swept by %s; an axis parameter cannot also be fixed", f.Param, key)
		}
	}
	s.Overlays.validate(&v)
	s.Output.validate(&v)
	return errors.Join(v.errs...)
}

func (l Loop) validate(v *validator) {
	hasPlant := l.Plant != ""
	hasLists := l.Numerator != nil || l.Denominator != nil
	switch {
	case hasPlant && hasLists:
		v.add("loop.plant", "plant", "given together with loop.numerator and loop.denominator; give the plant one way only")
	case !hasPlant && !hasLists:
		v.add("loop.plant", "plant", "missing; give loop.plant, or loop.numerator and loop.denominator")
	case hasPlant && strings.TrimSpace(l.Plant) == "":
		v.add("loop.plant", "plant", "%s is blank", strconv.Quote(l.Plant))
	case hasLists:
		v.coefficients("loop.numerator", "num", l.Numerator)
		v.coefficients("loop.denominator", "den", l.Denominator)
	}
	v.text("loop.plant", "plant", l.Plant)
	if strings.TrimSpace(l.Controller) == "" {
		v.add("loop.controller", "ctrl", "missing; give a controller family such as \"pid\"")
	}
	v.text("loop.controller", "ctrl", l.Controller)
}

func (a Axes) validate(v *validator) {
	v.axis("axes.x", "x", a.X)
	v.axis("axes.y", "y", a.Y)
	if a.X.Param != "" && a.X.Param == a.Y.Param {
		v.add("axes.y", "y", "both axes sweep %s; choose two different parameters", a.X.Param)
	}
	for _, n := range []struct {
		what  string
		count int
	}{{"columns", a.Columns}, {"rows", a.Rows}} {
		if n.count < 2 || n.count > spec.MaxNodesPerAxis {
			v.add("axes.grid", "grid", "%dx%d has %d %s; each axis takes 2 to %d nodes",
				a.Columns, a.Rows, n.count, n.what, spec.MaxNodesPerAxis)
		}
	}
}

func (o Overlays) validate(v *validator) {
	v.levels("overlays.decay_levels", "", o.DecayLevels, "", func(float64) bool { return true })
	v.levels("overlays.damping_levels", "", o.DampingLevels, "a damping ratio lies between 0 and 1",
		func(x float64) bool { return x >= 0 && x <= 1 })
	// Ms is at least 1 for a strictly proper loop: S(jω) → 1 as ω → ∞.
	v.levels("overlays.ms_levels", "", o.MsLevels, "Ms is at least 1", func(x float64) bool { return x >= 1 })
	if !finite(o.MsBound) || (o.MsBound != 0 && o.MsBound < 1) {
		v.add("overlays.ms_bound", "ms-bound", "%s: expected 0 (no limit) or a bound of at least 1, since Ms is at least 1", formatNumber(o.MsBound))
	}
	for i, m := range o.Marks {
		key := fmt.Sprintf("overlays.marks[%d]", i+1)
		if len(m) == 0 {
			v.add(key, "mark", "the point has no values; write it as \"kp=2, ki=0.8\"")
		}
		v.values(key, "mark", m)
	}
	seen := map[string]bool{}
	for i, b := range o.Best {
		key := fmt.Sprintf("overlays.best[%d]", i+1)
		switch {
		case strings.TrimSpace(b) == "":
			v.add(key, "best", "%s is blank; name a search", strconv.Quote(b))
		case seen[b]:
			v.add(key, "best", "%s is listed twice", strconv.Quote(b))
		}
		seen[b] = true
		v.text(key, "best", b)
	}
}

func (o Output) validate(v *validator) {
	for _, p := range []struct{ key, flag, val string }{
		{"output.image", "out", o.Image}, {"output.data", "data", o.Data}, {"output.csv", "csv", o.CSV},
		{"output.note", "note", o.Note}, {"output.title", "title", o.Title},
	} {
		v.text(p.key, p.flag, p.val)
	}
	for _, d := range []struct {
		key string
		cm  float64
	}{{"output.width_cm", o.WidthCm}, {"output.height_cm", o.HeightCm}} {
		if !(d.cm >= MinSizeCm && d.cm <= MaxSizeCm) {
			v.add(d.key, "", "%s cm is outside %d to %d cm", formatNumber(d.cm), MinSizeCm, MaxSizeCm)
		}
	}
}

// validator collects the problems Validate finds.
type validator struct{ errs []error }

func (v *validator) add(key, flag, format string, args ...any) {
	v.errs = append(v.errs, &Error{Key: key, Flag: flag, Msg: fmt.Sprintf(format, args...)})
}

// text checks that a string can be written to a file and read back.
func (v *validator) text(key, flag, s string) {
	if !utf8.ValidString(s) {
		v.add(key, flag, "%s is not valid UTF-8 text", strconv.Quote(s))
	}
}

func (v *validator) coefficients(key, flag string, c []float64) {
	if len(c) == 0 {
		v.add(key, flag, "missing; loop.numerator and loop.denominator go together, highest power first")
		return
	}
	allZero := true
	for i, x := range c {
		if !finite(x) {
			v.add(key, flag, "%s: coefficient %d is not a finite number", formatList(c), i+1)
		}
		allZero = allZero && x == 0
	}
	if allZero {
		v.add(key, flag, "%s: every coefficient is zero", formatList(c))
	}
}

func (v *validator) axis(key, flag string, a spec.Axis) {
	switch {
	case !validName(a.Param):
		v.add(key, flag, "%s: %s is not a parameter name (a lower-case letter, then letters, digits or _)", formatAxis(a), strconv.Quote(a.Param))
	case !finite(a.Min) || !finite(a.Max):
		v.add(key, flag, "%s: the range is not finite", formatAxis(a))
	case !(a.Min < a.Max):
		v.add(key, flag, "%s: the minimum must be below the maximum", formatAxis(a))
	}
}

// values checks a list of name=value pairs: names the flags can carry,
// each once, and finite values.
func (v *validator) values(key, flag string, vals []spec.Value) {
	seen := map[string]bool{}
	for _, x := range vals {
		switch {
		case !validName(x.Param):
			v.add(key, flag, "%s is not a parameter name (a lower-case letter, then letters, digits or _)", strconv.Quote(x.Param))
		case seen[x.Param]:
			v.add(key, flag, "%s is given twice", x.Param)
		case !finite(x.V):
			v.add(key, flag, "%s = %s is not a finite number", x.Param, formatNumber(x.V))
		}
		seen[x.Param] = true
	}
}

// levels checks iso-line levels: finite and, where rule is given, within
// the range it states.
func (v *validator) levels(key, flag string, l []float64, rule string, ok func(float64) bool) {
	for i, x := range l {
		switch {
		case !finite(x):
			v.add(key, flag, "%s: level %d is not a finite number", formatList(l), i+1)
		case !ok(x):
			v.add(key, flag, "%s: level %s is out of range; %s", formatList(l), formatNumber(x), rule)
		}
	}
}

// validName reports whether s is a parameter name: a lower-case letter,
// then lower-case letters, digits or underscores. Such names pass through
// the flag syntax "kd=0.5,tau=0" and are bare TOML keys.
func validName(s string) bool {
	if s == "" || s[0] < 'a' || s[0] > 'z' {
		return false
	}
	for _, c := range []byte(s) {
		if !(c >= 'a' && c <= 'z' || c >= '0' && c <= '9' || c == '_') {
			return false
		}
	}
	return true
}
