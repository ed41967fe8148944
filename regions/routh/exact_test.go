package routh

import (
	"math"
	"math/big"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// exactRHP counts the right-half-plane roots of p (ascending float64
// coefficients, taken as the exact rationals they are) with the Routh
// array in exact rational arithmetic (math/big): the referee of these
// tests, outside the floating-point code under test. ok is false when a
// first-column entry is exactly zero, where the regular array says
// nothing and the special cases would be needed.
func exactRHP(p poly.Poly) (rhp int, ok bool) {
	n := len(p) - 1
	for n > 0 && p[n] == 0 {
		n--
	}
	if n < 1 || p[0] == 0 {
		return 0, false
	}
	w := n/2 + 1
	row := func(start int) []*big.Rat {
		r := make([]*big.Rat, w+1)
		for j := range r {
			r[j] = new(big.Rat)
			if i := n - start - 2*j; i >= 0 {
				r[j].SetFloat64(p[i])
			}
		}
		return r
	}
	a, b := row(0), row(1)
	prev := a[0].Sign()
	for k := 1; k <= n; k++ {
		if b[0].Sign() == 0 {
			return 0, false
		}
		if b[0].Sign() != prev {
			rhp++
		}
		prev = b[0].Sign()
		next := make([]*big.Rat, w+1)
		for j := range next {
			next[j] = new(big.Rat)
			if j+1 <= w {
				// a[j+1] − a[0]/b[0]·b[j+1]
				t := new(big.Rat).Quo(a[0], b[0])
				t.Mul(t, b[j+1])
				next[j].Sub(a[j+1], t)
			}
		}
		a, b = b, next
	}
	return rhp, true
}

// TestExactRefereeOnHandCases checks the referee itself on polynomials
// whose root locations are known by construction.
func TestExactRefereeOnHandCases(t *testing.T) {
	for _, c := range []struct {
		roots []complex128
		want  int
	}{
		{[]complex128{-1, -2, -3}, 0},
		{[]complex128{1, -3, complex(0.5, 3), complex(0.5, -3)}, 3},
		{[]complex128{-1, complex(-0.001, 5), complex(-0.001, -5), 2}, 1},
	} {
		if got, ok := exactRHP(poly.FromRoots(c.roots)); !ok || got != c.want {
			t.Errorf("roots %v: exact count %d (%v); want %d", c.roots, got, ok, c.want)
		}
	}
}

// TestLightlyDampedPairsAgainstExactCounts builds polynomials of degree
// 12 to 20 with several lightly damped pairs, some a little to the right
// of the imaginary axis (real parts from 1e-9 to 1e-6 of their size,
// hundreds to millions of rounding units off the axis), and checks the
// sign-array count against the exact rational array wherever that array
// has no zero pivot. A count that rounding could not move must be right:
// undecided is accepted only where a root is within a few hundred
// rounding units of the axis.
func TestLightlyDampedPairsAgainstExactCounts(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	test := Test{}
	checked, undecided := 0, 0
	for trial := 0; trial < 400; trial++ {
		deg := 12 + 2*rng.IntN(5)
		var roots []complex128
		pairs := 2 + rng.IntN(3)
		for k := 0; k < pairs; k++ {
			w := 0.5 + 4*rng.Float64()
			re := w * math.Pow(10, -9+3*rng.Float64())
			if rng.IntN(2) == 0 {
				re = -re
			}
			roots = append(roots, complex(re, w), complex(re, -w))
		}
		for len(roots) < deg {
			if len(roots)+2 <= deg && rng.IntN(2) == 0 {
				re, im := -(0.2 + 3*rng.Float64()), 0.5+5*rng.Float64()
				roots = append(roots, complex(re, im), complex(re, -im))
			} else {
				roots = append(roots, complex(-(0.1+4*rng.Float64()), 0))
			}
		}
		p := poly.FromRoots(roots).Scaled(math.Exp(6*rng.Float64() - 3))
		want, ok := exactRHP(p)
		if !ok {
			continue
		}
		v := test.NewCounter(len(p)).Count(stability.Function{P: p})
		if v.Unstable == stability.Undecided {
			undecided++
			continue
		}
		checked++
		if v.Unstable != want {
			t.Fatalf("trial %d, degree %d: count %d, exact %d\nroots %v", trial, len(p)-1, v.Unstable, want, roots)
		}
	}
	t.Logf("%d checked against exact counts, %d undecided", checked, undecided)
	if checked < 350 {
		t.Fatalf("only %d checked (%d undecided)", checked, undecided)
	}
}
