package main

import (
	"context"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"gainscape/internal/safefile"
	"gainscape/regions/export"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
	"gainscape/regions/study"
	"gainscape/render"
)

// compareFlags are the command-line settings of a comparison, as typed.
type compareFlags struct {
	plants       []string
	num, den     string
	ctrl         string
	set, xs, ys  []string
	slices       string
	timeUnit     string
	sample       float64
	integral     string
	grid         string
	msBound      float64
	msLevels     string
	decay        bool
	kdRange      string
	columns      int
	out, format  string
	data, note   string
	responses    string
	title, size  string
	dpi, workers int
	quiet        bool
	scenarioFile string
	allowOutside bool
}

// panelFlags are the flags that define the panels; they cannot be given
// beside a scenario file, whose [[panels]] do that.
var panelFlags = []string{"plant", "num", "den", "ctrl", "set", "x", "y", "slices", "sample", "integral", "time-unit"}

func newCompareFlagSet(f *compareFlags) *pflag.FlagSet {
	d := scenario.DefaultCompare()
	fs := pflag.NewFlagSet("compare", pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.StringArrayVar(&f.plants, "plant", nil, "plant in s, optionally LABEL=EXPR (repeatable: one panel row per plant)")
	fs.StringVar(&f.num, "num", "", "plant numerator coefficients, highest power first")
	fs.StringVar(&f.den, "den", "", "plant denominator coefficients, highest power first")
	fs.StringVar(&f.ctrl, "ctrl", "pi,pid", "controller structures, comma-separated")
	fs.StringArrayVar(&f.set, "set", nil, "fixed values LIST, or STRUCT:LIST for one structure (repeatable)")
	fs.StringArrayVar(&f.xs, "x", nil, "horizontal axis [STRUCT:]NAME[=MIN:MAX] (repeatable)")
	fs.StringArrayVar(&f.ys, "y", nil, "vertical axis [STRUCT:]NAME[=MIN:MAX] (repeatable)")
	fs.StringVar(&f.slices, "slices", "", "one panel per value: NAME=V1,V2,… (sample=… for sample times)")
	fs.StringVar(&f.timeUnit, "time-unit", d.Loop.TimeUnit, "unit of time of s")
	fs.Float64Var(&f.sample, "sample", 0, "sample time of a digital controller (0: continuous)")
	fs.StringVar(&f.integral, "integral", "", "digital integral: backward, forward or trapezoid")
	fs.StringVar(&f.grid, "grid", fmt.Sprintf("%dx%d", study.DefaultCompareColumns, study.DefaultCompareRows), "grid nodes of each panel NXxNY")
	fs.Float64Var(&f.msBound, "ms-bound", 0, "Ms limit of the searches (0: 1.4)")
	fs.StringVar(&f.msLevels, "ms-levels", numbersText(d.Settings.MsLevels), "Ms iso-lines, or none")
	fs.BoolVar(&f.decay, "decay", false, "shade the stable regions by decay rate, on one scale")
	fs.StringVar(&f.kdRange, "kd-range", "", "range MIN:MAX of the search for the best ki over kd")
	fs.IntVar(&f.columns, "columns", 0, "panels per row of the figure (0: chosen)")
	fs.StringVarP(&f.out, "out", "o", d.Output.Image, "figure of the panels (.png, .svg or .pdf, - for stdout)")
	fs.StringVar(&f.format, "format", "", "image format png, svg or pdf")
	fs.StringVar(&f.data, "data", "", "JSON data file")
	fs.StringVar(&f.note, "note", "", "Markdown note with the table")
	fs.StringVar(&f.responses, "responses", "", "figure of the step responses of the best designs")
	fs.StringVar(&f.title, "title", "", "figure title")
	fs.StringVar(&f.size, "size", "", "image size WxH in centimetres (default: 17 cm wide, height to suit)")
	fs.IntVar(&f.dpi, "dpi", d.Output.DPI, "resolution of PNG images")
	fs.IntVar(&f.workers, "workers", 0, "goroutines (0 = all cores)")
	fs.BoolVar(&f.quiet, "quiet", false, "print nothing but errors")
	fs.StringVar(&f.scenarioFile, "scenario", "", "compare scenario file to read")
	fs.BoolVar(&f.allowOutside, scenario.OutsidePathsFlag, false, "let a scenario file write outside its own folder")
	return fs
}

func runCompare(ctx context.Context, args []string, stdout, stderr io.Writer) error {
	var f compareFlags
	fs := newCompareFlagSet(&f)
	if err := parseFlags(fs, args, compareHelp, stdout); err != nil {
		return err
	}
	if f.workers < 0 {
		return userErr("--workers %d: must be 0 (all cores) or more", f.workers)
	}
	c, err := f.comparison(fs)
	if err != nil {
		return err
	}
	req, err := study.CompareRequestOf(c)
	if err != nil {
		return err
	}
	formats := map[string]string{}
	for _, o := range []struct{ key, path string }{{"output.image", c.Output.Image}, {"output.responses", c.Output.Responses}} {
		if o.path == "" {
			continue
		}
		format, err := imageFormat(o.path, f.format, o.key == "output.image")
		if err != nil {
			return usageError{fmt.Errorf("%s: %w", c.Where(o.key), err)}
		}
		formats[o.key] = format
	}

	plan := safefile.NewPlan()
	outputs := map[string]*safefile.Output{}
	for _, key := range compareOutputs {
		if p := outputPath(c.Output, key); p != "" {
			outputs[key] = plan.Add(c.Where(key), p)
		}
	}
	if f.scenarioFile != "" {
		plan.AddInput("--scenario", f.scenarioFile)
	}
	if err := plan.Check(); err != nil {
		return usageError{err}
	}
	defer plan.Abort()
	for _, o := range outputs {
		if o.Path() == safefile.Stdout && !f.quiet {
			stdout = stderr
		}
	}

	start := time.Now()
	cmp, err := study.Compare(ctx, req, study.Options{Workers: f.workers, Progress: progressFor(stderr, f.quiet)})
	if err != nil {
		return err
	}
	elapsed := time.Since(start)
	title := compareTitle(cmp, c.Output.Title)
	writers := map[string]func(io.Writer) error{
		"output.image": func(w io.Writer) error {
			return render.WritePanels(w, formats["output.image"], panelsFigure(cmp, c, title))
		},
		"output.data": func(w io.Writer) error { return export.Write(w, cmp.Data(title)) },
		"output.note": func(w io.Writer) error {
			return writeCompareNote(w, cmp, title, relLink(c.Output.Note, c.Output.Image), relLink(c.Output.Note, c.Output.Responses))
		},
		"output.responses": func(w io.Writer) error {
			fig, err := responsesFigure(cmp, c, title)
			if err != nil {
				return err
			}
			return render.WriteResponses(w, formats["output.responses"], fig)
		},
	}
	if err := writeAll(ctx, plan, outputs, writers, compareOutputs); err != nil {
		return err
	}
	if !f.quiet {
		printComparison(stdout, cmp, title, elapsed)
		for _, key := range compareOutputs {
			if p := outputPath(c.Output, key); p != "" && p != safefile.Stdout {
				fmt.Fprintf(stdout, "%-11s %s\n", strings.TrimPrefix(key, "output."), p)
			}
		}
		fmt.Fprintln(stdout, caution)
	}
	return nil
}

// compareOutputs are the keys of a comparison's outputs, in the order
// they are written.
var compareOutputs = []string{"output.image", "output.data", "output.note", "output.responses"}

// outputPath returns the output file of key.
func outputPath(o scenario.CompareOutput, key string) string {
	switch key {
	case "output.image":
		return o.Image
	case "output.data":
		return o.Data
	case "output.note":
		return o.Note
	}
	return o.Responses
}

// imageFormat returns the format of an image file from its extension, or
// format when given (they must agree); standard output is PNG unless
// format says otherwise.
func imageFormat(path, format string, stdoutOK bool) (string, error) {
	format = strings.ToLower(format)
	if format != "" && format != "png" && format != "svg" && format != "pdf" {
		return "", fmt.Errorf("--format %q is not an image format; use png, svg or pdf", format)
	}
	if path == safefile.Stdout && stdoutOK {
		if format == "" {
			return "png", nil
		}
		return format, nil
	}
	ext := strings.ToLower(strings.TrimPrefix(filepath.Ext(path), "."))
	if ext != "png" && ext != "svg" && ext != "pdf" {
		return "", fmt.Errorf("%q: an image takes the extension .png, .svg or .pdf", path)
	}
	if format != "" && stdoutOK && format != ext {
		return "", fmt.Errorf("--format %s does not match %q", format, path)
	}
	return ext, nil
}

// relLink is the path of target as a note at note links it, or "".
func relLink(note, target string) string {
	if target == "" || target == safefile.Stdout || note == "" || note == safefile.Stdout {
		return ""
	}
	rel, err := filepath.Rel(filepath.Dir(note), target)
	if err != nil {
		return ""
	}
	return filepath.ToSlash(rel)
}

// comparison reads the scenario file, if any, and the flags into one
// validated comparison with its paths resolved.
func (f *compareFlags) comparison(fs *pflag.FlagSet) (scenario.Compare, error) {
	c := scenario.DefaultCompare()
	if f.scenarioFile != "" {
		for _, name := range panelFlags {
			if fs.Changed(name) {
				return c, userErr("--%s: the panels come from --scenario %s; give them there, or leave --scenario out", name, f.scenarioFile)
			}
		}
		var err error
		if c, err = scenario.LoadCompare(f.scenarioFile); err != nil {
			return c, err
		}
	} else {
		var err error
		if c.Loop, c.Panels, err = f.panels(); err != nil {
			return c, err
		}
	}
	if err := f.settings(&c, fs); err != nil {
		return c, err
	}
	if err := c.ResolvePaths(f.allowOutside); err != nil {
		return c, err
	}
	if err := c.Validate(); err != nil {
		return c, err
	}
	return c, nil
}

// settings applies the flags that set what every panel computes and the
// outputs, over the file's values when a flag was given.
func (f *compareFlags) settings(c *scenario.Compare, fs *pflag.FlagSet) error {
	given := func(name string) bool { return f.scenarioFile == "" || fs.Changed(name) }
	mark := func(key, flag string) {
		if fs.Changed(flag) {
			c.Origins[key] = scenario.Origin{Flag: flag}
		}
	}
	if c.Origins == nil {
		c.Origins = scenario.Origins{}
	}
	var err error
	s := &c.Settings
	if given("grid") {
		if s.Columns, s.Rows, err = spec.ParseGrid(f.grid); err != nil {
			return userErr("--grid: %v", err)
		}
	}
	if given("ms-bound") {
		s.MsBound = f.msBound
		mark("compare.ms_bound", "ms-bound")
	}
	if given("ms-levels") {
		if s.MsLevels, err = numberList("--ms-levels", f.msLevels); err != nil {
			return err
		}
		mark("compare.ms_levels", "ms-levels")
	}
	if given("decay") {
		s.Decay = f.decay
	}
	if fs.Changed("kd-range") {
		lo, hi, ok := strings.Cut(f.kdRange, ":")
		a, err1 := strconv.ParseFloat(strings.TrimSpace(lo), 64)
		b, err2 := strconv.ParseFloat(strings.TrimSpace(hi), 64)
		if !ok || err1 != nil || err2 != nil {
			return userErr("--kd-range %q: expected MIN:MAX, such as 0:4", f.kdRange)
		}
		s.KdRange = []float64{a, b}
		mark("compare.kd_range", "kd-range")
	}
	if given("columns") {
		s.FigureColumns = f.columns
		mark("compare.columns", "columns")
	}
	o := &c.Output
	for _, p := range []struct {
		flag, key string
		into      *string
		val       string
	}{{"out", "output.image", &o.Image, f.out}, {"data", "output.data", &o.Data, f.data}, {"note", "output.note", &o.Note, f.note},
		{"responses", "output.responses", &o.Responses, f.responses}, {"title", "output.title", &o.Title, f.title}} {
		if given(p.flag) {
			*p.into = p.val
			mark(p.key, p.flag)
		}
	}
	if fs.Changed("size") {
		if o.WidthCm, o.HeightCm, err = parseSize(f.size); err != nil {
			return userErr("--size %q: %v", f.size, err)
		}
	}
	if given("dpi") {
		o.DPI = f.dpi
		mark("output.dpi", "dpi")
	}
	return nil
}
