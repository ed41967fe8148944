package margins

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
)

// Proportional control kp = 2 of e^(−s)/(s + 1), derived by hand:
// |L(jω)| = 2/√(1 + ω²) = 1 at ω = √3; arg L = −atan ω − ω, so the phase
// margin is π − atan √3 − √3 = 2π/3 − √3 rad and the delay margin that
// divided by √3. The phase crossover solves ω + atan ω = π (by bisection
// below), with gain margin √(1 + ω²)/2.
func TestProportionalDeadTimeHandDerived(t *testing.T) {
	l := Loop{Num: p(2), Den: p(1, 1), Delay: 1}
	m := mustMargins(t, l)
	check(t, "ωc", m.GainCrossover, math.Sqrt(3), 1e-11)
	pm := 2*math.Pi/3 - math.Sqrt(3)
	check(t, "PM", m.PhaseMargin, pm*deg, 1e-10)
	w180 := bisect(func(w float64) float64 { return w + math.Atan(w) - math.Pi }, 1, 3)
	check(t, "ω180", m.PhaseCrossover, w180, 1e-11)
	check(t, "GM", m.GainMargin, math.Sqrt(1+w180*w180)/2, 1e-10)
	// The next phase crossovers solve ω + atan ω = π + 2πk: each is listed
	// with its margin √(1 + ω²)/2.
	if len(m.PhaseCrossings) < 3 {
		t.Fatalf("phase crossings %v, want at least three", m.PhaseCrossings)
	}
	for k, c := range m.PhaseCrossings[:3] {
		want := bisect(func(w float64) float64 { return w + math.Atan(w) - math.Pi*float64(2*k+1) }, 0, 50)
		check(t, "ω of crossing", c.Freq, want, 1e-10)
		check(t, "GM of crossing", c.Margin, math.Sqrt(1+want*want)/2, 1e-9)
	}
}

// Integrator plus dead time k·e^(−Ls)/s, derived by hand: |L| = k/ω, so
// ωc = k and PM = π/2 − kL rad; arg L = −π/2 − ωL reaches −π − 2πm at
// ω_m = (π/2 + 2πm)/L, with gain margin ω_m/k (K. J. Åström and
// T. Hägglund, Advanced PID Control, ISA 2006, treat this process; the
// values here are derived by hand). The lowest twelve crossovers are
// listed.
func TestIntegratorDeadTime(t *testing.T) {
	for _, c := range []struct{ k, L float64 }{{0.5, 1}, {0.1, 3}, {2, 0.2}} {
		m := mustMargins(t, Loop{Num: p(c.k), Den: p(1, 0), Delay: c.L})
		check(t, "ωc", m.GainCrossover, c.k, 1e-11)
		check(t, "PM", m.PhaseMargin, (math.Pi/2-c.k*c.L)*deg, 1e-10)
		check(t, "GM", m.GainMargin, math.Pi/(2*c.k*c.L), 1e-10)
		if n := len(m.PhaseCrossings); n != maxListed {
			t.Errorf("k=%g L=%g: %d phase crossings listed, want %d", c.k, c.L, n, maxListed)
		}
		for i, x := range m.PhaseCrossings {
			w := (math.Pi/2 + 2*math.Pi*float64(i)) / c.L
			check(t, "ω_m", x.Freq, w, 1e-10)
			check(t, "GM_m", x.Margin, w/c.k, 1e-9)
		}
	}
}

// A constant loop b·e^(−Ls) with |b| < 1 has S = 1/(1 + b·e^(−jωL)), whose
// modulus swings between 1/(1 + b) and 1/(1 − b); derived by hand, the
// supremum is Ms = 1/(1 − b) and Mt = b/(1 − b), reached at ωL = π. The
// evaluator says the same, and with |b| ≥ 1 both are infinite (a neutral
// loop on or past its chain of roots).
func TestConstantLoopWithDelay(t *testing.T) {
	for _, b := range []float64{0.2, 0.5, 0.9} {
		l := Loop{Num: p(b), Den: p(1), Delay: 2}
		m := mustMargins(t, l)
		check(t, "Ms", m.Ms, 1/(1-b), 1e-9)
		check(t, "Mt", m.Mt, b/(1-b), 1e-9)
		ev, err := NewMsEvaluatorDelay(1e-2, 1e2, DefaultMsPerDecade, 2, DefaultMsSteps, nil, 2)
		if err != nil {
			t.Fatal(err)
		}
		check(t, "fast Ms", ev.Ms(l.Num, l.Den), 1/(1-b), 1e-9)
	}
	s, tt := limitWithDelay(p(1), p(1), 1)
	if !math.IsInf(s, 1) || !math.IsInf(tt, 1) {
		t.Errorf("limits for |b| = 1: %g, %g, want +Inf", s, tt)
	}
}

// bruteMs is the largest |S| on a dense grid: 2000 points per decade over
// [1e-4, 1e4] and points spaced so that the delay turns the phase by
// π/256 between them, up to 100, with no refinement. It is a lower bound
// of the supremum that owes nothing to the scan of Margins.
func bruteMs(l Loop) float64 {
	best := 0.0
	eval := func(w float64) {
		s := complex(0, w)
		v := l.Den.Eval(s) / (l.Den.Eval(s) + l.Num.Eval(s)*cmplx.Exp(complex(0, -w*l.Delay)))
		best = max(best, cmplx.Abs(v))
	}
	for i := 0; i <= 16000; i++ {
		eval(math.Pow(10, -4+float64(i)/2000))
	}
	step := math.Pi / 256 / l.Delay
	for w := step; w < 100; w += step {
		eval(w)
	}
	return best
}

// Ms of random stable loops with dead time: the refined value of Margins
// may not fall below the dense grid's (it refines every peak) nor exceed
// it by more than the grid's own coarseness; the fast evaluator may read
// low by at most 1e-3 relative, and never high.
func TestMsWithDelayAgainstDenseGrid(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	ev, err := NewMsEvaluatorDelay(1e-4, 1e3, DefaultMsPerDecade, 9, DefaultMsSteps, nil, 1)
	if err != nil {
		t.Fatal(err)
	}
	tested, worstFast := 0, 0.0
	for tested < 25 {
		l, ok := randomLoop(t, rng, 0.2)
		if !ok {
			continue
		}
		// A dead time of 1, and the gain lowered to half the gain margin
		// of the loop with it, so that the loop stays stable.
		l.Delay = 1
		m := mustMargins(t, l)
		if !Finite(m.GainMargin) || m.GainMargin <= 1 {
			continue
		}
		l.Num = l.Num.Scaled(0.5 * m.GainMargin)
		tested++
		m = mustMargins(t, l)
		brute := bruteMs(l)
		if m.Ms < brute*(1-1e-12) || m.Ms > brute*(1+1e-4) {
			t.Errorf("Ms %.12g, dense grid %.12g\nnum %v\nden %v", m.Ms, brute, l.Num, l.Den)
		}
		fast := ev.Ms(l.Num, l.Den)
		rel := (m.Ms - fast) / m.Ms
		worstFast = max(worstFast, math.Abs(rel))
		if rel > 1e-3 || rel < -1e-12 {
			t.Errorf("fast Ms %.12g, refined %.12g (rel %.2g)", fast, m.Ms, rel)
		}
	}
	t.Logf("fast evaluator: largest relative difference %.3g over %d loops", worstFast, tested)
}

// A dead time of zero changes nothing, and a tiny one next to nothing.
func TestTinyDelayMatchesRational(t *testing.T) {
	l := Loop{Num: p(4), Den: p(1, 3, 3, 1)} // 4/(s+1)³
	m0 := mustMargins(t, l)
	l.Delay = 1e-9
	m1 := mustMargins(t, l)
	check(t, "GM", m1.GainMargin, m0.GainMargin, 1e-7)
	check(t, "PM", m1.PhaseMargin, m0.PhaseMargin, 1e-7)
	check(t, "Ms", m1.Ms, m0.Ms, 1e-7)
	ev0, _ := NewMsEvaluator(1e-3, 1e3, DefaultMsPerDecade, 4, DefaultMsSteps)
	ev1, _ := NewMsEvaluatorDelay(1e-3, 1e3, DefaultMsPerDecade, 4, DefaultMsSteps, nil, 0)
	if a, b := ev0.Ms(l.Num, l.Den), ev1.Ms(l.Num, l.Den); a != b {
		t.Errorf("evaluators without delay differ: %g, %g", a, b)
	}
	if _, err := (Loop{Num: p(1), Den: p(1, 1), Delay: -1}).Margins(); err == nil {
		t.Error("a negative dead time was accepted")
	}
	if _, err := NewMsEvaluatorDelay(1, 10, 10, 2, 2, nil, math.NaN()); err == nil {
		t.Error("a NaN dead time was accepted")
	}
}

// The fast evaluator with dead time allocates nothing per call.
func TestMsEvaluatorDelayAllocs(t *testing.T) {
	ev, err := NewMsEvaluatorDelay(1e-3, 1e3, DefaultMsPerDecade, 4, DefaultMsSteps, nil, 1.5)
	if err != nil {
		t.Fatal(err)
	}
	num, den := poly.Poly{2}, poly.Poly{1, 5, 4}
	if a := testing.AllocsPerRun(50, func() { ev.Ms(num, den) }); a != 0 {
		t.Errorf("%g allocations per call", a)
	}
}

// bisect finds a zero of f in [a, b], where f changes sign, to 1e-15.
func bisect(f func(float64) float64, a, b float64) float64 {
	fa := f(a)
	for b-a > 1e-15*math.Max(1, math.Abs(a)) {
		m := 0.5 * (a + b)
		if fm := f(m); (fm > 0) == (fa > 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return 0.5 * (a + b)
}

// The fast evaluator with a dead time of 1 on a grid up to 100 rad/s (the
// equally spaced part adds about 500 frequencies), against the refined
// Margins of the same loops with that dead time: compare ns/op within one
// run.
func BenchmarkMsEvaluatorDelay(b *testing.B) {
	ls := benchLoops(b)
	ev, err := NewMsEvaluatorDelay(1e-4, 1e2, DefaultMsPerDecade, 9, DefaultMsSteps, nil, 1)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		l := ls[i&255]
		ev.Ms(l.Num, l.Den)
	}
}

func BenchmarkMarginsRefinedDelay(b *testing.B) {
	ls := benchLoops(b)
	for i := range ls {
		ls[i].Delay = 1
	}
	for i := 0; b.Loop(); i++ {
		if _, err := ls[i&255].Margins(); err != nil {
			b.Fatal(err)
		}
	}
}
