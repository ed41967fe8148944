package zoh

import (
	"fmt"
	"math"

	"gainscape/regions/poly"
)

// realisation is the controllable canonical form of a proper plant
// N(s)/D(s) of order n, written in the scaled variable σ = s/ρ:
//
//	D(ρσ)/(lead·ρⁿ) = σⁿ + a[n−1]·σ^(n−1) + … + a[0],
//	A = companion of a (ones above the diagonal, −a in the last row),
//	B = (0, …, 0, 1)ᵀ,  C = c,  G = C·(σI − A)⁻¹·B + d.
//
// The time scale moves into the sample time: the model in σ sampled every
// ρ·T units has the same pulse transfer function as the plant sampled
// every T seconds (the sampled step response is unchanged by a change of
// time unit). ρ is the larger of two scales. The geometric mean magnitude
// of the non-zero poles keeps the entries of A of order one when the
// poles are fast against the sampling: the companion matrix of
// (s + 1000)³ has entries up to 10⁹, that of its scaled form up to 3.
// And 1/T keeps the scaled sample interval ρ·T at least one: over an
// interval h the entries of Γ grow like h, h²/2, …, hⁿ/n!, and an
// exponential that is accurate in norm (as scaling and squaring is) loses
// the small ones when h is small; 1/s⁷ sampled at T = 10⁻⁴ without this
// came out with its smallest numerator coefficient 5% wrong.
type realisation struct {
	n    int
	a, c []float64
	d    float64
	rho  float64
	// integrators is the number of poles exactly at s = 0 (den[0], den[1],
	// … exactly zero).
	integrators int
}

// realise builds the scaled controllable canonical form of num/den for
// sample time T; the caller has checked num/den to be proper with den
// non-zero.
func realise(num, den poly.Poly, T float64) *realisation {
	den = den[:den.Degree()+1]
	n := len(den) - 1
	lead := den[n]
	k := 0
	for den[k] == 0 {
		k++
	}
	rho := 1 / T
	if n > k {
		rho = math.Max(rho, math.Pow(math.Abs(den[k])/math.Abs(lead), 1/float64(n-k)))
	}
	r := &realisation{n: n, rho: rho, integrators: k, a: make([]float64, n), c: make([]float64, n)}
	b := make([]float64, n+1)
	for i := 0; i <= n && i < len(num); i++ {
		b[i] = num[i] / lead * math.Pow(rho, float64(i-n))
	}
	r.d = b[n]
	for i := 0; i < n; i++ {
		r.a[i] = den[i] / lead * math.Pow(rho, float64(i-n))
		// Strictly proper part: N − d·D, coefficient by coefficient.
		r.c[i] = b[i] - r.d*r.a[i]
	}
	return r
}

// denominator returns det(zI − Φ) = ∏(z − e^(σᵢ·ρT)) over the poles σᵢ
// of the scaled model: (z − 1) exactly for each integrator, real factors
// for real poles and z² − 2·Re(μ)·z + |μ|² for each complex pair μ, μ̄,
// so that the product is real by construction. Roots of a polynomial are
// computed as gonum eigenvalues (poly.Roots); a multiple pole is found only
// to about the k-th root of the rounding, but the coefficients of the
// product are symmetric functions of the poles and keep full accuracy.
func (r *realisation) denominator(T float64) (poly.Poly, error) {
	h := r.rho * T
	a := poly.Poly{1}
	for range r.integrators {
		a = poly.Mul(a, poly.Poly{-1, 1})
	}
	rest := make(poly.Poly, r.n-r.integrators+1)
	copy(rest, r.a[r.integrators:])
	rest[len(rest)-1] = 1
	roots, err := rest.Roots()
	if err != nil {
		return nil, fmt.Errorf("the poles could not be found: %v", err)
	}
	for _, s := range roots {
		switch {
		case imag(s) == 0:
			a = poly.Mul(a, poly.Poly{-math.Exp(real(s) * h), 1})
		case imag(s) > 0:
			m := math.Exp(real(s) * h)
			a = poly.Mul(a, poly.Poly{m * m, -2 * m * math.Cos(imag(s)*h), 1})
		}
	}
	return a, nil
}
