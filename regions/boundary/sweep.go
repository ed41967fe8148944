package boundary

import (
	"context"
	"math"

	"gainscape/regions/dpartition"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// Method names how the edges of a map were found.
type Method string

// The methods.
const (
	// Swept edges are the D-partition curves traced in ω
	// (dpartition.Edges): every point is computed from its frequency, and
	// no curve is missed however coarse the grid.
	Swept Method = "frequency sweep"
	// Bisected edges are grid-edge crossings refined by bisection and
	// joined by marching squares (Trace).
	Bisected Method = "bisection"
)

// Sweep is the D-partition of a map's window, traced in ω, as boundary
// curves, with what the cross-check of a grid needs: the side of each
// curve with fewer unstable roots and how many roots cross it.
type Sweep struct {
	// Curves are the edges, clipped to the window, each point labelled
	// with its frequency (0 on a Real edge, NaN on an Infinite one, +Inf
	// at the end of a Complex edge that reaches ω → ∞).
	Curves []Curve
	// Chord is the largest distance between a polyline and its curve, in
	// units of the window's sides.
	Chord float64
	fewer []dpartition.Side
	// change is the number of roots that cross each curve, 0 where it
	// cannot be told or no root changes side.
	change []int
}

// ProblemOf returns the characteristic function of s over its window as a
// D-partition problem, formed from the setup's pencils without any
// further arithmetic: Δ = Char for a rational loop, P = OpenDen = Dc·D and
// Q = OpenNum = Nc·N with the plant's dead time otherwise (the pencils are
// family.Split's parts multiplied by the plant polynomials). ok is false
// for a sampled-data loop, whose boundary is the unit circle, not the
// imaginary axis.
func ProblemOf(s plane.Setup) (pr dpartition.Problem, ok bool) {
	if s.Plant.Sample > 0 {
		return dpartition.Problem{}, false
	}
	bl := func(p plane.Pencil) dpartition.Bilinear {
		return dpartition.Bilinear{A: p.A, B: p.B, C: p.C, E: p.E}
	}
	pr = dpartition.Problem{X: dpartition.Range{Min: s.X.Min, Max: s.X.Max}, Y: dpartition.Range{Min: s.Y.Min, Max: s.Y.Max}}
	if L := s.Plant.Delay; L > 0 {
		pr.P, pr.Q, pr.Delay = bl(s.OpenDen), bl(s.OpenNum), L
	} else {
		pr.P = bl(s.Char)
	}
	return pr, true
}

// Affine reports whether the axis parameters of s enter its
// characteristic function affinely: no term in x·y (the pencils' E parts
// are zero) and, since the pencils hold each parameter to the first power
// only, none multiplying itself. Over a rectangle of the plane the
// characteristic polynomials then form a polytope.
func Affine(s plane.Setup) bool {
	zero := func(p poly.Poly) bool { return p.Degree() < 0 }
	return zero(s.Char.E) && zero(s.OpenNum.E) && zero(s.OpenDen.E)
}

// SweepChord is the chord tolerance of the traced polylines, in cells of
// the grid: small, so that the curves pass a grid node on the side they
// truly pass it, except within this distance.
const SweepChord = 1.0 / 64

// TraceSweep traces the D-partition of s over its window (dpartition.Edges)
// with polylines within SweepChord of a cell of the grid of s (and within
// dpartition.DefaultChord of the window). It returns ok false where the
// sweep does not apply: a sampled-data loop, a problem the tracer refuses
// (a degenerate characteristic function), or a loop with dead time whose
// sweep has no frequency bound and so may be incomplete. It returns
// ctx.Err() if cancelled.
func TraceSweep(ctx context.Context, s plane.Setup) (sw *Sweep, ok bool, err error) {
	pr, ok := ProblemOf(s)
	if !ok {
		return nil, false, nil
	}
	cells := float64(max(s.X.N, s.Y.N, 2) - 1)
	chord := math.Min(dpartition.DefaultChord, SweepChord/cells)
	res, err := dpartition.Edges(pr, dpartition.Options{Chord: chord})
	if err := ctx.Err(); err != nil {
		return nil, false, err
	}
	if err != nil || !res.Complete {
		return nil, false, nil
	}
	sw = &Sweep{Chord: chord}
	for _, c := range res.Curves {
		if len(c.Points) == 0 {
			continue
		}
		pts := make([]Point, len(c.Points))
		for k, p := range c.Points {
			pts[k] = Point{X: p.X, Y: p.Y, Omega: p.Omega}
		}
		change := c.Change
		if change == dpartition.Unbounded || c.Fewer == dpartition.SideUnknown {
			change = 0
		}
		sw.Curves = append(sw.Curves, Curve{Kind: c.Kind, Points: pts})
		sw.fewer = append(sw.fewer, c.Fewer)
		sw.change = append(sw.change, change)
	}
	return sw, true, nil
}
