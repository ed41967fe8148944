package dpartition

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// islandPlant is G = (s+6)²/(s(s+1)²(s+36)), whose PI map has, beside the
// large stable region at high kp, a second small one at low gains with ki
// below about 0.61 (invented for this project's tests; the figure is
// derived from PI's curve kp = −Re[1/G(jω)], ki = ω·Im[1/G(jω)]).
func islandPlant() (num, den poly.Poly) {
	num = poly.Mul(poly.Poly{6, 1}, poly.Poly{6, 1})
	den = poly.Mul(poly.Mul(sVar, poly.Poly{1, 2, 1}), poly.Poly{36, 1})
	return num, den
}

// piCurve is PI's complex edge on the plant N/D, by complex arithmetic:
// kp = −Re[1/G(jω)], ki = ω·Im[1/G(jω)] (derived by hand from
// jω·D + (kp·jω + ki)·N = 0).
func piCurve(num, den poly.Poly) func(float64) Point {
	return func(w float64) Point {
		s := complex(0, w)
		inv := den.Eval(s) / num.Eval(s)
		return Point{-real(inv), w * imag(inv), w}
	}
}

// The island: its edges are found in the window kp ∈ [0, 80], ki ∈ [0, 8],
// and in windows 10 and 100 times as large, where it covers a fraction of
// one cell of a 300×225 grid. The tracer has no grid: the island's arch is
// found whole, its top at the reference height, every time.
func TestIsland(t *testing.T) {
	num, den := islandPlant()
	edge := piCurve(num, den)
	// Reference: the arch's top, from a fine scan of ki(ω) below the
	// frequency where it returns to ki = 0 (near 1.69 rad/s).
	top := 0.0
	for _, w := range span(1e-3, 1.69, 200000) {
		top = math.Max(top, edge(w).Y)
	}
	if top < 0.6 || top > 0.62 {
		t.Fatalf("reference top of the island %g, want about 0.61", top)
	}
	for _, m := range []float64{1, 10, 100} {
		pr := piProblem(num, den, 0, Range{0, 80 * m}, Range{0, 8 * m})
		res := mustEdges(t, pr)
		var arch *Curve
		for i, c := range res.Curves {
			if c.Kind == stability.Complex && c.Points[0].Omega == 0 {
				arch = &res.Curves[i]
			}
		}
		if arch == nil {
			t.Fatalf("window ×%g: no edge leaves (0, 0) at ω = 0", m)
		}
		high := 0.0
		for _, p := range arch.Points {
			high = math.Max(high, p.Y)
		}
		// The polyline follows the curve to the chord tolerance of the
		// window, so its highest point is that close to the top.
		if d := (top - high) / pr.Y.Span(); d < -1e-12 || d > DefaultChord {
			t.Errorf("window ×%g: arch top %g, reference %g", m, high, top)
		}
		last := arch.Points[len(arch.Points)-1]
		if last.Y != 0 || arch.Fewer != Right {
			t.Errorf("window ×%g: arch ends at %+v with fewer %v; want back on ki = 0, stable below", m, last, arch.Fewer)
		}
		checkCovers(t, pr, res.Curves, edge, span(1e-6, 2*last.Omega, 20000), 1.01*DefaultChord)
		checkResiduals(t, pr, res.Curves)
		checkSides(t, pr, res.Curves, 1e-6)
	}
	// Inside the island the loop is stable (gonum eigenvalues), while a
	// grid of 9 × 9 nodes over the base window has no stable node near it.
	pr := piProblem(num, den, 0, Range{0, 80}, Range{0, 8})
	if n, ok := eigenCount(t, pr.Function(3, 0.3).P); !ok || n != 0 {
		t.Fatalf("at (3, 0.3), inside the island: %d unstable roots", n)
	}
	for i := 0; i <= 8; i++ {
		for j := 0; j <= 8; j++ {
			x, y := 10*float64(i), float64(j)
			if x > 7 {
				continue
			}
			if n, ok := eigenCount(t, pr.Function(x, y).P); ok && n == 0 {
				t.Fatalf("the coarse grid sees the island at (%g, %g): the test shows nothing", x, y)
			}
		}
	}
	res := mustEdges(t, pr)
	checkAgainstGrid(t, pr, res.Curves, 60, 3e-3)
}
