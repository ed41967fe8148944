package study

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
)

// withDefaultAxes gives an axis without a parameter the structure's
// first or second parameter, its range to be chosen.
func withDefaultAxes(ps PanelSpec, l loop.Loop) PanelSpec {
	params := l.Family.Params()
	if ps.X.Param == "" && len(params) > 0 {
		ps.X, ps.AutoX = spec.Axis{Param: params[0].Name}, true
	}
	if ps.Y.Param == "" && len(params) > 1 {
		name := params[1].Name
		if name == ps.X.Param {
			name = params[0].Name
		}
		ps.Y, ps.AutoY = spec.Axis{Param: name}, true
	}
	return ps
}

// shareWindows gives panels of one structure that sweep the same two
// parameters, with the same axes to choose (slices, or plants), the
// smallest window holding each one's; other structures keep their own.
func shareWindows(panels []*PanelResult, specs []PanelSpec) {
	type key struct {
		ctrl, x, y   string
		autoX, autoY bool
	}
	groups := map[key][]int{}
	var order []key
	for k, ps := range specs {
		if !ps.AutoX && !ps.AutoY {
			continue
		}
		g := key{strings.ToLower(ps.Loop.Controller), ps.X.Param, ps.Y.Param, ps.AutoX, ps.AutoY}
		if groups[g] == nil {
			order = append(order, g)
		}
		groups[g] = append(groups[g], k)
	}
	for _, g := range order {
		members := groups[g]
		if len(members) < 2 {
			continue
		}
		u := panels[members[0]].Window
		for _, k := range members[1:] {
			w := panels[k].Window
			u.X.Min, u.X.Max = math.Min(u.X.Min, w.X.Min), math.Max(u.X.Max, w.X.Max)
			u.Y.Min, u.Y.Max = math.Min(u.Y.Min, w.Y.Min), math.Max(u.Y.Max, w.Y.Max)
		}
		names := make([]string, len(members))
		for i, k := range members {
			names[i] = fmt.Sprint(k + 1)
		}
		for _, k := range members {
			w := &panels[k].Window
			if g.autoX {
				w.X.Min, w.X.Max = u.X.Min, u.X.Max
			}
			if g.autoY {
				w.Y.Min, w.Y.Max = u.Y.Min, u.Y.Max
			}
			w.Rule += fmt.Sprintf("; shared by panels %s, the smallest window holding each one's", strings.Join(names, ", "))
		}
	}
}

// panelScenario is the map scenario of a panel over window w, the axis
// parameters taken out of the fixed values.
func panelScenario(ls LoopSpec, w Window, cols, rows int) scenario.Scenario {
	sc := scenario.Default()
	sc.Loop = scenario.Loop{Plant: ls.Plant, Numerator: ls.Num, Denominator: ls.Den, Controller: ls.Controller,
		TimeUnit: ls.TimeUnit, Sample: ls.Sample, Integral: ls.Integral}
	if sc.Loop.TimeUnit == "" {
		sc.Loop.TimeUnit = "s"
	}
	for _, v := range ls.Fixed {
		if v.Param != w.X.Param && v.Param != w.Y.Param {
			sc.Fixed = append(sc.Fixed, v)
		}
	}
	sc.Axes = scenario.Axes{X: w.X, Y: w.Y, Columns: cols, Rows: rows}
	return sc
}

// panelLabel titles a panel: the plant's label, the structure, its
// fixed values and a digital controller's sample time.
func panelLabel(res *MapResult, ps PanelSpec) string {
	s := family.Title(res.Controller)
	for _, v := range res.Fixed {
		s += fmt.Sprintf(", %s = %s", v.Name, shortNumber(v.Value))
	}
	if ps.Loop.Sample > 0 {
		s += fmt.Sprintf(", T = %g %s", ps.Loop.Sample, res.Units.TimeLabel())
	}
	if ps.PlantLabel != "" {
		s = ps.PlantLabel + ": " + s
	}
	return s
}

// shortNumber writes v to four significant digits, as panel titles
// show values.
func shortNumber(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }

// responses computes the step responses of every panel's best-ki design
// over one window, the longest any of them needs, so that they share
// their time axis.
func (c *Comparison) responses() error {
	loops := make([]*loop.Loop, len(c.Panels))
	for k, pr := range c.Panels {
		if pr.Table.BestKi.Failed != "" {
			pr.ResponseFailed = "no best-ki design: " + pr.Table.BestKi.Failed
			continue
		}
		l, err := withValues(pr.base, pr.Table.BestKi.Values)
		if err != nil {
			return err
		}
		d, err := ResponseWindow(l)
		if err != nil {
			pr.ResponseFailed = strings.TrimPrefix(err.Error(), "response: ")
			continue
		}
		loops[k] = &l
		c.ResponseWindow = math.Max(c.ResponseWindow, d)
	}
	for k, pr := range c.Panels {
		if loops[k] == nil {
			continue
		}
		r, err := StepResponse(*loops[k], c.ResponseWindow)
		if err != nil {
			pr.ResponseFailed = strings.TrimPrefix(err.Error(), "response: ")
			continue
		}
		pr.Response = r
	}
	return nil
}

// takeBetterKi replaces the best-ki point of a panel drawn at the kd its
// search over kd found by the search's design, at the same kd, when that
// has the larger ki: both meet the bound by the refined Ms, and the two
// grids may resolve the tip of a narrow feasible region differently.
func takeBetterKi(job *MapJob, pr *PanelResult, bound float64) error {
	og := pr.overKd
	for k, b := range pr.Map.Overlays.Best {
		if b.Label != "best "+BestIntegral || (b.Failed == "" && b.Values["ki"] >= og.Values["ki"]) {
			continue
		}
		s := job.setup
		x, y := og.Values[s.X.Param], og.Values[s.Y.Param]
		if x < s.X.Min || x > s.X.Max || y < s.Y.Min || y > s.Y.Max {
			continue
		}
		p, err := pointAt(s, x, y)
		if err != nil {
			return err
		}
		p.Label, p.Criterion = b.Label, fmt.Sprintf("largest ki with Ms ≤ %g (from the search over kd)", bound)
		pr.Map.Overlays.Best[k] = p
	}
	return nil
}

// overKd reports whether the panel gets a search for its best design
// over kd: its structure has ki and kd, and kd is not an axis.
func overKd(l loop.Loop, ps PanelSpec) bool {
	_, errKi := family.Index(l.Family, "ki")
	_, errKd := family.Index(l.Family, "kd")
	return errKi == nil && errKd == nil && ps.X.Param != "kd" && ps.Y.Param != "kd"
}

// searchKey identifies the search over kd of a panel: its loop without
// kd and its plane.
func searchKey(ps PanelSpec) string {
	ls := ps.Loop
	ls.Fixed = nil
	for _, v := range ps.Loop.Fixed {
		if v.Param != "kd" {
			ls.Fixed = append(ls.Fixed, v)
		}
	}
	slices.SortFunc(ls.Fixed, func(a, b spec.Value) int { return strings.Compare(a.Param, b.Param) })
	return fmt.Sprintf("%#v|%s|%s", ls, ps.X.Param, ps.Y.Param)
}

// kdIndex returns the index of kd in l's family.
func kdIndex(l loop.Loop) int {
	i, err := family.Index(l.Family, "kd")
	if err != nil {
		panic(err)
	}
	return i
}

// hasValue reports whether vals gives the named parameter.
func hasValue(vals []spec.Value, name string) bool {
	for _, v := range vals {
		if v.Param == name {
			return true
		}
	}
	return false
}

// withValues returns l with the named values set.
func withValues(l loop.Loop, values map[string]float64) (loop.Loop, error) {
	out := l.Set(0, l.Values[0])
	for name, v := range values {
		i, err := family.Index(l.Family, name)
		if err != nil {
			return out, err
		}
		out.Values[i] = v
	}
	return out, nil
}
