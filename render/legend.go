package render

import (
	"image/color"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"gainscape/regions/grid"
	"gainscape/regions/stability"
)

// The legend sits in a column to the right of the plot, so it never
// covers data. It lists only what the figure shows, in sections: the
// region shades, the kinds of edge, the iso-line sets and the design
// points; below them comes the shading scale when there is one.

// legendSection is a heading and its entries.
type legendSection struct {
	heading string
	entries []legendEntry
}

// legendEntry is one line of the legend: a thumbnail and its text.
type legendEntry struct {
	text   string
	thumbs []plot.Thumbnailer
}

// Legend spacing.
const (
	thumbWidth   = vg.Length(20)
	entryPadding = vg.Length(2.5)
	headingGap   = vg.Length(3)
	sectionGap   = vg.Length(9)
)

// legendSections lists what the figure shows.
func legendSections(f *Figure, rc regionColours, scale *shadeScale) []legendSection {
	var out []legendSection

	// present[c+1] for count c: Undecided (−1) first.
	var present [distinctCounts + 2]bool
	maxCount := 0
	for k, c := range f.Map.RHP {
		if f.Map.ClassAt(k) != stability.ClassMarginal {
			present[min(int(c), distinctCounts)+1] = true
		}
		maxCount = max(maxCount, int(c))
	}
	regions := legendSection{heading: "Region"}
	if present[1] {
		var th plot.Thumbnailer = swatch{fill: rc.stable}
		if scale != nil {
			th = gradientSwatch{scale}
		}
		regions.entries = append(regions.entries, legendEntry{"stable", []plot.Thumbnailer{th}})
	}
	for k := 1; k <= distinctCounts; k++ {
		if !present[k+1] {
			continue
		}
		regions.entries = append(regions.entries, legendEntry{
			countText(k, k == distinctCounts && maxCount > distinctCounts, f.Sample > 0),
			[]plot.Thumbnailer{swatch{fill: rc.count(k)}},
		})
	}
	if hasMarginal(f.Map) {
		text := "marginal (root on axis)"
		if f.Sample > 0 {
			text = "marginal (root on circle)"
		}
		regions.entries = append(regions.entries, legendEntry{text, []plot.Thumbnailer{swatch{fill: rc.marginal}}})
	}
	if present[grid.Undecided+1] {
		regions.entries = append(regions.entries, legendEntry{"undecided", []plot.Thumbnailer{swatch{fill: rc.undecided, hatched: true}}})
	}
	out = append(out, regions)

	kinds := map[stability.Kind]bool{}
	for _, cv := range f.Curves {
		if len(finitePieces(cv.Points)) > 0 {
			kinds[cv.Kind] = true
		}
	}
	edges := legendSection{heading: "Edge"}
	for _, k := range kindOrder {
		if kinds[k] {
			edges.entries = append(edges.entries, legendEntry{kindName(k, f.Sample > 0), []plot.Thumbnailer{lineThumb{haloStyle(), curveStyle(k)}}})
		}
	}
	if len(f.LaterBranches) > 0 {
		edges.entries = append(edges.entries, legendEntry{"on a later branch", []plot.Thumbnailer{branchThumb{lineThumb{haloStyle(), curveStyle(stability.Complex)}}}})
	}
	if len(edges.entries) > 0 {
		out = append(out, edges)
	}
	if cmp := compareSection(f); len(cmp.entries) > 0 {
		out = append(out, cmp)
	}

	iso := legendSection{heading: isoHeading}
	for _, cs := range f.Contours {
		if drawn := drawnLevels(cs); len(drawn.Levels) > 0 {
			iso.entries = append(iso.entries, legendEntry{contourText(drawn), []plot.Thumbnailer{lineThumb{contourStyle(cs.Look)}}})
		}
	}
	if len(iso.entries) > 0 {
		out = append(out, iso)
	}

	if len(f.Marks) > 0 {
		out = append(out, legendSection{heading: marksHeading, entries: []legendEntry{{"design point", []plot.Thumbnailer{markThumb{}}}}})
	}
	return out
}

// isoHeading heads the legend's section of iso-lines.
const isoHeading = "Iso-lines"

// marksHeading heads the legend's section of design points.
const marksHeading = "Marks"

// countText is the legend text for k unstable roots: in the right half
// plane, or outside the unit circle for a sampled map.
func countText(k int, orMore, sampled bool) string {
	where := " in RHP"
	if sampled {
		where = " outside circle"
	}
	switch {
	case orMore:
		return strconv.Itoa(k) + " or more roots" + where
	case k == 1:
		return "1 root" + where
	}
	return strconv.Itoa(k) + " roots" + where
}

// drawnLevels returns cs with only the levels that have a line of two
// points or more: the legend lists what the figure shows.
func drawnLevels(cs ContourSet) ContourSet {
	out := cs
	out.Levels, out.Lines = nil, nil
	for k, level := range cs.Levels {
		for _, l := range cs.Lines[k] {
			if len(l) >= 2 {
				out.Levels = append(out.Levels, level)
				out.Lines = append(out.Lines, cs.Lines[k])
				break
			}
		}
	}
	return out
}

// contourText names a contour set and, when there are few, its levels.
func contourText(cs ContourSet) string {
	name := cs.Name
	if name == "" {
		name = "level"
	}
	if len(cs.Levels) == 0 || len(cs.Levels) > 4 {
		return name
	}
	vals := make([]string, len(cs.Levels))
	for i, v := range cs.Levels {
		vals[i] = formatNumber(v)
	}
	return name + " = " + strings.Join(vals, ", ")
}

// newLegend returns an empty gonum legend in the figure's style.
func newLegend() plot.Legend {
	l := plot.NewLegend()
	l.TextStyle = textStyle(legendSize, false, inkColour)
	l.Top, l.Left = true, true
	l.ThumbnailWidth = thumbWidth
	l.Padding = entryPadding
	return l
}

// sectionSize returns the width and height a section needs.
func sectionSize(s legendSection) (w, h vg.Length) {
	hs := textStyle(legendSize, true, inkColour)
	l := newLegend()
	for _, e := range s.entries {
		l.Add(e.text, e.thumbs...)
	}
	r := l.Rectangle(draw.Canvas{})
	w = max(hs.Width(s.heading), r.Size().X)
	return w, hs.Height(s.heading) + headingGap + r.Size().Y
}

// drawSection draws s from the top-left corner of c and returns the
// height used.
func drawSection(c draw.Canvas, s legendSection) vg.Length {
	hs := textStyle(legendSize, true, inkColour)
	hs.YAlign = draw.YTop
	c.FillText(hs, vg.Point{X: c.Min.X, Y: c.Max.Y}, s.heading)
	used := hs.Height(s.heading) + headingGap
	l := newLegend()
	for _, e := range s.entries {
		l.Add(e.text, e.thumbs...)
	}
	l.Draw(draw.Crop(c, 0, 0, 0, -used))
	_, h := sectionSize(s)
	return h
}

// swatch is a legend thumbnail filled with one region colour, optionally
// hatched like undecided cells.
type swatch struct {
	fill    color.Color
	hatched bool
}

// Thumbnail draws the swatch.
func (s swatch) Thumbnail(c *draw.Canvas) {
	pts := rectPoints(c.Rectangle)
	c.FillPolygon(s.fill, pts)
	if s.hatched {
		hatchRect(*c, c.Rectangle)
	}
	c.StrokeLines(draw.LineStyle{Color: color.Gray{Y: 0x60}, Width: 0.4}, pts)
}

// gradientSwatch is a legend thumbnail showing the shading scale.
type gradientSwatch struct{ s *shadeScale }

// Thumbnail draws the scale as vertical bands, low values to the left.
func (g gradientSwatch) Thumbnail(c *draw.Canvas) {
	const bands = 8
	w := c.Size().X / bands
	for i := 0; i < bands; i++ {
		r := vg.Rectangle{
			Min: vg.Point{X: c.Min.X + vg.Length(i)*w, Y: c.Min.Y},
			Max: vg.Point{X: c.Min.X + vg.Length(i+1)*w, Y: c.Max.Y},
		}
		c.FillPolygon(g.s.colourAt((float64(i)+0.5)/bands), rectPoints(r))
	}
	c.StrokeLines(draw.LineStyle{Color: color.Gray{Y: 0x60}, Width: 0.4}, rectPoints(c.Rectangle))
}

// lineThumb is a legend thumbnail of one or more stacked strokes.
type lineThumb []draw.LineStyle

// Thumbnail draws the strokes across the middle of the thumbnail.
func (l lineThumb) Thumbnail(c *draw.Canvas) {
	y := c.Center().Y
	for _, s := range l {
		c.StrokeLine2(s, c.Min.X, y, c.Max.X, y)
	}
}

// markThumb is the legend thumbnail of a design point.
type markThumb struct{}

// Thumbnail draws the mark symbol in the middle of the thumbnail.
func (markThumb) Thumbnail(c *draw.Canvas) { drawMark(*c, c.Center()) }

// hasMarginal reports whether any node of m is marginal.
func hasMarginal(m *grid.Map) bool {
	for k := range m.RHP {
		if m.ClassAt(k) == stability.ClassMarginal {
			return true
		}
	}
	return false
}
