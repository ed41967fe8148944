package render

import (
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gainscape/regions/boundary"
	"gainscape/regions/stability"
)

// Label spacing along complex-root curves, the retry step when a
// candidate is blocked, and the padding of label boxes, in canvas units.
const (
	omegaSpacing = vg.Length(100)
	omegaStep    = vg.Length(4)
	labelPad     = vg.Length(1.2) // background around the text
	labelGap     = vg.Length(1.5) // clear space kept between labels
	markRadius   = vg.Length(3.4)
	markClear    = markRadius + 1.5 // half the side of the box a symbol claims
)

// annotations is the plotter that writes every label on the map and
// draws the design points and the frame. It runs last, when the data
// area is known, so labels can be placed in canvas units.
type annotations struct {
	fig *Figure
	iso []isoSet
}

// isoSet is a contour set with its traced lines.
type isoSet struct {
	name   string
	levels []isoLevel
}

// isoLevel is one level of a contour set and its lines in data units.
type isoLevel struct {
	level float64
	lines []plotter.XYs
}

// drawnLabel is a placed label ready to be drawn.
type drawnLabel struct {
	text  string
	at    vg.Point
	style text.Style
	bg    vg.Rectangle
}

// layout is everything the annotations draw, placed in canvas units.
type layout struct {
	// labels are the iso-line, ω and mark labels; leaders are the
	// mark labels that stand off their symbols.
	labels  []drawnLabel
	leaders []markLabel
	symbols []vg.Point
}

// Plot places and draws the labels, the marks and the frame.
func (a annotations) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	lay := a.place(c.Rectangle, trX, trY)
	for _, pt := range branchSites(a.fig.LaterBranches, c.Rectangle, trX, trY) {
		drawBranchMark(c, pt)
	}
	for _, l := range lay.leaders {
		drawLeader(c, l)
	}
	for _, l := range lay.labels {
		c.FillPolygon(haloColour, rectPoints(l.bg))
		c.FillText(l.style, l.at, l.text)
	}
	for _, pt := range lay.symbols {
		drawMark(c, pt)
	}
	c.StrokeLines(draw.LineStyle{Color: inkColour, Width: 0.8}, rectPoints(c.Rectangle))
}

// place lays out the annotations in the data area.
func (a annotations) place(area vg.Rectangle, trX, trY transform) layout {
	pl := &placer{area: area}
	curves := a.curvePaths(pl, trX, trY)
	levels := a.isoTexts(pl, trX, trY)
	var lay layout
	var marks []markText
	for _, m := range a.fig.Marks {
		pt := vg.Point{X: trX(m.X), Y: trY(m.Y)}
		if inside(vg.Rectangle{Min: pt, Max: pt}, area) {
			marks = append(marks, markText{at: pt, text: m.Label})
			lay.symbols = append(lay.symbols, pt)
			pl.addSymbol(pt)
		}
	}
	lay.labels = placeIsoLabels(pl, levels, lay.symbols)
	markLabels := placeMarkLabels(pl, marks)
	lay.labels = append(lay.labels, placeOmegaLabels(pl, curves, a.fig.FreqUnit)...)
	for _, l := range markLabels {
		if l.leader {
			lay.leaders = append(lay.leaders, l)
		}
		lay.labels = append(lay.labels, l.drawnLabel)
	}
	return lay
}

// transform maps data units to canvas units along one axis.
type transform = func(float64) vg.Length

// curvePath is a finite piece of a boundary curve in canvas units.
type curvePath struct {
	kind stability.Kind
	path []pathPoint
}

// curvePaths maps the finite pieces of the boundary curves to canvas
// units and records them in pl as lines labels should not cover.
func (a annotations) curvePaths(pl *placer, trX, trY transform) []curvePath {
	var out []curvePath
	for _, cv := range a.fig.Curves {
		for _, piece := range finitePieces(cv.Points) {
			path := canvasPath(piece, trX, trY)
			pts := make([]vg.Point, len(path))
			for i, p := range path {
				pts[i] = p.At
			}
			pl.addLine(pts, boundaryCover)
			out = append(out, curvePath{kind: cv.Kind, path: path})
		}
	}
	return out
}

// isoTexts maps the traced iso-lines to canvas units with their labels
// and records them in pl.
func (a annotations) isoTexts(pl *placer, trX, trY transform) []isoText {
	var out []isoText
	for i, set := range a.iso {
		for _, lv := range set.levels {
			it := isoText{text: set.name + "=" + formatNumber(lv.level), colour: contourLabelColour(a.fig.Contours[i].Look)}
			for _, xys := range lv.lines {
				if len(xys) < 2 {
					continue
				}
				pts := make([]vg.Point, len(xys))
				for k, p := range xys {
					pts[k] = vg.Point{X: trX(p.X), Y: trY(p.Y)}
				}
				it.lines = append(it.lines, isoLine{pts: pts, id: pl.addLine(pts, isoCover)})
			}
			out = append(out, it)
		}
	}
	return out
}

// placeOmegaLabels writes ω along every complex-pair edge at intervals
// of omegaSpacing (at least once where there is room), "ω=0" once on
// every real-root edge, and "ω=π/T=…" once on every edge where a real
// root of a sampled loop crosses z = −1.
func placeOmegaLabels(pl *placer, curves []curvePath, unit string) []drawnLabel {
	style := centredStyle(labelSize, inkColour)
	formatOmega := func(w float64) string { return omegaText(w, unit) }
	box := func(pt vg.Point, w float64) (vg.Rectangle, bool) {
		if !finite(w) {
			return vg.Rectangle{}, false
		}
		return labelBox(style, formatOmega(w), pt), true
	}
	zeroBox := func(pt vg.Point, _ float64) (vg.Rectangle, bool) { return box(pt, 0) }
	inf := vg.Length(math.Inf(1))
	var labels []drawnLabel
	for _, cv := range curves {
		path := cv.path
		switch cv.kind {
		case stability.Complex:
			sites := pl.along(path, omegaSpacing*0.45, omegaSpacing, omegaStep, box)
			if len(sites) == 0 {
				// A short edge still gets one label if it has room.
				sites = pl.along(path, omegaStep, inf, omegaStep, box)
			}
			labels = append(labels, toLabels(sites, style, formatOmega)...)
		case stability.Real:
			sites := pl.along(path, pathLength(path)/2, inf, omegaStep, zeroBox)
			if len(sites) == 0 {
				sites = pl.along(path, omegaStep, inf, omegaStep, zeroBox)
			}
			labels = append(labels, toLabels(sites, style, func(float64) string { return formatOmega(0) })...)
		case stability.Alternating:
			nyquist := func(w float64) string { return strings.Replace(formatOmega(w), "ω=", "ω=π/T=", 1) }
			nbox := func(pt vg.Point, w float64) (vg.Rectangle, bool) {
				if !finite(w) {
					return vg.Rectangle{}, false
				}
				return labelBox(style, nyquist(w), pt), true
			}
			sites := pl.along(path, pathLength(path)/2, inf, omegaStep, nbox)
			if len(sites) == 0 {
				sites = pl.along(path, omegaStep, inf, omegaStep, nbox)
			}
			labels = append(labels, toLabels(sites, style, nyquist)...)
		}
	}
	return labels
}

// toLabels turns placed sites into labels with the given style and text.
func toLabels(sites []site, style text.Style, format func(float64) string) []drawnLabel {
	out := make([]drawnLabel, len(sites))
	for i, s := range sites {
		out[i] = drawnLabel{text: format(s.Value), at: s.At, style: style, bg: grow(s.Box, -labelGap)}
	}
	return out
}

// omegaText writes a frequency with three significant digits, keeping
// trailing zeros so neighbouring labels read alike, and its unit:
// "ω=1.83 rad/s", "ω=0.700 rad/s", "ω=12.5 rad/s"; very large or small
// values use an exponent; ω = 0 needs no unit.
func omegaText(w float64, unit string) string {
	a := math.Abs(w)
	var num string
	switch {
	case w == 0:
		return "ω=0"
	case a >= 1e4 || a < 1e-3:
		num = strconv.FormatFloat(w, 'g', 3, 64)
	default:
		decimals := max(0, 2-int(math.Floor(math.Log10(a))))
		num = strconv.FormatFloat(w, 'f', decimals, 64)
	}
	if unit == "" {
		return "ω=" + num
	}
	return "ω=" + num + " " + unit
}

// formatNumber writes a level as the caller would: the shortest form
// that reads back to the same value, e.g. "1.4", "2", "0.05".
func formatNumber(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// finitePieces splits pts at non-finite coordinates into runs of at
// least two points.
func finitePieces(pts []boundary.Point) [][]boundary.Point {
	var out [][]boundary.Point
	start := 0
	for i := 0; i <= len(pts); i++ {
		if i < len(pts) && finite(pts[i].X) && finite(pts[i].Y) {
			continue
		}
		if i-start >= 2 {
			out = append(out, pts[start:i])
		}
		start = i + 1
	}
	return out
}

// finite reports whether v is neither NaN nor infinite.
func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// canvasPath maps boundary points to canvas units, carrying ω along.
func canvasPath(pts []boundary.Point, trX, trY transform) []pathPoint {
	out := make([]pathPoint, len(pts))
	for i, p := range pts {
		out[i] = pathPoint{At: vg.Point{X: trX(p.X), Y: trY(p.Y)}, Value: p.Omega}
	}
	return out
}

// pathLength is the arc length of path in canvas units.
func pathLength(path []pathPoint) vg.Length {
	var l vg.Length
	for i := 1; i < len(path); i++ {
		l += dist(path[i-1].At, path[i].At)
	}
	return l
}

// rectPoints returns the closed outline of r.
func rectPoints(r vg.Rectangle) []vg.Point {
	return []vg.Point{
		r.Min, {X: r.Max.X, Y: r.Min.Y}, r.Max, {X: r.Min.X, Y: r.Max.Y}, r.Min,
	}
}
