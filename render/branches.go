package render

import (
	"image/color"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// BranchPoint is a point of an edge that lies on a D-partition branch
// beyond the first (a loop with dead time): there the Nyquist curve of
// the loop has turned at least once more before it passes −1.
type BranchPoint struct {
	X, Y float64
}

// Size and spacing of the branch marks, in canvas units: a small diamond,
// unlike the round symbol of a design point, at most one within
// branchSpacing of another.
const (
	branchHalf    = vg.Length(2.3)
	branchSpacing = vg.Length(16)
)

// branchSites returns the canvas points at which branch marks are drawn:
// the points inside area, thinned so that no two are closer than
// branchSpacing, taken in the order given.
func branchSites(pts []BranchPoint, area vg.Rectangle, trX, trY transform) []vg.Point {
	var out []vg.Point
next:
	for _, p := range pts {
		at := vg.Point{X: trX(p.X), Y: trY(p.Y)}
		if !inside(vg.Rectangle{Min: at, Max: at}, area) {
			continue
		}
		for _, q := range out {
			if dx, dy := at.X-q.X, at.Y-q.Y; dx*dx+dy*dy < branchSpacing*branchSpacing {
				continue next
			}
		}
		out = append(out, at)
	}
	return out
}

// drawBranchMark draws the diamond of a later branch at pt.
func drawBranchMark(c draw.Canvas, pt vg.Point) {
	var d vg.Path
	d.Move(vg.Point{X: pt.X + branchHalf, Y: pt.Y})
	d.Line(vg.Point{X: pt.X, Y: pt.Y + branchHalf})
	d.Line(vg.Point{X: pt.X - branchHalf, Y: pt.Y})
	d.Line(vg.Point{X: pt.X, Y: pt.Y - branchHalf})
	d.Close()
	c.SetColor(color.White)
	c.Fill(d)
	c.SetLineStyle(draw.LineStyle{Color: inkColour, Width: 0.9})
	c.Stroke(d)
}

// branchThumb is the legend thumbnail of a later branch: the diamond on
// the complex-pair edge's stroke.
type branchThumb struct{ lineThumb }

// Thumbnail draws the stroke and the diamond in its middle.
func (b branchThumb) Thumbnail(c *draw.Canvas) {
	b.lineThumb.Thumbnail(c)
	drawBranchMark(*c, c.Center())
}
