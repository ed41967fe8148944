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

// Trace finds every grid edge whose two nodes have different
// right-half-plane counts, bisects along it to the crossing (to Tolerance
// of the axis span) with the setup's stability test, classifies the
// crossing there (stability.Test.Classify), and joins the crossings into
// polylines by marching squares. Curves are split where their kind
// changes. Edges are refined in parallel; the result does not depend on
// the worker count.
func Trace(ctx context.Context, s plane.Setup, m *grid.Map, workers int) ([]Curve, error) {
	var edges []edgeKey
	nx, ny := m.XAxis.N, m.YAxis.N
	differs := func(a, b int) bool { return a != b && a != grid.Undecided && b != grid.Undecided }
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			if i+1 < nx && differs(m.Count(i, j), m.Count(i+1, j)) {
				edges = append(edges, edgeKey{i, j, true})
			}
			if j+1 < ny && differs(m.Count(i, j), m.Count(i, j+1)) {
				edges = append(edges, edgeKey{i, j, false})
			}
		}
	}
	found := make([]crossing, len(edges))
	type scratch struct {
		counter stability.Counter
		buf     *plane.Scratch
	}
	newScratch := func() scratch { return scratch{s.NewCounter(), s.NewScratch()} }
	err := pool.Each(ctx, len(edges), workers, nil, newScratch, func(w scratch, k int) {
		found[k] = refine(s, w.counter, w.buf, m, edges[k])
	})
	if err != nil {
		return nil, err
	}
	return join(m, edges, found), nil
}

// refine bisects edge e between its two nodes, which have different counts.
func refine(s plane.Setup, c stability.Counter, buf *plane.Scratch, m *grid.Map, e edgeKey) crossing {
	x0, y0 := m.XAxis.At(e.i), m.YAxis.At(e.j)
	var x1, y1, span float64
	var end int
	if e.horiz {
		x1, y1, span, end = m.XAxis.At(e.i+1), y0, m.XAxis.Span(), m.Count(e.i+1, e.j)
	} else {
		x1, y1, span, end = x0, m.YAxis.At(e.j+1), m.YAxis.Span(), m.Count(e.i, e.j+1)
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
	x, y := point(0.5 * (lo + hi))
	cr := s.Test().Classify(s.Function(buf, x, y))
	return crossing{pt: Point{X: x, Y: y, Omega: cr.Omega}, kind: cr.Kind}
}
