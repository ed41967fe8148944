package intervals

import (
	"errors"
	"math"
	"math/cmplx"

	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// line is the characteristic polynomial along one parameter,
// p(s; k) = a(s) + k·b(s) (plane.NewLine).
type line struct {
	a, b poly.Poly // equal lengths
}

// newLine forms the line of parameter param of loop. Top coefficients that
// are exactly zero for every k are dropped: the structure lacks that term
// (an ideal derivative, say), so the polynomial simply has a lower degree,
// which is no degree drop.
func newLine(l loop.Loop, param int) (line, error) {
	pl := plane.NewLine(l, param)
	a, b := pl.A, pl.B
	n := len(a)
	if !a.Finite() || !b.Finite() {
		return line{}, errors.New("the characteristic polynomial has coefficients that are not finite numbers")
	}
	for n > 0 && a[n-1] == 0 && b[n-1] == 0 {
		n--
	}
	if n == 0 {
		return line{}, errors.New("the characteristic polynomial is zero for every value")
	}
	return line{a: a[:n], b: b[:n]}, nil
}

func (l line) len() int { return len(l.a) }

// at writes p(s; k) into dst (length l.len()) and returns it.
func (l line) at(dst poly.Poly, k float64) poly.Poly {
	for i := range dst {
		dst[i] = l.a[i] + k*l.b[i]
	}
	return dst
}

// candidate is a parameter value at which roots may cross the imaginary
// axis: a solution of one of the three D-partition equations.
type candidate struct {
	k     float64
	kind  stability.Kind
	omega float64
}

// candidates returns the solutions of the three D-partition equations in
// any order. A value may be a candidate without changing stability (a root
// that touches the axis, or a pair crossing while others stay unstable);
// the caller decides by testing the pieces between candidates.
func (l line) candidates() []candidate {
	if l.b.Degree() < 0 {
		return nil // p does not depend on k: one piece.
	}
	// Any non-zero coefficient gives a candidate, however small: a value
	// from rounding gives a far or harmless extra candidate, while a small
	// genuine one dropped by a relative test would hide a boundary.
	var cs []candidate
	n := len(l.b) - 1
	// Real: p(0; k) = a0 + k·b0 = 0.
	if l.b[0] != 0 {
		cs = append(cs, candidate{k: -l.a[0] / l.b[0], kind: stability.Real, omega: 0})
	}
	// Infinite: the leading coefficient a_n + k·b_n = 0.
	if l.b[n] != 0 {
		cs = append(cs, candidate{k: -l.a[n] / l.b[n], kind: stability.Infinite, omega: math.NaN()})
	}
	cs = append(cs, l.complexCandidates()...)
	for i := range cs {
		cs[i].k += 0 // −0 from −0/b reads as 0 in reports
	}
	return cs
}

// complexCandidates solves a(jω) + k·b(jω) = 0 for ω > 0 and real k.
//
// Write a(jω) = ar(u) + jω·ai(u) with u = ω², where ar and ai collect the
// even and odd coefficients with alternating signs, and likewise for b.
// A real k exists exactly when a(jω)·conj(b(jω)) is real:
//
//	Im(a·conj(b)) = ω·(ai·br − ar·bi)(u) = ω·q(u) = 0,
//
// and then k = −Re(a·conj(b))/|b|² = −(ar·br + u·ai·bi)/(br² + u·bi²).
// Working in u halves the degree of the equation. Its positive real roots
// come from gonum's eigenvalues of the companion matrix (poly.Roots),
// keeping near-real ones and polishing them by Newton's method on q.
//
// If q vanishes identically, a/b is an even rational function of s:
// a = g·P, b = g·Q with P and Q even. Then p = g·(P + k·Q), and the even
// factor P + k·Q has roots mirrored about the imaginary axis (or has lost
// degree) for every k, so the loop is never stable, unless P and Q are
// constants; then p = (P + k·Q)·g changes stability only where the real
// and infinite candidates already lie. So no complex candidate is needed.
func (l line) complexCandidates() []candidate {
	ar, ai := split(l.a)
	br, bi := split(l.b)
	q := poly.Sub(poly.Mul(ai, br), poly.Mul(ar, bi))
	// A coefficient of q is zero if it is within the rounding of the
	// products that formed it. Only exact cancellation, such as a multiple
	// of b in place of a, is meant: leftover noise would merely add
	// candidates, which cost a stability test each, while a relative test
	// against the whole polynomial could erase small genuine coefficients.
	bound := poly.Add(absMul(ai, br), absMul(ar, bi))
	for i := range q {
		if math.Abs(q[i]) <= roundingUlps*float64(len(l.a))*unit*bound[i] {
			q[i] = 0
		}
	}
	lo := 0
	for lo < len(q) && q[lo] == 0 {
		lo++ // roots at u = 0 belong to the real candidate
	}
	q = q[lo:]
	if q.Degree() < 1 {
		return nil
	}
	roots, err := q.Roots()
	if err != nil {
		return nil
	}
	var cs []candidate
	for _, r := range roots {
		u := real(r)
		if u <= 0 || math.Abs(imag(r)) > nearReal*cmplx.Abs(r) {
			continue
		}
		u = q.PolishReal(u)
		if !(u > 0) {
			continue
		}
		w := math.Sqrt(u)
		vr, vi := br.EvalReal(u), bi.EvalReal(u)
		den := vr*vr + u*vi*vi
		if den <= sq(coefficientTol*absEval(l.b, w)) {
			continue // b(jω) = 0: no finite k puts a root at jω
		}
		k := -(ar.EvalReal(u)*vr + u*ai.EvalReal(u)*vi) / den
		cs = append(cs, candidate{k: k, kind: stability.Complex, omega: w})
	}
	return cs
}

// nearReal is the largest |Im u|/|u| of a root of q still taken as real.
// It is generous: a tangency of the D-partition curve makes a double root,
// which eigenvalues find only to about the square root of the unit
// roundoff, and an extra candidate costs one extra stability test while a
// missing one could hide a boundary.
const nearReal = 1e-5

// split returns the even and odd parts of p(jω) as polynomials in u = ω²:
// p(jω) = er(u) + jω·oi(u).
func split(p poly.Poly) (er, oi poly.Poly) {
	er = make(poly.Poly, (len(p)+1)/2)
	oi = make(poly.Poly, len(p)/2)
	for i, c := range p {
		sign := 1.0
		if (i/2)%2 == 1 {
			sign = -1
		}
		if i%2 == 0 {
			er[i/2] = sign * c
		} else {
			oi[i/2] = sign * c
		}
	}
	return er, oi
}

// absMul returns the product of x and y with every term made positive,
// the size of the terms that form each coefficient of x·y.
func absMul(x, y poly.Poly) poly.Poly {
	if len(x) == 0 || len(y) == 0 {
		return nil
	}
	r := make(poly.Poly, len(x)+len(y)-1)
	for i, a := range x {
		for j, b := range y {
			r[i+j] += math.Abs(a * b)
		}
	}
	return r
}

// coefficientTol is the relative size, against the terms that form it,
// below which b(jω) counts as zero: a few hundred rounding errors of
// forming the characteristic polynomial, with a wide margin.
const coefficientTol = 1e-13

// unit is the unit roundoff of float64, 2^-53.
const unit = 0x1p-53

// roundingUlps times the length of the polynomial times unit bounds the
// relative rounding of a sum of products and of the inputs' own rounding.
const roundingUlps = 16

// absEval returns Σ|p_i|·w^i, the size of the terms of p(jw).
func absEval(p poly.Poly, w float64) float64 {
	r := 0.0
	for i := len(p) - 1; i >= 0; i-- {
		r = r*w + math.Abs(p[i])
	}
	return r
}

func sq(x float64) float64 { return x * x }
