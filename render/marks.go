package render

import (
	"image/color"
	"math"
	"slices"
	"sort"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// A mark label is tried in eight directions around its symbol, right of
// it first as text is read, at two distances; the cheapest candidate
// that fits wins, its cost rising with its place in the list, with the
// lines it would cover and when it would sit as near another symbol as
// its own. When no candidate fits, or every one that fits costs more
// than a leader, the label moves to the nearest free spot further out
// and a thin leader line joins it to its symbol. A leader may cross
// drawn lines; it crosses another leader, passes another symbol or, last
// of all, runs under another label only where nothing else is left, and
// such a placement counts as poor, so other orders of placing the marks
// are tried. Labels themselves never overlap while the plot has room.

// nearDirections are the directions tried next to a symbol, in order of
// preference: right, upper right, lower right, left, upper left, lower
// left, above, below. A direction is a point on the square of half-side
// 1, so a label set in it clears the symbol along at least one axis.
var nearDirections = [][2]vg.Length{{1, 0}, {1, 1}, {1, -1}, {-1, 0}, {-1, 1}, {-1, -1}, {0, 1}, {0, -1}}

// Costs of placing mark labels, in units of one step down the list of
// near candidates, and sizes in label heights.
const (
	leaderCost       = 16.0  // cost of standing off on a leader, above every near candidate's place
	leaderLengthCost = 8.0   // cost of each label height of leader beyond the shortest
	minLeader        = 0.75  // shortest leader
	crowdCost        = 8.0   // cost of sitting next to a symbol still to be labelled
	ambiguousCost    = 12.0  // cost of sitting about as near another symbol as its own
	misleadingCost   = 100.0 // cost of sitting nearer another symbol than its own
	crossLeaderCost  = 30.0  // cost of a leader crossing another
	passSymbolCost   = 100.0 // cost of a leader passing another symbol
	underLabelCost   = 500.0 // cost of a leader running under another label
	overlapCost      = 1e6   // cost of a label set over others for want of room
	crowdRadius      = 4.0   // label heights within which two marks crowd each other
	secondOffset     = 0.5   // label heights between the two near distances
)

// leaderWidth is the stroke width of leader lines, thin beside the
// boundary curves so a leader is not read as one.
const leaderWidth = vg.Length(0.6)

// markText is a mark inside the plot area, in canvas units, with its
// label.
type markText struct {
	at   vg.Point
	text string
}

// markLabel is a placed mark label; one that stands off its symbol has
// a leader line from the symbol's ring (from) to its background (to).
type markLabel struct {
	drawnLabel
	leader   bool
	from, to vg.Point
	// poor is set for a label nearer another symbol than its own, or
	// on a leader that crosses another, passes another symbol or runs
	// under another label.
	poor bool
}

// symbolBox is the box a mark symbol claims.
func symbolBox(pt vg.Point) vg.Rectangle {
	return grow(vg.Rectangle{Min: pt, Max: pt}, markClear)
}

// placeMarkLabels places the labels of marks whose symbols pl already
// holds, claims their boxes and records their leaders. Marks are placed
// one at a time, the most crowded first, since they have the fewest free
// candidates, with ties in the order given; the orders from top to
// bottom, bottom to top, left to right and right to left are tried too,
// as is moving a poorly placed mark to the front (see
// placeInBestOrder), and the placement of least cost is kept. All of
// this depends only on the input, so the same figure comes out the same
// every time. Marks with an empty text get no label.
func placeMarkLabels(pl *placer, marks []markText) []markLabel {
	style := centredStyle(legendSize, inkColour)
	probe := labelBox(style, "M", vg.Point{})
	h := probe.Size().Y
	order := make([]int, 0, len(marks))
	crowd := make([]int, len(marks))
	for i, m := range marks {
		if m.text == "" {
			continue
		}
		order = append(order, i)
		for j, o := range marks {
			if j != i && dist(m.at, o.at) < crowdRadius*h {
				crowd[i]++
			}
		}
	}
	sort.SliceStable(order, func(a, b int) bool { return crowd[order[a]] > crowd[order[b]] })
	// The labels of a cluster often fan out best in the order of their
	// symbols along one axis.
	starts := [][]int{order}
	for _, less := range []func(a, b vg.Point) bool{
		func(a, b vg.Point) bool { return a.Y > b.Y },
		func(a, b vg.Point) bool { return a.Y < b.Y },
		func(a, b vg.Point) bool { return a.X < b.X },
		func(a, b vg.Point) bool { return a.X > b.X },
	} {
		o := slices.Clone(order)
		sort.SliceStable(o, func(a, b int) bool { return less(marks[o[a]].at, marks[o[b]].at) })
		starts = append(starts, o)
	}

	var out []markLabel
	placeInBestOrder(pl, starts, func(order []int) (poor []int, total float64) {
		out = out[:0]
		done := make([]bool, len(marks))
		for _, i := range order {
			m := marks[i]
			// Sitting next to a symbol whose label is still to come
			// takes room that label may need.
			var pending []vg.Rectangle
			var others []vg.Point
			for j, o := range marks {
				if j == i {
					continue
				}
				others = append(others, o.at)
				if !done[j] && o.text != "" {
					pending = append(pending, grow(symbolBox(o.at), h))
				}
			}
			l, cost := placeOneMark(markPlacing{pl: pl, m: m, box0: labelBox(style, m.text, vg.Point{}), h: h, pending: pending, others: others})
			l.style = style
			if l.leader {
				pl.leaders = append(pl.leaders, [2]vg.Point{l.from, l.to})
			}
			if l.poor {
				poor = append(poor, i)
			}
			total += cost
			done[i] = true
			out = append(out, l)
		}
		return poor, total
	})
	return out
}

// markPlacing is the label of one mark being placed and what it must
// make room for.
type markPlacing struct {
	pl *placer
	m  markText
	// box0 is the claimed box of the label with its text anchored at
	// the origin; h is the height of a label box.
	box0 vg.Rectangle
	h    vg.Length
	// pending are the surroundings of symbols still to be labelled;
	// others are the centres of the other symbols.
	pending []vg.Rectangle
	others  []vg.Point
}

// placeOneMark places the label of m, claims its box and returns it
// without its text style, and its cost. A label that finds no free place
// at all is set over whatever lies right of its symbol and marked poor,
// at a cost above any other.
func placeOneMark(mp markPlacing) (markLabel, float64) {
	near, nearCost := mp.near()
	l, cost := mp.onLeader(nearCost)
	if cost >= nearCost {
		l, cost = near, nearCost
	}
	if !math.IsInf(cost, 1) {
		mp.pl.claim(grow(l.bg, labelGap))
		return l, cost
	}
	// No room anywhere: the label goes right of its symbol, over
	// whatever is there, rather than not at all.
	l = mp.at(mp.nextTo(nearDirections[0], 0))
	l.poor = true
	mp.pl.block(grow(l.bg, labelGap))
	return l, overlapCost
}

// at returns the label with its text anchored at the given point.
func (mp markPlacing) at(anchor vg.Point) markLabel {
	return markLabel{drawnLabel: drawnLabel{text: mp.m.text, at: anchor, bg: grow(mp.box0.Add(anchor), -labelGap)}}
}

// centred returns the text anchor that centres the label's box on c.
func (mp markPlacing) centred(c vg.Point) vg.Point {
	return vg.Point{X: c.X - (mp.box0.Min.X+mp.box0.Max.X)/2, Y: c.Y - (mp.box0.Min.Y+mp.box0.Max.Y)/2}
}

// nextTo returns the text anchor of the label set in direction u at
// distance d beyond the symbol's box, and a hair more, so rounding
// cannot make the two boxes overlap.
func (mp markPlacing) nextTo(u [2]vg.Length, d vg.Length) vg.Point {
	d += 0.01
	size := mp.box0.Size()
	return mp.centred(vg.Point{
		X: mp.m.at.X + u[0]*(markClear+d+size.X/2),
		Y: mp.m.at.Y + u[1]*(markClear+d+size.Y/2),
	})
}

// crowding is the cost of the lines box covers and of the room it takes
// from symbols still to be labelled.
func (mp markPlacing) crowding(box vg.Rectangle) float64 {
	cost := mp.pl.coverCost(box, -1)
	for _, p := range mp.pending {
		if overlaps(box, p) {
			cost += crowdCost
		}
	}
	return cost
}

// ambiguity is the cost of other symbols lying closer to the label
// background bg than limit, and far more for those closer than own, the
// distance of the label's own symbol, since a label nearer another
// symbol than its own misleads.
func (mp markPlacing) ambiguity(bg vg.Rectangle, own, limit vg.Length) float64 {
	var cost float64
	for _, o := range mp.others {
		switch d := rectDist(o, bg); {
		case d < own:
			cost += misleadingCost
		case d < limit:
			cost += ambiguousCost
		}
	}
	return cost
}

// near returns the cheapest label next to the symbol that fits and its
// cost, or an infinite cost if none fits.
func (mp markPlacing) near() (markLabel, float64) {
	best, bestCost := markLabel{}, math.Inf(1)
	for k, d := range []vg.Length{0, secondOffset * mp.h} {
		for r, u := range nearDirections {
			l := mp.at(mp.nextTo(u, d))
			box := grow(l.bg, labelGap)
			if !mp.pl.fits(box) {
				continue
			}
			// A label about as near another symbol as its own reads
			// as that symbol's, unless it stands far enough off for a
			// leader to show whose it is.
			own := rectDist(mp.m.at, l.bg)
			amb := mp.ambiguity(l.bg, own, own+markClear)
			if amb > 0 && k > 0 {
				if mp.joinLeader(&l) == 0 {
					amb = mp.ambiguity(l.bg, 0, min(own, mp.h/2))
				} else {
					l.leader = false
				}
			}
			l.poor = amb >= misleadingCost
			cost := float64(k*len(nearDirections)+r) + mp.crowding(box) + amb
			if cost < bestCost {
				best, bestCost = l, cost
			}
		}
	}
	return best, bestCost
}

// onLeader returns the cheapest label on a leader that costs less than
// bound, and its cost, or an infinite cost if there is none. Label boxes
// are tried with their centres on a grid of half a label height around
// the symbol, and the leader runs from the symbol's ring to the nearest
// point of the label's background. The cost grows with the leader's
// length, with the lines the label covers, the room it and its leader
// take from pending symbols, when another symbol lies within half a
// label height of the label, and for what the leader runs across (see
// leaderPath).
func (mp markPlacing) onLeader(bound float64) (markLabel, float64) {
	pt, a := mp.m.at, mp.pl.area
	half := vg.Point{X: mp.box0.Size().X / 2, Y: mp.box0.Size().Y / 2}
	step := mp.h / 2
	type spot struct {
		anchor vg.Point
		reach  vg.Length
	}
	var spots []spot
	for i := math.Ceil(float64((a.Min.X + half.X - pt.X) / step)); pt.X+vg.Length(i)*step <= a.Max.X-half.X; i++ {
		for j := math.Ceil(float64((a.Min.Y + half.Y - pt.Y) / step)); pt.Y+vg.Length(j)*step <= a.Max.Y-half.Y; j++ {
			anchor := mp.centred(vg.Point{X: pt.X + vg.Length(i)*step, Y: pt.Y + vg.Length(j)*step})
			reach := rectDist(pt, grow(mp.box0.Add(anchor), -labelGap))
			if reach >= markRadius+minLeader*mp.h {
				spots = append(spots, spot{anchor, reach})
			}
		}
	}
	sort.SliceStable(spots, func(i, j int) bool { return spots[i].reach < spots[j].reach })

	best, bestCost := markLabel{}, bound
	for _, sp := range spots {
		cost := leaderCost + leaderLengthCost*float64((sp.reach-markRadius)/mp.h-minLeader)
		if cost >= bestCost {
			break
		}
		l := mp.at(sp.anchor)
		box := grow(l.bg, labelGap)
		if !mp.pl.fits(box) {
			continue
		}
		path := mp.joinLeader(&l)
		l.poor = path > 0
		cost += path + mp.crowding(box) + mp.ambiguity(l.bg, 0, min(sp.reach, mp.h/2))
		for _, p := range mp.pending {
			if segmentHits(l.from, l.to, p) {
				cost += crowdCost
			}
		}
		if cost < bestCost {
			best, bestCost = l, cost
		}
	}
	if bestCost == bound {
		return markLabel{}, math.Inf(1)
	}
	return best, bestCost
}

// joinLeader gives l a leader from the symbol's ring to the nearest
// point of its background and returns the cost of its path (see
// leaderPath).
func (mp markPlacing) joinLeader(l *markLabel) float64 {
	pt := mp.m.at
	to := vg.Point{X: min(max(pt.X, l.bg.Min.X), l.bg.Max.X), Y: min(max(pt.Y, l.bg.Min.Y), l.bg.Max.Y)}
	u := (markRadius + 0.5) / dist(pt, to)
	l.leader, l.from, l.to = true, vg.Point{X: pt.X + u*(to.X-pt.X), Y: pt.Y + u*(to.Y-pt.Y)}, to
	return leaderPath(mp.pl, pt, l.from, l.to)
}

// leaderPath returns the cost of a leader from the ring of the symbol at
// pt (at from) to to for the labels it runs under, the other leaders it
// crosses and the other symbols it passes.
func leaderPath(pl *placer, pt, from, to vg.Point) float64 {
	var cost float64
	for _, t := range pl.taken {
		if segmentHits(from, to, t) {
			cost += underLabelCost
		}
	}
	for _, t := range pl.symbols {
		if !inside(vg.Rectangle{Min: pt, Max: pt}, t) && segmentHits(from, to, t) {
			cost += passSymbolCost
		}
	}
	for _, l := range pl.leaders {
		if segmentsCross(from, to, l[0], l[1]) {
			cost += crossLeaderCost
		}
	}
	return cost
}

// rectDist is the distance from pt to the nearest point of r, zero
// inside.
func rectDist(pt vg.Point, r vg.Rectangle) vg.Length {
	q := vg.Point{X: min(max(pt.X, r.Min.X), r.Max.X), Y: min(max(pt.Y, r.Min.Y), r.Max.Y)}
	return dist(pt, q)
}

// segmentsCross reports whether the segments ab and cd cross at a point
// interior to both.
func segmentsCross(a, b, c, d vg.Point) bool {
	side := func(p, q, r vg.Point) float64 {
		return float64((q.X-p.X)*(r.Y-p.Y) - (q.Y-p.Y)*(r.X-p.X))
	}
	return side(a, b, c)*side(a, b, d) < 0 && side(c, d, a)*side(c, d, b) < 0
}

// drawLeader draws the line joining a standing-off label to its symbol.
func drawLeader(c draw.Canvas, l markLabel) {
	c.StrokeLine2(draw.LineStyle{Color: inkColour, Width: leaderWidth}, l.from.X, l.from.Y, l.to.X, l.to.Y)
}

// drawMark draws the design-point symbol: a white disc with a dark ring
// and a dark centre dot, visible on every fill.
func drawMark(c draw.Canvas, pt vg.Point) {
	// Each circle starts with a move to its first point: an arc opening a
	// path is otherwise written to SVG as a line from nowhere, which
	// viewers drop.
	var disc vg.Path
	disc.Move(vg.Point{X: pt.X + markRadius, Y: pt.Y})
	disc.Arc(pt, markRadius, 0, 2*math.Pi)
	disc.Close()
	c.SetColor(color.White)
	c.Fill(disc)
	c.SetLineStyle(draw.LineStyle{Color: inkColour, Width: 1.2})
	c.Stroke(disc)
	var dot vg.Path
	dot.Move(vg.Point{X: pt.X + 1.1, Y: pt.Y})
	dot.Arc(pt, 1.1, 0, 2*math.Pi)
	dot.Close()
	c.SetColor(inkColour)
	c.Fill(dot)
}
