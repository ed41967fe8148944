package delay

import (
	"fmt"
	"math"
	"math/big"

	"gainscape/regions/poly"
)

// MaxPadeOrder is the highest order Pade and PadeOrder give. Beyond it the
// coefficients of the approximant span more than double precision keeps
// meaningfully (c_n·L^n falls like (n!)²/(2n)!), and the loop should be
// analysed with the delay itself.
const MaxPadeOrder = 30

// Pade returns the diagonal (n, n) Padé approximant num/den of e^(−L·s):
//
//	num(s) = Σ c_k·(−L·s)^k,  den(s) = Σ c_k·(L·s)^k,
//	c_k = (2n − k)!·n! / ((2n)!·k!·(n − k)!),  k = 0 … n
//
// (H. Padé, Ann. Sci. École Norm. Sup. 9, 1892; the closed form as in
// G. A. Baker and P. Graves-Morris, Padé Approximants, 2nd ed., Cambridge
// 1996, Sec. 1.2). Each c_k is computed exactly as a rational number and
// rounded once; only the powers of L add rounding. den has all its roots
// in the left half plane and num(s) = den(−s), so num/den has modulus one
// on the imaginary axis and errs in phase only. It panics if n is outside
// 0 … MaxPadeOrder or L is negative or not finite.
func Pade(L float64, n int) (num, den poly.Poly) {
	if n < 0 || n > MaxPadeOrder || !(L >= 0) || math.IsInf(L, 1) {
		panic(fmt.Sprintf("delay: Padé approximant of order %d for delay %g", n, L))
	}
	num, den = make(poly.Poly, n+1), make(poly.Poly, n+1)
	fact := func(k int) *big.Int { return new(big.Int).MulRange(1, int64(k)) }
	lk := 1.0
	for k := 0; k <= n; k++ {
		c := new(big.Rat).SetFrac(new(big.Int).Mul(fact(2*n-k), fact(n)),
			new(big.Int).Mul(fact(2*n), new(big.Int).Mul(fact(k), fact(n-k))))
		ck, _ := c.Float64()
		den[k] = ck * lk
		num[k] = den[k]
		if k%2 == 1 {
			num[k] = -num[k]
		}
		lk *= L
	}
	return num, den
}

// PadeRange returns the largest ωL up to which the phase of the order-n
// approximant of Pade stays within 1° of the exact phase −ωL. On the axis
// the approximant is den(−jω)/den(jω), of phase −2·arg den(jω), which
// depends on ω through ωL alone; arg den(jω) is unwrapped along a fine
// sweep (den is Hurwitz, so its phase rises steadily) and the end refined
// by bisection to 1e-9. Measured: 0.604, 1.72, 3.08, 4.56, 6.12, 7.74,
// 9.40, 11.09, 12.81, 14.55 for n = 1 … 10, and 32.6 for n = 20, 51.3 for
// n = 30. The rule of thumb ωL ≲ 1.5·n − 1 overstates the range slightly
// for n = 2 … 7 (by 0.44 at n = 4) and understates it from n = 8 on;
// ωL ≤ 1.5·(n − 1) holds for every order from 1 to MaxPadeOrder (see
// TestPadeRange).
func PadeRange(n int) float64 {
	if n == 0 {
		return 0
	}
	_, den := Pade(1, n)
	const limit = math.Pi / 180
	const step = 1.0 / 64
	phase := func(x, prev float64) float64 {
		v := den.Eval(complex(0, x))
		a := math.Atan2(imag(v), real(v))
		// Unwrap next to the previous value.
		return a + 2*math.Pi*math.Round((prev-a)/(2*math.Pi))
	}
	x, arg := 0.0, 0.0
	for {
		next := x + step
		a := phase(next, arg)
		if math.Abs(2*a-next) > limit {
			lo, hi := x, next
			for hi-lo > 1e-9 {
				mid := 0.5 * (lo + hi)
				if math.Abs(2*phase(mid, arg)-mid) > limit {
					hi = mid
				} else {
					lo = mid
				}
			}
			return lo
		}
		x, arg = next, a
	}
}

// PadeOrder returns the smallest order n whose Padé approximant keeps the
// phase error within about 1° for every ω with ωL ≤ maxOmegaL (see
// PadeRange), and at most MaxPadeOrder: for wider ranges the caller should
// check PadeRange(MaxPadeOrder) and work with the delay itself.
func PadeOrder(maxOmegaL float64) int {
	for n := 1; n < MaxPadeOrder; n++ {
		if PadeRange(n) >= maxOmegaL {
			return n
		}
	}
	return MaxPadeOrder
}
