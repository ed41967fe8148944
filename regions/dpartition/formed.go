package dpartition

import (
	"math"

	"gainscape/regions/poly"
)

// formTol is the size, relative to the sum of the magnitudes of the
// products that formed it, below which a formed coefficient is rounding
// and taken as zero: a few thousand units of rounding, allowing for sums
// of up to a few hundred products whose inputs carry rounding of their own.
const formTol = 1e-12

// formed is a polynomial whose coefficients are sums of products of input
// coefficients, carried with the sum of the magnitudes of those products.
// Coefficients are formed exactly (products and sums of the inputs, never
// differences of evaluations), and the magnitudes make every zero test
// relative to what formed the coefficient, whatever the scale of the
// input.
type formed struct {
	c, m poly.Poly
}

func input(p poly.Poly) formed {
	m := make(poly.Poly, len(p))
	for i, v := range p {
		m[i] = math.Abs(v)
	}
	return formed{p.Clone(), m}
}

func (f formed) mul(g formed) formed { return formed{poly.Mul(f.c, g.c), poly.Mul(f.m, g.m)} }
func (f formed) add(g formed) formed { return formed{poly.Add(f.c, g.c), poly.Add(f.m, g.m)} }
func (f formed) sub(g formed) formed { return formed{poly.Sub(f.c, g.c), poly.Add(f.m, g.m)} }

func (f formed) scale(k float64) formed {
	return formed{f.c.Scaled(k), f.m.Scaled(math.Abs(k))}
}

// derivative is the derivative in the polynomial's own variable; the
// factors k are exact.
func (f formed) derivative() formed { return formed{f.c.Derivative(), f.m.Derivative()} }

// clean returns the coefficients with those at rounding level set to zero
// and zero leading coefficients dropped.
func (f formed) clean() poly.Poly {
	p := make(poly.Poly, len(f.c))
	for k, v := range f.c {
		if math.Abs(v) > formTol*f.m[k] {
			p[k] = v
		}
	}
	return p[:p.Degree()+1]
}

// zero reports whether every coefficient is rounding.
func (f formed) zero() bool { return len(f.clean()) == 0 }

// The ν-forms of a polynomial U(s) on the imaginary axis: with ν = ω²,
//
//	U(jω) = even(U)(ν) + jω·odd(U)(ν),
//
// even(U)_j = (−1)^j u_2j and odd(U)_j = (−1)^j u_(2j+1). Both are formed
// by sign changes alone, so they are exact.
func (f formed) even() formed { return formed{alternate(f.c, 0), take(f.m, 0)} }
func (f formed) odd() formed  { return formed{alternate(f.c, 1), take(f.m, 1)} }

// reflect returns U(−s).
func (f formed) reflect() formed {
	c := f.c.Clone()
	for k := 1; k < len(c); k += 2 {
		c[k] = -c[k]
	}
	return formed{c, f.m.Clone()}
}

func alternate(p poly.Poly, start int) poly.Poly {
	if len(p) <= start {
		return poly.Poly{}
	}
	r := make(poly.Poly, (len(p)-start+1)/2)
	for j := range r {
		v := p[2*j+start]
		if j%2 == 1 {
			v = -v
		}
		r[j] = v
	}
	return r
}

// take returns every second coefficient from start, without sign changes,
// for the magnitudes.
func take(p poly.Poly, start int) poly.Poly {
	if len(p) <= start {
		return poly.Poly{}
	}
	r := make(poly.Poly, (len(p)-start+1)/2)
	for j := range r {
		r[j] = p[2*j+start]
	}
	return r
}
