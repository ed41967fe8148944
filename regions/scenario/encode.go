package scenario

import (
	"fmt"
	"io"
	"math"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"

	"gainscape/internal/safefile"
	"gainscape/regions/spec"
)

// Save writes s to the file at path as EncodeFile writes it, through a
// temporary file renamed into place, so that a failure leaves no partial
// file and path as it was.
func Save(path string, s Scenario) error {
	return safefile.Write(path, func(w io.Writer) error { return EncodeFile(w, s, path) })
}

// EncodeFile writes s as Encode does, for the scenario file at path: the
// header names the file by its base name, and the output paths, which
// are relative to the current folder, are rewritten relative to path's
// folder, where ResolvePaths takes them from when the file is run. A
// path that lands outside that folder is kept, with its "..", and is
// refused when the file is run unless the user allows it.
func EncodeFile(w io.Writer, s Scenario, path string) error {
	s.Output = s.Output.relativeTo(filepath.Dir(path))
	return encode(w, s, filepath.Base(path))
}

// Encode writes s as a scenario file: a header comment saying what the
// file is and how to re-run it, then every key of the schema, so the file
// also shows what can be changed. It writes only a scenario that passes
// Validate, and Decode reads what it writes back to a Scenario equal to s
// (reflect.DeepEqual), provided s's empty lists are nil, as Decode
// returns them.
func Encode(w io.Writer, s Scenario) error { return encode(w, s, "FILE") }

func encode(w io.Writer, s Scenario, name string) error {
	if err := s.Validate(); err != nil {
		return err
	}
	var b strings.Builder
	b.WriteString("# gainscape scenario: one stability map, what is drawn over it and where it is written.\n")
	fmt.Fprintf(&b, "# Re-run it with: gainscape map --scenario %s\n", shellWord(name))
	b.WriteString("# Flags given beside --scenario override the values in this file.\n\n")
	fmt.Fprintf(&b, "schema = %d\n", Version)

	l := s.Loop
	b.WriteString("\n[loop]\n")
	if l.Plant != "" {
		fmt.Fprintf(&b, "plant = %s\n", quote(l.Plant))
	} else {
		fmt.Fprintf(&b, "numerator = %s    # highest power first\n", formatList(l.Numerator))
		fmt.Fprintf(&b, "denominator = %s\n", formatList(l.Denominator))
	}
	fmt.Fprintf(&b, "controller = %s\n", quote(l.Controller))
	fmt.Fprintf(&b, "time_unit = %s    # the unit of time of s: labels only\n", quote(l.TimeUnit))
	fmt.Fprintf(&b, "sample = %s    # sample time of a digital controller; 0: continuous\n", formatNumber(l.Sample))
	fmt.Fprintf(&b, "integral = %s    # a digital integral: backward, forward or trapezoid\n", quote(l.Integral))
	fmt.Fprintf(&b, "prewarp = %s    # pre-warp frequency of a digital lead or lag; 0: none\n", formatNumber(l.Prewarp))
	fmt.Fprintf(&b, "pade = %d    # Padé order of the cross-check of a loop with dead time; 0: chosen\n", l.Pade)

	a := s.Axes
	b.WriteString("\n[axes]\n")
	fmt.Fprintf(&b, "x = %s\n", quote(formatAxis(a.X)))
	fmt.Fprintf(&b, "y = %s\n", quote(formatAxis(a.Y)))
	fmt.Fprintf(&b, "grid = %s    # nodes along x and along y\n", quote(fmt.Sprintf("%dx%d", a.Columns, a.Rows)))

	b.WriteString("\n[fixed]    # parameters that are not axes; the others keep their defaults\n")
	for _, f := range s.Fixed {
		fmt.Fprintf(&b, "%s = %s\n", f.Param, formatNumber(f.V))
	}

	o := s.Overlays
	marks := make([]string, len(o.Marks))
	for i, m := range o.Marks {
		marks[i] = quote(formatValues(m))
	}
	best := make([]string, len(o.Best))
	for i, n := range o.Best {
		best[i] = quote(n)
	}
	b.WriteString("\n[overlays]\n")
	fmt.Fprintf(&b, "decay = %t\n", o.Decay)
	fmt.Fprintf(&b, "decay_levels = %s\n", formatList(o.DecayLevels))
	fmt.Fprintf(&b, "damping_levels = %s\n", formatList(o.DampingLevels))
	fmt.Fprintf(&b, "ms_levels = %s\n", formatList(o.MsLevels))
	fmt.Fprintf(&b, "marks = [%s]\n", strings.Join(marks, ", "))
	fmt.Fprintf(&b, "best = [%s]\n", strings.Join(best, ", "))
	fmt.Fprintf(&b, "ms_bound = %s    # 0: no limit\n", formatNumber(o.MsBound))
	fmt.Fprintf(&b, "compare_samples = %s    # sample times whose edges are drawn over the map\n", formatList(o.CompareSamples))

	out := s.Output
	b.WriteString("\n[output]    # an empty path is not written\n")
	fmt.Fprintf(&b, "image = %s\n", quote(out.Image))
	fmt.Fprintf(&b, "data = %s\n", quote(out.Data))
	fmt.Fprintf(&b, "csv = %s\n", quote(out.CSV))
	fmt.Fprintf(&b, "note = %s\n", quote(out.Note))
	fmt.Fprintf(&b, "title = %s    # empty: plant and controller\n", quote(out.Title))
	fmt.Fprintf(&b, "width_cm = %s\n", formatNumber(out.WidthCm))
	fmt.Fprintf(&b, "height_cm = %s\n", formatNumber(out.HeightCm))
	fmt.Fprintf(&b, "dpi = %d    # resolution of a PNG image\n", out.DPI)

	_, err := io.WriteString(w, b.String())
	return err
}

// formatNumber writes x so that both TOML and strconv.ParseFloat read back
// exactly x: the shortest decimal that does, with -0 kept negative.
func formatNumber(x float64) string {
	switch {
	case x == 0 && math.Signbit(x):
		return "-0.0"
	case math.IsNaN(x):
		return "nan"
	case math.IsInf(x, 1):
		return "inf"
	case math.IsInf(x, -1):
		return "-inf"
	}
	return strconv.FormatFloat(x, 'g', -1, 64)
}

// formatList writes a TOML array of numbers.
func formatList(l []float64) string {
	parts := make([]string, len(l))
	for i, x := range l {
		parts[i] = formatNumber(x)
	}
	return "[" + strings.Join(parts, ", ") + "]"
}

// formatAxis writes an axis as the --x flag takes it, "kp=0:20".
func formatAxis(a spec.Axis) string {
	return a.Param + "=" + formatNumber(a.Min) + ":" + formatNumber(a.Max)
}

// formatValues writes parameter values as the --set and --mark flags take
// them, "kp=2, ki=0.8".
func formatValues(vals []spec.Value) string {
	parts := make([]string, len(vals))
	for i, v := range vals {
		parts[i] = v.Param + "=" + formatNumber(v.V)
	}
	return strings.Join(parts, ", ")
}

// quote writes s as a TOML basic string. TOML escapes differ from Go's:
// there is no \x or \a, so other control characters become \uXXXX.
func quote(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch r {
		case '"':
			b.WriteString(`\"`)
		case '\\':
			b.WriteString(`\\`)
		case '\n':
			b.WriteString(`\n`)
		case '\t':
			b.WriteString(`\t`)
		case '\r':
			b.WriteString(`\r`)
		case '\b':
			b.WriteString(`\b`)
		case '\f':
			b.WriteString(`\f`)
		default:
			if r < 0x20 || r == 0x7f {
				fmt.Fprintf(&b, `\u%04X`, r)
			} else {
				b.WriteRune(r)
			}
		}
	}
	b.WriteByte('"')
	return b.String()
}

// plainWord matches file names a shell takes as one word unquoted.
var plainWord = regexp.MustCompile(`^[A-Za-z0-9._/+-]+$`)

// shellWord returns name as one word for the re-run line of the header:
// as it is when plain, otherwise quoted, which also keeps line breaks and
// control characters out of the comment.
func shellWord(name string) string {
	if plainWord.MatchString(name) {
		return name
	}
	return strconv.QuoteToASCII(name)
}
