package margins

import (
	"cmp"
	"fmt"
	"math"
	"slices"

	"gainscape/regions/poly"
)

// Poles returns the roots of the characteristic polynomial char, computed
// by poly.Roots (gonum eigenvalues of the companion matrix), sorted by real
// part descending (ties by imaginary part descending), so that the first
// pole is the slowest or most unstable one. Only leading coefficients that
// are exactly zero are dropped: a leading coefficient that is tiny but not
// zero gives a correspondingly large pole. A constant non-zero polynomial
// has no poles (nil, nil).
func Poles(char poly.Poly) ([]complex128, error) {
	r, err := char.Roots()
	if err != nil {
		return nil, fmt.Errorf("margins: closed-loop poles: %w", err)
	}
	slices.SortFunc(r, func(a, b complex128) int {
		if c := cmp.Compare(real(b), real(a)); c != 0 {
			return c
		}
		return cmp.Compare(imag(b), imag(a))
	})
	return r, nil
}

// DecayRate returns −max Re(p) over the poles: the exponential rate at
// which the slowest mode decays, positive when every pole is in the open
// left half plane, zero or negative otherwise. With no poles it returns
// +Inf (the minimum over an empty set), which matches the shifted sign test of package overlay on a
// constant polynomial.
func DecayRate(poles []complex128) float64 {
	d := math.Inf(1)
	for _, p := range poles {
		d = min(d, -real(p))
	}
	return d
}

// MinDamping returns the least damping ratio ζ = −Re(p)/|p| over the
// poles: 1 for a pole on the negative real axis, 0 for a pole on the
// imaginary axis or at the origin, negative for an unstable pole (−1 on
// the positive real axis). With no poles it returns 1.
func MinDamping(poles []complex128) float64 {
	z := 1.0
	for _, p := range poles {
		m := math.Hypot(real(p), imag(p))
		if m == 0 {
			z = min(z, 0)
			continue
		}
		z = min(z, -real(p)/m)
	}
	return z
}
