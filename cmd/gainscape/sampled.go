package main

import (
	"fmt"
	"io"
	"math"
	"strings"

	"gainscape/regions/export"
	"gainscape/regions/stability"
	"gainscape/regions/study"
)

// printSampledProbe writes the report on a design point of a sampled
// loop: the unit-circle test's own table instead of the sign array, the
// poles in z with their continuous equivalents, and the decay rate from
// the largest root magnitude; the rest is printRobustness.
func printSampledProbe(w io.Writer, rep *study.ProbeReport) {
	r := rep.Doc
	u := rep.Units
	fmt.Fprintf(w, "plant        %s\n", plantText(r.Plant))
	fmt.Fprintf(w, "sampling     %s\n", rep.Sampled.Text(u))
	fmt.Fprintf(w, "controller   %s with %s\n", rep.Formula, study.ValuesText(rep.Values))
	fmt.Fprintf(w, "closed loop  p(z) = %s\n\n", zText(r.Characteristic))
	fmt.Fprintf(w, "Unit-circle test (%s):\n", r.CountFrom)
	for _, row := range r.SignArray {
		label := row.Label
		if label == "" {
			label = fmt.Sprintf("w^%d", row.Power)
		}
		fmt.Fprintf(w, "  %s\n    │ %s%s\n", label, strings.Join(pad(row.Entries, 12), " "), rowNote(row))
	}
	for _, n := range r.TestNotes {
		fmt.Fprintf(w, "  (%s)\n", n)
	}
	if r.Aux != nil {
		fmt.Fprintf(w, "  auxiliary polynomial mapped back to z: %s\n", zText(r.Aux))
	}
	fmt.Fprintf(w, "  roots outside the unit circle: %d; on it: %d", r.RHP, r.JW)
	printVerdict(w, r, "ω = θ/T", u)

	fmt.Fprintln(w, "Closed-loop poles in z, largest |z| first, with their continuous equivalents s = ln(z)/T:")
	for i, p := range r.Poles {
		if p[1] < 0 {
			continue
		}
		z := complex(p[0], p[1])
		s := r.ContinuousPoles[i]
		zs := fmt.Sprintf("%.6g", p[0])
		if p[1] != 0 {
			zs = fmt.Sprintf("%.6g ± %.6gj", p[0], p[1])
		}
		switch {
		case z == 0:
			fmt.Fprintf(w, "  %-26s |z| = 0 (a deadbeat mode, gone after one sample)\n", zs)
		case s[1] == 0:
			fmt.Fprintf(w, "  %-26s |z| = %-8.4g s = %.6g\n", zs, math.Hypot(p[0], p[1]), float64(s[0]))
		default:
			wn := math.Hypot(float64(s[0]), float64(s[1]))
			fmt.Fprintf(w, "  %-26s |z| = %-8.4g s = %.6g ± %.6gj  (ζ = %.3g, ωn = %.4g %s)\n", zs, math.Hypot(p[0], p[1]),
				float64(s[0]), math.Abs(float64(s[1])), -float64(s[0])/wn, wn, u.Freq())
		}
	}
	radius := math.NaN()
	if r.RootRadius != nil {
		radius = *r.RootRadius
	}
	fmt.Fprintf(w, "largest |z|  %.6g; decay rate σ = −ln|z|/T = %.4g %s, smallest damping ratio ζ = %.3g\n", radius, r.DecayRate, u.Rate(), r.MinDamping)
	fmt.Fprintf(w, "margins, Ms and Mt below are taken on the unit circle, z = e^(jωT), 0 ≤ ω ≤ π/T = %.4g %s\n", rep.Sampled.Nyquist(), u.Freq())
	printRobustness(w, rep)
}

// plantText names the plant as given: in s, or in z when it contains z.
func plantText(p string) string {
	if strings.ContainsRune(p, 'z') {
		return "G(z) = " + p
	}
	return "G(s) = " + p
}

// zText writes a polynomial, highest power first, in z.
func zText(desc []float64) string { return strings.ReplaceAll(polyText(desc), "s", "z") }

// openLoopText names the open loop's frequency response.
func openLoopText(rep *study.ProbeReport) string {
	if rep.Sampled != nil {
		return "L(e^(jωT))"
	}
	return "L(jω)"
}

// unstableSide names where unstable roots lie.
func unstableSide(rep *study.ProbeReport) string {
	if rep.Sampled != nil {
		return "outside the unit circle"
	}
	return "in the right half plane"
}

// circleEdgeText describes the nearest edge of a sampled loop.
func circleEdgeText(n *export.NearestEdge, u study.Units) string {
	switch n.Kind.String() {
	case "complex":
		return fmt.Sprintf("a complex pair crosses the unit circle at ω = %.4g %s", float64(n.Omega), u.Freq())
	case "real":
		return "a real root crosses the unit circle at z = 1"
	case "alternating":
		return fmt.Sprintf("a real root crosses the unit circle at z = −1 (ω = π/T = %.4g %s)", float64(n.Omega), u.Freq())
	}
	return "a root passes through infinity"
}

// unstableWhere, boundaryWhere and beyondWhere name the sides of the
// stability boundary of a map's loop in summaries.
func unstableWhere(res *study.MapResult) string {
	if res.Sampled != nil {
		return "outside the unit circle"
	}
	return "in the right half plane"
}

func boundaryWhere(res *study.MapResult) string {
	if res.Sampled != nil {
		return "on the unit circle"
	}
	return "on the imaginary axis"
}

func beyondWhere(res *study.MapResult) string {
	if res.Sampled != nil {
		return "outside it"
	}
	return "to its right"
}

// edgeCounts counts the edge curves of each kind, in words.
func edgeCounts(res *study.MapResult) string {
	if res.Sampled == nil {
		return fmt.Sprintf("%d complex-pair, %d real-root, %d through-infinity curves",
			res.Edges[stability.Complex], res.Edges[stability.Real], res.Edges[stability.Infinite])
	}
	return fmt.Sprintf("%d complex-pair (e^(±jωT)), %d real-root at z = 1, %d real-root at z = −1 (alternating, ω = π/T = %.4g %s), %d through-infinity curves",
		res.Edges[stability.Complex], res.Edges[stability.Real], res.Edges[stability.Alternating], res.Sampled.Nyquist(), res.Units.Freq(), res.Edges[stability.Infinite])
}

// printCompare writes the gain limit along the x axis of the map's own
// loop and of every compared sample time.
func printCompare(w io.Writer, res *study.MapResult) {
	if len(res.Compare) == 0 {
		return
	}
	x, y := res.X.Param, res.Y.Param
	for i, e := range res.Compare {
		head := "compared"
		if i > 0 {
			head = ""
		}
		at := fmt.Sprintf("%s = %.4g", y, e.LimitY)
		if e.Above {
			at = fmt.Sprintf("%s just above %.4g (the row %s = %.4g itself is marginal)", y, res.Y.Min, y, res.Y.Min)
		}
		label := e.Label(res.Units)
		if e.Own {
			label += " (this map)"
		}
		fmt.Fprintf(w, "%-11s %-22s stable for %s at %s\n", head, label+":", e.LimitText(x, res.Units), at)
	}
}
