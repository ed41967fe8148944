package margins

import (
	"math"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// TestPublishedThirdOrderLoop checks the margins of KG(s) = 1/(s(s+1)²),
// the third-order loop used to introduce gain and phase margin in
// G. F. Franklin, J. D. Powell, A. Emami-Naeini, Feedback Control of
// Dynamic Systems, Ch. 6 (stability margins), which reports GM = 2 and
// PM ≈ 22° for K = 1 (from memory). The exact values are derived by hand
// here: the phase −90° − 2·atan ω reaches −180° at ω = 1, where |L| = 1/2,
// so GM = 2 exactly; |L| = 1 where ω(1 + ω²) = 1, the real root of
// ω³ + ω − 1 = 0, ω ≈ 0.6823278, and PM = 90° − 2·atan ω ≈ 21.39°.
func TestPublishedThirdOrderLoop(t *testing.T) {
	// Real root of ω³ + ω − 1 by Cardano's formula: with q = −1/2 and
	// p/3 = 1/3, ω = ∛(1/2 + √(1/4 + 1/27)) + ∛(1/2 − √(1/4 + 1/27)).
	d := math.Sqrt(0.25 + 1.0/27)
	wc := math.Cbrt(0.5+d) + math.Cbrt(0.5-d)
	pm := 90 - 2*math.Atan(wc)*180/math.Pi

	l := NewLoop(poly.Poly{1}, poly.FromDescending([]float64{1, 2, 1, 0}), poly.Poly{1}, poly.Poly{1})
	m, err := l.Margins()
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"gain margin", m.GainMargin, 2},
		{"phase crossover", m.PhaseCrossover, 1},
		{"phase margin (deg)", m.PhaseMargin, pm},
		{"gain crossover", m.GainCrossover, wc},
	} {
		if math.Abs(c.got-c.want) > 1e-9*math.Max(1, math.Abs(c.want)) {
			t.Errorf("%s = %.12g; want %.12g", c.name, c.got, c.want)
		}
	}
	if math.Abs(pm-22) > 1 {
		t.Errorf("hand-derived PM %.4g° is not the ≈22° of the published example", pm)
	}
	// The ultimate gain of the same plant is the gain margin: 2, at ω = 1.
	ku, tu, ok := Ultimate(poly.Poly{1}, poly.FromDescending([]float64{1, 2, 1, 0}), routh.Test{})
	if !ok || math.Abs(ku-2) > 1e-10 || math.Abs(tu-2*math.Pi) > 1e-9 {
		t.Errorf("Ultimate = %g, %g, %v; want 2, 2π", ku, tu, ok)
	}
}
