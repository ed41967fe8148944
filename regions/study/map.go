package study

import (
	"context"
	"fmt"
	"math"

	"gainscape/regions/boundary"
	"gainscape/regions/export"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/scenario"
	"gainscape/regions/stability"
)

// MapJob is a map ready to compute: the loop in the plane of the two
// axis parameters, checked, with its characteristic function built.
type MapJob struct {
	sc    scenario.Scenario
	setup plane.Setup
	plant string
	units Units
	// spec is the loop as given; sampled its sampling, nil for a
	// continuous-time loop.
	spec    LoopSpec
	sampled *Sampling
}

// NewMap checks a validated scenario and builds its loop and plane. Errors
// are *InputError values.
func NewMap(sc scenario.Scenario) (*MapJob, error) {
	ls := mapLoopSpec(sc)
	l, err := ls.Build()
	if err != nil {
		return nil, err
	}
	x := plane.Axis{Param: sc.Axes.X.Param, Min: sc.Axes.X.Min, Max: sc.Axes.X.Max, N: sc.Axes.Columns}
	y := plane.Axis{Param: sc.Axes.Y.Param, Min: sc.Axes.Y.Min, Max: sc.Axes.Y.Max, N: sc.Axes.Rows}
	s, err := plane.NewSetup(l, x, y)
	if err != nil {
		return nil, inputErr("--x", "axes.x", axisText(x)+" --y "+axisText(y), "%v", err)
	}
	return &MapJob{sc: sc, setup: s, plant: ls.PlantText(), units: Units{ls.TimeUnit}, spec: ls, sampled: sampledOf(l, ls)}, nil
}

// mapLoopSpec is the loop of a map scenario.
func mapLoopSpec(sc scenario.Scenario) LoopSpec {
	return LoopSpec{Plant: sc.Loop.Plant, Num: sc.Loop.Numerator, Den: sc.Loop.Denominator, Controller: sc.Loop.Controller, Fixed: sc.Fixed, TimeUnit: sc.Loop.TimeUnit,
		Sample: sc.Loop.Sample, Integral: sc.Loop.Integral, Prewarp: sc.Loop.Prewarp}
}

func axisText(a plane.Axis) string { return fmt.Sprintf("%s=%g:%g", a.Param, a.Min, a.Max) }

// Warnings returns warnings about the map to show before it is computed:
// characteristic coefficients at the window's corners that span so many
// decades that products in the sign array approach the limits of double
// precision, where nodes it cannot decide are reported as undecided
// rather than guessed.
func (j *MapJob) Warnings() []string {
	s := j.setup
	lo, hi := math.Inf(1), 0.0
	for _, x := range []float64{s.X.Min, s.X.Max} {
		for _, y := range []float64{s.Y.Min, s.Y.Max} {
			for _, c := range s.Char.Eval(x, y) {
				if a := math.Abs(c); a != 0 {
					lo, hi = math.Min(lo, a), math.Max(hi, a)
				}
			}
		}
	}
	if j.sc.Loop.Pade > 0 && s.Plant.Delay == 0 {
		return []string{fmt.Sprintf("warning: --pade %d has no effect: the plant has no dead time", j.sc.Loop.Pade)}
	}
	if hi > 1e100 || lo < 1e-100 || hi/lo > 1e150 {
		return []string{fmt.Sprintf("warning: characteristic coefficients range from %.3g to %.3g; the sign array may lose meaning, and nodes it cannot decide are marked undecided — consider rescaling time (s) or gains", lo, hi)}
	}
	return nil
}

// MapResult is everything computed for one map.
type MapResult struct {
	// Plant is the plant as the user gave it; Controller the family name
	// and Formula its transfer function.
	Plant, Controller, Formula string
	// Fixed lists the parameters that are not axes, in family order.
	Fixed []Value
	// X and Y are the axes.
	X, Y plane.Axis
	// Map holds the right-half-plane count at every node.
	Map *grid.Map
	// Curves are the edges of the regions, refined.
	Curves []boundary.Curve
	// Stats summarises the map.
	Stats grid.Stats
	// Edges counts the edge curves of each kind, of two points or more.
	Edges map[stability.Kind]int
	// EdgeReport says how the edges were found and checked.
	EdgeReport EdgeReport
	// Overlays is nil when none was asked for.
	Overlays *Overlays
	// Units labels frequencies, decay rates and periods.
	Units Units
	// Sampled describes the sampling of a sampled-data loop; nil for a
	// continuous-time one.
	Sampled *Sampling
	// Compare holds the edges of the same window at other sample times,
	// when the scenario asks for them (see compareSamples).
	Compare []SampleEdges
	// Delay is the loop's dead time, 0 for none. A map of a loop with dead
	// time also has, for each curve, the D-partition branch of each of its
	// points (Branches, see branchesOf), the number of nodes of neutral
	// type with infinitely many unstable roots (NeutralNodes), the check
	// of its counts by a second method (Confirmation) and the comparison
	// with the map of its Padé-approximated loop (Pade).
	Delay        float64
	Branches     [][]int
	NeutralNodes int
	Confirmation *export.Confirmation
	Pade         *export.PadeMap
}

// Run computes the map, its edges and the overlays the scenario asks for.
// It returns ctx.Err() if cancelled.
func (j *MapJob) Run(ctx context.Context, opt Options) (*MapResult, error) {
	s := j.setup
	m, curves, rep, err := mapAndEdges(ctx, s, opt)
	if err != nil {
		return nil, err
	}
	res := &MapResult{
		Plant: j.plant, Controller: s.Family.Name(), Formula: s.Family.Formula(),
		Fixed: valuesOf(s.Loop, s.XIndex, s.YIndex), X: s.X, Y: s.Y,
		Map: m, Curves: curves, Stats: m.Stats(), Edges: map[stability.Kind]int{}, EdgeReport: rep, Units: j.units, Sampled: j.sampled,
	}
	for _, c := range curves {
		// A crossing no other joins is a point, not an edge.
		if len(c.Points) > 1 {
			res.Edges[c.Kind]++
		}
	}
	if s.Plant.Delay > 0 {
		if err := res.deadTime(ctx, s, j.sc.Loop.Pade, opt); err != nil {
			return nil, err
		}
	}
	if res.Overlays, err = computeOverlays(ctx, s, m, j.sc.Overlays, j.sc.Output.Data != "", opt); err != nil {
		return nil, err
	}
	if res.Compare, err = j.compareSamples(ctx, opt); err != nil {
		return nil, err
	}
	return res, nil
}

// OmegaRange returns the smallest and largest finite ω on complex-root
// edges.
func (r *MapResult) OmegaRange() (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, c := range r.Curves {
		if c.Kind != stability.Complex {
			continue
		}
		for _, p := range c.Points {
			if !math.IsNaN(p.Omega) && !math.IsInf(p.Omega, 0) {
				lo, hi, ok = math.Min(lo, p.Omega), math.Max(hi, p.Omega), true
			}
		}
	}
	return lo, hi, ok
}

// Data returns the --data document of the map.
func (r *MapResult) Data() *export.Region {
	doc := &export.Region{
		Plant: r.Plant, Controller: r.Controller, TimeUnit: r.Units.Key(), Fixed: map[string]float64{},
		X: r.X, Y: r.Y, RHP: export.Counts{NX: r.X.N, NY: r.Y.N, V: r.Map.RHP}, Axis: export.Counts{NX: r.X.N, NY: r.Y.N, V: r.Map.Axis},
		Boundaries: []export.Boundary{},
	}
	for _, v := range r.Fixed {
		doc.Fixed[v.Name] = v.Value
	}
	if r.Sampled != nil {
		doc.SampleTime, doc.Integral = r.Sampled.T, r.Sampled.Integral
	}
	doc.Compare = compareData(r.Compare)
	doc.Boundaries = boundaries(r.Curves)
	for i, c := range r.Curves {
		if r.Branches != nil && c.Kind == stability.Complex {
			doc.Boundaries[i].Branches = r.Branches[i]
		}
	}
	st := r.Stats
	doc.Summary = export.Summary{Nodes: st.Nodes, StableNodes: st.Stable, MarginalNodes: st.Marginal, UndecidedNodes: st.Undecided, StableFraction: st.StableFraction(),
		EvaluatedNodes: r.Map.Evaluated, EdgeMethod: string(r.EdgeReport.Method)}
	if r.EdgeReport.Method == boundary.Swept {
		doc.Summary.EdgeCheck = &r.EdgeReport.Unexplained
	}
	if st.Stable > 0 {
		doc.Summary.StableBox = &[4]float64{st.XMin, st.XMax, st.YMin, st.YMax}
	}
	if lo, hi, ok := r.OmegaRange(); ok {
		doc.Summary.OmegaRange = &[2]float64{lo, hi}
	}
	if r.Overlays != nil {
		doc.Extra = r.Overlays.data()
	}
	doc.Delay, doc.Pade, doc.Confirmation, doc.Summary.NeutralNodes = r.Delay, r.Pade, r.Confirmation, r.NeutralNodes
	return doc
}
