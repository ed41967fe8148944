package study

import (
	"context"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"

	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/response"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
)

// MaxPanels is the most panels one comparison draws: three by three, the
// most a printed page shows readably.
const MaxPanels = 9

// Default grid of a comparison's panels: each panel is drawn a third of
// the width of a page or less, so fewer nodes than a map's do.
const (
	DefaultCompareColumns = 240
	DefaultCompareRows    = 180
)

// LoadCriterion names the load-disturbance criterion of the best-ki
// search and its source, for tables and notes.
const (
	LoadCriterion = "largest integral gain ki with Ms ≤ bound (IE = 1/ki for a unit load step at the plant input)"
	LoadSource    = "K. J. Åström, H. Panagopoulos, T. Hägglund, \"Design of PI controllers based on non-convex optimization\", Automatica 34(5), 1998; K. J. Åström, T. Hägglund, Advanced PID Control, ISA, 2006"
)

// PanelSpec is one panel of a comparison: a loop in the plane of two of
// its parameters, the others fixed. An axis marked Auto has its range
// chosen by ChooseWindow; an axis with no Param is the structure's first
// (X) or second (Y) parameter, its range chosen.
type PanelSpec struct {
	Loop         LoopSpec
	X, Y         spec.Axis
	AutoX, AutoY bool
	// PlantLabel names the plant when panels have several, such as
	// "worn".
	PlantLabel string
}

// CompareRequest is a comparison: the panels and what every panel
// computes and draws.
type CompareRequest struct {
	Panels []PanelSpec
	// Columns and Rows are each panel's grid; 0 takes the defaults.
	Columns, Rows int
	// MsBound is the Ms limit of the searches; 0 takes 1.4.
	MsBound float64
	// MsLevels are the Ms iso-lines drawn; Decay shades the stable region
	// by decay rate.
	MsLevels []float64
	Decay    bool
	// KdRange, when set, is the range of the search for the best-ki
	// design over kd; nil takes [0, 2·(the kd scale)] (see KdScaleRule).
	KdRange *[2]float64
}

// Comparison is everything computed for a comparison.
type Comparison struct {
	Panels []*PanelResult
	// Bound is the Ms limit used; BoundDefault is set when it is the
	// default.
	Bound        float64
	BoundDefault bool
	// ResponseWindow is the duration shared by the step responses.
	ResponseWindow float64
	Units          Units
}

// PanelResult is one panel computed.
type PanelResult struct {
	Map *MapResult
	// Label titles the panel; PlantLabel is the plant's label, if any.
	Label, PlantLabel string
	Sample            float64
	Window            Window
	Table             export.CompareTable
	// Response holds the step responses of the best-ki design; nil with
	// ResponseFailed saying why.
	Response       *response.Result
	ResponseFailed string
	// OverKdRule says how the range of the search over kd was chosen;
	// KdChosen is set when the panel is drawn at the kd the search found,
	// no kd having been given.
	OverKdRule string
	KdChosen   bool
	// Caveat, when set, says which figures of the panel cannot be relied
	// on, and why.
	Caveat string
	// OverKdFrom, when positive, is the panel (counted from 1) whose
	// search over kd this panel shares: the same loop but for kd.
	OverKdFrom int
	overKd     *export.OverGain
	base       loop.Loop
}

// Compare computes every panel of the request: its window (panels of one
// structure that sweep the same two parameters with ranges to choose
// share one window, the smallest holding each one's chosen window, so
// that slices and plants read alike), a search for the best-ki design over kd for a structure with
// kd that is not an axis (the panel is drawn at the kd found when no kd
// is given), its map with the Ms overlay and the
// best-ki and best-decay searches under the bound, its row of the table,
// and the step responses of each best-ki design over one shared window.
// Errors about the input are *InputError values.
func Compare(ctx context.Context, req CompareRequest, opt Options) (*Comparison, error) {
	if len(req.Panels) == 0 {
		return nil, inputErr("--ctrl", "panel", "", "no panel to draw; give at least one structure")
	}
	if len(req.Panels) > MaxPanels {
		return nil, inputErr("--ctrl", "panel", "", "%d panels; a comparison draws at most %d", len(req.Panels), MaxPanels)
	}
	c := &Comparison{Bound: req.MsBound}
	if c.Bound == 0 {
		c.Bound, c.BoundDefault = defaultKiBound, true
	}
	cols, rows := req.Columns, req.Rows
	if cols == 0 || rows == 0 {
		cols, rows = DefaultCompareColumns, DefaultCompareRows
	}
	specs := make([]PanelSpec, len(req.Panels))
	// Slices of one structure differ in kd only and share one search.
	searched := map[string]int{}
	for k, ps := range req.Panels {
		l, err := ps.Loop.Build()
		if err != nil {
			return nil, panelErr(k, err)
		}
		ps = withDefaultAxes(ps, l)
		pr := &PanelResult{PlantLabel: ps.PlantLabel, Sample: l.Plant.Sample, Caveat: msCaveat(l)}
		if overKd(l, ps) && pr.Caveat == "" {
			rng, rule := kdRange(l, req.KdRange)
			pr.OverKdRule = rule
			key := searchKey(ps)
			if first, ok := searched[key]; ok {
				pr.overKd, pr.OverKdFrom = c.Panels[first].overKd, first+1
			} else if pr.overKd, err = bestOverKd(ctx, ps, rng, c.Bound, opt); err != nil {
				return nil, panelErr(k, err)
			} else {
				searched[key] = k
			}
			if !hasValue(ps.Loop.Fixed, "kd") && pr.overKd.Failed == "" {
				// No kd given: the panel shows the structure at its best.
				ps.Loop.Fixed = withValue(ps.Loop.Fixed, "kd", pr.overKd.Values["kd"])
				pr.KdChosen = true
				if l, err = ps.Loop.Build(); err != nil {
					return nil, panelErr(k, err)
				}
			}
		}
		if pr.Window, err = ChooseWindow(ctx, l, ps.X, ps.Y, ps.AutoX, ps.AutoY, opt); err != nil {
			return nil, panelErr(k, err)
		}
		pr.base = l
		specs[k] = ps
		c.Panels = append(c.Panels, pr)
	}
	shareWindows(c.Panels, specs)
	c.Units = Units{specs[0].Loop.TimeUnit}
	for k, pr := range c.Panels {
		if err := c.runPanel(ctx, pr, specs[k], cols, rows, req, opt); err != nil {
			return nil, panelErr(k, err)
		}
	}
	if err := c.responses(); err != nil {
		return nil, err
	}
	return c, nil
}

// panelErr places an error in panel k (counted from 1) for messages.
func panelErr(k int, err error) error {
	if ie, ok := err.(*InputError); ok {
		cp := *ie
		cp.Err = fmt.Errorf("panel %d: %w", k+1, ie.Err)
		return &cp
	}
	return fmt.Errorf("panel %d: %w", k+1, err)
}

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

// runPanel maps one panel and fills its table.
func (c *Comparison) runPanel(ctx context.Context, pr *PanelResult, ps PanelSpec, cols, rows int, req CompareRequest, opt Options) error {
	l := pr.base
	_, hasKi := family.Index(l.Family, "ki")
	best := []string{BestDecay}
	if hasKi == nil {
		best = []string{BestIntegral, BestDecay}
	}
	sc := panelScenario(ps.Loop, pr.Window, cols, rows)
	sc.Overlays = scenario.Overlays{Decay: req.Decay, MsLevels: req.MsLevels, Best: best, MsBound: c.Bound}
	if pr.Caveat != "" {
		sc.Overlays.MsLevels, sc.Overlays.Best = nil, nil
	}
	job, err := NewMap(sc)
	if err != nil {
		return err
	}
	if pr.Map, err = job.Run(ctx, opt); err != nil {
		return err
	}
	pr.Label = panelLabel(pr.Map, ps)
	if pr.KdChosen {
		kd := "kd = " + shortNumber(l.Values[kdIndex(l)])
		pr.Label = strings.Replace(pr.Label, kd, kd+" (best)", 1)
	}
	if pr.KdChosen {
		if err := takeBetterKi(job, pr, c.Bound); err != nil {
			return err
		}
	}
	pr.Table = tableOf(pr.Map, l, c.Bound, hasKi == nil)
	pr.Table.OverKd = pr.overKd
	if pr.Caveat != "" {
		pr.Table.BestKi.Failed, pr.Table.BestDecay.Failed = caveatShort, caveatShort
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

// msCaveat says why l gets no Ms-based figures, or "" when it does: Ms,
// the margins and the searches bounded by Ms come from package margins,
// which takes the open loop as a rational function of s: it would leave
// a dead time out and read the polynomials of a sampled loop, in z, as if
// they were in s. Such a panel shows its stable region, stable share and
// ultimate gain only. When margins serves these loops, this is the one
// place to change.
func msCaveat(l loop.Loop) string {
	switch {
	case l.Plant.Sample > 0:
		return "Ms and the margins of sampled loops are not computed yet, so this panel shows its stable region without Ms and searches"
	case l.Plant.Delay > 0:
		return "Ms and the margins of loops with dead time are not computed yet, so this panel shows its stable region without Ms and searches"
	}
	return ""
}

// caveatShort is the table's entry for a search not run for a panel
// with a caveat.
const caveatShort = "not run: no Ms for this kind of loop yet"

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
	s := strings.ToUpper(res.Controller)
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
			pr.ResponseFailed = err.Error()
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
			pr.ResponseFailed = err.Error()
			continue
		}
		pr.Response = r
	}
	return nil
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
