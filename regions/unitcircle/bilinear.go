package unitcircle

import (
	"math"
	"math/cmplx"
	"slices"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// bilinearBasis returns, for j = 0 … m, the coefficients (ascending in w)
// of (1 + w)^j·(1 − w)^(m−j). They are integers below 2^m, exact in
// double precision for m < 53.
func bilinearBasis(m int) [][]float64 {
	basis := make([][]float64, m+1)
	for j := range basis {
		c := poly.Poly{1}
		for range j {
			c = poly.Mul(c, poly.Poly{1, 1})
		}
		for range m - j {
			c = poly.Mul(c, poly.Poly{1, -1})
		}
		basis[j] = c
	}
	return basis
}

// mapToHalfPlane writes into q (length m + 1) the image of p, of degree m,
// under z = (1 + w)/(1 − w):
//
//	Q(w) = (1 − w)^m·P((1 + w)/(1 − w)) = Σ_j p_j·(1 + w)^j·(1 − w)^(m−j),
//
// with basis = bilinearBasis(m). It allocates nothing.
//
// The map takes the inside of the unit circle to the open left half
// plane: w = 0 ↔ z = 1, w = jν ↔ z = e^(jθ) with θ = 2·atan ν, and w = ∞ ↔
// z = −1, so that a root of P at z = −1 shows as a drop of the degree of
// Q (its leading coefficient is (−1)^m·P(−1)).
//
// Each coefficient is a dot product of p with integers, and cancels
// heavily when the roots of P crowd z = 1 (fast sampling). It is summed
// by the compensated dot product Dot2 (T. Ogita, S. M. Rump, S. Oishi,
// "Accurate sum and dot product", SIAM J. Sci. Comput. 26(6), 2005): the
// result is as if computed in twice the working precision and rounded,
// within a unit in the last place of itself unless it cancels by more
// than about 10^14, so the map adds no rounding beyond what the sign
// array assumes of its input. A coefficient no larger than what the
// input's own rounding can make of it (inputUlps units in the last place
// of each p_j, propagated) is set to zero exactly: P(1) formed from
// coefficients that cancel (an integrator on both sides of the loop, a
// point on an edge) is zero, not 1e-17, and the array then sees the root
// at w = 0 for what it is. judged reports whether any coefficient was
// set to zero so.
func mapToHalfPlane(q, p []float64, basis [][]float64) (judged bool) {
	m := len(p) - 1
	for k := 0; k <= m; k++ {
		var sum, comp, size float64
		for j, pj := range p {
			c := basis[j][k]
			h := c * pj
			r := math.FMA(c, pj, -h)
			s := sum + h
			z := s - sum
			comp += (sum - (s - z)) + (h - z) + r
			sum = s
			size += math.Abs(h)
		}
		v := sum + comp
		if v != 0 && math.Abs(v) <= (inputUlps+1)*unit*size {
			v, judged = 0, true
		}
		q[k] = v
	}
	return judged
}

// toHalfPlane returns mapToHalfPlane's image of p.
func toHalfPlane(p poly.Poly) poly.Poly {
	q := make(poly.Poly, len(p))
	mapToHalfPlane(q, p, bilinearBasis(len(p)-1))
	return q
}

// fromHalfPlane maps a polynomial a(w) of degree k back to the z-plane,
// (z + 1)^k·a((z − 1)/(z + 1)) = Σ_j a_j·(−1)^j·(1 − z)^j·(1 + z)^(k−j),
// so that its roots on the imaginary axis land on the unit circle.
func fromHalfPlane(a poly.Poly) poly.Poly {
	k := len(a) - 1
	basis := bilinearBasis(k)
	out := make(poly.Poly, k+1)
	for j, aj := range a {
		if j%2 == 1 {
			aj = -aj
		}
		for i, c := range basis[k-j] {
			out[i] += c * aj
		}
	}
	return out
}

// analysis is the full verdict on P(z) from the bilinear map and the
// complete sign-array analysis (routh.Analyze), with its working.
type analysis struct {
	verdict stability.Verdict
	// thetas are the distinct angles θ ∈ [0, π] of the roots on the
	// circle, ascending.
	thetas []float64
	q      poly.Poly
	sign   routh.Report
	// mapped is false when the map was not needed (nothing but a constant
	// was left after removing the degree drop).
	mapped bool
	notes  []string
	reason string
}

// clusterTol is how near z = 1 or z = −1 (in z) the eigenvalues of P must
// show as many roots as the sign array finds there. A root of
// multiplicity k is found by the eigenvalues to about the k-th root of
// the rounding, so 1e-3 admits clusters of four or five.
const clusterTol = 1e-3

// analyse decides where the roots of p lie when the faster stages could
// not: leading coefficients that are exactly zero are roots at infinity;
// exact zeros at the bottom are roots at z = 0, which lie inside and are
// removed; what remains is mapped to the half plane and counted by the
// complete sign-array analysis with its ε rule, auxiliary polynomial and
// eigenvalue confirmation.
//
// Roots the array places at w = 0 or w = ∞ (z = 1, z = −1) come from
// coefficients of Q judged zero, and a polynomial can make its
// coefficients cancel so heavily that rounding decides them without any
// root being near those points: (z − 0.9)^20 rounded to double precision
// has roots spread from 0.6 to 1.2 and a mapped constant coefficient
// 1e-20 of its terms. Such roots are therefore confirmed by the
// eigenvalues of P (as many within clusterTol of the point), and the
// verdict is undecided where they are not there.
func analyse(p poly.Poly) analysis {
	var an analysis
	if len(p) == 0 || !p.Finite() {
		an.verdict, an.reason = undecided(), "the coefficients are not finite numbers"
		return an
	}
	hi := len(p) - 1
	for hi >= 0 && p[hi] == 0 {
		hi--
	}
	if hi < 0 {
		an.verdict, an.reason = undecided(), "every coefficient is zero"
		return an
	}
	an.verdict.Infinite = len(p) - 1 - hi
	if an.verdict.Infinite > 0 {
		an.notes = append(an.notes, "the leading coefficient vanishes: a root has gone to z = ∞ (1 + C·G = 0 at z = ∞, a loop without a causal solution)")
	}
	lo := 0
	for p[lo] == 0 {
		lo++
	}
	core := p[lo : hi+1]
	if len(core) == 1 {
		return an
	}
	an.mapped = true
	an.q = toHalfPlane(core)
	an.sign = routh.Analyze(an.q)
	if an.sign.Undecided {
		an.verdict, an.reason = undecided(), an.sign.Reason
		return an
	}
	if an.sign.ZeroRoots > 0 || an.sign.DegreeDrop > 0 {
		roots, err := core.Roots()
		if err != nil {
			an.verdict, an.reason = undecided(), "the eigenvalues could not be found to confirm the roots at z = ±1"
			return an
		}
		near1, nearM1 := 0, 0
		for _, r := range roots {
			if cmplx.Abs(r-1) <= clusterTol {
				near1++
			}
			if cmplx.Abs(r+1) <= clusterTol {
				nearM1++
			}
		}
		if near1 < an.sign.ZeroRoots || nearM1 < an.sign.DegreeDrop {
			an.verdict, an.reason = undecided(), "the coefficients cancel so heavily at z = ±1 that rounding decides where the roots lie"
			return an
		}
	}
	an.verdict.Unstable = an.sign.RHP
	an.verdict.Boundary = an.sign.JW + an.sign.DegreeDrop
	for _, nu := range an.sign.Omegas {
		an.thetas = append(an.thetas, 2*math.Atan(nu))
	}
	if an.sign.DegreeDrop > 0 {
		an.thetas = append(an.thetas, math.Pi)
		an.notes = append(an.notes, "the mapped polynomial drops degree: a root lies at z = −1")
	}
	if an.sign.ZeroRoots > 0 {
		an.notes = append(an.notes, "the mapped polynomial has a root at w = 0: a root lies at z = 1")
	}
	slices.Sort(an.thetas)
	return an
}

func undecided() stability.Verdict {
	return stability.Verdict{Unstable: stability.Undecided}
}
