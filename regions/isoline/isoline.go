// Package isoline traces the lines on which a field sampled on a grid of
// two parameters takes a given value, such as the contours of the decay
// rate inside the stable region.
//
// The fields have no value (NaN) outside the stable region, so a cell
// with a missing corner must yield no line at all, and callers that label
// or export the lines need them as joined polylines rather than as loose
// segments; both are reasons to trace here instead of in a plotting
// library.
package isoline

import (
	"fmt"
	"math"

	"gainscape/regions/plane"
)

// Line is one iso-line polyline, points (x, y) in parameter units. A
// closed line ends with the point it starts with.
type Line [][2]float64

// Trace returns the iso-lines of values at level.
//
// values is row-major like grid.Map: values[j*x.N+i] belongs to the node
// (x.At(i), y.At(j)). NaN, and likewise ±Inf, means no value there; a
// cell with such a corner yields no line, so lines stop at the edge of
// the valued area.
//
// The method is marching squares (Segments): a node is above the level
// when its value is ≥ level, every cell edge between an above and a below
// node is crossed at the point found by linear interpolation of the two
// node values, and each cell joins its crossings by straight segments. A
// cell crossed on all four edges is a saddle; it is resolved by the mean
// of its four corners, which decides whether the two above corners or the
// two below corners are connected through the centre. Segments sharing a
// crossing are then chained into polylines (Chain).
//
// Limits: within a cell the line is straight, so a curved iso-line is
// cut by its chords and a feature smaller than a cell may be missed or
// misjoined. Where the field is linear along the cell edges the crossings
// are exact up to rounding. A level met exactly at a node puts a crossing
// on that node, possibly twice in a row.
//
// The result depends only on the arguments. Crossings are numbered in the
// order they are met when scanning the cells row by row from (x.At(0),
// y.At(0)), x fastest; lines come in the order of Chain, and a closed line
// ends with the point it starts with.
//
// Trace panics if len(values) is not x.N·y.N.
func Trace(x, y plane.Axis, values []float64, level float64) []Line {
	if x.N < 0 || y.N < 0 || len(values) != x.N*y.N {
		panic(fmt.Sprintf("isoline: %d values for a %d × %d grid", len(values), x.N, y.N))
	}
	z := func(i, j int) float64 { return values[j*x.N+i] }
	valued := func(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
	// side[k] is 0 without a value, 1 below the level, 2 at or above it:
	// a cell is looked at only when its corners are valued and not all on
	// one side, the only cells a line can cross.
	side := make([]uint8, len(values))
	for k, v := range values {
		switch {
		case !valued(v):
		case v >= level:
			side[k] = 2
		default:
			side[k] = 1
		}
	}
	inCell := func(i, j int) bool {
		k := j*x.N + i
		a, b, c, d := side[k], side[k+1], side[k+x.N], side[k+x.N+1]
		return a != 0 && b != 0 && c != 0 && d != 0 && !(a == b && a == c && a == d)
	}
	index := map[int]int{} // edge 2·node, or 2·node+1 for the edge above it → crossing
	var points [][2]float64
	crossing := func(i, j int, horiz bool) int {
		i1, j1, id := i, j+1, 2*(j*x.N+i)+1
		if horiz {
			i1, j1, id = i+1, j, 2*(j*x.N+i)
		}
		z0, z1 := z(i, j), z(i1, j1)
		if (z0 >= level) == (z1 >= level) {
			return -1
		}
		if k, ok := index[id]; ok {
			return k
		}
		s := (level - z0) / (z1 - z0)
		x0, x1 := x.At(i), x.At(i1)
		y0, y1 := y.At(j), y.At(j1)
		index[id] = len(points)
		points = append(points, [2]float64{x0 + s*(x1-x0), y0 + s*(y1-y0)})
		return len(points) - 1
	}
	// A saddle joins the corners that agree with the centre, the mean of
	// the four corners.
	saddle := func(i, j int, at [4]int) [][2]int {
		centreAbove := (z(i, j)+z(i+1, j)+z(i+1, j+1)+z(i, j+1))/4 >= level
		if centreAbove == (z(i, j) >= level) {
			return Saddle(at, JoinDiagonal)
		}
		return Saddle(at, CutDiagonal)
	}
	segs := Segments(x.N, y.N, inCell, crossing, saddle)
	var lines []Line
	for _, ch := range Chain(len(points), segs) {
		line := make(Line, len(ch))
		for k, c := range ch {
			line[k] = points[c]
		}
		lines = append(lines, line)
	}
	return lines
}
