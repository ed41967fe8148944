package render

import (
	"math"
	"slices"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// Labels on the map are placed greedily: each label claims a box in
// canvas units, and a later candidate whose box would leave the plot
// area or touch a claimed box is rejected. Mark symbols are claimed
// first, then iso-line labels, mark labels and ω labels. Iso-line labels
// come early because they must sit on their lines, which are often short
// and run close to the marks; mark labels follow, as the information the
// figure was drawn for, free to move around their symbols or stand off
// on a leader line; ω labels come last, as they repeat along long edges
// and slide along them to wherever there is room.
//
// Among the candidates that fit, an iso-line or mark label prefers one
// that covers no other drawn line: the background box of a label hides what lies under
// it, and a boundary hidden next to a design point is the very margin a
// reader wants to see.

// placer keeps the boxes already claimed inside one plot area, the mark
// symbols and leader lines no label may cover, and the lines drawn
// there.
type placer struct {
	area    vg.Rectangle
	taken   []vg.Rectangle
	symbols []vg.Rectangle
	leaders [][2]vg.Point
	lines   []drawnLine
}

// drawnLine is a line of the map in canvas units with its bounding box
// and the cost of covering part of it with a label.
type drawnLine struct {
	pts    []vg.Point
	bounds vg.Rectangle
	cost   float64
}

// Costs of covering a line with a label, in units of one step down a
// label's list of candidates.
const (
	boundaryCover = 12.0
	isoCover      = 4.0
)

// addLine records pts as a drawn line with the given covering cost and
// returns its index for coverCost's skip argument.
func (p *placer) addLine(pts []vg.Point, cost float64) int {
	b := vg.Rectangle{Min: pts[0], Max: pts[0]}
	for _, q := range pts[1:] {
		b.Min.X, b.Min.Y = min(b.Min.X, q.X), min(b.Min.Y, q.Y)
		b.Max.X, b.Max.Y = max(b.Max.X, q.X), max(b.Max.Y, q.Y)
	}
	p.lines = append(p.lines, drawnLine{pts: pts, bounds: b, cost: cost})
	return len(p.lines) - 1
}

// coverCost sums the costs of the drawn lines that pass through b, each
// line counted once, leaving out line skip (the line a label is written
// on; -1 for none).
func (p *placer) coverCost(b vg.Rectangle, skip int) float64 {
	var c float64
	for i, l := range p.lines {
		if i == skip || !overlaps(grow(l.bounds, 0.01), b) {
			continue
		}
		for k := 1; k < len(l.pts); k++ {
			if segmentHits(l.pts[k-1], l.pts[k], b) {
				c += l.cost
				break
			}
		}
	}
	return c
}

// segmentHits reports whether the segment from a to b meets the interior
// of r. It clips the segment to r's slabs in turn (Liang and Barsky's
// parametric clipping).
func segmentHits(a, b vg.Point, r vg.Rectangle) bool {
	t0, t1 := 0.0, 1.0
	clip := func(p, q float64) bool {
		// The segment enters or leaves the slab at t = q/p.
		if p == 0 {
			return q > 0
		}
		t := q / p
		if p < 0 {
			t0 = max(t0, t)
		} else {
			t1 = min(t1, t)
		}
		return t0 < t1
	}
	dx, dy := float64(b.X-a.X), float64(b.Y-a.Y)
	return clip(-dx, float64(a.X-r.Min.X)) && clip(dx, float64(r.Max.X-a.X)) &&
		clip(-dy, float64(a.Y-r.Min.Y)) && clip(dy, float64(r.Max.Y-a.Y))
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

// fits reports whether b lies in the area, clear of every claimed box,
// symbol and leader.
func (p *placer) fits(b vg.Rectangle) bool {
	if !inside(b, p.area) {
		return false
	}
	for _, t := range p.taken {
		if overlaps(b, t) {
			return false
		}
	}
	for _, t := range p.symbols {
		if overlaps(b, t) {
			return false
		}
	}
	for _, l := range p.leaders {
		if segmentHits(l[0], l[1], b) {
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

// maxPlacements bounds the placements placeInBestOrder tries, so a
// plot crowded past help is drawn in good time.
const maxPlacements = 24

// placerState is how many boxes and leaders a placer held at some point.
type placerState struct{ taken, leaders int }

// state returns the placer's present state for restore.
func (p *placer) state() placerState { return placerState{len(p.taken), len(p.leaders)} }

// restore forgets every box and leader claimed since s.
func (p *placer) restore(s placerState) {
	p.taken, p.leaders = p.taken[:s.taken], p.leaders[:s.leaders]
}

// placeInBestOrder places items with place in the order of least cost it
// finds. From each of the starting orders in turn it calls place and,
// while some item comes out badly placed, calls it again with the first
// such item that has not been at the front yet moved there; so each
// start costs at most one call per item and one more, and all starts
// together at most maxPlacements calls. pl is restored before each
// call. place returns the badly placed items, in the order
// it tried them, and the cost of its placement. The best order is placed
// last, so pl holds its claims and whatever place records is from that
// call.
func placeInBestOrder(pl *placer, starts [][]int, place func(order []int) (poor []int, cost float64)) {
	state := pl.state()
	var best, last []int
	bestCost := math.Inf(1)
	calls := 0
	for s, order := range starts {
		if slices.ContainsFunc(starts[:s], func(o []int) bool { return slices.Equal(o, order) }) {
			continue
		}
		tried := make(map[int]bool)
		for calls < maxPlacements {
			calls++
			pl.restore(state)
			poor, cost := place(order)
			last = order
			if cost < bestCost {
				best, bestCost = order, cost
			}
			k := slices.IndexFunc(poor, func(i int) bool { return !tried[i] })
			if k < 0 {
				break
			}
			p := poor[k]
			tried[p] = true
			order = append([]int{p}, slices.DeleteFunc(slices.Clone(order), func(i int) bool { return i == p })...)
		}
	}
	if !slices.Equal(best, last) {
		pl.restore(state)
		place(best)
	}
}

// addSymbol records a mark symbol centred at pt.
func (p *placer) addSymbol(pt vg.Point) { p.symbols = append(p.symbols, symbolBox(pt)) }

// block records b as occupied whether or not it fits, for things that
// must be drawn where they are.
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

// dist is the Euclidean distance between a and b.
func dist(a, b vg.Point) vg.Length {
	return vg.Length(math.Hypot(float64(a.X-b.X), float64(a.Y-b.Y)))
}
