package main

import (
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"time"

	"gainscape/regions/boundary"
	"gainscape/regions/export"
	"gainscape/regions/plane"
	"gainscape/regions/scenario"
)

// printSummary writes the text report of a map.
func printSummary(w io.Writer, res *mapResult, sc scenario.Scenario, f mapFlags) {
	s, m, curves := res.setup, res.m, res.curves
	st := m.Stats()
	if res.demo != "" {
		fmt.Fprintf(w, "%s (run with --plant to map your own loop)\n", res.demo)
	}
	fmt.Fprintf(w, "plant       G(s) = %s\n", f.plantLabel(sc))
	fmt.Fprintf(w, "controller  %s", s.Family.Formula())
	if fixed := fixedText(s.Loop, s.XIndex, s.YIndex); fixed != "" {
		fmt.Fprintf(w, "; fixed %s", fixed)
	}
	fmt.Fprintln(w)
	fmt.Fprintf(w, "window      %s %g…%g (%d nodes) × %s %g…%g (%d nodes)\n",
		s.X.Param, s.X.Min, s.X.Max, s.X.N, s.Y.Param, s.Y.Min, s.Y.Max, s.Y.N)
	if st.Stable > 0 {
		fmt.Fprintf(w, "stable      %.1f%% of the window; stable nodes span %s %.4g…%.4g, %s %.4g…%.4g\n",
			100*st.StableFraction(), s.X.Param, st.XMin, st.XMax, s.Y.Param, st.YMin, st.YMax)
	} else {
		fmt.Fprintf(w, "stable      no stable node in the window (most unstable: %d roots in the right half plane)\n", st.MaxRHP)
	}
	counts := map[boundary.Kind]int{}
	for _, c := range curves {
		counts[c.Kind]++
	}
	fmt.Fprintf(w, "edges       %d complex-pair, %d real-root, %d through-infinity curves\n",
		counts[boundary.Complex], counts[boundary.Real], counts[boundary.Infinite])
	if lo, hi, ok := export.OmegaRange(curves); ok {
		fmt.Fprintf(w, "oscillation ω from %.4g to %.4g rad/s along the complex-pair edges\n", lo, hi)
	}
	if st.Undecided > 0 {
		fmt.Fprintf(w, "undecided   %d nodes where the sign array could not be trusted (drawn hatched)\n", st.Undecided)
	}
	if res.over != nil {
		for _, p := range append(append([]pointInfo(nil), res.over.marks...), res.over.best...) {
			fmt.Fprintf(w, "%-11s %s = %.6g, %s = %.6g: %s\n", pointName(p), s.X.Param, p.X, s.Y.Param, p.Y, pointFigures(p))
		}
	}
	rate := float64(st.Nodes) / res.elapsed.Seconds()
	fmt.Fprintf(w, "nodes       %d evaluated, edges refined and overlays computed in %s (%.3g nodes/s)\n", st.Nodes, res.elapsed.Round(time.Millisecond), rate)
	if sc.Output.Image != "-" {
		fmt.Fprintf(w, "image       %s\n", sc.Output.Image)
	}
	for _, o := range []struct{ what, path string }{{"data", sc.Output.Data}, {"csv", sc.Output.CSV}, {"note", sc.Output.Note}, {"scenario", f.save}} {
		if o.path != "" {
			fmt.Fprintf(w, "%-11s %s\n", o.what, o.path)
		}
	}
	fmt.Fprintln(w, caution)
}

func pointName(p pointInfo) string {
	if p.Criterion != "" {
		return p.Label
	}
	return "mark " + p.Label
}

// pointFigures says how stable and robust a point is, in words.
func pointFigures(p pointInfo) string {
	if !p.Stable {
		return "not stable"
	}
	s := fmt.Sprintf("decay rate %.4g 1/s, smallest damping %.3g", float64(p.Decay), float64(p.Damping))
	if !math.IsNaN(float64(p.Ms)) {
		s += fmt.Sprintf(", Ms %.4g", float64(p.Ms))
	}
	if p.Criterion != "" {
		s += " (" + p.Criterion + ")"
	}
	return s
}

// dirExists reports an error if the directory that would hold path is
// missing.
func dirExists(path string) error {
	dir := filepath.Dir(path)
	fi, err := os.Stat(dir)
	if err != nil || !fi.IsDir() {
		return fmt.Errorf("directory %s does not exist", dir)
	}
	return nil
}

// scalingWarning returns a warning when the characteristic polynomial's
// coefficients at the window's corners span so many decades that products
// in the sign array approach the limits of double precision; nodes where
// that happens are reported as undecided rather than guessed.
func scalingWarning(s plane.Setup) string {
	pc := s.Pencil()
	lo, hi := math.Inf(1), 0.0
	for _, x := range []float64{s.X.Min, s.X.Max} {
		for _, y := range []float64{s.Y.Min, s.Y.Max} {
			for _, c := range pc.Eval(x, y) {
				if a := math.Abs(c); a != 0 {
					lo, hi = math.Min(lo, a), math.Max(hi, a)
				}
			}
		}
	}
	if hi > 1e100 || lo < 1e-100 || hi/lo > 1e150 {
		return fmt.Sprintf("warning: characteristic coefficients range from %.3g to %.3g; the sign array may lose meaning, and nodes it cannot decide are marked undecided — consider rescaling time (s) or gains", lo, hi)
	}
	return ""
}
