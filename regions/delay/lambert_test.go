package delay

import (
	"math"
	"math/cmplx"
)

// lambertW returns the branch k ≥ 0 of the Lambert W function at z, the
// solution w of w·e^w = z with w + ln w = ln z + 2πik (principal
// logarithms), by Newton's method on that form from the asymptotic
// starting value ln z + 2πik − ln(ln z + 2πik) (R. M. Corless, G. H.
// Gonnet, D. E. G. Hare, D. J. Jeffrey and D. E. Knuth, "On the Lambert W
// function", Adv. Comput. Math. 5, 1996, Sec. 4). It reports false if the
// result does not satisfy w·e^w = z to 1e-10 relative, checked in
// logarithmic form so that huge branches do not overflow.
func lambertW(k int, z complex128) (complex128, bool) {
	target := cmplx.Log(z) + complex(0, 2*math.Pi*float64(k))
	w := target - cmplx.Log(target)
	for range 100 {
		g := w + cmplx.Log(w) - target
		step := g / (1 + 1/w)
		w -= step
		if cmplx.Abs(step) <= 1e-15*cmplx.Abs(w) {
			break
		}
	}
	res := w + cmplx.Log(w) - target
	return w, cmplx.Abs(res) <= 1e-10*math.Max(1, cmplx.Abs(target))
}
