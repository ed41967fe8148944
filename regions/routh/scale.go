package routh

import "math"

// balancedScales returns, for each coefficient of p, the size against which
// it is judged to be zero or perturbed. Comparing every coefficient with
// the largest one would call the leading coefficient of (s + 1000)⁶ zero;
// instead p is balanced first. With ρ = (|p_lo|/|p_hi|)^(1/(hi−lo)) from
// its lowest and highest non-zero coefficients (the geometric mean root
// magnitude when p_lo is the constant term), the substitution s = ρ·t gives
// coefficients p_k·ρ^k of comparable size, and the scale of coefficient k
// is max_j |p_j|·ρ^(j−k): the largest balanced coefficient, mapped back.
// This makes every zero test invariant under rescaling of both p and s.
// Computed in logarithms so that no intermediate overflows.
func balancedScales(p []float64) []float64 {
	lo, hi := -1, -1
	for k, v := range p {
		if v != 0 {
			if lo < 0 {
				lo = k
			}
			hi = k
		}
	}
	out := make([]float64, len(p))
	if lo < 0 {
		return out
	}
	logRho := 0.0
	if hi > lo {
		logRho = (math.Log(math.Abs(p[lo])) - math.Log(math.Abs(p[hi]))) / float64(hi-lo)
	}
	best := math.Inf(-1)
	for j, v := range p {
		if v != 0 {
			best = math.Max(best, math.Log(math.Abs(v))+float64(j)*logRho)
		}
	}
	for k := range out {
		out[k] = math.Exp(best - float64(k)*logRho)
	}
	return out
}
