package study

import (
	"context"
	"fmt"
	"math"
	"slices"

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
// displacement compares the two stability edges as sets of points: on
// every grid row and column, where the stability class changes between
// neighbouring nodes, the edge is placed by bisection with each map's own
// test; the displacement is the largest distance from an edge point of
// either map to the nearest edge point of the other (the Hausdorff
// distance of the two sets), measured in the window scaled to a unit
// square, and is reported with the two points. Lines are done in
// parallel and reduced in order, so the result does not depend on the
// worker count.
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
	exactLines, approxLines := make([][]edgePoint, ny+nx), make([][]edgePoint, ny+nx)
	type worker struct {
		exact, approx     stability.Counter
		exactSc, approxSc *plane.Scratch
	}
	newWorker := func() worker { return worker{s.NewCounter(), ps.NewCounter(), s.NewScratch(), ps.NewScratch()} }
	err = pool.Each(ctx, ny+nx, workers, nil, newWorker, func(wk worker, line int) {
		exactLines[line] = lineEdges(s, wk.exact, wk.exactSc, m, line)
		approxLines[line] = lineEdges(ps, wk.approx, wk.approxSc, pm, line)
	})
	if err != nil {
		return nil, err
	}
	out.Largest = hausdorff(s, slices.Concat(exactLines...), slices.Concat(approxLines...))
	out.Note = padeMapNote(out, len(m.RHP), orderText(n, chosen, w*L), s.X.Param, s.Y.Param)
	return out, nil
}

// edgePoint is a point of a stability edge on a grid line.
type edgePoint struct{ x, y float64 }

// lineEdges returns the stability edge points on grid line line (rows
// first, then columns), where m's stability class changes between
// neighbouring decided nodes, each placed by bisection on the setup's
// test.
func lineEdges(s plane.Setup, c stability.Counter, sc *plane.Scratch, m *grid.Map, line int) []edgePoint {
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
	var out []edgePoint
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
		out = append(out, edgePoint{snapZero(xa+t*(xb-xa), m.XAxis.Span()), snapZero(ya+t*(yb-ya), m.YAxis.Span())})
	}
	return out
}

// snapZero returns 0 for a value within 1e-12 of the span from it: the
// residue of a bisection onto an edge along a zero gain (ki = 0).
func snapZero(v, span float64) float64 {
	if math.Abs(v) <= 1e-12*span {
		return 0
	}
	return v
}

// hausdorff returns the largest distance from a point of either set to
// the nearest point of the other, in the window of s scaled to a unit
// square, with the two points; nil when a set is empty.
func hausdorff(s plane.Setup, exact, approx []edgePoint) *export.Displacement {
	if len(exact) == 0 || len(approx) == 0 {
		return nil
	}
	sx, sy := s.X.Span(), s.Y.Span()
	var best *export.Displacement
	farthest := func(from, to []edgePoint, fromExact bool) {
		for _, p := range from {
			d, q := math.Inf(1), to[0]
			for _, o := range to {
				if e := math.Hypot((o.x-p.x)/sx, (o.y-p.y)/sy); e < d {
					d, q = e, o
				}
			}
			if best != nil && d <= best.Share {
				continue
			}
			ex, ap := p, q
			if !fromExact {
				ex, ap = q, p
			}
			best = &export.Displacement{Exact: [2]float64{ex.x, ex.y}, Approximate: [2]float64{ap.x, ap.y}, DX: ap.x - ex.x, DY: ap.y - ex.y, Share: d}
		}
	}
	farthest(exact, approx, true)
	farthest(approx, exact, false)
	return best
}

// padeMapNote says in words where the approximate map misleads.
func padeMapNote(p *export.PadeMap, nodes int, order, xName, yName string) string {
	if p.Disagree == 0 && p.CountDiffers == 0 && (p.Largest == nil || p.Largest.Share == 0) {
		return order + ": the approximate map agrees with the exact one at every node"
	}
	s := fmt.Sprintf("%s: %d of %d nodes (%.3g%%) disagree on stability, %d on the count", order, p.Disagree, nodes, 100*float64(p.Disagree)/float64(nodes), p.CountDiffers)
	if p.Largest == nil {
		return s + "; one of the two maps has no stability edge in the window"
	}
	if d := p.Largest; d != nil {
		s += fmt.Sprintf("; the stability edge moves by up to %.3g%% of the window, from (%.6g, %.6g) to (%.6g, %.6g): by %.4g in %s and %.4g in %s",
			100*d.Share, d.Exact[0], d.Exact[1], d.Approximate[0], d.Approximate[1], d.DX, xName, d.DY, yName)
	}
	return s
}
