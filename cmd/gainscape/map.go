package main

import (
	"context"
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"gainscape/internal/safefile"
	"gainscape/regions/export"
	"gainscape/regions/scenario"
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
	quiet          bool
	scenario, save string
	decay          bool
	decayLevels    string
	dampingLevels  string
	msLevels       string
	marks          []string
	best           string
	msBound        float64
	demoLabel      string
}

func newMapFlagSet(f *mapFlags) *pflag.FlagSet {
	d := scenario.Default()
	fs := pflag.NewFlagSet("map", pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.StringVar(&f.plant, "plant", "", "plant transfer function in s")
	fs.StringVar(&f.num, "num", "", "plant numerator coefficients, highest power first")
	fs.StringVar(&f.den, "den", "", "plant denominator coefficients, highest power first")
	fs.StringVar(&f.ctrl, "ctrl", d.Loop.Controller, "controller family")
	fs.StringVar(&f.set, "set", "", "fixed parameter values")
	fs.StringVar(&f.x, "x", axisText(d.Axes.X), "horizontal axis NAME=MIN:MAX")
	fs.StringVar(&f.y, "y", axisText(d.Axes.Y), "vertical axis NAME=MIN:MAX")
	fs.StringVar(&f.grid, "grid", fmt.Sprintf("%dx%d", d.Axes.Columns, d.Axes.Rows), "grid nodes NXxNY")
	fs.IntVar(&f.workers, "workers", 0, "goroutines (0 = all cores)")
	fs.StringVarP(&f.out, "out", "o", d.Output.Image, "image file (.png or .svg, - for stdout)")
	fs.StringVar(&f.data, "data", "", "JSON data file")
	fs.StringVar(&f.csv, "csv", "", "CSV file of the boundary polylines")
	fs.StringVar(&f.note, "note", "", "Markdown note for a design document")
	fs.StringVar(&f.format, "format", "", "image format png or svg")
	fs.StringVar(&f.title, "title", "", "figure title")
	fs.StringVar(&f.size, "size", fmt.Sprintf("%gx%g", d.Output.WidthCm, d.Output.HeightCm), "image size WxH in centimetres")
	fs.BoolVar(&f.quiet, "quiet", false, "print nothing but errors")
	fs.StringVar(&f.scenario, "scenario", "", "scenario file to read")
	fs.StringVar(&f.save, "save-scenario", "", "write the scenario of this map to a file")
	fs.BoolVar(&f.decay, "decay", d.Overlays.Decay, "shade the stable region by decay rate")
	fs.StringVar(&f.decayLevels, "decay-levels", "", "decay rates to draw as iso-lines")
	fs.StringVar(&f.dampingLevels, "damping-levels", "", "damping ratios to draw as iso-lines")
	fs.StringVar(&f.msLevels, "ms-levels", numbersText(d.Overlays.MsLevels), "Ms values to draw as iso-lines, or none")
	fs.StringArrayVar(&f.marks, "mark", nil, "design point to mark, NAME=V,NAME=V (repeatable)")
	fs.StringVar(&f.best, "best", "", "best-point searches: decay, ki")
	fs.Float64Var(&f.msBound, "ms-bound", d.Overlays.MsBound, "Ms limit of the ki search")
	return fs
}

func runMap(ctx context.Context, args []string, stdout, stderr io.Writer) error {
	var f mapFlags
	fs := newMapFlagSet(&f)
	if err := fs.Parse(args); err != nil {
		return userErr("%v (see gainscape help map)", err)
	}
	if fs.NArg() > 0 {
		return userErr("unexpected argument %q (see gainscape help map)", fs.Arg(0))
	}
	if f.workers < 0 {
		return userErr("--workers %d: must be 0 (all cores) or more", f.workers)
	}
	sc, err := resolveScenario(&f, fs)
	if err != nil {
		return err
	}
	job, err := study.NewMap(sc)
	if err != nil {
		return err
	}
	format, err := imageFormat(sc.Output.Image, f.format)
	if err != nil {
		return err
	}
	if err := checkOutputs(sc.Output, f.save); err != nil {
		return err
	}
	if sc.Output.Image == "-" && !f.quiet {
		// The image goes to stdout, so the report goes to stderr.
		stdout = stderr
	}
	if !f.quiet {
		for _, w := range job.Warnings() {
			fmt.Fprintln(stderr, w)
		}
	}

	start := time.Now()
	res, err := job.Run(ctx, study.Options{Workers: f.workers, Progress: progressFor(stderr, f.quiet)})
	if err != nil {
		return err
	}
	elapsed := time.Since(start)

	fig := figureOf(res, sc, f.demoLabel)
	if sc.Output.Image == "-" {
		if err := render.Write(stdoutFile, format, fig); err != nil {
			return err
		}
	} else if err := safefile.Write(sc.Output.Image, func(w io.Writer) error { return render.Write(w, format, fig) }); err != nil {
		return err
	}
	if err := writeExports(res, sc); err != nil {
		return err
	}
	if f.save != "" {
		if err := scenario.Save(f.save, sc); err != nil {
			return userErr("--save-scenario: %v", err)
		}
	}
	if !f.quiet {
		printSummary(stdout, res, sc, f, elapsed)
	}
	return nil
}

// resolveScenario merges the built-in demo, a scenario file and the flags
// (flags win) into one validated scenario.
func resolveScenario(f *mapFlags, fs *pflag.FlagSet) (scenario.Scenario, error) {
	sc := scenario.Default()
	given := fs.Changed
	if f.scenario != "" {
		var err error
		if sc, err = scenario.Load(f.scenario); err != nil {
			return sc, userErr("--scenario: %v", err)
		}
	} else {
		// Without a file every flag counts, defaults included.
		given = func(string) bool { return true }
		if f.plant == "" && f.num == "" && f.den == "" {
			f.demoLabel = demo.label
			f.plant = demo.plant
			for name, v := range map[string]*string{"ctrl": &f.ctrl, "set": &f.set, "x": &f.x, "y": &f.y, "out": &f.out} {
				if !fs.Changed(name) {
					*v = map[string]string{"ctrl": demo.ctrl, "set": demo.set, "x": demo.x, "y": demo.y, "out": demo.out}[name]
				}
			}
		}
	}
	fromFlags, err := f.toScenario(given)
	if err != nil {
		return sc, err
	}
	sc.Override(fromFlags, given)
	if err := sc.Validate(); err != nil {
		return sc, userErr("%v", firstLine(err))
	}
	return sc, nil
}

// imageFormat returns "png" or "svg" from --format or the image extension.
func imageFormat(image, format string) (string, error) {
	if format != "" {
		switch v := strings.ToLower(format); v {
		case "png", "svg":
			return v, nil
		}
		return "", userErr("--format %q: use png or svg", format)
	}
	if image == "-" {
		return "png", nil
	}
	switch ext := strings.ToLower(filepath.Ext(image)); ext {
	case ".png", ".svg":
		return ext[1:], nil
	}
	return "", userErr("--out %q: unknown image type %q; use .png or .svg (or --format)", image, filepath.Ext(image))
}

// checkOutputs rejects output paths that cannot be written before any
// work is done.
func checkOutputs(o scenario.Output, save string) error {
	paths := []struct{ flag, path string }{{"--out", o.Image}, {"--data", o.Data}, {"--csv", o.CSV}, {"--note", o.Note}, {"--save-scenario", save}}
	for _, p := range paths {
		if p.path == "" || (p.flag == "--out" && p.path == "-") {
			continue
		}
		if err := dirExists(p.path); err != nil {
			return userErr("%s %q: %v", p.flag, p.path, err)
		}
	}
	return nil
}

// firstLine returns the first line of a possibly joined error.
func firstLine(err error) string {
	s, _, _ := strings.Cut(err.Error(), "\n")
	return s
}

// writeExports writes the data, CSV and note files a scenario asks for.
func writeExports(res *study.MapResult, sc scenario.Scenario) error {
	o := sc.Output
	if o.CSV != "" {
		if err := safefile.Write(o.CSV, func(w io.Writer) error { return writeCSV(w, res) }); err != nil {
			return err
		}
	}
	if o.Note != "" {
		link := ""
		if o.Image != "-" {
			if rel, err := filepath.Rel(filepath.Dir(o.Note), o.Image); err == nil {
				link = filepath.ToSlash(rel)
			}
		}
		if err := safefile.Write(o.Note, func(w io.Writer) error { return writeNote(w, res, sc, link) }); err != nil {
			return err
		}
	}
	if o.Data != "" {
		if err := safefile.Write(o.Data, func(w io.Writer) error { return export.Write(w, res.Data()) }); err != nil {
			return err
		}
	}
	return nil
}
