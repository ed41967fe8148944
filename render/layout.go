package render

import (
	"image/color"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gainscape/regions/isoline"
	"gainscape/regions/stability"
)

// The page is laid out as a header (title and notes) across the top, the
// plot below it on the left, and the legend column on the right, its
// top level with the top of the data area. A shaded figure has its
// scale as a bar between plot and legend, as tall as the data area, so
// the scale never competes with the legend for height.

// Page spacing.
const (
	margin     = vg.Length(9)
	panelGap   = vg.Length(12)
	headerGap  = vg.Length(8)
	minPanel   = 3 * vg.Centimeter
	panelShare = 0.36 // largest share of the width the legend may take
)

// plotOnly hides every method of a plotter except Plot, so line plotters
// neither widen the axes nor pad the data area: the axes are set to the
// map's cells exactly.
type plotOnly struct{ plot.Plotter }

// drawFigure draws f, already checked and with defaults, onto c. If
// fillDPI is positive the cell fills are drawn as one image of that
// resolution, as cellFill describes; otherwise as vector shapes.
func drawFigure(c draw.Canvas, f *Figure, fillDPI int) {
	var scale *shadeScale
	if f.Shade != nil {
		if lo, hi, ok := f.Shade.Range(); ok {
			scale = newShadeScale(lo, hi)
		}
	}
	rc := countColours(scale != nil)

	inner := draw.Crop(c, margin, -margin, margin, -margin)
	used := drawHeader(inner, f)
	body := draw.Crop(inner, 0, 0, 0, -used)

	sections := legendSections(f, rc, scale)
	panelW := vg.Length(0)
	for _, sec := range sections {
		w, _ := sectionSize(sec)
		panelW = max(panelW, w)
	}
	panelW = min(max(panelW, minPanel), vg.Length(panelShare)*body.Size().X)
	var scaleW vg.Length
	if scale != nil {
		scaleW = scaleColumnWidth(scale, f.Shade.Name)
	}

	plotC := draw.Crop(body, 0, -(panelW + panelGap + scaleW), 0, 0)
	data := drawMap(plotC, f, rc, scale, fillDPI)
	if scale != nil {
		drawScale(c, scale, f.Shade.Name, vg.Rectangle{
			Min: vg.Point{X: plotC.Max.X, Y: data.Min.Y},
			Max: vg.Point{X: plotC.Max.X + scaleW, Y: data.Max.Y},
		})
	}

	panel := draw.Crop(body, body.Size().X-panelW, 0, 0, data.Max.Y-body.Max.Y)
	for _, sec := range sections {
		h := drawSection(panel, sec)
		panel = draw.Crop(panel, 0, 0, 0, -(h + sectionGap))
	}
}

// drawMap draws the map of f, its axes included, into c, and returns
// the canvas of its data area. The legend, the shading scale and the
// header are the caller's: a figure of one map sets them beside it, a
// figure of several shares them.
func drawMap(c draw.Canvas, f *Figure, rc regionColours, scale *shadeScale, fillDPI int) draw.Canvas {
	p, _ := buildPlot(f, rc, scale, fillDPI)
	p.Draw(c)
	return p.DataCanvas(c)
}

// drawHeader sets the title and notes, wrapped to the width of c, from
// its top edge and returns the height used.
func drawHeader(c draw.Canvas, f *Figure) vg.Length { return layHeader(c, f) }

// headerUsed returns the height drawHeader would use at the given width.
func headerUsed(f *Figure, width vg.Length) vg.Length {
	return layHeader(draw.Canvas{Rectangle: vg.Rectangle{Max: vg.Point{X: width}}}, f)
}

// layHeader lays the header out in c, drawing it unless c has no
// canvas, and returns the height used.
func layHeader(c draw.Canvas, f *Figure) vg.Length {
	y := c.Max.Y
	put := func(s text.Style, txt string) {
		s.YAlign = text.YTop
		for _, line := range wrap(s, txt, c.Size().X) {
			if c.Canvas != nil {
				c.FillText(s, vg.Point{X: c.Min.X, Y: y}, line)
			}
			y -= s.Height(line) * 1.1
		}
	}
	if f.Title != "" {
		put(textStyle(titleSize, true, inkColour), f.Title)
		y -= 2
	}
	for _, n := range f.Notes {
		put(textStyle(noteSize, false, noteColour), n)
	}
	if y == c.Max.Y {
		return 0
	}
	return c.Max.Y - y + headerGap
}

// wrap breaks txt at spaces into lines no wider than width where
// possible; a single word wider than width gets a line of its own.
func wrap(s text.Style, txt string, width vg.Length) []string {
	var lines []string
	line := ""
	for _, w := range strings.Fields(txt) {
		try := w
		if line != "" {
			try = line + " " + w
		}
		if line != "" && s.Width(try) > width {
			lines = append(lines, line)
			line = w
			continue
		}
		line = try
	}
	if line != "" {
		lines = append(lines, line)
	}
	return lines
}

// styleAxis sets an axis's fonts and strokes.
func styleAxis(a *plot.Axis, label string) {
	a.Label.Text = label
	a.Label.TextStyle.Font = font.From(sans, axisSize)
	a.Label.TextStyle.Color = inkColour
	a.Label.Padding = 4
	a.Tick.Label.Font = font.From(sans, tickSize)
	a.Tick.Label.Color = inkColour
	a.Tick.Length = 4
	a.Tick.LineStyle.Width = 0.6
	// The annotations plotter frames the data area; an axis line as
	// well would double the left and bottom edges.
	a.LineStyle.Width = 0
	a.Padding = 0
	a.Tick.Marker = readableTicks{}
}

// buildPlot assembles the map: fills, hatching, iso-lines, boundary
// curves and, last, the labels and marks, which it also returns. FillDPI
// is as for drawFigure.
func buildPlot(f *Figure, rc regionColours, scale *shadeScale, fillDPI int) (*plot.Plot, annotations) {
	p := plot.New()
	styleAxis(&p.X, f.XLabel)
	styleAxis(&p.Y, f.YLabel)

	m := f.Map
	fills := cellFill{dpi: fillDPI, layers: []cellLayer{
		{g: m, colour: func(c, r int) color.Color {
			if m.Class(c, r) == stability.ClassMarginal {
				return rc.marginal
			}
			return rc.count(m.Count(c, r))
		}, key: func(c, r int) int {
			// The count, or one key for every marginal node.
			if k := r*m.XAxis.N + c; m.RHP[k] != 0 || m.Axis[k] == 0 {
				return int(m.RHP[k])
			}
			return math.MinInt
		}},
	}}
	xe, ye := cellEdges(m.XAxis.N, m.X), cellEdges(m.YAxis.N, m.Y)
	p.X.Min, p.X.Max = xe[0], xe[len(xe)-1]
	p.Y.Min, p.Y.Max = ye[0], ye[len(ye)-1]

	if scale != nil {
		shade := stableOnly{f.Shade, m}
		fills.layers = append(fills.layers, cellLayer{g: shade, colour: func(c, r int) color.Color {
			v := shade.Z(c, r)
			if math.IsNaN(v) {
				return nil
			}
			return scale.colourAt((v - scale.Min()) / (scale.Max() - scale.Min()))
		}})
	}
	p.Add(fills)
	if hasUndecided(m) {
		p.Add(undecidedHatch{m})
	}
	ann := annotations{fig: f}
	for _, cs := range f.Contours {
		set := isoSet{name: cs.Name}
		for li, level := range cs.Levels {
			traced := cs.Lines[li]
			lines := make([]plotter.XYs, len(traced))
			for k, l := range traced {
				lines[k] = lineXYs(l)
				p.Add(plotOnly{&plotter.Line{XYs: lines[k], LineStyle: contourStyle(cs.Look)}})
			}
			set.levels = append(set.levels, isoLevel{level, lines})
		}
		ann.iso = append(ann.iso, set)
	}
	var halos, lines []plot.Plotter
	for _, cv := range f.Curves {
		for _, piece := range finitePieces(cv.Points) {
			xys := make(plotter.XYs, len(piece))
			for i, pt := range piece {
				xys[i].X, xys[i].Y = pt.X, pt.Y
			}
			halos = append(halos, plotOnly{&plotter.Line{XYs: xys, LineStyle: haloStyle()}})
			lines = append(lines, plotOnly{&plotter.Line{XYs: xys, LineStyle: curveStyle(cv.Kind)}})
		}
	}
	p.Add(compareLines(f)...)
	p.Add(halos...)
	p.Add(lines...)
	p.Add(ann)
	return p, ann
}

// lineXYs converts an iso-line to the point list gonum/plot draws.
func lineXYs(l isoline.Line) plotter.XYs {
	xys := make(plotter.XYs, len(l))
	for k, p := range l {
		xys[k].X, xys[k].Y = p[0], p[1]
	}
	return xys
}
