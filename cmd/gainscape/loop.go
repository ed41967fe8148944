package main

import (
	"fmt"
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
		if num, den, err = expr.Parse(f.plant); err != nil {
			return plane.Loop{}, userErr("--plant: %v", err)
		}
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
	if err := expr.Check(num, den); err != nil {
		if f.plant != "" {
			return plane.Loop{}, userErr("--plant %q: %v", f.plant, err)
		}
		return plane.Loop{}, userErr("--num %q --den %q: %v", f.num, f.den, err)
	}
	fam, err := family.Lookup(f.ctrl)
	if err != nil {
		return plane.Loop{}, userErr("--ctrl: %v", err)
	}
	loop := plane.Loop{PlantNum: num, PlantDen: den, Family: fam, Values: family.Defaults(fam)}
	if strings.TrimSpace(f.set) != "" {
		vals, err := spec.ParseValues(f.set)
		if err != nil {
			return plane.Loop{}, userErr("--set: %v", err)
		}
		for _, v := range vals {
			i, err := family.Index(fam, v.Param)
			if err != nil {
				return plane.Loop{}, userErr("--set %q: %v", f.set, err)
			}
			loop.Values[i] = v.V
		}
	}
	return loop, nil
}

// fixedText lists the parameters other than skip as "kd = 0.5, tau = 0".
func fixedText(l plane.Loop, skip ...int) string {
	var parts []string
	for i, p := range l.Family.Params() {
		if contains(skip, i) {
			continue
		}
		parts = append(parts, fmt.Sprintf("%s = %g", p.Name, l.Values[i]))
	}
	return strings.Join(parts, ", ")
}

func contains(s []int, v int) bool {
	for _, x := range s {
		if x == v {
			return true
		}
	}
	return false
}
