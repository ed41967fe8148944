package render

import (
	"image/color"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gainscape/regions/boundary"
)

// The figure is set in the sans-serif Liberation face that gonum/plot
// bundles. It is metric-compatible with the sans faces found on most
// systems, so an SVG viewer that substitutes its own font keeps the
// layout.
var sans = font.Font{Typeface: "Liberation", Variant: "Sans"}

// Type sizes, chosen to stay readable when the figure is printed at its
// default width of 16 cm.
const (
	titleSize  = vg.Length(11)
	noteSize   = vg.Length(8.5)
	axisSize   = vg.Length(10)
	tickSize   = vg.Length(8.5)
	legendSize = vg.Length(8)
	labelSize  = vg.Length(7.5)
)

// inkColour is used for boundary curves, marks, text and the frame.
var inkColour = color.Gray{Y: 0x10}

// noteColour is a dark grey for the lines under the title.
var noteColour = color.Gray{Y: 0x40}

// haloColour separates black lines and labels from dark fills.
var haloColour = color.NRGBA{R: 255, G: 255, B: 255, A: 230}

// contourColour is a dark slate blue, distinct from the black boundary
// curves in colour and, through thinner lines, in greyscale.
var contourColour = hcl(255, 0.22, 0.30)

// textStyle returns a left-aligned, baseline-anchored style of the given
// size.
func textStyle(size vg.Length, bold bool, c color.Color) text.Style {
	f := sans
	if bold {
		f.Weight = xfont.WeightBold
	}
	return text.Style{
		Color:   c,
		Font:    font.From(f, size),
		Handler: plot.DefaultTextHandler,
	}
}

// centredStyle returns a style that centres text on its anchor point.
func centredStyle(size vg.Length, c color.Color) text.Style {
	s := textStyle(size, false, c)
	s.XAlign, s.YAlign = text.XCenter, text.YCenter
	return s
}

// curveWidth is the stroke width of boundary curves.
const curveWidth = vg.Length(1.5)

// curveStyle returns the stroke of a boundary of kind k. The kinds differ
// in dash pattern, not in colour, so they survive greyscale printing:
// complex-pair edges (the common case, carrying ω labels) are solid,
// real-root edges dashed and edges through infinity dotted.
func curveStyle(k boundary.Kind) draw.LineStyle {
	s := draw.LineStyle{Color: inkColour, Width: curveWidth}
	switch k {
	case boundary.Real:
		s.Dashes = []vg.Length{6, 3}
	case boundary.Infinite:
		s.Dashes = []vg.Length{1.5, 2.5}
		s.Width = 1.8
	}
	return s
}

// haloStyle is the light casing stroked under every boundary curve.
func haloStyle() draw.LineStyle {
	return draw.LineStyle{Color: haloColour, Width: curveWidth + 2}
}

// kindNames are the legend texts of the boundary kinds.
var kindNames = map[boundary.Kind]string{
	boundary.Complex:  "pair crosses at ±jω",
	boundary.Real:     "real root crosses at 0",
	boundary.Infinite: "root crosses at ∞",
}

// kindOrder is the order of boundary kinds in the legend.
var kindOrder = []boundary.Kind{boundary.Complex, boundary.Real, boundary.Infinite}

// contourDashes are the dash patterns of successive contour sets; none is
// solid, dashed or dotted alone, so no set looks like a boundary curve.
var contourDashes = [][]vg.Length{
	{5, 1.8, 1.2, 1.8},
	{5, 1.8, 1.2, 1.8, 1.2, 1.8},
	{9, 2, 3, 2},
	{2.5, 1.5},
}

// contourStyle returns the stroke of the i-th contour set.
func contourStyle(i int) draw.LineStyle {
	return draw.LineStyle{
		Color:  contourColour,
		Width:  0.9,
		Dashes: contourDashes[i%len(contourDashes)],
	}
}
