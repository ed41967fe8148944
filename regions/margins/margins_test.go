package margins

import (
	"encoding/json"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"gainscape/regions/poly"
)

const deg = 180 / math.Pi

// L = k/(s(s+1)).
//
// Phase: arg L(jω) = −90° − atan ω > −180° for every finite ω, so there is
// no phase crossover: GM = +Inf.
//
// Gain crossover: |L| = 1 ⇔ k = ω·sqrt(ω² + 1) ⇔ ω⁴ + ω² − k² = 0 ⇔
// ωc² = (−1 + sqrt(1 + 4k²))/2, and PM = 180° − 90° − atan ωc
// = 90° − atan ωc.
//
// Mt: T = k/(s² + s + k) is the standard second-order system with
// ωn = √k, 2ζωn = 1, ζ = 1/(2√k). For ζ < 1/√2 (k > 1/2) its resonant
// peak is Mt = 1/(2ζ·sqrt(1 − ζ²)) at ω = ωn·sqrt(1 − 2ζ²); otherwise |T|
// decreases from T(0) = 1 (the integrator) and Mt = 1 at ω = 0.
//
// Ms: S = s(s+1)/(s² + s + k), so with x = ω²
// |S|² = f(x) = (x² + x)/((k − x)² + x). f'(x) = 0 ⇔
// (2x+1)((k−x)² + x) − (x² + x)(2x + 1 − 2k) = 0; expanding, the cubic and
// x² terms cancel down to −2k·x² + 2k²·x + k² = 0, i.e.
// 2x² − 2k·x − k = 0, x* = (k + sqrt(k² + 2k))/2, Ms = sqrt(f(x*)) at
// ω = sqrt(x*). (S(0) = 0 and |S| → 1 as ω → ∞, and f(x*) > 1, so this is
// the maximum.)
func TestIntegratorPlusLag(t *testing.T) {
	for _, k := range []float64{0.3, 1, 2, 10, 100} {
		m := mustMargins(t, Loop{Num: p(k), Den: p(1, 1, 0)})
		if !math.IsInf(m.GainMargin, 1) || !math.IsNaN(m.PhaseCrossover) || len(m.PhaseCrossings) != 0 {
			t.Errorf("k=%g: GM %g at %g (%v), want +Inf, none", k, m.GainMargin, m.PhaseCrossover, m.PhaseCrossings)
		}
		wc := math.Sqrt((-1 + math.Sqrt(1+4*k*k)) / 2)
		check(t, "ωc", m.GainCrossover, wc, 1e-11)
		check(t, "PM", m.PhaseMargin, 90-math.Atan(wc)*deg, 1e-10)
		if len(m.GainCrossings) != 1 {
			t.Errorf("k=%g: gain crossings %v, want one", k, m.GainCrossings)
		}

		x := (k + math.Sqrt(k*k+2*k)) / 2
		ms := math.Sqrt((x*x + x) / ((k-x)*(k-x) + x))
		check(t, "Ms", m.Ms, ms, 1e-12)
		check(t, "Ms frequency", m.MsFreq, math.Sqrt(x), 1e-5)

		zeta := 1 / (2 * math.Sqrt(k))
		if zeta < 1/math.Sqrt2 {
			check(t, "Mt", m.Mt, 1/(2*zeta*math.Sqrt(1-zeta*zeta)), 1e-12)
			check(t, "Mt frequency", m.MtFreq, math.Sqrt(k)*math.Sqrt(1-2*zeta*zeta), 1e-5)
		} else {
			check(t, "Mt", m.Mt, 1, 1e-15)
			check(t, "Mt frequency", m.MtFreq, 0, 0)
		}
	}
}

// L = K/(s+1)³.
//
// Phase: arg L = −3·atan ω = −180° ⇔ atan ω = 60° ⇔ ω = √3, where
// |L| = K/(1 + 3)^(3/2) = K/8: GM = 8/K (so Ku = 8, Tu = 2π/√3).
// Gain crossover (K > 1): (1 + ω²)^(3/2) = K ⇔ ωc = sqrt(K^(2/3) − 1),
// PM = 180° − 3·atan ωc.
// Ms and Mt are compared with a dense brute-force evaluation of
// |1/(1+L)| and |L/(1+L)| by complex arithmetic on a uniform grid of step
// 1e-5 over [0, 10], which shares no code with Margins.
func TestThirdOrderLag(t *testing.T) {
	for _, K := range []float64{0.5, 2, 4, 6, 7.5} {
		l := Loop{Num: p(K), Den: p(1, 3, 3, 1)}
		m := mustMargins(t, l)
		check(t, "phase crossover", m.PhaseCrossover, math.Sqrt(3), 1e-11)
		check(t, "GM", m.GainMargin, 8/K, 1e-11)
		if K > 1 {
			wc := math.Sqrt(math.Pow(K, 2.0/3) - 1)
			check(t, "ωc", m.GainCrossover, wc, 1e-11)
			check(t, "PM", m.PhaseMargin, 180-3*math.Atan(wc)*deg, 1e-10)
		} else if !math.IsInf(m.PhaseMargin, 1) || !math.IsNaN(m.GainCrossover) {
			t.Errorf("K=%g: PM %g at %g, want +Inf, NaN", K, m.PhaseMargin, m.GainCrossover)
		}

		ms, mt, wms, wmt := bruteForcePeaks(K, 10, 1e-4)
		check(t, "Ms vs brute force", m.Ms, ms, 1e-9)
		check(t, "Mt vs brute force", m.Mt, mt, 1e-9)
		if wms > 0 {
			check(t, "Ms frequency", m.MsFreq, wms, 1e-3)
		}
		if wmt > 0 {
			check(t, "Mt frequency", m.MtFreq, wmt, 1e-3)
		}
	}
}

// bruteForcePeaks evaluates S and T of K/(s+1)³ on a uniform grid of
// step over [0, wmax], then again with step·1e-4 over two steps either side
// of each maximum found.
func bruteForcePeaks(K, wmax, step float64) (ms, mt, wms, wmt float64) {
	st := func(w float64) (float64, float64) {
		s := complex(1, w)
		l := complex(K, 0) / (s * s * s)
		return cmplx.Abs(1 / (1 + l)), cmplx.Abs(l / (1 + l))
	}
	for i := 0; float64(i)*step <= wmax; i++ {
		w := float64(i) * step
		vs, vt := st(w)
		if vs > ms {
			ms, wms = vs, w
		}
		if vt > mt {
			mt, wmt = vt, w
		}
	}
	cs, ct := wms, wmt
	for i := -20000; i <= 20000; i++ {
		if w := cs + float64(i)*step*1e-4; w >= 0 {
			if vs, _ := st(w); vs > ms {
				ms, wms = vs, w
			}
		}
		if w := ct + float64(i)*step*1e-4; w >= 0 {
			if _, vt := st(w); vt > mt {
				mt, wmt = vt, w
			}
		}
	}
	return
}

// L = k/(s(s+1)(s+2)): D(jω) = −3ω² + j(2ω − ω³). The phase crosses −180°
// where Im D = 0 with ω > 0: ω = √2, where D = −6 and L = −k/6: GM = 6/k.
// The characteristic polynomial s³ + 3s² + 2s + k is Hurwitz for
// 0 < k < 3·2 = 6 (Routh), consistent.
func TestIntegratorTwoLags(t *testing.T) {
	for _, k := range []float64{0.5, 1, 3, 5.9} {
		m := mustMargins(t, Loop{Num: p(k), Den: p(1, 3, 2, 0)})
		check(t, "phase crossover", m.PhaseCrossover, math.Sqrt2, 1e-11)
		check(t, "GM", m.GainMargin, 6/k, 1e-11)
		if m.PhaseMargin <= 0 {
			t.Errorf("k=%g: PM %g, want positive for a stable loop", k, m.PhaseMargin)
		}
	}
}

// L = 10/(s(s+1)(s+5)) (a standard textbook loop; the figures here are
// derived, not quoted). s³ + 6s² + 5s + K is Hurwitz for K < 30, with the
// imaginary pair at ω² = 5: GM = 30/10 = 3 (9.54 dB) at ω = √5.
// Gain crossover: ω²(ω² + 1)(ω² + 25) = 100, a cubic in x = ω²,
// x³ + 26x² + 25x − 100 = 0, solved here by eigenvalues (independent of
// the frequency scan); PM = 90° − atan ωc − atan(ωc/5).
func TestTextbookThirdOrder(t *testing.T) {
	m := mustMargins(t, NewLoop(p(1), p(1, 6, 5, 0), p(10), p(1)))
	check(t, "GM", m.GainMargin, 3, 1e-11)
	check(t, "GM dB", DB(m.GainMargin), 20*math.Log10(3), 1e-11)
	check(t, "phase crossover", m.PhaseCrossover, math.Sqrt(5), 1e-11)
	xs, err := p(1, 26, 25, -100).Roots()
	if err != nil {
		t.Fatal(err)
	}
	var wc float64
	for _, x := range xs {
		if imag(x) == 0 && real(x) > 0 {
			wc = math.Sqrt(real(x))
		}
	}
	check(t, "ωc", m.GainCrossover, wc, 1e-10)
	check(t, "PM", m.PhaseMargin, 90-math.Atan(wc)*deg-math.Atan(wc/5)*deg, 1e-9)
	if m.PhaseMargin < 25 || m.PhaseMargin > 26 {
		t.Errorf("PM = %g°, expected about 25.4°", m.PhaseMargin)
	}
}

// L = k/(s + a), a > 0: arg L = −atan(ω/a) > −90°: GM = +Inf.
// |L| = 1 at ωc = sqrt(k² − a²) (k > a), PM = 180° − atan(ωc/a).
// S = (s + a)/(s + a + k): |S|² = (ω² + a²)/(ω² + (a+k)²) increases to 1,
// so Ms = 1 as ω → ∞ (reported at +Inf). T = k/(s + a + k): |T| decreases
// from k/(a + k), so Mt = k/(a + k) at ω = 0.
//
// L = k/(s − a), a < k < 2a (open-loop unstable, closed loop s − a + k
// stable): L(0) = −k/a is real negative, a phase crossover at ω = 0 with
// GM = a/k < 1 (lowering the gain below a destabilises); arg L =
// −180° + atan(ω/a) never returns to −180°. |L| = 1 at ωc = sqrt(k² − a²),
// PM = atan(ωc/a). |S|² = (ω² + a²)/(ω² + (k − a)²) decreases from
// a²/(k−a)² because a > k − a: Ms = a/(k − a) at ω = 0.
func TestFirstOrder(t *testing.T) {
	for _, c := range []struct{ k, a float64 }{{3, 1}, {0.5, 2}, {10, 0.1}} {
		m := mustMargins(t, Loop{Num: p(c.k), Den: p(1, c.a)})
		if !math.IsInf(m.GainMargin, 1) {
			t.Errorf("k=%g a=%g: GM = %g, want +Inf", c.k, c.a, m.GainMargin)
		}
		if c.k > c.a {
			wc := math.Sqrt(c.k*c.k - c.a*c.a)
			check(t, "ωc", m.GainCrossover, wc, 1e-11)
			check(t, "PM", m.PhaseMargin, 180-math.Atan(wc/c.a)*deg, 1e-10)
		}
		check(t, "Ms", m.Ms, 1, 1e-15)
		if !math.IsInf(m.MsFreq, 1) {
			t.Errorf("Ms frequency %g, want +Inf", m.MsFreq)
		}
		check(t, "Mt", m.Mt, c.k/(c.a+c.k), 1e-15)
		check(t, "Mt frequency", m.MtFreq, 0, 0)
	}
	k, a := 1.5, 1.0
	m := mustMargins(t, Loop{Num: p(k), Den: p(1, -a)})
	if len(m.PhaseCrossings) != 1 || m.PhaseCrossings[0].Freq != 0 {
		t.Fatalf("phase crossings %v, want one at ω = 0", m.PhaseCrossings)
	}
	check(t, "GM", m.GainMargin, a/k, 1e-15)
	wc := math.Sqrt(k*k - a*a)
	check(t, "ωc", m.GainCrossover, wc, 1e-11)
	check(t, "PM", m.PhaseMargin, math.Atan(wc/a)*deg, 1e-10)
	check(t, "Ms", m.Ms, a/(k-a), 1e-15)
	check(t, "Ms frequency", m.MsFreq, 0, 0)
}

// L = k/s²: no root away from the origin in the open loop; the default
// range must come from the closed-loop poles ±j√k. |L| = 1 at ω = √k with
// arg L = −180°: PM = 0.
func TestDoubleIntegrator(t *testing.T) {
	for _, k := range []float64{1e-4, 1, 1e4} {
		m := mustMargins(t, Loop{Num: p(k), Den: p(1, 0, 0)})
		check(t, "ωc", m.GainCrossover, math.Sqrt(k), 1e-11)
		check(t, "PM", m.PhaseMargin, 0, 1e-9)
	}
}

// L = K(s+1)²/(s³(s+10)²): two phase crossovers.
// arg L = −270° + 2·atan ω − 2·atan(ω/10) = −180° ⇔
// atan ω − atan(ω/10) = 45° ⇔ (ω − ω/10)/(1 + ω²/10) = 1 ⇔
// ω² − 9ω + 10 = 0 ⇔ ω = (9 ∓ √41)/2. There
// |L| = K(1 + ω²)/(ω³(100 + ω²)), GM = 1/|L|. For K = 100 the lower one
// gives GM ≈ 0.83 (−1.6 dB) and the upper GM ≈ 12 (21.6 dB); the reported
// margin is the one nearer 0 dB, the lower.
func TestTwoPhaseCrossovers(t *testing.T) {
	K := 100.0
	l := Loop{Num: poly.Mul(p(K), p(1, 2, 1)), Den: poly.Mul(p(1, 0, 0, 0), p(1, 20, 100))}
	m := mustMargins(t, l)
	if len(m.PhaseCrossings) != 2 {
		t.Fatalf("phase crossings %v, want two", m.PhaseCrossings)
	}
	gm := func(w float64) float64 { return w * w * w * (100 + w*w) / (K * (1 + w*w)) }
	w1, w2 := (9-math.Sqrt(41))/2, (9+math.Sqrt(41))/2
	check(t, "ω1", m.PhaseCrossings[0].Freq, w1, 1e-11)
	check(t, "ω2", m.PhaseCrossings[1].Freq, w2, 1e-11)
	check(t, "GM1", m.PhaseCrossings[0].Margin, gm(w1), 1e-10)
	check(t, "GM2", m.PhaseCrossings[1].Margin, gm(w2), 1e-10)
	check(t, "reported GM", m.GainMargin, gm(w1), 1e-10)
	check(t, "reported ω", m.PhaseCrossover, w1, 1e-11)
}

// exactCrossings computes the crossovers of num/den without any frequency
// scan: phase crossovers are the positive real roots ω of
// Im(N(jω)·conj D(jω)) (odd in ω, so a polynomial in ω² after dividing by
// ω) with Re(N·conj D) < 0; gain crossovers are the positive real roots of
// |N(jω)|² − |D(jω)|², a polynomial in ω².
func exactCrossings(t *testing.T, num, den poly.Poly) (phase, gain []float64) {
	nr, ni := splitJW(num)
	dr, di := splitJW(den)
	im := poly.Sub(poly.Mul(ni, dr), poly.Mul(nr, di))
	mag := poly.Sub(poly.Add(poly.Mul(nr, nr), poly.Mul(ni, ni)), poly.Add(poly.Mul(dr, dr), poly.Mul(di, di)))
	var imx, magx poly.Poly
	for j := 1; j < len(im); j += 2 {
		imx = append(imx, im[j])
	}
	for j := 0; j < len(mag); j += 2 {
		magx = append(magx, mag[j])
	}
	pos := func(q poly.Poly) []float64 {
		q = q.Trim(1e-13)
		if q.Degree() < 1 {
			return nil
		}
		xs, err := q.Roots()
		if err != nil {
			t.Fatal(err)
		}
		var ws []float64
		for _, x := range xs {
			if real(x) > 0 && math.Abs(imag(x)) <= 1e-9*cmplx.Abs(x) {
				ws = append(ws, math.Sqrt(q.PolishReal(real(x))))
			}
		}
		slices.Sort(ws)
		return ws
	}
	l := Loop{Num: num, Den: den}
	for _, w := range pos(imx) {
		if real(l.At(w)) < 0 {
			phase = append(phase, w)
		}
	}
	return phase, pos(magx)
}

// TestCrossingsAgreeWithExactRoute compares every crossover found by the
// frequency scan with the exact polynomial route on 400 random loops:
// plants of degree 1-6 with stable poles, 0-2 zeros (either half plane),
// and PI/PID-like controllers, at random gains. Loops whose crossing
// polynomials have near-double roots (tangencies, where either route is
// ill-conditioned) are skipped and counted.
func TestCrossingsAgreeWithExactRoute(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	skipped, multi := 0, 0
	for trial := 0; trial < 400; trial++ {
		nd := 1 + trial%6
		den := poly.FromRoots(stableRoots(rng, nd, 0.05, 1.5))
		var zs []complex128
		for range rng.IntN(min(nd, 3)) {
			z := complex(math.Exp(3*rng.Float64()-1.5), 0)
			if rng.IntN(2) == 0 {
				z = -z
			}
			zs = append(zs, z)
		}
		num := poly.FromRoots(zs).Scaled(math.Exp(6*rng.Float64() - 3))
		switch trial % 3 {
		case 1: // PI: (s + z)/s
			num = poly.Mul(num, poly.Poly{math.Exp(2*rng.Float64() - 1), 1})
			den = poly.Mul(den, poly.Poly{0, 1})
		case 2: // PID with filter: (s² + a s + b)/(s (τ s + 1))
			num = poly.Mul(num, poly.FromRoots(stableRoots(rng, 2, 0.3, 1)))
			den = poly.Mul(den, poly.Poly{0, 1, 0.05})
		}
		phase, gain := exactCrossings(t, num, den)
		if nearDouble(phase) || nearDouble(gain) {
			skipped++
			continue
		}
		if len(phase) > 1 || len(gain) > 1 {
			multi++
		}
		m := mustMargins(t, Loop{Num: num, Den: den})
		var got []float64
		for _, c := range m.PhaseCrossings {
			if c.Freq > 0 {
				got = append(got, c.Freq)
			}
		}
		if !sameFreqs(got, phase) {
			t.Errorf("trial %d: phase crossovers %v, exact %v\nnum %v\nden %v", trial, got, phase, num, den)
		}
		got = got[:0]
		for _, c := range m.GainCrossings {
			got = append(got, c.Freq)
		}
		if !sameFreqs(got, gain) {
			t.Errorf("trial %d: gain crossovers %v, exact %v\nnum %v\nden %v", trial, got, gain, num, den)
		}
	}
	if skipped > 40 {
		t.Errorf("%d of 400 loops skipped as near-tangent", skipped)
	}
	// The comparison proves little unless some loops cross more than once.
	if multi < 20 {
		t.Errorf("only %d loops with several crossovers", multi)
	}
	t.Logf("%d of 400 loops skipped as near-tangent, %d with several crossovers", skipped, multi)
}

func nearDouble(ws []float64) bool {
	for i := 1; i < len(ws); i++ {
		if ws[i]-ws[i-1] < 1e-2*ws[i] {
			return true
		}
	}
	return false
}

func sameFreqs(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if !closeTo(a[i], b[i], 1e-9) && math.Abs(a[i]-b[i]) > 1e-9*b[i] {
			return false
		}
	}
	return true
}

func TestMarginsJSON(t *testing.T) {
	m := mustMargins(t, Loop{Num: p(2), Den: p(1, 1, 0)})
	b, err := json.Marshal(m)
	if err != nil {
		t.Fatal(err)
	}
	s := string(b)
	for _, want := range []string{`"gain_margin":null`, `"phase_crossover":null`, `"phase_crossings":[]`} {
		if !strings.Contains(s, want) {
			t.Errorf("JSON %s lacks %s", s, want)
		}
	}
	if strings.Contains(s, `"phase_margin_deg":null`) || strings.Contains(s, `"ms":null`) {
		t.Errorf("JSON %s has null for a finite figure", s)
	}
	if Finite(math.Inf(1)) || Finite(math.NaN()) || !Finite(3) || Nullable(math.Inf(1)) != nil || *Nullable(2) != 2 {
		t.Error("Finite/Nullable")
	}
}

func TestMarginsErrors(t *testing.T) {
	if _, err := (Loop{Num: p(1), Den: poly.Poly{}}).Margins(); err == nil {
		t.Error("zero denominator accepted")
	}
	if _, err := (Loop{Num: p(math.NaN()), Den: p(1, 1)}).Margins(); err == nil {
		t.Error("NaN accepted")
	}
	// L = 0: nothing crosses, S = 1, T = 0.
	m := mustMargins(t, Loop{Num: poly.Poly{0}, Den: p(1, 1)})
	if !math.IsInf(m.GainMargin, 1) || !math.IsInf(m.PhaseMargin, 1) || m.Ms != 1 || m.Mt != 0 {
		t.Errorf("L = 0: %+v", m)
	}
}

func TestEvalJW(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for n := 0; n < 9; n++ {
		q := make(poly.Poly, n)
		for i := range q {
			q[i] = rng.NormFloat64()
		}
		for _, w := range []float64{0, 0.3, 1, 2.7} {
			re, im := evalJW(q, w)
			want := q.Eval(complex(0, w))
			if cmplx.Abs(complex(re, im)-want) > 1e-12*(1+cmplx.Abs(want)) {
				t.Errorf("n=%d ω=%g: %v, want %v", n, w, complex(re, im), want)
			}
		}
	}
}

// A lightly damped resonance narrower than the grid spacing:
// L = k·ωn²/(s(s² + 2ζωn·s + ωn²)). At ω = ωn the quadratic factor is
// j·2ζωn², so L(jωn) = k·ωn²/(jωn·j·2ζωn²) = −k/(2ζωn): a phase crossover
// at ωn with GM = 2ζωn/k. With ζ = 1e-3 and ωn = 10 the resonance is
// 0.02 rad/s wide against a grid spacing of 0.23 rad/s there.
// Ms is compared with a dense evaluation (step 1e-6 across the resonance).
func TestNarrowResonance(t *testing.T) {
	zeta, wn, k := 1e-3, 10.0, 1e-3
	l := Loop{Num: p(k * wn * wn), Den: p(1, 2*zeta*wn, wn*wn, 0)}
	m := mustMargins(t, l)
	check(t, "phase crossover", m.PhaseCrossover, wn, 1e-11)
	check(t, "GM", m.GainMargin, 2*zeta*wn/k, 1e-10)
	ms := 0.0
	for w := 9.9; w <= 10.1; w += 1e-6 {
		ms = max(ms, cmplx.Abs(1/(1+l.At(w))))
	}
	if m.Ms < ms*(1-1e-9) || m.Ms > ms*(1+1e-6) {
		t.Errorf("Ms = %.12g, dense evaluation %.12g", m.Ms, ms)
	}
}
