package dpartition

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// fopdt is an invented first-order plant with dead time, k·e^(−Ls)/(Ts + 1).
type fopdt struct{ k, t, l float64 }

var fopdtCases = []fopdt{{1, 1, 1}, {2.5, 4, 0.7}, {0.3, 0.5, 2}}

// alpha1 is the root in (π/2, π) of tan α = −(T/L)·α, by bisection on
// sin α + (T/L)·α·cos α, which falls from positive to negative there.
func (p fopdt) alpha1() float64 {
	g := func(a float64) float64 { return math.Sin(a) + p.t/p.l*a*math.Cos(a) }
	lo, hi := math.Pi/2, math.Pi
	for it := 0; it < 200 && hi-lo > 1e-16*hi; it++ {
		m := (lo + hi) / 2
		if g(m) > 0 {
			lo = m
		} else {
			hi = m
		}
	}
	return (lo + hi) / 2
}

// ultimate is the upper end of the stabilising P gains,
// (T/(kL))·√(α1² + (L/T)²) (Silva, Datta & Bhattacharyya, PID Controllers
// for Time-Delay Systems, Birkhäuser 2005; from memory).
func (p fopdt) ultimate() float64 {
	a := p.alpha1()
	return p.t / (p.k * p.l) * math.Sqrt(a*a+(p.l/p.t)*(p.l/p.t))
}

// residualRoot finds by Newton's method the root of Δ(s; x, y) near s0.
func localRoot(pr Problem, x, y float64, s0 complex128) complex128 {
	f := pr.Function(x, y)
	dp, dq := f.P.Derivative(), f.Q.Derivative()
	l := complex(f.Delay, 0)
	s := s0
	for it := 0; it < 30; it++ {
		z := cmplx.Exp(-l * s)
		v := f.P.Eval(s) + f.Q.Eval(s)*z
		d := dp.Eval(s) + (dq.Eval(s)-l*f.Q.Eval(s))*z
		if d == 0 {
			break
		}
		s -= v / d
	}
	return s
}

// checkDelaySides confirms the side of each complex curve of a delay loop
// by following the crossing root off the axis: at a small offset d to the
// side named Fewer, Newton's method from jω finds the root in the left
// half plane, and to the other side in the right.
func checkDelaySides(t *testing.T, pr Problem, cs []Curve, d float64) {
	t.Helper()
	w := window{pr.X, pr.Y}
	for ci, c := range cs {
		if c.Kind != stability.Complex {
			continue
		}
		for i := 1; i+1 < len(c.Points); i++ {
			p := c.Points[i]
			s0 := complex(0, p.Omega)
			var re [2]float64
			for k, sg := range [2]float64{1, -1} {
				x, y := offset(w, c.Points, i, sg*d)
				s := localRoot(pr, x, y, s0)
				if cmplx.Abs(s-s0) > 1e-3*(1+p.Omega) {
					t.Fatalf("curve %d at %+v: Newton wandered to %v", ci, p, s)
				}
				re[k] = real(s)
			}
			left, right := re[0], re[1]
			if c.Fewer == Right {
				left, right = right, left
			}
			if !(left < 0 && right > 0) {
				t.Fatalf("curve %d (fewer %v) at %+v: root real parts %g on the fewer side, %g on the other", ci, c.Fewer, p, left, right)
			}
		}
	}
}

// PI on first order plus dead time, (kp, ki) plane: every complex point
// lies on kp(ω) = (ωT·sin ωL − cos ωL)/k, ki(ω) = ω(sin ωL + ωT·cos ωL)/k
// (Silva, Datta & Bhattacharyya, Automatica 37, 2001; from memory; the
// same follows from Δ(jω) = 0 by hand), on branch k for 2πk ≤ ωL ≤ 2π(k + 1). The first
// branch starts at (−1/k, 0) for ω = 0 and comes back to ki = 0 at
// ωL = α1, kp at the ultimate P gain.
//
// The last window reaches far enough for several branches to cross it.
func TestFirstOrderDeadTimePI(t *testing.T) {
	cases := []struct {
		fopdt
		kp, ki   float64 // window: kp up to kp·ku, ki up to ki·ku/L
		branches int     // complex branches expected in the window
	}{
		{fopdtCases[0], 1.5, 2, 1}, {fopdtCases[1], 1.5, 2, 1}, {fopdtCases[2], 1.5, 2, 1},
		{fopdtCases[0], 8, 40, 3},
	}
	for _, tc := range cases {
		p := tc.fopdt
		ku := p.ultimate()
		pr := piProblem(poly.Poly{p.k}, poly.Poly{1, p.t}, p.l, Range{-2 / p.k, tc.kp * ku}, Range{0, tc.ki * ku / p.l})
		res := mustEdges(t, pr)
		if !res.Complete || math.IsInf(res.OmegaMax, 0) {
			t.Fatalf("%+v: sweep not bounded: %+v", p, res.OmegaMax)
		}
		var first *Curve
		for i, c := range res.Curves {
			if c.Kind != stability.Complex {
				continue
			}
			for _, q := range c.Points {
				w := q.Omega
				sn, cs := math.Sincos(w * p.l)
				if !near(q.X, (w*p.t*sn-cs)/p.k, 1e-9) || !near(q.Y, w*(sn+w*p.t*cs)/p.k, 1e-9) {
					t.Fatalf("%+v: point %+v off the published curve", p, q)
				}
				if ph := w * p.l / (2 * math.Pi); ph < float64(c.Branch)*(1-1e-15) || ph > float64(c.Branch+1)*(1+1e-15) {
					t.Fatalf("%+v: point %+v on branch %d", p, q, c.Branch)
				}
				if w > res.OmegaMax {
					t.Fatalf("%+v: point %+v above the bound %g", p, q, res.OmegaMax)
				}
			}
			if c.Points[0].Omega == 0 {
				first = &res.Curves[i]
			}
		}
		if first == nil {
			t.Fatalf("%+v: no curve starts at ω = 0", p)
		}
		a, b := first.Points[0], first.Points[len(first.Points)-1]
		if !near(a.X, -1/p.k, 1e-12) || a.Y != 0 {
			t.Errorf("%+v: first branch starts at %+v, want (%g, 0)", p, a, -1/p.k)
		}
		if b.Y != 0 || !near(b.X, ku, 1e-8) || !near(b.Omega, p.alpha1()/p.l, 1e-8) {
			t.Errorf("%+v: first branch ends at %+v, want (%.12g, 0) at ω = %.12g", p, b, ku, p.alpha1()/p.l)
		}
		if first.Fewer != Right || first.Branch != 0 {
			t.Errorf("%+v: first branch fewer %v, branch %d; want right (below it), 0", p, first.Fewer, first.Branch)
		}
		checkResiduals(t, pr, res.Curves)
		checkDelaySides(t, pr, res.Curves, 1e-6)
		// Every point of the published curve below the bound, sampled
		// finely, lies within the chord tolerance of a traced curve.
		edge := func(w float64) Point {
			sn, cs := math.Sincos(w * p.l)
			return Point{(w*p.t*sn - cs) / p.k, w * (sn + w*p.t*cs) / p.k, w}
		}
		branches := map[int]bool{}
		for _, c := range res.Curves {
			if c.Kind == stability.Complex {
				branches[c.Branch] = true
			}
		}
		if len(branches) != tc.branches {
			t.Errorf("%+v: complex curves on branches %v, want %d branches", p, branches, tc.branches)
		}
		n := checkCovers(t, pr, res.Curves, edge, span(0, res.OmegaMax, 200000), 1.01*DefaultChord)
		t.Logf("%+v: %d curves on %d branches up to ω = %.4g; %d reference points inside", p, len(res.Curves), len(branches), res.OmegaMax, n)
	}
}

// P control on first order plus dead time: the stabilising gains are
// −1/k < kp < (T/(kL))·√(α1² + (L/T)²) (Silva, Datta & Bhattacharyya,
// Birkhäuser 2005; from memory), the upper end a complex crossing at
// ω = α1/L.
func TestFirstOrderDeadTimeP(t *testing.T) {
	for _, p := range fopdtCases {
		ku := p.ultimate()
		lp := LineProblem{P: Affine{A: poly.Poly{1, p.t}}, Q: Affine{B: poly.Poly{p.k}}, Delay: p.l, K: Range{-3 / p.k, 3 * ku}}
		res, err := Crossings(lp, Options{})
		if err != nil {
			t.Fatal(err)
		}
		// Below −1/k the loop is unstable already (a real root, and pairs
		// leaving as kp rises toward it); the stable interval is between the
		// real crossing and the next one.
		lo := -1
		for i, c := range res.Crossings {
			if c.Kind == stability.Real {
				lo = i
			}
		}
		if lo < 0 || lo+1 >= len(res.Crossings) {
			t.Fatalf("%+v: crossings %+v", p, res.Crossings)
		}
		low, high := res.Crossings[lo], res.Crossings[lo+1]
		if !near(low.K, -1/p.k, 1e-8) || low.Delta != -1 {
			t.Errorf("%+v: lower end %+v, want real at %g leaving the right half plane", p, low, -1/p.k)
		}
		if high.Kind != stability.Complex || !near(high.K, ku, 1e-8) || !near(high.Omega, p.alpha1()/p.l, 1e-8) || high.Delta != 2 {
			t.Errorf("%+v: upper end %+v, want complex at %.12g, ω = %.12g, entering", p, high, ku, p.alpha1()/p.l)
		}
		for _, c := range res.Crossings[lo+2:] {
			if c.Kind != stability.Complex || c.Delta != 2 {
				t.Errorf("%+v: beyond the ultimate gain %+v, want pairs entering", p, c)
			}
		}
	}
}

// The frequency bound of a delay loop: above OmegaMax, |P(jω)| > |Q(jω)|
// at every point of the window, so Δ(jω) cannot vanish (checked at random
// points and frequencies with the plant's polynomials evaluated afresh).
func TestDelayFrequencyBound(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, p := range fopdtCases {
		pr := piProblem(poly.Poly{p.k}, poly.Poly{1, p.t}, p.l, Range{-2 / p.k, 1.5 * p.ultimate()}, Range{0, 3 / p.l})
		om, ok := frequencyBound(pr)
		if !ok || !(om > 0) {
			t.Fatalf("%+v: no bound", p)
		}
		for i := 0; i < 2000; i++ {
			x := pr.X.Min + pr.X.Span()*rng.Float64()
			y := pr.Y.Min + pr.Y.Span()*rng.Float64()
			w := om * (1 + 20*rng.Float64())
			f := pr.Function(x, y)
			s := complex(0, w)
			if pa, qa := cmplx.Abs(f.P.Eval(s)), cmplx.Abs(f.Q.Eval(s)); !(pa > qa) {
				t.Fatalf("%+v: at (%g, %g), ω = %g > Ω = %g: |P| = %g ≤ |Q| = %g", p, x, y, w, om, pa, qa)
			}
		}
	}
}

// Ideal PD on first order plus dead time is neutral: Δ = Ts + 1 +
// (kp + kd·s)·k·e^(−Ls) has deg Q = deg P = 1, q_1/p_1 = kd·k/T, and a
// chain of roots crosses where |kd·k/T| = 1 (derived by hand). With both
// lines in the window there is no frequency bound.
func TestNeutralEdges(t *testing.T) {
	p := fopdt{2, 3, 0.5}
	kd := p.t / p.k
	pr := Problem{P: Bilinear{A: poly.Poly{1, p.t}}, Q: Bilinear{B: poly.Poly{p.k}, C: poly.Poly{0, p.k}}, Delay: p.l,
		X: Range{-0.4, 2}, Y: Range{-2 * kd, 2 * kd}}
	res, err := Edges(pr, Options{MaxBranches: 4})
	if err != nil {
		t.Fatal(err)
	}
	if res.Complete {
		t.Fatal("complete, want the sweep capped: the neutral edges are in the window")
	}
	var lines []float64
	for _, c := range res.Curves {
		if c.Kind != stability.Infinite {
			continue
		}
		y := c.Points[0].Y
		lines = append(lines, y)
		if c.Change != Unbounded {
			t.Errorf("neutral edge change %d, want Unbounded", c.Change)
		}
		// Points run in increasing kp; fewer roots where |kd| < T/k.
		want := Left
		if y > 0 {
			want = Right
		}
		if c.Fewer != want {
			t.Errorf("neutral edge kd = %g: fewer %v, want %v", y, c.Fewer, want)
		}
	}
	if len(lines) != 2 || !near(math.Min(lines[0], lines[1]), -kd, 1e-12) || !near(math.Max(lines[0], lines[1]), kd, 1e-12) {
		t.Fatalf("neutral edges at kd = %v, want ±%g", lines, kd)
	}
	checkResiduals(t, pr, res.Curves)
}
