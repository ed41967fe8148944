package intervals_test

import (
	"fmt"

	"gainscape/regions/family"
	"gainscape/regions/intervals"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
)

// The proportional gain that keeps 1/(s+1)³ stable in a unity feedback
// loop: −1 < kp < 8, the upper limit with a pair of roots crossing at
// ω = √3 (the characteristic polynomial s³+3s²+3s+1+kp, worked by hand in
// the package tests).
func ExampleStable() {
	f, _ := family.Lookup("p")
	l := loop.New(loop.Plant{Num: poly.Poly{1}, Den: poly.FromDescending([]float64{1, 3, 3, 1})}, f)
	ivs, err := intervals.Stable(l, 0, -10, 10)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, iv := range ivs {
		fmt.Printf("%.6g (%s, ω = %.6g) < kp < %.6g (%s, ω = %.6g)\n", iv.Lo, iv.LoKind, iv.LoOmega, iv.Hi, iv.HiKind, iv.HiOmega)
	}
	// Output:
	// -1 (real, ω = 0) < kp < 8 (complex, ω = 1.73205)
}
