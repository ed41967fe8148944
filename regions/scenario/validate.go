package scenario

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"gainscape/regions/spec"
)

// Validate checks that s is complete and consistent in itself: the plant
// given one way only and not given empty, names that the flags can
// carry, windows that floating point can resolve at the grid's spacing,
// grid sizes within 2…spec.MaxNodesPerAxis, every number finite, every
// string valid UTF-8, lists within their bounds (MaxLevels, MaxMarks,
// MaxFixed), known searches and output files with the extensions of
// their kinds. It does not look up the controller family or its
// parameters; the command does that when it builds the loop. Each
// problem is an *Error placed where the value was given (see Where) and
// quoting the value; several are joined with errors.Join, at most three.
func (s Scenario) Validate() error {
	v := validator{origins: s.Origins}
	s.Loop.validate(&v)
	s.Axes.validate(&v)
	if len(s.Fixed) > MaxFixed {
		v.add("fixed", "%d values; a scenario fixes at most %d parameters", len(s.Fixed), MaxFixed)
	} else {
		v.values("fixed", s.Fixed, true)
	}
	axes := map[string]string{s.Axes.X.Param: "axes.x", s.Axes.Y.Param: "axes.y"}
	for _, f := range s.Fixed {
		if key, ok := axes[f.Param]; ok && f.Param != "" {
			v.add("fixed."+f.Param, "%s is swept by %s; an axis parameter cannot also be fixed", f.Param, key)
		}
	}
	s.Overlays.validate(&v)
	s.Output.validate(&v)
	return joinReported(s.Origins[""].File, v.errs)
}

func (l Loop) validate(v *validator) {
	hasPlant := l.Plant != ""
	hasLists := l.Numerator != nil || l.Denominator != nil
	switch {
	case hasPlant && hasLists:
		v.add("loop.plant", "%s is given together with coefficient lists; give the plant one way only", quoteShort(l.Plant))
	case !hasPlant && !hasLists:
		switch {
		case v.given("loop.plant"):
			v.add("loop.plant", `"" is empty; give a plant transfer function in s, such as "1/(s+1)^2"`)
		case v.given("loop.numerator"):
			v.add("loop.numerator", "[] is empty; give the numerator coefficients, highest power first")
		case v.given("loop.denominator"):
			v.add("loop.denominator", "[] is empty; give the denominator coefficients, highest power first")
		default:
			v.add("loop.plant", "no plant given; give it as an expression in s or as numerator and denominator coefficients")
		}
	case hasPlant && strings.TrimSpace(l.Plant) == "":
		v.add("loop.plant", "%s is blank", strconv.Quote(l.Plant))
	case hasLists:
		v.coefficients("loop.numerator", "numerator", l.Numerator)
		v.coefficients("loop.denominator", "denominator", l.Denominator)
	}
	v.text("loop.plant", l.Plant)
	if strings.TrimSpace(l.Controller) == "" {
		v.add("loop.controller", "%s: no controller family; give one such as \"pid\"", strconv.Quote(l.Controller))
	}
	v.text("loop.controller", l.Controller)
	if !finite(l.Sample) || l.Sample < 0 {
		v.add("loop.sample", "%s: a sample time is a positive number, or 0 for a continuous-time controller", formatNumber(l.Sample))
	}
	if !finite(l.Prewarp) || l.Prewarp < 0 {
		v.add("loop.prewarp", "%s: a pre-warp frequency is a positive number, or 0 for none", formatNumber(l.Prewarp))
	}
	if !slices.Contains([]string{"", "backward", "forward", "trapezoid"}, l.Integral) {
		v.add("loop.integral", "%s is not a rule for the integral; use backward, forward or trapezoid", quoteShort(l.Integral))
	}
	if l.Pade < 0 || l.Pade > MaxPade {
		v.add("loop.pade", "%d is not an order of the Padé approximant; use 1 to %d, or 0 to have it chosen", l.Pade, MaxPade)
	}
	if !slices.Contains(TimeUnits, l.TimeUnit) {
		v.add("loop.time_unit", "%s is not a unit of time; use one of %s", quoteShort(l.TimeUnit), strings.Join(TimeUnits, ", "))
	}
}

func (a Axes) validate(v *validator) {
	okX := v.axis("axes.x", a.X)
	okY := v.axis("axes.y", a.Y)
	if a.X.Param != "" && a.X.Param == a.Y.Param {
		v.add("axes.y", "both axes sweep %s; choose two different parameters", a.X.Param)
	}
	okGrid := true
	for _, n := range []struct {
		what  string
		count int
	}{{"columns", a.Columns}, {"rows", a.Rows}} {
		if n.count < 2 || n.count > spec.MaxNodesPerAxis {
			v.add("axes.grid", "%dx%d has %d %s; each axis takes 2 to %d nodes",
				a.Columns, a.Rows, n.count, n.what, spec.MaxNodesPerAxis)
			okGrid = false
		}
	}
	if !okGrid {
		return
	}
	for _, w := range []struct {
		key   string
		ok    bool
		axis  spec.Axis
		nodes int
	}{{"axes.x", okX, a.X, a.Columns}, {"axes.y", okY, a.Y, a.Rows}} {
		if w.ok {
			if err := spec.CheckWindow(w.axis, w.nodes); err != nil {
				v.add(w.key, "%s: %v", formatAxis(w.axis), err)
			}
		}
	}
}

func (o Overlays) validate(v *validator) {
	v.levels("overlays.decay_levels", o.DecayLevels, "", func(float64) bool { return true })
	v.levels("overlays.damping_levels", o.DampingLevels, "a damping ratio lies between 0 and 1",
		func(x float64) bool { return x >= 0 && x <= 1 })
	// Ms is at least 1 for a strictly proper loop: S(jω) → 1 as ω → ∞.
	v.levels("overlays.ms_levels", o.MsLevels, "Ms is at least 1", func(x float64) bool { return x >= 1 })
	if len(o.CompareSamples) > MaxCompareSamples {
		v.add("overlays.compare_samples", "%d sample times; a map compares at most %d", len(o.CompareSamples), MaxCompareSamples)
	} else {
		for _, T := range o.CompareSamples {
			if !finite(T) || T <= 0 {
				v.add("overlays.compare_samples", "%s: %s is not a sample time, which is a positive number", formatList(o.CompareSamples), formatNumber(T))
			}
		}
	}
	if !finite(o.MsBound) || (o.MsBound != 0 && o.MsBound < 1) {
		v.add("overlays.ms_bound", "%s: expected 0 (no limit) or a bound of at least 1, since Ms is at least 1", formatNumber(o.MsBound))
	}
	if len(o.Marks) > MaxMarks {
		v.add("overlays.marks", "%d points; a map marks at most %d, labelled A to Z", len(o.Marks), MaxMarks)
	} else {
		for i, m := range o.Marks {
			key := fmt.Sprintf("overlays.marks[%d]", i+1)
			if len(m) == 0 {
				v.add(key, "the point has no values; write it as \"kp=2, ki=0.8\"")
			}
			v.values(key, m, false)
		}
	}
	searches := Searches()
	seen := map[string]bool{}
	for i, b := range o.Best {
		key := fmt.Sprintf("overlays.best[%d]", i+1)
		switch {
		case !slices.Contains(searches, b):
			v.add(key, "%s is not a search; the searches are %s", quoteShort(b), strings.Join(searches, " and "))
		case seen[b]:
			v.add(key, "%s is listed twice", strconv.Quote(b))
		}
		seen[b] = true
	}
}

func (o Output) validate(v *validator) {
	for _, p := range []struct {
		key, val, kind string
		exts           []string
	}{
		{"output.image", o.Image, "an image", imageExtensions},
		{"output.data", o.Data, "a data file", []string{".json"}},
		{"output.csv", o.CSV, "a CSV file", []string{".csv"}},
		{"output.note", o.Note, "a note", []string{".md", ".txt"}},
	} {
		v.path(p.key, p.val, p.kind, p.exts)
	}
	v.looks(o.Title, o.WidthCm, o.HeightCm, o.DPI, false)
}

// looks checks an image's title, size and resolution; with zeroSize, a
// size of 0 (the figure's natural size) is allowed.
func (v *validator) looks(title string, widthCm, heightCm float64, dpi int, zeroSize bool) {
	v.text("output.title", title)
	if n := utf8.RuneCountInString(title); n > MaxTitleRunes {
		v.add("output.title", "%s has %d characters; a title takes at most %d", quoteShort(title), n, MaxTitleRunes)
	}
	for _, d := range []struct {
		key string
		cm  float64
	}{{"output.width_cm", widthCm}, {"output.height_cm", heightCm}} {
		if !(d.cm >= MinSizeCm && d.cm <= MaxSizeCm) && !(zeroSize && d.cm == 0) {
			v.add(d.key, "%s cm is outside %d to %d cm", formatNumber(d.cm), MinSizeCm, MaxSizeCm)
		}
	}
	if dpi < MinDPI || dpi > MaxDPI {
		v.add("output.dpi", "%d dots per inch is outside %d to %d", dpi, MinDPI, MaxDPI)
	}
}

// validator collects the problems Validate finds.
type validator struct {
	origins Origins
	errs    []error
}

func (v *validator) add(key, format string, args ...any) {
	at, _ := v.origins.origin(key)
	v.errs = append(v.errs, &Error{File: at.File, Line: at.Line, Key: key, Flag: at.Flag, Msg: fmt.Sprintf(format, args...)})
}

// given reports whether key was given, by a file or a flag.
func (v *validator) given(key string) bool {
	_, ok := v.origins.origin(key)
	return ok
}

// text checks that a string can be written to a file and read back.
func (v *validator) text(key, s string) {
	if !utf8.ValidString(s) {
		v.add(key, "%s is not valid UTF-8 text", quoteShort(s))
	}
}

// path checks an output path: empty (not written) or a file name with one
// of the extensions of its kind, in any letter case.
func (v *validator) path(key, p, kind string, exts []string) {
	switch {
	case p == "" || p == "-":
	case !utf8.ValidString(p):
		v.text(key, p)
	case strings.ContainsRune(p, 0):
		v.add(key, "%s contains a NUL character, which no file name can", quoteShort(p))
	case !slices.Contains(exts, strings.ToLower(extension(p))):
		v.add(key, "%s: %s takes the extension %s", quoteShort(p), kind, strings.Join(exts, " or "))
	}
}

func (v *validator) coefficients(key, what string, c []float64) {
	if len(c) == 0 {
		v.add(key, "[] is empty; the %s goes with the other coefficient list, highest power first", what)
		return
	}
	allZero := true
	for i, x := range c {
		if !finite(x) {
			v.add(key, "%s: coefficient %d is not a finite number", formatList(c), i+1)
		}
		allZero = allZero && x == 0
	}
	if allZero {
		v.add(key, "%s: every coefficient is zero", formatList(c))
	}
}

// axis checks an axis on its own and reports whether it passed.
func (v *validator) axis(key string, a spec.Axis) bool {
	switch {
	case !validName(a.Param):
		v.add(key, "%s: %s is not a parameter name (a lower-case letter, then letters, digits or _)", formatAxis(a), quoteShort(a.Param))
	case !finite(a.Min) || !finite(a.Max):
		v.add(key, "%s: the range is not finite", formatAxis(a))
	case !(a.Min < a.Max):
		v.add(key, "%s: the minimum must be below the maximum", formatAxis(a))
	default:
		return true
	}
	return false
}

// values checks a list of name=value pairs: names the flags can carry,
// each once, and finite values. With perKey, each pair is reported under
// its own key, such as "fixed.kd".
func (v *validator) values(key string, vals []spec.Value, perKey bool) {
	seen := map[string]bool{}
	for _, x := range vals {
		k := key
		if perKey && validName(x.Param) {
			k = key + "." + x.Param
		}
		switch {
		case !validName(x.Param):
			v.add(k, "%s is not a parameter name (a lower-case letter, then letters, digits or _)", quoteShort(x.Param))
		case seen[x.Param]:
			v.add(k, "%s is given twice", x.Param)
		case !finite(x.V):
			v.add(k, "%s = %s is not a finite number", x.Param, formatNumber(x.V))
		}
		seen[x.Param] = true
	}
}

// levels checks iso-line levels: at most MaxLevels, finite and, where
// rule is given, within the range it states.
func (v *validator) levels(key string, l []float64, rule string, ok func(float64) bool) {
	if len(l) > MaxLevels {
		v.add(key, "%d levels; an overlay draws at most %d", len(l), MaxLevels)
		return
	}
	for i, x := range l {
		switch {
		case !finite(x):
			v.add(key, "%s: level %d is not a finite number", formatList(l), i+1)
		case !ok(x):
			v.add(key, "%s: level %s is out of range; %s", formatList(l), formatNumber(x), rule)
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
