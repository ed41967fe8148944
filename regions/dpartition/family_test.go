package dpartition

import (
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// fromFamily builds a problem from a controller family by family.Split,
// the exact two-parameter split of its coefficients.
func fromFamily(t *testing.T, name string, values []float64, xi, yi int, num, den poly.Poly, delay float64, x, y Range) Problem {
	t.Helper()
	f, err := family.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	tr := f.Transfer()
	var nc, dc Bilinear
	nc.A, nc.B, nc.C, nc.E = family.Split(tr.Num, values, xi, yi)
	dc.A, dc.B, dc.C, dc.E = family.Split(tr.Den, values, xi, yi)
	return FeedbackLoop(nc, dc, num, den, delay, x, y)
}

// The project's controller families through family.Split give the same
// edges as the pencils written by hand: the PID slice of
// TestPIDSingularLines (ideal derivative, τ = 0, so the pencil is
// singular and must be recognised as such from the exact split), and PI
// on first order plus dead time as in TestFirstOrderDeadTimePI.
func TestFamiliesThroughSplit(t *testing.T) {
	num := poly.Poly{2, -1}
	den := poly.Mul(poly.FromDescending([]float64{1, 2, 1}), poly.FromDescending([]float64{1, 1, 4}))
	const kp, ki, kd = 0, 1, 2
	kdR, kiR := Range{-2, 2}, Range{-6, 5}
	got := mustEdges(t, fromFamily(t, "pid", []float64{1, 0, 0, 0}, kd, ki, num, den, 0, kdR, kiR))
	want := mustEdges(t, pidSlice(num, den, 1, kdR, kiR))
	compareEnds(t, got.Curves, want.Curves)

	p := fopdtCases[1]
	kpR, kiR2 := Range{-2 / p.k, 1.5 * p.ultimate()}, Range{0, 2 * p.ultimate() / p.l}
	got = mustEdges(t, fromFamily(t, "pi", []float64{0, 0}, kp, ki, poly.Poly{p.k}, poly.Poly{1, p.t}, p.l, kpR, kiR2))
	want = mustEdges(t, piProblem(poly.Poly{p.k}, poly.Poly{1, p.t}, p.l, kpR, kiR2))
	compareEnds(t, got.Curves, want.Curves)
}

// compareEnds requires the same curves, kinds, sides and ends to rounding.
func compareEnds(t *testing.T, got, want []Curve) {
	t.Helper()
	if len(got) != len(want) || kinds(got)[stability.Complex] == 0 {
		t.Fatalf("%d curves (%v), want %d (%v)", len(got), kinds(got), len(want), kinds(want))
	}
	for i, c := range got {
		w := want[i]
		a, b := c.Points[len(c.Points)-1], w.Points[len(w.Points)-1]
		if c.Kind != w.Kind || c.Fewer != w.Fewer || !near(a.X, b.X, 1e-12) || !near(a.Y, b.Y, 1e-12) {
			t.Fatalf("curve %d: %v %v ending %+v, want %v %v ending %+v", i, c.Kind, c.Fewer, a, w.Kind, w.Fewer, b)
		}
	}
}
