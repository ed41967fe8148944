package routh

import "math"

// balancedScales returns, for each coefficient of p, the logarithm of the
// size against which it is judged to be zero or perturbed. Comparing every coefficient with
// the largest one would call the leading coefficient of (s + 1000)⁶ zero;
// instead p is balanced first. With ρ = (|p_lo|/|p_hi|)^(1/(hi−lo)) from
// its lowest and highest non-zero coefficients (the geometric mean root
// magnitude when p_lo is the constant term), the substitution s = ρ·t gives
// coefficients p_k·ρ^k of comparable size, and the scale of coefficient k
// is max_j |p_j|·ρ^(j−k): the largest balanced coefficient, mapped back.
// This makes every zero test invariant under rescaling of both p and s.
// Computed and returned as natural logarithms so that nothing overflows.
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
		for k := range out {
			out[k] = math.Inf(-1)
		}
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
		out[k] = best - float64(k)*logRho
	}
	return out
}

// negligible reports whether v is zero against the balanced scale whose
// logarithm is logScale.
func negligible(v, logScale float64) bool {
	return v == 0 || math.Log(math.Abs(v)) <= math.Log(InputTol)+logScale
}

// balanceLimit is how far, in natural logarithms, the root scale ρ or the
// size of the balanced coefficients may stray from 1 before Analyze
// balances the polynomial: far enough that ordinary loops are analysed
// (and reported) with the coefficients the user's model gives.
const balanceLimit = 30

// balance returns q(ρ·t) divided by a power of two near its largest
// coefficient, and ρ, when q's roots or coefficients are far enough
// from unit size to risk overflow or underflow in the array; ok is false
// otherwise. ρ is a power of two, so every coefficient is scaled exactly
// (math.Ldexp) and the roots keep every digit: a polynomial with roots on
// the imaginary axis still has them there after balancing.
func balance(q []float64) (b []float64, rho float64, ok bool) {
	lo, hi := 0, len(q)-1
	if q[lo] == 0 || q[hi] == 0 || hi == lo {
		return nil, 0, false
	}
	logRho := (math.Log(math.Abs(q[lo])) - math.Log(math.Abs(q[hi]))) / float64(hi-lo)
	top := math.Inf(-1)
	for k, v := range q {
		if v != 0 {
			top = math.Max(top, math.Log(math.Abs(v))+float64(k)*logRho)
		}
	}
	if math.Abs(logRho) <= balanceLimit && math.Abs(top) <= 10*balanceLimit {
		return nil, 0, false
	}
	e := int(math.Round(logRho / math.Ln2))
	t := int(math.Round(top / math.Ln2))
	b = make([]float64, len(q))
	for k, v := range q {
		b[k] = math.Ldexp(v, k*e-t)
	}
	return b, math.Ldexp(1, e), true
}

// unbalance maps a polynomial in t = s/ρ back to s: coefficient d is
// divided by ρ^d (up to a common positive factor, which changes no root);
// ρ is the power of two balance chose, so this is exact.
func unbalance(a []float64, rho float64) []float64 {
	if rho == 1 {
		return a
	}
	_, e := math.Frexp(rho)
	e-- // rho = 2^e exactly
	out := make([]float64, len(a))
	for d, v := range a {
		out[d] = math.Ldexp(v, -e*d)
	}
	return out
}
