package overlay

import (
	"context"
	"math"
	"testing"

	"gainscape/regions/boundary"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// fragilityTol is the agreement required with the hand-derived distances
// and points.
const fragilityTol = 1e-6

// thirdOrderPI is PI control of 1/(s(s+1)(s+2)), on axes offset so that no
// node lies on a boundary.
//
// Derived by hand: p = s⁴ + 3s³ + 2s² + kp·s + ki. Routh rows: s⁴: 1, 2,
// ki; s³: 3, kp; s²: (6−kp)/3, ki; s¹: kp − 9ki/(6−kp); s⁰: ki. Stable
// exactly when 0 < kp < 6, ki > 0 and ki < f(kp) = kp(6−kp)/9. On the
// complex boundary ki = f(kp) the s¹ row vanishes and the s² row gives the
// auxiliary polynomial ((6−kp)/3)s² + ki, so ω² = 3ki/(6−kp) = kp/3. On
// ki = 0 a real root crosses at s = 0.
func thirdOrderPI(t *testing.T) plane.Setup {
	return setupOf(t, []float64{1}, []float64{1, 3, 2, 0}, "pi", []float64{0, 0},
		plane.Axis{Param: "kp", Min: -1.03, Max: 6.97, N: 81}, plane.Axis{Param: "ki", Min: -0.513, Max: 1.487, N: 81})
}

func parabola(kp float64) float64 { return kp * (6 - kp) / 9 }

// nearestOnParabola returns the point of ki = f(kp) nearest (x0, y0) when
// kp and ki differences are divided by sx and sy, by bisection on the
// derivative of the squared distance, g'(kp)/2 = (kp−x0)/sx² +
// (f(kp)−y0)·f'(kp)/sy² with f'(kp) = (6−2kp)/9, over [a, b] where it
// changes sign once (checked by the caller's choice of bracket).
func nearestOnParabola(x0, y0, sx, sy, a, b float64) (kp, dist float64) {
	dg := func(x float64) float64 { return (x-x0)/(sx*sx) + (parabola(x)-y0)*(6-2*x)/9/(sy*sy) }
	for b-a > 1e-14 {
		m := 0.5 * (a + b)
		if (dg(m) > 0) == (dg(b) > 0) {
			b = m
		} else {
			a = m
		}
	}
	kp = 0.5 * (a + b)
	return kp, math.Hypot((kp-x0)/sx, (parabola(kp)-y0)/sy)
}

// TestFragilityHandDerived measures from (kp, ki) = (4, 0.7) against the
// boundaries traced from the map and against a coarse polyline of nine
// points on the parabola, which the refinement must correct to the same
// answer.
func TestFragilityHandDerived(t *testing.T) {
	s := thirdOrderPI(t)
	m := mapOf(t, s)
	traced, err := boundary.Trace(context.Background(), s, m, 2)
	if err != nil {
		t.Fatal(err)
	}
	coarse := boundary.Curve{Kind: stability.Complex}
	for k := 0; k <= 8; k++ {
		kp := 0.75 * float64(k)
		coarse.Points = append(coarse.Points, boundary.Point{X: kp, Y: parabola(kp), Omega: math.Sqrt(kp / 3)})
	}
	line := boundary.Curve{Kind: stability.Real, Points: []boundary.Point{{X: 0, Y: 0}, {X: 6, Y: 0}}}

	const x0, y0 = 4, 0.7
	// Absolute: with u = kp − 3, f = 1 − u²/9 and the distance² is
	// (u−1)² + (0.3 − u²/9)², whose derivative vanishes where
	// 2u³/81 + (14/15)u − 1 = 0 (derived by hand); the root lies in
	// [0.5, 2]. The real boundary ki = 0 is 0.7 away, farther.
	absKp, absDist := nearestOnParabola(x0, y0, 1, 1, 3.5, 5)
	if u := absKp - 3; math.Abs(2*u*u*u/81+14.0/15*u-1) > 1e-12 {
		t.Fatalf("bisection and the hand-derived cubic disagree at u = %g", u)
	}
	// Relative: kp differences divided by 4, ki differences by 0.7. The
	// parabola meets ki = 0.7 at kp = 3 + √2.7 ≈ 4.64, so the nearest
	// point has kp in [4, 4.65]; ki = 0 is at relative distance 1.
	relKp, relDist := nearestOnParabola(x0, y0, 4, 0.7, 4, 4.65)

	for _, tc := range []struct {
		name   string
		curves []boundary.Curve
	}{
		{"traced", traced},
		{"coarse polyline", []boundary.Curve{line, coarse}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := Fragility(s, x0, y0, tc.curves)
			if err != nil {
				t.Fatal(err)
			}
			if c.XScale != 4 || c.YScale != 0.7 {
				t.Errorf("scales %g, %g; want the design values 4, 0.7", c.XScale, c.YScale)
			}
			for _, w := range []struct {
				what     string
				got      Nearest
				kp, dist float64
			}{{"absolute", c.Absolute, absKp, absDist}, {"relative", c.Relative, relKp, relDist}} {
				n := w.got
				if math.Abs(n.Distance-w.dist) > fragilityTol || math.Abs(n.X-w.kp) > fragilityTol ||
					math.Abs(n.Y-parabola(w.kp)) > fragilityTol {
					t.Errorf("%s: %+v; want distance %.9g at (%.9g, %.9g)", w.what, n, w.dist, w.kp, parabola(w.kp))
				}
				if n.Kind != stability.Complex || math.Abs(n.Omega-math.Sqrt(w.kp/3)) > fragilityTol {
					t.Errorf("%s: kind %s, ω %.9g; want complex, %.9g", w.what, n.Kind, n.Omega, math.Sqrt(w.kp/3))
				}
			}
		})
	}
}

// TestFragilityZeroValue checks the rule for a design value of zero: that
// coordinate is scaled by its axis span.
func TestFragilityZeroValue(t *testing.T) {
	// Derived by hand: plant 1/(s+1) under PI gives p = s² + (1+kp)s + ki,
	// stable for kp > −1 and ki > 0. From (0, 0.5): the real boundary
	// ki = 0 is 0.5 away at (0, 0), the complex boundary kp = −1 is 1 away
	// at (−1, 0.5), where p = s² + 0.5 and ω = √0.5. Relative, with kp
	// scaled by the span 4 (kp = 0) and ki by 0.5: 1/4 to kp = −1 and
	// 0.5/0.5 = 1 to ki = 0, so the complex boundary is nearer. The axes
	// are offset so that no node lies on a boundary.
	s := setupOf(t, []float64{1}, []float64{1, 1}, "pi", []float64{0, 0},
		plane.Axis{Param: "kp", Min: -2.03, Max: 1.97, N: 41}, plane.Axis{Param: "ki", Min: -1.03, Max: 1.47, N: 41})
	curves, err := boundary.Trace(context.Background(), s, mapOf(t, s), 2)
	if err != nil {
		t.Fatal(err)
	}
	c, err := Fragility(s, 0, 0.5, curves)
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name           string
		got            Nearest
		dist, x, y, om float64
		kind           stability.Kind
	}{
		{"absolute", c.Absolute, 0.5, 0, 0, 0, stability.Real},
		{"relative", c.Relative, 0.25, -1, 0.5, math.Sqrt(0.5), stability.Complex},
	}
	for _, tc := range tests {
		n := tc.got
		if math.Abs(n.Distance-tc.dist) > fragilityTol || math.Abs(n.X-tc.x) > fragilityTol ||
			math.Abs(n.Y-tc.y) > fragilityTol || n.Kind != tc.kind || math.Abs(n.Omega-tc.om) > fragilityTol {
			t.Errorf("%s: %+v; want distance %g at (%g, %g), %s, ω %g", tc.name, n, tc.dist, tc.x, tc.y, tc.kind, tc.om)
		}
	}
	if c.XScale != 4 || c.YScale != 0.5 {
		t.Errorf("scales %g, %g; want the span 4 and the value 0.5", c.XScale, c.YScale)
	}
}

// TestFragilityErrors checks the user errors.
func TestFragilityErrors(t *testing.T) {
	s := thirdOrderPI(t)
	some := []boundary.Curve{{Kind: stability.Real, Points: []boundary.Point{{X: 0, Y: 0}, {X: 6, Y: 0}}}}
	tests := []struct {
		name   string
		x, y   float64
		curves []boundary.Curve
	}{
		{"no curves", 4, 0.7, nil},
		{"curves without points", 4, 0.7, []boundary.Curve{{Kind: stability.Real}}},
		{"point not a number", math.NaN(), 0.7, some},
		{"point infinite", 4, math.Inf(-1), some},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if _, err := Fragility(s, tc.x, tc.y, tc.curves); err == nil {
				t.Fatal("no error")
			}
		})
	}
}
