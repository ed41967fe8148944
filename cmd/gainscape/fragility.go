package main

import (
	"context"
	"fmt"
	"io"
	"math"

	"gainscape/regions/boundary"
	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/overlay"
	"gainscape/regions/plane"
)

// fragilityReport is the distance from a design point to the nearest
// stability edge in a plane of two parameters.
type fragilityReport struct {
	X, Y string `json:"-"`
	// Plane names the two parameters, e.g. ["kp", "ki"].
	Plane [2]string `json:"plane"`
	// Window is [xmin, xmax, ymin, ymax] of the map searched.
	Window [4]float64 `json:"window"`
	// Found is false when no edge lies in the window.
	Found    bool         `json:"found"`
	Absolute *nearestEdge `json:"absolute,omitempty"`
	Relative *nearestEdge `json:"relative,omitempty"`
}

type nearestEdge struct {
	Distance float64    `json:"distance"`
	Point    [2]float64 `json:"point"`
	Kind     string     `json:"kind"`
	Omega    *float64   `json:"omega"`
}

// fragilityWindowSize is how far the searched window reaches on each side
// of the design point, as a multiple of the larger of |value| and 1: a
// little more than the value itself, so that a boundary where a gain
// passes through zero lies inside the window, not on its edge.
const fragilityWindowSize = 1.25

// fragility maps a window around the design point in the plane of the
// named parameters (default: the family's first two) and measures the
// distance to the nearest edge. A family with one parameter has no plane.
func fragility(ctx context.Context, loop plane.Loop, xName, yName string) (*fragilityReport, error) {
	params := loop.Family.Params()
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
	xi, err := family.Index(loop.Family, xName)
	if err != nil {
		return nil, userErr("--x %q: %v", xName, err)
	}
	yi, err := family.Index(loop.Family, yName)
	if err != nil {
		return nil, userErr("--y %q: %v", yName, err)
	}
	x, y := loop.Values[xi], loop.Values[yi]
	around := func(v float64) (float64, float64) {
		r := fragilityWindowSize * math.Max(math.Abs(v), 1)
		return v - r, v + r
	}
	x0, x1 := around(x)
	y0, y1 := around(y)
	s, err := plane.NewSetup(loop, plane.Axis{Param: xName, Min: x0, Max: x1, N: 161}, plane.Axis{Param: yName, Min: y0, Max: y1, N: 161})
	if err != nil {
		return nil, userErr("--x/--y: %v", err)
	}
	m, err := grid.Evaluate(ctx, s, grid.Options{})
	if err != nil {
		return nil, err
	}
	curves, err := boundary.Trace(ctx, s, m, 0)
	if err != nil {
		return nil, err
	}
	rep := &fragilityReport{X: xName, Y: yName, Plane: [2]string{xName, yName}, Window: [4]float64{x0, x1, y0, y1}}
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
	conv := func(n overlay.Nearest) *nearestEdge {
		pt := [2]float64{snap(n.X, x1-x0), snap(n.Y, y1-y0)}
		return &nearestEdge{Distance: n.Distance, Point: pt, Kind: string(n.Kind), Omega: nullable(n.Omega)}
	}
	rep.Found, rep.Absolute, rep.Relative = true, conv(cl.Absolute), conv(cl.Relative)
	return rep, nil
}

func nullable(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// printFragility writes the fragility lines of the probe report.
func printFragility(w io.Writer, fr *fragilityReport) {
	if !fr.Found {
		fmt.Fprintf(w, "nearest edge none in the %s–%s window %s %.4g…%.4g, %s %.4g…%.4g\n",
			fr.X, fr.Y, fr.X, fr.Window[0], fr.Window[1], fr.Y, fr.Window[2], fr.Window[3])
		return
	}
	edge := func(n *nearestEdge) string {
		switch n.Kind {
		case string(boundary.Complex):
			return fmt.Sprintf("a complex pair crosses at ω = %.4g rad/s", *n.Omega)
		case string(boundary.Real):
			return "a real root crosses through s = 0"
		}
		return "a root passes through infinity"
	}
	a, r := fr.Absolute, fr.Relative
	fmt.Fprintf(w, "nearest edge in the %s–%s plane: %.4g away at (%s, %s) = (%.4g, %.4g), where %s\n",
		fr.X, fr.Y, a.Distance, fr.X, fr.Y, a.Point[0], a.Point[1], edge(a))
	fmt.Fprintf(w, "             relative to the gains: %.3g%% away at (%.4g, %.4g), where %s\n",
		100*r.Distance, r.Point[0], r.Point[1], edge(r))
}
