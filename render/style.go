package render

import (
	"image/color"

	xfont "golang.org/x/image/font"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gainscape/regions/stability"
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
// real-root edges dashed, edges where a real root of a sampled loop
// crosses z = −1 long-and-short dashed, and edges through infinity
// dotted.
func curveStyle(k stability.Kind) draw.LineStyle {
	s := draw.LineStyle{Color: inkColour, Width: curveWidth}
	switch k {
	case stability.Real:
		s.Dashes = []vg.Length{6, 3}
	case stability.Alternating:
		s.Dashes = []vg.Length{9, 2.5, 2, 2.5}
	case stability.Infinite:
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
var kindNames = map[stability.Kind]string{
	stability.Complex:     "pair crosses at ±jω",
	stability.Real:        "real root crosses at 0",
	stability.Infinite:    "root crosses at ∞",
	stability.Alternating: "real root crosses at z = −1",
}

// sampledKindNames are the legend texts of the boundary kinds of a
// sampled loop, whose boundary is the unit circle.
var sampledKindNames = map[stability.Kind]string{
	stability.Complex:     "pair crosses at e^(±jωT)",
	stability.Real:        "real root crosses at z = 1",
	stability.Infinite:    "root crosses at ∞",
	stability.Alternating: "real root crosses at z = −1",
}

// kindName is the legend text of kind k, for a sampled map or not.
func kindName(k stability.Kind, sampled bool) string {
	if sampled {
		return sampledKindNames[k]
	}
	return kindNames[k]
}

// kindOrder is the order of boundary kinds in the legend.
var kindOrder = []stability.Kind{stability.Complex, stability.Real, stability.Alternating, stability.Infinite}

// compareLooks are the strokes of the edges of compared sample times
// (Figure.Compare), one per set in turn: hues spread away from the
// iso-lines' and from the black of the map's own edges, each with its own
// dash pattern, so that sets stay apart in greyscale too; thinner than
// the map's edges and without their white casing.
var compareLooks = []struct {
	hue, lightness float64
	dashes         []vg.Length
}{
	{250, 0.45, nil},
	{35, 0.50, []vg.Length{7, 2}},
	{320, 0.42, []vg.Length{2, 1.6}},
	{185, 0.45, []vg.Length{10, 2, 2, 2, 2, 2}},
	{95, 0.50, []vg.Length{4, 3}},
	{275, 0.30, []vg.Length{12, 2, 4, 2}},
}

// compareStyle returns the stroke of the i-th compared set.
func compareStyle(i int) draw.LineStyle {
	l := compareLooks[i%len(compareLooks)]
	return draw.LineStyle{Color: hcl(l.hue, contourChroma, l.lightness), Width: 1.3, Dashes: l.dashes}
}

// Iso-line sets are told apart twice over, so either cue suffices: by
// dash pattern, which survives greyscale print, and by hue. Each set's
// look pairs a dash pattern with a CIE-LCh hue and lightness. The four
// colours come from a search over hue and lightness for the set whose
// closest pair is farthest apart by CIEDE2000, as seen with full colour
// vision, as seen by red–green dichromats (who keep only lightness and
// the blue–yellow contrast) and in lightness and red–green alone (what
// the rarer blue–yellow dichromats keep); lightness was held to 0.5 or
// less so every line stands clear of the light fills, and hues were kept
// away from the blue-green of the stable region. The ochre was then
// darkened a little to hold against the darkest shading in greyscale.
// The result is ochre, indigo, raspberry and a dark green. The patterns,
// in the same order, are dash and dot, long dash, short dash and two
// dots, and fine dots; none is solid, plain dashed or coarse-dotted like
// a boundary curve, and the contour stroke is thinner and carries no
// white casing.
var contourLooks = []struct {
	hue, lightness float64
	dashes         []vg.Length
}{
	{70, 0.46, []vg.Length{9, 2, 1.2, 2}},
	{295, 0.30, []vg.Length{11, 3}},
	{0, 0.38, []vg.Length{3.5, 1.6, 1, 1.6, 1, 1.6}},
	{145, 0.30, []vg.Length{1, 1.4}},
}

// contourChroma is the chroma asked of every contour colour; hcl lowers
// it where a hue cannot reach it at the set lightness.
const contourChroma = 0.5

// contourWidth is the stroke width of iso-lines.
const contourWidth = vg.Length(1.1)

// contourColour returns the colour of the i-th contour set; sets beyond
// the fourth repeat the looks in turn.
func contourColour(i int) color.Color {
	l := contourLooks[i%len(contourLooks)]
	return hcl(l.hue, contourChroma, l.lightness)
}

// contourLabelColour returns the text colour of the i-th set's labels:
// the set's hue, darkened where needed so small type on the white label
// ground keeps a contrast ratio of about 7:1.
func contourLabelColour(i int) color.Color {
	l := contourLooks[i%len(contourLooks)]
	return hcl(l.hue, contourChroma, min(l.lightness, contourLabelLightness))
}

// contourLabelLightness is the greatest CIE L* (0–1) of label text.
const contourLabelLightness = 0.36

// contourStyle returns the stroke of the i-th contour set.
func contourStyle(i int) draw.LineStyle {
	return draw.LineStyle{
		Color:  contourColour(i),
		Width:  contourWidth,
		Dashes: contourLooks[i%len(contourLooks)].dashes,
	}
}
