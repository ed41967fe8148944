package dpartition

import (
	"errors"
	"math"
	"math/cmplx"
	"reflect"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// A window whose lower side is ki = 0: the real edge lies on the side and
// the arch of PI on 1/(s+1)³ (TestPIOnTripleLag) starts and ends on it, at
// (−1, 0) for ω = 0 and (8, 0) for ω = √3 (3ω² − ω⁴ = 0).
func TestWindowSideOnRealEdge(t *testing.T) {
	pr := piProblem(poly.Poly{1}, poly.FromDescending([]float64{1, 3, 3, 1}), 0, Range{-2, 10}, Range{0, 4})
	res := mustEdges(t, pr)
	realLen := 0.0
	for _, c := range res.Curves {
		switch c.Kind {
		case stability.Real:
			for _, p := range c.Points {
				if p.Y != 0 {
					t.Fatalf("real edge point %+v off the side", p)
				}
			}
			realLen += c.Points[len(c.Points)-1].X - c.Points[0].X
		case stability.Complex:
			a, b := c.Points[0], c.Points[len(c.Points)-1]
			if a != (Point{-1, 0, 0}) || b.Y != 0 || !near(b.X, 8, 1e-12) || !near(b.Omega, math.Sqrt(3), 1e-12) {
				t.Errorf("arch from %+v to %+v, want (−1, 0, 0) to (8, 0, √3)", a, b)
			}
		}
	}
	if realLen != 12 {
		t.Errorf("real edge covers %g of the side, want all 12", realLen)
	}
	checkResiduals(t, pr, res.Curves)
	checkSides(t, pr, res.Curves, 1e-6)
}

// Plant gains of 1e-12 and 1e12 with the window scaled by the inverse
// gain: the edges scale with it and their frequencies stay, to rounding.
func TestGainScaling(t *testing.T) {
	den := poly.FromDescending([]float64{1, 3, 3, 1})
	base := mustEdges(t, piProblem(poly.Poly{1}, den, 0, Range{-2, 10}, Range{-1, 4}))
	for _, k := range []float64{1e-12, 1e12} {
		pr := piProblem(poly.Poly{k}, den, 0, Range{-2 / k, 10 / k}, Range{-1 / k, 4 / k})
		res := mustEdges(t, pr)
		if len(res.Curves) != len(base.Curves) {
			t.Fatalf("gain %g: %d curves, want %d", k, len(res.Curves), len(base.Curves))
		}
		for i, c := range res.Curves {
			b := base.Curves[i]
			if c.Kind != b.Kind || c.Fewer != b.Fewer || c.Change != b.Change {
				t.Fatalf("gain %g, curve %d: %v/%v/%d, want %v/%v/%d", k, i, c.Kind, c.Fewer, c.Change, b.Kind, b.Fewer, b.Change)
			}
			for _, end := range [2]int{0, -1} {
				p, q := c.Points[(len(c.Points)+end)%len(c.Points)], b.Points[(len(b.Points)+end)%len(b.Points)]
				if !near(p.X*k, q.X, 1e-12) || !near(p.Y*k, q.Y, 1e-12) || !near(p.Omega, q.Omega, 1e-12) {
					t.Fatalf("gain %g, curve %d: end %+v, scaled %+v; base %+v", k, i, p, Point{p.X * k, p.Y * k, p.Omega}, q)
				}
			}
		}
		checkResiduals(t, pr, res.Curves)
		checkSides(t, pr, res.Curves, 1e-5)
	}
}

// Plants that are hard for a tracer: unstable, non-minimum phase, and of
// degree 20 (poles invented, spread from 0.5 to 5.25 rad/s, unit DC
// gain). Against gonum eigenvalues on a 50×50 grid, and by residual and
// sides.
func TestHardPlants(t *testing.T) {
	deg20 := poly.Poly{1}
	for i := 0; i < 20; i++ {
		deg20 = poly.Mul(deg20, poly.Poly{1, 1 / (0.5 + 0.25*float64(i))})
	}
	cases := []struct {
		name     string
		num, den poly.Poly
		kp, ki   Range
	}{
		{"unstable 1/((s−1)(s+2)(s+3))", poly.Poly{1}, poly.Mul(poly.Poly{-1, 1}, poly.Poly{6, 5, 1}), Range{0, 40}, Range{0, 20}},
		{"non-minimum-phase (1−s)/((s+1)(s+2)(s+3))", poly.Poly{1, -1}, poly.FromDescending([]float64{1, 6, 11, 6}), Range{-8, 6}, Range{-3, 5}},
		{"degree 20", poly.Poly{1}, deg20, Range{-2, 3}, Range{-0.5, 1}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			pr := piProblem(tc.num, tc.den, 0, tc.kp, tc.ki)
			res := mustEdges(t, pr)
			checkRational(t, pr, res.Curves, 50)
			checkCovers(t, pr, res.Curves, piCurve(tc.num, tc.den), span(1e-6, 20, 100000), 1.01*DefaultChord)
		})
	}
}

// A traced point is a loop with a pair of roots on the axis at ±jω:
// gonum's eigenvalues find one within rounding of jω.
func TestPointsHaveRootsOnTheAxis(t *testing.T) {
	pr := piProblem(poly.Poly{1}, poly.FromDescending([]float64{1, 3, 3, 1}), 0, Range{-2, 10}, Range{-1, 4})
	for _, c := range mustEdges(t, pr).Curves {
		if c.Kind != stability.Complex {
			continue
		}
		for _, p := range c.Points[1:] {
			roots, err := pr.Function(p.X, p.Y).P.Roots()
			if err != nil {
				t.Fatal(err)
			}
			best := math.Inf(1)
			for _, r := range roots {
				best = math.Min(best, cmplx.Abs(r-complex(0, p.Omega)))
			}
			if best > 1e-7*(1+p.Omega) {
				t.Fatalf("point %+v: nearest root %.3g from jω", p, best)
			}
		}
	}
}

// A tighter chord tolerance is met too, checked against the hand-derived
// curve of TestPIOnTripleLag at 20,000 frequencies.
func TestChordTolerance(t *testing.T) {
	pr := piProblem(poly.Poly{1}, poly.FromDescending([]float64{1, 3, 3, 1}), 0, Range{-2, 10}, Range{-1, 4})
	edge := func(w float64) Point { return Point{3*w*w - 1, 3*w*w - w*w*w*w, w} }
	for _, tol := range []float64{1e-2, DefaultChord, 1e-5} {
		res, err := Edges(pr, Options{Chord: tol})
		if err != nil {
			t.Fatal(err)
		}
		if n := checkCovers(t, pr, res.Curves, edge, span(0, 2, 20000), 1.01*tol); n == 0 {
			t.Fatal("no reference point inside")
		}
	}
}

// The result does not depend on anything but the input.
func TestDeterministic(t *testing.T) {
	num, den := islandPlant()
	pr := piProblem(num, den, 0, Range{0, 80}, Range{0, 8})
	a, b := mustEdges(t, pr), mustEdges(t, pr)
	if !reflect.DeepEqual(a, b) {
		t.Fatal("two runs differ")
	}
}

// User errors return an InputError naming the field.
func TestInputErrors(t *testing.T) {
	good := piProblem(poly.Poly{1}, poly.Poly{1, 1}, 0, Range{0, 1}, Range{0, 1})
	cases := []struct {
		name  string
		edit  func(*Problem)
		field string
	}{
		{"empty x window", func(p *Problem) { p.X = Range{1, 1} }, "X"},
		{"infinite y window", func(p *Problem) { p.Y = Range{0, math.Inf(1)} }, "Y"},
		{"negative delay", func(p *Problem) { p.Delay = -1; p.Q = Bilinear{B: poly.Poly{1}} }, "Delay"},
		{"NaN coefficient", func(p *Problem) { p.P.A = poly.Poly{math.NaN(), 1} }, "P, Q"},
		{"advanced type", func(p *Problem) { p.Delay = 1; p.Q = Bilinear{B: poly.Poly{0, 0, 0, 1}} }, "Q"},
		{"x absent", func(p *Problem) { p.P.B = nil }, "P, Q"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			pr := good
			tc.edit(&pr)
			_, err := Edges(pr, Options{})
			var ie *InputError
			if !errors.As(err, &ie) || ie.Field != tc.field {
				t.Fatalf("error %v, want an InputError on %s", err, tc.field)
			}
		})
	}
}

// An edge that goes to infinity at an isolated frequency: the lag
// k(s + 10)/(s + p) on the invented plant 1/(s(s+1)(s+5)) in the (k, p)
// plane is affine, with B = (s + 10), C = s(s+1)(s+5) (derived by hand):
// [B, C]/ω = 10(5 − ω²) + 6ω² = 50 − 4ω², so the 2×2 system is singular
// at ω = √12.5 alone, where (k, p) runs off to infinity and back.
func TestIsolatedPole(t *testing.T) {
	den := poly.FromDescending([]float64{1, 6, 5, 0})
	pr := Problem{P: Bilinear{A: poly.Mul(sVar, den), B: poly.Poly{10, 1}, C: den}, X: Range{0, 100}, Y: Range{0.1, 30}}
	pc, err := newPencil(pr)
	if err != nil {
		t.Fatal(err)
	}
	poles, err := positiveRoots(pc.x.c[1].even)
	if err != nil || len(poles) != 1 || !near(poles[0], 12.5, 1e-12) {
		t.Fatalf("poles at ν = %v (%v), want 12.5", poles, err)
	}
	checkRational(t, pr, mustEdges(t, pr).Curves, 60)
}

// Time scaling: the plant 1/(s/ω₀ + 1)³ under PI has the edge of
// TestPIOnTripleLag with ω and ki multiplied by ω₀ (kp(ω) = −Re[1/G(jω)]
// depends on ω/ω₀ only, ki = ω·Im[1/G(jω)] gains the factor ω₀). Checked
// for ω₀ = 1e-4 and 1e4, with the ki side of the window scaled alike.
func TestFrequencyScaling(t *testing.T) {
	for _, w0 := range []float64{1e-4, 1e4} {
		den := poly.Poly{1, 3 / w0, 3 / (w0 * w0), 1 / (w0 * w0 * w0)}
		pr := piProblem(poly.Poly{1}, den, 0, Range{-2, 10}, Range{-1 * w0, 4 * w0})
		res := mustEdges(t, pr)
		pts := complexPoints(res.Curves)
		if len(pts) == 0 {
			t.Fatalf("ω₀ = %g: no complex edge", w0)
		}
		for _, p := range pts {
			nu := p.Omega * p.Omega / (w0 * w0)
			if !near(p.X, 3*nu-1, 1e-11) || !near(p.Y/w0, 3*nu-nu*nu, 1e-11) {
				t.Fatalf("ω₀ = %g: point %+v off the scaled edge", w0, p)
			}
		}
		checkResiduals(t, pr, res.Curves)
		checkSides(t, pr, res.Curves, 1e-6)
	}
}
