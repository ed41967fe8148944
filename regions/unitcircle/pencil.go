package unitcircle

import (
	"math"

	"gonum.org/v1/gonum/mat"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Candidate is a value k of the parameter of a pencil a(z) + k·b(z) at
// which a root of the pencil lies on the unit circle.
type Candidate struct {
	K float64
	// Kind is Real for a root at z = 1, Alternating for z = −1, Complex
	// for a pair at e^(±jθ), θ ∈ (0, π), and Infinite where the leading
	// coefficient vanishes (a root at z = ∞, which is outside on both
	// sides; see the package comment).
	Kind stability.Kind
	// Theta is the angle of the root on the circle: 0, π, θ, or NaN for
	// Infinite.
	Theta float64
}

// PencilCandidates returns, in no particular order, every real k at which
// a(z) + k·b(z) has a root on the unit circle or loses its leading
// coefficient: the D-partition of one parameter for a sampled-data loop.
// a and b hold ascending coefficients and have one length. A candidate
// need not change stability (a pair may touch the circle and return, or
// cross while other roots stay outside); the caller tests the pieces
// between candidates.
//
// Method: the Chebyshev representation of a polynomial on the unit
// circle, as H. Xu, A. Datta and S. P. Bhattacharyya use it to compute
// the stabilising PID gains of digital control systems (IEEE Trans.
// Automatic Control 46, 2001; recalled, not copied). The three
// conditions are
//
//   - z = 1:  a(1) + k·b(1) = 0,
//   - z = −1: a(−1) + k·b(−1) = 0,
//   - z = e^(jθ), 0 < θ < π: a(e^(jθ)) + k·b(e^(jθ)) = 0 for a real k,
//     which requires Im(a(e^(jθ))·conj b(e^(jθ))) = 0.
//
// With a·conj b = Σ_{i,j} a_i·b_j·e^(j(i−j)θ) the last is
//
//	Σ_{m≥1} d_m·sin(mθ) = sin θ · Σ_{m≥1} d_m·U_{m−1}(cos θ) = 0,
//	d_m = Σ_i (a_i·b_{i−m} − a_{i−m}·b_i),
//
// U being the Chebyshev polynomials of the second kind. sin θ is not zero
// inside (0, π), so the crossings are the roots x = cos θ in (−1, 1) of a
// polynomial in the U basis. The d_m are formed from the coefficients
// directly (no evaluation is differenced); those within the rounding of
// their own terms are set to zero. The roots are the eigenvalues of the
// comrade matrix of the U basis (S. Barnett, "A companion matrix analogue
// for orthogonal polynomials", Linear Algebra Appl. 12, 1975; the
// Chebyshev analogue of the companion matrix, recalled), from gonum's
// eigenvalue solver, polished by Newton's method with Clenshaw's
// recurrence; working on [−1, 1] in the U basis avoids the growth of the
// power-basis coefficients of U_m (2^m). Each root gives θ = acos x and
// k = −Re(a·conj b)/|b|² from the two polynomials evaluated at e^(jθ).
//
// Limits: a crossing near θ = 0 has x = cos θ near 1, where θ is found
// to about ε/θ absolutely, so a loop sampled very fast relative to its
// dynamics (θ = ωT ≪ 1e-4) gets candidates that only bisection makes
// precise; the caller confirms every end by the stability test. If
// a·conj b is real on the whole circle (the d_m all vanish) there is no
// isolated complex candidate; then a/b is real on the circle, and the
// pieces between the other candidates are still tested.
func PencilCandidates(a, b poly.Poly) []Candidate {
	if len(a) != len(b) {
		panic("unitcircle: pencil parts of different lengths")
	}
	n := len(a) - 1
	if n < 0 || b.Degree() < 0 {
		return nil
	}
	var cs []Candidate
	add := func(num, den float64, kind stability.Kind, theta float64) {
		if den != 0 {
			cs = append(cs, Candidate{K: -num/den + 0, Kind: kind, Theta: theta})
		}
	}
	add(sumAt(a, 1), sumAt(b, 1), stability.Real, 0)
	add(sumAt(a, -1), sumAt(b, -1), stability.Alternating, math.Pi)
	add(a[n], b[n], stability.Infinite, math.NaN())
	for _, theta := range circleAngles(a, b) {
		z := complex(math.Cos(theta), math.Sin(theta))
		av, bv := a.Eval(z), b.Eval(z)
		b2 := real(bv)*real(bv) + imag(bv)*imag(bv)
		if b2 <= sq(coefTol*absOnCircle(b)) {
			continue // b(e^(jθ)) = 0: no finite k puts a root there
		}
		k := -(real(av)*real(bv) + imag(av)*imag(bv)) / b2
		cs = append(cs, Candidate{K: k + 0, Kind: stability.Complex, Theta: theta})
	}
	return cs
}

// coefTol is the relative size, against the terms that form it, below
// which b(e^(jθ)) counts as zero: a few hundred rounding errors of forming
// the characteristic polynomial, with a wide margin.
const coefTol = 1e-13

// nearReal is the largest imaginary part of an eigenvalue x still taken
// as a real root in [−1, 1]. It is generous: a tangency makes a double
// root, which eigenvalues find only to about the square root of the unit
// roundoff, and an extra candidate costs one stability test while a
// missing one could hide an edge.
const nearReal = 1e-5

// circleAngles returns the angles θ ∈ (0, π) at which
// Im(a(e^(jθ))·conj b(e^(jθ))) = 0 (see PencilCandidates).
func circleAngles(a, b poly.Poly) []float64 {
	n := len(a) - 1
	// c[m−1] = d_m, the coefficient of U_{m−1}.
	c := make([]float64, n)
	for m := 1; m <= n; m++ {
		var d, size float64
		for i := m; i <= n; i++ {
			u, v := a[i]*b[i-m], a[i-m]*b[i]
			d += u - v
			size += math.Abs(u) + math.Abs(v)
		}
		if math.Abs(d) <= float64(16*(n+1))*unit*size {
			d = 0
		}
		c[m-1] = d
	}
	top := len(c) - 1
	for top >= 0 && c[top] == 0 {
		top--
	}
	if top < 1 {
		return nil // a constant (or zero) in the U basis has no root
	}
	c = c[:top+1]
	xs := comradeRoots(c)
	var out []float64
	for _, x := range xs {
		x = polishU(c, x)
		if !(x > -1 && x < 1) {
			continue // θ = 0 and θ = π are the real candidates
		}
		out = append(out, math.Acos(x))
	}
	return out
}

// comradeRoots returns the real roots in [−1 − δ, 1 + δ] (δ = 1e-9) of
// q(x) = Σ c_m·U_m(x), c[len−1] ≠ 0, as eigenvalues of the comrade matrix
// M with x·u = M·u for u = (U_0, …, U_{d−1}): from x·U_0 = U_1/2,
// x·U_m = (U_{m−1} + U_{m+1})/2 and U_d = −Σ_{m<d} (c_m/c_d)·U_m.
func comradeRoots(c []float64) []float64 {
	d := len(c) - 1
	m := mat.NewDense(d, d, nil)
	for i := 0; i < d; i++ {
		if i > 0 {
			m.Set(i, i-1, 0.5)
		}
		if i+1 < d {
			m.Set(i, i+1, 0.5)
		}
	}
	for j := 0; j < d; j++ {
		m.Set(d-1, j, m.At(d-1, j)-0.5*c[j]/c[d])
	}
	var e mat.Eigen
	if !e.Factorize(m, mat.EigenNone) {
		return nil
	}
	var out []float64
	for _, v := range e.Values(nil) {
		if math.Abs(imag(v)) <= nearReal && math.Abs(real(v)) <= 1+1e-9 {
			out = append(out, real(v))
		}
	}
	return out
}

// polishU improves a root x of Σ c_m·U_m by Newton's method, the value
// and derivative from Clenshaw's recurrence b_k = c_k + 2x·b_{k+1} −
// b_{k+2}, keeping the last iterate that reduced |q|.
func polishU(c []float64, x float64) float64 {
	eval := func(x float64) (q, dq float64) {
		var b1, b2, d1, d2 float64
		for k := len(c) - 1; k >= 0; k-- {
			b0 := c[k] + 2*x*b1 - b2
			d0 := 2*b1 + 2*x*d1 - d2
			b1, b2 = b0, b1
			d1, d2 = d0, d1
		}
		return b1, d1
	}
	q, dq := eval(x)
	for it := 0; it < 8 && q != 0 && dq != 0; it++ {
		next := x - q/dq
		nq, ndq := eval(next)
		if !(math.Abs(nq) < math.Abs(q)) {
			break
		}
		x, q, dq = next, nq, ndq
	}
	return x
}

// sumAt returns p(1) (sign 1) or p(−1) (sign −1) by compensated summation
// (Neumaier's variant of Kahan's), since these sums cancel heavily when
// the roots crowd z = 1: within a unit in the last place of the result
// unless the sum cancels by more than about 10^16. A sum no larger than
// the input's own rounding can make of it is zero, as the count judges it
// (mapToHalfPlane): a plant with an integrator has D(1) = 0, not 3e-16.
func sumAt(p poly.Poly, sign float64) float64 {
	var s, comp, size float64
	f := 1.0
	for _, c := range p {
		v := f * c
		t := s + v
		if math.Abs(s) >= math.Abs(v) {
			comp += (s - t) + v
		} else {
			comp += (v - t) + s
		}
		s = t
		size += math.Abs(c)
		f *= sign
	}
	if v := s + comp; math.Abs(v) > (inputUlps+1)*unit*size {
		return v
	}
	return 0
}

// absOnCircle returns Σ|p_k|, the size of the terms of p on the circle.
func absOnCircle(p poly.Poly) float64 {
	var s float64
	for _, c := range p {
		s += math.Abs(c)
	}
	return s
}

func sq(x float64) float64 { return x * x }
