package isoline

import (
	"math"
	"reflect"
	"testing"

	"gainscape/regions/plane"
)

// sample returns f at every node of the grid x × y, row-major.
func sample(x, y plane.Axis, f func(x, y float64) float64) []float64 {
	v := make([]float64, x.N*y.N)
	for j := 0; j < y.N; j++ {
		for i := 0; i < x.N; i++ {
			v[j*x.N+i] = f(x.At(i), y.At(j))
		}
	}
	return v
}

// bowl is x² + y², NaN where x < cut.
func bowl(cut float64) func(x, y float64) float64 {
	return func(x, y float64) float64 {
		if x < cut {
			return math.NaN()
		}
		return x*x + y*y
	}
}

// closed reports whether l ends with the point it starts with. Trace
// stores each crossing once and copies it to both ends of a loop, so the
// two are bit-for-bit equal when the line is closed.
func closed(l Line) bool { return l[0] == l[len(l)-1] }

// TestTraceCircle traces circles x² + y² = r² and checks every point
// against the error the grid allows.
//
// Bound, derived by hand in this test: a crossing lies on a grid edge of
// length h along which the field is t² + const, a parabola with second
// derivative 2. Linear interpolation finds where the chord between the
// two nodes equals r²; the chord lies above the convex parabola by at
// most (h/2)² = h²/4, at the middle of the edge. So every traced point
// has r² − h²/4 ≤ x² + y² ≤ r²: on or inside the circle, and at most
// r − √(r² − h²/4) (≈ h²/(8r)) inside it. Rounding adds a few units in
// the last place; 1e-12 covers it.
func TestTraceCircle(t *testing.T) {
	const rounding = 1e-12
	square := func(n int) plane.Axis { return plane.Axis{Param: "x", Min: -2, Max: 2, N: n} }
	cases := []struct {
		name       string
		axis       plane.Axis // both axes
		cut        float64    // no value where x < cut
		r          float64
		wantPoints int
		wantClosed bool
	}{
		{
			// h = 0.1. The circle crosses each of the 19 grid lines
			// x = k/10 and the 19 lines y = k/10 with |k| < 10 twice: 76
			// crossings, four of them on the nodes (±1, 0), (0, ±1), each
			// counted once, on the edge running into the node from below
			// the level. A closed line repeats its first point: 77
			// (derived by hand in this test).
			name: "unit circle, h = 0.1", axis: square(41), cut: math.Inf(-1), r: 1,
			wantPoints: 77, wantClosed: true,
		},
		{
			// h = 0.25. 16r² = 27.04 is not a sum of two squares of
			// integers, so no crossing falls on a node. The 11 lines
			// x = k/4 with |k| ≤ 5 are crossed twice each, and so are the
			// 11 lines y = k/4: 44 crossings, 45 points with the repeated
			// first one (derived by hand in this test).
			name: "r = 1.3, h = 0.25", axis: square(17), cut: math.Inf(-1), r: 1.3,
			wantPoints: 45, wantClosed: true,
		},
		{
			// Cells with a corner at x < 0 are skipped. The 10 lines
			// x = k/10, 0 ≤ k ≤ 9, are crossed twice (the two on x = 0 at
			// the nodes (0, ±1)), the 19 lines y = k/10 with |k| < 10
			// once on the right: 39 points on an open line (derived by
			// hand in this test).
			name: "right half of the unit circle", axis: square(41), cut: 0, r: 1,
			wantPoints: 39, wantClosed: false,
		},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			h := tc.axis.Span() / float64(tc.axis.N-1)
			lines := Trace(tc.axis, tc.axis, sample(tc.axis, tc.axis, bowl(tc.cut)), tc.r*tc.r)
			if len(lines) != 1 {
				t.Fatalf("%d lines, want 1", len(lines))
			}
			l := lines[0]
			if got := closed(l); got != tc.wantClosed {
				t.Errorf("closed = %v, want %v", got, tc.wantClosed)
			}
			if len(l) != tc.wantPoints {
				t.Errorf("%d points, want %d", len(l), tc.wantPoints)
			}
			lo, hi := tc.r*tc.r-h*h/4, tc.r*tc.r
			for _, p := range l {
				if p[0] < tc.cut {
					t.Errorf("point %v lies where the field has no value", p)
				}
				if q := p[0]*p[0] + p[1]*p[1]; q < lo-rounding || q > hi+rounding {
					t.Errorf("point %v has x²+y² = %v, want within [%v, %v] ± %g", p, q, lo, hi, rounding)
				}
			}
		})
	}
}

// TestTraceStraightLine traces linear fields, whose iso-lines are
// straight lines. Linear interpolation along an edge is exact for a
// linear field, so every point lies on the line up to rounding of values
// of order 10: |a·x + b·y + c − level| ≤ 1e-12 (derived by hand in this
// test).
func TestTraceStraightLine(t *testing.T) {
	const tol = 1e-12
	x := plane.Axis{Param: "kp", Min: -1, Max: 3, N: 21}
	y := plane.Axis{Param: "ki", Min: 0, Max: 2, N: 11}
	cases := []struct {
		name    string
		a, b, c float64
		level   float64
	}{
		{name: "oblique", a: 0.7, b: -1.9, c: 0.25, level: 0.1},
		{name: "vertical between nodes", a: 1, b: 0, c: 0, level: 1.13},
		{name: "horizontal between nodes", a: 0, b: -2, c: 1, level: -1.5},
		// x − y = 0 meets the level at nodes; a node exactly at the level
		// counts as above it, and the line still comes out whole.
		{name: "diagonal through nodes", a: 1, b: -1, c: 0, level: 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			f := func(x, y float64) float64 { return tc.a*x + tc.b*y + tc.c }
			lines := Trace(x, y, sample(x, y, f), tc.level)
			if len(lines) != 1 {
				t.Fatalf("%d lines, want 1", len(lines))
			}
			l := lines[0]
			if len(l) < 2 {
				t.Fatalf("%d points, want at least 2", len(l))
			}
			for _, p := range l {
				if d := f(p[0], p[1]) - tc.level; math.Abs(d) > tol {
					t.Errorf("point %v is %g off the line, want within %g", p, d, tol)
				}
			}
			// A straight line through the rectangle enters and leaves at
			// its border.
			for _, p := range [2][2]float64{l[0], l[len(l)-1]} {
				onBorder := math.Abs(p[0]-x.Min) <= tol || math.Abs(p[0]-x.Max) <= tol ||
					math.Abs(p[1]-y.Min) <= tol || math.Abs(p[1]-y.Max) <= tol
				if !onBorder {
					t.Errorf("end %v is not on the border of the grid", p)
				}
			}
		})
	}
}

// TestTraceSaddle checks how cells crossed on all four edges are split.
func TestTraceSaddle(t *testing.T) {
	const tol = 1e-12
	unit := plane.Axis{Param: "x", Min: 0, Max: 1, N: 2}
	// One cell with corners (counter-clockwise from (0, 0)) 1, 0, 1, 0:
	// its mean is 0.5. The crossings follow from linear interpolation on
	// the unit edges, e.g. at level 0.4 the bottom edge from 1 to 0 is
	// crossed at x = 0.6 (derived by hand in this test).
	checker := []float64{1, 0, 0, 1} // row-major: (0,0) (1,0) (0,1) (1,1)
	cases := []struct {
		name   string
		level  float64
		values []float64
		want   []Line
	}{
		{
			// Mean 0.5 ≥ 0.4: the high corners (0, 0) and (1, 1) connect
			// through the centre, the low corners are cut off.
			name: "mean above the level", level: 0.4, values: checker,
			want: []Line{{{0.6, 0}, {1, 0.4}}, {{0.4, 1}, {0, 0.6}}},
		},
		{
			// Mean 0.5 < 0.6: the low corners (1, 0) and (0, 1) connect,
			// the high corners are cut off.
			name: "mean below the level", level: 0.6, values: checker,
			want: []Line{{{0.4, 0}, {0, 0.4}}, {{1, 0.6}, {0.6, 1}}},
		},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got := Trace(unit, unit, tc.values, tc.level)
			if len(got) != len(tc.want) {
				t.Fatalf("%d lines, want %d", len(got), len(tc.want))
			}
			for _, w := range tc.want {
				found := false
				for _, g := range got {
					found = found || sameSegment(g, w, tol)
				}
				if !found {
					t.Errorf("no line %v in %v", w, got)
				}
			}
		})
	}

	// z = x·y on a 3×3 grid over [−1, 1]²: level 0.5 passes the corners
	// (1, 1) and (−1, −1) only, as two separate arcs.
	a := plane.Axis{Param: "x", Min: -1, Max: 1, N: 3}
	lines := Trace(a, a, sample(a, a, func(x, y float64) float64 { return x * y }), 0.5)
	if len(lines) != 2 {
		t.Fatalf("x·y = 0.5: %d lines, want 2", len(lines))
	}
	for _, l := range lines {
		for _, p := range l {
			if p[0]*p[1] <= 0 {
				t.Errorf("x·y = 0.5: point %v lies in a quadrant where x·y ≤ 0", p)
			}
		}
	}
}

// sameSegment reports whether the two-point lines g and w join the same
// points within tol, in either direction.
func sameSegment(g, w Line, tol float64) bool {
	if len(g) != 2 || len(w) != 2 {
		return false
	}
	near := func(p, q [2]float64) bool { return math.Abs(p[0]-q[0]) <= tol && math.Abs(p[1]-q[1]) <= tol }
	return near(g[0], w[0]) && near(g[1], w[1]) || near(g[0], w[1]) && near(g[1], w[0])
}

// TestTraceDeterministic checks that lines come in the documented order,
// by their lowest cell in a row-by-row scan, and that repeated calls
// agree exactly.
func TestTraceDeterministic(t *testing.T) {
	x := plane.Axis{Param: "x", Min: 0, Max: 4, N: 41}
	y := plane.Axis{Param: "y", Min: 0, Max: 6, N: 61}
	// Two wells: rings of radius 0.8 round (3, 1.5) and (1, 4.5); the
	// lower one comes first although it lies further right.
	wells := func(x, y float64) float64 {
		return min(math.Hypot(x-3, y-1.5), math.Hypot(x-1, y-4.5))
	}
	values := sample(x, y, wells)
	first := Trace(x, y, values, 0.8)
	if len(first) != 2 {
		t.Fatalf("%d lines, want 2", len(first))
	}
	if first[0][0][1] > first[1][0][1] {
		t.Errorf("lines start at %v and %v: the lower ring should come first", first[0][0], first[1][0])
	}
	for k := 0; k < 5; k++ {
		if again := Trace(x, y, values, 0.8); !reflect.DeepEqual(again, first) {
			t.Fatalf("call %d differs from the first", k+2)
		}
	}
}

// TestTraceEdgeCases covers grids with no cells, fields with no value
// and levels the field never reaches: all yield no line.
func TestTraceEdgeCases(t *testing.T) {
	a := plane.Axis{Param: "x", Min: 0, Max: 1, N: 3}
	one := plane.Axis{Param: "x", Min: 0, Max: 1, N: 1}
	nan := math.NaN()
	cases := []struct {
		name   string
		x, y   plane.Axis
		values []float64
		level  float64
	}{
		{name: "empty grid", x: plane.Axis{}, y: plane.Axis{}, values: nil, level: 0},
		{name: "single column", x: one, y: a, values: []float64{0, 1, 2}, level: 0.5},
		{name: "all missing", x: a, y: a, values: []float64{nan, nan, nan, nan, nan, nan, nan, nan, nan}, level: 0},
		{name: "infinite values", x: a, y: a, values: []float64{0, 1, 2, 0, math.Inf(1), 2, 0, 1, 2}, level: 0.5},
		{name: "level above the field", x: a, y: a, values: []float64{0, 1, 2, 0, 1, 2, 0, 1, 2}, level: 3},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			if got := Trace(tc.x, tc.y, tc.values, tc.level); len(got) != 0 {
				t.Errorf("got %d lines %v, want none", len(got), got)
			}
		})
	}
}

// TestTracePanics checks that values not matching the grid panic.
func TestTracePanics(t *testing.T) {
	a := plane.Axis{Param: "x", Min: 0, Max: 1, N: 3}
	cases := []struct {
		name   string
		values []float64
	}{
		{name: "too few", values: make([]float64, 8)},
		{name: "too many", values: make([]float64, 10)},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			defer func() {
				if recover() == nil {
					t.Error("no panic")
				}
			}()
			Trace(a, a, tc.values, 0)
		})
	}
}
