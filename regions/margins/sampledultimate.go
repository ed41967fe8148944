package margins

import (
	"math"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
	"gainscape/regions/unitcircle"
)

// SampledUltimate returns the ultimate gain ku and period tu of the plant
// N(z)/D(z), sampled every T, under proportional control: the smallest
// k > 0 at which the closed loop D + k·N, stable just below k, loses
// stability through roots crossing the unit circle in an oscillation. A
// pair at e^(±jθ) oscillates at ω = θ/T (tu = 2π·T/θ); a real root at
// z = −1 alternates in sign every sample (ω = π/T, tu = 2T), which kind
// reports as stability.Alternating (Complex for a pair).
//
// Method (exact, no search): the candidate gains are those of
// unitcircle.PencilCandidates for D + k·N, where a root lies on the circle
// at z = 1, z = −1 or e^(±jθ), or the leading coefficient vanishes; each
// piece between them is tested once with the given test, as Ultimate does
// for continuous-time loops. ok is false when stability is never lost in
// an oscillation for k > 0 (only through z = 1 or infinity, or never),
// when the loop is not stable for small k > 0 just below the first
// oscillatory gain, or for coefficients that are not finite.
func SampledUltimate(plantNum, plantDen poly.Poly, T float64, test stability.Test) (ku, tu float64, kind stability.Kind, ok bool) {
	num, den := plantNum.Clone().Trim(0), plantDen.Clone().Trim(0)
	if !num.Finite() || !den.Finite() || num.Degree() < 0 || den.Degree() < 0 || !(T > 0) {
		return 0, 0, stability.None, false
	}
	n := max(len(num), len(den))
	a, b := make(poly.Poly, n), make(poly.Poly, n)
	copy(a, den)
	copy(b, num)
	var cs []cand
	for _, c := range unitcircle.PencilCandidates(a, b) {
		if !(c.K > 0) || math.IsInf(c.K, 0) {
			continue
		}
		w := 0.0
		if c.Kind == stability.Complex || c.Kind == stability.Alternating {
			w = c.Theta / T
		}
		cs = append(cs, cand{c.K, w})
	}
	k, w, ok := firstLoss(cs, stabilityTester{num: num, den: den, test: test})
	if !ok {
		return 0, 0, stability.None, false
	}
	kind = stability.Complex
	if w >= math.Pi/T*(1-1e-12) {
		kind = stability.Alternating
	}
	return k, 2 * math.Pi / w, kind, true
}
