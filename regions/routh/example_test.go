package routh_test

import (
	"fmt"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// The sign array of s³ + 3s² + 3s + 9, which has the pair ±j√3 on the
// imaginary axis (s³ + 3s² + 3s + 9 = (s + 3)(s² + 3), by hand): the s¹
// row vanishes, the auxiliary polynomial 3s² + 9 of the row above
// replaces it, and its roots give the frequency of the pair.
func ExampleAnalyze() {
	r := routh.Analyze(poly.Poly{9, 3, 3, 1})
	for _, row := range r.Rows {
		fmt.Printf("s^%d %v auxiliary=%v\n", row.Power, row.Entries, row.Auxiliary)
	}
	fmt.Printf("right half plane %d, imaginary axis %d at ω = %.6g\n", r.RHP, r.JW, r.Omegas)
	// Output:
	// s^3 [1 3] auxiliary=false
	// s^2 [3 9] auxiliary=false
	// s^1 [6] auxiliary=true
	// s^0 [9] auxiliary=false
	// right half plane 0, imaginary axis 2 at ω = [1.73205]
}

// Count is the allocation-free path used at every node of a map.
func ExampleCount() {
	p := poly.Poly{1, 3, 3, 1}.Scaled(1) // (s+1)³
	p[0] += 9                            // s³ + 3s² + 3s + 10: two roots to the right
	work := make([]float64, routh.WorkLen(len(p)))
	rhp, zeros, st := routh.Count(p, work)
	fmt.Println(rhp, zeros, st == routh.Decided)
	// Output: 2 0 true
}
