package render

import (
	"image/color"
	"math"
	"sort"

	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// Every level of a contour set that shows a line long enough to hold its
// label gets "Name=level" written on that line, so a reader can tell
// two nearby levels apart. The longest line of a level is labelled once,
// or twice if it is long; each further line of the level at least
// isoOtherLine labels long is labelled once too. A label may sit
// anywhere on its line, its ends included, nearest the preferred spot
// first, and steers clear of other lines and of the room mark labels
// need. A label that finds no room on its line, short of hiding a
// boundary curve there, goes just beside the line instead, where no
// other line comes near, and only failing that over the boundary. Levels whose lines
// are shortest, and so have the fewest places for a label, are labelled
// first; a level left without a label, or with one only beside its
// line, is moved to the front and the labels placed again.

// Iso-line label tuning, in label widths and cost units.
const (
	isoTwice     = 6.0 // a line at least this long gets two labels
	isoOtherLine = 3.0 // a further line of a level at least this long gets one
	isoShift     = 1.0 // cost of moving one label width off the preferred spot
	isoEndCost   = 1.0 // cost of a label hanging over the end of its line
	nearMarkCost = 2.0 // cost of sitting next to a mark symbol

	// unlabelledCost is the cost of a level left without a label, in
	// levels labelled beside their lines.
	unlabelledCost = 100.0
)

// Spacing of a label set beside its line, in canvas units: the gap
// between line and background, and the room kept around the label free
// of every other line so it cannot be read as theirs.
const (
	isoBesideGap   = vg.Length(1)
	isoBesideClear = vg.Length(4)
)

// isoLine is an iso-line in canvas units and its index among the
// placer's lines.
type isoLine struct {
	pts []vg.Point
	id  int
}

// isoText is one level of a contour set as drawn: its label, the label's
// colour (nil means ink) and its lines.
type isoText struct {
	text   string
	colour color.Color
	lines  []isoLine
}

// placeIsoLabels writes the label of every level on its lines and claims
// the boxes. Marks are the symbol centres whose surroundings labels
// avoid when they can.
func placeIsoLabels(pl *placer, levels []isoText, marks []vg.Point) []drawnLabel {
	longest := make([]vg.Length, len(levels))
	order := make([]int, len(levels))
	for i, lv := range levels {
		order[i] = i
		for _, l := range lv.lines {
			longest[i] = max(longest[i], polyLength(l.pts))
		}
	}
	sort.SliceStable(order, func(a, b int) bool { return longest[order[a]] < longest[order[b]] })

	var out []drawnLabel
	placeInBestOrder(pl, [][]int{order}, func(order []int) (poor []int, cost float64) {
		out = out[:0]
		for _, i := range order {
			style := centredStyle(labelSize, inkColour)
			if c := levels[i].colour; c != nil {
				style.Color = c
			}
			labels, bad := labelLevel(pl, levels[i], style, marks)
			out = append(out, labels...)
			switch {
			case bad && len(labels) == 0:
				poor = append(poor, i)
				cost += unlabelledCost
			case bad:
				poor = append(poor, i)
				cost++
			}
		}
		return poor, cost
	})
	return out
}

// labelLevel labels the lines of one level and claims the boxes. It
// reports whether the level is poorly labelled: beside a line or over a
// boundary rather than cleanly on its line, or not at all though a line
// is long enough to hold a label.
func labelLevel(pl *placer, lv isoText, style text.Style, marks []vg.Point) (out []drawnLabel, poor bool) {
	box0 := labelBox(style, lv.text, vg.Point{})
	w := box0.Size().X
	avoid := make([]vg.Rectangle, len(marks))
	for i, m := range marks {
		avoid[i] = grow(symbolBox(m), box0.Size().Y)
	}
	lines := append([]isoLine(nil), lv.lines...)
	sort.SliceStable(lines, func(i, j int) bool { return polyLength(lines[i].pts) > polyLength(lines[j].pts) })
	for _, l := range lines {
		length := polyLength(l.pts)
		if length < w || (len(out) > 0 && length < isoOtherLine*w) {
			continue
		}
		n := 1
		if len(out) == 0 && length >= isoTwice*w {
			n = 2
		}
		for k := 0; k < n; k++ {
			lo, hi := length*vg.Length(k)/vg.Length(n), length*vg.Length(k+1)/vg.Length(n)
			// On the line where it hides no boundary, else beside the
			// line, else on it wherever it fits; a second label on the
			// same line only where it covers no other line, as it adds
			// nothing if it cannot be told from that line's.
			ways := []isoWay{onLine, besideLine, overBoundary}
			if k > 0 {
				ways = []isoWay{clearOfLines}
			}
			for _, way := range ways {
				if at, ok := bestOnLine(pl, l, lo, hi, box0, avoid, way); ok {
					pl.claim(box0.Add(at))
					out = append(out, drawnLabel{text: lv.text, at: at, style: style, bg: grow(box0.Add(at), -labelGap)})
					poor = poor || way != onLine
					break
				}
			}
		}
	}
	if len(out) == 0 {
		return nil, len(lines) > 0 && polyLength(lines[0].pts) >= w
	}
	return out, poor
}

// isoWay is how an iso-line label sits on its line.
type isoWay int

// A label on its line hides no boundary curve unless it goes
// overBoundary, and no other line at all if clearOfLines; one
// besideLine sits just clear of its line.
const (
	onLine isoWay = iota
	besideLine
	overBoundary
	clearOfLines
)

// bestOnLine returns the text anchor of the cheapest label for l that
// fits, its box being box0 moved by the anchor, set the given way at an
// arc length between lo and hi. The cost grows with the distance from
// the middle of lo…hi, with the label hanging over an end of the line,
// with the other lines covered and with the avoided boxes touched. It
// reports false if no label fits.
func bestOnLine(pl *placer, l isoLine, lo, hi vg.Length, box0 vg.Rectangle, avoid []vg.Rectangle, way isoWay) (vg.Point, bool) {
	cum := cumulative(l.pts)
	total := cum[len(cum)-1]
	w := box0.Size().X
	want := (lo + hi) / 2
	c0 := vg.Point{X: (box0.Min.X + box0.Max.X) / 2, Y: (box0.Min.Y + box0.Max.Y) / 2}
	bgHalf := vg.Point{X: box0.Size().X/2 - labelGap, Y: box0.Size().Y/2 - labelGap}
	best, bestCost := vg.Point{}, math.Inf(1)
	consider := func(anchor vg.Point, cost float64) {
		box := box0.Add(anchor)
		if !pl.fits(box) {
			return
		}
		for _, a := range avoid {
			if overlaps(box, a) {
				cost += nearMarkCost
			}
		}
		if cost < bestCost {
			best, bestCost = anchor, cost
		}
	}
	try := func(s vg.Length) {
		pt := pointAlong(l.pts, cum, s)
		shift := isoShift * math.Abs(float64((s-want)/w))
		end := 0.0
		if s < w/2 || s > total-w/2 {
			end = isoEndCost
		}
		if way != besideLine {
			cover := pl.coverCost(box0.Add(pt), l.id)
			if way == overBoundary || cover < boundaryCover && (way != clearOfLines || cover == 0) {
				consider(pt, shift+end+cover)
			}
			return
		}
		// Beside the line, its background just clear of it on either
		// side, where it neither covers nor comes near another line.
		a, b := pointAlong(l.pts, cum, s-1), pointAlong(l.pts, cum, s+1)
		t := dist(a, b)
		if t == 0 {
			return
		}
		n := vg.Point{X: -(b.Y - a.Y) / t, Y: (b.X - a.X) / t}
		off := vg.Length(math.Abs(float64(n.X)))*bgHalf.X + vg.Length(math.Abs(float64(n.Y)))*bgHalf.Y + isoBesideGap
		for _, side := range []vg.Length{1, -1} {
			c := vg.Point{X: pt.X + side*off*n.X, Y: pt.Y + side*off*n.Y}
			anchor := vg.Point{X: c.X - c0.X, Y: c.Y - c0.Y}
			if pl.coverCost(grow(box0.Add(anchor), isoBesideClear), l.id) == 0 {
				consider(anchor, shift)
			}
		}
	}
	for s := want; s <= hi; s += omegaStep {
		try(s)
	}
	for s := want - omegaStep; s >= lo; s -= omegaStep {
		try(s)
	}
	return best, bestCost < math.Inf(1)
}

// cumulative returns the arc length of pts up to each point.
func cumulative(pts []vg.Point) []vg.Length {
	cum := make([]vg.Length, len(pts))
	for i := 1; i < len(pts); i++ {
		cum[i] = cum[i-1] + dist(pts[i-1], pts[i])
	}
	return cum
}

// pointAlong returns the point at arc length s along pts, whose
// cumulative lengths are cum.
func pointAlong(pts []vg.Point, cum []vg.Length, s vg.Length) vg.Point {
	k := sort.Search(len(cum), func(i int) bool { return cum[i] >= s })
	switch {
	case k == 0:
		return pts[0]
	case k == len(cum):
		return pts[len(pts)-1]
	}
	a, b := pts[k-1], pts[k]
	t := vg.Length(0)
	if l := cum[k] - cum[k-1]; l > 0 {
		t = (s - cum[k-1]) / l
	}
	return vg.Point{X: a.X + t*(b.X-a.X), Y: a.Y + t*(b.Y-a.Y)}
}

// polyLength is the arc length of pts.
func polyLength(pts []vg.Point) vg.Length {
	var l vg.Length
	for i := 1; i < len(pts); i++ {
		l += dist(pts[i-1], pts[i])
	}
	return l
}
