package response

import (
	"math"

	"gainscape/regions/poly"
)

// part is one transfer function M(s)/Δ(s) split for a realisation that
// shares its state with every other M over the same Δ: the step response
// is d + c·x(t) for t > 0, where x' = A·x + b·1 with A the companion
// matrix of Δ made monic and b = (0, …, 0, 1), plus, when M has a higher
// degree than Δ, impulses at t = 0.
type part struct {
	// c are the coefficients of the remainder R = M mod Δ, divided by the
	// leading coefficient of Δ: R/Δ = (c₀ + c₁s + … + c_{n−1}s^{n−1})/Δ_monic.
	c []float64
	// d is the constant of the quotient M div Δ: the direct feedthrough.
	d float64
	// impulse[j] is the coefficient of s^(j+1) of the quotient: a unit
	// step through it gives impulse[j] times the j-th derivative of the
	// Dirac impulse at t = 0.
	impulse []float64
}

// split divides m by delta (degree n ≥ 0, non-zero leading coefficient)
// by long division, which forms every coefficient from products and one
// subtraction each.
func split(m, delta poly.Poly) part {
	n := len(delta) - 1
	rem := append(poly.Poly(nil), m...)
	for len(rem) > 0 && rem[len(rem)-1] == 0 {
		rem = rem[:len(rem)-1]
	}
	var quot []float64
	if len(rem) > n {
		quot = make([]float64, len(rem)-n)
		for k := len(rem) - 1; k >= n; k-- {
			q := rem[k] / delta[n]
			quot[k-n] = q
			for j := 0; j <= n; j++ {
				rem[k-n+j] -= q * delta[j]
			}
			rem[k] = 0
		}
	}
	p := part{c: make([]float64, n)}
	for k := 0; k < n && k < len(rem); k++ {
		p.c[k] = rem[k] / delta[n]
	}
	if len(quot) > 0 {
		p.d = quot[0]
		if len(quot) > 1 {
			p.impulse = quot[1:]
		}
	}
	return p
}

// antiderivative returns the row w and the constant f with
//
//	∫₀ᵗ (d + c·x(τ)) dτ = f·t + w·x(t)
//
// for the companion realisation of the monic polynomial a (ascending,
// a[n] = 1, a[0] ≠ 0). f = d + c₀/a₀ is the final value; the step response
// of (H(s) − H(0))/s has the numerator (a₀·R(s) − R(0)·Δ(s))/s, whose
// constant term cancels exactly, so w is formed from the coefficients
// with no differencing of evaluations.
func antiderivative(c, a []float64, d float64) (w []float64, f float64) {
	n := len(c)
	w = make([]float64, n)
	if n == 0 {
		return w, d
	}
	a0, c0 := a[0], c[0]
	for k := 0; k < n; k++ {
		ck1 := 0.0
		if k+1 < n {
			ck1 = c[k+1]
		}
		w[k] = (a0*ck1 - c0*a[k+1]) / a0
	}
	return w, d + c0/a0
}

// companion returns the n×n companion matrix (row-major) of the monic
// polynomial a of degree n: ones above the diagonal and −a₀ … −a_{n−1} in
// the last row, so that x₁ is the step response of 1/Δ and x_{k+1} = x₁^(k).
func companion(a []float64) []float64 {
	n := len(a) - 1
	m := make([]float64, n*n)
	for i := 0; i+1 < n; i++ {
		m[i*n+i+1] = 1
	}
	for j := 0; j < n; j++ {
		m[(n-1)*n+j] = -a[j]
	}
	return m
}

// monic returns p divided by its leading coefficient.
func monic(p poly.Poly) []float64 {
	n := len(p) - 1
	a := make([]float64, n+1)
	for k := range a {
		a[k] = p[k] / p[n]
	}
	a[n] = 1
	return a
}

// balance scales the n×n matrix a (row-major, in place) by a diagonal
// similarity D⁻¹·A·D with D a power of two in each entry, so that each
// row and the matching column have about the same norm, and returns D.
// It is the iteration of Parlett & Reinsch, "Balancing a matrix for
// calculation of eigenvalues and eigenvectors", Numer. Math. 13 (1969),
// without the permutation step. Powers of two make the scaling exact: the
// balanced matrix has the same exponential up to the same exact scaling.
// A companion matrix whose coefficients span many decades is the case it
// is for.
func balance(a []float64, n int) []float64 {
	d := make([]float64, n)
	for i := range d {
		d[i] = 1
	}
	for again := true; again; {
		again = false
		for i := 0; i < n; i++ {
			c, r := 0.0, 0.0
			for j := 0; j < n; j++ {
				if j != i {
					c += math.Abs(a[j*n+i])
					r += math.Abs(a[i*n+j])
				}
			}
			if c == 0 || r == 0 {
				continue
			}
			g, f, s := r/2, 1.0, c+r
			for c < g {
				f, c = f*2, c*4
			}
			g = r * 2
			for c > g {
				f, c = f/2, c/4
			}
			if (c+r)/f < 0.95*s {
				again = true
				d[i] *= f
				for j := 0; j < n; j++ {
					a[i*n+j] /= f
					a[j*n+i] *= f
				}
			}
		}
	}
	return d
}

// expm returns e^(M·t) for the k×k matrix m (row-major) as a row-major
// slice, by scaling and squaring carried out on W = e^X − I rather than
// on e^X: with X = M·t/2^s of 1-norm at most 1/4, W = X·φ₁(X), φ₁(X) =
// Σ X^j/(j+1)! summed until the remainder bound ‖X‖^(K+1)/(K+2)! falls
// below 2⁻⁵⁶, and each
// squaring e^(2X) = (I + W)² becomes W ← 2W + W². Squaring e^X itself
// would double the relative error of every mode close to 1 at each of
// the s squarings, and s grows with the fastest mode: a loop with poles
// 1e12 apart lost seven digits of its slow mode that way (and of the
// constant 1 of the augmented input rows). In the W form a slow mode is
// carried as its small departure from 1, with its own relative accuracy,
// and the rows and columns of an augmented input stay exact. This is the
// device of expm1 for scalars applied to the squaring phase; the Taylor
// start with a norm bound is the textbook one (Moler & Van Loan, SIAM
// Review 45, 2003, method 3).
func expm(m []float64, k int, t float64) []float64 {
	if k == 0 {
		return nil
	}
	x := make([]float64, len(m))
	norm := 0.0
	for j := 0; j < k; j++ {
		col := 0.0
		for i := 0; i < k; i++ {
			col += math.Abs(m[i*k+j] * t)
		}
		norm = max(norm, col)
	}
	s := 0
	if norm > expmNorm {
		s = int(math.Ceil(math.Log2(norm / expmNorm)))
	}
	scale := math.Ldexp(t, -s)
	for i, v := range m {
		x[i] = v * scale
	}
	// The series stops at the first power K whose remainder bound,
	// ‖X‖^(K+1)/(K+2)! over the sum, is below a unit of rounding.
	norm = math.Ldexp(norm, -s)
	terms, bound := 0, norm/2
	for bound > 0x1p-56 && terms < expmTerms {
		terms++
		bound *= norm / float64(terms+2)
	}
	// φ₁(X) by Horner's rule: P ← X·P + I/(j+1)!.
	p := make([]float64, len(m))
	tmp := make([]float64, len(m))
	fact := 1.0
	for j := 2; j <= terms+1; j++ {
		fact *= float64(j)
	}
	for i := 0; i < k; i++ {
		p[i*k+i] = 1 / fact
	}
	for j := terms - 1; j >= 0; j-- {
		fact /= float64(j + 2)
		matMul(tmp, x, p, k)
		p, tmp = tmp, p
		for i := 0; i < k; i++ {
			p[i*k+i] += 1 / fact
		}
	}
	w := make([]float64, len(m))
	matMul(w, x, p, k)
	for ; s > 0; s-- {
		matMul(tmp, w, w, k)
		for i := range w {
			w[i] = 2*w[i] + tmp[i]
		}
	}
	for i := 0; i < k; i++ {
		w[i*k+i]++
	}
	return w
}

// The base of expm: the norm bound of the scaled matrix and a cap on the
// powers of its Taylor series (at the bound, 11 powers meet the
// remainder test: 0.25^12/13! < 1e-17).
const (
	expmNorm  = 0.25
	expmTerms = 13
)

// matMul sets dst = a·b for k×k row-major matrices; dst must not alias
// a or b.
func matMul(dst, a, b []float64, k int) {
	for i := 0; i < k; i++ {
		row := dst[i*k : (i+1)*k]
		clear(row)
		for l := 0; l < k; l++ {
			if v := a[i*k+l]; v != 0 {
				bl := b[l*k : (l+1)*k]
				for j := range row {
					row[j] += v * bl[j]
				}
			}
		}
	}
}

// dot returns Σ a[i]·b[i].
func dot(a, b []float64) float64 {
	s := 0.0
	for i, v := range a {
		s += v * b[i]
	}
	return s
}

// rowTimes returns the row vector c·A for the n×n matrix a.
func rowTimes(c, a []float64) []float64 {
	n := len(c)
	r := make([]float64, n)
	for i, ci := range c {
		if ci == 0 {
			continue
		}
		for j := 0; j < n; j++ {
			r[j] += ci * a[i*n+j]
		}
	}
	return r
}
