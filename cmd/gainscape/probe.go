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

With --sample T the loop is sampled (see "gainscape help map"): the report
shows the unit-circle test's own table (the Schur–Cohn recursion, or the
sign array of the bilinear image Q(w) in its special cases), the roots
outside and on the unit circle, the poles in z with their continuous
equivalents ln(z)/T, the largest |z| and the decay rate −ln|z|/T; margins,
Ms and Mt are taken on z = e^(jωT) for 0 ≤ ω ≤ π/T, and the ultimate gain
where the proportional-only loop's roots cross the circle (a pair, or a real
root at z = −1 with Tu = 2T). The tuning rules, made for continuous
controllers, then set the digital controller of the same structure and are
checked with the unit-circle test.

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
  --sample T, --integral RULE, --prewarp W
                      a digital controller, as for "gainscape map"
                        --sample 0.5 --integral trapezoid
  --vary NAME=MIN:MAX find the stable intervals of one parameter instead
                        --vary kp=0:100
  --json              print one JSON object instead of text
                        --json
  --pade N            for a plant with dead time exp(-L*s): the order of the
                      Padé approximant the exact results are compared with
                      (0, the default: chosen from the frequencies that
                      matter at the point)
                        --pade 3
  --response FILE     the closed-loop responses to a unit setpoint step and a
                      unit load step at the plant input, drawn to FILE (.png,
                      .svg or .pdf); their figures (overshoot, settling time,
                      IAE and IE of the load step, …) join the text and the
                      JSON (field response)
                        --response steps.png

Examples:
  gainscape probe --plant "1/(s+1)^3" --ctrl pid --set kp=2,ki=0.8,kd=0.3
  gainscape probe --plant "1/(s*(s+1)*(s+2))" --ctrl p --vary kp=0:100
  gainscape probe --plant "exp(-s)/(s+1)" --ctrl p --set kp=2
  gainscape probe --num "3" --den "0.16, 1.3, 2.45, 2.5, 1" --ctrl pi --set kp=1,ki=0.3 --json
  gainscape probe --plant "1/(s*(s+1))" --ctrl p --sample 1 --vary kp=0:10
`

type probeFlags struct {
	loopFlags
	x, y     string
	vary     string
	json     bool
	pade     int
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
	fs.Float64Var(&f.prewarp, "prewarp", 0, "pre-warp frequency of a digital lead or lag (0: none)")
	fs.StringVar(&f.x, "x", "", "first parameter of the fragility plane")
	fs.StringVar(&f.y, "y", "", "second parameter of the fragility plane")
	fs.StringVar(&f.vary, "vary", "", "one parameter NAME=MIN:MAX to scan for stable intervals")
	fs.BoolVar(&f.json, "json", false, "print JSON")
	fs.IntVar(&f.pade, "pade", 0, "order of the Padé approximant a loop with dead time is compared with (0: chosen)")
	fs.StringVar(&f.response, "response", "", "figure of the step responses of the design point")
	if err := parseFlags(fs, args, probeHelp, stdout); err != nil {
		return err
	}
	ls, err := f.spec()
	if err != nil {
		return err
	}
	if err := padeFlag(f.pade); err != nil {
		return err
	}
	if f.vary != "" {
		return runVary(ls, f, stdout)
	}
	if f.response != "" {
		return probeWithResponse(ctx, ls, f, stdout)
	}
	rep, err := study.Probe(ctx, study.ProbeRequest{Loop: ls, X: f.x, Y: f.y, Pade: f.pade})
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
	if rep.Sampled != nil {
		printSampledProbe(w, rep)
		return
	}
	fmt.Fprintf(w, "plant        G(s) = %s\n", r.Plant)
	fmt.Fprintf(w, "controller   %s with %s\n", rep.Formula, study.ValuesText(rep.Values))
	if r.Delayed != nil {
		printDelayWorking(w, r, u)
	} else {
		fmt.Fprintf(w, "closed loop  p(s) = %s\n\n", polyText(r.Characteristic))
		fmt.Fprintln(w, "Routh sign array (first column decides):")
	}
	for _, row := range r.SignArray {
		fmt.Fprintf(w, "  s^%-2d │ %s%s\n", row.Power, strings.Join(pad(row.Entries, 12), " "), rowNote(row))
	}
	if r.Aux != nil {
		fmt.Fprintf(w, "  auxiliary polynomial A(s) = %s\n", polyText(r.Aux))
	}
	if r.CountFrom == "eigenvalues" {
		fmt.Fprintln(w, "  an entry that decides the count has no significant digit left in double precision;")
		fmt.Fprintln(w, "  the count below is confirmed from the eigenvalues, all clear of the imaginary axis")
	}
	fmt.Fprintf(w, "  roots in the right half plane: %s; on the imaginary axis: %d", countText(r.RHP), r.JW)
	printVerdict(w, r, "ω", u)

	if r.Delayed != nil {
		fmt.Fprintln(w, "Closed-loop poles: the rightmost roots of Δ (spectral collocation, polished by Newton's method on Δ):")
	} else {
		fmt.Fprintln(w, "Closed-loop poles:")
	}
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
	if r.Delayed != nil && len(r.Poles) == 0 {
		fmt.Fprintln(w, "  none listed: infinitely many roots lie in the right half plane")
	}
	if r.DecayRate.Valid() {
		fmt.Fprintf(w, "decay rate   σ = %.4g %s (slowest pole), smallest damping ratio ζ = %.3g\n", float64(r.DecayRate), u.Rate(), float64(r.MinDamping))
	} else {
		fmt.Fprintln(w, "decay rate   none: roots grow without bound on the right")
	}
	printRobustness(w, rep)
}

// rowNote explains a special row of a sign array.
func rowNote(row export.SignRow) string {
	switch {
	case row.Auxiliary:
		return "  ← all-zero row: replaced by the derivative of the auxiliary polynomial"
	case row.Epsilon:
		return "  ← zero first entry: replaced by ε → 0+ (ε rule)"
	}
	return ""
}

// printVerdict ends the line of root counts with the frequencies of the
// roots on the boundary (named omega) and the roots gone to infinity, and
// writes the verdict.
func printVerdict(w io.Writer, r *export.Probe, omega string, u study.Units) {
	if len(r.JWOmegas) > 0 {
		fmt.Fprintf(w, " (%s = %s %s)", omega, floatsText(r.JWOmegas), u.Freq())
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
}

// printRobustness writes the margins, Ms, the nearest edge and the
// ultimate gain with the tuning rules, for any kind of loop.
func printRobustness(w io.Writer, rep *study.ProbeReport) {
	r := rep.Doc
	u := rep.Units
	if !r.Stable {
		fmt.Fprintln(w, "The loop is not stable, so the figures below are no robustness margins: they")
		fmt.Fprintf(w, "describe the open loop %s, not how far the loop is from instability.\n", openLoopText(rep))
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
			if r.Delayed != nil && i == shownCrossovers {
				fmt.Fprintf(w, "%s … %d more phase crossovers, one per turn of the delay (see --json)\n", head, len(r.GainMargins)-i)
				break
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
	for i, d := range r.DelayMargins {
		head := "delay margin"
		if i > 0 {
			head = "            "
		}
		fmt.Fprintf(w, "%s %.4g %s of further dead time at the gain crossover ω = %.4g %s (phase margin %.4g°)\n", head, d.Extra, u.TimeLabel(), d.Freq, u.Freq(), d.PhaseMarginDeg)
	}
	fmt.Fprintf(w, "Ms           %s at ω = %s %s%s\n", peakText(r.Ms), optText(r.MsFreq), u.Freq(), band)
	fmt.Fprintf(w, "Mt           %s at ω = %s %s\n", peakText(r.Mt), optText(r.MtFreq), u.Freq())
	if fr := r.Fragility; fr != nil {
		printFragility(w, fr, u, r.SampleTime, r.Delayed != nil)
	}
	if ul := r.Ultimate; ul != nil {
		fmt.Fprintf(w, "\nProportional-only loop: ultimate gain Ku = %.6g, ultimate period Tu = %.6g %s\n", ul.Ku, ul.Tu, u.TimeLabel())
		if ul.Method != "" {
			fmt.Fprintf(w, "  %s\n", ul.Method)
		}
		if !ul.RulesApply {
			fmt.Fprintf(w, "  %s; their settings follow for reference only\n", ul.Note)
		}
		for _, rule := range ul.Rules {
			verdict := "stable"
			if !rule.Stable {
				verdict = fmt.Sprintf("NOT stable (%d roots %s)", rule.RHP, unstableSide(rep))
			}
			fmt.Fprintf(w, "  %-24s kp = %-10.4g ki = %-10.4g kd = %-10.4g %s\n", rule.Name, rule.Kp, rule.Ki, rule.Kd, verdict)
		}
		fmt.Fprintln(w, "  sources: Ziegler & Nichols, Trans. ASME 64 (1942); Tyreus & Luyben, Ind. Eng. Chem. Res. 31 (1992)")
	} else {
		fmt.Fprintln(w, "\nProportional-only loop: no finite ultimate gain with a sustained oscillation")
	}
	if pd := r.Pade; pd != nil {
		fmt.Fprintf(w, "\nPadé cross-check: %s\n", pd.Note)
	}
	if rep.Response != nil {
		printStepFigures(w, rep)
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, caution)
}

// printFragility writes the fragility lines of the probe report; T is the
// sample time of a sampled loop, 0 for a continuous one, and dead says
// the loop has dead time.
func printFragility(w io.Writer, fr *export.Fragility, u study.Units, T float64, dead bool) {
	xn, yn := fr.Plane[0], fr.Plane[1]
	if !fr.Found {
		fmt.Fprintf(w, "nearest edge none in the %s–%s window %s %.4g…%.4g, %s %.4g…%.4g\n",
			xn, yn, xn, fr.Window[0], fr.Window[1], yn, fr.Window[2], fr.Window[3])
		return
	}
	edge := func(n *export.NearestEdge) string {
		if T > 0 {
			return circleEdgeText(n, u)
		}
		switch n.Kind.String() {
		case "complex":
			return fmt.Sprintf("a complex pair crosses at ω = %.4g %s", float64(n.Omega), u.Freq())
		case "real":
			return "a real root crosses through s = 0"
		}
		if dead {
			return "a chain of infinitely many roots crosses (neutral type: |lim L(s)| reaches 1)"
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
	rep, err := study.Vary(study.VaryRequest{Loop: ls, Range: ax, Text: f.vary, Pade: f.pade})
	if err != nil {
		return err
	}
	if f.json {
		return export.Write(w, rep.Doc)
	}
	fmt.Fprintf(w, "plant        %s\n", plantText(rep.Doc.Plant))
	if rep.Sampled != nil {
		fmt.Fprintf(w, "sampling     %s\n", rep.Sampled.Text(study.Units{Time: ls.TimeUnit}))
	}
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
	if pd := rep.Doc.Pade; pd != nil {
		fmt.Fprintf(w, "\nPadé cross-check: %s\n", pd.Note)
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

// peakText writes Ms or Mt: infinite for a neutral loop whose |L| tends
// to 1 or more.
func peakText(v export.Number) string {
	if !v.Valid() {
		return "∞"
	}
	return fmt.Sprintf("%.4g", float64(v))
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
