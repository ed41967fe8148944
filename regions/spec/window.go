package spec

import (
	"fmt"
	"math"
)

// MinStepsPerCell is the fewest representable float64 values a window
// must hold between two neighbouring grid nodes. Below it the nodes,
// the edges found between them by bisection and the tick labels are
// decided by rounding rather than by the window: with 1024 = 2^10 steps
// a bisection between two nodes still places an edge to a thousandth of
// a cell, and the tick labels of the window stay distinct.
const MinStepsPerCell = 1024

// CheckWindow checks that the axis a, swept in the given number of
// nodes (at least 2), is a window floating point can compute with:
//
//   - wide enough: the spacing of the nodes, (Max−Min)/(nodes−1), is at
//     least MinStepsPerCell units in the last place of the endpoint of
//     larger magnitude, where representable values are sparsest;
//   - narrow enough: Max−Min and (Max−Min)·(nodes−1) are finite, so that
//     no node Min + i·(Max−Min)/(nodes−1) overflows on the way.
//
// The message says which limit is broken and what to change; it does not
// quote the axis, which the caller names.
func CheckWindow(a Axis, nodes int) error {
	if nodes < 2 {
		panic(fmt.Sprintf("spec: CheckWindow with %d nodes", nodes))
	}
	if !finite(a.Min) || !finite(a.Max) || !(a.Min < a.Max) {
		return fmt.Errorf("the window %g to %g is not a finite range from low to high", a.Min, a.Max)
	}
	cells := float64(nodes - 1)
	span := a.Max - a.Min
	if !finite(span) {
		return fmt.Errorf("the window is too wide for floating point: its width %g − (%g) overflows; narrow it", a.Max, a.Min)
	}
	if !finite(span * cells) {
		return fmt.Errorf("the window is too wide for floating point: its width %g times %d cells overflows; narrow it or use fewer nodes",
			span, nodes-1)
	}
	steps := span / cells / ulp(math.Max(math.Abs(a.Min), math.Abs(a.Max)))
	if steps < MinStepsPerCell {
		where, advice := "between its ends", "widen it"
		if nodes > 2 {
			where, advice = fmt.Sprintf("between neighbouring nodes of %d", nodes), "widen it or use fewer nodes"
		}
		return fmt.Errorf("the window is too narrow for floating point: about %.3g representable values %s, fewer than %d; %s",
			math.Floor(steps), where, MinStepsPerCell, advice)
	}
	return nil
}

// ulp returns the spacing of the float64 values just above x ≥ 0, or
// just below it at the largest float64, where there is nothing above.
func ulp(x float64) float64 {
	if x == math.MaxFloat64 {
		return x - math.Nextafter(x, 0)
	}
	return math.Nextafter(x, math.Inf(1)) - x
}

// finite reports whether x is neither NaN nor infinite.
func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }
