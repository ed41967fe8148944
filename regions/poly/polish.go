package poly

import (
	"math"
	"math/cmplx"
)

// polishSteps caps the Newton iterations of Polish and PolishReal; a root
// that is already good to a few digits needs two or three.
const polishSteps = 8

// Polish improves an approximate root r of p by Newton's method on p,
// keeping the last iterate that reduced |p|. Roots from the eigenvalues of
// a companion matrix, or from a factor of p found with rounding, gain
// their last digits this way.
func (p Poly) Polish(r complex128) complex128 {
	dp := p.Derivative()
	best := cmplx.Abs(p.Eval(r))
	for it := 0; it < polishSteps && best > 0; it++ {
		d := dp.Eval(r)
		if d == 0 {
			break
		}
		next := r - p.Eval(r)/d
		v := cmplx.Abs(p.Eval(next))
		if !(v < best) {
			break
		}
		r, best = next, v
	}
	return r
}

// PolishReal is Polish for a real root x of p.
func (p Poly) PolishReal(x float64) float64 {
	dp := p.Derivative()
	best := math.Abs(p.EvalReal(x))
	for it := 0; it < polishSteps && best > 0; it++ {
		d := dp.EvalReal(x)
		if d == 0 {
			break
		}
		next := x - p.EvalReal(x)/d
		v := math.Abs(p.EvalReal(next))
		if !(v < best) {
			break
		}
		x, best = next, v
	}
	return x
}
