package study

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"

	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/isoline"
	"gainscape/regions/margins"
	"gainscape/regions/overlay"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
)

// Names of the best-point searches, as --best and the scenario key best
// take them.
const (
	BestDecay    = "decay" // the largest decay rate in the window
	BestIntegral = "ki"    // the largest integral gain with Ms at most the bound
)

// defaultKiBound is the Ms limit of the ki search when the scenario sets
// none: the tight end of the usual robustness band 1.4–2.0 (common
// practice).
const defaultKiBound = 1.4

// Overlays are the quantities computed over the stable region, with the
// iso-lines traced once for both the figure and the data.
type Overlays struct {
	XAxis, YAxis plane.Axis
	// Each layer is nil unless something draws, searches or writes it:
	// Decay for its shading, its iso-lines, a search or the data; Damping
	// and Ms when their iso-lines or a search ask for them.
	Decay, Damping, Ms *Layer
	// Marks and Best are the marked and the found design points.
	Marks, Best []export.Point
}

// Layer is one overlay grid and its iso-lines.
type Layer struct {
	// Values is row-major like grid.Map, NaN outside the stable region.
	Values []float64
	// Levels are the iso-line levels asked for; Lines[k] are the lines
	// of Levels[k].
	Levels []float64
	Lines  [][]isoline.Line
	// Partial reports that Values hold the quantity only at the corners
	// of the cells its levels cross, and elsewhere a stand-in on the same
	// side of every level (overlay.MsForLevels): enough for the lines,
	// not for the data, which never gets a partial layer.
	Partial bool
}

func newLayer(x, y plane.Axis, values, levels []float64) *Layer {
	if values == nil {
		return nil
	}
	l := &Layer{Values: values, Levels: levels}
	for _, level := range levels {
		l.Lines = append(l.Lines, isoline.Trace(x, y, values, level))
	}
	return l
}

// computeOverlays evaluates the overlays, marks and searches of ov, or
// returns nil when none is asked for. The decay rate is computed only
// where it is shown, searched or, with data, written: the data document
// promises every overlay grid computed.
func computeOverlays(ctx context.Context, s plane.Setup, m *grid.Map, ov scenario.Overlays, data bool, opt Options) (*Overlays, error) {
	// Ms is needed for its iso-lines, and by every search: as the ki
	// search's bound, as the decay search's bound when one is given, and
	// to break the ties of a flat optimum.
	wantMs := len(ov.MsLevels) > 0 || len(ov.Best) > 0
	if !ov.Decay && len(ov.DecayLevels) == 0 && len(ov.DampingLevels) == 0 && !wantMs && len(ov.Best) == 0 && len(ov.Marks) == 0 {
		return nil, nil
	}
	needDecay := ov.Decay || len(ov.DecayLevels) > 0 || len(ov.Best) > 0 || data
	o := overlay.Options{Workers: opt.Workers, Damping: len(ov.DampingLevels) > 0, SkipDecay: !needDecay}
	// Ms only for its iso-lines (no search, no data): evaluated near the
	// lines only, every other node certified to lie on its side.
	var ev *margins.MsEvaluator
	linesOnly := wantMs && len(ov.Best) == 0 && !data && overlay.LevelsApply(s)
	if wantMs {
		var err error
		if linesOnly {
			if ev, err = msEvaluator(s); err != nil {
				return nil, err
			}
		} else {
			if o.Sensitivity, err = msOverlay(s); err != nil {
				return nil, err
			}
			o.Exact = refinedMs(s.Plant.Sample, s.Plant.Delay)
		}
	}
	set, finish := opt.stage("overlays", s.Y.N)
	o.Progress = set
	g, err := overlay.Compute(ctx, s, m, o)
	finish()
	if err != nil {
		return nil, err
	}
	if linesOnly {
		if g.Ms, _, err = overlay.MsForLevels(ctx, s, m, ev, ov.MsLevels, opt.Workers); err != nil {
			return nil, err
		}
	}
	res := &Overlays{
		XAxis: g.XAxis, YAxis: g.YAxis,
		Decay:   newLayer(g.XAxis, g.YAxis, g.Decay, ov.DecayLevels),
		Damping: newLayer(g.XAxis, g.YAxis, g.Damping, ov.DampingLevels),
		Ms:      newLayer(g.XAxis, g.YAxis, g.Ms, ov.MsLevels),
	}
	if linesOnly {
		res.Ms.Partial = true
	}
	for k, mk := range ov.Marks {
		p, err := markPoint(s, mk)
		if err != nil {
			return nil, err
		}
		p.Label = string(rune('A' + k%26))
		res.Marks = append(res.Marks, p)
	}
	for _, b := range ov.Best {
		var best overlay.Optimum
		var err error
		switch b {
		case BestDecay:
			best, err = overlay.BestDecay(s, g, o, ov.MsBound)
			if err == nil && ov.MsBound == 0 {
				best.Criterion += "; no Ms bound (--ms-bound sets one)"
			}
		case BestIntegral:
			bound := ov.MsBound
			if bound == 0 {
				bound = defaultKiBound
			}
			best, err = overlay.BestIntegral(s, g, o, bound)
			if err == nil && ov.MsBound == 0 {
				best.Criterion += fmt.Sprintf("; %g is the default bound (--ms-bound sets another)", defaultKiBound)
			}
		}
		var nf *overlay.NotFound
		switch {
		case errors.As(err, &nf):
			nan := export.Number(math.NaN())
			res.Best = append(res.Best, export.Point{Label: "best " + b, Failed: nf.Reason, X: nan, Y: nan, Decay: nan, Damping: nan, Ms: nan, Values: map[string]float64{}})
			continue
		case err != nil:
			return nil, &InputError{Flag: "--best", Key: "overlays.best", Value: b, Err: err}
		}
		p, _ := pointAt(s, best.X, best.Y)
		p.Label, p.Criterion = "best "+b, best.Criterion
		if onWindowEdge(s, best.X, best.Y) {
			p.Warning = "on the edge of the window: the best point may lie outside it; widen the window to see"
		}
		res.Best = append(res.Best, p)
	}
	return res, nil
}

// refinedMs returns Ms as the probe computes it (margins.Loop.Margins
// with the dead time, or SampledLoop.Margins for a loop sampled every
// T > 0), with which the searches check the points they return.
func refinedMs(T, delay float64) overlay.Sensitivity {
	return func(num, den poly.Poly) float64 {
		var m margins.Margins
		var err error
		if T > 0 {
			m, err = margins.SampledLoop{Num: num.Clone(), Den: den.Clone(), T: T}.Margins()
		} else {
			m, err = margins.Loop{Num: num.Clone(), Den: den.Clone(), Delay: delay}.Margins()
		}
		if err != nil {
			return math.NaN()
		}
		return m.Ms
	}
}

// onWindowEdge reports whether (x, y) lies on a side of the window, to
// within a millionth of its spans.
func onWindowEdge(s plane.Setup, x, y float64) bool {
	tx, ty := 1e-6*s.X.Span(), 1e-6*s.Y.Span()
	return x-s.X.Min <= tx || s.X.Max-x <= tx || y-s.Y.Min <= ty || s.Y.Max-y <= ty
}

// msEvaluator returns a fast Ms evaluator whose frequency grid covers the
// loop at the centre of the window.
func msEvaluator(s plane.Setup) (*margins.MsEvaluator, error) {
	centre := s.At(0.5*(s.X.Min+s.X.Max), 0.5*(s.Y.Min+s.Y.Max))
	num, den := centre.Open()
	lo, hi := margins.Loop{Num: num, Den: den}.FrequencyRange()
	if s.Plant.Delay > 0 {
		hi = delayMsTop(s, lo, hi)
	}
	// The plant's own resonances are the same at every node; the grid is
	// enriched around them so that no narrow peak of |S| is missed.
	var roots []complex128
	for _, p := range []poly.Poly{centre.Plant.Num, centre.Plant.Den} {
		if r, err := p.Trim(0).Roots(); err == nil {
			roots = append(roots, r...)
		}
	}
	return margins.NewMsEvaluatorDelay(lo, hi, margins.DefaultMsPerDecade, max(s.OpenNum.Len(), s.OpenDen.Len()), margins.DefaultMsSteps, roots, s.Plant.Delay)
}

// markPoint places a mark in the plane: it must give both axis
// parameters, and may repeat the map's value of another parameter, but
// not give it another value, for then the point would not lie on the
// plane drawn.
func markPoint(s plane.Setup, vals []spec.Value) (export.Point, error) {
	x, y := math.NaN(), math.NaN()
	for _, v := range vals {
		text := v.Param + "=" + formatAll([]float64{v.V})[0]
		i, err := family.Index(s.Family, v.Param)
		if err != nil {
			return export.Point{}, &InputError{Flag: "--mark", Key: "overlays.marks", Value: text, Err: err}
		}
		switch i {
		case s.XIndex:
			x = v.V
		case s.YIndex:
			y = v.V
		default:
			if v.V != s.Values[i] {
				return export.Point{}, inputErr("--mark", "overlays.marks", valuesList(vals),
					"the map is drawn at %s = %g, the mark at %s; a mark lies on the map's plane (leave %s out, or map at that value)", v.Param, s.Values[i], text, v.Param)
			}
		}
	}
	if math.IsNaN(x) || math.IsNaN(y) {
		return export.Point{}, inputErr("--mark", "overlays.marks", valuesList(vals), "give both %s and %s", s.X.Param, s.Y.Param)
	}
	return pointAt(s, x, y)
}

// pointAt describes the loop at (x, y) of the plane.
func pointAt(s plane.Setup, x, y float64) (export.Point, error) {
	l := s.At(x, y)
	p := export.Point{Values: valueMap(l), X: export.Number(x), Y: export.Number(y)}
	var pr export.Probe
	if err := probePoles(&pr, l, l.Function()); err != nil {
		return p, err
	}
	p.Decay, p.Damping = pr.DecayRate, pr.MinDamping
	p.Stable = pr.DecayRate > 0
	mg, err := loopMargins(l)
	p.Ms = export.Number(math.NaN())
	if err == nil && p.Stable {
		p.Ms = export.Number(mg.Ms)
	}
	return p, nil
}

// valuesList writes values as --mark takes them.
func valuesList(vals []spec.Value) string {
	parts := make([]string, len(vals))
	for i, v := range vals {
		parts[i] = v.Param + "=" + formatAll([]float64{v.V})[0]
	}
	return strings.Join(parts, ",")
}

// data returns the overlays as they are written to --data.
func (o *Overlays) data() *export.Extra {
	layer := func(l *Layer) *export.Layer {
		if l == nil {
			return nil
		}
		out := &export.Layer{Contours: []export.Contour{}, Levels: l.Levels, Values: export.Grid{NX: o.XAxis.N, NY: o.YAxis.N, V: l.Values}}
		if out.Levels == nil {
			out.Levels = []float64{}
		}
		for k, level := range l.Levels {
			lines := l.Lines[k]
			if lines == nil {
				lines = []isoline.Line{}
			}
			out.Contours = append(out.Contours, export.Contour{Level: level, Lines: lines})
		}
		return out
	}
	ex := &export.Extra{Best: o.Best, Marks: o.Marks, Overlays: export.Overlays{
		DecayRate: layer(o.Decay), MinDamping: layer(o.Damping), Ms: layer(o.Ms),
	}}
	if ex.Best == nil {
		ex.Best = []export.Point{}
	}
	if ex.Marks == nil {
		ex.Marks = []export.Point{}
	}
	return ex
}
