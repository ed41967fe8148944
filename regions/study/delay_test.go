package study

import (
	"context"
	"math"
	"math/cmplx"
	"strings"
	"testing"

	"gainscape/regions/delay"
	"gainscape/regions/export"
	"gainscape/regions/spec"
)

func probeOf(t *testing.T, plant, ctrl string, pade int, vals ...spec.Value) *export.Probe {
	t.Helper()
	rep, err := Probe(context.Background(), ProbeRequest{Loop: LoopSpec{Plant: plant, Controller: ctrl, Fixed: vals}, Pade: pade})
	if err != nil {
		t.Fatal(err)
	}
	return rep.Doc
}

// rootIn returns the zero of f in [a, b], where f changes sign, by
// bisection to rounding.
func rootIn(f func(float64) float64, a, b float64) float64 {
	fa := f(a)
	for range 200 {
		m := 0.5 * (a + b)
		if fm := f(m); (fm > 0) == (fa > 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return 0.5 * (a + b)
}

// alphaOne is the root in (π/2, π) of tan α = −r·α, that is of
// sin α + r·α·cos α.
func alphaOne(r float64) float64 {
	return rootIn(func(a float64) float64 { return math.Sin(a) + r*a*math.Cos(a) }, math.Pi/2, math.Pi)
}

// TestProbeDelayMarginHandDerived: P with kp = 2 on e^(−s)/(s + 1), derived
// by hand: |L(jω)| = 2/√(1 + ω²) = 1 at ω = √3; arg L = −atan ω − ω, so
// the phase margin is π − atan √3 − √3 = 2π/3 − √3 rad and the delay
// margin that over √3 (checked to 1e-9). The ultimate gain is that of
// Silva, Datta and Bhattacharyya's closed form with k = T = L = 1,
// Ku = √(α1² + 1), tan α1 = −α1, at ω = α1 (PID Controllers for
// Time-Delay Systems, Birkhäuser 2005).
func TestProbeDelayMarginHandDerived(t *testing.T) {
	d := probeOf(t, "exp(-s)/(s+1)", "p", 0, spec.Value{Param: "kp", V: 2})
	if !d.Stable || d.RHP != 0 || len(d.SignArray) != 0 || len(d.Working) == 0 || d.Delay != 1 {
		t.Fatalf("stable %v, rhp %d, sign array %d rows, working %d rows, delay %g", d.Stable, d.RHP, len(d.SignArray), len(d.Working), d.Delay)
	}
	pm := 2*math.Pi/3 - math.Sqrt(3)
	if len(d.DelayMargins) != 1 {
		t.Fatalf("delay margins %+v, want one gain crossover", d.DelayMargins)
	}
	dm := d.DelayMargins[0]
	if math.Abs(dm.Freq-math.Sqrt(3)) > 1e-9 || math.Abs(dm.PhaseMarginDeg-pm*180/math.Pi) > 1e-9 ||
		math.Abs(dm.Extra-pm/math.Sqrt(3)) > 1e-9 || math.Abs(float64(d.DelayMargin)-pm/math.Sqrt(3)) > 1e-9 {
		t.Errorf("delay margin %+v (smallest %v), want %.12g s at ω = √3 with PM %.12g°", dm, d.DelayMargin, pm/math.Sqrt(3), pm*180/math.Pi)
	}
	a := alphaOne(1)
	if d.Ultimate == nil || math.Abs(d.Ultimate.Ku-math.Sqrt(a*a+1)) > 1e-8 || math.Abs(d.Ultimate.Tu-2*math.Pi/a) > 1e-8 {
		t.Errorf("ultimate %+v, want Ku %.12g, Tu %.12g", d.Ultimate, math.Sqrt(a*a+1), 2*math.Pi/a)
	}
	// The rules are checked with the count of the loop with dead time:
	// each rule's verdict must match the rightmost roots of its loop
	// (delay.Rightmost, a method independent of the count).
	for _, r := range d.Ultimate.Rules {
		vals := []spec.Value{{Param: "kp", V: r.Kp}}
		if r.Family != "p" {
			vals = append(vals, spec.Value{Param: "ki", V: r.Ki})
		}
		if r.Family == "pid" {
			vals = append(vals, spec.Value{Param: "kd", V: r.Kd})
		}
		l, err := LoopSpec{Plant: "exp(-s)/(s+1)", Controller: r.Family, Fixed: vals}.Build()
		if err != nil {
			t.Fatal(err)
		}
		if _, neutral := delay.ChainAbscissa(l.Function()); neutral {
			continue // the ideal PID on a first-order plant: the chain decides
		}
		roots, err := delay.Rightmost(l.Function(), 2)
		if err != nil {
			t.Fatal(err)
		}
		if stable := delay.DecayRate(roots) > 0; stable != r.Stable {
			t.Errorf("%s: reported stable %v, rightmost root %v", r.Name, r.Stable, roots[0])
		}
	}
	// The gain margin: the phase crossover solves ω + atan ω = π, that is
	// ω = α1, with |L| = 2/√(1 + α1²).
	if math.Abs(float64(d.PhaseCrossover)-a) > 1e-9 || math.Abs(float64(d.GainMargin)-math.Sqrt(1+a*a)/2) > 1e-9 {
		t.Errorf("gain margin %v at %v, want %.12g at %.12g", d.GainMargin, d.PhaseCrossover, math.Sqrt(1+a*a)/2, a)
	}
	// The rightmost roots: a pair whose real part is the decay rate, and
	// each a root of Δ.
	if len(d.Poles) < 2 || d.PolesFrom != polesByCollocation || !(d.DecayRate > 0) {
		t.Fatalf("poles %v (%s), decay %v", d.Poles, d.PolesFrom, d.DecayRate)
	}
	for _, p := range d.Poles {
		s := complex(p[0], p[1])
		v := (s + 1) + 2*cmplx.Exp(-s)
		if cmplx.Abs(v) > 1e-9*(cmplx.Abs(s+1)+2*cmplx.Abs(cmplx.Exp(-s))) {
			t.Errorf("pole %v: |Δ| = %g", s, cmplx.Abs(v))
		}
	}
}

// TestPadeReportFirstOrderDeadTime: the P limit of e^(−s)/(s + 1) from a
// first-order Padé approximant, derived by hand: e^(−s) ≈ (1 − s/2)/(1 + s/2)
// gives (s + 1)(1 + s/2) + kp(1 − s/2) = s²/2 + (3 − kp)s/2 + 1 + kp, which
// the sign array calls stable for −1 < kp < 3; the exact limit is
// Ku = √(α1² + 1) ≈ 2.2618 (above), so order 1 overstates it by about a
// third (32.6%). Order 3 is well within 1%. Both the probe's ultimate
// gain and the interval ends of --vary report it, and their notes say so.
func TestPadeReportFirstOrderDeadTime(t *testing.T) {
	a := alphaOne(1)
	ku := math.Sqrt(a*a + 1)
	for _, c := range []struct {
		order  int
		lo, hi float64 // bounds on the relative error
	}{{1, 0.32, 0.33}, {3, 0, 0.01}} {
		d := probeOf(t, "exp(-s)/(s+1)", "p", c.order, spec.Value{Param: "kp", V: 1})
		pd := d.Pade
		if pd == nil || pd.Order != c.order || pd.Chosen {
			t.Fatalf("order %d: pade %+v", c.order, pd)
		}
		if e := float64(pd.KuError); !(math.Abs(e) >= c.lo && math.Abs(e) <= c.hi) {
			t.Errorf("order %d: Ku %v vs %v, relative error %.4g, want within [%g, %g]", c.order, pd.Ku, pd.KuExact, e, c.lo, c.hi)
		}
		if c.order == 1 && (math.Abs(float64(pd.Ku)-3) > 1e-9 || !strings.Contains(pd.Note, "+32.6%")) {
			t.Errorf("order 1: Ku %v, note %q; want 3 and +32.6%%", pd.Ku, pd.Note)
		}
		rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: "exp(-s)/(s+1)", Controller: "p"}, Range: spec.Axis{Param: "kp", Min: 0, Max: 5}, Text: "kp=0:5", Pade: c.order})
		if err != nil {
			t.Fatal(err)
		}
		pv := rep.Doc.Pade
		if pv == nil || math.Abs(float64(pv.At)-ku) > 1e-8 {
			t.Fatalf("order %d: vary pade %+v, want the end at %.10g compared", c.order, pv, ku)
		}
		if r := float64(pv.Relative); r < c.lo || r > c.hi {
			t.Errorf("order %d: relative displacement %.4g, want within [%g, %g]; %s", c.order, r, c.lo, c.hi, pv.Note)
		}
	}
}

// TestPadeOrderChosen: with no order given, the order covers ωL at the
// crossing of the exact interval end, ω = α1 ≈ 2.03 with L = 1
// (delay.PadeOrder), and the chosen approximant puts the end within 1%.
func TestPadeOrderChosen(t *testing.T) {
	rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: "exp(-s)/(s+1)", Controller: "p"}, Range: spec.Axis{Param: "kp", Min: 0, Max: 5}, Text: "kp=0:5"})
	if err != nil {
		t.Fatal(err)
	}
	pv := rep.Doc.Pade
	a := alphaOne(1)
	if !pv.Chosen || pv.Order != delay.PadeOrder(a) || math.Abs(pv.OmegaL-a) > 1e-8 || float64(pv.Relative) > 0.01 {
		t.Errorf("pade %+v, want order %d for ωL = %.6g within 1%%", pv, delay.PadeOrder(a), a)
	}
}

// TestProbeNeutralLoop: PD with kd = 1.5 on e^(−s)/(s + 1) is of neutral
// type with |q_n/p_n| = kd > 1: infinitely many roots on the right
// (Pontryagin's condition, as in package delay). The probe says so and
// does not fail; with kd = 0.5 the chain lies on the left and bounds the
// decay rate by −ln(0.5)/1.
func TestProbeNeutralLoop(t *testing.T) {
	d := probeOf(t, "exp(-s)/(s+1)", "pd", 0, spec.Value{Param: "kp", V: 0.5}, spec.Value{Param: "kd", V: 1.5})
	if d.Neutral == nil || !d.Neutral.InfinitelyMany || d.Stable || d.RHP != delay.InfinitelyMany || !strings.Contains(d.Neutral.Note, "infinitely many") {
		t.Fatalf("neutral %+v, stable %v, rhp %d", d.Neutral, d.Stable, d.RHP)
	}
	d = probeOf(t, "exp(-s)/(s+1)", "pd", 0, spec.Value{Param: "kp", V: 0.5}, spec.Value{Param: "kd", V: 0.5})
	if d.Neutral == nil || d.Neutral.InfinitelyMany || !d.Stable || float64(d.DecayRate) > math.Log(2)+1e-12 {
		t.Fatalf("neutral %+v, stable %v, decay %v (chain at −ln 2)", d.Neutral, d.Stable, d.DecayRate)
	}
}

// TestProbeUnstablePlantWithDelay: P on e^(−0.5s)/(2s − 1), derived by
// hand as in package intervals' test of the unstable first-order plant:
// stable for 1 < kp < (T/L)·√(z1² + (L/T)²), tan z1 = (T/L)·z1; the probe
// at kp = 1.5 is stable, the ultimate gain is that upper end, and the
// rules are marked as not applying to a plant unstable in open loop.
func TestProbeUnstablePlantWithDelay(t *testing.T) {
	d := probeOf(t, "exp(-0.5*s)/(2*s-1)", "p", 0, spec.Value{Param: "kp", V: 1.5})
	if !d.Stable {
		t.Fatalf("kp = 1.5 reported unstable: rhp %d", d.RHP)
	}
	r := 4.0 // T/L
	z := rootIn(func(z float64) float64 { return math.Sin(z) - r*z*math.Cos(z) }, 1e-9, math.Pi/2)
	ku := r * math.Sqrt(z*z+1/(r*r))
	if d.Ultimate == nil || math.Abs(d.Ultimate.Ku-ku) > 1e-8*ku || d.Ultimate.RulesApply {
		t.Errorf("ultimate %+v, want Ku %.10g with the rules marked as not applying", d.Ultimate, ku)
	}
}

// TestPIRegionFirstOrderDeadTime checks the stable integral gains of PI on
// k·e^(−Ls)/(Ts + 1) at several fixed kp against the characterisation of
// G. J. Silva, A. Datta and S. P. Bhattacharyya, "PI stabilization of
// first-order systems with time delay", Automatica 37 (2001) (as recalled:
// the region is bounded by ki = 0 and the first arch of the D-partition
// curve kp(ω) = (ωT·sin ωL − cos ωL)/k, ki(ω) = ω(sin ωL + ωT·cos ωL)/k,
// ωL ∈ (0, α1), over the P range −1/k < kp < (T/(kL))·√(α1² + (L/T)²)):
// at each kp the stable ki run from 0 to the least ki(ω) over the ω of
// the first arch with kp(ω) = kp, found here by a fine scan and
// bisection on the closed form. The upper end and its frequency must
// agree to 1e-8; just outside the kp range no ki is stable.
func TestPIRegionFirstOrderDeadTime(t *testing.T) {
	for _, c := range []struct{ k, T, L float64 }{{1, 1, 1}, {2, 4, 1.5}, {0.5, 2, 3}} {
		kpOf := func(w float64) float64 { return (w*c.T*math.Sin(w*c.L) - math.Cos(w*c.L)) / c.k }
		kiOf := func(w float64) float64 { return w * (math.Sin(w*c.L) + w*c.T*math.Cos(w*c.L)) / c.k }
		a1 := alphaOne(c.T / c.L)
		kpLo, kpHi := -1/c.k, kpOf(a1/c.L)
		plant := formatAll([]float64{c.k})[0] + "*exp(-" + formatAll([]float64{c.L})[0] + "*s)/(" + formatAll([]float64{c.T})[0] + "*s+1)"
		vary := func(kp, top float64) []export.Interval {
			rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: plant, Controller: "pi", Fixed: []spec.Value{{Param: "kp", V: kp}}},
				Range: spec.Axis{Param: "ki", Min: 0, Max: top}, Text: "ki"})
			if err != nil {
				t.Fatal(err)
			}
			return rep.Doc.Intervals
		}
		for _, share := range []float64{0.1, 0.35, 0.6, 0.9} {
			kp := kpLo + share*(kpHi-kpLo)
			// The first-arch frequencies with kp(ω) = kp.
			bound, at := math.Inf(1), math.NaN()
			const steps = 4000
			for i := 0; i < steps; i++ {
				w0, w1 := a1/c.L*float64(i)/steps, a1/c.L*float64(i+1)/steps
				if (kpOf(w0)-kp)*(kpOf(w1)-kp) > 0 {
					continue
				}
				for range 100 {
					m := 0.5 * (w0 + w1)
					if (kpOf(w0)-kp)*(kpOf(m)-kp) <= 0 {
						w1 = m
					} else {
						w0 = m
					}
				}
				if w := 0.5 * (w0 + w1); kiOf(w) < bound {
					bound, at = kiOf(w), w
				}
			}
			ivs := vary(kp, 3*bound)
			if len(ivs) != 1 || ivs[0].Lo != 0 || ivs[0].HiKind != "complex" ||
				math.Abs(ivs[0].Hi-bound) > 1e-8*bound || math.Abs(float64(ivs[0].HiOmega)-at) > 1e-8*at {
				t.Errorf("%s, kp = %.6g: intervals %+v, want (0, %.12g) ended at ω = %.12g", plant, kp, ivs, bound, at)
			}
		}
		for _, kp := range []float64{kpLo - 0.05*(kpHi-kpLo), kpHi + 0.05*(kpHi-kpLo)} {
			if ivs := vary(kp, 10); len(ivs) != 0 {
				t.Errorf("%s, kp = %.6g outside the P range: intervals %+v", plant, kp, ivs)
			}
		}
	}
}

// TestVaryFirstOrderDeadTime: probe --vary of P on k·e^(−Ls)/(Ts + 1)
// reports the closed form of Silva, Datta and Bhattacharyya (PID
// Controllers for Time-Delay Systems, Birkhäuser 2005),
// −1/k < kp < (T/(kL))·√(α1² + (L/T)²), tan α1 = −(T/L)·α1, with the
// crossing frequency α1/L, ends to 1e-8, on three invented (k, T, L).
func TestVaryFirstOrderDeadTime(t *testing.T) {
	for _, c := range []struct{ k, T, L float64 }{{1, 1, 1}, {2, 4, 1.5}, {0.8, 0.5, 3}} {
		a := alphaOne(c.T / c.L)
		lo, hi := -1/c.k, (c.T/(c.k*c.L))*math.Sqrt(a*a+(c.L/c.T)*(c.L/c.T))
		plant := formatAll([]float64{c.k})[0] + "*exp(-" + formatAll([]float64{c.L})[0] + "*s)/(" + formatAll([]float64{c.T})[0] + "*s+1)"
		rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: plant, Controller: "p"}, Range: spec.Axis{Param: "kp", Min: 3 * lo, Max: 3 * hi}, Text: "kp"})
		if err != nil {
			t.Fatal(err)
		}
		iv := rep.Doc.Intervals
		if len(iv) != 1 || math.Abs(iv[0].Lo-lo) > 1e-8*math.Abs(lo) || iv[0].LoKind != "real" ||
			math.Abs(iv[0].Hi-hi) > 1e-8*hi || iv[0].HiKind != "complex" || math.Abs(float64(iv[0].HiOmega)-a/c.L) > 1e-8*a/c.L {
			t.Errorf("%s: intervals %+v, want (%.12g, %.12g) with ω %.12g at the top", plant, iv, lo, hi, a/c.L)
		}
		if !strings.Contains(rep.Intervals[0].HiEnd, "oscillates") {
			t.Errorf("%s: upper end %q", plant, rep.Intervals[0].HiEnd)
		}
	}
}
