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
	"gainscape/regions/boundary"
	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/spec"
	"gainscape/render"
)

const mapHelp = `gainscape map — the stable region of a loop in the plane of two controller parameters

The loop is unity negative feedback around plant G(s) with controller C(s).
Every grid node gets the number of closed-loop roots in the right half plane
from the Routh sign-array test; edges between regions are refined by
bisection and labelled with the frequency at which the loop oscillates there.

Plant (one of):
  --plant EXPR        rational expression in s: numbers, + - * / ^ ( )
                        --plant "2.5*(s+0.4)/(s*(s+1.5)^2*(0.2*s+1))"
  --num LIST --den LIST
                      coefficients, highest power first
                        --num "1" --den "1, 3, 3, 1"
Controller:
  --ctrl NAME         p, pi, pd, pid, lead, lag, leadlag (default pid)
                        --ctrl pi
                      p:  kp                 pi: kp, ki        pd: kp, kd
                      pid: kp, ki, kd, tau (C = kp + ki/s + kd·s/(tau·s+1))
                      lead, lag: k, z, p (C = k(s+z)/(s+p))
                      leadlag: k, z1, p1, z2, p2
  --set LIST          values of the parameters that are not axes
                        --set kd=0.5,tau=0.02
Window:
  --x NAME=MIN:MAX    horizontal axis (default kp=0:10)
                        --x kp=0:20
  --y NAME=MIN:MAX    vertical axis (default ki=0:5)
                        --y ki=0:8
  --grid NXxNY        nodes per axis, 2…4000 each (default 300x225)
                        --grid 400x300
  --workers N         goroutines (default: all cores); the map does not
                      depend on it
                        --workers 1
Output:
  -o, --out FILE      image, .png or .svg (default gainscape-map.png);
                      - writes the image to standard output
                        -o pump-pid.svg
  --format png|svg    image format when the extension does not say
                        -o - --format svg > map.svg
  --data FILE         the map as JSON: axes, counts, boundaries with ω
                        --data region.json
  --csv FILE          the boundary polylines: curve, kind, x, y, ω
                        --csv edges.csv
  --note FILE         a Markdown block for a design note: image link, loop,
                      stable ranges and the caution
                        --note design-note.md
  --title TEXT        replaces the plant-and-controller title
                        --title "Pressure loop, PID with kd = 0.5"
  --quiet             print nothing but errors (and no progress bar)
                        --quiet

With no plant flag, a built-in demo scenario (an invented pump pressure loop)
is drawn into gainscape-demo.png in the current directory.

Examples:
  gainscape map
  gainscape map --plant "1/(s+1)^3" --ctrl pi --x kp=0:8 --y ki=0:3 -o pi.png
  gainscape map --num "4" --den "0.5, 2.5, 3, 1" --ctrl pid --set kd=0.3,tau=0.05 \
      --x kp=0:15 --y ki=0:10 --grid 400x300 -o pid.svg --data pid.json
`

// demo is the built-in scenario: an invented pump pressure loop, two
// first-order lags and a doubled sensor lag, under a filtered PID with
// fixed derivative action. It exists only to show a new user a real map.
var demo = struct {
	plant, ctrl, set, x, y, out, label string
}{
	plant: "3/((s+0.5)*(s+2)*(0.4*s+1)^2)",
	ctrl:  "pid",
	set:   "kd=0.5,tau=0.05",
	x:     "kp=-1:8",
	y:     "ki=-0.5:4",
	out:   "gainscape-demo.png",
	label: "invented demo: pump pressure loop",
}

// mapFlags are the settings of one map.
type mapFlags struct {
	loopFlags
	x, y, grid string
	workers    int
	out, data  string
	csv, note  string
	format     string
	title      string
	quiet      bool
}

func newMapFlagSet(f *mapFlags) *pflag.FlagSet {
	fs := pflag.NewFlagSet("map", pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.StringVar(&f.plant, "plant", "", "plant transfer function in s")
	fs.StringVar(&f.num, "num", "", "plant numerator coefficients, highest power first")
	fs.StringVar(&f.den, "den", "", "plant denominator coefficients, highest power first")
	fs.StringVar(&f.ctrl, "ctrl", "pid", "controller family")
	fs.StringVar(&f.set, "set", "", "fixed parameter values")
	fs.StringVar(&f.x, "x", "kp=0:10", "horizontal axis NAME=MIN:MAX")
	fs.StringVar(&f.y, "y", "ki=0:5", "vertical axis NAME=MIN:MAX")
	fs.StringVar(&f.grid, "grid", "300x225", "grid nodes NXxNY")
	fs.IntVar(&f.workers, "workers", 0, "goroutines (0 = all cores)")
	fs.StringVarP(&f.out, "out", "o", "gainscape-map.png", "image file (.png or .svg)")
	fs.StringVar(&f.data, "data", "", "JSON data file")
	fs.StringVar(&f.csv, "csv", "", "CSV file of the boundary polylines")
	fs.StringVar(&f.note, "note", "", "Markdown note for a design document")
	fs.StringVar(&f.format, "format", "", "image format png or svg (default: from the --out extension)")
	fs.StringVar(&f.title, "title", "", "figure title")
	fs.BoolVar(&f.quiet, "quiet", false, "print nothing but errors")
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
	demoLabel := ""
	if f.plant == "" && f.num == "" && f.den == "" {
		demoLabel = demo.label
		f.plant = demo.plant
		for name, v := range map[string]*string{"ctrl": &f.ctrl, "set": &f.set, "x": &f.x, "y": &f.y, "out": &f.out} {
			if !fs.Changed(name) {
				*v = map[string]string{"ctrl": demo.ctrl, "set": demo.set, "x": demo.x, "y": demo.y, "out": demo.out}[name]
			}
		}
	}
	job, err := f.setup()
	if err != nil {
		return err
	}
	if f.workers < 0 {
		return userErr("--workers %d: must be 0 (all cores) or more", f.workers)
	}
	format, err := f.imageFormat()
	if err != nil {
		return err
	}
	if err := checkOutputs(f); err != nil {
		return err
	}
	if f.out == "-" && !f.quiet {
		// The image goes to stdout, so the report goes to stderr.
		stdout = stderr
	}

	if w := scalingWarning(job); w != "" && !f.quiet {
		fmt.Fprintln(stderr, w)
	}
	start := time.Now()
	bar := newProgress(stderr, "mapping", job.Y.N, f.quiet)
	m, err := grid.Evaluate(ctx, job, grid.Options{Workers: f.workers, Progress: bar.set})
	bar.finish()
	if err != nil {
		return err
	}
	curves, err := boundary.Trace(ctx, job, m, f.workers)
	if err != nil {
		return err
	}
	elapsed := time.Since(start)

	title := f.title
	if title == "" {
		title = fmt.Sprintf("G(s) = %s under %s", f.plantText(), strings.ToUpper(job.Family.Name()))
	}
	notes := []string{job.Family.Formula()}
	if fixed := fixedText(job.Loop, job.XIndex, job.YIndex); fixed != "" {
		notes[0] += "; fixed: " + fixed
	}
	if demoLabel != "" {
		notes = append(notes, demoLabel)
	}
	fig := render.Figure{Map: m, Curves: curves, Title: title, Notes: notes}
	if f.out == "-" {
		if err := render.Write(stdoutFile, format, fig); err != nil {
			return err
		}
	} else if err := safefile.Write(f.out, func(w io.Writer) error { return render.Write(w, format, fig) }); err != nil {
		return err
	}
	if f.csv != "" {
		if err := safefile.Write(f.csv, func(w io.Writer) error { return writeCSV(w, job, curves) }); err != nil {
			return err
		}
	}
	if f.note != "" {
		link := ""
		if f.out != "-" {
			if rel, err := filepath.Rel(filepath.Dir(f.note), f.out); err == nil {
				link = filepath.ToSlash(rel)
			}
		}
		if err := safefile.Write(f.note, func(w io.Writer) error { return writeNote(w, job, m, curves, f, link) }); err != nil {
			return err
		}
	}
	if f.data != "" {
		doc := export.NewRegion(m, curves)
		doc.Plant, doc.Controller = f.plantText(), job.Family.Name()
		doc.Fixed = fixedMap(job.Loop, job.XIndex, job.YIndex)
		if err := safefile.Write(f.data, func(w io.Writer) error { return export.Write(w, doc) }); err != nil {
			return err
		}
	}
	if !f.quiet {
		printSummary(stdout, job, m, curves, elapsed, f, demoLabel)
	}
	return nil
}

// setup resolves the flags into a plane setup.
func (f mapFlags) setup() (plane.Setup, error) {
	loop, err := f.buildLoop()
	if err != nil {
		return plane.Setup{}, err
	}
	xs, err := spec.ParseAxis(f.x)
	if err != nil {
		return plane.Setup{}, userErr("--x: %v", err)
	}
	ys, err := spec.ParseAxis(f.y)
	if err != nil {
		return plane.Setup{}, userErr("--y: %v", err)
	}
	nx, ny, err := spec.ParseGrid(f.grid)
	if err != nil {
		return plane.Setup{}, userErr("--grid: %v", err)
	}
	for flag, a := range map[string]spec.Axis{"--x": xs, "--y": ys} {
		if _, err := family.Index(loop.Family, a.Param); err != nil {
			return plane.Setup{}, userErr("%s %q: %v", flag, a.Param, err)
		}
	}
	if vals, _ := spec.ParseValues(f.set); vals != nil {
		for _, v := range vals {
			if v.Param == xs.Param || v.Param == ys.Param {
				return plane.Setup{}, userErr("--set %q: %s is an axis; it cannot also be fixed", f.set, v.Param)
			}
		}
	}
	s, err := plane.NewSetup(loop, plane.Axis{Param: xs.Param, Min: xs.Min, Max: xs.Max, N: nx},
		plane.Axis{Param: ys.Param, Min: ys.Min, Max: ys.Max, N: ny})
	if err != nil {
		return plane.Setup{}, userErr("--x/--y: %v", err)
	}
	return s, nil
}

// imageFormat returns "png" or "svg" from --format or the --out extension.
func (f mapFlags) imageFormat() (string, error) {
	if f.format != "" {
		switch v := strings.ToLower(f.format); v {
		case "png", "svg":
			return v, nil
		}
		return "", userErr("--format %q: use png or svg", f.format)
	}
	if f.out == "-" {
		return "png", nil
	}
	switch ext := strings.ToLower(filepath.Ext(f.out)); ext {
	case ".png", ".svg":
		return ext[1:], nil
	}
	return "", userErr("--out %q: unknown image type %q; use .png or .svg (or --format)", f.out, filepath.Ext(f.out))
}

// checkOutputs rejects output paths that cannot be written before any
// work is done.
func checkOutputs(f mapFlags) error {
	paths := []struct{ flag, path string }{{"--out", f.out}, {"--data", f.data}, {"--csv", f.csv}, {"--note", f.note}}
	for _, o := range paths {
		flag, p := o.flag, o.path
		if p == "" || (flag == "--out" && p == "-") {
			continue
		}
		if err := dirExists(p); err != nil {
			return userErr("%s %q: %v", flag, p, err)
		}
	}
	return nil
}

func fixedMap(l plane.Loop, skip ...int) map[string]float64 {
	out := map[string]float64{}
	for i, p := range l.Family.Params() {
		if !contains(skip, i) {
			out[p.Name] = l.Values[i]
		}
	}
	return out
}
