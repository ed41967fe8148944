package main

import (
	"strings"

	"gainscape/regions/expr"
	"gainscape/regions/spec"
	"gainscape/regions/study"
)

// loopFlags are the flags that describe the plant and controller, shared
// by every command.
type loopFlags struct {
	plant, num, den string
	ctrl            string
	set             string
}

// spec reads the plant and controller flags into a loop description; the
// study checks it.
func (f loopFlags) spec() (study.LoopSpec, error) {
	ls := study.LoopSpec{Plant: f.plant, Controller: f.ctrl}
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
	if strings.TrimSpace(f.set) != "" {
		fixed, err := spec.ParseValues(f.set)
		if err != nil {
			return ls, userErr("--set: %v", err)
		}
		ls.Fixed = fixed
	}
	return ls, nil
}
