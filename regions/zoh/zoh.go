// Package zoh discretises a continuous-time plant for a sampled-data loop:
// the plant preceded by a zero-order hold and followed by a sampler, both
// with period T, has the pulse transfer function
//
//	G(z) = (1 − z⁻¹)·Z{G(s)/s}
//
// which Discretise returns as a ratio of polynomials in z, exactly up to
// rounding, dead time included.
//
// Method. The rational part N(s)/D(s) is realised in controllable
// canonical form (strictly proper part plus feedthrough). The hold makes
// the input constant over each period, so the state moves by
// x[k+1] = Φ·x[k] + Γ·u[k] with Φ = e^(AT) and Γ = ∫₀ᵀ e^(Aτ)dτ·B, both
// read from one exponential of the augmented matrix [[A, B], [0, 0]]·T
// (C. F. Van Loan, "Computing integrals involving the matrix
// exponential", IEEE Trans. Automatic Control 23(3), 1978), computed by
// gonum's mat.Exp (scaling and squaring with Padé approximants, N. J.
// Higham, Functions of Matrices, SIAM 2008, Algorithm 10.20). The
// augmented matrix needs no inverse of A, so poles at s = 0 are handled
// like any other. The denominator of G(z) is ∏(z − e^(λᵢT)) over the
// poles λᵢ of G(s) (gonum eigenvalues, integrators taken exactly as
// z − 1); the numerator C·adj(zI − Φ)·Γ + d·det(zI − Φ) is a polynomial
// of known degree, evaluated on points of the unit circle and interpolated
// there by the inverse discrete Fourier transform (see numerator.go).
//
// Dead time L = d·T + τ, 0 ≤ τ < T, is exact: d whole samples are the
// factor z^(−d), and a fractional part τ splits each hold interval in two,
// which is the modified z-transform (E. I. Jury, Theory and Application
// of the z-Transform Method, Wiley 1964; K. Ogata, Discrete-Time Control
// Systems, the chapter on the modified z-transform) derived here from the
// state equation instead of from tables (see Discretise).
package zoh

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"

	"gainscape/regions/poly"
)

// WholeTol is how close, in samples, the dead time L/T must be to a whole
// number d to be taken as exactly d samples. Decimal inputs such as
// L = 0.3, T = 0.1 give L/T = 2.9999999999999996; a fractional part this
// small would add a root within about WholeTol of z = 0 and a numerator
// coefficient of that size, changing no verdict that rounding does not
// already decide.
const WholeTol = 1e-9

// InputError reports a plant or a sampling that cannot be discretised,
// with the input that was given.
type InputError struct {
	Num, Den poly.Poly
	T, L     float64
	Reason   string
}

// Error implements error.
func (e *InputError) Error() string {
	return fmt.Sprintf("zoh: cannot discretise G(s) = (%v)/(%v) with T = %g, L = %g: %s",
		e.Num, e.Den, e.T, e.L, e.Reason)
}

// Discretise returns the pulse transfer function numZ(z)/denZ(z), ascending
// coefficients in z, of the plant num(s)/den(s)·e^(−L·s) behind a
// zero-order hold with sample time T (seconds; L in seconds too).
//
// With L = d·T + τ, 0 ≤ τ < T, the input seen by the plant during
// [kT, (k+1)T) is u[k−d−1] for the first τ seconds and u[k−d] for the
// remaining T − τ, so
//
//	x[k+1] = Φ·x[k] + Γ1·u[k−d−1] + Γ0·u[k−d],
//	Γ0 = ∫₀^(T−τ) e^(Aσ)dσ·B,   Γ1 = e^(A(T−τ))·∫₀^τ e^(Aσ)dσ·B,
//	y[k] = C·x[k] + D·u[k−d−1]   (D·u[k−d] when τ = 0),
//
// and G(z) = z^(−d−1)·(C·(zI − Φ)⁻¹·(z·Γ0 + Γ1) + D) for τ > 0,
// G(z) = z^(−d)·(C·(zI − Φ)⁻¹·Γ + D) for τ = 0. Hence
// denZ = z^(d+1)·det(zI − Φ) (z^d for τ = 0), of degree n + d + 1, and
// numZ has degree at most n, n being the order of the plant: the result
// is strictly proper whenever the plant is or τ > 0.
//
// The plant must be proper (degree of num at most that of den); den must
// not be zero; T must be positive and finite, L finite and not negative.
// Leading coefficients that are exactly zero are ignored. Otherwise the
// error is an *InputError carrying the input.
func Discretise(num, den poly.Poly, T, L float64) (numZ, denZ poly.Poly, err error) {
	fail := func(reason string) (poly.Poly, poly.Poly, error) {
		return nil, nil, &InputError{Num: num.Clone(), Den: den.Clone(), T: T, L: L, Reason: reason}
	}
	switch {
	case !num.Finite() || !den.Finite():
		return fail("the coefficients are not all finite numbers")
	case den.Degree() < 0:
		return fail("the denominator is zero")
	case num.Degree() > den.Degree():
		return fail(fmt.Sprintf("the plant is not proper (numerator degree %d above denominator degree %d)", num.Degree(), den.Degree()))
	case !(T > 0) || math.IsInf(T, 1):
		return fail("the sample time must be positive and finite")
	case !(L >= 0) || math.IsInf(L, 1):
		return fail("the dead time must be finite and not negative")
	}
	d, tau := splitDelay(L, T)
	if num.Degree() < 0 {
		return poly.Poly{0}, poly.Poly{1}, nil
	}
	r := realise(num, den, T)
	if r.n == 0 {
		// A static gain: only the delay remains.
		shift := d
		if tau > 0 {
			shift++
		}
		return poly.Poly{r.d}, monomial(shift), nil
	}
	a, err := r.denominator(T)
	if err != nil {
		return fail(err.Error())
	}
	var parts [][]float64
	if tau == 0 {
		phi, g := r.hold(T)
		parts, err = adjugateNumerators(phi, r.c, [][]float64{g})
	} else {
		phi, _ := r.hold(T)
		phi1, g0 := r.hold(T - tau)
		_, g := r.hold(tau)
		g1 := make([]float64, r.n)
		mulVec(g1, phi1, g, r.n)
		parts, err = adjugateNumerators(phi, r.c, [][]float64{g0, g1})
	}
	if err != nil {
		return fail(err.Error())
	}
	numZ = a.Scaled(r.d)
	if tau == 0 {
		addTo(numZ, parts[0], 0)
		return numZ, poly.Mul(a, monomial(d)), nil
	}
	addTo(numZ, parts[0], 1)
	addTo(numZ, parts[1], 0)
	return numZ, poly.Mul(a, monomial(d+1)), nil
}

// splitDelay writes L = d·T + τ with d whole and 0 ≤ τ < T, snapping L/T
// to the nearest whole number within WholeTol.
func splitDelay(L, T float64) (d int, tau float64) {
	q := L / T
	if w := math.Round(q); math.Abs(q-w) <= WholeTol {
		return int(w), 0
	}
	f := math.Floor(q)
	// τ = L − f·T with a single rounding.
	tau = math.FMA(-f, T, L)
	return int(f), min(max(tau, 0), T)
}

// monomial returns z^k.
func monomial(k int) poly.Poly {
	p := make(poly.Poly, k+1)
	p[k] = 1
	return p
}

// addTo adds the coefficients c, shifted up by s powers, into p, which is
// long enough by construction.
func addTo(p poly.Poly, c []float64, s int) {
	for k, v := range c {
		p[k+s] += v
	}
}

// mulVec sets dst = m·v for the n×n row-major matrix m.
func mulVec(dst, m, v []float64, n int) {
	for i := 0; i < n; i++ {
		s := 0.0
		for j := 0; j < n; j++ {
			s += m[i*n+j] * v[j]
		}
		dst[i] = s
	}
}

// hold returns Φ = e^(A·h) and W(h)·B = ∫₀^h e^(Aσ)dσ·B for the plant's
// state model, h in seconds, from the exponential of the augmented matrix
//
//	exp([[A, B], [0, 0]]·h) = [[e^(Ah), W(h)·B], [0, 1]]
//
// (Van Loan 1978). Φ is row-major n×n.
func (r *realisation) hold(h float64) (phi, g []float64) {
	n := r.n
	m := mat.NewDense(n+1, n+1, nil)
	hs := h * r.rho
	for i := 0; i+1 < n; i++ {
		m.Set(i, i+1, hs)
	}
	for j := 0; j < n; j++ {
		m.Set(n-1, j, -r.a[j]*hs)
	}
	m.Set(n-1, n, hs)
	var e mat.Dense
	e.Exp(m)
	phi = make([]float64, n*n)
	g = make([]float64, n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			phi[i*n+j] = e.At(i, j)
		}
		g[i] = e.At(i, n)
	}
	return phi, g
}
