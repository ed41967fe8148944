package render

import (
	"fmt"
	"image/color"
	"io"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// Responses is a figure of closed-loop step responses on shared axes:
// the plant output after a unit setpoint step above, after a unit load
// step at the plant input below, one line per design, on one time axis.
type Responses struct {
	// Title and Notes head the figure.
	Title string
	Notes []string
	// Series are the designs, at most len(seriesLooks) of them.
	Series []Series
	// TimeUnit labels the time axis, such as "s".
	TimeUnit string
	// Width and Height are the image size; zero means 17 cm by 13 cm.
	Width, Height vg.Length
	// DPI is the resolution of PNG output; zero means DefaultDPI.
	DPI int
}

// Series is one design's responses: the plant output y at the times
// Time after the setpoint step (Setpoint) and after the load step (Load).
type Series struct {
	Label          string
	Time           []float64
	Setpoint, Load []float64
}

// seriesLooks tell the designs apart twice over, by dash pattern (for
// greyscale print) and by hue: dark blue solid, orange long dash, green
// dash and dot, raspberry short dash, grey-violet fine dots, brown two
// dots and a dash, teal dash, olive dots, black dash and two dots. The
// hues are spread round the CIE-LCh circle at lightness 0.45 or less, so
// every line stands clear of the white ground.
var seriesLooks = []struct {
	hue, lightness float64
	dashes         []vg.Length
}{
	{265, 0.35, nil},
	{55, 0.55, []vg.Length{8, 3}},
	{140, 0.45, []vg.Length{7, 2, 1.5, 2}},
	{5, 0.42, []vg.Length{3.5, 2}},
	{300, 0.40, []vg.Length{1.2, 1.6}},
	{35, 0.32, []vg.Length{5, 1.5, 1.2, 1.5, 1.2, 1.5}},
	{200, 0.42, []vg.Length{5, 2.5}},
	{100, 0.45, []vg.Length{1.2, 2.5}},
	{0, 0.10, []vg.Length{6, 1.5, 1.2, 1.5, 1.2, 1.5}},
}

// MaxSeries is the most designs a Responses figure draws: one per look.
const MaxSeries = 9

// seriesStyle returns the stroke of the i-th design.
func seriesStyle(i int) draw.LineStyle {
	l := seriesLooks[i]
	return draw.LineStyle{Color: hcl(l.hue, 0.6, l.lightness), Width: 1.4, Dashes: l.dashes}
}

func (r *Responses) check() error {
	if len(r.Series) == 0 || len(r.Series) > MaxSeries {
		return fmt.Errorf("render: %d responses; a figure draws 1 to %d", len(r.Series), MaxSeries)
	}
	for i, s := range r.Series {
		if len(s.Time) < 2 || len(s.Setpoint) != len(s.Time) || len(s.Load) != len(s.Time) {
			return fmt.Errorf("render: response %d (%q) has %d times, %d setpoint and %d load values", i+1, s.Label, len(s.Time), len(s.Setpoint), len(s.Load))
		}
	}
	if r.Width < 0 || r.Height < 0 || r.DPI < 0 {
		return fmt.Errorf("render: negative size %v×%v or resolution %d", r.Width, r.Height, r.DPI)
	}
	return nil
}

// WriteResponses draws r and writes it to w in format "png", "svg" or
// "pdf".
func WriteResponses(w io.Writer, format string, r Responses) error {
	if err := r.check(); err != nil {
		return err
	}
	if r.Width == 0 {
		r.Width = DefaultPanelsWidth
	}
	if r.Height == 0 {
		r.Height = 13 * vg.Centimeter
	}
	if r.DPI == 0 {
		r.DPI = DefaultDPI
	}
	cv, _, err := newCanvas(format, r.Width, r.Height, r.DPI)
	if err != nil {
		return err
	}
	r.draw(draw.New(cv))
	_, err = cv.WriteTo(w)
	return err
}

// draw lays out the header, the two plots and the legend below them.
func (r *Responses) draw(c draw.Canvas) {
	inner := draw.Crop(c, margin, -margin, margin, -margin)
	used := drawHeader(inner, &Figure{Title: r.Title, Notes: r.Notes})
	body := draw.Crop(inner, 0, 0, 0, -used)
	sec := legendSection{heading: "Design"}
	for i, s := range r.Series {
		sec.entries = append(sec.entries, legendEntry{s.Label, []plot.Thumbnailer{lineThumb{seriesStyle(i)}}})
	}
	rows, legendH := legendRows(splitSection(sec, body.Size().X), body.Size().X)
	plots := draw.Crop(body, 0, 0, legendH+panelSpacing, 0)
	h := (plots.Size().Y - panelSpacing) / 2
	tmax := 0.0
	for _, s := range r.Series {
		tmax = math.Max(tmax, s.Time[len(s.Time)-1])
	}
	unit := r.TimeUnit
	if unit == "" {
		unit = "s"
	}
	top := draw.Crop(plots, 0, 0, h+panelSpacing, 0)
	bottom := draw.Crop(plots, 0, 0, 0, -(h + panelSpacing))
	for _, part := range []struct {
		c            draw.Canvas
		title, label string
		values       func(Series) []float64
		level        float64
	}{
		{top, "Unit setpoint step", "", func(s Series) []float64 { return s.Setpoint }, 1},
		{bottom, "Unit load step at the plant input", "time t (" + unit + ")", func(s Series) []float64 { return s.Load }, 0},
	} {
		ts := textStyle(panelTitleSize, true, inkColour)
		ts.YAlign = draw.YTop
		part.c.FillText(ts, vg.Point{X: part.c.Min.X, Y: part.c.Max.Y}, part.title)
		area := draw.Crop(part.c, 0, 0, 0, -(ts.Height(part.title) + panelTitleGap))
		r.plot(part.label, tmax, part.values, part.level).Draw(area)
	}
	drawLegendRows(c, rows, vg.Point{X: body.Min.X, Y: body.Min.Y + legendH})
}

// splitSection splits a long legend section into columns that each fit
// a third of width, so the legend band stays short.
func splitSection(sec legendSection, width vg.Length) []legendSection {
	w, _ := sectionSize(sec)
	if w <= width/3 || len(sec.entries) <= 3 {
		return []legendSection{sec}
	}
	var out []legendSection
	for k := 0; k < len(sec.entries); k += 3 {
		part := legendSection{entries: sec.entries[k:min(k+3, len(sec.entries))]}
		if k == 0 {
			part.heading = sec.heading
		} else {
			part.heading = " "
		}
		out = append(out, part)
	}
	return out
}

// plot builds one of the two plots: the output each series gives,
// against time, with a thin reference line at level.
func (r *Responses) plot(xlabel string, tmax float64, values func(Series) []float64, level float64) *plot.Plot {
	p := plot.New()
	styleAxis(&p.X, xlabel)
	styleAxis(&p.Y, "output y")
	p.X.Min, p.X.Max = 0, tmax
	lo, hi := math.Min(level, 0), math.Max(level, 0)
	for _, s := range r.Series {
		for _, v := range values(s) {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	pad := 0.05 * math.Max(hi-lo, 1e-12)
	p.Y.Min, p.Y.Max = lo-pad, hi+pad
	ref := plotter.XYs{{X: 0, Y: level}, {X: tmax, Y: level}}
	p.Add(plotOnly{&plotter.Line{XYs: ref, LineStyle: draw.LineStyle{Color: color.Gray{Y: 0x90}, Width: 0.6}}})
	for i, s := range r.Series {
		p.Add(plotOnly{&plotter.Line{XYs: thinned(s.Time, values(s), maxLinePoints), LineStyle: seriesStyle(i)}})
	}
	p.Add(frame{})
	return p
}

// maxLinePoints bounds the points drawn of one response: a few per
// pixel of a page-wide figure (about 1300 pixels at 200 dpi), each run
// of four points standing for one pixel column or so.
const maxLinePoints = 1600

// thinned returns the points (t[k], v[k]), at most about n of them: a
// longer series is cut into n/4 runs of samples, each drawn by its first
// and last sample and its lowest and highest in the order they occur, so
// that no peak is lost at the resolution of the figure.
func thinned(t, v []float64, n int) plotter.XYs {
	if len(t) <= n {
		xys := make(plotter.XYs, len(t))
		for k := range t {
			xys[k].X, xys[k].Y = t[k], v[k]
		}
		return xys
	}
	runs := n / 4
	xys := make(plotter.XYs, 0, n)
	for r := range runs {
		a, b := r*len(t)/runs, (r+1)*len(t)/runs
		lo, hi := a, a
		for k := a; k < b; k++ {
			if v[k] < v[lo] {
				lo = k
			}
			if v[k] > v[hi] {
				hi = k
			}
		}
		for _, k := range []int{a, min(lo, hi), max(lo, hi), b - 1} {
			if len(xys) == 0 || xys[len(xys)-1].X != t[k] {
				xys = append(xys, plotter.XY{X: t[k], Y: v[k]})
			}
		}
	}
	return xys
}

// frame strokes the border of a plot's data area.
type frame struct{}

// Plot draws the frame.
func (frame) Plot(c draw.Canvas, _ *plot.Plot) {
	c.StrokeLines(draw.LineStyle{Color: inkColour, Width: 0.8}, rectPoints(c.Rectangle))
}
