package routh

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
)

// Inclusion counts the right-half-plane roots of a polynomial from
// approximate roots, certified by disks that provably hold the roots of
// every polynomial within the input tolerance of the given one. It is the
// middle tier between Count and Analyze: Count's running error bound sums
// the magnitudes of every error it carries, and at high degree (above 20
// or so) that sum grows by a factor of several per row even where the
// true rounding error stays near 1e-13 (measured against exact rational
// arithmetic), so the fast path hands away nodes it computed right. The
// disks decide them at the cost of one eigenvalue solve instead of a full
// analysis.
//
// Method: with distinct approximations z_1 … z_n of the roots of p
// (degree n, leading coefficient a_n), Lagrange interpolation at the z_i
// gives (derived by hand)
//
//	p(λ)/a_n = ∏(λ − z_j) · (1 + Σ_i W_i/(λ − z_i)),
//	W_i = p(z_i) / (a_n · ∏_{j≠i} (z_i − z_j)),
//
// which is det(λI − M) for M = diag(z) − W·1ᵀ. By Gershgorin's theorem
// (S. A. Gerschgorin, Izv. Akad. Nauk SSSR 6, 1931) on the rows of M the
// roots lie in the disks of centre z_i − W_i and radius (n − 1)·|W_i|, a
// set of k disks disjoint from the others holding exactly k roots. (The
// same disks are the Weierstrass-correction inclusions of the literature,
// e.g. L. Elsner, "A remark on simultaneous inclusions of the zeros of a
// polynomial by Gershgorin's theorem", Numer. Math. 21, 1973, from memory.)
// Every polynomial whose coefficients differ from p's by at most
// inputUlps units in the last place of each, evaluated with rounding,
// moves each W_i by at most δ_i, bounded from Σ|a_k|·|z_i|^k; the radii
// are widened to (n − 1)·|W_i| + n·δ_i to hold them all. When every disk
// lies strictly on one side of the imaginary axis, the count is the
// number of disks on the right, for every polynomial in that tolerance:
// one that rounding cannot move. Otherwise (a root near the axis, a
// cluster of roots, an eigenvalue solver that failed) it declines.
type Inclusion struct {
	finder *poly.Finder
	z, w   []complex128
	rad    []float64
}

// NewInclusion returns an Inclusion for polynomials with up to n
// coefficients.
func NewInclusion(n int) *Inclusion {
	return &Inclusion{finder: poly.NewFinder(n), z: make([]complex128, n), w: make([]complex128, n), rad: make([]float64, n)}
}

// Count returns the number of right-half-plane roots of q (ascending
// coefficients, q[0] and the leading coefficient non-zero) and true when
// the disks certify it, or false when they do not. It panics if q has
// more coefficients than the Inclusion was made for.
func (c *Inclusion) Count(q []float64) (rhp int, ok bool) {
	n := len(q) - 1
	if n < 1 || q[0] == 0 || q[n] == 0 {
		return 0, false
	}
	re, im, ok := c.finder.Roots(q)
	if !ok || len(re) != n {
		return 0, false
	}
	z := c.z[:n]
	for i := range z {
		z[i] = complex(re[i], im[i])
		if cmplx.IsNaN(z[i]) || cmplx.IsInf(z[i]) {
			return 0, false
		}
	}
	// The Weierstrass corrections move each approximation to the centre
	// of its disk (the Durand–Kerner step, quadratically convergent for
	// simple roots); when the first disks straddle the axis, two more
	// steps sharpen approximations that the eigenvalue solver left loose.
	for pass := 0; pass < 3; pass++ {
		if rhp, ok := c.disks(q, z); ok {
			return rhp, true
		}
		for i := range z {
			z[i] -= c.w[i]
		}
	}
	return 0, false
}

// disks computes the corrections and radii at the approximations z and
// returns the count when every disk lies off the imaginary axis.
func (c *Inclusion) disks(q []float64, z []complex128) (rhp int, ok bool) {
	n := len(q) - 1
	an := math.Abs(q[n])
	// Relative rounding of the evaluation of p(z) by Horner's rule in
	// complex arithmetic (a few units per step), with the input tolerance.
	evalTol := float64(inputUlps+8*n+8) * unit
	// Relative rounding of the product, the division and the centre.
	prodTol := float64(4*n+16) * unit
	for i, zi := range z {
		// p(z_i) and Σ|a_k|·|z_i|^k by Horner's rule.
		var v complex128
		abs, r := 0.0, cmplx.Abs(zi)
		for k := n; k >= 0; k-- {
			v = v*zi + complex(q[k], 0)
			abs = abs*r + math.Abs(q[k])
		}
		prod := complex(1, 0)
		for j, zj := range z {
			if j != i {
				prod *= zi - zj
			}
		}
		ap := cmplx.Abs(prod)
		if ap == 0 || math.IsInf(ap, 0) || math.IsNaN(ap) {
			return 0, false
		}
		wi := v / (complex(q[n], 0) * prod)
		aw := cmplx.Abs(wi)
		delta := evalTol*abs/(an*ap) + prodTol*aw
		c.w[i] = wi
		c.rad[i] = float64(n-1)*aw + float64(n)*delta
	}
	for i, zi := range z {
		centre := zi - c.w[i]
		margin := c.rad[i] + 4*unit*cmplx.Abs(centre)
		if !(math.Abs(real(centre)) > margin) {
			return 0, false
		}
		if real(centre) > 0 {
			rhp++
		}
	}
	return rhp, true
}
