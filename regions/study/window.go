package study

import (
	"context"
	"fmt"
	"math"
	"strconv"
	"strings"

	"gainscape/regions/grid"
	"gainscape/regions/intervals"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
)

// The window rule. A window is chosen on a coarse grid of windowNodes ×
// windowNodes: it starts at [0, 2·scale] on each axis to be chosen (the
// scales of parameterScale), and every side on which a stable node lies
// is pushed out by the window's span, at most windowGrowths times; then
// the window is shrunk to the stable nodes, one coarse cell beyond them
// and windowPad of their span more, rounded outward to a tick step. A
// side that still has stable nodes after the last push is taken as
// unbounded and cut at windowMultiple times the axis scale beyond the
// opposite side (or beyond 0); the other axis is then chosen again
// within the cut, so that, for instance, ki reaches just past the
// largest ki on the edge within the kp range kept.
const (
	windowNodes    = 121
	windowGrowths  = 10
	windowPad      = 0.05
	windowMultiple = 3.0
)

// Window is a window chosen for a map and the rule that chose it.
type Window struct {
	// X and Y are the axes with their ranges.
	X, Y spec.Axis
	// Auto says which axes were chosen (the others were given).
	AutoX, AutoY bool
	// Rule says in words how the window was chosen, for reports.
	Rule string
	// Cut lists the sides at which the stable region reaches past the
	// last push and the window was cut by the rule, as "kp above".
	Cut []string
	// Scales are the axis scales the rule started from, with where they
	// came from.
	XScale, YScale Scale
}

// Scale is the size of a parameter's values for the window rule.
type Scale struct {
	Value float64
	// From says where it came from, e.g. "Ku = 4".
	From string
}

// Text writes the window as the flags take it, "kp=-0.2:4.1 ki=…".
func (w Window) Text() string {
	return fmt.Sprintf("%s %s", axisRange(w.X), axisRange(w.Y))
}

func axisRange(a spec.Axis) string { return fmt.Sprintf("%s=%g:%g", a.Param, a.Min, a.Max) }

// ChooseWindow chooses the ranges of the axes of the plane (x, y) of the
// loop l that autoX and autoY mark, keeping the others as given: large
// enough to hold every stable node the rule's coarse grid finds, as the
// package's window rule describes. The grid sees what its nodes see: a
// stable sliver narrower than a coarse cell, or a piece of the region
// not joined to what the growing window reaches, may be missed. It
// returns an *InputError if the axes are not parameters of l or no
// stable node is found however far the window grows.
func ChooseWindow(ctx context.Context, l loop.Loop, x, y spec.Axis, autoX, autoY bool, opt Options) (Window, error) {
	ch, err := newChooser(ctx, l, x, y, opt)
	if err != nil {
		return Window{}, err
	}
	w := Window{X: x, Y: y, AutoX: autoX, AutoY: autoY, XScale: ch.scale[0], YScale: ch.scale[1]}
	if !autoX && !autoY {
		w.Rule = "window as given"
		return w, nil
	}
	free := [4]bool{autoX, autoX, autoY, autoY}
	b := box{x.Min, x.Max, y.Min, y.Max}
	for k, auto := range []bool{autoX, autoX, autoY, autoY} {
		if auto {
			b[k] = ch.start(k)
		}
	}
	b, unb, ext, err := ch.grow(b, free)
	if err != nil {
		return Window{}, err
	}
	cut := [4]bool{}
	// An unbounded x is cut first, with y back at its start so that the
	// cells are fine enough to show where x ends on the other side, and
	// y is then chosen again within the cut.
	if unb[0] || unb[1] {
		if autoY {
			b[2], b[3] = ch.start(2), ch.start(3)
		}
		if b, err = ch.cutSides(b, unb, ext, 0, &cut); err != nil {
			return Window{}, err
		}
		if autoY {
			if b, unb, ext, err = ch.grow(b, [4]bool{false, false, true, true}); err != nil {
				return Window{}, err
			}
		}
	}
	if unb[2] || unb[3] {
		if b, err = ch.cutSides(b, unb, ext, 2, &cut); err != nil {
			return Window{}, err
		}
	}
	if b, err = ch.shrink(b, free, cut); err != nil {
		return Window{}, err
	}
	w.X.Min, w.X.Max, w.Y.Min, w.Y.Max = b[0], b[1], b[2], b[3]
	w.Rule, w.Cut = ch.rule(w, cut)
	return w, nil
}

// ChooseMapWindow returns sc with the ranges of the axes that autoX and
// autoY mark chosen by ChooseWindow for its loop, and the window chosen.
// Errors are *InputError values.
func ChooseMapWindow(ctx context.Context, sc scenario.Scenario, autoX, autoY bool, opt Options) (scenario.Scenario, Window, error) {
	l, err := mapLoopSpec(sc).Build()
	if err != nil {
		return sc, Window{}, err
	}
	w, err := ChooseWindow(ctx, l, sc.Axes.X, sc.Axes.Y, autoX, autoY, opt)
	if err != nil {
		return sc, w, err
	}
	sc.Axes.X, sc.Axes.Y = w.X, w.Y
	return sc, w, nil
}

// box is a window: x min, x max, y min, y max.
type box [4]float64

// chooser runs the window rule for one loop and plane.
type chooser struct {
	ctx   context.Context
	l     loop.Loop
	names [2]string
	idx   [2]int
	plane plane.Setup
	scale [2]Scale
	opt   Options
}

func newChooser(ctx context.Context, l loop.Loop, x, y spec.Axis, opt Options) (*chooser, error) {
	probe := plane.Axis{Param: x.Param, Min: 0, Max: 1, N: 2}
	s, err := plane.NewSetup(l, probe, plane.Axis{Param: y.Param, Min: 0, Max: 1, N: 2})
	if err != nil {
		return nil, inputErr("--x", "axes.x", x.Param+" --y "+y.Param, "%v", err)
	}
	sc := loopScales(l)
	return &chooser{ctx: ctx, l: l, names: [2]string{x.Param, y.Param}, idx: [2]int{s.XIndex, s.YIndex}, plane: s,
		scale: [2]Scale{parameterScale(l, x.Param, sc), parameterScale(l, y.Param, sc)}, opt: opt}, nil
}

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

// sideNodes is the number of points at which a side is tested where no
// exact method serves.
const sideNodes = 2001

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
					"no stable point found in %s %g…%g × %s %g…%g, the farthest the window rule looks; give the window with --x NAME=MIN:MAX --y NAME=MIN:MAX",
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

// rule describes the window chosen, in words.
func (ch *chooser) rule(w Window, cut [4]bool) (string, []string) {
	var parts, sides []string
	for a, auto := range []bool{w.AutoX, w.AutoY} {
		if !auto {
			continue
		}
		name, sc := ch.names[a], ch.scale[a]
		var cuts []string
		for k, where := range []string{"below", "above"} {
			if cut[2*a+k] {
				cuts = append(cuts, where)
				sides = append(sides, name+" "+where)
			}
		}
		if len(cuts) == 0 {
			parts = append(parts, fmt.Sprintf("%s holds every stable node of the growing window (started at 0…%.3g, twice its scale %s)", name, 2*sc.Value, sc.From))
			continue
		}
		where := fmt.Sprintf("cut at %g × its scale %s beyond the region's other end", windowMultiple, sc.From)
		if len(cuts) == 2 {
			where = fmt.Sprintf("cut at ±%g × its scale %s", windowMultiple, sc.From)
		}
		parts = append(parts, fmt.Sprintf("%s: the stable region reaches %s past %d pushes of the window (unbounded that way); %s",
			name, strings.Join(cuts, " and "), windowGrowths, where))
	}
	return strings.Join(parts, "; "), sides
}
