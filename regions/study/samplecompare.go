package study

import (
	"context"
	"fmt"
	"math"
	"slices"
	"strings"

	"gainscape/regions/boundary"
	"gainscape/regions/export"
	"gainscape/regions/expr"
	"gainscape/regions/grid"
	"gainscape/regions/intervals"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
)

// SampleEdges are the stability edges of a map's window when the same
// plant and controller structure are sampled every T (0: the continuous
// loop), to be drawn over the map, with the gain limit along its x axis.
type SampleEdges struct {
	T      float64
	Curves []boundary.Curve
	// Limits are the stable intervals of the x parameter at y = LimitY:
	// the window's lowest y, or, where the loop is marginal along that
	// whole row (a PI controller at ki = 0 has its integrator's root at
	// z = 1 or s = 0), the row just above it (Above set), which is the
	// limit of the stable region as y falls to the lowest y.
	Limits []intervals.Interval
	LimitY float64
	Above  bool
	// Own marks the map's own loop, listed for its gain limit; its edges
	// are the map's, so Curves is nil.
	Own bool
}

// Label names the set in legends and summaries: "T = 0.2 s" or
// "continuous".
func (e SampleEdges) Label(u Units) string {
	if e.T == 0 {
		return "continuous"
	}
	return fmt.Sprintf("T = %g %s", e.T, u.TimeLabel())
}

// LimitText says where the stable range along x ends, for summaries:
// "kp < 2.392 (a pair crosses at ω = 1.324 rad/s)".
func (e SampleEdges) LimitText(x string, u Units) string {
	if len(e.Limits) == 0 {
		return "no stable " + x + " in the window"
	}
	parts := make([]string, len(e.Limits))
	for i, iv := range e.Limits {
		hi := fmt.Sprintf("%.6g", iv.Hi)
		if iv.HiKind == intervals.Window {
			hi += " (the window's side)"
		} else {
			hi += " (" + limitKindText(iv.HiKind.String(), iv.HiOmega, e.T, u) + ")"
		}
		parts[i] = fmt.Sprintf("%.6g < %s < %s", iv.Lo, x, hi)
	}
	return strings.Join(parts, "; ")
}

// limitKindText names the crossing at an upper gain limit in a few words.
func limitKindText(kind string, omega, T float64, u Units) string {
	switch kind {
	case "complex":
		return fmt.Sprintf("a pair crosses at ω = %.4g %s", omega, u.Freq())
	case "alternating":
		return "a real root crosses at z = −1"
	case "real":
		if T > 0 {
			return "a real root crosses at z = 1"
		}
		return "a real root crosses at s = 0"
	}
	return "a root passes through infinity"
}

// compareSamples maps the window again for every sample time the
// scenario lists, and for the continuous loop when the map itself is
// sampled; it returns them by descending T, the continuous loop last, the
// map's own loop among them with its gain limit only (Own). Each is a map
// of its own: the same grid, the same bisection of edges.
func (j *MapJob) compareSamples(ctx context.Context, opt Options) ([]SampleEdges, error) {
	ts := slices.Clone(j.sc.Overlays.CompareSamples)
	if len(ts) == 0 {
		return nil, nil
	}
	if j.spec.Plant != "" {
		if _, err := expr.ParsePlant(j.spec.Plant); err != nil {
			return nil, inputErr("--compare-samples", "overlays.compare_samples", strings.Join(formatAll(ts), ","),
				"a comparison needs the plant in s: a plant given in z holds for its own sample time only")
		}
	}
	own := j.setup.Plant.Sample
	ts = append(ts, 0, own)
	slices.Sort(ts)
	slices.Reverse(ts)
	ts = slices.Compact(ts)
	var out []SampleEdges
	for _, T := range ts {
		if T == own {
			e := SampleEdges{T: T, Own: true}
			var err error
			if e.Limits, e.LimitY, e.Above, err = gainLimit(j.setup.Loop, j.setup); err != nil {
				return nil, err
			}
			out = append(out, e)
			continue
		}
		e, err := j.edgesAt(ctx, T, opt)
		if err != nil {
			return nil, err
		}
		out = append(out, e)
	}
	return out, nil
}

// edgesAt maps the window with the loop sampled every T (0: continuous).
func (j *MapJob) edgesAt(ctx context.Context, T float64, opt Options) (SampleEdges, error) {
	ls := j.spec
	ls.Sample = T
	if T == 0 {
		ls.Integral, ls.Prewarp = "", 0
	}
	l, err := ls.Build()
	if err != nil {
		return SampleEdges{}, inputErr("--compare-samples", "overlays.compare_samples", strings.Join(formatAll(j.sc.Overlays.CompareSamples), ","), "the loop sampled every %g: %v", T, err)
	}
	s := j.setup
	setup, err := plane.NewSetup(l, s.X, s.Y)
	if err != nil {
		return SampleEdges{}, err
	}
	set, finish := opt.stage(fmt.Sprintf("comparing T = %g", T), s.Y.N)
	m, err := grid.Evaluate(ctx, setup, grid.Options{Workers: opt.Workers, Progress: set})
	finish()
	if err != nil {
		return SampleEdges{}, err
	}
	curves, err := boundary.Trace(ctx, setup, m, opt.Workers)
	if err != nil {
		return SampleEdges{}, err
	}
	e := SampleEdges{T: T, Curves: curves}
	e.Limits, e.LimitY, e.Above, err = gainLimit(l, s)
	return e, err
}

// aboveLowest is how far above the window's lowest y, relative to its
// height, the gain limit is taken where the lowest row is marginal.
const aboveLowest = 1e-9

// gainLimit returns the stable intervals of the x parameter of s's window
// at its lowest y, or just above it where there are none there. Just
// above, the ends move with y by about aboveLowest of the spans, so an
// end within a millionth of the x span of zero is the limit zero (a PI
// loop's lower end kp > 0 as ki falls to 0, found at 1e-9).
func gainLimit(l loop.Loop, s plane.Setup) ([]intervals.Interval, float64, bool, error) {
	y := s.Y.Min
	for _, above := range []bool{false, true} {
		if above {
			y = s.Y.Min + aboveLowest*s.Y.Span()
		}
		ivs, err := intervals.Stable(l.Set(s.YIndex, y), s.XIndex, s.X.Min, s.X.Max)
		if err != nil {
			return nil, y, above, err
		}
		if len(ivs) == 0 {
			continue
		}
		if above {
			snap := func(v float64) float64 {
				if math.Abs(v) <= 1e-6*s.X.Span() {
					return 0
				}
				return v
			}
			for i := range ivs {
				ivs[i].Lo, ivs[i].Hi = snap(ivs[i].Lo), snap(ivs[i].Hi)
			}
		}
		return ivs, y, above, nil
	}
	return nil, s.Y.Min, false, nil
}

// compareData returns the compared edges as the --data document writes
// them.
func compareData(es []SampleEdges) []export.SampleEdges {
	var out []export.SampleEdges
	for _, e := range es {
		d := export.SampleEdges{SampleTime: e.T, Boundaries: boundaries(e.Curves), LimitY: e.LimitY, Above: e.Above, Own: e.Own}
		for _, iv := range e.Limits {
			d.Limits = append(d.Limits, export.Interval{Lo: iv.Lo, Hi: iv.Hi, LoKind: endKind(iv.LoKind), HiKind: endKind(iv.HiKind),
				LoOmega: export.Number(iv.LoOmega), HiOmega: export.Number(iv.HiOmega)})
		}
		if d.Limits == nil {
			d.Limits = []export.Interval{}
		}
		out = append(out, d)
	}
	return out
}

// boundaries writes edge curves as the --data document does.
func boundaries(cs []boundary.Curve) []export.Boundary {
	out := []export.Boundary{}
	for _, c := range cs {
		b := export.Boundary{Kind: c.Kind, Points: make([][3]export.Number, len(c.Points))}
		for k, p := range c.Points {
			b.Points[k] = [3]export.Number{export.Number(p.X), export.Number(p.Y), export.Number(p.Omega)}
		}
		out = append(out, b)
	}
	return out
}
