package zoh

import (
	"errors"
	"math"
	"math/cmplx"
)

// adjugateNumerators returns, for each vector g in gs, the n coefficients
// (ascending) of the polynomial
//
//	q(z) = C·adj(zI − Φ)·g = det(zI − Φ)·C·(zI − Φ)⁻¹·g,
//
// of degree at most n − 1, Φ being n×n row-major and C the row c.
//
// Method: q is evaluated at the n points z_j = e^(iπ(2j+1)/n) of the unit
// circle and its coefficients are recovered by the inverse discrete
// Fourier transform, q_k = (1/n)·Σ_j q(z_j)·z_j^(−k). The transform is
// perfectly conditioned (it is unitary up to the factor n), so each
// coefficient is accurate to the rounding of the values times
// max|q| on the circle, which is at most Σ|q_k|: the error is small
// against the coefficients as a whole, whatever the plant. The points sit
// half a step off z = 1, where the poles of integrating and slowly
// sampled plants gather.
//
// Each value comes from one LU factorisation with partial pivoting of
// zI − Φ: the product of the pivots is det(zI − Φ) and the solution x of
// (zI − Φ)·x = g is found with the same factors, so that det·x is the
// adjugate applied to g for a matrix within rounding of zI − Φ (backward
// stability of the factorisation, J. H. Wilkinson; N. J. Higham, Accuracy
// and Stability of Numerical Algorithms, 2nd ed., Sec. 9.3). The product
// stays accurate next to a pole, where det is small and x large, because
// it is a polynomial in the matrix entries: no point of the circle needs
// to be avoided except an exact eigenvalue, which rounding makes
// practically impossible and which is reported as an error.
//
// Coefficients are never formed by differencing evaluations: q's values
// are interpolated, not subtracted from one another.
func adjugateNumerators(phi, c []float64, gs [][]float64) ([][]float64, error) {
	n := len(c)
	m := make([]complex128, n*n)
	x := make([]complex128, n)
	perm := make([]int, n)
	out := make([][]float64, len(gs))
	acc := make([][]complex128, len(gs))
	for i := range gs {
		out[i] = make([]float64, n)
		acc[i] = make([]complex128, n)
	}
	for j := 0; j < n; j++ {
		z := cmplx.Rect(1, math.Pi*float64(2*j+1)/float64(n))
		for r := 0; r < n; r++ {
			for s := 0; s < n; s++ {
				m[r*n+s] = complex(-phi[r*n+s], 0)
			}
			m[r*n+r] += z
		}
		det := luFactor(m, perm, n)
		if det == 0 || cmplx.IsNaN(det) || cmplx.IsInf(det) {
			return nil, errors.New("a point of the interpolation fell on a pole of the sampled plant")
		}
		zinv := 1 / z
		for i, g := range gs {
			luSolve(x, m, perm, g, n)
			var v complex128
			for k := 0; k < n; k++ {
				v += complex(c[k], 0) * x[k]
			}
			v *= det
			// Accumulate v·z^(−k) for every k.
			w := v
			for k := 0; k < n; k++ {
				acc[i][k] += w
				w *= zinv
			}
		}
	}
	for i := range gs {
		for k := 0; k < n; k++ {
			out[i][k] = real(acc[i][k]) / float64(n)
		}
	}
	return out, nil
}

// luFactor overwrites the n×n row-major complex matrix m with its LU
// factors under partial pivoting (row swaps recorded in perm) and returns
// the determinant, zero when a pivot is exactly zero.
func luFactor(m []complex128, perm []int, n int) complex128 {
	det := complex(1, 0)
	for k := 0; k < n; k++ {
		p, best := k, -1.0
		for r := k; r < n; r++ {
			if a := cabs1(m[r*n+k]); a > best {
				p, best = r, a
			}
		}
		perm[k] = p
		if p != k {
			for s := 0; s < n; s++ {
				m[k*n+s], m[p*n+s] = m[p*n+s], m[k*n+s]
			}
			det = -det
		}
		piv := m[k*n+k]
		if piv == 0 {
			return 0
		}
		det *= piv
		for r := k + 1; r < n; r++ {
			f := m[r*n+k] / piv
			m[r*n+k] = f
			for s := k + 1; s < n; s++ {
				m[r*n+s] -= f * m[k*n+s]
			}
		}
	}
	return det
}

// luSolve solves (LU)·x = P·g with the factors of luFactor.
func luSolve(x, m []complex128, perm []int, g []float64, n int) {
	for i := range x {
		x[i] = complex(g[i], 0)
	}
	// The factorisation swapped whole rows, multipliers included, so the
	// swaps apply to g first, in order, and L then holds its final rows.
	for k := 0; k < n; k++ {
		x[k], x[perm[k]] = x[perm[k]], x[k]
	}
	for k := 0; k < n; k++ {
		for r := k + 1; r < n; r++ {
			x[r] -= m[r*n+k] * x[k]
		}
	}
	for k := n - 1; k >= 0; k-- {
		s := x[k]
		for j := k + 1; j < n; j++ {
			s -= m[k*n+j] * x[j]
		}
		x[k] = s / m[k*n+k]
	}
}

// cabs1 is |re| + |im|, the pivot size LAPACK uses for complex matrices.
func cabs1(v complex128) float64 { return math.Abs(real(v)) + math.Abs(imag(v)) }
