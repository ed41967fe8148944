package zoh_test

import (
	"fmt"

	"gainscape/regions/poly"
	"gainscape/regions/zoh"
)

// ExampleDiscretise samples the plant 1/(s(s + 1)) behind a hold every
// second, the case K. Ogata works in Discrete-Time Control Systems (from
// memory): G(z) = (0.3679·z + 0.2642)/(z² − 1.3679·z + 0.3679).
func ExampleDiscretise() {
	num, den, err := zoh.Discretise(poly.Poly{1}, poly.Poly{0, 1, 1}, 1, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("numerator   (z^1, z^0): %.4f %.4f\n", num[1], num[0])
	fmt.Printf("denominator (z^2 … z^0): %.4f %.4f %.4f\n", den[2], den[1], den[0])
	// Output:
	// numerator   (z^1, z^0): 0.3679 0.2642
	// denominator (z^2 … z^0): 1.0000 -1.3679 0.3679
}
