package dpartition

import (
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// leadProblem is the loop (s + p)·D + k·(s + z)·N under the lead
// k(s + z)/(s + p) at fixed p, in the (k, z) plane: k and z enter as the
// product k·z, so the pencil is bilinear (E = N) with no y-only part
// (C = 0).
func leadProblem(num, den poly.Poly, p float64, k, z Range) Problem {
	return Problem{P: Bilinear{A: poly.Mul(poly.Poly{p, 1}, den), B: poly.Mul(sVar, num), E: num}, X: k, Y: z}
}

// filteredPID is the loop s·(τs + 1)·D + (kp·s + ki)(τs + 1)·N + kd·s²·N
// under kp + ki/s + kd·s/(τs + 1) in the (kp, τ) plane: kp·τ products and
// a τ-only part, a bilinear pencil with two solutions per ω.
func filteredPID(num, den poly.Poly, ki, kd float64, kp, tau Range) Problem {
	s2 := poly.Poly{0, 0, 1}
	a := poly.Add(poly.Add(poly.Mul(sVar, den), num.Scaled(ki)), poly.Mul(s2, num).Scaled(kd))
	c := poly.Add(poly.Mul(s2, den), poly.Mul(sVar, num).Scaled(ki))
	return Problem{P: Bilinear{A: a, B: poly.Mul(sVar, num), C: c, E: poly.Mul(s2, num)}, X: kp, Y: tau}
}

// The bilinear cases: every traced point solves Δ(jω) = 0 to rounding,
// the gonum eigenvalue counts change across every curve as its side and
// change say, and wherever the counts of two neighbours on a 60×60 grid
// differ a curve passes between them. Plants invented for these tests.
func TestBilinearEdges(t *testing.T) {
	cases := []struct {
		name      string
		pr        Problem
		atLeast   map[stability.Kind]int
		realCurve func(x, y float64) float64 // zero on the real edge
	}{
		{"lead on 1/(s(s+1)(s+5)), p = 10, (k, z)",
			leadProblem(poly.Poly{1}, poly.FromDescending([]float64{1, 6, 5, 0}), 10, Range{0.5, 800}, Range{0.05, 30}),
			map[stability.Kind]int{stability.Complex: 1}, nil},
		// Δ(0) = 20·(−4) + 2·k·z: the real edge is the hyperbola k·z = 40.
		{"lead on unstable (s+2)/((s−1)(s+4)), p = 20, (k, z)",
			leadProblem(poly.Poly{2, 1}, poly.FromDescending([]float64{1, 3, -4}), 20, Range{0.1, 300}, Range{0.05, 40}),
			map[stability.Kind]int{stability.Real: 1}, func(x, y float64) float64 { return x*y/40 - 1 }},
		{"lead on non-minimum-phase (1 − s)/(s+1)⁴, p = 5, (k, z)",
			leadProblem(poly.Poly{1, -1}, poly.FromDescending([]float64{1, 4, 6, 4, 1}), 5, Range{0.01, 10}, Range{0.05, 10}),
			map[stability.Kind]int{stability.Complex: 1}, nil},
		{"filtered PID on 1/((s+1)(s+2)(s+3)), ki = 20, kd = 5, (kp, τ)",
			filteredPID(poly.Poly{1}, poly.FromDescending([]float64{1, 6, 11, 6}), 20, 5, Range{-5, 100}, Range{0, 0.5}),
			map[stability.Kind]int{stability.Complex: 2, stability.Infinite: 1}, nil},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			res := mustEdges(t, tc.pr)
			got := kinds(res.Curves)
			for k, n := range tc.atLeast {
				if got[k] < n {
					t.Fatalf("curves %v, want at least %d %v", got, n, k)
				}
			}
			for _, c := range res.Curves {
				if c.Kind == stability.Real && tc.realCurve != nil {
					for _, p := range c.Points {
						if v := tc.realCurve(p.X, p.Y); !(v*v < 1e-24) {
							t.Fatalf("real edge point %+v off the hyperbola", p)
						}
					}
				}
			}
			checkResiduals(t, tc.pr, res.Curves)
			checkSides(t, tc.pr, res.Curves, 1e-5)
			if checkAgainstGrid(t, tc.pr, res.Curves, 60, 3e-3) == 0 {
				t.Fatal("the grid saw no edge: the case tests nothing")
			}
		})
	}
}
