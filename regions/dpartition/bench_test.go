package dpartition

import (
	"testing"
	"time"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// gridPass runs routh.Count once over a 300×225 grid of the rational
// problem pr, the work of a grid map of the same window: each node's
// polynomial formed in a buffer, then counted.
func gridPass(pr Problem, p, work []float64) {
	const nx, ny = 300, 225
	a, b, c, e := pr.P.A, pr.P.B, pr.P.C, pr.P.E
	for j := 0; j < ny; j++ {
		y := pr.Y.Min + pr.Y.Span()*float64(j)/(ny-1)
		for i := 0; i < nx; i++ {
			x := pr.X.Min + pr.X.Span()*float64(i)/(nx-1)
			for k := range p {
				p[k] = coef(a, k) + x*coef(b, k) + y*coef(c, k) + x*y*coef(e, k)
			}
			routh.Count(p, work)
		}
	}
}

// benchTrace times Edges on pr and reports the ratio of the cost of a
// 300×225 grid of routh.Count on grid (the same loop, or a rational
// stand-in for a delay loop) to the tracer's. The two are timed in turns
// within the run and the least time of each is kept, so that the ratio
// stands even on a machine shared with other work.
func benchTrace(b *testing.B, pr, grid Problem) {
	n := max(len(grid.P.A), len(grid.P.B), len(grid.P.C), len(grid.P.E))
	p, work := make([]float64, n), make([]float64, routh.WorkLen(n-1))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Edges(pr, Options{}); err != nil {
			b.Fatal(err)
		}
	}
	b.StopTimer()
	bestGrid, bestTrace := time.Duration(1<<62), time.Duration(1<<62)
	for r := 0; r < 15; r++ {
		start := time.Now()
		gridPass(grid, p, work)
		bestGrid = min(bestGrid, time.Since(start))
		start = time.Now()
		const k = 5
		for i := 0; i < k; i++ {
			if _, err := Edges(pr, Options{}); err != nil {
				b.Fatal(err)
			}
		}
		bestTrace = min(bestTrace, time.Since(start)/k)
	}
	b.ReportMetric(float64(bestGrid)/float64(bestTrace), "grid/trace")
	b.ReportMetric(float64(bestGrid.Microseconds()), "grid-µs")
	b.ReportMetric(float64(bestTrace.Microseconds()), "trace-µs")
}

// pade33 returns the (3, 3) Padé approximant of e^(−Ls) as num/den.
func pade33(l float64) (num, den poly.Poly) {
	c := []float64{1, l / 2, l * l / 10, l * l * l / 120}
	return poly.Poly{c[0], -c[1], c[2], -c[3]}, poly.Poly{c[0], c[1], c[2], c[3]}
}

func BenchmarkTracePITripleLag(b *testing.B) {
	pr := piProblem(poly.Poly{1}, poly.FromDescending([]float64{1, 3, 3, 1}), 0, Range{-2, 10}, Range{-1, 4})
	benchTrace(b, pr, pr)
}

func BenchmarkTraceIsland(b *testing.B) {
	num, den := islandPlant()
	pr := piProblem(num, den, 0, Range{0, 80}, Range{0, 8})
	benchTrace(b, pr, pr)
}

func BenchmarkTraceLeadBilinear(b *testing.B) {
	pr := leadProblem(poly.Poly{1, -1}, poly.FromDescending([]float64{1, 4, 6, 4, 1}), 5, Range{0.01, 10}, Range{0.05, 10})
	benchTrace(b, pr, pr)
}

func BenchmarkTraceFilteredPID(b *testing.B) {
	pr := filteredPID(poly.Poly{1}, poly.FromDescending([]float64{1, 6, 11, 6}), 20, 5, Range{-5, 100}, Range{0, 0.5})
	benchTrace(b, pr, pr)
}

func BenchmarkTraceDegree20(b *testing.B) {
	den := poly.Poly{1}
	for i := 0; i < 20; i++ {
		den = poly.Mul(den, poly.Poly{1, 1 / (0.5 + 0.25*float64(i))})
	}
	pr := piProblem(poly.Poly{1}, den, 0, Range{-2, 3}, Range{-0.5, 1})
	benchTrace(b, pr, pr)
}

// The delay loop's grid stands in with the (3, 3) Padé approximant of its
// dead time, the cheapest rational grid of that loop.
func BenchmarkTraceDeadTimePI(b *testing.B) {
	p := fopdtCases[0]
	ku := p.ultimate()
	kp, ki := Range{-2 / p.k, 1.5 * ku}, Range{0, 2 * ku / p.l}
	pr := piProblem(poly.Poly{p.k}, poly.Poly{1, p.t}, p.l, kp, ki)
	pn, pd := pade33(p.l)
	grid := piProblem(poly.Mul(poly.Poly{p.k}, pn), poly.Mul(poly.Poly{1, p.t}, pd), 0, kp, ki)
	benchTrace(b, pr, grid)
}
