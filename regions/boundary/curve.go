// Package boundary finds the edges of the regions of a stability map to
// full precision as curves, each point carrying the frequency at which
// the loop oscillates there: from the D-partition traced in ω
// (TraceSweep), checked against the map's counts (Footprint.Check), or,
// where the sweep does not apply, by bisecting the grid edges whose
// counts differ and joining the crossings (Trace).
package boundary

import "gainscape/regions/stability"

// Point is one refined boundary point in the parameter plane and the
// frequency of the boundary roots there (0 for Real, NaN for Infinite).
type Point struct {
	X, Y, Omega float64
}

// Curve is a polyline of boundary points of one kind.
type Curve struct {
	Kind   stability.Kind
	Points []Point
}
