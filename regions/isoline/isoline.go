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
// The method is marching squares, the two-dimensional form of marching
// cubes (W. E. Lorensen and H. E. Cline, "Marching cubes: a high
// resolution 3D surface construction algorithm", SIGGRAPH 1987): a node
// is above the level when its value is ≥ level, every cell edge between
// an above and a below node is crossed at the point found by linear
// interpolation of the two node values, and each cell joins its crossings
// by straight segments. A cell crossed on all four edges is a saddle; it
// is resolved by the mean of its four corners, which decides whether the
// two above corners or the two below corners are connected through the
// centre. Segments sharing a crossing are then chained into polylines.
//
// Limits: within a cell the line is straight, so a curved iso-line is
// cut by its chords and a feature smaller than a cell may be missed or
// misjoined. Where the field is linear along the cell edges the crossings
// are exact up to rounding. A level met exactly at a node puts a crossing
// on that node, possibly twice in a row.
//
// The result depends only on the arguments. Lines come in the order in
// which their lowest cell is met when scanning the cells row by row from
// (x.At(0), y.At(0)), x fastest; a closed line starts at a crossing of
// that cell.
//
// Trace panics if len(values) is not x.N·y.N.
func Trace(x, y plane.Axis, values []float64, level float64) []Line {
	if x.N < 0 || y.N < 0 || len(values) != x.N*y.N {
		panic(fmt.Sprintf("isoline: %d values for a %d × %d grid", len(values), x.N, y.N))
	}
	t := tracer{x: x, y: y, values: values, level: level, index: map[int]int{}}
	for j := 0; j+1 < y.N; j++ {
		for i := 0; i+1 < x.N; i++ {
			t.cell(i, j)
		}
	}
	return t.join()
}

// tracer holds the crossings and segments found so far.
type tracer struct {
	x, y   plane.Axis
	values []float64
	level  float64
	// index maps an edge to its crossing in crossings. Edges are numbered
	// 2·node for the edge to the right of a node and 2·node+1 for the edge
	// above it, with node = j·x.N + i. The map is only looked up, never
	// ranged over, so it does not make the output depend on map order.
	index     map[int]int
	crossings []crossing
	segments  [][2]int // pairs of indices into crossings, in cell scan order
}

// crossing is the point where the line crosses one grid edge, with the
// at most two segments that end there: an edge borders two cells, and
// each cell puts at most one segment end on it.
type crossing struct {
	at       [2]float64
	segments [2]int // -1 when absent
}

// z returns the value at node (i, j).
func (t *tracer) z(i, j int) float64 { return t.values[j*t.x.N+i] }

// cross returns the index of the crossing on the edge from node (i0, j0)
// to node (i1, j1), the second to the right of or above the first,
// creating it on first use.
func (t *tracer) cross(i0, j0, i1, j1 int) int {
	id := 2 * (j0*t.x.N + i0)
	if j1 != j0 {
		id++
	}
	if k, ok := t.index[id]; ok {
		return k
	}
	z0, z1 := t.z(i0, j0), t.z(i1, j1)
	s := (t.level - z0) / (z1 - z0)
	x0, x1 := t.x.At(i0), t.x.At(i1)
	y0, y1 := t.y.At(j0), t.y.At(j1)
	k := len(t.crossings)
	t.crossings = append(t.crossings, crossing{
		at:       [2]float64{x0 + s*(x1-x0), y0 + s*(y1-y0)},
		segments: [2]int{-1, -1},
	})
	t.index[id] = k
	return k
}

// cell adds the segments of the cell whose lower-left node is (i, j).
func (t *tracer) cell(i, j int) {
	// Corners counter-clockwise from the lower left.
	z := [4]float64{t.z(i, j), t.z(i+1, j), t.z(i+1, j+1), t.z(i, j+1)}
	var above [4]bool
	for k, v := range z {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return
		}
		above[k] = v >= t.level
	}
	// Edges bottom, right, top, left: their end nodes, each pair ordered
	// to the right or upwards, and the corners they join.
	ends := [4][4]int{{i, j, i + 1, j}, {i + 1, j, i + 1, j + 1}, {i, j + 1, i + 1, j + 1}, {i, j, i, j + 1}}
	corners := [4][2]int{{0, 1}, {1, 2}, {3, 2}, {0, 3}}
	var at [4]int
	var hit []int
	for e, c := range corners {
		if above[c[0]] != above[c[1]] {
			at[e] = t.cross(ends[e][0], ends[e][1], ends[e][2], ends[e][3])
			hit = append(hit, e)
		}
	}
	switch len(hit) {
	case 2:
		t.segment(at[hit[0]], at[hit[1]])
	case 4:
		centreAbove := (z[0]+z[1]+z[2]+z[3])/4 >= t.level
		if centreAbove == above[0] {
			// Corners 0 and 2 connect through the centre; cut off 1 and 3.
			t.segment(at[0], at[1])
			t.segment(at[2], at[3])
		} else {
			t.segment(at[0], at[3])
			t.segment(at[1], at[2])
		}
	}
}

// segment records a segment between crossings a and b.
func (t *tracer) segment(a, b int) {
	s := len(t.segments)
	t.segments = append(t.segments, [2]int{a, b})
	for _, c := range [2]int{a, b} {
		p := &t.crossings[c].segments
		if p[0] < 0 {
			p[0] = s
		} else {
			p[1] = s
		}
	}
}

// join chains the segments into polylines. Every crossing ends at most
// two segments, so each chain is a simple path or a loop; the walk round
// a loop returns to its first crossing, so a closed polyline ends where
// it starts.
func (t *tracer) join() []Line {
	used := make([]bool, len(t.segments))
	// walk follows segments from crossing c, away from segment s, and
	// returns the crossings it passes after c.
	walk := func(s, c int) []int {
		var out []int
		for {
			next := -1
			for _, k := range t.crossings[c].segments {
				if k >= 0 && k != s && !used[k] {
					next = k
					break
				}
			}
			if next < 0 {
				return out
			}
			used[next] = true
			if seg := t.segments[next]; seg[0] == c {
				c = seg[1]
			} else {
				c = seg[0]
			}
			out = append(out, c)
			s = next
		}
	}
	var lines []Line
	for s, seg := range t.segments {
		if used[s] {
			continue
		}
		used[s] = true
		forward := walk(s, seg[1])
		back := walk(s, seg[0])
		line := make(Line, 0, len(back)+len(forward)+2)
		for k := len(back) - 1; k >= 0; k-- {
			line = append(line, t.crossings[back[k]].at)
		}
		line = append(line, t.crossings[seg[0]].at, t.crossings[seg[1]].at)
		for _, c := range forward {
			line = append(line, t.crossings[c].at)
		}
		lines = append(lines, line)
	}
	return lines
}
