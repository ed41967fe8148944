package dpartition

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// pidSlice is the ideal PID loop s·D + (kd·s² + kp·s + ki)·N at fixed kp
// in the (kd, ki) plane.
func pidSlice(num, den poly.Poly, kp float64, kd, ki Range) Problem {
	a := poly.Add(poly.Mul(sVar, den), poly.Mul(sVar, num).Scaled(kp))
	return Problem{P: Bilinear{A: a, B: poly.Mul(poly.Poly{0, 0, 1}, num), C: num}, X: kd, Y: ki}
}

// silvaFrequencies returns the ω in (0, hi) where kp = −Re[1/G(jω)], by a
// fine scan and bisection on the complex quotient D(jω)/N(jω): the
// crossing frequencies of the PID characterisation of Silva, Datta &
// Bhattacharyya (recalled), computed without the tracer.
func silvaFrequencies(num, den poly.Poly, kp, hi float64) []float64 {
	g := func(w float64) float64 {
		s := complex(0, w)
		return kp + real(den.Eval(s)/num.Eval(s))
	}
	var out []float64
	const n = 20000
	for i := 0; i < n; i++ {
		a, b := hi*float64(i)/n, hi*float64(i+1)/n
		if a == 0 {
			a = hi * 1e-9
		}
		fa, fb := g(a), g(b)
		if (fa < 0) == (fb < 0) {
			continue
		}
		for it := 0; it < 200 && b-a > 1e-15*b; it++ {
			m := (a + b) / 2
			if fm := g(m); (fm < 0) == (fa < 0) {
				a, fa = m, fm
			} else {
				b = m
			}
		}
		out = append(out, (a+b)/2)
	}
	return out
}

// Ideal PID at fixed kp in the (kd, ki) plane: the columns of kd and ki,
// s²·N and N, are real multiples of N(jω), so the edge system is singular
// at every ω and the complex edge is a set of straight lines
// ki = ω²·kd + ω·Im[1/G(jω)], one per root of kp = −Re[1/G(jω)]. Plant
// invented for this test, non-minimum phase: G = (2 − s)/((s+1)²(s² + s + 4)),
// with kp = 1, which has two such roots (near 0.80 and 1.93 rad/s).
func TestPIDSingularLines(t *testing.T) {
	num := poly.Poly{2, -1}
	den := poly.Mul(poly.FromDescending([]float64{1, 2, 1}), poly.FromDescending([]float64{1, 1, 4}))
	const kp = 1
	pr := pidSlice(num, den, kp, Range{-2, 2}, Range{-6, 5})
	res := mustEdges(t, pr)
	want := silvaFrequencies(num, den, kp, 20)
	if len(want) != 2 {
		t.Fatalf("reference found %d crossing frequencies, want 2 for this plant", len(want))
	}
	var lines []Curve
	for _, c := range res.Curves {
		if c.Kind == stability.Complex {
			lines = append(lines, c)
		}
	}
	if len(lines) != len(want) {
		t.Fatalf("%d complex lines, want %d (ω = %v)", len(lines), len(want), want)
	}
	for i, c := range lines {
		w := want[i]
		s := complex(0, w)
		im := imag(den.Eval(s) / num.Eval(s))
		for _, p := range c.Points {
			if !near(p.Omega, w, 1e-9) {
				t.Fatalf("line %d at ω = %.15g, reference %.15g", i, p.Omega, w)
			}
			if ki := w*w*p.X + w*im; !near(p.Y, ki, 1e-9) {
				t.Fatalf("line %d point %+v: ki = ω²·kd + ω·Im[1/G] gives %.15g", i, p, ki)
			}
		}
		if len(c.Points) != 2 {
			t.Errorf("line %d has %d points, want its two ends", i, len(c.Points))
		}
	}
	checkResiduals(t, pr, res.Curves)
	checkSides(t, pr, res.Curves, 1e-5)
}

// With a plant whose zero lies on the imaginary axis, C = N vanishes at
// that frequency and [A, C] with it, without any crossing there: the
// candidate must be rejected, the others kept. Plant invented for this
// test: G = (s² + 4)/((s+1)³(s+3)), kp = 0.5; the reference's sign change
// at ω = 2 is the pole of D/N there, not a crossing.
func TestPIDSingularSkipsPlantZeroOnAxis(t *testing.T) {
	num := poly.Poly{4, 0, 1}
	den := poly.Mul(poly.FromDescending([]float64{1, 3, 3, 1}), poly.Poly{3, 1})
	pr := pidSlice(num, den, 0.5, Range{-5, 5}, Range{-10, 10})
	var want []float64
	for _, w := range silvaFrequencies(num, den, 0.5, 20) {
		if math.Abs(w-2) > 1e-6 {
			want = append(want, w)
		}
	}
	res := mustEdges(t, pr)
	found := 0
	for _, c := range res.Curves {
		if c.Kind != stability.Complex {
			continue
		}
		w := c.Points[0].Omega
		if math.Abs(w-2) < 1e-6 {
			t.Fatalf("a line at the plant's zero ω = 2: %+v", c)
		}
		ok := false
		for _, r := range want {
			ok = ok || near(w, r, 1e-9)
		}
		if !ok {
			t.Fatalf("line at ω = %.15g, not among the reference frequencies %v", w, want)
		}
		found++
	}
	if found == 0 {
		t.Fatalf("no line; reference frequencies %v", want)
	}
	checkResiduals(t, pr, res.Curves)
	checkSides(t, pr, res.Curves, 1e-5)
}
