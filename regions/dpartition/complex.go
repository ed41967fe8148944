package dpartition

import (
	"math"

	"gainscape/regions/stability"
)

// piece is one solution of the edge equations (sheet, counted in
// increasing x among count solutions) over a frequency interval [a, b]
// between two critical frequencies, lying inside the window.
type piece struct {
	a, b         float64
	sheet, count int
}

// intervalMid returns a frequency inside (a, b); b may be +Inf.
func (pc *pencil) intervalMid(a, b float64) float64 {
	switch {
	case math.IsInf(b, 1):
		return a + math.Max(a, pc.scale)
	case a > 0 && b > 4*a:
		return math.Sqrt(a * b)
	}
	return a + (b-a)/2
}

// pieces returns the pieces of the complex edge inside the window.
func (pc *pencil) pieces(crit []float64, w window) []piece {
	var out []piece
	var sols [2]solution
	for i := 0; i+1 < len(crit); i++ {
		a, b := crit[i], crit[i+1]
		f := newFreq(pc.intervalMid(a, b), pc.delay)
		n := pc.solve(&f, false, &sols)
		for k, s := range sols[:n] {
			if w.contains(s.x, s.y) {
				out = append(out, piece{a, b, k, n})
			}
		}
	}
	return out
}

// omegaAt maps the curve parameter t in [0, 1] of a piece to ω: linearly
// for a delay loop or a short interval, geometrically over an interval of
// many octaves, and as a + s·t/(1 − t) up to ω → ∞.
func (pc *pencil) omegaAt(pe piece, t float64) float64 {
	a, b := pe.a, pe.b
	switch {
	case t <= 0:
		return a
	case t >= 1:
		return b
	case math.IsInf(b, 1):
		return a + math.Max(a, pc.scale)*t/(1-t)
	case pc.delay == 0 && a > 0 && b > 4*a:
		return a * math.Pow(b/a, t)
	}
	return a + (b-a)*t
}

// pointAt evaluates one sheet of the edge at ω. At an end of a piece the
// solution count may differ from the piece's (two roots meeting at a fold,
// or one leaving through infinity); the discriminant is then clamped at
// zero, and if the sheet is still missing, ω is moved inside the piece by
// 1e-12 of its size, then by up to 1e-6.
func (pc *pencil) pointAt(pe piece, omega float64) (Point, solution, bool) {
	var sols [2]solution
	for nudge := 0; nudge < 4; nudge++ {
		f := newFreq(omega, pc.delay)
		n := pc.solve(&f, true, &sols)
		if n == pe.count {
			s := sols[pe.sheet]
			return Point{s.x, s.y, omega}, s, true
		}
		d := 1e-12 * math.Pow(100, float64(nudge)) * math.Max(omega, pc.scale)
		if omega-pe.a < pe.b-omega || math.IsInf(pe.b, 1) {
			omega = math.Min(omega+d, pc.intervalMid(pe.a, pe.b))
		} else {
			omega = math.Max(omega-d, pc.intervalMid(pe.a, pe.b))
		}
	}
	return Point{}, solution{}, false
}

// limitPoint is the end of a piece of a rational loop's edge as ω → ∞:
// F(t, ν)/ν^d tends to the quadratic of the coefficients of ν^d, d the
// highest degree among them, whose roots are the limits of the solutions.
// The root nearest the last finite sample is taken, for each coordinate.
func (pc *pencil) limitPoint(near Point) (Point, bool) {
	x, okx := limitRoot(&pc.x, near.X)
	y, oky := limitRoot(&pc.y, near.Y)
	return Point{x, y, math.Inf(1)}, okx && oky
}

func limitRoot(q *quadratic, near float64) (float64, bool) {
	d := 0
	for k := 0; k <= q.deg; k++ {
		d = max(d, len(q.c[k].even)-1)
	}
	var l [3]float64
	for k := 0; k <= q.deg; k++ {
		if e := q.c[k].even; len(e)-1 == d {
			l[k] = e[d]
		}
	}
	var rs [2]float64
	n := roots(l[0], l[1], l[2], false, &rs)
	best, ok := 0.0, false
	for _, r := range rs[:n] {
		if !ok || math.Abs(r-near) < math.Abs(best-near) {
			best, ok = r, true
		}
	}
	return best, ok
}

// tracePiece samples one piece into polylines inside the window.
func (pc *pencil) tracePiece(pe piece, w window, tol float64) [][]Point {
	eval := func(t float64) (Point, bool) {
		om := pc.omegaAt(pe, t)
		if math.IsInf(om, 1) {
			near, _, ok := pc.pointAt(pe, pc.omegaAt(pe, 1-1e-6))
			if !ok {
				return Point{}, false
			}
			return pc.limitPoint(near)
		}
		p, _, ok := pc.pointAt(pe, om)
		return p, ok
	}
	n0 := 8
	if pc.delay > 0 {
		// At least 16 initial segments per 2π of ωL.
		n0 = max(n0, int(math.Ceil((pe.b-pe.a)*pc.delay/(math.Pi/8))))
	}
	s := sampler{eval: eval, win: w, tol: tol, n0: n0}
	return s.clip(s.run())
}

// complexCurves traces every piece and joins the pieces that meet end to
// start at a critical frequency into curves of increasing ω, each with one
// side of fewer unstable roots and one branch.
func (pc *pencil) complexCurves(ps []piece, w window, tol float64) []Curve {
	var out []Curve
	for _, pe := range ps {
		mid := pc.intervalMid(pe.a, pe.b)
		_, s, ok := pc.pointAt(pe, mid)
		if !ok {
			continue
		}
		fewer, branch := sideOf(s.j), pc.branch(mid)
		for _, run := range pc.tracePiece(pe, w, tol) {
			if i := joinable(out, run[0], fewer, branch, w); i >= 0 {
				out[i].Points = append(out[i].Points, run[1:]...)
				continue
			}
			out = append(out, Curve{Kind: stability.Complex, Points: run, Fewer: fewer, Change: 2, Branch: branch})
		}
	}
	return out
}

// joinable returns the index of the curve that ends where a run starts, at
// the same frequency, with the same side and branch, or -1.
func joinable(cs []Curve, start Point, fewer Side, branch int, w window) int {
	for i := range cs {
		c := &cs[i]
		last := c.Points[len(c.Points)-1]
		if c.Fewer == fewer && c.Branch == branch && last.Omega == start.Omega && w.length(last, start) <= 1e-7 {
			return i
		}
	}
	return -1
}

// branch numbers the branch of a delay loop's edge at ω: ⌊ωL/2π⌋.
func (pc *pencil) branch(omega float64) int {
	if pc.delay == 0 {
		return 0
	}
	return int(math.Floor(omega * pc.delay / (2 * math.Pi)))
}
