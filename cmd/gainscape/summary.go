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
	"gainscape/regions/grid"
	"gainscape/regions/plane"
)

// printSummary writes the text report of a map.
func printSummary(w io.Writer, s plane.Setup, m *grid.Map, curves []boundary.Curve, elapsed time.Duration, f mapFlags, demoLabel string) {
	st := m.Stats()
	if demoLabel != "" {
		fmt.Fprintf(w, "%s (run with --plant to map your own loop)\n", demoLabel)
	}
	fmt.Fprintf(w, "plant       G(s) = %s\n", f.plantText())
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
	rate := float64(st.Nodes) / elapsed.Seconds()
	fmt.Fprintf(w, "nodes       %d evaluated and edges refined in %s (%.3g nodes/s)\n", st.Nodes, elapsed.Round(time.Millisecond), rate)
	fmt.Fprintf(w, "image       %s\n", f.out)
	if f.data != "" {
		fmt.Fprintf(w, "data        %s\n", f.data)
	}
	fmt.Fprintln(w, caution)
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
