// Package render draws a stability map of a closed loop in the plane of
// two controller parameters to PNG or SVG.
//
// A map shows the stable region, the unstable cells shaded by their
// number of right-half-plane roots, the boundary curves with the
// oscillation frequency ω written along them, and optionally a shaded
// quantity inside the stable region, its iso-lines and design points.
// Every quantity is drawn as given: the package computes no stability
// information of its own.
package render

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/plot/vg"

	"gainscape/regions/boundary"
	"gainscape/regions/grid"
	"gainscape/regions/isoline"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// Figure is everything one map image shows.
type Figure struct {
	// Map holds the right-half-plane root count at every grid node. It is
	// required.
	Map *grid.Map
	// Curves are the boundary curves, drawn over the map.
	Curves []boundary.Curve
	// Title names the plant and controller, e.g.
	// "plant 2.5(s+0.4)/(s(s+1.5)²(0.2s+1)) under PID".
	Title string
	// Notes are short lines set under the title, such as the fixed
	// parameters or a caution.
	Notes []string
	// FreqUnit is the unit written after every ω on an edge, such as
	// "rad/s"; empty writes none.
	FreqUnit string
	// XLabel and YLabel title the axes; empty means the axis parameter
	// name.
	XLabel, YLabel string
	// Shade, if not nil, is a continuous quantity shaded inside the
	// stable region instead of a flat fill; the unstable region is then
	// shaded in muted tones.
	Shade *Field
	// Contours are iso-lines of fields, each set drawn in the dash
	// pattern and colour of its Look and labelled "Name=level" in its
	// colour.
	Contours []ContourSet
	// Marks are design points drawn as a symbol with a label.
	Marks []Mark
	// Sample is the sample time of a sampled-data loop, 0 for a
	// continuous-time one: the legend then speaks of the unit circle, and
	// edges where a real root crosses z = −1 are labelled ω = π/T.
	Sample float64
	// Compare are edge sets of the same window drawn over the map, each
	// in its own style (such as the loop at other sample times), and
	// OwnLabel names the map's own loop beside them in the legend.
	Compare  []EdgeSet
	OwnLabel string
	// LaterBranches are edge points on D-partition branches beyond the
	// first, marked by small diamonds along the edge (see BranchPoint).
	LaterBranches []BranchPoint
	// Width and Height are the image size; zero means 16 cm by 12 cm.
	Width, Height vg.Length
	// DPI is the resolution of PNG output; zero means 200 dots per inch.
	// SVG output ignores it.
	DPI int
}

// Default image size and PNG resolution.
const (
	DefaultWidth  = 16 * vg.Centimeter
	DefaultHeight = 12 * vg.Centimeter
	DefaultDPI    = 200
)

// Field is a continuous quantity sampled on a grid, such as the decay
// rate at every node. It satisfies gonum/plot's plotter.GridXYZ.
type Field struct {
	XAxis, YAxis plane.Axis
	// Values[j*XAxis.N+i] belongs to node (XAxis.At(i), YAxis.At(j)),
	// the layout of grid.Map. NaN means no value there.
	Values []float64
	// Name titles the shading scale, e.g. "decay rate σ (1/s)".
	Name string
}

// Dims returns the number of columns (x nodes) and rows (y nodes).
func (f *Field) Dims() (c, r int) { return f.XAxis.N, f.YAxis.N }

// Z returns the value at column c, row r.
func (f *Field) Z(c, r int) float64 { return f.Values[r*f.XAxis.N+c] }

// X returns the x value of column c.
func (f *Field) X(c int) float64 { return f.XAxis.At(c) }

// Y returns the y value of row r.
func (f *Field) Y(r int) float64 { return f.YAxis.At(r) }

// Range returns the smallest and largest finite values, and false if
// there are none.
func (f *Field) Range() (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range f.Values {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			continue
		}
		lo, hi = min(lo, v), max(hi, v)
	}
	return lo, hi, lo <= hi
}

// ContourSet is a family of iso-lines of one field, traced by the caller
// (isoline.Trace) so that a figure and the data written beside it hold
// the same lines.
type ContourSet struct {
	// Levels are the values at which lines are drawn.
	Levels []float64
	// Lines[k] are the iso-lines at Levels[k].
	Lines [][]isoline.Line
	// Look picks the set's colour and dash pattern from the iso-line
	// looks (modulo their number), so that a quantity keeps one style
	// whatever else a figure shows.
	Look int
	// Name is written before the level in the line labels and in the
	// legend, e.g. "Ms".
	Name string
}

// Mark is a design point: a symbol at (X, Y) with a label beside it.
type Mark struct {
	X, Y  float64
	Label string
}

// checkAxis reports an axis that cannot be drawn.
func checkAxis(what string, a plane.Axis) error {
	switch {
	case a.N < 2:
		return fmt.Errorf("render: %s axis %q has %d nodes; need at least 2", what, a.Param, a.N)
	case !(a.Max > a.Min) || math.IsInf(a.Min, 0) || math.IsInf(a.Max, 0):
		return fmt.Errorf("render: %s axis %q has range [%g, %g]; need finite Min < Max", what, a.Param, a.Min, a.Max)
	}
	return nil
}

// checkField reports a field whose values do not match its axes.
func checkField(what string, f *Field) error {
	if err := checkAxis(what+" x", f.XAxis); err != nil {
		return err
	}
	if err := checkAxis(what+" y", f.YAxis); err != nil {
		return err
	}
	if len(f.Values) != f.XAxis.N*f.YAxis.N {
		return fmt.Errorf("render: %s %q has %d values for a %d×%d grid", what, f.Name, len(f.Values), f.XAxis.N, f.YAxis.N)
	}
	return nil
}

// check reports data the figure cannot be drawn from.
func (f *Figure) check() error {
	if f.Map == nil {
		return errors.New("render: figure has no map")
	}
	if err := checkAxis("map x", f.Map.XAxis); err != nil {
		return err
	}
	if err := checkAxis("map y", f.Map.YAxis); err != nil {
		return err
	}
	if n := f.Map.XAxis.N * f.Map.YAxis.N; len(f.Map.RHP) != n || len(f.Map.Axis) != n {
		return fmt.Errorf("render: map has %d counts for a %d×%d grid", len(f.Map.RHP), f.Map.XAxis.N, f.Map.YAxis.N)
	}
	if f.Shade != nil {
		if err := checkField("shade field", f.Shade); err != nil {
			return err
		}
	}
	for i, cs := range f.Contours {
		if len(cs.Lines) != len(cs.Levels) {
			return fmt.Errorf("render: contour set %d (%q) has %d line sets for %d levels", i, cs.Name, len(cs.Lines), len(cs.Levels))
		}
	}
	if f.Width < 0 || f.Height < 0 || f.DPI < 0 {
		return fmt.Errorf("render: negative size %v×%v or resolution %d", f.Width, f.Height, f.DPI)
	}
	return nil
}

// withDefaults returns f with the documented defaults filled in.
func (f Figure) withDefaults() Figure {
	if f.Width == 0 {
		f.Width = DefaultWidth
	}
	if f.Height == 0 {
		f.Height = DefaultHeight
	}
	if f.DPI == 0 {
		f.DPI = DefaultDPI
	}
	if f.XLabel == "" {
		f.XLabel = f.Map.XAxis.Param
	}
	if f.YLabel == "" {
		f.YLabel = f.Map.YAxis.Param
	}
	return f
}

// stableOnly shows a field only where the nearest map node is stable, so
// shading never spills into the unstable region even if the field has
// values there.
type stableOnly struct {
	*Field
	m *grid.Map
}

// Z returns the field value, or NaN where the map is not stable.
func (s stableOnly) Z(c, r int) float64 {
	i := nearest(s.m.XAxis, s.Field.X(c))
	j := nearest(s.m.YAxis, s.Field.Y(r))
	if i < 0 || j < 0 || s.m.Class(i, j) != stability.ClassStable {
		return math.NaN()
	}
	return s.Field.Z(c, r)
}

// nearest returns the index of the node of a closest to v, or -1 if v
// lies more than half a node spacing outside the axis.
func nearest(a plane.Axis, v float64) int {
	k := (v - a.Min) / a.Span() * float64(a.N-1)
	if math.IsNaN(k) || k < -0.5 || k > float64(a.N-1)+0.5 {
		return -1
	}
	return int(max(0, min(math.Round(k), float64(a.N-1))))
}

// hasUndecided reports whether any node of m is undecided.
func hasUndecided(m *grid.Map) bool {
	for _, c := range m.RHP {
		if c == grid.Undecided {
			return true
		}
	}
	return false
}
