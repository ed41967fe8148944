package study

import (
	"context"

	"gainscape/regions/boundary"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
)

// EdgeReport says how the edges of a map were found and how the grid
// agreed with them.
type EdgeReport struct {
	// Method is boundary.Swept where the D-partition curves traced in ω
	// give the edges, boundary.Bisected where they cannot be traced (a
	// sampled-data loop, or a characteristic function the tracer
	// refuses) and grid crossings are refined by bisection.
	Method boundary.Method
	// Unexplained is the number of grid edges whose change of count no
	// traced curve explains, or whose traced crossing the counts do not
	// show (boundary.Footprint.Check); 0 for bisected edges, which come
	// from the counts themselves.
	Unexplained int
	// Certified reports whether nodes were filled from certified cells
	// rather than all evaluated; Conflicts counts the regions of
	// certified cells whose evaluated nodes disagreed, and which were
	// therefore evaluated in full.
	Certified bool
	Conflicts int
}

// mapAndEdges computes the counts of the map and its edges: from the
// frequency sweep where it applies, the grid's counts then labelling the
// regions between the curves and checked against them, with only the
// nodes near the curves and a sparse lattice evaluated when the axis
// parameters enter affinely and the loop is rational; otherwise every
// node is evaluated and the edges are bisected from the grid.
func mapAndEdges(ctx context.Context, s plane.Setup, opt Options) (*grid.Map, []boundary.Curve, EdgeReport, error) {
	sw, ok, err := boundary.TraceSweep(ctx, s)
	if err != nil {
		return nil, nil, EdgeReport{}, err
	}
	set, finish := opt.stage("mapping", s.Y.N)
	gopt := grid.Options{Workers: opt.Workers, Progress: set}
	if !ok {
		m, err := grid.Evaluate(ctx, s, gopt)
		finish()
		if err != nil {
			return nil, nil, EdgeReport{}, err
		}
		curves, err := boundary.Trace(ctx, s, m, opt.Workers)
		return m, curves, EdgeReport{Method: boundary.Bisected}, err
	}
	rep := EdgeReport{Method: boundary.Swept}
	fp := sw.Footprint(s.X, s.Y)
	var m *grid.Map
	if boundary.Affine(s) && s.Plant.Delay == 0 && s.X.N >= 2 && s.Y.N >= 2 {
		rep.Certified = true
		m, rep.Conflicts, err = grid.EvaluateCertified(ctx, s, fp.Touched, gopt)
	} else {
		m, err = grid.Evaluate(ctx, s, gopt)
	}
	finish()
	if err != nil {
		return nil, nil, EdgeReport{}, err
	}
	rep.Unexplained = fp.Check(m)
	return m, sw.Curves, rep, nil
}
