package intervals

import (
	"gainscape/regions/stability"
	"gainscape/regions/unitcircle"
)

// circleCandidates returns the values of k at which p(z; k) = a(z) +
// k·b(z), the characteristic polynomial of a loop sampled every T time
// units, has a root on the unit circle or loses its leading coefficient
// (unitcircle.PencilCandidates): a real root at z = 1 (Real, ω = 0), a
// real root at z = −1 (Alternating, ω = π/T), a pair at e^(±jθ) (Complex,
// ω = θ/T) and a root through infinity (Infinite, ω = NaN).
func (l line) circleCandidates(T float64) []candidate {
	pcs := unitcircle.PencilCandidates(l.a, l.b)
	cs := make([]candidate, len(pcs))
	for i, c := range pcs {
		omega := c.Theta / T
		if c.Kind == stability.Real {
			omega = 0
		}
		cs[i] = candidate{k: c.K, kind: c.Kind, omega: omega}
	}
	return cs
}
