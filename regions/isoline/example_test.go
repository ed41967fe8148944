package isoline_test

import (
	"fmt"
	"math"

	"gainscape/regions/isoline"
	"gainscape/regions/plane"
)

// The field kp + 2·ki on a 3×3 grid has the straight iso-line
// kp + 2·ki = 1.5; the nodes at kp = 2 have no value, so the line stops
// at kp = 1, where it enters the cells with a missing corner.
func ExampleTrace() {
	kp := plane.Axis{Param: "kp", Min: 0, Max: 2, N: 3}
	ki := plane.Axis{Param: "ki", Min: 0, Max: 1, N: 3}
	nan := math.NaN()
	values := []float64{
		0, 1, nan, // ki = 0
		1, 2, nan, // ki = 0.5
		2, 3, nan, // ki = 1
	}
	for _, line := range isoline.Trace(kp, ki, values, 1.5) {
		for _, p := range line {
			fmt.Printf("(%.3g, %.3g) ", p[0], p[1])
		}
		fmt.Println()
	}
	// Output:
	// (1, 0.25) (0.5, 0.5) (0, 0.75)
}
