package main

import (
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"time"

	"gainscape/regions/export"
	"gainscape/regions/scenario"
	"gainscape/regions/study"
)

// printSummary writes the text report of a map.
func printSummary(w io.Writer, res *study.MapResult, sc scenario.Scenario, f mapFlags, elapsed time.Duration) {
	st := res.Stats
	if f.demoLabel != "" {
		fmt.Fprintf(w, "%s (run with --plant to map your own loop)\n", f.demoLabel)
	}
	fmt.Fprintf(w, "plant       G(s) = %s\n", res.Plant)
	fmt.Fprintf(w, "controller  %s", res.Formula)
	if fixed := study.ValuesText(res.Fixed); fixed != "" {
		fmt.Fprintf(w, "; fixed %s", fixed)
	}
	fmt.Fprintln(w)
	if res.Sampled != nil {
		fmt.Fprintf(w, "sampling    %s\n", res.Sampled.Text(res.Units))
	}
	x, y := res.X, res.Y
	fmt.Fprintf(w, "window      %s %g…%g (%d nodes) × %s %g…%g (%d nodes)\n",
		x.Param, x.Min, x.Max, x.N, y.Param, y.Min, y.Max, y.N)
	if f.window != nil {
		fmt.Fprintf(w, "            chosen: %s\n", f.window.Rule)
	}
	if st.Stable > 0 {
		fmt.Fprintf(w, "stable      %.1f%% of the window; stable nodes span %s %.4g…%.4g, %s %.4g…%.4g\n",
			100*st.StableFraction(), x.Param, st.XMin, st.XMax, y.Param, st.YMin, st.YMax)
	} else if st.MaxRHP > 0 {
		fmt.Fprintf(w, "stable      no stable node in the window (most unstable: %d roots %s)\n", st.MaxRHP, unstableWhere(res))
	} else {
		fmt.Fprintln(w, "stable      no stable node in the window")
	}
	if st.Marginal > 0 {
		fmt.Fprintf(w, "marginal    %d nodes with a root %s and none %s: on an edge, not stable (drawn violet)\n", st.Marginal, boundaryWhere(res), beyondWhere(res))
	}
	fmt.Fprintf(w, "edges       %s, by %s\n", edgeCounts(res), res.EdgeReport.Method)
	if n := res.EdgeReport.Unexplained; n > 0 {
		fmt.Fprintf(w, "edge check  %d grid edges where the counts and the swept edges disagree\n", n)
	}
	if lo, hi, ok := res.OmegaRange(); ok {
		fmt.Fprintf(w, "oscillation ω from %s to %.4g %s along the complex-pair edges\n", lowOmegaText(lo), hi, res.Units.Freq())
	}
	if st.Undecided > 0 {
		fmt.Fprintf(w, "undecided   %d nodes where the stability test could not be trusted (drawn hatched)\n", st.Undecided)
	}
	for _, l := range deadTimeLines(res) {
		fmt.Fprintf(w, "%-11s %s\n", l[0], l[1])
	}
	printCompare(w, res)
	for _, p := range points(res) {
		if p.Failed != "" {
			fmt.Fprintf(w, "%-11s none found: %s\n", pointName(p), p.Failed)
			continue
		}
		fmt.Fprintf(w, "%-11s %s = %.6g, %s = %.6g: %s\n", pointName(p), x.Param, float64(p.X), y.Param, float64(p.Y), pointFigures(p, res.Units))
		if p.Warning != "" {
			fmt.Fprintf(w, "%-11s %s\n", "", p.Warning)
		}
	}
	rate := float64(st.Nodes) / elapsed.Seconds()
	if ev := res.Map.Evaluated; ev < st.Nodes {
		fmt.Fprintf(w, "nodes       %d, of which %d evaluated (%.1f%%) and the rest filled from cells no edge enters\n", st.Nodes, ev, 100*float64(ev)/float64(st.Nodes))
		fmt.Fprintf(w, "time        map, edges and overlays in %s (%.3g nodes/s)\n", elapsed.Round(time.Millisecond), rate)
	} else {
		fmt.Fprintf(w, "nodes       %d evaluated, edges and overlays computed in %s (%.3g nodes/s)\n", st.Nodes, elapsed.Round(time.Millisecond), rate)
	}
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

// points returns the marked points, then the found ones.
func points(res *study.MapResult) []export.Point {
	if res.Overlays == nil {
		return nil
	}
	return append(append([]export.Point(nil), res.Overlays.Marks...), res.Overlays.Best...)
}

func pointName(p export.Point) string {
	if p.Criterion != "" || p.Failed != "" {
		return p.Label
	}
	return "mark " + p.Label
}

// pointFigures says how stable and robust a point is, in words.
func pointFigures(p export.Point, u study.Units) string {
	if !p.Stable {
		return "not stable"
	}
	s := fmt.Sprintf("decay rate %.4g %s, smallest damping %.3g", float64(p.Decay), u.Rate(), float64(p.Damping))
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

// lowOmegaText writes the lowest ω of the complex-pair edges: 0 where such
// an edge ends on a real-root edge, its pair merging into a double root
// at s = 0 (z = 1) there.
func lowOmegaText(lo float64) string {
	if lo == 0 {
		return "0 (where a complex-pair edge meets a real-root edge)"
	}
	return fmt.Sprintf("%.4g", lo)
}
