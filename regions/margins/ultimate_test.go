package margins

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// Hand-derived ultimate gains and periods.
//
// 1/(s+1)³: D + k = s³ + 3s² + 3s + 1 + k. Routh: the s¹ entry is
// (3·3 − (1 + k))/3, zero at k = 8; the auxiliary polynomial 3s² + 9 gives
// ω = √3. Ku = 8, Tu = 2π/√3.
//
// 1/(s(s+1)(s+2)): s³ + 3s² + 2s + k, s¹ entry (6 − k)/3: Ku = 6; the
// auxiliary polynomial 3s² + 6 gives ω = √2, Tu = 2π/√2 = π√2.
//
// 1/(s(s+1)(s+5)): s³ + 6s² + 5s + k: Ku = 30, ω = √5.
//
// (s+2)/(s(s−1)(s+6)), open-loop unstable:
// D + kN = s³ + 5s² + (k − 6)s + 2k. Hurwitz iff k > 6 and 5(k − 6) > 2k
// ⇔ k > 10: stability is gained at k = 10 (ω² = 2k/5 = 4), never lost, so
// there is no ultimate gain. The root locus crossing at k = 10 is the
// wrong direction and must not be reported.
func TestUltimateHandDerived(t *testing.T) {
	cases := []struct {
		name     string
		num, den poly.Poly
		ku, w    float64
	}{
		{"1/(s+1)^3", p(1), p(1, 3, 3, 1), 8, math.Sqrt(3)},
		{"1/(s(s+1)(s+2))", p(1), p(1, 3, 2, 0), 6, math.Sqrt2},
		{"1/(s(s+1)(s+5))", p(1), p(1, 6, 5, 0), 30, math.Sqrt(5)},
		{"2/(s+1)^3 (gain in the plant)", p(2), p(1, 3, 3, 1), 4, math.Sqrt(3)},
	}
	for _, c := range cases {
		ku, tu, ok := Ultimate(c.num, c.den, routh.Test{})
		if !ok {
			t.Errorf("%s: no ultimate gain", c.name)
			continue
		}
		check(t, c.name+" Ku", ku, c.ku, 1e-12)
		check(t, c.name+" Tu", tu, 2*math.Pi/c.w, 1e-12)
		// Cross-check with the Routh array: at Ku the characteristic
		// polynomial has the imaginary pair ±jωu.
		rep := routh.Analyze(poly.Add(c.den, c.num.Scaled(ku)))
		found := false
		for _, w := range rep.Omegas {
			found = found || math.Abs(w-c.w) < 1e-6*c.w
		}
		if !found || rep.RHP != 0 {
			t.Errorf("%s: Routh array at Ku: RHP %d, ω %v, want the pair at %g", c.name, rep.RHP, rep.Omegas, c.w)
		}
	}
	for _, c := range []struct {
		name     string
		num, den poly.Poly
	}{
		{"first order", p(1), p(1, 1)},
		{"second order", p(1), p(1, 0.4, 1)},
		{"double integrator", p(1), p(1, 0, 0)},
		{"gains stability at k = 10", p(1, 2), poly.Mul(p(1, -1, 0), p(1, 6))},
		{"NaN", p(math.NaN()), p(1, 1)},
		{"zero numerator", poly.Poly{0}, p(1, 1, 1, 1)},
	} {
		if ku, tu, ok := Ultimate(c.num, c.den, routh.Test{}); ok {
			t.Errorf("%s: Ku = %g, Tu = %g, want none", c.name, ku, tu)
		}
	}
}

// stableAt reports whether D + kN is Hurwitz, by eigenvalues.
func stableAt(t *testing.T, num, den poly.Poly, k float64) bool {
	r, err := poly.Add(den, num.Scaled(k)).Roots()
	if err != nil {
		t.Fatal(err)
	}
	return DecayRate(r) > 0 && len(r) == max(den.Degree(), num.Degree())
}

// TestUltimateAgreesWithScan compares Ultimate with an independent brute
// force on random plants of degree 3 to 6 (stable or not, some with
// zeros): the stability of D + kN by eigenvalues on a geometric scan of k
// over [1e-4, 1e4]·scale, then bisection on the first stable-to-unstable
// transition. Loops whose first loss is not oscillatory are skipped by
// both.
func TestUltimateAgreesWithScan(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	agreed := 0
	for trial := 0; trial < 200; trial++ {
		n := 3 + trial%4
		roots := stableRoots(rng, n, 0.1, 1)
		if trial%3 == 0 {
			roots[0] = complex(math.Abs(real(roots[0])), imag(roots[0]))
			if imag(roots[0]) != 0 {
				roots[1] = complex(math.Abs(real(roots[1])), imag(roots[1]))
			}
		}
		den := poly.FromRoots(roots)
		num := poly.Poly{1}
		if trial%2 == 1 {
			num = poly.FromRoots([]complex128{complex(-math.Exp(2*rng.Float64()-1), 0)})
		}
		num = num.Scaled(math.Exp(2*rng.Float64() - 1))
		ku, tu, ok := Ultimate(num, den, routh.Test{})

		// Brute force.
		const steps = 4000
		var kScan float64
		prevK, prevStable := 0.0, false
		for i := 0; i <= steps; i++ {
			k := 1e-4 * math.Pow(1e8, float64(i)/steps)
			s := stableAt(t, num, den, k)
			if prevStable && !s {
				lo, hi := prevK, k
				for range 100 {
					mid := 0.5 * (lo + hi)
					if stableAt(t, num, den, mid) {
						lo = mid
					} else {
						hi = mid
					}
				}
				kScan = 0.5 * (lo + hi)
				break
			}
			prevK, prevStable = k, s
		}
		if kScan == 0 {
			if ok {
				t.Errorf("trial %d: Ultimate found Ku = %g, the scan no loss of stability", trial, ku)
			}
			continue
		}
		// The scan cannot tell an oscillatory loss from a real-root one;
		// the closed-loop poles at kScan can.
		r, _ := poly.Add(den, num.Scaled(kScan*(1+1e-9))).Roots()
		w := math.Abs(imag(poleNearestAxis(r)))
		if w < 1e-6 {
			if ok && ku <= kScan*(1+1e-6) {
				t.Errorf("trial %d: Ultimate Ku = %g, scan found a real-root loss at %g", trial, ku, kScan)
			}
			continue
		}
		if !ok {
			t.Errorf("trial %d: no ultimate gain, scan found %g (ω %g)\nnum %v\nden %v", trial, kScan, w, num, den)
			continue
		}
		check(t, "Ku vs scan", ku, kScan, 1e-7)
		check(t, "Tu vs scan", tu, 2*math.Pi/w, 1e-6)
		agreed++
	}
	if agreed < 100 {
		t.Errorf("only %d plants with an ultimate gain compared", agreed)
	}
	t.Logf("%d plants compared", agreed)
}

func poleNearestAxis(r []complex128) complex128 {
	best := r[0]
	for _, z := range r {
		if math.Abs(real(z)) < math.Abs(real(best)) {
			best = z
		}
	}
	return best
}
