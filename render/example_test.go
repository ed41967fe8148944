package render_test

import (
	"bytes"
	"fmt"
	"strings"

	"gainscape/regions/boundary"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
	"gainscape/render"
)

// A 3×3 map, stable in its lower-left quarter, with one complex-pair edge
// between the regions: the SVG shows the edge's frequency.
func ExampleWrite() {
	m := grid.NewMap(
		plane.Axis{Param: "kp", Min: 0, Max: 2, N: 3},
		plane.Axis{Param: "ki", Min: 0, Max: 1, N: 3},
	)
	copy(m.RHP, []int8{0, 0, 2, 0, 2, 2, 2, 2, 2})
	fig := render.Figure{
		Map: m,
		Curves: []boundary.Curve{{Kind: stability.Complex, Points: []boundary.Point{
			{X: 1.5, Y: -0.25, Omega: 1.2}, {X: 1.2, Y: 0.3, Omega: 1.25}, {X: 0.6, Y: 0.6, Omega: 1.3}, {X: -0.5, Y: 0.75, Omega: 1.4},
		}}},
		Title: "plant 1/(s+1)³ under PI",
		Notes: []string{"fixed: none"},
	}
	var buf bytes.Buffer
	if err := render.Write(&buf, "svg", fig); err != nil {
		fmt.Println(err)
		return
	}
	svg := buf.String()
	fmt.Println(strings.Contains(svg, "2 roots in RHP"), strings.Contains(svg, "ω=1.2"))
	// Output: true true
}
