package dpartition

import (
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// sliceAt returns the part of b that is affine in x at fixed y.
func (b Bilinear) sliceAt(y float64) Affine {
	return Affine{A: poly.Add(b.A, b.C.Scaled(y)), B: poly.Add(b.B, b.E.Scaled(y))}
}

// checkSlices cuts the window along x at n values of y and finds the
// crossings of each cut with Crossings, a separate route (one cross
// product and its roots, no quadratic, no sheets): every crossing must lie
// on a traced edge of its kind, to the chord tolerance.
func checkSlices(t *testing.T, pr Problem, cs []Curve, n int) int {
	t.Helper()
	w := window{pr.X, pr.Y}
	found := 0
	for i := 1; i < n; i++ {
		y := pr.Y.Min + pr.Y.Span()*float64(i)/float64(n)
		lp := LineProblem{P: pr.P.sliceAt(y), Q: pr.Q.sliceAt(y), Delay: pr.Delay, K: pr.X}
		res, err := Crossings(lp, Options{})
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range res.Crossings {
			if c.Kind == stability.Infinite {
				continue // Crossings does not split by the neutral chains' sides
			}
			p := Point{c.K, y, c.Omega}
			if d := distanceToCurves(w, cs, c.Kind, p); !(d <= 1.01*DefaultChord) {
				t.Fatalf("crossing %+v at y = %g is %.3g from every %v edge", c, y, d, c.Kind)
			}
			found++
		}
	}
	return found
}

// Bilinear pencils, with and without dead time, cut along x: the
// crossings of the cuts lie on the traced edges. Loops invented for this
// test: the filtered PID of TestBilinearEdges, and the same controller on
// 1.5·e^(−0.8s)/(2s + 1) with ki = 0.5, kd = 0.4, τ from 0.05 (the
// delay-free degree drops at τ = 0, which would leave no frequency
// bound).
func TestSlicesAgreeWithEdges(t *testing.T) {
	fo := fopdt{1.5, 2, 0.8}
	s2 := poly.Poly{0, 0, 1}
	k := poly.Poly{fo.k}
	delayed := Problem{
		P: Bilinear{A: poly.Mul(sVar, poly.Poly{1, fo.t}), C: poly.Mul(s2, poly.Poly{1, fo.t})},
		Q: Bilinear{A: poly.Add(k.Scaled(0.5), poly.Mul(s2, k).Scaled(0.4)), B: poly.Mul(sVar, k),
			C: poly.Mul(sVar, k).Scaled(0.5), E: poly.Mul(s2, k)},
		Delay: fo.l, X: Range{-2, 4}, Y: Range{0.05, 1},
	}
	cases := []struct {
		name string
		pr   Problem
	}{
		{"filtered PID, rational", filteredPID(poly.Poly{1}, poly.FromDescending([]float64{1, 6, 11, 6}), 20, 5, Range{-5, 100}, Range{0, 0.5})},
		{"filtered PID, dead time", delayed},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			res := mustEdges(t, tc.pr)
			if !res.Complete {
				t.Fatal("sweep not bounded")
			}
			n := checkSlices(t, tc.pr, res.Curves, 40)
			t.Logf("%d crossings on the cuts, curves %v, ω up to %.4g", n, kinds(res.Curves), res.OmegaMax)
			if n < 20 {
				t.Fatalf("only %d crossings on the cuts: the case tests little", n)
			}
			checkResiduals(t, tc.pr, res.Curves)
			if tc.pr.Delay > 0 {
				checkDelaySides(t, tc.pr, res.Curves, 1e-6)
			}
		})
	}
}
