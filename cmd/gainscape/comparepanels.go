package main

import (
	"slices"
	"strconv"
	"strings"

	"gainscape/regions/expr"
	"gainscape/regions/family"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
)

// panels expands the panel flags: for each plant (in the order given),
// each structure of --ctrl, and each value of --slices that applies to
// the structure, one panel.
func (f *compareFlags) panels() (scenario.Loop, []scenario.Panel, error) {
	loop := scenario.Loop{TimeUnit: f.timeUnit, Sample: f.sample, Integral: f.integral}
	type plant struct{ label, text string }
	var plants []plant
	for _, p := range f.plants {
		label, text, ok := strings.Cut(p, "=")
		if !ok {
			label, text = "", p
		}
		label, text = strings.TrimSpace(label), strings.TrimSpace(text)
		if text == "" || (ok && label == "") {
			return loop, nil, userErr("--plant %q: expected EXPR or LABEL=EXPR, such as worn=0.7/(s+1)^4", p)
		}
		plants = append(plants, plant{label, text})
	}
	switch {
	case len(plants) > 0 && (f.num != "" || f.den != ""):
		return loop, nil, userErr("--plant cannot be combined with --num/--den; give the plant one way")
	case len(plants) == 0 && (f.num == "") != (f.den == ""):
		return loop, nil, userErr("--num and --den go together; give both, or --plant")
	case len(plants) == 0 && f.num == "":
		return loop, nil, userErr("give the plant as --plant EXPR (repeatable, LABEL=EXPR), or as --num and --den")
	case len(plants) == 0:
		n, err := expr.ParseList(f.num)
		if err != nil {
			return loop, nil, userErr("--num %q: %v", f.num, err)
		}
		d, err := expr.ParseList(f.den)
		if err != nil {
			return loop, nil, userErr("--den %q: %v", f.den, err)
		}
		loop.Numerator, loop.Denominator = n.Descending(), d.Descending()
		plants = []plant{{}}
	default:
		loop.Plant = plants[0].text
	}

	ctrls := splitList(f.ctrl)
	if len(ctrls) == 0 {
		return loop, nil, userErr("--ctrl %q: name at least one structure, such as pi,pid", f.ctrl)
	}
	fams := map[string]family.Family{}
	for _, c := range ctrls {
		fam, err := family.Lookup(c)
		if err != nil {
			return loop, nil, userErr("--ctrl %q: %v", f.ctrl, err)
		}
		fams[c] = fam
	}
	plain, scoped, err := scopedValues(f.set, ctrls)
	if err != nil {
		return loop, nil, err
	}
	xPlain, xScoped, err := scopedAxes("--x", f.xs, ctrls)
	if err != nil {
		return loop, nil, err
	}
	yPlain, yScoped, err := scopedAxes("--y", f.ys, ctrls)
	if err != nil {
		return loop, nil, err
	}
	sliceName, sliceValues, err := parseSlices(f.slices)
	if err != nil {
		return loop, nil, err
	}
	for _, v := range plain {
		if !slices.ContainsFunc(ctrls, func(c string) bool { return hasParam(fams[c], v.Param) }) {
			return loop, nil, userErr("--set %s=%g: no structure of --ctrl %s has %s", v.Param, v.V, f.ctrl, v.Param)
		}
	}
	if sliceName != "" && sliceName != "sample" && !slices.ContainsFunc(ctrls, func(c string) bool { return hasParam(fams[c], sliceName) }) {
		return loop, nil, userErr("--slices %q: no structure of --ctrl %s has %s", f.slices, f.ctrl, sliceName)
	}

	var panels []scenario.Panel
	for _, pl := range plants {
		for _, c := range ctrls {
			fam := fams[c]
			p := scenario.Panel{Controller: c, PlantLabel: pl.label}
			if len(plants) > 1 {
				p.Plant = pl.text
			}
			p.X = axisFor(fam, xScoped[c], xPlain)
			p.Y = axisFor(fam, yScoped[c], yPlain)
			axes := []string{axisName(p.X), axisName(p.Y)}
			for _, v := range plain {
				if hasParam(fam, v.Param) && !slices.Contains(axes, v.Param) {
					p.Fixed = withFixed(p.Fixed, v)
				}
			}
			for _, v := range scoped[c] {
				p.Fixed = withFixed(p.Fixed, v)
			}
			switch {
			case sliceName == "sample":
				for _, v := range sliceValues {
					q := p
					q.Sample, q.HasSample = v, true
					panels = append(panels, q)
				}
			case sliceName != "" && hasParam(fam, sliceName):
				for _, v := range sliceValues {
					q := p
					q.Fixed = withFixed(slices.Clone(p.Fixed), spec.Value{Param: sliceName, V: v})
					panels = append(panels, q)
				}
			default:
				panels = append(panels, p)
			}
		}
	}
	return loop, panels, nil
}

// splitList splits "pi, pid" at commas and spaces, lower-cased.
func splitList(s string) []string {
	var out []string
	for _, part := range strings.FieldsFunc(s, func(r rune) bool { return r == ',' || r == ' ' }) {
		out = append(out, strings.ToLower(part))
	}
	return out
}

// scope splits "pid:kd=0.5" into its structure and the rest; a text
// without a structure before the first ':' and '=' has none.
func scope(s string) (ctrl, rest string) {
	c, r, ok := strings.Cut(s, ":")
	if !ok || strings.ContainsAny(c, "=,") {
		return "", s
	}
	return strings.ToLower(strings.TrimSpace(c)), r
}

// scopedValues reads every --set: plain lists for all structures that
// have their parameters, STRUCT:LIST for one. A parameter given twice
// must have one value.
func scopedValues(sets []string, ctrls []string) ([]spec.Value, map[string][]spec.Value, error) {
	var plain []spec.Value
	scoped := map[string][]spec.Value{}
	for _, s := range sets {
		if strings.TrimSpace(s) == "" {
			continue
		}
		c, rest := scope(s)
		if c != "" && !slices.Contains(ctrls, c) {
			return nil, nil, userErr("--set %q: %s is not among the structures of --ctrl", s, c)
		}
		vals, err := spec.ParseValues(rest)
		if err != nil {
			return nil, nil, userErr("--set: %v", err)
		}
		for _, v := range vals {
			list := &plain
			if c != "" {
				l := scoped[c]
				list = &l
			}
			for _, old := range *list {
				if old.Param == v.Param && old.V != v.V {
					return nil, nil, userErr("--set: %s is given twice, as %g and as %g; give it once", v.Param, old.V, v.V)
				}
			}
			*list = withFixed(*list, v)
			if c != "" {
				scoped[c] = *list
			}
		}
	}
	return plain, scoped, nil
}

// scopedAxes reads the axis flags: a plain axis for every structure that
// has its parameter, STRUCT:AXIS for one.
func scopedAxes(flag string, texts []string, ctrls []string) (string, map[string]string, error) {
	plain, scoped := "", map[string]string{}
	for _, t := range texts {
		c, rest := scope(t)
		if _, _, err := spec.ParseAxisOrName(rest); err != nil {
			return "", nil, userErr("%s: %v", flag, err)
		}
		switch {
		case c == "":
			if plain != "" {
				return "", nil, userErr("%s %q: a plain axis is given twice (%q); give one, or scope it as STRUCT:AXIS", flag, t, plain)
			}
			plain = rest
		case !slices.Contains(ctrls, c):
			return "", nil, userErr("%s %q: %s is not among the structures of --ctrl", flag, t, c)
		default:
			scoped[c] = rest
		}
	}
	return plain, scoped, nil
}

// axisFor returns the axis of a panel of fam: its own, else the plain
// one if fam has its parameter, else none (the structure's default).
func axisFor(fam family.Family, own, plain string) string {
	if own != "" {
		return own
	}
	if plain != "" && hasParam(fam, axisName(plain)) {
		return plain
	}
	return ""
}

// axisName is the parameter of an axis text.
func axisName(text string) string {
	a, _, err := spec.ParseAxisOrName(text)
	if err != nil {
		return ""
	}
	return a.Param
}

// parseSlices reads "kd=0,0.5,1" into the parameter and its values.
func parseSlices(s string) (string, []float64, error) {
	if strings.TrimSpace(s) == "" {
		return "", nil, nil
	}
	name, list, ok := strings.Cut(s, "=")
	name = strings.ToLower(strings.TrimSpace(name))
	if !ok || !spec.IsName(name) {
		return "", nil, userErr("--slices %q: expected NAME=V1,V2,…, such as kd=0,0.5,1", s)
	}
	var vals []float64
	for _, part := range strings.FieldsFunc(list, func(r rune) bool { return r == ',' || r == ' ' }) {
		v, err := strconv.ParseFloat(part, 64)
		if err != nil || v != v || v > 1e300 || v < -1e300 {
			return "", nil, userErr("--slices %q: %q is not a finite number", s, part)
		}
		if slices.Contains(vals, v) {
			return "", nil, userErr("--slices %q: %g is given twice", s, v)
		}
		vals = append(vals, v)
	}
	if len(vals) == 0 {
		return "", nil, userErr("--slices %q: give at least one value", s)
	}
	return name, vals, nil
}

func hasParam(fam family.Family, name string) bool {
	_, err := family.Index(fam, name)
	return err == nil
}

// withFixed returns vals with v set, replacing an earlier value of its
// parameter.
func withFixed(vals []spec.Value, v spec.Value) []spec.Value {
	for i, x := range vals {
		if x.Param == v.Param {
			vals[i] = v
			return vals
		}
	}
	return append(vals, v)
}
