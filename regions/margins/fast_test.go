package margins

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
)

// randomLoop returns a plant of degree 1-5 with stable poles (damping at
// least minDamp) and at most one zero under a PI or PID controller, scaled
// so that the closed loop is stable (half the gain margin of the unit-gain
// loop when it has one). ok is false if no stable gain was found.
func randomLoop(t testing.TB, rng *rand.Rand, minDamp float64) (l Loop, ok bool) {
	n := 1 + rng.IntN(5)
	den := poly.FromRoots(stableRoots(rng, n, minDamp, 1))
	num := poly.Poly{1}
	if rng.IntN(2) == 0 {
		num = poly.Poly{math.Exp(2*rng.Float64() - 1), 1}
	}
	var cn, cd poly.Poly
	switch rng.IntN(3) {
	case 0:
		cn, cd = poly.Poly{1}, poly.Poly{1}
	case 1:
		cn, cd = poly.Poly{math.Exp(2*rng.Float64() - 2), 1}, poly.Poly{0, 1}
	default:
		cn, cd = poly.FromRoots(stableRoots(rng, 2, 0.5, 1)), poly.Poly{0, 1, 0.02}
	}
	l = NewLoop(num, den, cn, cd)
	m, err := l.Margins()
	if err != nil {
		t.Fatal(err)
	}
	g := 2.0
	if Finite(m.GainMargin) {
		g = m.GainMargin * (0.2 + 0.6*rng.Float64())
	}
	l.Num = l.Num.Scaled(g)
	poles, err := Poles(l.Characteristic())
	if err != nil {
		t.Fatal(err)
	}
	return l, DecayRate(poles) > 0
}

// TestMsEvaluatorMatchesRefined checks the fast evaluator against
// Loop.Margins on 300 random stable loops, on one grid wide enough for all
// of them ([1e-4, 1e4] rad/s), requiring 1e-3 relative and reporting the
// largest difference seen. The fast value must not exceed the refined one
// (beyond rounding): both are values of |S|, and the refined one is the
// supremum.
func TestMsEvaluatorMatchesRefined(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	ev, err := NewMsEvaluator(1e-4, 1e4, DefaultMsPerDecade, 9, DefaultMsSteps)
	if err != nil {
		t.Fatal(err)
	}
	worst, tested := 0.0, 0
	for tested < 300 {
		l, ok := randomLoop(t, rng, 0.1)
		if !ok {
			continue
		}
		tested++
		m := mustMargins(t, l)
		got := ev.Ms(l.Num, l.Den)
		rel := (m.Ms - got) / m.Ms
		worst = max(worst, math.Abs(rel))
		if rel > 1e-3 || rel < -1e-12 {
			t.Errorf("fast Ms %.12g, refined %.12g at ω %g (rel %.2g)\nnum %v\nden %v", got, m.Ms, m.MsFreq, rel, l.Num, l.Den)
		}
	}
	t.Logf("largest relative difference %.3g over %d loops", worst, tested)
}

// The analytic cases again, through the fast evaluator.
func TestMsEvaluatorAnalytic(t *testing.T) {
	ev, err := NewMsEvaluator(1e-3, 1e3, DefaultMsPerDecade, 4, DefaultMsSteps)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range []float64{0.3, 1, 10} {
		x := (k + math.Sqrt(k*k+2*k)) / 2
		want := math.Sqrt((x*x + x) / ((k-x)*(k-x) + x))
		check(t, "Ms of k/(s(s+1))", ev.Ms(p(k), p(1, 1, 0)), want, 1e-6)
	}
	// Peak at ω = 0: k/(s − a), a < k < 2a: Ms = a/(k − a).
	check(t, "Ms of 1.5/(s−1)", ev.Ms(p(1.5), p(1, -1)), 2, 1e-15)
	// Supremum at ω → ∞: k/(s + a): Ms = 1.
	check(t, "Ms of 3/(s+1)", ev.Ms(p(3), p(1, 1)), 1, 1e-15)
	// Biproper: L = 2(s+1)/(s+3): S = (s+3)/(3s+5),
	// |S|² = (ω²+9)/(9ω²+25), decreasing (25 < 81) from 9/25 at ω = 0 to
	// 1/9: Ms = 3/5 at ω = 0.
	check(t, "Ms of 2(s+1)/(s+3)", ev.Ms(p(2, 2), p(1, 3)), 0.6, 1e-15)
}

func TestMsEvaluatorAllocs(t *testing.T) {
	ev, err := NewMsEvaluator(1e-3, 1e3, DefaultMsPerDecade, 6, DefaultMsSteps)
	if err != nil {
		t.Fatal(err)
	}
	num, den := p(4, 4, 1), p(1, 3, 3, 1, 0)
	if a := testing.AllocsPerRun(50, func() { ev.Ms(num, den) }); a != 0 {
		t.Errorf("%g allocations per call", a)
	}
}

func TestMsEvaluatorErrors(t *testing.T) {
	for _, c := range []struct {
		lo, hi    float64
		pd, n, st int
	}{{0, 1, 10, 3, 5}, {2, 1, 10, 3, 5}, {1, math.Inf(1), 10, 3, 5}, {1, 10, 0, 3, 5}, {1, 10, 10, 0, 5}, {1, 10, 10, 3, -1}} {
		if _, err := NewMsEvaluator(c.lo, c.hi, c.pd, c.n, c.st); err == nil {
			t.Errorf("%+v accepted", c)
		}
	}
	ev, _ := NewMsEvaluator(1, 10, 10, 2, 0)
	defer func() {
		if recover() == nil {
			t.Error("too long a polynomial did not panic")
		}
	}()
	ev.Ms(p(1), p(1, 2, 3))
}

// TestMsEvaluatorNearResonance: a plant resonance with damping 0.004
// puts a peak in |S| far narrower than 40 points per decade. Without the
// plant roots the grid may miss it; with them the fast value must agree
// with Margins (whose scan is enriched the same way and refined) to 1e-3.
// The loop is invented: L = 30(s+2)/((s+1)(s² + 0.08s + 100)) under a
// gain of 0.1, stable (checked by the poles below).
func TestMsEvaluatorNearResonance(t *testing.T) {
	num := poly.Poly{6, 3}
	den := poly.Mul(poly.Poly{1, 1}, poly.Poly{100, 0.08, 1})
	l := Loop{Num: num, Den: den}
	poles, err := Poles(l.Characteristic())
	if err != nil || DecayRate(poles) <= 0 {
		t.Fatalf("test loop not stable: %v %v", poles, err)
	}
	full, err := l.Margins()
	if err != nil {
		t.Fatal(err)
	}
	roots, _ := den.Roots()
	nr, _ := num.Roots()
	ev, err := NewMsEvaluatorNear(1e-3, 1e3, DefaultMsPerDecade, 4, DefaultMsSteps, append(roots, nr...))
	if err != nil {
		t.Fatal(err)
	}
	if got := ev.Ms(num, den); math.Abs(got-full.Ms) > 1e-3*full.Ms {
		t.Fatalf("fast Ms %.6g; refined %.6g", got, full.Ms)
	}
}
