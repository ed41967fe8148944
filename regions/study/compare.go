package study

import (
	"context"
	"fmt"
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
		pr := &PanelResult{PlantLabel: ps.PlantLabel, Sample: l.Plant.Sample}
		if overKd(l, ps) {
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
	return nil
}
