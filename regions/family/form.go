package family

import (
	"fmt"
	"math/bits"

	"gainscape/regions/poly"
)

// Term is one product Coef·v_i·v_j·… of a coefficient and the values of
// the parameters whose bits are set in Mask (bit i for parameter i of the
// family's Params order).
type Term struct {
	Coef float64
	Mask uint32
}

// Const returns the constant term c.
func Const(c float64) Term { return Term{Coef: c} }

// Times returns the term c·v_p·v_q·… for the parameter indices given. It
// panics if an index repeats, since a Form is affine in each parameter.
func Times(c float64, params ...int) Term {
	var m uint32
	for _, p := range params {
		if p < 0 || p >= 32 || m&(1<<p) != 0 {
			panic(fmt.Sprintf("family: parameter index %d out of range or repeated in a term", p))
		}
		m |= 1 << p
	}
	return Term{Coef: c, Mask: m}
}

// Form is a multi-affine function of the parameter values: a sum of
// terms in which no parameter appears twice. Every coefficient of a
// controller's numerator and denominator is a Form, which is what lets a
// plane of two parameters be written exactly as A + x·B + y·C + x·y·E.
type Form []Term

// Eval returns the value of f at the parameter values.
func (f Form) Eval(values []float64) float64 {
	s := 0.0
	for _, t := range f {
		s += t.Coef * product(t.Mask, values)
	}
	return s
}

// product returns the product of the values whose bits are set in mask,
// in increasing order of index, so that it is reproducible.
func product(mask uint32, values []float64) float64 {
	p := 1.0
	for m := mask; m != 0; m &= m - 1 {
		p *= values[bits.TrailingZeros32(m)]
	}
	return p
}

// Transfer is a transfer function Num/Den whose coefficients, in
// ascending powers of the variable (s, or z for a digital controller),
// are Forms of the parameters.
type Transfer struct {
	Num, Den []Form
}

// Eval returns the numerator and denominator at the parameter values.
func (t Transfer) Eval(values []float64) (num, den poly.Poly) {
	return evalForms(t.Num, values), evalForms(t.Den, values)
}

func evalForms(fs []Form, values []float64) poly.Poly {
	p := make(poly.Poly, len(fs))
	for k, f := range fs {
		p[k] = f.Eval(values)
	}
	return p
}

// Split writes the forms fs as an exact function of two of the
// parameters, x = values[xi] and y = values[yi], with every other
// parameter at its value:
//
//	Σ_k fs[k](values)·s^k = A(s) + x·B(s) + y·C(s) + x·y·E(s).
//
// Each term lands in exactly one of the four parts, multiplied by the
// fixed values it contains, so no coefficient is formed by differencing
// evaluations. xi may equal yi, for a line along one parameter; then C
// and E are zero and B holds the part affine in that parameter.
func Split(fs []Form, values []float64, xi, yi int) (a, b, c, e poly.Poly) {
	n := len(fs)
	a, b, c, e = make(poly.Poly, n), make(poly.Poly, n), make(poly.Poly, n), make(poly.Poly, n)
	bx, by := uint32(1)<<xi, uint32(1)<<yi
	for k, f := range fs {
		for _, t := range f {
			rest := t.Mask &^ (bx | by)
			v := t.Coef * product(rest, values)
			hasX, hasY := t.Mask&bx != 0, t.Mask&by != 0
			switch {
			case xi == yi && hasX:
				b[k] += v
			case hasX && hasY:
				e[k] += v
			case hasX:
				b[k] += v
			case hasY:
				c[k] += v
			default:
				a[k] += v
			}
		}
	}
	return a, b, c, e
}
