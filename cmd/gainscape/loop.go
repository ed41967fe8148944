package main

import (
	"fmt"
	"slices"
	"strings"

	"gainscape/regions/expr"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
	"gainscape/regions/study"
)

// loopFlags are the flags that describe the plant and controller, shared
// by every command.
type loopFlags struct {
	plant, num, den string
	ctrl            string
	set             []string // every --set, in order
	timeUnit        string
	sample          float64
	integral        string
	prewarp         float64
}

// fixed reads every --set into one list: repeated flags add to each
// other, and a parameter given twice must have one value.
func (f loopFlags) fixed() ([]spec.Value, error) {
	var out []spec.Value
	from := map[string]string{}
	for _, s := range f.set {
		if strings.TrimSpace(s) == "" {
			continue
		}
		vals, err := spec.ParseValues(s)
		if err != nil {
			return nil, userErr("--set: %v", err)
		}
		for _, v := range vals {
			text := fmt.Sprintf("%s=%g", v.Param, v.V)
			if prev, ok := from[v.Param]; ok {
				if prev != text {
					return nil, userErr("--set: %s is given twice, as %s and as %s; give it once", v.Param, prev, text)
				}
				continue
			}
			from[v.Param] = text
			out = append(out, v)
		}
	}
	return out, nil
}

// spec reads the plant and controller flags into a loop description; the
// study checks it.
func (f loopFlags) spec() (study.LoopSpec, error) {
	ls := study.LoopSpec{Plant: f.plant, Controller: f.ctrl, TimeUnit: f.timeUnit, Sample: f.sample, Integral: f.integral, Prewarp: f.prewarp}
	switch {
	case f.plant != "" && (f.num != "" || f.den != ""):
		return ls, userErr("--plant cannot be combined with --num/--den; give the plant one way")
	case f.plant != "":
	case f.num != "" && f.den != "":
		num, err := expr.ParseList(f.num)
		if err != nil {
			return ls, userErr("--num %q: %v", f.num, err)
		}
		den, err := expr.ParseList(f.den)
		if err != nil {
			return ls, userErr("--den %q: %v", f.den, err)
		}
		ls.Num, ls.Den = num.Descending(), den.Descending()
	default:
		return ls, userErr("give the plant as --plant EXPR, or as both --num and --den")
	}
	fixed, err := f.fixed()
	if err != nil {
		return ls, err
	}
	ls.Fixed = fixed
	if !slices.Contains(scenario.TimeUnits, f.timeUnit) {
		return ls, userErr("--time-unit %q: use one of %s", f.timeUnit, strings.Join(scenario.TimeUnits, ", "))
	}
	return ls, nil
}
