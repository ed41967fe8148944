package dpartition_test

import (
	"fmt"

	"gainscape/regions/dpartition"
	"gainscape/regions/poly"
)

// PI control of the invented plant 1/(s+1)³ in the (kp, ki) plane: the
// characteristic polynomial s·(s+1)³ + kp·s + ki is A + kp·B + ki·C with
// A = s·(s+1)³, B = s and C = 1.
func ExampleEdges() {
	den := poly.FromDescending([]float64{1, 3, 3, 1})
	pr := dpartition.Problem{
		P: dpartition.Bilinear{A: poly.Mul(poly.Poly{0, 1}, den), B: poly.Poly{0, 1}, C: poly.Poly{1}},
		X: dpartition.Range{Min: -2, Max: 10},
		Y: dpartition.Range{Min: -1, Max: 4},
	}
	res, err := dpartition.Edges(pr, dpartition.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range res.Curves {
		a, b := c.Points[0], c.Points[len(c.Points)-1]
		fmt.Printf("%-7v from (%.4g, %.4g) at ω = %.4g to (%.4g, %.4g) at ω = %.4g; fewer unstable roots on the %v (%d cross)\n",
			c.Kind, a.X, a.Y, a.Omega, b.X, b.Y, b.Omega, c.Fewer, c.Change)
	}
	// Output:
	// real    from (-2, 0) at ω = 0 to (-1, 0) at ω = 0; fewer unstable roots on the right (1 cross)
	// real    from (-1, 0) at ω = 0 to (10, 0) at ω = 0; fewer unstable roots on the left (1 cross)
	// complex from (-1, 0) at ω = 0 to (8.908, -1) at ω = 1.817; fewer unstable roots on the right (2 cross)
}

// The stabilising P gains of the invented plant 2·e^(−0.5s)/(3s + 1): the
// real root leaves the right half plane at kp = −1/2 and a pair enters at
// the ultimate gain (T/(kL))·√(α1² + (L/T)²) = 5.0356, α1 = 1.6703 the root
// of tan α = −6α in (π/2, π) (Silva, Datta & Bhattacharyya, PID
// Controllers for Time-Delay Systems, Birkhäuser 2005; from memory).
func ExampleCrossings() {
	lp := dpartition.LineProblem{
		P:     dpartition.Affine{A: poly.Poly{1, 3}},
		Q:     dpartition.Affine{B: poly.Poly{2}},
		Delay: 0.5,
		K:     dpartition.Range{Min: -1, Max: 6},
	}
	res, err := dpartition.Crossings(lp, dpartition.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range res.Crossings {
		fmt.Printf("%-7v kp = %.6f at ω = %.6f: unstable count %+d\n", c.Kind, c.K, c.Omega, c.Delta)
	}
	// Output:
	// real    kp = -0.500000 at ω = 0.000000: unstable count -1
	// complex kp = 5.035642 at ω = 3.340505: unstable count +2
}
