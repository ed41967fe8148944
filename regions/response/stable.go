package response

import (
	"cmp"
	"fmt"
	"math/cmplx"
	"slices"

	"gainscape/regions/margins"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// wellPosed returns an error for a loop where 1 + C·G vanishes at
// infinity, or may vanish within rounding.
func wellPosed(c closedLoop, l Loop) error {
	switch {
	case c.illPosed:
		return fmt.Errorf("response: %w: the loop is ill-posed (1 + C·G vanishes at infinity, so a closed-loop root has gone to infinity), in %v", ErrUnstable, l)
	case c.roundedLead:
		return fmt.Errorf("response: %w: the leading coefficient of the characteristic polynomial is within rounding of zero "+
			"(1 + C·G nearly vanishes at infinity), in %v", ErrUndecided, l)
	}
	return nil
}

// requireStable returns nil when the Routh sign array (routh.Hurwitz,
// the project's one stability predicate) puts every root of p in the
// open left half plane with no drop of degree, and otherwise an error wrapping ErrUnstable or ErrUndecided
// that names the loop. what names the polynomial in the message; drop
// says what a drop of its degree means.
func requireStable(p poly.Poly, what, drop string, l Loop) error {
	if routh.Hurwitz(p, make([]float64, routh.WorkLen(len(p)-1))) {
		return nil
	}
	rep := routh.Analyze(p)
	switch {
	case rep.Undecided:
		return fmt.Errorf("response: %w: %s: %s, in %v", ErrUndecided, what, rep.Reason, l)
	case rep.Stable():
		return nil
	case rep.RHP == 0 && rep.JW == 0:
		return fmt.Errorf("response: %w: %s loses degree (%s), in %v", ErrUnstable, what, drop, l)
	}
	return fmt.Errorf("response: %w: %s has roots on the unstable side (%d) or on the boundary (%d), in %v",
		ErrUnstable, what, rep.RHP, rep.JW, l)
}

// What a drop of degree of the tested polynomial means.
const (
	dropInfinity = "a root close to infinity: the loop is nearly ill-posed"
	dropMinusOne = "a root at z = −1"
)

// bilinear returns Q(w) = (1 − w)^n·P((1 + w)/(1 − w)) for P of degree n:
// the map z = (1 + w)/(1 − w) takes the inside of the unit circle to the
// open left half plane, z = 1 to w = 0 and z = −1 to a drop of the
// degree of Q. Every coefficient is a sum of products of P's
// coefficients with binomial coefficients, formed exactly by polynomial
// multiplication.
func bilinear(p poly.Poly) poly.Poly {
	n := len(p) - 1
	plus, minus := poly.Poly{1, 1}, poly.Poly{1, -1}
	q := make(poly.Poly, n+1)
	for k, c := range p {
		if c == 0 {
			continue
		}
		t := poly.Mul(plus.Pow(k), minus.Pow(n-k))
		for j, v := range t {
			q[j] += c * v
		}
	}
	return q
}

// polesContinuous returns the roots of Δ (gonum eigenvalues of the
// companion matrix), slowest first, after requireStable has passed; an
// eigenvalue that lands on the unstable side despite the sign array
// makes the verdict undecided.
func polesContinuous(delta poly.Poly, l Loop) ([]complex128, error) {
	p, err := margins.Poles(delta)
	if err != nil {
		return nil, fmt.Errorf("response: %w in %v", err, l)
	}
	if len(p) > 0 && real(p[0]) >= 0 {
		return nil, fmt.Errorf("response: %w: the sign array finds the loop stable but an eigenvalue %v is not in the left half plane, in %v",
			ErrUndecided, p[0], l)
	}
	return p, nil
}

// polesSampled is polesContinuous for the unit circle, slowest (largest
// modulus) first.
func polesSampled(delta poly.Poly, l Loop) ([]complex128, error) {
	p, err := delta.Roots()
	if err != nil {
		return nil, fmt.Errorf("response: %w in %v", err, l)
	}
	slices.SortStableFunc(p, func(a, b complex128) int { return cmp.Compare(cmplx.Abs(b), cmplx.Abs(a)) })
	for _, z := range p {
		if cmplx.Abs(z) >= 1 {
			return nil, fmt.Errorf("response: %w: the bilinear sign array finds the loop stable but the eigenvalue %v is not inside the unit circle, in %v",
				ErrUndecided, z, l)
		}
	}
	return p, nil
}
