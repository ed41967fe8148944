package overlay

import (
	"errors"
	"math"

	"gainscape/regions/boundary"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// Nearest is the boundary point nearest a design point in one metric.
type Nearest struct {
	// Distance is measured in the metric of the field that holds this
	// Nearest (see Clearance).
	Distance float64
	// X, Y is the boundary point, refined with the stability test.
	X, Y float64
	// Kind and Omega say how roots cross there (the setup's stability
	// test at the refined point): Omega is 0 for Real and NaN for Infinite.
	Kind  stability.Kind
	Omega float64
	// Curve is the index of the curve whose polyline came nearest.
	Curve int
}

// Clearance is how far a design point is from the nearest stability
// boundary of the plane.
type Clearance struct {
	// Absolute is nearest in the Euclidean distance in parameter units.
	Absolute Nearest
	// Relative is nearest when each coordinate difference is divided by
	// the design point's own value of that parameter, so that 0.2 means a
	// change of 20% of the gains (combined as a Euclidean norm).
	Relative Nearest
	// XScale and YScale are the divisors Relative used: |x| and |y| of
	// the design point, or, for a value that is zero (within 1e-12 of the
	// axis span), the span of that axis, since a percentage of zero means
	// nothing.
	XScale, YScale float64
}

// Fragility measures the distance from the design point (x, y) of s to the
// nearest stability boundary, given the boundary curves of its map
// (boundary.Trace), in absolute and relative terms.
//
// The nearest point of the polylines is found by point-to-segment
// distances. It lies on a chord, not on the boundary itself, so it is
// refined: the boundary is located on the ray from the design point
// through it by bisection on the right-half-plane count (as the map counts
// roots), and the ray's direction is then adjusted by golden-section
// search (J. Kiefer, "Sequential minimax search for a maximum", Proc. AMS
// 4(3), 1953) to minimise the distance along it. The kind of crossing and
// its frequency are read from the stability test at the refined point.
//
// It returns an error for a design point that is not finite or when the
// curves hold no point.
func Fragility(s plane.Setup, x, y float64, curves []boundary.Curve) (Clearance, error) {
	if math.IsNaN(x) || math.IsNaN(y) || math.IsInf(x, 0) || math.IsInf(y, 0) {
		return Clearance{}, errors.New("fragility: the design point must be finite")
	}
	points := 0
	for _, c := range curves {
		points += len(c.Points)
	}
	if points == 0 {
		return Clearance{}, errors.New("fragility: the map has no stability boundary to measure against")
	}
	cl := Clearance{XScale: ownScale(x, s.X), YScale: ownScale(y, s.Y)}
	pr := newProber(s)
	f := frame{pr: pr, x0: x, y0: y, count0: pr.count(x, y)}
	f.sx, f.sy = 1, 1
	cl.Absolute = f.nearest(curves)
	f.sx, f.sy = cl.XScale, cl.YScale
	cl.Relative = f.nearest(curves)
	return cl, nil
}

// ownScale is the divisor for relative changes of a design value v on
// axis a.
func ownScale(v float64, a plane.Axis) float64 {
	span := math.Abs(a.Span())
	if math.Abs(v) > 1e-12*span {
		return math.Abs(v)
	}
	if span > 0 {
		return span
	}
	return 1
}

// frame is the plane seen from the design point with each axis divided by
// a scale: scaled point (u, v) is (x0 + sx·u, y0 + sy·v).
type frame struct {
	pr     *prober
	x0, y0 float64
	sx, sy float64
	count0 int
}

// nearest finds the nearest polyline point in the scaled metric and
// refines it on the boundary.
func (f frame) nearest(curves []boundary.Curve) Nearest {
	best := Nearest{Distance: math.Inf(1)}
	var bu, bv, seg float64
	for ci, c := range curves {
		for k := range c.Points {
			a := c.Points[k]
			au, av := (a.X-f.x0)/f.sx, (a.Y-f.y0)/f.sy
			bu2, bv2 := au, av
			if k+1 < len(c.Points) {
				b := c.Points[k+1]
				bu2, bv2 = (b.X-f.x0)/f.sx, (b.Y-f.y0)/f.sy
			} else if len(c.Points) > 1 {
				continue
			}
			u, v := nearestOnSegment(au, av, bu2, bv2)
			if d := math.Hypot(u, v); d < best.Distance {
				best.Distance, best.Curve = d, ci
				bu, bv, seg = u, v, math.Hypot(bu2-au, bv2-av)
			}
		}
	}
	if best.Distance == 0 {
		best.X, best.Y = f.x0, f.y0
		return f.classify(best, best.X, best.Y)
	}
	theta := math.Atan2(bv, bu)
	r := f.ray(theta, best.Distance)
	if math.IsInf(r, 1) {
		// The count does not change near the polyline point (a curve the
		// count cannot see, such as a touching pair): keep the chord point.
		best.X, best.Y = f.x0+f.sx*bu, f.y0+f.sy*bv
		return f.classify(best, best.X, best.Y)
	}
	// Golden-section search on the direction, within the angle the found
	// segment subtends (at most 45° either way).
	span := math.Min(math.Pi/4, 2*math.Atan2(seg, best.Distance))
	a, b := theta-span, theta+span
	g := (math.Sqrt(5) - 1) / 2
	p, q := b-g*(b-a), a+g*(b-a)
	rp, rq := f.ray(p, best.Distance), f.ray(q, best.Distance)
	for b-a > searchTol*math.Pi {
		if rp <= rq {
			b, q, rq = q, p, rp
			p = b - g*(b-a)
			rp = f.ray(p, best.Distance)
		} else {
			a, p, rp = p, q, rq
			q = a + g*(b-a)
			rq = f.ray(q, best.Distance)
		}
	}
	for _, c := range [2]struct{ r, t float64 }{{rp, p}, {rq, q}} {
		if c.r < r {
			r, theta = c.r, c.t
		}
	}
	best.Distance = r
	best.X, best.Y = f.x0+f.sx*r*math.Cos(theta), f.y0+f.sy*r*math.Sin(theta)
	far := f.across(theta, r)
	return f.classify(best, f.x0+f.sx*far*math.Cos(theta), f.y0+f.sy*far*math.Sin(theta))
}

// across returns a distance just beyond r along theta where the count
// differs from the design point's: r plus the smallest of a growing
// series of steps that crosses, so that r and it bracket the edge.
func (f frame) across(theta, r float64) float64 {
	cu, cv := math.Cos(theta), math.Sin(theta)
	for step := 2 * rayTol * r; step < r; step *= 4 {
		if t := r + step; f.pr.count(f.x0+f.sx*t*cu, f.y0+f.sy*t*cv) != f.count0 {
			return t
		}
	}
	return r
}

// rayTol is the bisection width along a ray relative to the distance,
// close to the rounding of the coordinates: the golden-section search on
// the direction sees the distance change only quadratically near its
// minimum, so the position of the nearest point is about the square root
// of this tolerance times the distance (here about 3e-8 of it).
const rayTol = 1e-15

// ray returns the scaled distance along direction theta to where the
// right-half-plane count first differs from the design point's, searching
// up to a few times d (the polyline distance), or +Inf if it does not
// change there. The distance returned is the last one bisection found on
// the design point's side, so the boundary point reported keeps the
// design point's count.
func (f frame) ray(theta, d float64) float64 {
	cu, cv := math.Cos(theta), math.Sin(theta)
	differs := func(t float64) bool { return f.pr.count(f.x0+f.sx*t*cu, f.y0+f.sy*t*cv) != f.count0 }
	hi := math.Inf(1)
	for _, k := range [...]float64{1, 1 + 1e-6, 1 + 1e-4, 1.01, 1.1, 1.5, 2, 3} {
		if differs(k * d) {
			hi = k * d
			break
		}
	}
	if math.IsInf(hi, 1) {
		return hi
	}
	lo := 0.0
	for hi-lo > rayTol*d {
		m := 0.5 * (lo + hi)
		if m <= lo || m >= hi {
			break
		}
		if differs(m) {
			hi = m
		} else {
			lo = m
		}
	}
	return lo
}

// classify fills the kind and frequency of n from what crosses between
// its point and (x, y), just across the edge (the same point when n lies
// on it).
func (f frame) classify(n Nearest, x, y float64) Nearest {
	a := f.pr.function(n.X, n.Y)
	a.P = a.P.Clone()
	cr := f.pr.setup.Test().Classify(a, f.pr.function(x, y))
	n.Kind, n.Omega = cr.Kind, cr.Omega
	return n
}

// nearestOnSegment returns the point of segment ab nearest the origin.
func nearestOnSegment(au, av, bu, bv float64) (float64, float64) {
	du, dv := bu-au, bv-av
	l2 := du*du + dv*dv
	if l2 == 0 {
		return au, av
	}
	t := clamp(-(au*du+av*dv)/l2, 0, 1)
	return au + t*du, av + t*dv
}
