package expr

import (
	"errors"
	"fmt"
	"math"

	"gainscape/regions/poly"
)

// ErrImproper is wrapped by the error Check returns for a plant whose
// numerator degree exceeds its denominator degree.
var ErrImproper = errors.New("plant is not proper")

// Check returns nil if num/den, with coefficients in ascending powers, is
// a plant the stability computations can use, and otherwise an error that
// says what is wrong. A plant is usable if both polynomials have at least
// one coefficient, every coefficient is finite, the denominator is not
// zero, and the plant is proper: deg num ≤ deg den. Degrees are taken after
// dropping leading coefficients that are exactly zero, so a list typed
// with leading zeros is judged by what it means. A zero numerator passes.
//
// Check is separate from Parse and ParseList so that a caller decides
// whether an improper plant is an error in its setting.
func Check(num, den poly.Poly) error {
	if err := checkPoly("numerator", num); err != nil {
		return err
	}
	if err := checkPoly("denominator", den); err != nil {
		return err
	}
	dd := den.Degree()
	if dd < 0 {
		return errors.New("plant denominator is zero: every coefficient is 0")
	}
	if dn := num.Degree(); dn > dd {
		return fmt.Errorf("%w: numerator degree %d exceeds denominator degree %d", ErrImproper, dn, dd)
	}
	return nil
}

func checkPoly(name string, p poly.Poly) error {
	if len(p) == 0 {
		return fmt.Errorf("plant %s has no coefficients", name)
	}
	for k, v := range p {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("plant %s %s is %v, not a finite number", name, coefficientName(k), v)
		}
	}
	return nil
}

// coefficientName names the coefficient of s^k as an engineer would.
func coefficientName(k int) string {
	switch k {
	case 0:
		return "constant term"
	case 1:
		return "coefficient of s"
	}
	return fmt.Sprintf("coefficient of s^%d", k)
}
