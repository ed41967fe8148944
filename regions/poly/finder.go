package poly

import (
	"math"

	"gonum.org/v1/gonum/lapack"
	lapackgonum "gonum.org/v1/gonum/lapack/gonum"
)

// Finder computes the roots of polynomials up to a fixed degree as the
// eigenvalues of their companion matrices, reusing its buffers so that it
// allocates little (gonum's QR iteration keeps one small array on the heap
// per iteration).
//
// The companion matrix (first row −p[n−1..0]/p[n], ones on the
// subdiagonal) is already upper Hessenberg, so the Hessenberg reduction of
// a general eigenvalue solver is skipped: the matrix is balanced by
// diagonal scaling, which keeps it Hessenberg (B. N. Parlett, C. Reinsch,
// "Balancing a matrix for calculation of eigenvalues and eigenvectors",
// Numer. Math. 13, 1969; gonum's Dgebal), and its eigenvalues are found by
// the double-shift QR algorithm (J. G. F. Francis, "The QR transformation",
// Computer Journal 4, 1961–62; gonum's Dlahqr). These are the steps
// poly.Roots takes through gonum's mat.Eigen, without its allocations.
type Finder struct {
	h, scale, wr, wi []float64
}

// NewFinder returns a Finder for polynomials with up to n coefficients.
func NewFinder(n int) *Finder {
	d := max(n-1, 1)
	return &Finder{
		h:     make([]float64, d*d),
		scale: make([]float64, d),
		wr:    make([]float64, d),
		wi:    make([]float64, d),
	}
}

var lapackImpl lapackgonum.Implementation

// Roots returns the real and imaginary parts of the roots of p, after
// dropping leading coefficients that are exactly zero, in slices owned by
// f and valid until its next use. ok is false when the QR iteration did
// not converge or p has no non-zero coefficient. It panics if p has more
// coefficients than f was made for.
func (f *Finder) Roots(p Poly) (re, im []float64, ok bool) {
	p = p.Trim(0)
	n := len(p) - 1
	if n < 0 {
		return nil, nil, false
	}
	if n == 0 {
		return f.wr[:0], f.wi[:0], true
	}
	h := f.h[:n*n]
	clear(h)
	inv := 1 / p[n]
	for j := 0; j < n; j++ {
		h[j] = -p[n-1-j] * inv
	}
	for i := 1; i < n; i++ {
		h[i*n+i-1] = 1
	}
	re, im = f.wr[:n], f.wi[:n]
	ilo, ihi := lapackImpl.Dgebal(lapack.Scale, n, h, n, f.scale[:n])
	if lapackImpl.Dlahqr(false, false, n, ilo, ihi, h, n, re, im, 0, n-1, nil, 1) != 0 {
		return nil, nil, false
	}
	return re, im, true
}

// DecayAndDamping returns the decay rate σ = −max Re(root) and the
// smallest damping ratio ζ = min −Re(root)/|root| of the roots of p, NaN
// for both when the eigenvalues cannot be computed. A polynomial without
// roots (a constant) has neither a slowest nor a least damped root: +Inf
// and 1.
func (f *Finder) DecayAndDamping(p Poly) (decay, damping float64) {
	re, im, ok := f.Roots(p)
	if !ok {
		return math.NaN(), math.NaN()
	}
	if len(re) == 0 {
		return math.Inf(1), 1
	}
	maxRe, zeta := math.Inf(-1), math.Inf(1)
	for k, r := range re {
		maxRe = math.Max(maxRe, r)
		if m := math.Hypot(r, im[k]); m > 0 {
			zeta = math.Min(zeta, -r/m)
		} else {
			zeta = math.Min(zeta, 0) // a pole at s = 0 is undamped
		}
	}
	return -maxRe, zeta
}
