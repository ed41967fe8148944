package dpartition

import "math"

// snapTol is how far outside a window side, in window coordinates, a
// computed end point may lie and still be taken as on the side: rounding
// of a point found as a root of the side's equation.
const snapTol = 1e-9

// maxChordLen caps a polyline segment, in window coordinates, so that a
// long chord never hides a bend that happens to pass through its
// test points.
const maxChordLen = 0.125

// maxDepth caps the halvings of one initial segment.
const maxDepth = 48

// window is the rectangle X × Y of the plane.
type window struct {
	x, y Range
}

func (w window) contains(x, y float64) bool {
	return x >= w.x.Min && x <= w.x.Max && y >= w.y.Min && y <= w.y.Max
}

// near reports whether (x, y) is inside the window or within snapTol of it.
func (w window) near(x, y float64) bool {
	u, v := w.unit(x, y)
	return u >= -snapTol && u <= 1+snapTol && v >= -snapTol && v <= 1+snapTol
}

// unit maps (x, y) to window coordinates, each side of length 1.
func (w window) unit(x, y float64) (u, v float64) {
	return (x - w.x.Min) / w.x.Span(), (y - w.y.Min) / w.y.Span()
}

// snap moves a coordinate that lies within snapTol of a side onto it.
func (w window) snap(p Point) Point {
	p.X = snapTo(p.X, w.x)
	p.Y = snapTo(p.Y, w.y)
	return p
}

func snapTo(v float64, r Range) float64 {
	lim := snapTol * r.Span()
	switch {
	case math.Abs(v-r.Min) <= lim:
		return r.Min
	case math.Abs(v-r.Max) <= lim:
		return r.Max
	}
	return v
}

// deviation is the distance in window coordinates from p to the segment
// from a to b.
func (w window) deviation(p, a, b Point) float64 {
	pu, pv := w.unit(p.X, p.Y)
	au, av := w.unit(a.X, a.Y)
	bu, bv := w.unit(b.X, b.Y)
	du, dv := bu-au, bv-av
	l2 := du*du + dv*dv
	t := 0.0
	if l2 > 0 {
		t = math.Max(0, math.Min(1, ((pu-au)*du+(pv-av)*dv)/l2))
	}
	return math.Hypot(pu-au-t*du, pv-av-t*dv)
}

func (w window) length(a, b Point) float64 {
	au, av := w.unit(a.X, a.Y)
	bu, bv := w.unit(b.X, b.Y)
	return math.Hypot(bu-au, bv-av)
}

// node is a sampled point with its curve parameter.
type node struct {
	t float64
	p Point
}

// sampler follows a curve t ↦ point, t in [0, 1], with a polyline whose
// segments stay within tol of the curve. A segment is accepted when the
// curve's points at a quarter, half and three quarters of its parameter
// interval all lie within tol of its chord and the chord is short; else it
// is halved, the quarter points becoming the midpoints of the halves, so
// refinement gathers where the curve bends.
type sampler struct {
	eval func(t float64) (Point, bool)
	win  window
	tol  float64
	n0   int // initial segments
}

type segment struct {
	a, m, b node
	depth   int
}

func (s *sampler) at(t float64) (node, bool) {
	p, ok := s.eval(t)
	return node{t, p}, ok && !math.IsNaN(p.X) && !math.IsNaN(p.Y)
}

// run samples the curve and returns its nodes in increasing t. It returns
// nil if the curve cannot be evaluated at its ends.
func (s *sampler) run() []node {
	first, ok := s.at(0)
	if !ok {
		return nil
	}
	out := []node{first}
	prev := first
	stack := make([]segment, 0, 2*maxDepth)
	for i := 1; i <= s.n0; i++ {
		end, ok := s.at(float64(i) / float64(s.n0))
		if !ok {
			return nil
		}
		mid, ok := s.at((prev.t + end.t) / 2)
		if !ok {
			mid = node{(prev.t + end.t) / 2, midpoint(prev.p, end.p)}
		}
		stack = append(stack[:0], segment{prev, mid, end, 0})
		for len(stack) > 0 {
			g := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			q1, ok1 := s.at((g.a.t + g.m.t) / 2)
			q3, ok3 := s.at((g.m.t + g.b.t) / 2)
			fine := ok1 && ok3 &&
				s.win.deviation(g.m.p, g.a.p, g.b.p) <= s.tol &&
				s.win.deviation(q1.p, g.a.p, g.b.p) <= s.tol &&
				s.win.deviation(q3.p, g.a.p, g.b.p) <= s.tol &&
				s.win.length(g.a.p, g.b.p) <= maxChordLen
			if fine || g.depth >= maxDepth || !ok1 || !ok3 {
				out = append(out, g.b)
				continue
			}
			stack = append(stack, segment{g.m, q3, g.b, g.depth + 1}, segment{g.a, q1, g.m, g.depth + 1})
		}
		prev = end
	}
	return out
}

func midpoint(a, b Point) Point {
	return Point{(a.X + b.X) / 2, (a.Y + b.Y) / 2, (a.Omega + b.Omega) / 2}
}

// clip cuts a sampled polyline where it leaves the window, finding each
// exit by bisection in t, and returns the runs inside. The ends of a piece
// already lie on the window sides, found as exact roots; this is the net
// under a crossing that root finding could not resolve, such as two
// crossings closer than one sweep step of a delay loop.
func (s *sampler) clip(nodes []node) [][]Point {
	var runs [][]Point
	var cur []Point
	for i, nd := range nodes {
		in := s.win.near(nd.p.X, nd.p.Y)
		if in {
			if cur == nil && i > 0 {
				cur = append(cur, s.boundary(nodes[i-1], nd))
			}
			cur = append(cur, s.win.snap(nd.p))
			continue
		}
		if cur != nil {
			cur = append(cur, s.boundary(nodes[i-1], nd))
			runs = append(runs, cur)
			cur = nil
		}
	}
	if len(cur) > 1 {
		runs = append(runs, cur)
	}
	return runs
}

// boundary bisects between a node inside the window and one outside (in
// either order) for the point where the curve crosses a side.
func (s *sampler) boundary(a, b node) Point {
	inA := s.win.near(a.p.X, a.p.Y)
	for it := 0; it < 60; it++ {
		m, ok := s.at((a.t + b.t) / 2)
		if !ok || m.t == a.t || m.t == b.t {
			break
		}
		if s.win.near(m.p.X, m.p.Y) == inA {
			a = m
		} else {
			b = m
		}
	}
	if inA {
		return s.win.snap(a.p)
	}
	return s.win.snap(b.p)
}
