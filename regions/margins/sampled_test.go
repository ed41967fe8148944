package margins

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
	"gainscape/regions/unitcircle"
	"gainscape/regions/zoh"
)

// held returns the zero-order-hold discretisation of num/den (descending
// coefficients) with sample time T.
func held(t *testing.T, num, den []float64, T float64) (poly.Poly, poly.Poly) {
	t.Helper()
	nz, dz, err := zoh.Discretise(poly.FromDescending(num), poly.FromDescending(den), T, 0)
	if err != nil {
		t.Fatal(err)
	}
	return nz, dz
}

// direct is the reference of these tests: L(e^(jωT)) written out with
// math/cmplx, independent of the package's evaluation.
func direct(num, den poly.Poly, T, w float64) complex128 {
	z := cmplx.Exp(complex(0, w*T))
	horner := func(p poly.Poly) complex128 {
		var r complex128
		for k := len(p) - 1; k >= 0; k-- {
			r = r*z + complex(p[k], 0)
		}
		return r
	}
	return horner(num) / horner(den)
}

// directFigures scans L(e^(jωT)) on n equal steps of (0, π/T] and refines
// by bisection every sign change of Im L with Re L < 0 (a phase crossover)
// and of |L| − 1 (a gain crossover); it returns the gain margin nearest
// 0 dB, the phase margin of least magnitude and the largest |1/(1 + L)|
// on the grid, the ends ω = 0⁺ and π/T included.
func directFigures(num, den poly.Poly, T float64, n int) (gm, pm, ms float64) {
	gm, pm = math.Inf(1), math.Inf(1)
	top := math.Pi / T
	imL := func(w float64) float64 { return imag(direct(num, den, T, w)) }
	magL := func(w float64) float64 { return cmplx.Abs(direct(num, den, T, w)) - 1 }
	bisect := func(f func(float64) float64, a, b float64) float64 {
		fa := f(a)
		for range 100 {
			m := 0.5 * (a + b)
			if (f(m) > 0) == (fa > 0) {
				a, fa = m, f(m)
			} else {
				b = m
			}
		}
		return 0.5 * (a + b)
	}
	prev := 1e-9 * top
	for i := 1; i <= n; i++ {
		w := top * float64(i) / float64(n)
		l0, l1 := direct(num, den, T, prev), direct(num, den, T, w)
		ms = math.Max(ms, 1/cmplx.Abs(1+l1))
		if (imag(l0) > 0) != (imag(l1) > 0) {
			x := bisect(imL, prev, w)
			if l := direct(num, den, T, x); real(l) < 0 {
				if g := 1 / cmplx.Abs(l); math.Abs(math.Log(g)) < math.Abs(math.Log(gm)) {
					gm = g
				}
			}
		}
		if (cmplx.Abs(l0) > 1) != (cmplx.Abs(l1) > 1) {
			x := bisect(magL, prev, w)
			ph := 180 + cmplx.Phase(direct(num, den, T, x))*180/math.Pi
			if ph > 180 {
				ph -= 360
			}
			if math.Abs(ph) < math.Abs(pm) {
				pm = ph
			}
		}
		prev = w
	}
	// L(1) and L(−1) are real: a crossover at ω = 0 or π/T exactly when
	// it is negative.
	for _, w := range []float64{0, top} {
		if l := real(direct(num, den, T, w)); l < 0 && math.Abs(math.Log(-1/l)) < math.Abs(math.Log(gm)) {
			gm = -1 / l
		}
	}
	return gm, pm, ms
}

// TestSampledMarginsAgainstDirectEvaluation compares the margins and Ms
// of invented held plants under invented gains with directFigures.
func TestSampledMarginsAgainstDirectEvaluation(t *testing.T) {
	cases := []struct {
		name     string
		num, den []float64
		T, k     float64
	}{
		{"integrator and lag", []float64{1}, []float64{1, 1, 0}, 1, 1},
		{"integrator and lag, fast", []float64{1}, []float64{1, 1, 0}, 0.05, 2},
		{"third-order lag", []float64{2}, []float64{1, 3, 3, 1}, 0.3, 1.5},
		{"resonance", []float64{4}, []float64{1, 0.4, 4}, 0.2, 0.3},
		{"lead zero", []float64{1, 2}, []float64{1, 6, 11, 6}, 0.4, 2.5},
		{"open-loop unstable", []float64{1}, []float64{1, 1, -2}, 0.1, 4},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			nz, dz := held(t, c.num, c.den, c.T)
			nz = nz.Scaled(c.k)
			m, err := SampledLoop{Num: nz, Den: dz, T: c.T}.Margins()
			if err != nil {
				t.Fatal(err)
			}
			gm, pm, ms := directFigures(nz, dz, c.T, 20000)
			// Crossovers are refined to 1e-12 in ω by both; 1e-6 allows
			// for the conditioning of the phase near a crossover. The grid
			// maximum of the reference lies below the refined peak by at
			// most its spacing squared times the curvature: 1e-4 here.
			check(t, "gain margin", m.GainMargin, gm, 1e-6)
			check(t, "phase margin", m.PhaseMargin, pm, 1e-6)
			if !(m.Ms >= ms*(1-1e-12)) || m.Ms > ms*(1+1e-4) {
				t.Errorf("Ms = %.10g, direct grid maximum %.10g", m.Ms, ms)
			}
			if m.MsFreq < 0 || m.MsFreq > math.Pi/c.T {
				t.Errorf("Ms at ω = %g, outside [0, π/T]", m.MsFreq)
			}
		})
	}
}

// TestSampledMarginAtHalfTheSampleRate checks a phase crossover exactly at
// ω = π/T. Derived by hand in this test: K/(s + 1) held with sample time T
// is K(1 − a)/(z − a), a = e^(−T); at z = −1 it is −K(1 − a)/(1 + a), real
// and negative, so the gain margin is (1 + a)/((1 − a)K) = coth(T/2)/K
// there, which is where the interval test finds the loop's limit.
func TestSampledMarginAtHalfTheSampleRate(t *testing.T) {
	for _, T := range []float64{0.01, 0.5, 3} {
		nz, dz := held(t, []float64{1}, []float64{1, 1}, T)
		const k = 0.7
		m, err := SampledLoop{Num: nz.Scaled(k), Den: dz, T: T}.Margins()
		if err != nil {
			t.Fatal(err)
		}
		want := 1 / math.Tanh(T/2) / k
		check(t, "gain margin", m.GainMargin, want, 1e-12)
		check(t, "phase crossover", m.PhaseCrossover, math.Pi/T, 1e-15)
		if n := len(m.PhaseCrossings); n != 1 {
			t.Errorf("T = %g: %d phase crossovers, want 1 at π/T: %v", T, n, m.PhaseCrossings)
		}
	}
}

// TestSampledUltimateOgata checks the ultimate gain and period of
// K/(s(s+1)) under a zero-order hold against the values derived by hand
// in regions/study (TestVaryOgataGainLimit; K. Ogata, Discrete-Time
// Control Systems, from memory: K < 2.3925 at T = 1 s from rounded
// coefficients): with a = e^(−T), a pair reaches the circle at
// K = (1 − a)/(1 − a − T·a), cos θ = −(K(T − 1 + a) − (1 + a))/2, and a
// real root reaches z = −1 at K = 2(1 + a)/(T(1 + a) − 2(1 − a)), the
// smaller of the two for T above about 3.3. The gain margin at K = 1 is
// the ultimate gain.
func TestSampledUltimateOgata(t *testing.T) {
	for _, T := range []float64{0.05, 0.5, 1, 2, 5} {
		nz, dz := held(t, []float64{1}, []float64{1, 1, 0}, T)
		ku, tu, kind, ok := SampledUltimate(nz, dz, T, unitcircle.Test{T: T})
		if !ok {
			t.Fatalf("T = %g: no ultimate gain", T)
		}
		a := math.Exp(-T)
		kc := (1 - a) / (1 - a - T*a)
		ka := 2 * (1 + a) / (T*(1+a) - 2*(1-a))
		wantK, wantKind := kc, stability.Complex
		wantT := 2 * math.Pi * T / math.Acos(-(kc*(T-1+a)-(1+a))/2)
		if ka < kc {
			wantK, wantKind, wantT = ka, stability.Alternating, 2*T
		}
		// The candidate gain is exact up to the rounding of the held
		// plant's coefficients: 1e-10 relative.
		check(t, "ultimate gain", ku, wantK, 1e-10)
		check(t, "ultimate period", tu, wantT, 1e-8)
		if kind != wantKind {
			t.Errorf("T = %g: crossing %v, want %v", T, kind, wantKind)
		}
		m, err := SampledLoop{Num: nz, Den: dz, T: T}.Margins()
		if err != nil {
			t.Fatal(err)
		}
		check(t, "gain margin at K = 1", m.GainMargin, wantK, 1e-9)
	}
}

// TestSampledUltimateFirstOrder checks two loops derived by hand in this
// test. A held integrator K/s is K·T/(z − 1): its root z = 1 − K·T leaves
// through z = −1 at K = 2/T, an alternating limit with period 2T. A held
// unstable lag 1/(s − 1) is (e^T − 1)/(z − e^T): its root
// e^T − K(e^T − 1) lies in (−1, 1) only for 1 < K < coth(T/2): the loop
// is stable from K = 1, where the root enters through z = 1, and the
// ultimate gain is coth(T/2), alternating, as for a continuous loop the
// first oscillatory loss of stability is (that the ultimate-cycle rules
// do not apply to such a plant is the probe's to say).
func TestSampledUltimateFirstOrder(t *testing.T) {
	const T = 0.25
	nz, dz := held(t, []float64{1}, []float64{1, 0}, T)
	ku, tu, kind, ok := SampledUltimate(nz, dz, T, unitcircle.Test{T: T})
	if !ok || kind != stability.Alternating {
		t.Fatalf("K/s held: ok %v, kind %v; want an alternating limit", ok, kind)
	}
	check(t, "ultimate gain", ku, 2/T, 1e-12)
	check(t, "ultimate period", tu, 2*T, 1e-12)
	nz, dz = held(t, []float64{1}, []float64{1, -1}, T)
	ku, tu, kind, ok = SampledUltimate(nz, dz, T, unitcircle.Test{T: T})
	if !ok || kind != stability.Alternating {
		t.Fatalf("1/(s − 1) held: ok %v, kind %v; want an alternating limit", ok, kind)
	}
	check(t, "ultimate gain", ku, 1/math.Tanh(T/2), 1e-12)
	check(t, "ultimate period", tu, 2*T, 1e-12)
}

// TestSampledMsEvaluatorAgainstMargins compares the fast evaluator with
// SampledLoop.Margins on invented random stable loops.
func TestSampledMsEvaluatorAgainstMargins(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	worst := 0.0
	for trial := 0; trial < 150; trial++ {
		T := math.Exp(-3 + 3*rng.Float64())
		n := 1 + rng.IntN(4)
		den := poly.FromRoots(stableRoots(rng, n, 0.1, 1.5))
		nz, dz, err := zoh.Discretise(poly.Poly{den[0]}, den, T, 0)
		if err != nil {
			t.Fatal(err)
		}
		nz = nz.Scaled(0.2 + 2*rng.Float64())
		l := SampledLoop{Num: nz, Den: dz, T: T}
		if !(unitcircle.Test{T: T}).NewCounter(len(dz)).Count(stability.Function{P: l.Characteristic()}).Stable() {
			continue
		}
		m, err := l.Margins()
		if err != nil {
			t.Fatal(err)
		}
		lo, _ := l.FrequencyRange()
		ev, err := NewSampledMsEvaluator(T, lo, DefaultMsPerDecade, len(dz), DefaultMsSteps, l.EquivalentRoots())
		if err != nil {
			t.Fatal(err)
		}
		got := ev.Ms(nz, dz)
		rel := (m.Ms - got) / m.Ms
		worst = math.Max(worst, math.Abs(rel))
		// One-sided, within 1e-3 (the bound MsEvaluator's tests use).
		if rel < -1e-12 || rel > 1e-3 {
			t.Fatalf("trial %d (T = %g): evaluator Ms %.10g, Margins %.10g", trial, T, got, m.Ms)
		}
		if allocs := testing.AllocsPerRun(3, func() { ev.Ms(nz, dz) }); allocs != 0 {
			t.Fatalf("Ms allocates %v times per call", allocs)
		}
	}
	t.Logf("largest relative difference %.2g", worst)
}

// TestSampledMarginsFastSampling checks a third-order lag sampled a
// hundred and a thousand times faster than its dynamics, where the roots
// of the held plant crowd z = 1. A hold acts like half a sample of dead
// time at low frequency (common practice): the gain crossover and Ms stay
// those of the continuous loop to O(ωT), and the phase margin drops by
// ωc·T/2. The held plant's coefficients carry their own rounding, which
// at z = 1 is about T^−3 times the unit roundoff relative to the values
// there; an order or a rate much beyond these leaves double precision
// nothing to work with, in this test and in the stability test alike.
func TestSampledMarginsFastSampling(t *testing.T) {
	const k = 4.0
	den := []float64{1, 3, 3, 1}
	c := mustMargins(t, Loop{Num: p(k), Den: p(den...)})
	for _, T := range []float64{1e-2, 1e-3} {
		nz, dz := held(t, []float64{k}, den, T)
		m, err := SampledLoop{Num: nz, Den: dz, T: T}.Margins()
		if err != nil {
			t.Fatal(err)
		}
		// O(ωT) differences: 2ωT relative, ω about √3.
		check(t, "gain crossover", m.GainCrossover, c.GainCrossover, 4*T)
		check(t, "Ms", m.Ms, c.Ms, 4*T)
		check(t, "gain margin", m.GainMargin, c.GainMargin, 4*T)
		drop := c.GainCrossover * T / 2 * 180 / math.Pi
		// The half-sample rule holds to O((ωc·T)²) in the phase: 0.01 of
		// the drop, and the crossover moves by O(T).
		if d := c.PhaseMargin - m.PhaseMargin; math.Abs(d-drop) > 0.02*drop {
			t.Errorf("T = %g: phase margin drops by %.6g°, want ωc·T/2 = %.6g°", T, d, drop)
		}
	}
}
