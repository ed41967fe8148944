package render

import (
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gainscape/regions/grid"
)

// Undecided nodes are drawn as diagonal hatching on a white ground: a
// pattern, unlike a grey, cannot be mistaken for any count's shade in
// greyscale. The hatching is anchored to the canvas, so runs of
// undecided cells in neighbouring rows join into one continuous pattern.

// hatchGap and hatchStyle set the spacing and stroke of the hatching.
const hatchGap = vg.Length(3.2)

var hatchStyle = draw.LineStyle{Color: color.Gray{Y: 0x50}, Width: 0.6}

// undecidedHatch is a plotter that hatches the undecided cells of a map.
type undecidedHatch struct{ m *grid.Map }

// Plot hatches each horizontal run of undecided cells.
func (h undecidedHatch) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	xa, ya := h.m.XAxis, h.m.YAxis
	dx, dy := xa.Span()/float64(xa.N-1)/2, ya.Span()/float64(ya.N-1)/2
	for j := 0; j < ya.N; j++ {
		for i := 0; i < xa.N; {
			if h.m.Count(i, j) != grid.Undecided {
				i++
				continue
			}
			start := i
			for i < xa.N && h.m.Count(i, j) == grid.Undecided {
				i++
			}
			hatchRect(c, vg.Rectangle{
				Min: vg.Point{X: trX(xa.At(start) - dx), Y: trY(ya.At(j) - dy)},
				Max: vg.Point{X: trX(xa.At(i-1) + dx), Y: trY(ya.At(j) + dy)},
			})
		}
	}
}

// hatchRect strokes the lines x − y = k·hatchGap that cross r.
func hatchRect(c draw.Canvas, r vg.Rectangle) {
	lo := int((r.Min.X-r.Max.Y)/hatchGap) - 1
	hi := int((r.Max.X-r.Min.Y)/hatchGap) + 1
	var lines [][]vg.Point
	for k := lo; k <= hi; k++ {
		off := vg.Length(k) * hatchGap
		// On the line y = x − off; clip x to the rectangle's x range and
		// to the x range where y stays inside.
		x0 := max(r.Min.X, r.Min.Y+off)
		x1 := min(r.Max.X, r.Max.Y+off)
		if x1 <= x0 {
			continue
		}
		lines = append(lines, []vg.Point{{X: x0, Y: x0 - off}, {X: x1, Y: x1 - off}})
	}
	if len(lines) > 0 {
		c.StrokeLines(hatchStyle, lines...)
	}
}
