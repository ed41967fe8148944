// Package grid evaluates the stability test on every node of a
// two-parameter grid, in parallel, and holds the resulting map of root
// counts: on the unstable side, and on the stability boundary.
package grid

import (
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// Undecided marks a node where the sign-array test could not decide the
// count (coefficients non-finite or beyond the range where the test keeps
// its meaning).
const Undecided = stability.Undecided

// Map holds the root counts of the closed loop at every node of a grid.
// RHP[k] is the number of roots strictly on the unstable side (the open
// right half plane), Undecided where the test could not tell, and Axis[k]
// the number on the stability boundary (the imaginary axis, s = 0 and
// roots gone to infinity included); node k = j·XAxis.N + i is
// (XAxis.At(i), YAxis.At(j)), row j = 0 at YAxis.Min. A node is stable
// only when both counts are zero; a node with no unstable root but one on
// the boundary is marginal, on an edge, and is neither drawn nor used as
// stable. Map satisfies gonum/plot's plotter.GridXYZ with the RHP counts.
type Map struct {
	XAxis, YAxis plane.Axis
	RHP, Axis    []int8
	// Evaluated is the number of nodes at which the stability test ran;
	// the others were filled from certified cells (EvaluateCertified).
	Evaluated int
}

// NewMap returns a map of the given axes with every count zero.
func NewMap(x, y plane.Axis) *Map {
	return &Map{XAxis: x, YAxis: y, RHP: make([]int8, x.N*y.N), Axis: make([]int8, x.N*y.N)}
}

// Set records the verdict of node k.
func (m *Map) Set(k int, v stability.Verdict) {
	if v.Unstable < 0 {
		m.RHP[k], m.Axis[k] = Undecided, 0
		return
	}
	m.RHP[k] = int8(min(v.Unstable, 127))
	m.Axis[k] = int8(min(v.Boundary+v.Infinite, 127))
}

// Count returns the unstable count at node (i, j).
func (m *Map) Count(i, j int) int { return int(m.RHP[j*m.XAxis.N+i]) }

// OnAxis returns the boundary count at node (i, j).
func (m *Map) OnAxis(i, j int) int { return int(m.Axis[j*m.XAxis.N+i]) }

// ClassAt returns the class of node k.
func (m *Map) ClassAt(k int) stability.Class {
	switch {
	case m.RHP[k] < 0:
		return stability.ClassUndecided
	case m.RHP[k] > 0:
		return stability.ClassUnstable
	case m.Axis[k] > 0:
		return stability.ClassMarginal
	}
	return stability.ClassStable
}

// Class returns the class of node (i, j).
func (m *Map) Class(i, j int) stability.Class { return m.ClassAt(j*m.XAxis.N + i) }

// StableAt reports whether node k is stable.
func (m *Map) StableAt(k int) bool { return m.RHP[k] == 0 && m.Axis[k] == 0 }

// Dims returns the number of columns (x nodes) and rows (y nodes).
func (m *Map) Dims() (c, r int) { return m.XAxis.N, m.YAxis.N }

// Z returns the count at column c, row r as a float.
func (m *Map) Z(c, r int) float64 { return float64(m.RHP[r*m.XAxis.N+c]) }

// X returns the x value of column c.
func (m *Map) X(c int) float64 { return m.XAxis.At(c) }

// Y returns the y value of row r.
func (m *Map) Y(r int) float64 { return m.YAxis.At(r) }

// Rows returns the unstable counts as rows, row 0 at YAxis.Min, for
// export.
func (m *Map) Rows() [][]int { return rowsOf(m.RHP, m.XAxis.N, m.YAxis.N) }

// AxisRows returns the boundary counts as rows, laid out as Rows.
func (m *Map) AxisRows() [][]int { return rowsOf(m.Axis, m.XAxis.N, m.YAxis.N) }

func rowsOf(v []int8, nx, ny int) [][]int {
	out := make([][]int, ny)
	for j := range out {
		row := make([]int, nx)
		for i := range row {
			row[i] = int(v[j*nx+i])
		}
		out[j] = row
	}
	return out
}

// Stats summarises a map. Stable counts stable nodes only; Marginal the
// nodes on an edge (no unstable root, one on the boundary).
type Stats struct {
	Nodes, Stable, Marginal, Undecided int
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
	imin, imax, jmin, jmax := m.XAxis.N, -1, m.YAxis.N, -1
	nx := m.XAxis.N
	for j := 0; j < m.YAxis.N; j++ {
		rhp, axis := m.RHP[j*nx:(j+1)*nx], m.Axis[j*nx:(j+1)*nx]
		for i, c := range rhp {
			switch {
			case c < 0:
				s.Undecided++
			case c > 0:
				s.MaxRHP = max(s.MaxRHP, int(c))
			case axis[i] > 0:
				s.Marginal++
			default:
				s.Stable++
				imin, imax = min(imin, i), max(imax, i)
				jmin, jmax = min(jmin, j), max(jmax, j)
			}
		}
	}
	if s.Stable > 0 {
		x0, x1, y0, y1 := m.XAxis.At(imin), m.XAxis.At(imax), m.YAxis.At(jmin), m.YAxis.At(jmax)
		s.XMin, s.XMax, s.YMin, s.YMax = min(x0, x1), max(x0, x1), min(y0, y1), max(y0, y1)
	}
	return s
}
