package routh

import (
	"math"

	"gainscape/regions/poly"
)

// Crossing describes a polynomial that sits (to within rounding) on the
// boundary where roots cross the imaginary axis, as the sign array shows
// it there.
type Crossing struct {
	// Vanishing is which part of the array nearly vanishes: "constant"
	// (the constant coefficient: a real root at s = 0), "leading" (the
	// leading coefficient: a root through infinity) or "row" (a whole row:
	// an imaginary pair, frequency Omega).
	Vanishing string
	// Omega is the frequency of the crossing pair for "row", 0 for
	// "constant", NaN for "leading".
	Omega float64
	// Aux is the auxiliary polynomial formed from the row above the
	// vanishing row, for "row".
	Aux poly.Poly
}

// ClassifyCrossing looks at p, a characteristic polynomial found by
// bisection to lie very close to a stability boundary, and says how its
// roots cross there. The constant and leading coefficients are measured
// against their neighbours (see endSize); each row of the regular sign array
// by the ratio of its largest entry to the size of the terms that formed it
// (how completely it cancelled). The smallest of these names the crossing.
// For a row, the auxiliary polynomial of the row above gives ω, polished by
// Newton's method on p itself. This is the D-partition classification
// (Yu. I. Neimark, "On the determination of the values of parameters for
// which an automatic regulation system is stable", Avtomatika i
// Telemekhanika 9(3), 1948): real-root, complex-root and infinite-root
// boundaries.
func ClassifyCrossing(p poly.Poly) Crossing {
	scale := p.Scale()
	n := len(p) - 1
	for n > 0 && p[n] == 0 {
		n--
	}
	best := Crossing{Vanishing: "constant", Omega: 0}
	bestSize := endSize(p, 0, scale)
	if s := endSize(p, len(p)-1, scale); s < bestSize {
		best, bestSize = Crossing{Vanishing: "leading", Omega: math.NaN()}, s
	}
	q := p[:n+1]
	w := n/2 + 1
	a, b := make([]float64, w), make([]float64, w)
	for j := 0; j < w; j++ {
		if i := n - 2*j; i >= 0 {
			a[j] = q[i]
		}
		if i := n - 1 - 2*j; i >= 0 {
			b[j] = q[i]
		}
	}
	if (n-1)%2 == 1 {
		// The second row holds the odd coefficients directly; it vanishes
		// when a pair crosses on a polynomial of even degree 2 or more.
		size := 0.0
		for _, v := range b {
			size = math.Max(size, math.Abs(v))
		}
		if size/scale < bestSize {
			aux := make(poly.Poly, n+1)
			for j, v := range a {
				if d := n - 2*j; d >= 0 {
					aux[d] = v
				}
			}
			best, bestSize = Crossing{Vanishing: "row", Aux: aux, Omega: auxOmega(aux, q)}, size/scale
		}
	}
	for k := 1; k < n; k++ {
		// b is row s^(n-k); form row s^(n-k-1) and measure its cancellation.
		if b[0] == 0 {
			break
		}
		r := a[0] / b[0]
		next := make([]float64, w)
		size, terms := 0.0, 0.0
		for j := 0; j+1 < w; j++ {
			x, y := a[j+1], r*b[j+1]
			next[j] = x - y
			size = math.Max(size, math.Abs(next[j]))
			terms = math.Max(terms, math.Abs(x)+math.Abs(y))
		}
		power := n - k - 1
		if terms > 0 && power%2 == 1 && size/terms < bestSize {
			// Auxiliary polynomial from row b (power+1), even in s.
			aux := make(poly.Poly, power+2)
			for j, v := range b {
				if d := power + 1 - 2*j; d >= 0 {
					aux[d] = v
				}
			}
			best, bestSize = Crossing{Vanishing: "row", Aux: aux, Omega: auxOmega(aux, q)}, size/terms
		}
		a, b = b, next
	}
	return best
}

// auxOmega returns the frequency of the imaginary-axis pair of aux nearest
// the axis, polished on p.
func auxOmega(aux, p poly.Poly) float64 {
	roots, err := aux.Roots()
	if err != nil || len(roots) == 0 {
		return math.NaN()
	}
	bestRe, pick := math.Inf(1), roots[0]
	for _, r := range roots {
		if math.Abs(real(r)) < bestRe && imag(r) != 0 {
			bestRe, pick = math.Abs(real(r)), r
		}
	}
	return math.Abs(imag(p.Polish(complex(0, math.Abs(imag(pick))))))
}

// endSize measures how nearly the end coefficient p[k] (k = 0 or the last)
// vanishes, on a scale that does not depend on how fast the loop is. The
// root scale ρ = (|p1|/|pn−1|)^(1/(n−2)) is taken from the inner
// coefficients alone, so that neither vanishing end distorts it; a
// coefficient that is not vanishing then has |p0| ≈ |p1|·ρ and
// |pn|·ρ ≈ |pn−1|, a ratio of order one whatever the time scale, and the
// ratio falls in proportion to the distance from a boundary where that
// coefficient vanishes. Comparing with the largest coefficient instead
// would call the leading coefficient of a fast loop (roots near 1e4)
// vanishing everywhere. Below degree 3, or where an inner coefficient is
// zero, there is no inner scale and it falls back to scale, the largest
// coefficient.
func endSize(p poly.Poly, k int, scale float64) float64 {
	n := len(p) - 1
	if n < 3 || p[1] == 0 || p[n-1] == 0 {
		return math.Abs(p[k]) / scale
	}
	rho := math.Pow(math.Abs(p[1])/math.Abs(p[n-1]), 1/float64(n-2))
	if k == 0 {
		return math.Abs(p[0]) / (math.Abs(p[1]) * rho)
	}
	return math.Abs(p[n]) * rho / math.Abs(p[n-1])
}
