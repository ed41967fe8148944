package study

import (
	"context"
	"math"

	"gainscape/regions/boundary"
	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/loop"
	"gainscape/regions/overlay"
	"gainscape/regions/plane"
)

// fragilityWindowSize is how far the searched window reaches on each side
// of the design point, as a multiple of the larger of |value| and 1: a
// little more than the value itself, so that a boundary where a gain
// passes through zero lies inside the window, not on its edge.
const fragilityWindowSize = 1.25

// fragilityNodes is the grid size of the window searched, per axis.
const fragilityNodes = 161

// fragility maps a window around the design point in the plane of the
// named parameters (default: the family's first two) and measures the
// distance to the nearest edge. A family with one parameter has no plane:
// it returns nil.
func fragility(ctx context.Context, l loop.Loop, xName, yName string) (*export.Fragility, error) {
	params := l.Family.Params()
	if len(params) < 2 {
		return nil, nil
	}
	if xName == "" {
		xName = params[0].Name
	}
	if yName == "" {
		yName = params[1].Name
		if yName == xName {
			yName = params[0].Name
		}
	}
	xi, err := family.Index(l.Family, xName)
	if err != nil {
		return nil, &InputError{Flag: "--x", Value: `"` + xName + `"`, Err: err}
	}
	yi, err := family.Index(l.Family, yName)
	if err != nil {
		return nil, &InputError{Flag: "--y", Value: `"` + yName + `"`, Err: err}
	}
	x, y := l.Values[xi], l.Values[yi]
	around := func(v float64) (float64, float64) {
		r := fragilityWindowSize * math.Max(math.Abs(v), 1)
		return v - r, v + r
	}
	x0, x1 := around(x)
	y0, y1 := around(y)
	s, err := plane.NewSetup(l, plane.Axis{Param: xName, Min: x0, Max: x1, N: fragilityNodes}, plane.Axis{Param: yName, Min: y0, Max: y1, N: fragilityNodes})
	if err != nil {
		return nil, inputErr("--x/--y", "", "", "%v", err)
	}
	m, err := grid.Evaluate(ctx, s, grid.Options{})
	if err != nil {
		return nil, err
	}
	curves, err := boundary.Trace(ctx, s, m, 0)
	if err != nil {
		return nil, err
	}
	rep := &export.Fragility{Plane: [2]string{xName, yName}, Window: [4]float64{x0, x1, y0, y1}}
	if len(curves) == 0 {
		return rep, nil
	}
	cl, err := overlay.Fragility(s, x, y, curves)
	if err != nil {
		return nil, err
	}
	// Bisection leaves rounding-sized residues where the edge lies on a
	// whole value such as ki = 0; they are set to that value for reports.
	snap := func(v, span float64) float64 {
		if r := math.Round(v); math.Abs(v-r) <= 1e-9*span {
			return r
		}
		return v
	}
	conv := func(n overlay.Nearest) *export.NearestEdge {
		pt := [2]float64{snap(n.X, x1-x0), snap(n.Y, y1-y0)}
		return &export.NearestEdge{Distance: n.Distance, Point: pt, Kind: n.Kind, Omega: export.Number(n.Omega)}
	}
	rep.Found, rep.Absolute, rep.Relative = true, conv(cl.Absolute), conv(cl.Relative)
	return rep, nil
}
