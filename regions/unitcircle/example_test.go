package unitcircle_test

import (
	"fmt"

	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
	"gainscape/regions/unitcircle"
	"gainscape/regions/zoh"
)

// Example counts the closed-loop roots of K/(s(s + 1)) behind a hold at
// T = 1 s under P control, below and above the critical gain 2.3922
// (K. Ogata, Discrete-Time Control Systems, from memory, gives 2.3925
// from rounded coefficients), and classifies the edge.
func Example() {
	num, den, err := zoh.Discretise(poly.Poly{1}, poly.Poly{0, 1, 1}, 1, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	test, err := unitcircle.New(1)
	if err != nil {
		fmt.Println(err)
		return
	}
	counter := test.NewCounter(3)
	for _, k := range []float64{2, 2.5} {
		p := family.Characteristic(num, den, poly.Poly{k}, poly.Poly{1})
		v := counter.Count(stability.Function{P: p})
		fmt.Printf("K = %g: %d outside, %v\n", k, v.Unstable, v.Class())
	}
	edge := family.Characteristic(num, den, poly.Poly{2.392211191177333}, poly.Poly{1})
	c := test.Classify(stability.Function{P: edge}, stability.Function{P: edge})
	fmt.Printf("edge: %v at ω = %.4f rad/s\n", c.Kind, c.Omega)
	// Output:
	// K = 2: 0 outside, stable
	// K = 2.5: 2 outside, unstable
	// edge: complex at ω = 1.3244 rad/s
}
