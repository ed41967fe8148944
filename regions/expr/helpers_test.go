package expr

import (
	"math"

	"gainscape/regions/poly"
)

// coefTol is the tolerance, relative to the largest expected coefficient,
// for coefficients that took a handful of roundings to compute.
const coefTol = 1e-13

// closeTo reports whether got and want, both highest power first, have
// the same length and agree coefficient by coefficient to within tol
// times the largest magnitude in want. Measuring against the scale of the
// whole polynomial, not each coefficient, is what matters for roots: a
// coefficient that should be 0 may come out as rounding residue.
func closeTo(got, want []float64, tol float64) bool {
	if len(got) != len(want) {
		return false
	}
	lim := tol * poly.Poly(want).Scale()
	for i := range want {
		if !(math.Abs(got[i]-want[i]) <= lim) {
			return false
		}
	}
	return true
}
