package render

import (
	"fmt"
	"io"
	"math"
	"slices"

	"gonum.org/v1/plot"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Panels is a figure of several maps in a grid, read as one: each map is
// drawn as Write draws it, titled by its own Title; the region shades,
// edge styles and iso-line looks are the same in every panel, a shaded
// quantity has one colour scale over all panels, and one legend below
// the grid lists everything any panel shows.
type Panels struct {
	// Title names the plant; Notes are lines under it.
	Title string
	Notes []string
	// Maps are the panels in reading order, at most MaxPanels. Their
	// Notes, sizes and resolutions are not used.
	Maps []Figure
	// Columns is the number of panels in a row; 0 takes one for one
	// panel, two for two or four, three otherwise.
	Columns int
	// Width and Height are the image size; zero width means 17 cm, the
	// width of a printed page's text, and zero height one that gives the
	// panels about the shape of a map.
	Width, Height vg.Length
	// DPI is the resolution of PNG output; zero means DefaultDPI.
	DPI int
	// MarkLegend, if set, replaces the legend's text for the marks.
	MarkLegend string
}

// MaxPanels is the most panels a Panels figure holds.
const MaxPanels = 9

// Panel geometry.
const (
	DefaultPanelsWidth = 17 * vg.Centimeter
	panelTitleSize     = vg.Length(8.5)
	panelTitleGap      = vg.Length(3)
	panelSpacing       = vg.Length(10)
	panelAspect        = 0.78 // height of a panel's plot over its width
	legendRowGap       = vg.Length(14)
)

// columns returns the number of panels per row.
func (p *Panels) columns() int {
	switch {
	case p.Columns > 0:
		return min(p.Columns, len(p.Maps))
	case len(p.Maps) <= 1:
		return 1
	case len(p.Maps) == 2 || len(p.Maps) == 4:
		return 2
	}
	return 3
}

// check reports panels that cannot be drawn.
func (p *Panels) check() error {
	if len(p.Maps) == 0 || len(p.Maps) > MaxPanels {
		return fmt.Errorf("render: %d panels; a figure holds 1 to %d", len(p.Maps), MaxPanels)
	}
	for i := range p.Maps {
		if err := p.Maps[i].check(); err != nil {
			return fmt.Errorf("panel %d: %w", i+1, err)
		}
	}
	if p.Width < 0 || p.Height < 0 || p.DPI < 0 || p.Columns < 0 {
		return fmt.Errorf("render: negative size %v×%v, resolution %d or columns %d", p.Width, p.Height, p.DPI, p.Columns)
	}
	return nil
}

// WritePanels draws p and writes it to w in format "png", "svg" or
// "pdf", as Write does for one map.
func WritePanels(w io.Writer, format string, p Panels) error {
	if err := p.check(); err != nil {
		return err
	}
	maps := make([]Figure, len(p.Maps))
	for i, f := range p.Maps {
		maps[i] = f.withDefaults()
	}
	p.Maps = maps
	if p.Width == 0 {
		p.Width = DefaultPanelsWidth
	}
	if p.DPI == 0 {
		p.DPI = DefaultDPI
	}
	scale := sharedScale(p.Maps)
	rc := countColours(scale != nil)
	sections := mergeSections(p.Maps, rc, scale)
	for i := range sections {
		if sections[i].heading == marksHeading && p.MarkLegend != "" {
			for k := range sections[i].entries {
				sections[i].entries[k].text = p.MarkLegend
			}
		}
	}
	if p.Height == 0 {
		p.Height = p.naturalHeight(sections, scale)
	}
	cv, fillDPI, err := newCanvas(format, p.Width, p.Height, p.DPI)
	if err != nil {
		return err
	}
	p.draw(draw.New(cv), rc, scale, sections, fillDPI)
	_, err = cv.WriteTo(w)
	return err
}

// sharedScale returns one shading scale over the shaded fields of every
// panel, nil when none is shaded.
func sharedScale(maps []Figure) *shadeScale {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, f := range maps {
		if f.Shade == nil {
			continue
		}
		if a, b, ok := f.Shade.Range(); ok {
			lo, hi = min(lo, a), max(hi, b)
		}
	}
	if !(lo <= hi) {
		return nil
	}
	return newShadeScale(lo, hi)
}

// scaleName is the name of the first shaded field.
func scaleName(maps []Figure) string {
	for _, f := range maps {
		if f.Shade != nil {
			return f.Shade.Name
		}
	}
	return ""
}

// mergeSections returns the legend sections of all panels, each entry
// once, in the order the panels first show it, the sections in a map's
// order; an iso-line set lists the
// levels drawn in any panel.
func mergeSections(maps []Figure, rc regionColours, scale *shadeScale) []legendSection {
	var out []legendSection
	index := map[string]int{}
	seen := map[string]bool{}
	for i := range maps {
		for _, sec := range legendSections(&maps[i], rc, scale) {
			if sec.heading == isoHeading {
				sec = mergedIso(maps)
			}
			k, ok := index[sec.heading]
			if !ok {
				k = len(out)
				index[sec.heading] = k
				out = append(out, legendSection{heading: sec.heading})
			}
			for _, e := range sec.entries {
				if key := sec.heading + "\x00" + e.text; !seen[key] {
					seen[key] = true
					out[k].entries = append(out[k].entries, e)
				}
			}
		}
	}
	// The sections keep the order a map's legend gives them.
	rank := map[string]int{"Region": 0, "Edge": 1, isoHeading: 2, marksHeading: 3}
	slices.SortStableFunc(out, func(a, b legendSection) int { return rank[a.heading] - rank[b.heading] })
	return out
}

// mergedIso returns the iso-line section for all panels: one entry per
// set (by look and name) with the levels any panel draws.
func mergedIso(maps []Figure) legendSection {
	type key struct {
		look int
		name string
	}
	var order []key
	levels := map[key][]float64{}
	for _, f := range maps {
		for _, cs := range f.Contours {
			k := key{cs.Look, cs.Name}
			if _, ok := levels[k]; !ok {
				order = append(order, k)
				levels[k] = nil
			}
			for _, v := range drawnLevels(cs).Levels {
				if !slices.Contains(levels[k], v) {
					levels[k] = append(levels[k], v)
				}
			}
		}
	}
	sec := legendSection{heading: isoHeading}
	for _, k := range order {
		if lv := levels[k]; len(lv) > 0 {
			slices.Sort(lv)
			sec.entries = append(sec.entries, legendEntry{contourText(ContourSet{Name: k.name, Levels: lv}), []plot.Thumbnailer{lineThumb{contourStyle(k.look)}}})
		}
	}
	return sec
}

// legendRows lays the sections out left to right in rows no wider than
// width; it returns the rows and the height they take.
func legendRows(sections []legendSection, width vg.Length) ([][]legendSection, vg.Length) {
	var rows [][]legendSection
	var used, rowH, total vg.Length
	for _, sec := range sections {
		w, h := sectionSize(sec)
		if len(rows) == 0 || used+w > width {
			if len(rows) > 0 {
				total += rowH + sectionGap
			}
			rows = append(rows, nil)
			used, rowH = 0, 0
		}
		rows[len(rows)-1] = append(rows[len(rows)-1], sec)
		used += w + legendRowGap
		rowH = max(rowH, h)
	}
	return rows, total + rowH
}

// headerHeight returns the height the title and notes take at width.
func (p *Panels) headerHeight(width vg.Length) vg.Length {
	f := Figure{Title: p.Title, Notes: p.Notes}
	return headerUsed(&f, width)
}

// naturalHeight returns the height that gives each panel's plot the
// shape panelAspect at the figure's width.
func (p *Panels) naturalHeight(sections []legendSection, scale *shadeScale) vg.Length {
	inner := p.Width - 2*margin
	gridW := inner - p.scaleWidth(scale)
	cols := p.columns()
	rows := (len(p.Maps) + cols - 1) / cols
	cellW := (gridW - vg.Length(cols-1)*panelSpacing) / vg.Length(cols)
	title := textStyle(panelTitleSize, true, inkColour)
	cellH := vg.Length(panelAspect)*cellW + title.Height("M") + panelTitleGap
	_, legendH := legendRows(sections, inner)
	return 2*margin + p.headerHeight(inner) + vg.Length(rows)*cellH + vg.Length(rows-1)*panelSpacing + panelSpacing + legendH
}

// scaleWidth is the width of the shared scale column, 0 without one.
func (p *Panels) scaleWidth(scale *shadeScale) vg.Length {
	if scale == nil {
		return 0
	}
	return scaleColumnWidth(scale, scaleName(p.Maps))
}

// draw draws the figure onto c.
func (p *Panels) draw(c draw.Canvas, rc regionColours, scale *shadeScale, sections []legendSection, fillDPI int) {
	inner := draw.Crop(c, margin, -margin, margin, -margin)
	f := Figure{Title: p.Title, Notes: p.Notes}
	used := drawHeader(inner, &f)
	body := draw.Crop(inner, 0, 0, 0, -used)
	rows, legendH := legendRows(sections, body.Size().X)
	gridC := draw.Crop(body, 0, -p.scaleWidth(scale), legendH+panelSpacing, 0)

	cols := p.columns()
	nrows := (len(p.Maps) + cols - 1) / cols
	cellW := (gridC.Size().X - vg.Length(cols-1)*panelSpacing) / vg.Length(cols)
	cellH := (gridC.Size().Y - vg.Length(nrows-1)*panelSpacing) / vg.Length(nrows)
	title := textStyle(panelTitleSize, true, inkColour)
	title.YAlign = draw.YTop
	lineH := title.Height("M") * 1.1
	// Every panel of a row leaves room for the longest title of the row,
	// so that the plots of a row line up.
	titleLines := make([]int, nrows)
	for i := range p.Maps {
		titleLines[i/cols] = max(titleLines[i/cols], len(wrap(title, p.Maps[i].Title, cellW)))
	}
	dataTop, dataBottom := vg.Length(math.Inf(-1)), vg.Length(math.Inf(1))
	for i := range p.Maps {
		r, k := i/cols, i%cols
		x0 := gridC.Min.X + vg.Length(k)*(cellW+panelSpacing)
		y1 := gridC.Max.Y - vg.Length(r)*(cellH+panelSpacing)
		cell := draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{Min: vg.Point{X: x0, Y: y1 - cellH}, Max: vg.Point{X: x0 + cellW, Y: y1}}}
		for n, line := range wrap(title, p.Maps[i].Title, cellW) {
			cell.FillText(title, vg.Point{X: x0, Y: y1 - vg.Length(n)*lineH}, line)
		}
		plotC := draw.Crop(cell, 0, 0, 0, -(vg.Length(titleLines[r])*lineH + panelTitleGap))
		ps := scale
		if p.Maps[i].Shade == nil {
			// A panel without a shaded field keeps its flat stable fill.
			ps = nil
		}
		data := drawMap(plotC, &p.Maps[i], rc, ps, fillDPI)
		dataTop, dataBottom = max(dataTop, data.Max.Y), min(dataBottom, data.Min.Y)
	}
	if scale != nil {
		drawScale(c, scale, scaleName(p.Maps), vg.Rectangle{
			Min: vg.Point{X: gridC.Max.X, Y: dataBottom},
			Max: vg.Point{X: gridC.Max.X + p.scaleWidth(scale), Y: dataTop},
		})
	}
	drawLegendRows(c, rows, vg.Point{X: body.Min.X, Y: body.Min.Y + legendH})
}

// drawLegendRows draws the rows of legendRows from the top-left corner
// at.
func drawLegendRows(c draw.Canvas, rows [][]legendSection, at vg.Point) {
	y := at.Y
	for _, row := range rows {
		x := at.X
		var rowH vg.Length
		for _, sec := range row {
			w, h := sectionSize(sec)
			drawSection(draw.Canvas{Canvas: c.Canvas, Rectangle: vg.Rectangle{Min: vg.Point{X: x, Y: y - h}, Max: vg.Point{X: x + w, Y: y}}}, sec)
			x += w + legendRowGap
			rowH = max(rowH, h)
		}
		y -= rowH + sectionGap
	}
}
