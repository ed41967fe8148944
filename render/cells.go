package render

import (
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// cellFill paints the cell around every node of a grid in a colour
// chosen per node; a nil colour leaves the cell unpainted. Cells reach
// halfway to the neighbouring nodes, as in plotter.HeatMap.
//
// It exists beside plotter.HeatMap because that plotter fills one
// rectangle per node: anti-aliased raster output then shows faint seams
// between cells of one colour, and SVG output grows with the number of
// nodes. Here each horizontal run of one colour is a single rectangle,
// and each rectangle reaches seamOverlap into the row above, which is
// painted later and covers the overlap.
type cellFill struct {
	g      plotter.GridXYZ
	colour func(c, r int) color.Color
}

// seamOverlap is about one pixel at the default resolution.
const seamOverlap = vg.Length(0.4)

// cellEdges returns the boundaries between the cells of n nodes at
// positions at(0) … at(n-1): n+1 values.
func cellEdges(n int, at func(int) float64) []float64 {
	e := make([]float64, n+1)
	for i := 1; i < n; i++ {
		e[i] = (at(i-1) + at(i)) / 2
	}
	e[0] = at(0) - (e[1] - at(0))
	e[n] = at(n-1) + (at(n-1) - e[n-1])
	return e
}

// Plot paints the cells.
func (f cellFill) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	nc, nr := f.g.Dims()
	if nc < 2 || nr < 2 {
		return
	}
	xe, ye := cellEdges(nc, f.g.X), cellEdges(nr, f.g.Y)
	for r := 0; r < nr; r++ {
		y0, y1 := trY(ye[r]), trY(ye[r+1])
		if r+1 < nr {
			y1 += seamOverlap
		}
		for i := 0; i < nc; {
			col := f.colour(i, r)
			start := i
			for i < nc && sameColour(f.colour(i, r), col) {
				i++
			}
			if col == nil {
				continue
			}
			x0, x1 := trX(xe[start]), trX(xe[i])
			if i < nc {
				x1 += seamOverlap
			}
			c.FillPolygon(col, c.ClipPolygonXY(rectPoints(vg.Rectangle{
				Min: vg.Point{X: x0, Y: y0},
				Max: vg.Point{X: x1, Y: y1},
			})))
		}
	}
}

// sameColour reports whether a and b paint alike; nil equals only nil.
func sameColour(a, b color.Color) bool {
	if a == nil || b == nil {
		return a == nil && b == nil
	}
	r0, g0, b0, a0 := a.RGBA()
	r1, g1, b1, a1 := b.RGBA()
	return r0 == r1 && g0 == g1 && b0 == b1 && a0 == a1
}
