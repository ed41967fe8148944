package render

import (
	"image/color"
	"math"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// placeMarkLabel tries eight positions around a mark, nearest first, and
// returns the first that is free; if none is, the label goes to the
// right of the mark regardless.
func placeMarkLabel(pl *placer, pt vg.Point, label string) drawnLabel {
	// Far enough that the label's box clears the symbol's.
	off := markClear + labelPad + labelGap + 1
	type spot struct {
		dx, dy vg.Length
		xa     text.XAlignment
		ya     text.YAlignment
	}
	spots := []spot{
		{off, 0, text.XLeft, text.YCenter},
		{-off, 0, text.XRight, text.YCenter},
		{0, off, text.XCenter, text.YBottom},
		{0, -off, text.XCenter, text.YTop},
		{off, off, text.XLeft, text.YBottom},
		{off, -off, text.XLeft, text.YTop},
		{-off, off, text.XRight, text.YBottom},
		{-off, -off, text.XRight, text.YTop},
	}
	styles := make([]text.Style, len(spots))
	boxes := make([]vg.Rectangle, len(spots))
	for i, s := range spots {
		styles[i] = textStyle(legendSize, false, inkColour)
		styles[i].XAlign, styles[i].YAlign = s.xa, s.ya
		at := vg.Point{X: pt.X + s.dx, Y: pt.Y + s.dy}
		boxes[i] = labelBox(styles[i], label, at)
	}
	k := pl.first(boxes)
	if k < 0 {
		k = 0
		pl.block(boxes[0])
	}
	at := vg.Point{X: pt.X + spots[k].dx, Y: pt.Y + spots[k].dy}
	return drawnLabel{text: label, at: at, style: styles[k], bg: grow(boxes[k], -labelGap)}
}

// drawMark draws the design-point symbol: a white disc with a dark ring
// and a dark centre dot, visible on every fill.
func drawMark(c draw.Canvas, pt vg.Point) {
	var disc vg.Path
	disc.Arc(pt, markRadius, 0, 2*math.Pi)
	disc.Close()
	c.SetColor(color.White)
	c.Fill(disc)
	c.SetLineStyle(draw.LineStyle{Color: inkColour, Width: 1.2})
	c.Stroke(disc)
	var dot vg.Path
	dot.Arc(pt, 1.1, 0, 2*math.Pi)
	dot.Close()
	c.SetColor(inkColour)
	c.Fill(dot)
}
