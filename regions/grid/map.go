// Package grid evaluates the sign-array test on every node of a
// two-parameter grid, in parallel, and holds the resulting map of
// right-half-plane root counts.
package grid

import (
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// Undecided marks a node where the sign-array test could not decide the
// count (coefficients non-finite or beyond the range where the test keeps
// its meaning).
const Undecided = stability.Undecided

// Map is the right-half-plane root count of the closed loop at every node
// of a grid. RHP[j*XAxis.N+i] belongs to node (XAxis.At(i), YAxis.At(j));
// row j = 0 is at YAxis.Min. It satisfies gonum/plot's plotter.GridXYZ.
type Map struct {
	XAxis, YAxis plane.Axis
	RHP          []int8
}

// NewMap returns a map of the given axes with every count zero.
func NewMap(x, y plane.Axis) *Map {
	return &Map{XAxis: x, YAxis: y, RHP: make([]int8, x.N*y.N)}
}

// Count returns the count at node (i, j).
func (m *Map) Count(i, j int) int { return int(m.RHP[j*m.XAxis.N+i]) }

// Dims returns the number of columns (x nodes) and rows (y nodes).
func (m *Map) Dims() (c, r int) { return m.XAxis.N, m.YAxis.N }

// Z returns the count at column c, row r as a float.
func (m *Map) Z(c, r int) float64 { return float64(m.RHP[r*m.XAxis.N+c]) }

// X returns the x value of column c.
func (m *Map) X(c int) float64 { return m.XAxis.At(c) }

// Y returns the y value of row r.
func (m *Map) Y(r int) float64 { return m.YAxis.At(r) }

// Rows returns the counts as rows, row 0 at YAxis.Min, for export.
func (m *Map) Rows() [][]int {
	out := make([][]int, m.YAxis.N)
	for j := range out {
		row := make([]int, m.XAxis.N)
		for i := range row {
			row[i] = m.Count(i, j)
		}
		out[j] = row
	}
	return out
}

// Stats summarises a map.
type Stats struct {
	Nodes, Stable, Undecided int
	// Bounding box of the stable nodes; valid only if Stable > 0.
	XMin, XMax, YMin, YMax float64
	MaxRHP                 int
}

// StableFraction returns the share of decided nodes that are stable.
func (s Stats) StableFraction() float64 {
	if s.Nodes-s.Undecided == 0 {
		return 0
	}
	return float64(s.Stable) / float64(s.Nodes-s.Undecided)
}

// Stats counts stable and undecided nodes and finds the stable bounding box.
func (m *Map) Stats() Stats {
	s := Stats{Nodes: len(m.RHP)}
	first := true
	for j := 0; j < m.YAxis.N; j++ {
		for i := 0; i < m.XAxis.N; i++ {
			c := m.Count(i, j)
			if c > s.MaxRHP {
				s.MaxRHP = c
			}
			switch {
			case c == Undecided:
				s.Undecided++
			case c == 0:
				s.Stable++
				x, y := m.XAxis.At(i), m.YAxis.At(j)
				if first {
					s.XMin, s.XMax, s.YMin, s.YMax = x, x, y, y
					first = false
				}
				s.XMin, s.XMax = min(s.XMin, x), max(s.XMax, x)
				s.YMin, s.YMax = min(s.YMin, y), max(s.YMax, y)
			}
		}
	}
	return s
}
