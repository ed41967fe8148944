package main

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gainscape/regions/expr"
	"gainscape/regions/family"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/spec"
)

// loopFlags are the flags that describe the plant and controller, shared
// by every command.
type loopFlags struct {
	plant, num, den string
	ctrl            string
	set             string
}

// plantText is the plant as the user gave it, for titles and reports.
func (f loopFlags) plantText() string {
	if f.plant != "" {
		return f.plant
	}
	return fmt.Sprintf("(%s)/(%s)", f.num, f.den)
}

// buildLoop parses the plant and controller flags into a loop whose
// parameter values are the family defaults overridden by --set.
func (f loopFlags) buildLoop() (plane.Loop, error) {
	var num, den poly.Poly
	var err error
	switch {
	case f.plant != "" && (f.num != "" || f.den != ""):
		return plane.Loop{}, userErr("--plant cannot be combined with --num/--den; give the plant one way")
	case f.plant != "":
	case f.num != "" && f.den != "":
		if num, err = expr.ParseList(f.num); err != nil {
			return plane.Loop{}, userErr("--num %q: %v", f.num, err)
		}
		if den, err = expr.ParseList(f.den); err != nil {
			return plane.Loop{}, userErr("--den %q: %v", f.den, err)
		}
	default:
		return plane.Loop{}, userErr("give the plant as --plant EXPR, or as both --num and --den")
	}
	var fixed []spec.Value
	if strings.TrimSpace(f.set) != "" {
		if fixed, err = spec.ParseValues(f.set); err != nil {
			return plane.Loop{}, userErr("--set: %v", err)
		}
	}
	return makeLoop(f.plant, num.Descending(), den.Descending(), f.ctrl, fixed)
}

// makeLoop builds a loop from a plant expression or coefficient lists
// (highest power first), a family name and fixed values; parameters not
// fixed keep the family defaults. Errors name the flag that carries each
// value.
func makeLoop(plant string, num, den []float64, ctrl string, fixed []spec.Value) (plane.Loop, error) {
	var pn, pd poly.Poly
	if plant != "" {
		var err error
		if pn, pd, err = expr.Parse(plant); err != nil {
			return plane.Loop{}, userErr("--plant: %v", err)
		}
		if err := expr.Check(pn, pd); err != nil {
			return plane.Loop{}, userErr("--plant %q: %v", plant, err)
		}
	} else {
		pn, pd = poly.FromDescending(num), poly.FromDescending(den)
		if err := expr.Check(pn, pd); err != nil {
			return plane.Loop{}, userErr("--num %s --den %s: %v", listText(num), listText(den), err)
		}
	}
	fam, err := family.Lookup(ctrl)
	if err != nil {
		return plane.Loop{}, userErr("--ctrl: %v", err)
	}
	loop := plane.Loop{PlantNum: pn, PlantDen: pd, Family: fam, Values: family.Defaults(fam)}
	for _, v := range fixed {
		i, err := family.Index(fam, v.Param)
		if err != nil {
			return plane.Loop{}, userErr("--set %s=%g: %v", v.Param, v.V, err)
		}
		loop.Values[i] = v.V
	}
	return loop, nil
}

// listText writes coefficients as the --num and --den flags take them.
func listText(c []float64) string {
	parts := make([]string, len(c))
	for i, v := range c {
		parts[i] = strconv.FormatFloat(v, 'g', -1, 64)
	}
	return strconv.Quote(strings.Join(parts, ", "))
}

// fixedText lists the parameters other than skip as "kd = 0.5, tau = 0".
func fixedText(l plane.Loop, skip ...int) string {
	var parts []string
	for i, p := range l.Family.Params() {
		if slices.Contains(skip, i) {
			continue
		}
		parts = append(parts, fmt.Sprintf("%s = %g", p.Name, l.Values[i]))
	}
	return strings.Join(parts, ", ")
}
