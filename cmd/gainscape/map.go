package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"slices"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"gainscape/internal/safefile"
	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
	"gainscape/regions/study"
	"gainscape/render"
)

// demo is the built-in scenario: an invented pump pressure loop, two
// first-order lags and a doubled sensor lag, under a filtered PID with
// fixed derivative action. It exists only to show a new user a real map.
var demo = struct {
	plant, ctrl, set, x, y, out, label string
}{
	plant: "3/((s+0.5)*(s+2)*(0.4*s+1)^2)",
	ctrl:  "pid",
	set:   "kd=0.5,tau=0.05",
	x:     "kp=-0.6:3.6",
	y:     "ki=-0.4:1.8",
	out:   "gainscape-demo.png",
	label: "invented demo: pump pressure loop",
}

// mapFlags are the command-line settings of one map, as typed.
type mapFlags struct {
	loopFlags
	x, y, grid     string
	workers        int
	out, data      string
	csv, note      string
	format, title  string
	size           string
	dpi            int
	quiet          bool
	scenario, save string
	allowOutside   bool
	decay          bool
	decayLevels    string
	dampingLevels  string
	msLevels       string
	marks          []string
	best           string
	msBound        float64
	compare        string
	pade           int
	demoLabel      string
	// window is the window chosen for axes given by name alone.
	window *study.Window
}

func newMapFlagSet(f *mapFlags) *pflag.FlagSet {
	d := scenario.Default()
	fs := pflag.NewFlagSet("map", pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.StringVar(&f.plant, "plant", "", "plant transfer function in s")
	fs.StringVar(&f.num, "num", "", "plant numerator coefficients, highest power first")
	fs.StringVar(&f.den, "den", "", "plant denominator coefficients, highest power first")
	fs.StringVar(&f.ctrl, "ctrl", d.Loop.Controller, "controller family")
	fs.StringArrayVar(&f.set, "set", nil, "fixed parameter values (repeatable)")
	fs.StringVar(&f.timeUnit, "time-unit", d.Loop.TimeUnit, "unit of time of s")
	fs.Float64Var(&f.sample, "sample", 0, "sample time of a digital controller (0: continuous)")
	fs.StringVar(&f.integral, "integral", "", "digital integral: backward, forward or trapezoid")
	fs.Float64Var(&f.prewarp, "prewarp", 0, "pre-warp frequency of a digital lead or lag (0: none)")
	fs.StringVar(&f.compare, "compare-samples", "", "sample times whose edges are drawn over the map")
	fs.IntVar(&f.pade, "pade", d.Loop.Pade, "order of the Padé approximant a loop with dead time is compared with (0: chosen)")
	fs.StringVar(&f.x, "x", axisText(d.Axes.X), "horizontal axis NAME=MIN:MAX")
	fs.StringVar(&f.y, "y", axisText(d.Axes.Y), "vertical axis NAME=MIN:MAX")
	fs.StringVar(&f.grid, "grid", fmt.Sprintf("%dx%d", d.Axes.Columns, d.Axes.Rows), "grid nodes NXxNY")
	fs.IntVar(&f.workers, "workers", 0, "goroutines (0 = all cores)")
	fs.StringVarP(&f.out, "out", "o", d.Output.Image, "image file (.png, .svg or .pdf, - for stdout)")
	fs.StringVar(&f.data, "data", "", "JSON data file")
	fs.StringVar(&f.csv, "csv", "", "CSV file of the boundary polylines")
	fs.StringVar(&f.note, "note", "", "Markdown note for a design document")
	fs.StringVar(&f.format, "format", "", "image format png, svg or pdf")
	fs.StringVar(&f.title, "title", "", "figure title")
	fs.StringVar(&f.size, "size", fmt.Sprintf("%gx%g", d.Output.WidthCm, d.Output.HeightCm), "image size WxH in centimetres")
	fs.IntVar(&f.dpi, "dpi", d.Output.DPI, "resolution of a PNG image")
	fs.BoolVar(&f.quiet, "quiet", false, "print nothing but errors")
	fs.StringVar(&f.scenario, "scenario", "", "scenario file to read")
	fs.StringVar(&f.save, "save-scenario", "", "write the scenario of this map to a file")
	fs.BoolVar(&f.allowOutside, scenario.OutsidePathsFlag, false, "let a scenario file write outside its own folder")
	fs.BoolVar(&f.decay, "decay", d.Overlays.Decay, "shade the stable region by decay rate")
	fs.StringVar(&f.decayLevels, "decay-levels", "", "decay rates to draw as iso-lines")
	fs.StringVar(&f.dampingLevels, "damping-levels", "", "damping ratios to draw as iso-lines")
	fs.StringVar(&f.msLevels, "ms-levels", numbersText(d.Overlays.MsLevels), "Ms values to draw as iso-lines, or none")
	fs.StringArrayVar(&f.marks, "mark", nil, "design point to mark, NAME=V,NAME=V (repeatable)")
	fs.StringVar(&f.best, "best", "", "best-point searches: decay, ki")
	fs.Float64Var(&f.msBound, "ms-bound", d.Overlays.MsBound, "Ms limit of the searches")
	return fs
}

func runMap(ctx context.Context, args []string, stdout, stderr io.Writer) error {
	var f mapFlags
	fs := newMapFlagSet(&f)
	if err := parseFlags(fs, args, mapHelp, stdout); err != nil {
		return err
	}
	if f.workers < 0 {
		return userErr("--workers %d: must be 0 (all cores) or more", f.workers)
	}
	sc, err := resolveScenario(ctx, &f, fs)
	if err != nil {
		return err
	}
	format, err := sc.ImageFormat(f.format)
	if err != nil {
		return err
	}
	job, err := study.NewMap(sc)
	if err != nil {
		return placed(sc, err)
	}

	plan := safefile.NewPlan()
	outputs := map[string]*safefile.Output{}
	for _, o := range []struct{ key, path string }{
		{"output.image", sc.Output.Image}, {"output.data", sc.Output.Data},
		{"output.csv", sc.Output.CSV}, {"output.note", sc.Output.Note},
	} {
		if o.path != "" {
			outputs[o.key] = plan.Add(sc.Where(o.key), o.path)
		}
	}
	if f.save != "" {
		outputs["save"] = plan.Add("--save-scenario", f.save)
	}
	if f.scenario != "" {
		plan.AddInput("--scenario", f.scenario)
	}
	if err := plan.Check(); err != nil {
		return usageError{err}
	}
	defer plan.Abort()
	for _, o := range outputs {
		if o.Path() == safefile.Stdout && !f.quiet {
			// An output goes to stdout, so the report goes to stderr.
			stdout = stderr
		}
	}
	if !f.quiet {
		for _, w := range job.Warnings() {
			fmt.Fprintln(stderr, w)
		}
	}

	start := time.Now()
	res, err := job.Run(ctx, study.Options{Workers: f.workers, Progress: progressFor(stderr, f.quiet)})
	if err != nil {
		return placed(sc, err)
	}
	elapsed := time.Since(start)

	writers := map[string]func(io.Writer) error{
		"output.image": func(w io.Writer) error { return render.Write(w, format, figureOf(res, sc, f.demoLabel)) },
		"output.data":  func(w io.Writer) error { return export.WriteRegion(w, res.Data()) },
		"output.csv":   func(w io.Writer) error { return writeCSV(w, res) },
		"output.note":  func(w io.Writer) error { return writeNote(w, res, sc, noteLink(sc.Output)) },
		"save":         func(w io.Writer) error { return scenario.EncodeFile(w, sc, f.save) },
	}
	if err := writeAll(ctx, plan, outputs, writers, []string{"output.image", "output.data", "output.csv", "output.note", "save"}); err != nil {
		return err
	}
	if !f.quiet {
		printSummary(stdout, res, sc, f, elapsed)
	}
	return nil
}

// writeAll writes the planned outputs, in the order of keys, each with
// its writer, and commits the plan: every file appears at once, or none
// if the run is interrupted or a writer fails.
func writeAll(ctx context.Context, plan *safefile.Plan, outputs map[string]*safefile.Output, writers map[string]func(io.Writer) error, keys []string) error {
	for _, key := range keys {
		if o := outputs[key]; o != nil {
			if err := o.Write(ctx, writers[key]); err != nil {
				return err
			}
		}
	}
	if err := ctx.Err(); err != nil {
		return err
	}
	return plan.Commit()
}

// noteLink is the image as a note beside it links it, or "" when there is
// no image file.
func noteLink(o scenario.Output) string {
	if o.Image == "" || o.Image == safefile.Stdout || o.Note == safefile.Stdout {
		return ""
	}
	rel, err := filepath.Rel(filepath.Dir(o.Note), o.Image)
	if err != nil {
		return ""
	}
	return filepath.ToSlash(rel)
}

// resolveScenario merges the built-in demo, a scenario file and the flags
// (flags win) into one validated scenario with its paths resolved.
func resolveScenario(ctx context.Context, f *mapFlags, fs *pflag.FlagSet) (scenario.Scenario, error) {
	sc := scenario.Default()
	given := fs.Changed
	if f.scenario != "" {
		var err error
		if sc, err = scenario.Load(f.scenario); err != nil {
			return sc, err
		}
	} else if !fs.Changed("plant") && !fs.Changed("num") && !fs.Changed("den") {
		// The demo fills what the user did not give: its plant always,
		// and its controller, fixed values and window unless another
		// controller was asked for.
		f.demoLabel = demo.label
		f.plant = demo.plant
		filled := map[string]bool{"plant": true}
		if !fs.Changed("out") {
			f.out, filled["out"] = demo.out, true
		}
		if !fs.Changed("ctrl") {
			f.ctrl, filled["ctrl"] = demo.ctrl, true
			if !fs.Changed("set") {
				f.set, filled["set"] = []string{demo.set}, true
			}
			if !fs.Changed("x") && !fs.Changed("y") {
				f.x, f.y, filled["x"], filled["y"] = demo.x, demo.y, true, true
			}
		}
		given = func(name string) bool { return fs.Changed(name) || filled[name] }
	}
	fromFlags, err := f.toScenario(given)
	if err != nil {
		return sc, err
	}
	sc.Override(fromFlags, given)
	defaultAxes(&sc)
	if autoX, autoY := f.autoAxes(given); autoX || autoY {
		w := study.Window{}
		if sc, w, err = study.ChooseMapWindow(ctx, sc, autoX, autoY, study.Options{Workers: f.workers}); err != nil {
			return sc, err
		}
		f.window = &w
	}
	if err := sc.ResolvePaths(f.allowOutside); err != nil {
		return sc, err
	}
	if err := sc.Validate(); err != nil {
		return sc, err
	}
	return sc, nil
}

// defaultAxes gives a map whose axes nobody chose the first two
// parameters of its controller, so that --ctrl lead alone maps k and z
// rather than failing on kp, a parameter the user never named.
func defaultAxes(sc *scenario.Scenario) {
	if sc.Given("axes.x") || sc.Given("axes.y") {
		return
	}
	fam, err := family.Lookup(sc.Loop.Controller)
	if err != nil || len(fam.Params()) < 2 {
		return
	}
	ps := fam.Params()
	d := scenario.Default().Axes
	if ps[0].Name == d.X.Param && ps[1].Name == d.Y.Param {
		return
	}
	sc.Axes.X = spec.Axis{Param: ps[0].Name, Min: d.X.Min, Max: d.X.Max}
	sc.Axes.Y = spec.Axis{Param: ps[1].Name, Min: d.Y.Min, Max: d.Y.Max}
}

// placed returns err with an input error of the study placed where the
// faulty value was given: the flag, or the scenario file, line and key.
func placed(sc scenario.Scenario, err error) error {
	var ie *study.InputError
	if !errors.As(err, &ie) || ie.Key == "" || !sc.Given(ie.Key) {
		return err
	}
	where := sc.Where(ie.Key)
	if strings.HasPrefix(where, "--") {
		return err
	}
	msg := ie.Err.Error()
	if ie.Value != "" && !slices.Contains([]string{"loop.plant", "loop.numerator"}, ie.Key) {
		msg = ie.Value + ": " + msg
	}
	return usageError{fmt.Errorf("%s: %s", where, msg)}
}
