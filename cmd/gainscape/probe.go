package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/spf13/pflag"

	"gainscape/regions/export"
	"gainscape/regions/poly"
	"gainscape/regions/spec"
	"gainscape/regions/study"
)

const probeHelp = `gainscape probe — how stable and how robust one design point is

Prints, for the loop at the parameter values given: the Routh sign array row
by row (showing where the ε rule or an auxiliary polynomial was used), the
number of closed-loop roots in the right half plane and on the imaginary
axis, the closed-loop poles, the decay rate and smallest damping ratio, gain
and phase margins with their crossover frequencies, the peak sensitivities
Ms and Mt, the distance to the nearest stability edge in a plane of two
parameters, and the ultimate gain and period of the proportional-only loop
with the classic tuning rules computed from them.

With --vary, prints instead every interval of one parameter in which the loop
is stable, with how it loses stability at each end.

Flags:
  --plant EXPR | --num LIST --den LIST   the plant, as for "gainscape map"
                        --plant "1/(s+1)^3"
  --ctrl NAME         controller family (default pid)
                        --ctrl pi
  --set LIST          parameter values of the design point
                        --set kp=2,ki=0.8,kd=0.3
  --x NAME, --y NAME  the plane for the distance to the nearest edge
                      (default: the first two parameters of the family)
                        --x kp --y ki
  --vary NAME=MIN:MAX find the stable intervals of one parameter instead
                        --vary kp=0:100
  --json              print one JSON object instead of text
                        --json
  --response FILE     the closed-loop responses to a unit setpoint step and a
                      unit load step at the plant input, drawn to FILE (.png,
                      .svg or .pdf); their figures (overshoot, settling time,
                      IAE and IE of the load step, …) join the text and the
                      JSON (field response)
                        --response steps.png

Examples:
  gainscape probe --plant "1/(s+1)^3" --ctrl pid --set kp=2,ki=0.8,kd=0.3
  gainscape probe --plant "1/(s*(s+1)*(s+2))" --ctrl p --vary kp=0:100
  gainscape probe --num "3" --den "0.16, 1.3, 2.45, 2.5, 1" --ctrl pi --set kp=1,ki=0.3 --json
`

type probeFlags struct {
	loopFlags
	x, y     string
	vary     string
	json     bool
	response string
}

func runProbe(ctx context.Context, args []string, stdout io.Writer) error {
	var f probeFlags
	fs := pflag.NewFlagSet("probe", pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.StringVar(&f.plant, "plant", "", "plant transfer function in s")
	fs.StringVar(&f.num, "num", "", "plant numerator coefficients")
	fs.StringVar(&f.den, "den", "", "plant denominator coefficients")
	fs.StringVar(&f.ctrl, "ctrl", "pid", "controller family")
	fs.StringArrayVar(&f.set, "set", nil, "parameter values (repeatable)")
	fs.StringVar(&f.timeUnit, "time-unit", "s", "unit of time of s")
	fs.Float64Var(&f.sample, "sample", 0, "sample time of a digital controller (0: continuous)")
	fs.StringVar(&f.integral, "integral", "", "digital integral: backward, forward or trapezoid")
	fs.StringVar(&f.x, "x", "", "first parameter of the fragility plane")
	fs.StringVar(&f.y, "y", "", "second parameter of the fragility plane")
	fs.StringVar(&f.vary, "vary", "", "one parameter NAME=MIN:MAX to scan for stable intervals")
	fs.BoolVar(&f.json, "json", false, "print JSON")
	fs.StringVar(&f.response, "response", "", "figure of the step responses of the design point")
	if err := parseFlags(fs, args, probeHelp, stdout); err != nil {
		return err
	}
	ls, err := f.spec()
	if err != nil {
		return err
	}
	if f.vary != "" {
		return runVary(ls, f, stdout)
	}
	if f.response != "" {
		return probeWithResponse(ctx, ls, f, stdout)
	}
	rep, err := study.Probe(ctx, study.ProbeRequest{Loop: ls, X: f.x, Y: f.y})
	if err != nil {
		return err
	}
	if f.json {
		return export.Write(stdout, rep.Doc)
	}
	printProbe(stdout, rep)
	return nil
}

// printProbe writes the report for a person.
func printProbe(w io.Writer, rep *study.ProbeReport) {
	r := rep.Doc
	u := rep.Units
	fmt.Fprintf(w, "plant        G(s) = %s\n", r.Plant)
	fmt.Fprintf(w, "controller   %s with %s\n", rep.Formula, study.ValuesText(rep.Values))
	fmt.Fprintf(w, "closed loop  p(s) = %s\n\n", polyText(r.Characteristic))
	fmt.Fprintln(w, "Routh sign array (first column decides):")
	for _, row := range r.SignArray {
		note := ""
		switch {
		case row.Auxiliary:
			note = "  ← all-zero row: replaced by the derivative of the auxiliary polynomial"
		case row.Epsilon:
			note = "  ← zero first entry: replaced by ε → 0+ (ε rule)"
		}
		fmt.Fprintf(w, "  s^%-2d │ %s%s\n", row.Power, strings.Join(pad(row.Entries, 12), " "), note)
	}
	if r.Aux != nil {
		fmt.Fprintf(w, "  auxiliary polynomial A(s) = %s\n", polyText(r.Aux))
	}
	if r.CountFrom == "eigenvalues" {
		fmt.Fprintln(w, "  an entry that decides the count has no significant digit left in double precision;")
		fmt.Fprintln(w, "  the count below is confirmed from the eigenvalues, all clear of the imaginary axis")
	}
	fmt.Fprintf(w, "  roots in the right half plane: %d; on the imaginary axis: %d", r.RHP, r.JW)
	if len(r.JWOmegas) > 0 {
		fmt.Fprintf(w, " (ω = %s %s)", floatsText(r.JWOmegas), u.Freq())
	}
	if r.DegreeDrop > 0 {
		fmt.Fprintf(w, "; %d root(s) gone to infinity (leading coefficient vanishes)", r.DegreeDrop)
	}
	fmt.Fprintln(w)
	verdict := "STABLE"
	if !r.Stable {
		verdict = "NOT STABLE"
	}
	fmt.Fprintf(w, "  verdict: %s\n\n", verdict)

	fmt.Fprintln(w, "Closed-loop poles:")
	for _, p := range r.Poles {
		if p[1] < 0 {
			continue
		}
		if p[1] == 0 {
			fmt.Fprintf(w, "  %.6g\n", p[0])
		} else {
			fmt.Fprintf(w, "  %.6g ± %.6gj  (ζ = %.3g, ωn = %.4g %s)\n", p[0], p[1], -p[0]/math.Hypot(p[0], p[1]), math.Hypot(p[0], p[1]), u.Freq())
		}
	}
	fmt.Fprintf(w, "decay rate   σ = %.4g %s (slowest pole), smallest damping ratio ζ = %.3g\n", r.DecayRate, u.Rate(), r.MinDamping)
	if !r.Stable {
		fmt.Fprintln(w, "The loop is not stable, so the figures below are no robustness margins: they")
		fmt.Fprintln(w, "describe the open loop L(jω), not how far the loop is from instability.")
	}
	switch len(r.GainMargins) {
	case 0:
		fmt.Fprintln(w, "gain margin  infinite (the phase never reaches −180°)")
	default:
		for i, g := range r.GainMargins {
			head := "gain margin "
			if i > 0 {
				head = "            "
			}
			change := "rise"
			if g.Direction == "fall" {
				change = "fall"
			}
			fmt.Fprintf(w, "%s %.4g (%.3g dB) at the phase crossover ω = %.4g %s: the gain may %s to %.4g times its value\n",
				head, g.Factor, g.DB, g.Freq, u.Freq(), change, g.Factor)
		}
	}
	if r.PhaseMargin.Valid() {
		fmt.Fprintf(w, "phase margin %.4g° at the gain crossover ω = %.4g %s\n", float64(r.PhaseMargin), float64(r.GainCrossover), u.Freq())
	} else {
		fmt.Fprintln(w, "phase margin infinite (|L| never equals 1)")
	}
	band := "   (1.4–2.0 is the usual robustness band, common practice)"
	if !r.Stable {
		band = ""
	}
	fmt.Fprintf(w, "Ms           %.4g at ω = %s %s%s\n", r.Ms, optText(r.MsFreq), u.Freq(), band)
	fmt.Fprintf(w, "Mt           %.4g at ω = %s %s\n", r.Mt, optText(r.MtFreq), u.Freq())
	if fr := r.Fragility; fr != nil {
		printFragility(w, fr, u)
	}
	if ul := r.Ultimate; ul != nil {
		fmt.Fprintf(w, "\nProportional-only loop: ultimate gain Ku = %.6g, ultimate period Tu = %.6g %s\n", ul.Ku, ul.Tu, u.TimeLabel())
		if !ul.RulesApply {
			fmt.Fprintf(w, "  %s; their settings follow for reference only\n", ul.Note)
		}
		for _, rule := range ul.Rules {
			verdict := "stable"
			if !rule.Stable {
				verdict = fmt.Sprintf("NOT stable (%d roots in the right half plane)", rule.RHP)
			}
			fmt.Fprintf(w, "  %-24s kp = %-10.4g ki = %-10.4g kd = %-10.4g %s\n", rule.Name, rule.Kp, rule.Ki, rule.Kd, verdict)
		}
		fmt.Fprintln(w, "  sources: Ziegler & Nichols, Trans. ASME 64 (1942); Tyreus & Luyben, Ind. Eng. Chem. Res. 31 (1992)")
	} else {
		fmt.Fprintln(w, "\nProportional-only loop: no finite ultimate gain with a sustained oscillation")
	}
	if rep.Response != nil {
		printStepFigures(w, rep)
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, caution)
}

// printFragility writes the fragility lines of the probe report.
func printFragility(w io.Writer, fr *export.Fragility, u study.Units) {
	xn, yn := fr.Plane[0], fr.Plane[1]
	if !fr.Found {
		fmt.Fprintf(w, "nearest edge none in the %s–%s window %s %.4g…%.4g, %s %.4g…%.4g\n",
			xn, yn, xn, fr.Window[0], fr.Window[1], yn, fr.Window[2], fr.Window[3])
		return
	}
	edge := func(n *export.NearestEdge) string {
		switch n.Kind.String() {
		case "complex":
			return fmt.Sprintf("a complex pair crosses at ω = %.4g %s", float64(n.Omega), u.Freq())
		case "real":
			return "a real root crosses through s = 0"
		}
		return "a root passes through infinity"
	}
	a, r := fr.Absolute, fr.Relative
	fmt.Fprintf(w, "nearest edge in the %s–%s plane: %.4g away at (%s, %s) = (%.4g, %.4g), where %s\n",
		xn, yn, a.Distance, xn, yn, a.Point[0], a.Point[1], edge(a))
	fmt.Fprintf(w, "             relative to the gains: %.3g%% away at (%.4g, %.4g), where %s\n",
		100*r.Distance, r.Point[0], r.Point[1], edge(r))
}

// runVary prints the stable intervals of one parameter.
func runVary(ls study.LoopSpec, f probeFlags, w io.Writer) error {
	ax, err := spec.ParseAxis(f.vary)
	if err != nil {
		return userErr("--vary: %v", err)
	}
	rep, err := study.Vary(study.VaryRequest{Loop: ls, Range: ax, Text: f.vary})
	if err != nil {
		return err
	}
	if f.json {
		return export.Write(w, rep.Doc)
	}
	fmt.Fprintf(w, "plant        G(s) = %s\n", rep.Doc.Plant)
	fmt.Fprintf(w, "controller   %s", rep.Formula)
	if fx := study.ValuesText(rep.Fixed); fx != "" {
		fmt.Fprintf(w, " with %s", fx)
	}
	fmt.Fprintf(w, "\nscanning     %s from %g to %g\n\n", ax.Param, ax.Min, ax.Max)
	if len(rep.Intervals) == 0 {
		fmt.Fprintf(w, "The loop is not stable for any %s in the range.\n", ax.Param)
	}
	for _, iv := range rep.Intervals {
		fmt.Fprintf(w, "stable for %.10g < %s < %.10g\n", iv.Lo, ax.Param, iv.Hi)
		fmt.Fprintf(w, "  lower end: %s\n", iv.LoEnd)
		fmt.Fprintf(w, "  upper end: %s\n", iv.HiEnd)
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, caution)
	return nil
}

func polyText(desc []float64) string { return poly.FromDescending(desc).String() }

func floatsText(v []float64) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = fmt.Sprintf("%.6g", x)
	}
	return strings.Join(s, ", ")
}

func optText(v export.Number) string {
	if !v.Valid() {
		return "∞"
	}
	return fmt.Sprintf("%.4g", float64(v))
}

func pad(s []string, n int) []string {
	out := make([]string, len(s))
	for i, x := range s {
		out[i] = fmt.Sprintf("%-*s", n, x)
	}
	return out
}
