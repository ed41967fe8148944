package dpartition

import (
	"math"
	"sort"
)

// conic is the bilinear function a + b·x + c·y + e·x·y. Its zero set, a
// line or a hyperbola with axis-parallel asymptotes, is the shape of every
// edge that does not depend on ω: the real edge Δ(0; x, y) = 0, the edge
// where a leading coefficient vanishes, and a whole line of crossings at
// one frequency.
type conic struct {
	a, b, c, e float64
}

func (q conic) at(x, y float64) float64 { return q.a + q.b*x + q.c*y + q.e*x*y }

func (q conic) gradient(x, y float64) (gx, gy float64) { return q.b + q.e*y, q.c + q.e*x }

func (q conic) add(r conic) conic { return conic{q.a + r.a, q.b + r.b, q.c + r.c, q.e + r.e} }

func (q conic) scale(k float64) conic { return conic{k * q.a, k * q.b, k * q.c, k * q.e} }

// swapped exchanges the roles of x and y.
func (q conic) swapped() conic { return conic{q.a, q.c, q.b, q.e} }

// zero reports whether q vanishes everywhere.
func (q conic) zero() bool { return q.a == 0 && q.b == 0 && q.c == 0 && q.e == 0 }

// maxAbs returns the largest |q| over the window, found at a corner: q is
// affine along every line parallel to an axis, so |q| takes its extremes
// on the sides, and along each side at its ends.
func (q conic) maxAbs(w window) float64 {
	m := 0.0
	for _, x := range [2]float64{w.x.Min, w.x.Max} {
		for _, y := range [2]float64{w.y.Min, w.y.Max} {
			m = math.Max(m, math.Abs(q.at(x, y)))
		}
	}
	return m
}

// minAbs returns the smallest |q| over the window: zero when q changes
// sign there, else the smallest corner value (for the same reason as
// maxAbs).
func (q conic) minAbs(w window) float64 {
	m, pos, neg := math.Inf(1), false, false
	for _, x := range [2]float64{w.x.Min, w.x.Max} {
		for _, y := range [2]float64{w.y.Min, w.y.Max} {
			v := q.at(x, y)
			pos, neg = pos || v > 0, neg || v < 0
			m = math.Min(m, math.Abs(v))
		}
	}
	if (pos && neg) || m == 0 {
		return 0
	}
	return m
}

// arc is a piece of a conic's zero set inside the window, on which the
// split function keeps one sign.
type arc []Point

// arcs returns the zero set of q inside w as polylines within tol of the
// curve (window coordinates), cut where split changes sign, with Omega set
// to omega on every point. The points of each arc run in increasing x, or
// in increasing y on a line parallel to the y axis.
func (w window) arcs(q, split conic, omega, tol float64) []arc {
	if q.e == 0 && math.Abs(q.c)*w.y.Span() < math.Abs(q.b)*w.x.Span() {
		// Closer to the y direction: follow the line in y.
		sw := window{w.y, w.x}
		out := sw.arcs(q.swapped(), split.swapped(), omega, tol)
		for _, a := range out {
			for i := range a {
				a[i].X, a[i].Y = a[i].Y, a[i].X
			}
		}
		return out
	}
	if q.e == 0 && q.c == 0 {
		return nil // q is a constant: no edge, or (all zero) no information
	}
	var out []arc
	if q.e != 0 && q.a*q.e == q.b*q.c {
		// q = (c + e·x)(y + b/e): the vertical line x = −c/e and the
		// horizontal line y = −b/e. The gradient of q changes direction
		// where they cross, and so does the side of fewer roots: each
		// line is cut there.
		out = append(out, w.arcs(conic{q.c, q.e, 0, 0}, split, omega, tol)...)
		out = append(out, w.arcs(conic{q.b, 0, q.e, 0}, split, omega, tol)...)
		return cutAt(out, -q.c/q.e, -q.b/q.e)
	}
	// y(x) = −(a + b·x)/(c + e·x) on each branch, with dy/dx =
	// (a·e − b·c)/(c + e·x)² of one sign: monotone.
	lo, hi := w.x.Min, w.x.Max
	cuts := []float64{lo, hi}
	if q.e != 0 {
		if x0 := -q.c / q.e; x0 > lo && x0 < hi {
			cuts = append(cuts, x0)
		}
	}
	for _, yv := range [2]float64{w.y.Min, w.y.Max} {
		if d := q.b + q.e*yv; d != 0 {
			if xs := -(q.a + q.c*yv) / d; xs > lo && xs < hi {
				cuts = append(cuts, xs)
			}
		}
	}
	// Where the split function changes sign on the curve:
	// split(x, y(x))·(c + e·x) is a quadratic in x.
	s := split
	c2 := s.b*q.e - s.e*q.b
	c1 := s.a*q.e + s.b*q.c - s.c*q.b - s.e*q.a
	c0 := s.a*q.c - s.c*q.a
	var rs [2]float64
	for _, r := range rs[:roots(c0, c1, c2, false, &rs)] {
		if r > lo && r < hi {
			cuts = append(cuts, r)
		}
	}
	sort.Float64s(cuts)
	// Adding zero turns a −0 into +0 for reports.
	yOf := func(x float64) float64 { return -(q.a+q.b*x)/(q.c+q.e*x) + 0 }
	var cur arc
	for i := 0; i+1 < len(cuts); i++ {
		x0, x1 := cuts[i], cuts[i+1]
		if !(x1 > x0) {
			continue
		}
		xm := (x0 + x1) / 2
		if ym := yOf(xm); !(ym >= w.y.Min && ym <= w.y.Max) {
			cur = flush(&out, cur)
			continue
		}
		smp := sampler{
			eval: func(t float64) (Point, bool) {
				x := x0 + (x1-x0)*t
				if t == 1 {
					x = x1
				}
				return Point{x, yOf(x), omega}, true
			},
			win: w, tol: tol, n0: 2,
		}
		var pts [][]Point
		if q.e == 0 {
			// A straight line needs its two ends only.
			a, _ := smp.eval(0)
			b, _ := smp.eval(1)
			pts = [][]Point{{w.snap(a), w.snap(b)}}
		} else {
			pts = smp.clip(smp.run())
		}
		for _, run := range pts {
			if len(cur) > 0 && cur[len(cur)-1] == run[0] && !splitAt(s, run[0]) {
				cur = append(cur, run[1:]...)
				continue
			}
			cur = flush(&out, cur)
			cur = append(cur, run...)
		}
	}
	flush(&out, cur)
	return out
}

// cutAt cuts every arc of axis-parallel segments that passes through
// (x, y) between two of its points there.
func cutAt(arcs []arc, x, y float64) []arc {
	var out []arc
	for _, a := range arcs {
		for k := 0; k+1 < len(a); k++ {
			p, q := a[k], a[k+1]
			inside := func(v, lo, hi float64) bool { return v > math.Min(lo, hi) && v < math.Max(lo, hi) }
			if (p.X == q.X && inside(y, p.Y, q.Y)) || (p.Y == q.Y && inside(x, p.X, q.X)) {
				cut := Point{p.X, p.Y, p.Omega}
				if p.X == q.X {
					cut.Y = y
				} else {
					cut.X = x
				}
				out = append(out, append(append(arc{}, a[:k+1]...), cut))
				a = append(arc{cut}, a[k+1:]...)
				k = -1
			}
		}
		out = append(out, a)
	}
	return out
}

// splitAt reports whether the split function vanishes at p, so that the
// arc must be cut there.
func splitAt(s conic, p Point) bool {
	v := s.at(p.X, p.Y)
	scale := math.Abs(s.a) + math.Abs(s.b*p.X) + math.Abs(s.c*p.Y) + math.Abs(s.e*p.X*p.Y)
	return math.Abs(v) <= 1e-12*scale
}

func flush(out *[]arc, cur arc) arc {
	if len(cur) > 1 {
		*out = append(*out, cur)
	}
	return nil
}
