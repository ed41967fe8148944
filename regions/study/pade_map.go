package study

import (
	"context"
	"fmt"
	"math"

	"gainscape/internal/pool"
	"gainscape/regions/boundary"
	"gainscape/regions/delay"
	"gainscape/regions/export"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// edgeSteps is the number of bisection steps that place a stability edge
// between two neighbouring nodes (2^-40 of a cell).
const edgeSteps = 40

// comparePade maps the window of s, a loop with dead time, a second time
// with the delay replaced by its Padé approximant (padeLoop; the order
// given, or chosen for the window's largest ωL: the highest ω on a
// complex edge of the exact map and at a gain crossover of the loop at
// the corners and the centre of the window, times L), by the sign array,
// and compares the two maps node by node: the nodes stable in one map and
// not in the other, and those whose counts differ. The largest edge
// displacement is measured along every grid row and column: on each
// line, where the stability class changes between neighbouring nodes,
// the edge is placed by bisection with each map's own test, and every
// edge of one map is paired with the nearest edge of the other on the
// line (the nearer end of the line where the other has none: the edge
// must move at least that far to leave the window). The largest of these
// distances as a share of the line's span is reported, with the line
// and both positions. Lines are done in parallel and reduced in order.
func comparePade(ctx context.Context, s plane.Setup, m *grid.Map, curves []boundary.Curve, given, workers int) (*export.PadeMap, error) {
	L := s.Plant.Delay
	w := 0.0
	for _, c := range curves {
		if c.Kind != stability.Complex {
			continue
		}
		for _, p := range c.Points {
			if !math.IsInf(p.Omega, 0) && !math.IsNaN(p.Omega) {
				w = math.Max(w, p.Omega)
			}
		}
	}
	sc := s.NewScratch()
	for _, x := range []float64{s.X.Min, 0.5 * (s.X.Min + s.X.Max), s.X.Max} {
		for _, y := range []float64{s.Y.Min, 0.5 * (s.Y.Min + s.Y.Max), s.Y.Max} {
			num, den := s.OpenLoop(sc, x, y)
			for _, c := range delay.GainCrossovers(num.Clone(), den.Clone(), L) {
				w = math.Max(w, c.Omega)
			}
		}
	}
	n, chosen := padeOrder(given, w*L)
	ps, err := plane.NewSetup(padeLoop(s.Loop, n), s.X, s.Y)
	if err != nil {
		return nil, err
	}
	pm, err := grid.Evaluate(ctx, ps, grid.Options{Workers: workers})
	if err != nil {
		return nil, err
	}
	out := &export.PadeMap{Order: n, Chosen: chosen, OmegaL: w * L}
	for k := range m.RHP {
		if m.RHP[k] < 0 || pm.RHP[k] < 0 {
			continue
		}
		if m.StableAt(k) != pm.StableAt(k) {
			out.Disagree++
		}
		if m.RHP[k] != pm.RHP[k] {
			out.CountDiffers++
		}
	}
	nx, ny := m.XAxis.N, m.YAxis.N
	found := make([]*export.Displacement, ny+nx)
	type worker struct {
		exact, approx     stability.Counter
		exactSc, approxSc *plane.Scratch
	}
	newWorker := func() worker { return worker{s.NewCounter(), ps.NewCounter(), s.NewScratch(), ps.NewScratch()} }
	err = pool.Each(ctx, ny+nx, workers, nil, newWorker, func(wk worker, line int) {
		e := lineEdges(s, wk.exact, wk.exactSc, m, line)
		a := lineEdges(ps, wk.approx, wk.approxSc, pm, line)
		found[line] = displacement(s, line, ny, e, a)
	})
	if err != nil {
		return nil, err
	}
	for _, d := range found {
		if d != nil && (out.Largest == nil || d.Share > out.Largest.Share) {
			out.Largest = d
		}
	}
	out.Note = padeMapNote(out, len(m.RHP), orderText(n, chosen, w*L))
	return out, nil
}

// lineEdges returns the positions along grid line line (rows first, then
// columns) where m's stability class changes between neighbouring
// decided nodes, each placed by bisection on the setup's test.
func lineEdges(s plane.Setup, c stability.Counter, sc *plane.Scratch, m *grid.Map, line int) []float64 {
	nx, ny := m.XAxis.N, m.YAxis.N
	row := line < ny
	count := nx
	if !row {
		count = ny
	}
	node := func(i int) (k int, x, y float64) {
		if row {
			return line*nx + i, m.XAxis.At(i), m.YAxis.At(line)
		}
		return i*nx + (line - ny), m.XAxis.At(line - ny), m.YAxis.At(i)
	}
	stable := func(x, y float64) bool { return c.Count(s.Function(sc, x, y)).Stable() }
	var out []float64
	for i := 0; i+1 < count; i++ {
		ka, xa, ya := node(i)
		kb, xb, yb := node(i + 1)
		if m.RHP[ka] < 0 || m.RHP[kb] < 0 || m.StableAt(ka) == m.StableAt(kb) {
			continue
		}
		lo, hi := 0.0, 1.0
		sa := m.StableAt(ka)
		for range edgeSteps {
			t := 0.5 * (lo + hi)
			if stable(xa+t*(xb-xa), ya+t*(yb-ya)) == sa {
				lo = t
			} else {
				hi = t
			}
		}
		t := 0.5 * (lo + hi)
		if row {
			out = append(out, xa+t*(xb-xa))
		} else {
			out = append(out, ya+t*(yb-ya))
		}
	}
	return out
}

// displacement pairs the exact edges e and the approximate edges a of one
// line (see comparePade) and returns the largest distance, nil when the
// line has no edge in either map.
func displacement(s plane.Setup, line, ny int, e, a []float64) *export.Displacement {
	ax, at := s.X, s.Y.At(line)
	other := s.Y.Param
	if line >= ny {
		ax, at, other = s.Y, s.X.At(line-ny), s.X.Param
	}
	var best *export.Displacement
	try := func(from, to []float64, fromExact bool) {
		for _, p := range from {
			d, q := nearest(p, to, ax.Min, ax.Max)
			if best != nil && d <= best.Distance {
				continue
			}
			ex, ap := export.Number(p), export.Number(q)
			if len(to) == 0 {
				ap = export.Number(math.NaN())
			}
			if !fromExact {
				ex, ap = export.Number(q), export.Number(p)
				if len(to) == 0 {
					ex = export.Number(math.NaN())
				}
			}
			best = &export.Displacement{Along: ax.Param, On: other, At: at, Distance: d, Share: d / ax.Span(), Exact: ex, Approximate: ap}
		}
	}
	try(e, a, true)
	try(a, e, false)
	return best
}

// padeMapNote says in words where the approximate map misleads.
func padeMapNote(p *export.PadeMap, nodes int, order string) string {
	if p.Disagree == 0 && p.CountDiffers == 0 && (p.Largest == nil || p.Largest.Distance == 0) {
		return order + ": the approximate map agrees with the exact one at every node"
	}
	s := fmt.Sprintf("%s: %d of %d nodes (%.3g%%) disagree on stability, %d on the count", order, p.Disagree, nodes, 100*float64(p.Disagree)/float64(nodes), p.CountDiffers)
	d := p.Largest
	switch {
	case d == nil:
	case !d.Approximate.Valid():
		s += fmt.Sprintf("; on the line %s = %.4g the exact stability edge at %s = %.4g has no counterpart in the approximate map: it has moved at least %.4g (%.3g%% of the window's span), out of the window", d.On, d.At, d.Along, float64(d.Exact), d.Distance, 100*d.Share)
	case !d.Exact.Valid():
		s += fmt.Sprintf("; on the line %s = %.4g the approximate map has a stability edge at %s = %.4g where the exact map has none: at least %.4g (%.3g%% of the window's span) off", d.On, d.At, d.Along, float64(d.Approximate), d.Distance, 100*d.Share)
	default:
		s += fmt.Sprintf("; the stability edge moves by up to %.4g in %s (%.3g%% of the window's span), from %.6g to %.6g on the line %s = %.4g", d.Distance, d.Along, 100*d.Share, float64(d.Exact), float64(d.Approximate), d.On, d.At)
	}
	return s
}
