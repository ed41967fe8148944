package dpartition

import (
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// TestCrossingRealLines: a lead k·(s+z)/(s+p) on a plant N/D with an
// integrator has Δ(0) = p·D(0) + k·z·N(0) = k·z·N(0) (D(0) = 0), so its
// real edge is the pair of lines k = 0 and z = 0, and the side with fewer
// unstable roots changes where they cross (derived by hand: near the edge
// the real root is s ≈ −Δ(0)/Δ'(0), and the gradient of k·z flips sign
// through (0, 0)). Each line must be cut there, and every piece's side is
// confirmed by eigenvalue counts (checkSides). The plant is the invented
// ram of the gallery's hydraulic press, 40/(s·((s/90)² + 0.4·s/90 + 1)),
// with p = 150.
func TestCrossingRealLines(t *testing.T) {
	num := poly.Poly{40}
	den := poly.Mul(poly.Poly{0, 1}, poly.Poly{1, 0.4 / 90, 1 / 8100.0})
	pr := leadProblem(num, den, 150, Range{-0.5, 5}, Range{-10, 120})
	res := mustEdges(t, pr)
	pieces := 0
	for _, c := range res.Curves {
		if c.Kind != stability.Real {
			continue
		}
		pieces++
		a, b := c.Points[0], c.Points[len(c.Points)-1]
		// Along k = 0 the ends share the sign of z; along z = 0, of k.
		if a.X*b.X < 0 || a.Y*b.Y < 0 {
			t.Errorf("real edge from %+v to %+v passes through the crossing (0, 0) uncut", a, b)
		}
	}
	if pieces != 4 {
		t.Errorf("%d real pieces, want 4: each line cut at (0, 0)", pieces)
	}
	checkSides(t, pr, res.Curves, 1e-6)
}
