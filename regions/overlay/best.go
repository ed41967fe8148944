package overlay

import (
	"fmt"
	"math"
	"sort"

	"gainscape/regions/family"
	"gainscape/regions/plane"
)

// searchTol is the stopping width of the local searches, relative to the
// span of the axis searched.
const searchTol = 1e-10

// NotFound is the error of a search that found no point meeting its
// criterion; the map itself is fine.
type NotFound struct{ Reason string }

func (e *NotFound) Error() string { return e.Reason }

// flatTol is the relative width of a flat optimum: node decay rates
// within it of the best count as equally good, and the one with the
// lowest Ms (the more robust design) is taken.
const flatTol = 1e-3

// tieTol is the relative difference of decay rates the local search
// treats as a tie, broken by Ms.
const tieTol = 1e-9

// decayStarts is how many nodes of each kind (best, and most robust of
// the nearly best) the decay search starts from; decayEvals bounds the
// evaluations of each start.
const (
	decayStarts = 6
	decayEvals  = 3000
)

// BestDecay returns the stable point with the largest decay rate among
// those with Ms ≤ bound (no bound when bound is 0). The decay rate has
// corners where two poles are equally slow and its maximum usually sits
// on one, often between nodes, so the search refines from several nodes:
// the best ones, and the most robust (lowest Ms) among those within one
// cell's variation of the best. Each refinement is a pattern search on
// the continuous decay rate within two cells of its node (a compass
// search with diagonal moves and step halving, after R. Hooke,
// T. A. Jeeves, "Direct search solution of numerical and statistical
// problems", J. ACM 8(2), 1961), which needs no derivative. The largest
// decay rate is often reached along a whole ridge, so optima are flat:
// results within flatTol of the best count as equal and the lower Ms wins,
// as it does between moves of a search that tie. With a bound, the point
// found is checked with opt.Exact (the refined Ms) and moved back towards
// its node until it meets the bound. g must come from Compute for s, with
// Ms when bound is not 0 (it panics otherwise). It returns a *NotFound
// error if no node qualifies.
func BestDecay(s plane.Setup, g *Grids, opt Options, bound float64) (Optimum, error) {
	checkGrids(s, g)
	if bound != 0 && g.Ms == nil {
		panic("overlay: BestDecay with an Ms bound needs grids computed with a Sensitivity evaluator")
	}
	crit := "largest decay rate"
	if bound != 0 {
		crit = fmt.Sprintf("largest decay rate with Ms ≤ %g", bound)
	}
	ms := func(k int) float64 {
		if g.Ms == nil {
			return 0
		}
		return g.Ms[k]
	}
	feasible := func(k int) bool {
		return !math.IsNaN(g.Decay[k]) && (bound == 0 || ms(k) <= bound)
	}
	var order []int
	for k := range g.Decay {
		if feasible(k) {
			order = append(order, k)
		}
	}
	if len(order) == 0 {
		if bound != 0 && !allNaN(g.Decay) {
			return Optimum{}, &NotFound{fmt.Sprintf("%s: no stable node has Ms ≤ %g", crit, bound)}
		}
		return Optimum{}, &NotFound{crit + ": no stable node in the map"}
	}
	sort.SliceStable(order, func(a, b int) bool { return g.Decay[order[a]] > g.Decay[order[b]] })
	top := order[0]
	// One cell's variation: the largest change from the best node to a
	// neighbour.
	spread := 0.0
	ti, tj := top%s.X.N, top/s.X.N
	for _, d := range [4][2]int{{1, 0}, {-1, 0}, {0, 1}, {0, -1}} {
		if i, j := ti+d[0], tj+d[1]; i >= 0 && j >= 0 && i < s.X.N && j < s.Y.N {
			if v := g.Decay[j*s.X.N+i]; !math.IsNaN(v) {
				spread = math.Max(spread, g.Decay[top]-v)
			}
		}
	}
	starts := order[:min(decayStarts, len(order))]
	var near []int
	for _, k := range order {
		if g.Decay[k] < g.Decay[top]-spread {
			break
		}
		near = append(near, k)
	}
	sort.SliceStable(near, func(a, b int) bool { return ms(near[a]) < ms(near[b]) })
	starts = append(append([]int(nil), starts...), near[:min(decayStarts, len(near))]...)

	pr := newProber(s)
	value := func(x, y float64) (decay, m float64, ok bool) {
		decay = pr.decay(x, y)
		m = pr.ms(opt.Sensitivity, x, y)
		if math.IsNaN(m) {
			m = 0
		}
		return decay, m, bound == 0 || m <= bound
	}
	type result struct{ x, y, decay, ms float64 }
	var best *result
	seen := map[int]bool{}
	for _, k := range starts {
		if seen[k] {
			continue
		}
		seen[k] = true
		i, j := k%s.X.N, k/s.X.N
		x, y := refineDecay(s, value, i, j)
		if bound != 0 {
			x, y = backOff(pr, opt.exact(), bound, s.X.At(i), s.Y.At(j), x, y)
		}
		d, m, _ := value(x, y)
		r := result{x, y, d, m}
		if best == nil || r.decay > best.decay+flatTol*math.Abs(best.decay) ||
			(r.decay >= best.decay-flatTol*math.Abs(best.decay) && r.ms < best.ms) {
			best = &r
		}
	}
	o := pr.describe(Optimum{X: best.x, Y: best.y, Criterion: crit}, opt.exact())
	o.Objective = o.Decay
	return o, nil
}

// refineDecay runs the pattern search for the largest decay rate from node
// (i, j), within two cells of it, breaking ties of decay rate by Ms.
func refineDecay(s plane.Setup, value func(x, y float64) (float64, float64, bool), i, j int) (float64, float64) {
	x0, x1 := cellRange(s.X, i, 2)
	y0, y1 := cellRange(s.Y, j, 2)
	better := func(d, m, bd, bm float64) bool {
		if d > bd+tieTol*math.Abs(bd) {
			return true
		}
		return d >= bd-tieTol*math.Abs(bd) && m < bm
	}
	x, y := s.X.At(i), s.Y.At(j)
	f, fm, _ := value(x, y)
	hx, hy := (x1-x0)/8, (y1-y0)/8
	tx, ty := searchTol*math.Abs(s.X.Span()), searchTol*math.Abs(s.Y.Span())
	dirs := [8][2]float64{{1, 0}, {-1, 0}, {0, 1}, {0, -1}, {1, 1}, {-1, 1}, {1, -1}, {-1, -1}}
	for evals := 0; (hx > tx || hy > ty) && evals < decayEvals; {
		bx, by, bf, bm := x, y, f, fm
		for _, d := range dirs {
			cx, cy := clamp(x+d[0]*hx, x0, x1), clamp(y+d[1]*hy, y0, y1)
			if v, m, ok := value(cx, cy); ok && better(v, m, bf, bm) {
				bx, by, bf, bm = cx, cy, v, m
			}
			evals++
		}
		if bx != x || by != y {
			x, y, f, fm = bx, by, bf, bm
			continue
		}
		hx, hy = hx/2, hy/2
	}
	return x, y
}

// backOff returns the point of the segment from (ax, ay), which meets the
// bound, to (bx, by) nearest (bx, by) whose Ms by exact is at most bound:
// (bx, by) itself if it meets it, else the end of a bisection to
// searchTol of the segment.
func backOff(pr *prober, exact Sensitivity, bound, ax, ay, bx, by float64) (float64, float64) {
	ok := func(t float64) bool {
		x, y := ax+t*(bx-ax), ay+t*(by-ay)
		return pr.stable(x, y) && pr.ms(exact, x, y) <= bound
	}
	if ok(1) {
		return bx, by
	}
	lo, hi := 0.0, 1.0
	for hi-lo > searchTol {
		m := 0.5 * (lo + hi)
		if ok(m) {
			lo = m
		} else {
			hi = m
		}
	}
	return ax + lo*(bx-ax), ay + lo*(by-ay)
}

func allNaN(v []float64) bool {
	for _, x := range v {
		if !math.IsNaN(x) {
			return false
		}
	}
	return true
}

// maxEvals bounds the work of one local search.
const maxEvals = 20000

// cellRange returns the values of the nodes cells away on either side of
// node i of a, clamped to the axis, in increasing order.
func cellRange(a plane.Axis, i, cells int) (float64, float64) {
	u, v := a.At(max(i-cells, 0)), a.At(min(i+cells, a.N-1))
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
// based on non-convex optimization", Automatica 34(5), 1998: the integral
// gain sets the integrated error after a load step (IE = 1/ki), and the
// bound on Ms keeps robustness.
//
// When ki is an axis, the feasible node with the largest ki is found in
// g.Ms; the constrained maximum then lies on the contour Ms = bound (or
// where stability ends) above it, which is located by bisection along the
// grid edges in the ki direction, and followed between the neighbouring
// nodes by golden-section search (J. Kiefer, "Sequential minimax search for
// a maximum", Proc. AMS 4(3), 1953) on the contour's height. The grid and
// these searches use opt.Sensitivity, which may read Ms a little low; the
// point found is then checked with opt.Exact, the refined Ms the probe
// reports, and lowered in ki by bisection until it meets the bound, so
// the point returned always satisfies it. When ki is cut by the axis
// maximum, the feasible node there with the smallest Ms is returned. When
// ki is a fixed parameter, every feasible node has the same objective and
// the one with the smallest Ms is returned.
//
// g must come from Compute for s with opt.Sensitivity set (it panics
// otherwise). It returns an error if the family has no ki or the bound is
// not a positive number, and a *NotFound error if no node satisfies the
// bound.
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
	exact := opt.exact()
	meets := func(x, y float64) bool { return pr.stable(x, y) && pr.ms(exact, x, y) <= bound }
	none := func() error {
		if allNaN(g.Decay) {
			return &NotFound{crit + ": no stable node in the map"}
		}
		return &NotFound{fmt.Sprintf("%s: no stable node has Ms ≤ %g", crit, bound)}
	}

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
			if feasible(k) && meets(s.X.At(k%s.X.N), s.Y.At(k/s.X.N)) && (best < 0 || g.Ms[k] < g.Ms[best]) {
				best = k
			}
		}
		if best < 0 {
			return Optimum{}, none()
		}
		o := Optimum{X: s.X.At(best % s.X.N), Y: s.Y.At(best / s.X.N), Criterion: crit + " (ki fixed: smallest Ms)"}
		o = pr.describe(o, exact)
		o.Objective = s.Values[ki]
		return o, nil
	}

	if !(along.Min < along.Max) {
		panic(fmt.Sprintf("overlay: ki axis %v must increase", along))
	}
	// The highest ki line with a node that meets the bound by the refined
	// Ms as well; its feasible node with the smallest Ms stands for the
	// line if no edge above can be refined.
	top, bestV := -1, -1
	for iu := along.N - 1; iu >= 0 && top < 0; iu-- {
		for iv := 0; iv < other.N; iv++ {
			k := index(iu, iv)
			if feasible(k) && (bestV < 0 || g.Ms[k] < g.Ms[index(iu, bestV)]) {
				if x, y := at(along.At(iu), other.At(iv)); meets(x, y) {
					top, bestV = iu, iv
				}
			}
		}
	}
	if top < 0 {
		return Optimum{}, none()
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
	// The refined Ms may exceed what the grid's Ms allowed: lower ki
	// until the point meets the bound, from the line below, which does.
	if x, y := at(bu, bv); !meets(x, y) {
		u0 := along.At(top)
		if x0, y0 := at(u0, bv); meets(x0, y0) {
			nx, ny := backOff(pr, exact, bound, x0, y0, x, y)
			bu = ny
			if ki == s.XIndex {
				bu = nx
			}
		} else {
			bu, bv = u0, other.At(bestV)
		}
	}
	x, y := at(bu, bv)
	o := pr.describe(Optimum{X: x, Y: y, Criterion: crit}, exact)
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
	a, b := cellRange(other, iv, 1)
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
