package study

import (
	"math"
	"strconv"

	"gainscape/regions/grid"
	"gainscape/regions/intervals"
	"gainscape/regions/plane"
)

// start returns the starting value of side k: 0 for a minimum, twice the
// axis scale for a maximum.
func (ch *chooser) start(k int) float64 {
	if k%2 == 0 {
		return 0
	}
	return 2 * ch.scale[k/2].Value
}

// coarse maps the box on the rule's grid.
func (ch *chooser) coarse(b box) (*grid.Map, error) {
	s, err := plane.NewSetup(ch.l, plane.Axis{Param: ch.names[0], Min: b[0], Max: b[1], N: windowNodes},
		plane.Axis{Param: ch.names[1], Min: b[2], Max: b[3], N: windowNodes})
	if err != nil {
		return nil, err
	}
	return grid.Evaluate(ch.ctx, s, grid.Options{Workers: ch.opt.Workers})
}

// stableSpan returns the first and last column and row holding a stable
// node, and false if none does.
func stableSpan(m *grid.Map) (span [4]int, ok bool) {
	span = [4]int{m.XAxis.N, -1, m.YAxis.N, -1}
	for j := 0; j < m.YAxis.N; j++ {
		for i := 0; i < m.XAxis.N; i++ {
			if m.StableAt(j*m.XAxis.N + i) {
				span = [4]int{min(span[0], i), max(span[1], i), min(span[2], j), max(span[3], j)}
			}
		}
	}
	return span, span[1] >= 0
}

// sidesStable reports which of the sides of b that want marks hold a
// stable point: exactly, by the stable intervals of the parameter along
// the side (intervals.Stable), for a continuous loop without dead time,
// and at sideNodes points along it otherwise. A thin stable tail that
// crosses a side is so seen however narrow it is where the coarse grid
// would lose it between nodes.
func (ch *chooser) sidesStable(b box, want [4]bool) [4]bool {
	var t [4]bool
	for k := range 4 {
		if want[k] {
			t[k] = ch.sideStable(b, k)
		}
	}
	return t
}

// sideStable reports whether side k of b holds a stable point.
func (ch *chooser) sideStable(b box, k int) bool {
	a := k / 2     // the axis the side cuts
	along := 1 - a // the axis it runs along
	fixed := ch.idx[a]
	l := ch.l.Set(fixed, b[k])
	lo, hi := b[2*along], b[2*along+1]
	if l.Plant.Delay == 0 && l.Plant.Sample == 0 {
		if ivs, err := intervals.Stable(l, ch.idx[along], lo, hi); err == nil {
			return len(ivs) > 0
		}
	}
	// The plane's own functions, as the grid evaluates them.
	counter, sc := ch.plane.NewCounter(), ch.plane.NewScratch()
	for i := range sideNodes {
		v := lo + float64(i)*(hi-lo)/(sideNodes-1)
		xy := [2]float64{b[k], b[k]}
		xy[along] = v
		if counter.Count(ch.plane.Function(sc, xy[0], xy[1])).Stable() {
			return true
		}
	}
	return false
}

// grow pushes out the free sides of b that stable nodes touch, each at
// most windowGrowths times, and reports the sides still touched at the
// end, where the region is unbounded as far as the rule looks, and the
// extent of the stable nodes of the last map.
func (ch *chooser) grow(b box, free [4]bool) (box, [4]bool, box, error) {
	var pushes [4]int
	for {
		m, err := ch.coarse(b)
		if err != nil {
			return b, [4]bool{}, box{}, err
		}
		_, any := stableSpan(m)
		if st := m.Stats(); !any && st.Marginal > 0 {
			// Marginal nodes and no stable one: a fixed value holds a
			// root on the boundary; looking farther will not help.
			return b, [4]bool{}, box{}, inputErr("--x", "axes.x", ch.names[0]+" --y "+ch.names[1],
				"no stable point in %s %.4g…%.4g × %s %.4g…%.4g, but %d of its %d nodes are marginal, a root on the stability boundary: a fixed value may hold one there at every point (ki = 0 leaves the integrator's root at s = 0: --set ki=… or a structure without it)",
				ch.names[0], b[0], b[1], ch.names[1], b[2], b[3], st.Marginal, st.Nodes)
		}
		t := ch.sidesStable(b, free)
		if !any && t == ([4]bool{}) {
			// No stable node yet: look farther on every free side.
			t = free
		}
		var unb [4]bool
		moved := false
		next := b
		for k := range 4 {
			if !free[k] || !t[k] {
				continue
			}
			if pushes[k] == windowGrowths {
				unb[k] = true
				continue
			}
			pushes[k]++
			span := b[k|1] - b[k&^1]
			if k%2 == 0 {
				next[k] -= span
			} else {
				next[k] += span
			}
			moved = true
		}
		if !moved {
			if !any {
				return b, unb, box{}, inputErr("--x", "axes.x", ch.names[0]+" --y "+ch.names[1],
					"no stable point found in %s %.4g…%.4g × %s %.4g…%.4g, the farthest the window rule looks; give the window with --x NAME=MIN:MAX --y NAME=MIN:MAX",
					ch.names[0], b[0], b[1], ch.names[1], b[2], b[3])
			}
			span, _ := stableSpan(m)
			return b, unb, box{m.XAxis.At(span[0]), m.XAxis.At(span[1]), m.YAxis.At(span[2]), m.YAxis.At(span[3])}, nil
		}
		b = next
	}
}

// cutSides cuts the unbounded sides of axis a (0 for x, 2 for y) at
// windowMultiple times its scale beyond the opposite end of the stable
// nodes, or beyond 0 when that end lies on the far side of 0. The end is
// first read from ext, the stable nodes of the grown window, whose cells
// may be wide, and then again from the map of the cut window, until it
// settles.
func (ch *chooser) cutSides(b box, unb [4]bool, ext box, a int, cut *[4]bool) (box, error) {
	reach := roundSignificant(windowMultiple*ch.scale[a/2].Value, 3)
	lo, hi := unb[a], unb[a+1]
	cut[a], cut[a+1] = lo, hi
	if lo && hi {
		b[a], b[a+1] = -reach, reach
		return b, nil
	}
	for range 6 {
		prev := b
		if hi {
			b[a+1] = math.Max(ext[a], 0) + reach
		} else {
			b[a] = math.Min(ext[a+1], 0) - reach
		}
		if b == prev {
			break
		}
		m, err := ch.coarse(b)
		if err != nil {
			return b, err
		}
		span, ok := stableSpan(m)
		if !ok {
			break
		}
		ext = box{m.XAxis.At(span[0]), m.XAxis.At(span[1]), m.YAxis.At(span[2]), m.YAxis.At(span[3])}
	}
	return b, nil
}

// shrink returns b shrunk on its free, uncut sides to the stable nodes
// of its coarse map, one cell beyond them and windowPad of their span
// more, rounded outward to a tick step of the result.
func (ch *chooser) shrink(b box, free, cut [4]bool) (box, error) {
	m, err := ch.coarse(b)
	if err != nil {
		return b, err
	}
	span, ok := stableSpan(m)
	if !ok {
		return b, nil
	}
	axes := [2]plane.Axis{m.XAxis, m.YAxis}
	out := b
	for a := range 2 {
		ax := axes[a]
		lo := ax.At(max(span[2*a]-1, 0))
		hi := ax.At(min(span[2*a+1]+1, ax.N-1))
		pad := windowPad * (hi - lo)
		lo, hi = lo-pad, hi+pad
		if cut[2*a] || !free[2*a] {
			lo = b[2*a]
		}
		if cut[2*a+1] || !free[2*a+1] {
			hi = b[2*a+1]
		}
		step := niceStep((hi - lo) / 20)
		if free[2*a] && !cut[2*a] {
			lo = math.Floor(lo/step) * step
		}
		if free[2*a+1] && !cut[2*a+1] {
			hi = math.Ceil(hi/step) * step
		}
		out[2*a], out[2*a+1] = tidy(lo), tidy(hi)
	}
	// The coarse nodes may miss a thin part of the region near a side:
	// such a side is moved back out, in steps of a tenth of the way to
	// where the window had grown, whose sides hold no stable point.
	for k := range 4 {
		if !free[k] || cut[k] {
			continue
		}
		for step := 1; step <= 10 && ch.sideStable(out, k); step++ {
			out[k] = tidy(out[k] + (b[k]-out[k])*float64(step)/10)
		}
	}
	return out, nil
}

// tidy rounds v to 12 significant digits, so that a multiple of a tick
// step reads as one (−0.6, not −0.6000000000000001); adding zero turns
// −0 into 0.
func tidy(v float64) float64 {
	r, _ := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	return r + 0
}

// niceStep returns the smallest of 1, 2, 2.5 and 5 times a power of ten
// that is at least v > 0.
func niceStep(v float64) float64 {
	p := math.Pow(10, math.Floor(math.Log10(v)))
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		if m*p >= v*(1-1e-12) {
			return m * p
		}
	}
	return 10 * p
}

// sideNodes is the number of points at which a side is tested where no
// exact method serves.
const sideNodes = 2001
