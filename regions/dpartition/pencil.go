package dpartition

import (
	"math"

	"gainscape/regions/poly"
)

// split is one part U of the pencil, U(s) = P_U(s) + Q_U(s)·e^(−Ls).
type split struct {
	p, q formed
}

// crossForm is the cross product of two parts on the imaginary axis,
// divided by ω:
//
//	[U, V](ω)/ω = (Re U·Im V − Im U·Re V)/ω at s = jω
//	            = even(ν) + Im(W(jω)·e^(−jωL))/ω,
//
// with ν = ω², even = [P_U, P_V]/ω + [Q_U, Q_V]/ω (a polynomial in ν) and
// W(s) = P_U(−s)·Q_V(s) − Q_U(s)·P_V(−s), because conj U(jω) = U(−jω)
// and |e^(−jωL)| = 1. Every coefficient is formed from products of the
// input coefficients, so a cross product that vanishes for every ω is
// recognised as such, relative to the scale of the input.
type crossForm struct {
	even, w formed
}

func crossOf(u, v split) crossForm {
	even := u.p.even().mul(v.p.odd()).sub(u.p.odd().mul(v.p.even()))
	even = even.add(u.q.even().mul(v.q.odd()).sub(u.q.odd().mul(v.q.even())))
	w := u.p.reflect().mul(v.q).sub(u.q.mul(v.p.reflect()))
	return crossForm{even, w}
}

func (c crossForm) add(d crossForm) crossForm { return crossForm{c.even.add(d.even), c.w.add(d.w)} }
func (c crossForm) scale(k float64) crossForm { return crossForm{c.even.scale(k), c.w.scale(k)} }
func (c crossForm) zero() bool                { return c.even.zero() && c.w.zero() }

func (c crossForm) compile() cross {
	return cross{even: c.even.clean(), wRe: c.w.even().clean(), wIm: c.w.odd().clean()}
}

// cross is a compiled crossForm, ready to evaluate.
type cross struct {
	even, wRe, wIm poly.Poly
}

// at returns [U, V](ω)/ω. With W(jω) = wRe(ν) + jω·wIm(ν),
// Im(W·e^(−jωL))/ω = wIm·cos ωL − wRe·sin(ωL)/ω, finite at ω = 0.
func (c *cross) at(f *freq) float64 {
	v := c.even.EvalReal(f.nu)
	if len(c.wRe)+len(c.wIm) > 0 {
		v += c.wIm.EvalReal(f.nu)*f.cos - c.wRe.EvalReal(f.nu)*f.sinc
	}
	return v
}

// freq holds what every evaluation at one frequency shares.
type freq struct {
	omega, nu, cos, sin, sinc float64 // sinc = sin(ωL)/ω, L at ω = 0
}

func newFreq(omega, delay float64) freq {
	f := freq{omega: omega, nu: omega * omega, cos: 1, sinc: delay}
	if delay == 0 {
		f.sinc = 0
		return f
	}
	th := omega * delay
	f.sin, f.cos = math.Sincos(th)
	if math.Abs(th) < 1e-4 {
		// sin θ/θ = 1 − θ²/6 + θ⁴/120, exact to rounding for |θ| < 1e-4.
		f.sinc = delay * (1 - th*th/6*(1-th*th/20))
	} else {
		f.sinc = f.sin / omega
	}
	return f
}

// part is a polynomial's ν-forms: U(jω) = re(ν) + jω·im(ν).
type part struct {
	re, im poly.Poly
}

func partOf(p poly.Poly) part {
	f := input(p)
	return part{f.even().c, f.odd().c}
}

// component is a part's value at jω written as (Re U, Im U/ω); dividing
// the imaginary part by ω keeps both equations meaningful as ω → 0, where
// the second becomes the equation of the derivative dU/ds at s = 0.
type component struct {
	re, im float64
}

// quadratic is F(t) = c[2]·t² + c[1]·t + c[0], whose real roots t are the
// values of one axis parameter on the complex edge at each ω; its
// coefficients are cross products of the parts.
type quadratic struct {
	form [3]crossForm
	c    [3]cross
	deg  int
}

func newQuadratic(c0, c1, c2 crossForm) quadratic {
	q := quadratic{form: [3]crossForm{c0, c1, c2}, deg: 2}
	for q.deg >= 0 && q.form[q.deg].zero() {
		q.deg--
	}
	return q
}

// dropRoot removes the factor t from F, for when t = 0 solves F at every
// ω only because the other parameter's column vanishes there.
func (q *quadratic) dropRoot() {
	q.form = [3]crossForm{q.form[1], q.form[2], {}}
	q.deg--
}

func (q *quadratic) compile() {
	for k := range q.c {
		q.c[k] = q.form[k].compile()
	}
}

// values returns the coefficients at one frequency.
func (q *quadratic) values(f *freq) (v0, v1, v2 float64) {
	v0, v1 = q.c[0].at(f), q.c[1].at(f)
	if q.deg == 2 {
		v2 = q.c[2].at(f)
	}
	return v0, v1, v2
}

// roots puts the real roots of v2·t² + v1·t + v0 in increasing order into
// out and returns how many there are. With clamp, a slightly negative
// discriminant (rounding at a fold, where two roots meet) counts as zero.
func roots(v0, v1, v2 float64, clamp bool, out *[2]float64) int {
	if v2 == 0 {
		if v1 == 0 {
			return 0
		}
		out[0] = -v0 / v1
		return 1
	}
	d := v1*v1 - 4*v2*v0
	if d < 0 {
		if !clamp {
			return 0
		}
		d = 0
	}
	// The root of larger magnitude first, then the other from the product
	// of the roots, so that neither is formed by cancellation.
	t := -(v1 + math.Copysign(math.Sqrt(d), v1)) / 2
	if t == 0 {
		out[0], out[1] = 0, 0
		return 2
	}
	r0, r1 := t/v2, v0/t
	if r0 > r1 {
		r0, r1 = r1, r0
	}
	out[0], out[1] = r0, r1
	return 2
}
