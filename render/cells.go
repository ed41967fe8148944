package render

import (
	"image"
	"image/color"
	imagedraw "image/draw"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// cellFill paints the cells around the nodes of one or more grids, each
// cell in a colour chosen per node; later layers paint over earlier ones
// and a nil colour leaves the cell unpainted. Cells reach halfway to the
// neighbouring nodes, as in plotter.HeatMap.
//
// It exists beside plotter.HeatMap because that plotter fills one
// rectangle per node: anti-aliased raster output then shows faint seams
// between cells of one colour, and SVG output grows with the number of
// nodes. Here each horizontal run of one colour is a single rectangle,
// and each rectangle reaches seamOverlap into the row above, which is
// painted later and covers the overlap.
//
// With dpi set, every layer is painted instead into one image of that
// resolution covering the data area, drawn with the canvas's DrawImage.
// A vector file then holds one embedded picture of the fills rather than
// a rectangle per run, which for a shaded map is one per cell; the
// edges, iso-lines and text drawn over it stay vector shapes.
type cellFill struct {
	layers []cellLayer
	dpi    int
}

// cellLayer is one grid of cells and the colour of each. When key is
// set, cells with equal keys have equal colours, and runs are found by
// comparing keys, the colour being asked for once per run.
type cellLayer struct {
	g      plotter.GridXYZ
	colour func(c, r int) color.Color
	key    func(c, r int) int
}

// seamOverlap is about one pixel at the default resolution.
const seamOverlap = vg.Length(0.4)

// cellEdges returns the boundaries between the cells of n nodes at
// positions at(0) … at(n-1): n+1 values.
func cellEdges(n int, at func(int) float64) []float64 {
	e := make([]float64, n+1)
	for i := 1; i < n; i++ {
		e[i] = (at(i-1) + at(i)) / 2
	}
	e[0] = at(0) - (e[1] - at(0))
	e[n] = at(n-1) + (at(n-1) - e[n-1])
	return e
}

// cellRun is a horizontal run of cells of one colour in canvas units;
// last reports whether the run ends at the grid's right edge and top
// reports whether it lies in the grid's top row.
type cellRun struct {
	rect      vg.Rectangle
	colour    color.Color
	last, top bool
}

// runs calls paint for every run of one colour of l, bottom row first.
func (l cellLayer) runs(trX, trY transform, paint func(cellRun)) {
	nc, nr := l.g.Dims()
	if nc < 2 || nr < 2 {
		return
	}
	xe, ye := cellEdges(nc, l.g.X), cellEdges(nr, l.g.Y)
	for r := 0; r < nr; r++ {
		for i := 0; i < nc; {
			col := l.colour(i, r)
			start := i
			if l.key != nil {
				for k := l.key(i, r); i < nc && l.key(i, r) == k; i++ {
				}
			} else {
				for i < nc && sameColour(l.colour(i, r), col) {
					i++
				}
			}
			if col == nil {
				continue
			}
			paint(cellRun{
				rect: vg.Rectangle{
					Min: vg.Point{X: trX(xe[start]), Y: trY(ye[r])},
					Max: vg.Point{X: trX(xe[i]), Y: trY(ye[r+1])},
				},
				colour: col,
				last:   i == nc,
				top:    r == nr-1,
			})
		}
	}
}

// rasterCanvas is a canvas that holds its pixels, as vgimg's does.
type rasterCanvas interface {
	Image() imagedraw.Image
	DPI() float64
}

// raster returns the raster canvas under c, which crops may wrap.
func raster(c vg.Canvas) (rasterCanvas, bool) {
	for {
		switch v := c.(type) {
		case rasterCanvas:
			return v, true
		case draw.Canvas:
			c = v.Canvas
		case *draw.Canvas:
			c = v.Canvas
		default:
			return nil, false
		}
	}
}

// Plot paints the cells. On a raster canvas the runs are painted
// straight into its pixels, their edges rounded to whole pixels as in
// image, rather than filled as polygons one by one.
func (f cellFill) Plot(c draw.Canvas, plt *plot.Plot) {
	trX, trY := plt.Transforms(&c)
	if rc, ok := raster(c.Canvas); ok && f.dpi == 0 {
		f.paint(rc.Image(), c.Rectangle, rc.DPI(), trX, trY)
		return
	}
	if f.dpi > 0 {
		if img := f.image(c.Rectangle, trX, trY); img != nil {
			c.DrawImage(c.Rectangle, img)
		}
		return
	}
	for _, l := range f.layers {
		l.runs(trX, trY, func(run cellRun) {
			r := run.rect
			if !run.last {
				r.Max.X += seamOverlap
			}
			if !run.top {
				r.Max.Y += seamOverlap
			}
			c.FillPolygon(run.colour, c.ClipPolygonXY(rectPoints(r)))
		})
	}
}

// maxFillPixels bounds each side of the fill image, so a poster-sized
// figure cannot ask for an image of hundreds of megabytes; at the
// default resolution it is reached only by a data area over half a
// metre wide.
const maxFillPixels = 4096

// image paints the layers into an image covering area at f.dpi; it
// returns nil if area is too small to hold a pixel. Run edges are
// rounded to whole pixels, so neighbouring runs meet without seams.
func (f cellFill) image(area vg.Rectangle, trX, trY transform) image.Image {
	size := area.Size()
	w := min(maxFillPixels, int(math.Ceil(float64(size.X/vg.Inch)*float64(f.dpi))))
	h := min(maxFillPixels, int(math.Ceil(float64(size.Y/vg.Inch)*float64(f.dpi))))
	if w < 1 || h < 1 {
		return nil
	}
	// Pixel columns count from the left edge of area, rows from its top.
	col := func(x vg.Length) int {
		return max(0, min(w, int(math.Round(float64((x-area.Min.X)/size.X)*float64(w)))))
	}
	row := func(y vg.Length) int {
		return max(0, min(h, int(math.Round(float64((area.Max.Y-y)/size.Y)*float64(h)))))
	}
	img := image.NewRGBA(image.Rect(0, 0, w, h))
	f.runsInto(img, col, row, trX, trY)
	return img
}

// paint paints the layers into the pixels of a raster canvas of the given
// resolution, clipped to area (in canvas units, y up; pixel rows count
// from the top of the image).
func (f cellFill) paint(img imagedraw.Image, area vg.Rectangle, dpi float64, trX, trY transform) {
	h := img.Bounds().Dy()
	dots := func(v vg.Length) int { return int(math.Round(float64(v.Dots(dpi)))) }
	x0, x1 := dots(area.Min.X), dots(area.Max.X)
	y0, y1 := h-dots(area.Max.Y), h-dots(area.Min.Y)
	col := func(x vg.Length) int { return max(x0, min(x1, dots(x))) }
	row := func(y vg.Length) int { return max(y0, min(y1, h-dots(y))) }
	f.runsInto(img, col, row, trX, trY)
}

// runsInto paints every run of every layer into img, with col and row
// mapping canvas coordinates to pixel columns and rows.
func (f cellFill) runsInto(img imagedraw.Image, col, row func(vg.Length) int, trX, trY transform) {
	for _, l := range f.layers {
		l.runs(trX, trY, func(run cellRun) {
			r := image.Rect(col(run.rect.Min.X), row(run.rect.Max.Y), col(run.rect.Max.X), row(run.rect.Min.Y))
			imagedraw.Draw(img, r, image.NewUniform(run.colour), image.Point{}, imagedraw.Over)
		})
	}
}

// sameColour reports whether a and b paint alike; nil equals only nil.
func sameColour(a, b color.Color) bool {
	if a == nil || b == nil {
		return a == nil && b == nil
	}
	if a == b {
		return true
	}
	r0, g0, b0, a0 := a.RGBA()
	r1, g1, b1, a1 := b.RGBA()
	return r0 == r1 && g0 == g1 && b0 == b1 && a0 == a1
}
