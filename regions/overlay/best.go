package overlay

import (
	"errors"
	"fmt"
	"math"

	"gainscape/regions/family"
	"gainscape/regions/plane"
)

// searchTol is the stopping width of the local searches, relative to the
// span of the axis searched.
const searchTol = 1e-10

// BestDecay returns the stable point with the largest decay rate: the
// best node of g.Decay, refined within the cells around it by pattern
// search on the continuous decay rate (a compass search with diagonal
// moves and step halving, after R. Hooke, T. A. Jeeves, "Direct search
// solution of numerical and statistical problems", J. ACM 8(2), 1961),
// which needs no derivative: the decay rate has corners where two poles
// are equally slow, and the optimum usually sits on one. The result is
// never worse than the best node. g must come from Compute for s (it
// panics otherwise); opt.Sensitivity, if set, gives Ms at the point. It
// returns an error if no node is stable.
func BestDecay(s plane.Setup, g *Grids, opt Options) (Optimum, error) {
	checkGrids(s, g)
	best := -1
	for k, v := range g.Decay {
		if !math.IsNaN(v) && (best < 0 || v > g.Decay[best]) {
			best = k
		}
	}
	if best < 0 {
		return Optimum{}, errors.New("largest decay rate: no stable node in the map")
	}
	i, j := best%s.X.N, best/s.X.N
	pr := newProber(s)
	x0, x1 := cellRange(s.X, i)
	y0, y1 := cellRange(s.Y, j)
	x, y := s.X.At(i), s.Y.At(j)
	f, _ := pr.decayAndDamping(x, y)
	hx, hy := (x1-x0)/4, (y1-y0)/4
	tx, ty := searchTol*math.Abs(s.X.Span()), searchTol*math.Abs(s.Y.Span())
	dirs := [8][2]float64{{1, 0}, {-1, 0}, {0, 1}, {0, -1}, {1, 1}, {-1, 1}, {1, -1}, {-1, -1}}
	for evals := 0; (hx > tx || hy > ty) && evals < maxEvals; {
		bx, by, bf := x, y, f
		for _, d := range dirs {
			cx, cy := clamp(x+d[0]*hx, x0, x1), clamp(y+d[1]*hy, y0, y1)
			if v, _ := pr.decayAndDamping(cx, cy); v > bf {
				bx, by, bf = cx, cy, v
			}
			evals++
		}
		if bf > f {
			x, y, f = bx, by, bf
			continue
		}
		hx, hy = hx/2, hy/2
	}
	o := pr.describe(Optimum{X: x, Y: y, Criterion: "largest decay rate"}, opt.Sensitivity)
	o.Objective = o.Decay
	return o, nil
}

// maxEvals bounds the work of one local search.
const maxEvals = 20000

// cellRange returns the values of the nodes on either side of node i of
// a, clamped to the axis, in increasing order.
func cellRange(a plane.Axis, i int) (float64, float64) {
	u, v := a.At(max(i-1, 0)), a.At(min(i+1, a.N-1))
	return min(u, v), max(u, v)
}

func clamp(v, lo, hi float64) float64 { return math.Min(math.Max(v, lo), hi) }

// checkGrids panics if g was not computed over the axes of s.
func checkGrids(s plane.Setup, g *Grids) {
	if g == nil || g.XAxis != s.X || g.YAxis != s.Y || len(g.Decay) != s.X.N*s.Y.N {
		panic(fmt.Sprintf("overlay: grids do not match the setup's axes %v × %v", s.X, s.Y))
	}
}

// BestIntegral returns the stable point with the largest integral gain ki
// subject to Ms ≤ bound, the load-disturbance design criterion of
// K. J. Åström, H. Panagopoulos, T. Hägglund, "Design of PI controllers
// based on non-convex optimization", Automatica 34(5), 1998 (from memory):
// the integral gain sets the integrated error after a load step, and the
// bound on Ms keeps robustness.
//
// When ki is an axis, the feasible node with the largest ki is found in
// g.Ms; the constrained maximum then lies on the contour Ms = bound (or
// where stability ends) above it, which is located by bisection along the
// grid edges in the ki direction, and followed between the neighbouring
// nodes by golden-section search (J. Kiefer, "Sequential minimax search for
// a maximum", Proc. AMS 4(3), 1953) on the contour's height. When ki is
// cut by the axis maximum, the feasible node there with the smallest Ms is
// returned. When ki is a fixed parameter, every feasible node has the same
// objective and the one with the smallest Ms is returned.
//
// g must come from Compute for s with opt.Sensitivity set (it panics
// otherwise). It returns an error if the family has no ki, the bound is
// not a positive number, or no node satisfies it.
func BestIntegral(s plane.Setup, g *Grids, opt Options, bound float64) (Optimum, error) {
	checkGrids(s, g)
	if opt.Sensitivity == nil || g.Ms == nil {
		panic("overlay: BestIntegral needs grids computed with a Sensitivity evaluator and the same evaluator in opt")
	}
	ki, err := family.Index(s.Family, "ki")
	if err != nil {
		return Optimum{}, fmt.Errorf("largest ki: %w", err)
	}
	if !(bound > 0) || math.IsInf(bound, 1) {
		return Optimum{}, fmt.Errorf("largest ki: Ms bound %g is not a positive number", bound)
	}
	crit := fmt.Sprintf("largest ki with Ms ≤ %g", bound)
	feasible := func(k int) bool { return !math.IsNaN(g.Ms[k]) && g.Ms[k] <= bound }
	pr := newProber(s)

	var along plane.Axis // the ki axis, or none
	var at func(u, v float64) (x, y float64)
	var index func(iu, iv int) int
	var other plane.Axis
	switch ki {
	case s.XIndex:
		along, other = s.X, s.Y
		at = func(u, v float64) (float64, float64) { return u, v }
		index = func(iu, iv int) int { return iv*s.X.N + iu }
	case s.YIndex:
		along, other = s.Y, s.X
		at = func(u, v float64) (float64, float64) { return v, u }
		index = func(iu, iv int) int { return iu*s.X.N + iv }
	default:
		best := -1
		for k := range g.Ms {
			if feasible(k) && (best < 0 || g.Ms[k] < g.Ms[best]) {
				best = k
			}
		}
		if best < 0 {
			return Optimum{}, fmt.Errorf("%s: no stable node meets the bound", crit)
		}
		o := Optimum{X: s.X.At(best % s.X.N), Y: s.Y.At(best / s.X.N), Criterion: crit + " (ki fixed: smallest Ms)"}
		o = pr.describe(o, opt.Sensitivity)
		o.Objective = s.Values[ki]
		return o, nil
	}

	if !(along.Min < along.Max) {
		panic(fmt.Sprintf("overlay: ki axis %v must increase", along))
	}
	// The feasible nodes on the highest ki line; the one with the smallest
	// Ms stands for the line if no edge above can be refined.
	top, bestV := -1, -1
	for iu := along.N - 1; iu >= 0 && top < 0; iu-- {
		for iv := 0; iv < other.N; iv++ {
			if k := index(iu, iv); feasible(k) && (bestV < 0 || g.Ms[k] < g.Ms[index(iu, bestV)]) {
				top, bestV = iu, iv
			}
		}
	}
	if top < 0 {
		return Optimum{}, fmt.Errorf("%s: no stable node meets the bound", crit)
	}
	ok := func(u, v float64) bool {
		x, y := at(u, v)
		return pr.stable(x, y) && pr.ms(opt.Sensitivity, x, y) <= bound
	}
	c := contour{along: along, ok: ok}
	bu, bv := along.At(top), other.At(bestV)
	if top < along.N-1 {
		for iv := 0; iv < other.N; iv++ {
			if !feasible(index(top, iv)) {
				continue
			}
			if u := c.height(top, other.At(iv)); u > bu {
				bu, bv = u, other.At(iv)
			}
		}
		bu, bv = c.follow(top, bu, bv, other)
	}
	x, y := at(bu, bv)
	o := pr.describe(Optimum{X: x, Y: y, Criterion: crit}, opt.Sensitivity)
	o.Objective = bu
	return o, nil
}

// contour measures the height, in the ki direction, of the feasible set
// above grid line top of the ki axis.
type contour struct {
	along plane.Axis
	ok    func(u, v float64) bool
}

// height returns the largest feasible u reached from (along.At(top), v)
// going up: cell by cell while the next grid line is feasible, then by
// bisection to searchTol of the axis span. It returns −Inf if the start is
// not feasible and the axis maximum if the set reaches it.
func (c contour) height(top int, v float64) float64 {
	if !c.ok(c.along.At(top), v) {
		return math.Inf(-1)
	}
	lo := top
	for lo+1 < c.along.N && c.ok(c.along.At(lo+1), v) {
		lo++
	}
	if lo == c.along.N-1 {
		return c.along.At(lo)
	}
	a, b := c.along.At(lo), c.along.At(lo+1)
	tol := searchTol * math.Abs(c.along.Span())
	for math.Abs(b-a) > tol {
		m := 0.5 * (a + b)
		if c.ok(m, v) {
			a = m
		} else {
			b = m
		}
	}
	return a
}

// follow maximises the height over v between the grid lines of other
// beside v by golden-section search, starting from the best edge (u, v),
// and returns the best point seen.
func (c contour) follow(top int, u, v float64, other plane.Axis) (float64, float64) {
	iv := 0
	for k := 0; k < other.N; k++ {
		if math.Abs(other.At(k)-v) < math.Abs(other.At(iv)-v) {
			iv = k
		}
	}
	a, b := cellRange(other, iv)
	tol := searchTol * math.Abs(other.Span())
	g := (math.Sqrt(5) - 1) / 2
	p, q := b-g*(b-a), a+g*(b-a)
	hp, hq := c.height(top, p), c.height(top, q)
	for evals := 0; b-a > tol && evals < maxEvals; evals++ {
		for _, s := range [2]struct{ h, v float64 }{{hp, p}, {hq, q}} {
			if s.h > u {
				u, v = s.h, s.v
			}
		}
		if hp >= hq {
			b, q, hq = q, p, hp
			p = b - g*(b-a)
			hp = c.height(top, p)
		} else {
			a, p, hp = p, q, hq
			q = a + g*(b-a)
			hq = c.height(top, q)
		}
	}
	for _, s := range [2]struct{ h, v float64 }{{hp, p}, {hq, q}} {
		if s.h > u {
			u, v = s.h, s.v
		}
	}
	return u, v
}
