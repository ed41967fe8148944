package intervals

import (
	"math"
	"testing"

	"gainscape/regions/delay"
	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// delayLoop is k·e^(−L·s)·num/den (coefficients highest power first)
// under the family fam with the given values.
func delayLoop(t testing.TB, num, den []float64, L float64, fam string, values ...float64) loop.Loop {
	t.Helper()
	l := loopOf(t, num, den, fam, values...)
	l.Plant.Delay = L
	return l
}

// rootOf finds the zero of f on [a, b], where f changes sign, by
// bisection to rounding.
func rootOf(f func(float64) float64, a, b float64) float64 {
	fa := f(a)
	for range 200 {
		m := 0.5 * (a + b)
		if m <= a || m >= b {
			break
		}
		if fm := f(m); (fm > 0) == (fa > 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return 0.5 * (a + b)
}

// firstOrder is a case of the first-order plant with dead time
// k·e^(−Ls)/(Ts ± 1).
type firstOrder struct {
	name    string
	k, T, L float64
}

// relClose reports |got − want| ≤ rel·|want|.
func relClose(got, want, rel float64) bool { return math.Abs(got-want) <= rel*math.Abs(want) }

// TestFirstOrderDeadTimeRange checks the P-only range of
// k·e^(−Ls)/(Ts + 1) against the closed form of G. J. Silva,
// A. Datta and S. P. Bhattacharyya, PID Controllers for Time-Delay
// Systems, Birkhäuser 2005 (the first-order plant with dead time under
// proportional control):
//
//	−1/k < kp < (T/(kL))·√(α1² + (L/T)²),
//
// α1 ∈ (π/2, π) the root of tan α = −(T/L)·α, found here by bisection on
// sin α + (T/L)·α·cos α. The lower end is a real root through s = 0
// (1 + k·kp = 0) and the upper end a pair at ω = α1/L: from
// jωT + 1 + k·kp·e^(−jωL) = 0, the phase condition ωL + atan(ωT) = π is
// tan(ωL) = −ωT, and the gain condition k·kp = √(1 + (ωT)²). Ends and the
// frequency to 1e-8 relative.
func TestFirstOrderDeadTimeRange(t *testing.T) {
	for _, c := range []firstOrder{
		{"k=1 T=1 L=1", 1, 1, 1},
		{"k=2 T=4 L=1.5", 2, 4, 1.5},
		{"k=0.5 T=10 L=0.3 (short delay)", 0.5, 10, 0.3},
		{"k=3 T=0.2 L=2 (delay-dominant)", 3, 0.2, 2},
		{"k=1e-6 T=1 L=0.5 (tiny plant gain)", 1e-6, 1, 0.5},
		{"k=1e6 T=2 L=0.1 (huge plant gain)", 1e6, 2, 0.1},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := c.T / c.L
			alpha := rootOf(func(a float64) float64 { return math.Sin(a) + r*a*math.Cos(a) }, math.Pi/2, math.Pi)
			hi := (c.T / (c.k * c.L)) * math.Sqrt(alpha*alpha+1/(r*r))
			lo := -1 / c.k
			l := delayLoop(t, []float64{c.k}, []float64{c.T, 1}, c.L, "p", 1)
			got, err := Stable(l, 0, 3*lo, 3*hi)
			if err != nil {
				t.Fatal(err)
			}
			if len(got) != 1 {
				t.Fatalf("intervals %+v, want one", got)
			}
			iv := got[0]
			if !relClose(iv.Lo, lo, 1e-8) || iv.LoKind != stability.Real || iv.LoOmega != 0 {
				t.Errorf("lower end %.12g (%v, ω %g), want %.12g, real", iv.Lo, iv.LoKind, iv.LoOmega, lo)
			}
			if !relClose(iv.Hi, hi, 1e-8) || iv.HiKind != stability.Complex || !relClose(iv.HiOmega, alpha/c.L, 1e-8) {
				t.Errorf("upper end %.12g (%v, ω %.12g), want %.12g at ω %.12g", iv.Hi, iv.HiKind, iv.HiOmega, hi, alpha/c.L)
			}
		})
	}
}

// TestUnstableFirstOrderDeadTime: k·e^(−Ls)/(Ts − 1) under P, derived by
// hand. Δ = Ts − 1 + K·e^(−Ls), K = k·kp. A real root crosses s = 0 at
// K = 1; a pair crosses at jω where K·e^(−jωL) = 1 − jωT, that is
// K = √(1 + (ωT)²) and ωL = atan(ωT): with z = ωL, tan z = (T/L)·z, which
// has a root z1 in (0, π/2) exactly when T > L (tan z − (T/L)·z starts
// with slope 1 − T/L). So the loop is stable for
// 1/k < kp < (T/(kL))·√(z1² + (L/T)²) when L < T, and never when L > T
// (the condition L < T is as recalled from Silva, Datta and
// Bhattacharyya 2005).
func TestUnstableFirstOrderDeadTime(t *testing.T) {
	for _, c := range []firstOrder{
		{"L<T", 1, 2, 0.5},
		{"L<T close", 2, 1, 0.8},
		{"L>T", 1, 1, 1.5},
	} {
		t.Run(c.name, func(t *testing.T) {
			l := delayLoop(t, []float64{c.k}, []float64{c.T, -1}, c.L, "p", 1)
			got, err := Stable(l, 0, -10, 50)
			if err != nil {
				t.Fatal(err)
			}
			if c.L > c.T {
				if len(got) != 0 {
					t.Errorf("intervals %+v, want none for L > T", got)
				}
				return
			}
			r := c.T / c.L
			z := rootOf(func(z float64) float64 { return math.Sin(z) - r*z*math.Cos(z) }, 1e-9, math.Pi/2)
			hi := (c.T / (c.k * c.L)) * math.Sqrt(z*z+1/(r*r))
			if len(got) != 1 {
				t.Fatalf("intervals %+v, want one", got)
			}
			iv := got[0]
			if !relClose(iv.Lo, 1/c.k, 1e-8) || iv.LoKind != stability.Real {
				t.Errorf("lower end %.12g (%v), want %.12g, real", iv.Lo, iv.LoKind, 1/c.k)
			}
			if !relClose(iv.Hi, hi, 1e-8) || iv.HiKind != stability.Complex || !relClose(iv.HiOmega, z/c.L, 1e-8) {
				t.Errorf("upper end %.12g (%v, ω %.12g), want %.12g at ω %.12g", iv.Hi, iv.HiKind, iv.HiOmega, hi, z/c.L)
			}
		})
	}
}

// TestTinyDelayAgreesWithRational: with L = 1e-9 the range of P on
// 1/(s+1)³ is that of the loop without delay, −1 < kp < 8 with ω = √3
// (the sign array worked by hand in TestStableHandDerived), to within the
// delay's own effect (relative 1e-6).
func TestTinyDelayAgreesWithRational(t *testing.T) {
	l := delayLoop(t, []float64{1}, []float64{1, 3, 3, 1}, 1e-9, "p", 1)
	got, err := Stable(l, 0, -5, 20)
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != 1 || !relClose(got[0].Lo, -1, 1e-6) || !relClose(got[0].Hi, 8, 1e-6) ||
		got[0].HiKind != stability.Complex || !relClose(got[0].HiOmega, math.Sqrt(3), 1e-6) {
		t.Errorf("intervals %+v, want (−1, 8) with ω = √3 at the top", got)
	}
}

// TestIntegralGainWithDelay: at fixed kp the stable ki of PI on
// e^(−s)/(s + 1) start at ki = 0 (the window end, where the integrator's
// root sits at s = 0) and end where a pair crosses; every value inside is
// confirmed stable and values just past the end unstable by the rightmost
// roots (delay.Rightmost), a method independent of the count the search
// uses.
func TestIntegralGainWithDelay(t *testing.T) {
	for _, kp := range []float64{0.2, 0.5, 1} {
		l := delayLoop(t, []float64{1}, []float64{1, 1}, 1, "pi", kp, 0)
		got, err := Stable(l, 1, 0, 5)
		if err != nil {
			t.Fatal(err)
		}
		if len(got) != 1 || got[0].Lo != 0 || got[0].HiKind != stability.Complex {
			t.Fatalf("kp=%g: intervals %+v, want one from ki = 0 to a complex crossing", kp, got)
		}
		hi := got[0].Hi
		for _, c := range []struct {
			ki     float64
			stable bool
		}{{0.5 * hi, true}, {0.999 * hi, true}, {1.001 * hi, false}, {2 * hi, false}} {
			f := l.Set(1, c.ki).Function()
			roots, err := delay.Rightmost(f, 2)
			if err != nil {
				t.Fatal(err)
			}
			if stable := delay.DecayRate(roots) > 0; stable != c.stable {
				t.Errorf("kp=%g ki=%g: rightmost root %v, want stable %v", kp, c.ki, roots[0], c.stable)
			}
		}
	}
}

// TestNeutralDerivativeWithDelay: PD kp + kd·s on e^(−s)/(s + 1) gives
// Δ = s + 1 + (kd·s + kp)·e^(−s), of neutral type with |q_n/p_n| = |kd|:
// infinitely many right-half-plane roots for |kd| > 1 (Pontryagin's
// condition, as in package delay), so every stable interval of kd lies
// inside [−1, 1]. At kp = 0.5 the search finds the whole of (−1, 1),
// ended by the chain of roots at both ends; the rightmost roots
// (delay.Rightmost, independent of the count) confirm stability at
// kd = ±0.9 and 0.
func TestNeutralDerivativeWithDelay(t *testing.T) {
	l := delayLoop(t, []float64{1}, []float64{1, 1}, 1, "pd", 0.5, 0)
	got, err := Stable(l, 1, -3, 3)
	if err != nil {
		t.Fatal(err)
	}
	if len(got) != 1 || !relClose(got[0].Lo, -1, 1e-12) || !relClose(got[0].Hi, 1, 1e-12) ||
		got[0].LoKind != stability.Infinite || got[0].HiKind != stability.Infinite {
		t.Fatalf("intervals %+v, want (−1, 1) ended by the neutral chain", got)
	}
	for _, kd := range []float64{-0.9, 0, 0.9} {
		roots, err := delay.Rightmost(l.Set(1, kd).Function(), 2)
		if err != nil {
			t.Fatal(err)
		}
		if delay.DecayRate(roots) <= 0 {
			t.Errorf("kd=%g: rightmost root %v, want stable", kd, roots[0])
		}
	}
}

// TestDelayLoopErrors: a characteristic function that is not finite is an
// error naming the parameter.
func TestDelayLoopErrors(t *testing.T) {
	f, _ := family.Lookup("p")
	l := loop.Loop{Plant: loop.Plant{Num: poly.Poly{math.Inf(1)}, Den: poly.Poly{1, 1}, Delay: 1}, Family: f, Values: []float64{1}}
	if _, err := Stable(l, 0, 0, 1); err == nil {
		t.Error("an infinite plant gain was accepted")
	}
}
