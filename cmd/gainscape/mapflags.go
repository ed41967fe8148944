package main

import (
	"fmt"
	"strconv"
	"strings"

	"gainscape/regions/expr"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
)

// toScenario reads the flags into a scenario. Only flags for which given
// is true are parsed, so that a scenario file is not overridden, or
// failed, by a flag's default.
func (f mapFlags) toScenario(given func(string) bool) (scenario.Scenario, error) {
	var s scenario.Scenario
	var err error
	s.Loop.Plant, s.Loop.Controller = f.plant, f.ctrl
	if given("num") && f.num != "" {
		p, err := expr.ParseList(f.num)
		if err != nil {
			return s, userErr("--num %q: %v", f.num, err)
		}
		s.Loop.Numerator = p.Descending()
	}
	if given("den") && f.den != "" {
		p, err := expr.ParseList(f.den)
		if err != nil {
			return s, userErr("--den %q: %v", f.den, err)
		}
		s.Loop.Denominator = p.Descending()
	}
	if (f.num == "") != (f.den == "") && (given("num") || given("den")) {
		return s, userErr("--num and --den go together; give both, or --plant")
	}
	if f.plant != "" && (f.num != "" || f.den != "") {
		return s, userErr("--plant cannot be combined with --num/--den; give the plant one way")
	}
	if given("set") {
		if s.Fixed, err = f.fixed(); err != nil {
			return s, err
		}
	}
	s.Loop.TimeUnit, s.Loop.Sample, s.Loop.Integral, s.Loop.Prewarp, s.Loop.Pade = f.timeUnit, f.sample, f.integral, f.prewarp, f.pade
	// An axis given by name alone has its range chosen (autoAxes).
	if given("x") {
		if s.Axes.X, _, err = spec.ParseAxisOrName(f.x); err != nil {
			return s, userErr("--x: %v", err)
		}
	}
	if given("y") {
		if s.Axes.Y, _, err = spec.ParseAxisOrName(f.y); err != nil {
			return s, userErr("--y: %v", err)
		}
	}
	if given("grid") {
		if s.Axes.Columns, s.Axes.Rows, err = spec.ParseGrid(f.grid); err != nil {
			return s, userErr("--grid: %v", err)
		}
	}
	s.Output = scenario.Output{Image: f.out, Data: f.data, CSV: f.csv, Note: f.note, Title: f.title, DPI: f.dpi}
	if given("size") {
		if s.Output.WidthCm, s.Output.HeightCm, err = parseSize(f.size); err != nil {
			return s, userErr("--size %q: %v", f.size, err)
		}
	}
	s.Overlays.Decay = f.decay
	if s.Overlays.DecayLevels, err = numberList("--decay-levels", f.decayLevels); err != nil {
		return s, err
	}
	if s.Overlays.DampingLevels, err = numberList("--damping-levels", f.dampingLevels); err != nil {
		return s, err
	}
	if s.Overlays.MsLevels, err = numberList("--ms-levels", f.msLevels); err != nil {
		return s, err
	}
	for _, m := range f.marks {
		v, err := spec.ParseValues(m)
		if err != nil {
			return s, userErr("--mark: %v", err)
		}
		s.Overlays.Marks = append(s.Overlays.Marks, v)
	}
	for _, b := range strings.FieldsFunc(f.best, func(r rune) bool { return r == ',' || r == ' ' }) {
		s.Overlays.Best = append(s.Overlays.Best, strings.ToLower(b))
	}
	s.Overlays.MsBound = f.msBound
	if s.Overlays.CompareSamples, err = numberList("--compare-samples", f.compare); err != nil {
		return s, err
	}
	return s, nil
}

// autoAxes reports which axes the flags give by name alone, for the
// window rule to choose their ranges.
func (f mapFlags) autoAxes(given func(string) bool) (x, y bool) {
	return given("x") && !strings.Contains(f.x, "="), given("y") && !strings.Contains(f.y, "=")
}

// numberList reads "0.2, 0.5" (or "none" or "" for no values).
func numberList(flag, s string) ([]float64, error) {
	s = strings.TrimSpace(s)
	if s == "" || strings.EqualFold(s, "none") {
		return nil, nil
	}
	var out []float64
	for _, part := range strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ' ' }) {
		v, err := strconv.ParseFloat(part, 64)
		if err != nil || v != v || v > 1e300 || v < -1e300 {
			return nil, userErr("%s %q: %q is not a finite number", flag, s, part)
		}
		out = append(out, v)
	}
	return out, nil
}

// parseSize reads "16x12" in centimetres.
func parseSize(s string) (w, h float64, err error) {
	a, b, ok := strings.Cut(strings.ToLower(s), "x")
	if !ok {
		return 0, 0, fmt.Errorf("expected WIDTHxHEIGHT in centimetres, e.g. 16x12")
	}
	if w, err = strconv.ParseFloat(strings.TrimSpace(a), 64); err != nil {
		return 0, 0, fmt.Errorf("width %q is not a number", a)
	}
	if h, err = strconv.ParseFloat(strings.TrimSpace(b), 64); err != nil {
		return 0, 0, fmt.Errorf("height %q is not a number", b)
	}
	if !(w >= scenario.MinSizeCm && w <= scenario.MaxSizeCm && h >= scenario.MinSizeCm && h <= scenario.MaxSizeCm) {
		return 0, 0, fmt.Errorf("each side must be %g to %g cm", float64(scenario.MinSizeCm), float64(scenario.MaxSizeCm))
	}
	return w, h, nil
}

func axisText(a spec.Axis) string { return fmt.Sprintf("%s=%g:%g", a.Param, a.Min, a.Max) }

func numbersText(v []float64) string {
	parts := make([]string, len(v))
	for i, x := range v {
		parts[i] = strconv.FormatFloat(x, 'g', -1, 64)
	}
	return strings.Join(parts, ",")
}
