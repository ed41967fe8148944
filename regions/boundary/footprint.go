package boundary

import (
	"math"
	"slices"

	"gainscape/regions/dpartition"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
)

// Footprint is where the curves of a Sweep lie on the grid of a map: the
// cells they may enter, the nodes they pass near, and the change of the
// unstable count they predict across each grid edge they cross.
//
// Cell (i, j) lies between nodes i, i+1 of the x axis and j, j+1 of the y
// axis. Grid edge 2·k joins node k to its right neighbour, 2·k+1 to the
// one above it (node k = j·nx + i).
type Footprint struct {
	nx, ny int
	// Touched[j·(nx−1)+i] reports whether a curve may enter cell (i, j):
	// its polyline enters the cell or passes within Tolerance of it.
	Touched []bool
	// Tolerance is the distance, in units of the window's sides, within
	// which a polyline may lie from its true curve (twice the chord).
	Tolerance float64
	near      []bool
	cross     map[int]edgeCross
}

// edgeCross is what the curves crossing one grid edge predict: the
// change of count from its first node to its second, unless a crossing
// curve's change cannot be told.
type edgeCross struct {
	delta         int
	unpredictable bool
}

// Footprint lays the curves of sw on the grid of axes x and y.
//
// Each polyline segment is walked through the cells it passes, in the
// grid's own coordinates (node i at u = i); the cell holding each piece is
// touched, and so is a neighbour whose side or corner the piece passes
// within Tolerance of, since the true curve may lie that far from its
// polyline. A node within Tolerance of a piece is near the curve. Where a
// segment meets a grid line, the grid edge it crosses gets the change the
// curve predicts: walking along the curve, the side dpartition reports
// with fewer unstable roots (Šiljak's rule) has Change roots fewer. A
// point where one segment ends and the next starts is met once.
func (sw *Sweep) Footprint(x, y plane.Axis) *Footprint {
	nx, ny := x.N, y.N
	f := &Footprint{nx: nx, ny: ny, Touched: make([]bool, max(nx-1, 0)*max(ny-1, 0)),
		Tolerance: 2 * sw.Chord, near: make([]bool, nx*ny), cross: map[int]edgeCross{}}
	if nx < 2 || ny < 2 {
		return f
	}
	du, dv := x.Span()/float64(nx-1), y.Span()/float64(ny-1)
	// A point on a grid line, such as the end of a curve on a side of
	// the window, is put on it exactly, whatever the rounding of the
	// tracer's clipping (about 1e-9 of the window) and of the division.
	snap := func(a float64) float64 {
		if r := math.Round(a); math.Abs(a-r) <= 1e-6 {
			return r
		}
		return a
	}
	uv := func(p Point) (float64, float64) { return snap((p.X - x.Min) / du), snap((p.Y - y.Min) / dv) }
	w := walker{f: f, tu: f.Tolerance * float64(nx-1), tv: f.Tolerance * float64(ny-1)}
	for c, cv := range sw.Curves {
		w.fewer, w.change = sw.fewer[c], sw.change[c]
		pts := cv.Points
		for k := range pts {
			u0, v0 := uv(pts[k])
			if len(pts) == 1 {
				w.segment(u0, v0, u0, v0, true)
				break
			}
			if k+1 == len(pts) {
				break
			}
			u1, v1 := uv(pts[k+1])
			w.segment(u0, v0, u1, v1, k+2 == len(pts))
		}
	}
	return f
}

// walker walks polyline segments through the cells of a footprint.
type walker struct {
	f      *Footprint
	tu, tv float64 // the tolerance in cells of each axis
	fewer  dpartition.Side
	change int
	ts     []float64
}

// segment walks the segment from (u0, v0) to (u1, v1), in node units;
// last says whether its end point is the end of the curve, whose
// crossing it then counts.
func (w *walker) segment(u0, v0, u1, v1 float64, last bool) {
	f := w.f
	at := func(t float64) (float64, float64) { return u0 + t*(u1-u0), v0 + t*(v1-v0) }
	w.ts = append(w.ts[:0], 0, 1)
	// Crossings of the lines v = k, which hold the horizontal grid
	// edges, and of u = k, which hold the vertical ones.
	lines := func(a0, a1 float64, n int, horizontal bool) {
		if a0 == a1 {
			return
		}
		lo, hi := math.Max(math.Ceil(math.Min(a0, a1)), 0), math.Min(math.Floor(math.Max(a0, a1)), float64(n-1))
		for k := lo; k <= hi; k++ {
			t := (k - a0) / (a1 - a0)
			if t < 0 || t > 1 || (t == 1 && !last) {
				continue
			}
			w.ts = append(w.ts, t)
			u, v := at(t)
			if horizontal {
				w.crossing(u, int(k), true, v1 > v0)
			} else {
				w.crossing(v, int(k), false, u1 < u0)
			}
		}
	}
	lines(v0, v1, f.ny, true)
	lines(u0, u1, f.nx, false)
	slices.Sort(w.ts)
	for k := 0; k+1 < len(w.ts); k++ {
		ta, tb := w.ts[k], w.ts[k+1]
		if tb == ta {
			continue
		}
		ua, va := at(ta)
		ub, vb := at(tb)
		um, vm := at(0.5 * (ta + tb))
		w.piece(ua, va, ub, vb, um, vm)
	}
}

// crossing records that a segment crosses the grid line k (v = k when
// horizontal, else u = k) at position a along it; firstLeft says whether
// the edge's first node lies to the left of the direction of travel.
func (w *walker) crossing(a float64, k int, horizontal, firstLeft bool) {
	f := w.f
	n := f.nx
	if !horizontal {
		n = f.ny
	}
	if a < 0 || a > float64(n-1) {
		return
	}
	i := min(int(a), n-2)
	var edge int
	if horizontal {
		edge = 2 * (k*f.nx + i)
	} else {
		edge = 2*(i*f.nx+k) + 1
	}
	ec := f.cross[edge]
	if w.change == 0 {
		ec.unpredictable = true
	} else if firstLeft == (w.fewer == dpartition.Left) {
		ec.delta += w.change
	} else {
		ec.delta -= w.change
	}
	f.cross[edge] = ec
}

// piece marks the cell holding the piece from (ua, va) to (ub, vb), whose
// midpoint is (um, vm), the neighbours it passes within the tolerance
// of, and the nodes it passes near.
func (w *walker) piece(ua, va, ub, vb, um, vm float64) {
	f := w.f
	i := max(0, min(int(math.Floor(um)), f.nx-2))
	j := max(0, min(int(math.Floor(vm)), f.ny-2))
	if um < -w.tu || um > float64(f.nx-1)+w.tu || vm < -w.tv || vm > float64(f.ny-1)+w.tv {
		return
	}
	left := math.Min(ua, ub)-float64(i) < w.tu
	right := float64(i+1)-math.Max(ua, ub) < w.tu
	below := math.Min(va, vb)-float64(j) < w.tv
	above := float64(j+1)-math.Max(va, vb) < w.tv
	for di := -1; di <= 1; di++ {
		for dj := -1; dj <= 1; dj++ {
			if (di == -1 && !left) || (di == 1 && !right) || (dj == -1 && !below) || (dj == 1 && !above) {
				continue
			}
			if ci, cj := i+di, j+dj; ci >= 0 && cj >= 0 && ci < f.nx-1 && cj < f.ny-1 {
				f.Touched[cj*(f.nx-1)+ci] = true
			}
		}
	}
	for _, c := range [4][2]int{{i, j}, {i + 1, j}, {i, j + 1}, {i + 1, j + 1}} {
		if nearSegment(float64(c[0]), float64(c[1]), ua, va, ub, vb, w.tu, w.tv) {
			f.near[c[1]*f.nx+c[0]] = true
		}
	}
}

// nearSegment reports whether the point (pu, pv) lies within the
// ellipse of half-axes tu, tv around some point of the segment from
// (ua, va) to (ub, vb).
func nearSegment(pu, pv, ua, va, ub, vb, tu, tv float64) bool {
	// Scale so that the tolerance is 1 on both axes.
	ax, ay := (ua-pu)/tu, (va-pv)/tv
	bx, by := (ub-pu)/tu, (vb-pv)/tv
	dx, dy := bx-ax, by-ay
	t := 0.0
	if l := dx*dx + dy*dy; l > 0 {
		t = math.Max(0, math.Min(1, -(ax*dx+ay*dy)/l))
	}
	cx, cy := ax+t*dx, ay+t*dy
	return cx*cx+cy*cy <= 1
}

// Near reports whether a curve passes within Tolerance of node (i, j).
func (f *Footprint) Near(i, j int) bool { return f.near[j*f.nx+i] }

// Check returns the number of grid edges of m whose change of count the
// curves do not explain: two neighbouring decided nodes whose counts
// differ with no curve crossing between them, or a crossing whose
// predicted change (the sum over the curves that cross, each counted
// from its side with fewer unstable roots) differs from the change in m.
// Edges next to a node that a curve passes within Tolerance of are
// explained by that curve whatever their counts, since the polyline may
// put the node on either side; so are edges crossed by a curve whose
// change cannot be told (a pair that touches the axis and returns, say).
// m must have the axes the footprint was laid on.
func (f *Footprint) Check(m *grid.Map) int {
	if m.XAxis.N != f.nx || m.YAxis.N != f.ny {
		panic("boundary: footprint and map differ in size")
	}
	bad := 0
	explained := func(edge, a, b int) bool {
		d := int(m.RHP[b]) - int(m.RHP[a])
		if f.near[a] || f.near[b] {
			return true
		}
		ec, crossed := f.cross[edge]
		switch {
		case !crossed:
			return d == 0
		case ec.unpredictable:
			return true
		}
		return ec.delta == d
	}
	decided := func(k int) bool { return m.RHP[k] != grid.Undecided }
	for j := 0; j < f.ny; j++ {
		for i := 0; i < f.nx; i++ {
			k := j*f.nx + i
			if !decided(k) {
				continue
			}
			if i+1 < f.nx && decided(k+1) && m.RHP[k] != m.RHP[k+1] && !explained(2*k, k, k+1) {
				bad++
			}
			if j+1 < f.ny && decided(k+f.nx) && m.RHP[k] != m.RHP[k+f.nx] && !explained(2*k+1, k, k+f.nx) {
				bad++
			}
		}
	}
	// Crossed edges whose nodes share a count.
	for edge := range f.cross {
		a := edge / 2
		b := a + 1
		if edge%2 == 1 {
			b = a + f.nx
		}
		if decided(a) && decided(b) && m.RHP[a] == m.RHP[b] && !explained(edge, a, b) {
			bad++
		}
	}
	return bad
}
