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
	return newton(r, p.Eval, p.Derivative().Eval, cmplx.Abs)
}

// PolishReal is Polish for a real root x of p.
func (p Poly) PolishReal(x float64) float64 {
	return newton(x, p.EvalReal, p.Derivative().EvalReal, math.Abs)
}

// newton runs at most polishSteps steps of Newton's method on f with
// derivative df from x, stopping as soon as a step fails to reduce |f|.
func newton[T float64 | complex128](x T, f, df func(T) T, abs func(T) float64) T {
	best := abs(f(x))
	for it := 0; it < polishSteps && best > 0; it++ {
		d := df(x)
		if d == 0 {
			break
		}
		next := x - f(x)/d
		v := abs(f(next))
		if !(v < best) {
			break
		}
		x, best = next, v
	}
	return x
}
