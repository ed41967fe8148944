package boundary

import (
	"context"
	"math"

	"gainscape/internal/pool"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// Tolerance is the bisection stopping width as a fraction of the span of
// the axis being bisected.
const Tolerance = 1e-9

// crossing is one refined point on a grid edge.
type crossing struct {
	pt   Point
	kind stability.Kind
}

// edgeKey names a grid edge: from node (i, j) to (i+1, j) when horiz, or to
// (i, j+1) otherwise.
type edgeKey struct {
	i, j  int
	horiz bool
}

// task is an edge to refine. at is 0 when the counts of its nodes differ
// and the crossing must be found by bisection; 1 or 2 when the crossing is
// the edge's first or second node itself, a marginal node with roots on
// the boundary beside a node with the same unstable count and none there.
type task struct {
	edgeKey
	at int
}

// Trace finds every grid edge whose two nodes have different
// right-half-plane counts, bisects along it to the crossing (to Tolerance
// of the axis span) with the setup's stability test, classifies the
// crossing by what changes between the two ends of the bisection
// (stability.Test.Classify), and joins the crossings into polylines by
// marching squares. A marginal node, with roots on the boundary, is a
// crossing itself where its neighbour has none there (a window that
// starts on an edge, such as ki = 0). Curves are split where their kind
// changes. Edges are refined in parallel; the result does not depend on
// the worker count.
func Trace(ctx context.Context, s plane.Setup, m *grid.Map, workers int) ([]Curve, error) {
	nx, ny := m.XAxis.N, m.YAxis.N
	var tasks []task
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			if i+1 < nx {
				if t, ok := edgeTask(m, i, j, true); ok {
					tasks = append(tasks, t)
				}
			}
			if j+1 < ny {
				if t, ok := edgeTask(m, i, j, false); ok {
					tasks = append(tasks, t)
				}
			}
		}
	}
	found := make([]crossing, len(tasks))
	type scratch struct {
		counter stability.Counter
		buf     *plane.Scratch
	}
	newScratch := func() scratch { return scratch{s.NewCounter(), s.NewScratch()} }
	err := pool.Each(ctx, len(tasks), workers, nil, newScratch, func(w scratch, k int) {
		found[k] = refine(s, w.counter, w.buf, m, tasks[k])
	})
	if err != nil {
		return nil, err
	}
	edges := make([]edgeKey, len(tasks))
	for k, t := range tasks {
		edges[k] = t.edgeKey
	}
	return join(m, edges, found), nil
}

// edgeTask says whether the edge from node (i, j) is crossed by an edge
// of the map, and how to find the crossing. Undecided nodes take no part.
// Where the unstable counts differ, the crossing lies between the nodes.
// Where they agree but one node is marginal (roots on the boundary) and
// the other has none there, the crossing is the marginal node itself;
// unless the node beyond it, on the same grid line, has another unstable
// count, for then the bisection on that side already ends at it.
func edgeTask(m *grid.Map, i, j int, horiz bool) (task, bool) {
	di, dj := 0, 1
	if horiz {
		di, dj = 1, 0
	}
	a, b := m.Count(i, j), m.Count(i+di, j+dj)
	if a == grid.Undecided || b == grid.Undecided {
		return task{}, false
	}
	e := edgeKey{i, j, horiz}
	if a != b {
		return task{edgeKey: e}, true
	}
	onA, onB := m.OnAxis(i, j) > 0, m.OnAxis(i+di, j+dj) > 0
	if onA == onB {
		return task{}, false
	}
	// The marginal node and the node beyond it.
	mi, mj, bi, bj, at := i, j, i-di, j-dj, 1
	if onB {
		mi, mj, bi, bj, at = i+di, j+dj, i+2*di, j+2*dj, 2
	}
	if bi >= 0 && bj >= 0 && bi < m.XAxis.N && bj < m.YAxis.N {
		if c := m.Count(bi, bj); c != grid.Undecided && c != m.Count(mi, mj) {
			return task{}, false
		}
	}
	return task{edgeKey: e, at: at}, true
}

// refine finds the crossing on the edge of t: bisection between its two
// nodes, which have different counts, or the marginal node it names.
func refine(s plane.Setup, c stability.Counter, buf *plane.Scratch, m *grid.Map, t task) crossing {
	e := t.edgeKey
	x0, y0 := m.XAxis.At(e.i), m.YAxis.At(e.j)
	var x1, y1, span float64
	var end int
	if e.horiz {
		x1, y1, span, end = m.XAxis.At(e.i+1), y0, m.XAxis.Span(), m.Count(e.i+1, e.j)
	} else {
		x1, y1, span, end = x0, m.YAxis.At(e.j+1), m.YAxis.Span(), m.Count(e.i, e.j+1)
	}
	function := func(x, y float64) stability.Function {
		f := s.Function(buf, x, y)
		// The scratch polynomials are reused by the next call: keep copies
		// of both parts (Q carries the delayed part of a loop with dead time).
		f.P = f.P.Clone()
		if f.Q != nil {
			f.Q = f.Q.Clone()
		}
		return f
	}
	if t.at != 0 {
		x, y := x0, y0
		if t.at == 2 {
			x, y = x1, y1
		}
		f := function(x, y)
		cr := s.Test().Classify(f, f)
		return crossing{pt: Point{X: x, Y: y, Omega: cr.Omega}, kind: cr.Kind}
	}
	start := m.Count(e.i, e.j)
	count := func(x, y float64) int { return c.Count(s.Function(buf, x, y)).Unstable }
	lo, hi := 0.0, 1.0
	point := func(t float64) (float64, float64) { return x0 + t*(x1-x0), y0 + t*(y1-y0) }
	width := math.Abs(x1-x0) + math.Abs(y1-y0)
	for (hi-lo)*width > Tolerance*span {
		mid := 0.5 * (lo + hi)
		x, y := point(mid)
		switch count(x, y) {
		case start:
			lo = mid
		case end:
			hi = mid
		default:
			// A third count inside the edge: keep the half next to start,
			// which still holds a change of count.
			hi = mid
			end = count(point(hi))
		}
	}
	cr := s.Test().Classify(function(point(lo)), function(point(hi)))
	x, y := point(0.5 * (lo + hi))
	return crossing{pt: Point{X: x, Y: y, Omega: cr.Omega}, kind: cr.Kind}
}
