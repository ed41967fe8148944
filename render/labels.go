package render

import (
	"math"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// Labels on the map are placed greedily: each label claims a box in
// canvas units, and a later candidate whose box would leave the plot
// area or touch a claimed box is skipped. Marks are placed first, then ω
// labels, then contour labels, so the most specific information wins.

// placer keeps the boxes already claimed inside one plot area.
type placer struct {
	area  vg.Rectangle
	taken []vg.Rectangle
}

// overlaps reports whether the interiors of a and b intersect.
func overlaps(a, b vg.Rectangle) bool {
	return a.Min.X < b.Max.X && b.Min.X < a.Max.X &&
		a.Min.Y < b.Max.Y && b.Min.Y < a.Max.Y
}

// inside reports whether b lies wholly within a.
func inside(b, a vg.Rectangle) bool {
	return b.Min.X >= a.Min.X && b.Max.X <= a.Max.X &&
		b.Min.Y >= a.Min.Y && b.Max.Y <= a.Max.Y
}

// grow returns r enlarged by d on every side.
func grow(r vg.Rectangle, d vg.Length) vg.Rectangle {
	return vg.Rectangle{
		Min: vg.Point{X: r.Min.X - d, Y: r.Min.Y - d},
		Max: vg.Point{X: r.Max.X + d, Y: r.Max.Y + d},
	}
}

// fits reports whether b lies in the area and clear of every claimed box.
func (p *placer) fits(b vg.Rectangle) bool {
	if !inside(b, p.area) {
		return false
	}
	for _, t := range p.taken {
		if overlaps(b, t) {
			return false
		}
	}
	return true
}

// claim records b and reports true if it fits; otherwise it changes
// nothing and reports false.
func (p *placer) claim(b vg.Rectangle) bool {
	if !p.fits(b) {
		return false
	}
	p.taken = append(p.taken, b)
	return true
}

// block records b as occupied whether or not it fits, for things that
// must be drawn where they are, such as mark symbols.
func (p *placer) block(b vg.Rectangle) { p.taken = append(p.taken, b) }

// pathPoint is a point of a curve in canvas units with the value carried
// along it (the frequency ω of a boundary).
type pathPoint struct {
	At    vg.Point
	Value float64
}

// site is a placed label: its anchor on the curve, the value there and
// the box it claimed.
type site struct {
	At    vg.Point
	Value float64
	Box   vg.Rectangle
}

// boxFunc returns the box a label for value v would occupy when anchored
// at pt, or false if no label should be written for v.
type boxFunc func(pt vg.Point, v float64) (vg.Rectangle, bool)

// along walks path by arc length and places labels: the first candidate
// lies first along the path, and after each placed label the next
// candidate lies spacing further on. A candidate that does not fit is
// retried step further along. Values between path points are
// interpolated linearly in arc length.
func (p *placer) along(path []pathPoint, first, spacing, step vg.Length, boxAt boxFunc) []site {
	if len(path) < 2 || step <= 0 {
		return nil
	}
	cum := make([]vg.Length, len(path))
	for i := 1; i < len(path); i++ {
		cum[i] = cum[i-1] + dist(path[i-1].At, path[i].At)
	}
	total := cum[len(cum)-1]
	var out []site
	seg := 1
	for d := first; d <= total; {
		for seg < len(path)-1 && cum[seg] < d {
			seg++
		}
		a, b := path[seg-1], path[seg]
		t := 0.0
		if l := cum[seg] - cum[seg-1]; l > 0 {
			t = float64((d - cum[seg-1]) / l)
		}
		pt := vg.Point{
			X: a.At.X + vg.Length(t)*(b.At.X-a.At.X),
			Y: a.At.Y + vg.Length(t)*(b.At.Y-a.At.Y),
		}
		v := a.Value + t*(b.Value-a.Value)
		if box, ok := boxAt(pt, v); ok && p.claim(box) {
			out = append(out, site{At: pt, Value: v, Box: box})
			d += spacing
			continue
		}
		d += step
	}
	return out
}

// labelBox returns the box a label claims when drawn at pt: the text's
// extent grown by its background padding and the gap kept to other
// labels.
func labelBox(s text.Style, txt string, pt vg.Point) vg.Rectangle {
	return grow(s.Rectangle(txt).Add(pt), labelPad+labelGap)
}

// first claims the first of boxes that fits and returns its index, or -1.
func (p *placer) first(boxes []vg.Rectangle) int {
	for i, b := range boxes {
		if p.claim(b) {
			return i
		}
	}
	return -1
}

// dist is the Euclidean distance between a and b.
func dist(a, b vg.Point) vg.Length {
	return vg.Length(math.Hypot(float64(a.X-b.X), float64(a.Y-b.Y)))
}
