package overlay_test

import (
	"context"
	"fmt"

	"gainscape/regions/boundary"
	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/loop"
	"gainscape/regions/overlay"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// How far the design kp = 0.5, ki = 0.5 for PI control of 1/(s+1) is from
// losing stability. The loop is stable for kp > −1 and ki > 0 (the
// characteristic polynomial is s² + (1+kp)s + ki), so in gain units the
// nearest boundary is ki = 0, half a unit away; relative to the gains
// themselves, kp = −1 is 300% of kp away and ki = 0 is 100% of ki away.
func ExampleFragility() {
	f, _ := family.Lookup("pi")
	loop := loop.Loop{Plant: loop.Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 1}}, Family: f, Values: []float64{0, 0}}
	s, err := plane.NewSetup(loop,
		plane.Axis{Param: "kp", Min: -2.03, Max: 1.97, N: 41},
		plane.Axis{Param: "ki", Min: -1.03, Max: 1.47, N: 41})
	if err != nil {
		fmt.Println(err)
		return
	}
	ctx := context.Background()
	m, _ := grid.Evaluate(ctx, s, grid.Options{})
	curves, _ := boundary.Trace(ctx, s, m, 0)
	c, err := overlay.Fragility(s, 0.5, 0.5, curves)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("absolute %.4f to the %s boundary at (%.4f, %.4f)\n", c.Absolute.Distance, c.Absolute.Kind, c.Absolute.X, c.Absolute.Y)
	fmt.Printf("relative %.0f%% to the %s boundary at (%.4f, %.4f)\n", 100*c.Relative.Distance, c.Relative.Kind, c.Relative.X, c.Relative.Y)
	// Output:
	// absolute 0.5000 to the real boundary at (0.5000, 0.0000)
	// relative 100% to the real boundary at (0.5000, 0.0000)
}
