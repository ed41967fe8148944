package study

import (
	"context"
	"fmt"
	"strings"

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
