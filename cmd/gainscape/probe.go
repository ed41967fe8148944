package main

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"

	"github.com/spf13/pflag"

	"gainscape/regions/family"
	"gainscape/regions/intervals"
	"gainscape/regions/margins"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/spec"
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

Examples:
  gainscape probe --plant "1/(s+1)^3" --ctrl pid --set kp=2,ki=0.8,kd=0.3
  gainscape probe --plant "1/(s*(s+1)*(s+2))" --ctrl p --vary kp=0:100
  gainscape probe --num "3" --den "0.16, 1.3, 2.45, 2.5, 1" --ctrl pi --set kp=1,ki=0.3 --json
`

type probeFlags struct {
	loopFlags
	x, y string
	vary string
	json bool
}

func runProbe(ctx context.Context, args []string, stdout io.Writer) error {
	var f probeFlags
	fs := pflag.NewFlagSet("probe", pflag.ContinueOnError)
	fs.SetOutput(io.Discard)
	fs.StringVar(&f.plant, "plant", "", "plant transfer function in s")
	fs.StringVar(&f.num, "num", "", "plant numerator coefficients")
	fs.StringVar(&f.den, "den", "", "plant denominator coefficients")
	fs.StringVar(&f.ctrl, "ctrl", "pid", "controller family")
	fs.StringVar(&f.set, "set", "", "parameter values")
	fs.StringVar(&f.x, "x", "", "first parameter of the fragility plane")
	fs.StringVar(&f.y, "y", "", "second parameter of the fragility plane")
	fs.StringVar(&f.vary, "vary", "", "one parameter NAME=MIN:MAX to scan for stable intervals")
	fs.BoolVar(&f.json, "json", false, "print JSON")
	if err := fs.Parse(args); err != nil {
		return userErr("%v (see gainscape help probe)", err)
	}
	if fs.NArg() > 0 {
		return userErr("unexpected argument %q (see gainscape help probe)", fs.Arg(0))
	}
	loop, err := f.buildLoop()
	if err != nil {
		return err
	}
	if f.vary != "" {
		return runVary(loop, f, stdout)
	}
	rep, err := probePoint(ctx, loop, f)
	if err != nil {
		return err
	}
	if f.json {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", " ")
		return enc.Encode(rep)
	}
	printProbe(stdout, rep)
	return nil
}

// probeReport is everything probe says about one design point. Its JSON
// field names are a stable contract.
type probeReport struct {
	Plant          string             `json:"plant"`
	Controller     string             `json:"controller"`
	Values         map[string]float64 `json:"values"`
	Characteristic []float64          `json:"characteristic"` // highest power first
	SignArray      []signRow          `json:"sign_array"`
	Aux            []float64          `json:"auxiliary_polynomial,omitempty"`
	Stable         bool               `json:"stable"`
	CountFrom      string             `json:"count_from"`
	RHP            int                `json:"rhp"`
	JW             int                `json:"jw_roots"`
	JWOmegas       []float64          `json:"jw_omegas"`
	DegreeDrop     int                `json:"degree_drop"`
	Poles          [][2]float64       `json:"poles"`
	DecayRate      float64            `json:"decay_rate"`
	MinDamping     float64            `json:"min_damping"`
	GainMargin     *float64           `json:"gain_margin"`
	GainMarginDB   *float64           `json:"gain_margin_db"`
	PhaseCrossover *float64           `json:"phase_crossover"`
	PhaseMargin    *float64           `json:"phase_margin_deg"`
	GainCrossover  *float64           `json:"gain_crossover"`
	Ms             float64            `json:"ms"`
	MsFreq         *float64           `json:"ms_freq"`
	Mt             float64            `json:"mt"`
	MtFreq         *float64           `json:"mt_freq"`
	Fragility      *fragilityReport   `json:"fragility,omitempty"`
	Ultimate       *ultimateReport    `json:"ultimate,omitempty"`
	Caution        string             `json:"caution"`
}

type signRow struct {
	Power     int      `json:"power"`
	Entries   []string `json:"entries"`
	Epsilon   bool     `json:"epsilon_rule,omitempty"`
	Auxiliary bool     `json:"from_auxiliary,omitempty"`
}

type ultimateReport struct {
	Ku    float64        `json:"ku"`
	Tu    float64        `json:"tu"`
	Rules []margins.Rule `json:"rules"`
}

// probePoint computes the report for the loop's parameter values.
func probePoint(ctx context.Context, loop plane.Loop, f probeFlags) (*probeReport, error) {
	char := loop.Characteristic()
	if !char.Finite() {
		return nil, userErr("--set %q: the characteristic polynomial has non-finite coefficients", f.set)
	}
	rep := &probeReport{
		Plant: f.plantText(), Controller: loop.Family.Name(),
		Values: fixedMap(loop), Characteristic: char.Descending(), Caution: caution,
	}
	ra := routh.Analyze(char)
	if ra.Undecided {
		return nil, fmt.Errorf("the sign-array test cannot decide this point: %s", ra.Reason)
	}
	for _, r := range ra.Rows {
		rep.SignArray = append(rep.SignArray, signRow{Power: r.Power, Entries: r.Entries, Epsilon: r.Epsilon, Auxiliary: r.Auxiliary})
	}
	if ra.Aux != nil {
		rep.Aux = ra.Aux.Descending()
	}
	rep.RHP, rep.JW, rep.DegreeDrop, rep.Stable = ra.RHP, ra.JW, ra.DegreeDrop, ra.Stable()
	rep.CountFrom = "sign array"
	if ra.FromEigenvalues {
		rep.CountFrom = "eigenvalues"
	}
	rep.JWOmegas = append([]float64{}, ra.Omegas...)

	poles, err := margins.Poles(char)
	if err != nil {
		return nil, err
	}
	for _, p := range poles {
		rep.Poles = append(rep.Poles, [2]float64{real(p), imag(p)})
	}
	rep.DecayRate, rep.MinDamping = margins.DecayRate(poles), margins.MinDamping(poles)

	cn, cd := family.Controller(loop.Family, loop.Values)
	mg, err := margins.NewLoop(loop.PlantNum, loop.PlantDen, cn, cd).Margins()
	if err != nil {
		return nil, err
	}
	rep.GainMargin, rep.PhaseCrossover = margins.Nullable(mg.GainMargin), margins.Nullable(mg.PhaseCrossover)
	if rep.GainMargin != nil {
		rep.GainMarginDB = margins.Nullable(margins.DB(mg.GainMargin))
	}
	rep.PhaseMargin, rep.GainCrossover = margins.Nullable(mg.PhaseMargin), margins.Nullable(mg.GainCrossover)
	rep.Ms, rep.MsFreq, rep.Mt, rep.MtFreq = mg.Ms, margins.Nullable(mg.MsFreq), mg.Mt, margins.Nullable(mg.MtFreq)

	if fr, err := fragility(ctx, loop, f.x, f.y); err != nil {
		return nil, err
	} else {
		rep.Fragility = fr
	}
	if ku, tu, ok := margins.Ultimate(loop.PlantNum, loop.PlantDen); ok {
		rep.Ultimate = &ultimateReport{Ku: ku, Tu: tu, Rules: margins.UltimateCycleRules(ku, tu)}
	}
	return rep, nil
}

// printProbe writes the report for a person.
func printProbe(w io.Writer, r *probeReport) {
	fam, _ := family.Lookup(r.Controller)
	fmt.Fprintf(w, "plant        G(s) = %s\n", r.Plant)
	fmt.Fprintf(w, "controller   %s with %s\n", fam.Formula(), valuesText(fam, r.Values))
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
		fmt.Fprintf(w, " (ω = %s rad/s)", floatsText(r.JWOmegas))
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
			fmt.Fprintf(w, "  %.6g ± %.6gj  (ζ = %.3g, ωn = %.4g rad/s)\n", p[0], p[1], -p[0]/math.Hypot(p[0], p[1]), math.Hypot(p[0], p[1]))
		}
	}
	fmt.Fprintf(w, "decay rate   σ = %.4g 1/s (slowest pole), smallest damping ratio ζ = %.3g\n", r.DecayRate, r.MinDamping)
	if r.GainMargin != nil {
		fmt.Fprintf(w, "gain margin  %.4g (%.3g dB) at the phase crossover ω = %.4g rad/s\n", *r.GainMargin, *r.GainMarginDB, *r.PhaseCrossover)
	} else {
		fmt.Fprintln(w, "gain margin  infinite (the phase never reaches −180°)")
	}
	if r.PhaseMargin != nil {
		fmt.Fprintf(w, "phase margin %.4g° at the gain crossover ω = %.4g rad/s\n", *r.PhaseMargin, *r.GainCrossover)
	} else {
		fmt.Fprintln(w, "phase margin infinite (|L| never equals 1)")
	}
	fmt.Fprintf(w, "Ms           %.4g at ω = %s rad/s   (1.4–2.0 is the usual robustness band, common practice)\n", r.Ms, optText(r.MsFreq))
	fmt.Fprintf(w, "Mt           %.4g at ω = %s rad/s\n", r.Mt, optText(r.MtFreq))
	if fr := r.Fragility; fr != nil {
		printFragility(w, fr)
	}
	if u := r.Ultimate; u != nil {
		fmt.Fprintf(w, "\nProportional-only loop: ultimate gain Ku = %.6g, ultimate period Tu = %.6g s\n", u.Ku, u.Tu)
		for _, rule := range u.Rules {
			fmt.Fprintf(w, "  %-24s kp = %-10.4g ki = %-10.4g kd = %.4g\n", rule.Name, rule.Kp, rule.Ki, rule.Kd)
		}
		fmt.Fprintln(w, "  sources: Ziegler & Nichols, Trans. ASME 64 (1942); Luyben, Ind. Eng. Chem. Process Des. Dev. 25 (1986)")
	} else {
		fmt.Fprintln(w, "\nProportional-only loop: no finite ultimate gain with a sustained oscillation")
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, caution)
}

// runVary prints the stable intervals of one parameter.
func runVary(loop plane.Loop, f probeFlags, w io.Writer) error {
	ax, err := spec.ParseAxis(f.vary)
	if err != nil {
		return userErr("--vary: %v", err)
	}
	idx, err := family.Index(loop.Family, ax.Param)
	if err != nil {
		return userErr("--vary %q: %v", f.vary, err)
	}
	ivs, err := intervals.Stable(loop, idx, ax.Min, ax.Max)
	if err != nil {
		return userErr("--vary %q: %v", f.vary, err)
	}
	type jsonInterval struct {
		Lo      float64  `json:"lo"`
		Hi      float64  `json:"hi"`
		LoKind  string   `json:"lo_kind"`
		HiKind  string   `json:"hi_kind"`
		LoOmega *float64 `json:"lo_omega"`
		HiOmega *float64 `json:"hi_omega"`
	}
	out := struct {
		Plant      string             `json:"plant"`
		Controller string             `json:"controller"`
		Param      string             `json:"param"`
		Min        float64            `json:"min"`
		Max        float64            `json:"max"`
		Fixed      map[string]float64 `json:"fixed"`
		Intervals  []jsonInterval     `json:"intervals"`
		Caution    string             `json:"caution"`
	}{f.plantText(), loop.Family.Name(), ax.Param, ax.Min, ax.Max, fixedMap(loop, idx), []jsonInterval{}, caution}
	for _, iv := range ivs {
		out.Intervals = append(out.Intervals, jsonInterval{iv.Lo, iv.Hi, iv.LoKind, iv.HiKind, margins.Nullable(iv.LoOmega), margins.Nullable(iv.HiOmega)})
	}
	if f.json {
		enc := json.NewEncoder(w)
		enc.SetIndent("", " ")
		return enc.Encode(out)
	}
	fmt.Fprintf(w, "plant        G(s) = %s\n", f.plantText())
	fmt.Fprintf(w, "controller   %s", loop.Family.Formula())
	if fx := fixedText(loop, idx); fx != "" {
		fmt.Fprintf(w, " with %s", fx)
	}
	fmt.Fprintf(w, "\nscanning     %s from %g to %g\n\n", ax.Param, ax.Min, ax.Max)
	if len(ivs) == 0 {
		fmt.Fprintf(w, "The loop is not stable for any %s in the range.\n", ax.Param)
	}
	for _, iv := range ivs {
		// Adding zero turns a negative zero from the search into +0.
		fmt.Fprintf(w, "stable for %.10g < %s < %.10g\n", iv.Lo+0, ax.Param, iv.Hi+0)
		fmt.Fprintf(w, "  lower end: %s\n", endText(iv.LoKind, iv.LoOmega))
		fmt.Fprintf(w, "  upper end: %s\n", endText(iv.HiKind, iv.HiOmega))
	}
	fmt.Fprintln(w)
	fmt.Fprintln(w, caution)
	return nil
}

func endText(kind string, omega float64) string {
	switch kind {
	case intervals.Real:
		return "a real root crosses through s = 0 (the loop drifts away, ω = 0)"
	case intervals.Complex:
		return fmt.Sprintf("a complex pair crosses the imaginary axis: the loop oscillates at ω = %.6g rad/s (period %.4g s)", omega, 2*math.Pi/omega)
	case intervals.Infinite:
		return "a root passes through infinity (the leading coefficient vanishes)"
	}
	return "the end of the range scanned"
}

func valuesText(f family.Family, v map[string]float64) string {
	var parts []string
	for _, p := range f.Params() {
		parts = append(parts, fmt.Sprintf("%s = %g", p.Name, v[p.Name]))
	}
	return strings.Join(parts, ", ")
}

func polyText(desc []float64) string { return poly.FromDescending(desc).String() }

func floatsText(v []float64) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = fmt.Sprintf("%.6g", x)
	}
	return strings.Join(s, ", ")
}

func optText(v *float64) string {
	if v == nil {
		return "∞"
	}
	return fmt.Sprintf("%.4g", *v)
}

func pad(s []string, n int) []string {
	out := make([]string, len(s))
	for i, x := range s {
		out[i] = fmt.Sprintf("%-*s", n, x)
	}
	return out
}
