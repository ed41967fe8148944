package dpartition

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// PI on G = 1/(s+1)³ (derived by hand in this test):
//
//	Δ = s·(s+1)³ + kp·s + ki = s⁴ + 3s³ + 3s² + (1 + kp)·s + ki.
//
// At s = jω: Re Δ = ω⁴ − 3ω² + ki and Im Δ = ω·(−3ω² + 1 + kp), so the
// complex edge is kp = 3ω² − 1, ki = 3ω² − ω⁴, and the real edge
// Δ(0) = ki = 0. Δ'(0) = 1 + kp, so the real edge changes side at kp = −1,
// where the complex edge starts (ω = 0). In the window kp ∈ [−2, 10],
// ki ∈ [−1, 4] the complex edge leaves through ki = −1 where
// ν = ω² solves ν² − 3ν − 1 = 0: ν = (3 + √13)/2, kp = 3ν − 1.
func TestPIOnTripleLag(t *testing.T) {
	den := poly.FromDescending([]float64{1, 3, 3, 1})
	pr := piProblem(poly.Poly{1}, den, 0, Range{-2, 10}, Range{-1, 4})
	res := mustEdges(t, pr)
	if got := kinds(res.Curves); got[stability.Real] != 2 || got[stability.Complex] != 1 || got[stability.Infinite] != 0 {
		t.Fatalf("kinds %v, want 2 real (cut at kp = −1) and 1 complex", got)
	}
	for _, c := range res.Curves {
		switch c.Kind {
		case stability.Real:
			for _, p := range c.Points {
				if p.Y != 0 || p.Omega != 0 {
					t.Fatalf("real edge point %+v off ki = 0", p)
				}
			}
		case stability.Complex:
			for _, p := range c.Points {
				nu := p.Omega * p.Omega
				if !near(p.X, 3*nu-1, 1e-12) || !near(p.Y, 3*nu-nu*nu, 1e-12) {
					t.Fatalf("point %+v off kp = 3ω² − 1, ki = 3ω² − ω⁴", p)
				}
			}
			first, last := c.Points[0], c.Points[len(c.Points)-1]
			nuEnd := (3 + math.Sqrt(13)) / 2
			if first != (Point{-1, 0, 0}) {
				t.Errorf("complex edge starts at %+v, want (−1, 0) at ω = 0", first)
			}
			if last.Y != -1 || !near(last.X, 3*nuEnd-1, 1e-12) || !near(last.Omega, math.Sqrt(nuEnd), 1e-12) {
				t.Errorf("complex edge ends at %+v, want (%g, −1) at ω = %g", last, 3*nuEnd-1, math.Sqrt(nuEnd))
			}
			if c.Fewer != Right {
				t.Errorf("stable side of the arch %v, want right (below it, walking up in ω)", c.Fewer)
			}
		}
	}
	checkResiduals(t, pr, res.Curves)
	checkSides(t, pr, res.Curves, 1e-5)
}

// PD on G = 1/(s(s+1)(s+2)) in the (kp, kd) plane (derived by hand):
//
//	Δ = s³ + 3s² + (2 + kd)·s + kp.
//
// Re Δ(jω) = kp − 3ω², Im Δ(jω) = ω·(2 + kd − ω²): kp = 3ω², kd = ω² − 2,
// a straight line from (0, −2) at ω = 0. Real edge kp = 0, cut at
// kd = −2 where Δ'(0) = 2 + kd vanishes. In kp ∈ [−1, 20], kd ∈ [−3, 5]
// the line leaves through kp = 20 at ω² = 20/3, kd = 14/3.
func TestPDOnTypeOnePlant(t *testing.T) {
	den := poly.FromDescending([]float64{1, 3, 2, 0})
	pr := Problem{P: Bilinear{A: den, B: poly.Poly{1}, C: sVar}, X: Range{-1, 20}, Y: Range{-3, 5}}
	res := mustEdges(t, pr)
	if got := kinds(res.Curves); got[stability.Real] != 2 || got[stability.Complex] != 1 {
		t.Fatalf("kinds %v, want 2 real and 1 complex", got)
	}
	for _, c := range res.Curves {
		if c.Kind != stability.Complex {
			for _, p := range c.Points {
				if p.X != 0 {
					t.Fatalf("real edge point %+v off kp = 0", p)
				}
			}
			continue
		}
		for _, p := range c.Points {
			nu := p.Omega * p.Omega
			if !near(p.X, 3*nu, 1e-12) || !near(p.Y, nu-2, 1e-12) {
				t.Fatalf("point %+v off kp = 3ω², kd = ω² − 2", p)
			}
		}
		last := c.Points[len(c.Points)-1]
		if c.Points[0] != (Point{0, -2, 0}) || last.X != 20 || !near(last.Y, 14.0/3, 1e-12) {
			t.Errorf("complex edge from %+v to %+v, want (0, −2) to (20, 14/3)", c.Points[0], last)
		}
	}
	checkResiduals(t, pr, res.Curves)
	checkSides(t, pr, res.Curves, 1e-5)
}

// PD on G = (s+1)/(s(s+2)) in the (kp, kd) plane (derived by hand), a
// relative degree of one, so that the derivative gain reaches the leading
// coefficient:
//
//	Δ = (1 + kd)·s² + (2 + kp + kd)·s + kp.
//
// Infinite edge kd = −1; real edge kp = 0. At jω: kp = (1 + kd)·ω² and
// kp + kd = −2, so kd = −(2 + ω²)/(1 + ω²), kp = −ω²/(1 + ω²): from
// (0, −2) at ω = 0 to (−1, −1) as ω → ∞, where it meets the infinite
// edge. Both ends lie inside kp ∈ [−2, 1], kd ∈ [−3, 1].
func TestEndsAtZeroAndInfiniteFrequency(t *testing.T) {
	pr := Problem{P: Bilinear{A: poly.Poly{0, 2, 1}, B: poly.Poly{1, 1}, C: poly.Poly{0, 1, 1}}, X: Range{-2, 1}, Y: Range{-3, 1}}
	res := mustEdges(t, pr)
	var complexSeen, infiniteSeen bool
	for _, c := range res.Curves {
		switch c.Kind {
		case stability.Infinite:
			infiniteSeen = true
			for _, p := range c.Points {
				if p.Y != -1 || !math.IsNaN(p.Omega) {
					t.Fatalf("infinite edge point %+v, want kd = −1 with ω NaN", p)
				}
			}
		case stability.Complex:
			complexSeen = true
			first, last := c.Points[0], c.Points[len(c.Points)-1]
			if first != (Point{0, -2, 0}) {
				t.Errorf("starts at %+v, want (0, −2) at ω = 0", first)
			}
			if !near(last.X, -1, 1e-12) || !near(last.Y, -1, 1e-12) || !math.IsInf(last.Omega, 1) {
				t.Errorf("ends at %+v, want (−1, −1) at ω = +Inf", last)
			}
			for _, p := range c.Points[:len(c.Points)-1] {
				nu := p.Omega * p.Omega
				if !near(p.X, -nu/(1+nu), 1e-12) || !near(p.Y, -(2+nu)/(1+nu), 1e-12) {
					t.Fatalf("point %+v off the hand-derived edge", p)
				}
			}
		}
	}
	if !complexSeen || !infiniteSeen {
		t.Fatalf("curves %v: want a complex and an infinite edge", kinds(res.Curves))
	}
	checkResiduals(t, pr, res.Curves)
	checkSides(t, pr, res.Curves, 1e-5)
}
