package render

import (
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// The shading scale is a vertical bar beside the plot, spanning the
// data area's height. Ticks and their values are on the bar's right and
// the field's name runs up the right edge of the column.

// Scale column geometry.
const (
	scaleLead    = vg.Length(10) // space between plot and bar
	scaleBar     = vg.Length(11) // bar width
	scaleTick    = vg.Length(3)
	scaleTextGap = vg.Length(2.5)
	scaleNameGap = vg.Length(5)
)

// scaleTicks returns the ticks of the scale's range.
func scaleTicks(s *shadeScale) []plot.Tick { return readableTicks{}.Ticks(s.Min(), s.Max()) }

// scaleNameStyle is the style of the field's name, turned to read
// upwards.
func scaleNameStyle() text.Style {
	st := textStyle(legendSize, false, inkColour)
	st.Rotation = math.Pi / 2
	st.XAlign, st.YAlign = text.XCenter, text.YTop
	return st
}

// scaleColumnWidth returns the width the scale column needs.
func scaleColumnWidth(s *shadeScale, name string) vg.Length {
	ts := textStyle(legendSize, false, inkColour)
	var labels vg.Length
	for _, t := range scaleTicks(s) {
		labels = max(labels, ts.Width(t.Label))
	}
	w := scaleLead + scaleBar + scaleTick + scaleTextGap + labels
	if name != "" {
		w += scaleNameGap + ts.Height(name)
	}
	return w
}

// drawScale draws the bar, its ticks and the field's name in the column
// r of c.
func drawScale(c draw.Canvas, s *shadeScale, name string, r vg.Rectangle) {
	barRect := vg.Rectangle{
		Min: vg.Point{X: r.Min.X + scaleLead, Y: r.Min.Y},
		Max: vg.Point{X: r.Min.X + scaleLead + scaleBar, Y: r.Max.Y},
	}
	bar := plot.New()
	bar.HideAxes()
	bar.X.Padding, bar.Y.Padding = 0, 0
	bar.Add(&plotter.ColorBar{ColorMap: s, Vertical: true, Colors: 256})
	bar.X.Min, bar.X.Max, bar.Y.Min, bar.Y.Max = 0, 1, s.Min(), s.Max()
	bar.Draw(draw.Canvas{Canvas: c.Canvas, Rectangle: barRect})
	frame := draw.Canvas{Canvas: c.Canvas, Rectangle: barRect}
	frame.StrokeLines(draw.LineStyle{Color: inkColour, Width: 0.5}, rectPoints(barRect))

	ts := textStyle(legendSize, false, inkColour)
	ts.YAlign = text.YCenter
	tickStyle := draw.LineStyle{Color: inkColour, Width: 0.5}
	right := barRect.Max.X
	var labels vg.Length
	for _, t := range scaleTicks(s) {
		y := barRect.Min.Y + barRect.Size().Y*vg.Length((t.Value-s.Min())/(s.Max()-s.Min()))
		length := scaleTick
		if t.Label == "" {
			length /= 2
		}
		c.StrokeLine2(tickStyle, right, y, right+length, y)
		if t.Label != "" {
			c.FillText(ts, vg.Point{X: right + scaleTick + scaleTextGap, Y: y}, t.Label)
			labels = max(labels, ts.Width(t.Label))
		}
	}
	if name != "" {
		x := right + scaleTick + scaleTextGap + labels + scaleNameGap
		c.FillText(scaleNameStyle(), vg.Point{X: x, Y: (barRect.Min.Y + barRect.Max.Y) / 2}, name)
	}
}
