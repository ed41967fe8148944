package response

import (
	"cmp"
	"math"
	"math/cmplx"
	"slices"

	"gainscape/regions/poly"
)

// padeCoefficients returns c₀ … c_n of P_n(x) = Σ c_k·x^k,
// c_k = (2n−k)!·n! / ((2n)!·k!·(n−k)!), for which P_n(−x)/P_n(x) is the
// (n, n) Padé approximant of e^(−x) (Baker & Graves-Morris, Padé
// Approximants, 2nd ed., Cambridge 1996, §1.2; recalled). The ratio
// c_{k+1}/c_k = (n−k)/((2n−k)(k+1)) forms them without factorials.
func padeCoefficients(n int) []float64 {
	c := make([]float64, n+1)
	c[0] = 1
	for k := 0; k < n; k++ {
		c[k+1] = c[k] * float64(n-k) / (float64(2*n-k) * float64(k+1))
	}
	return c
}

// padePolys returns P_n(L·s) and P_n(−L·s) as polynomials in s.
func padePolys(n int, delay float64) (den, num poly.Poly) {
	c := padeCoefficients(n)
	den, num = make(poly.Poly, n+1), make(poly.Poly, n+1)
	lk := 1.0
	for k, v := range c {
		den[k] = v * lk
		num[k] = v * lk
		if k%2 == 1 {
			num[k] = -num[k]
		}
		lk *= delay
	}
	return den, num
}

// padeError returns |e^(−jx) − P_n(−jx)/P_n(jx)|, the error of the
// approximant on the imaginary axis, where it is all in phase.
func padeError(n int, x float64) float64 {
	p := poly.Poly(padeCoefficients(n))
	q := p.Eval(complex(0, x))
	return cmplx.Abs(cmplx.Exp(complex(0, -x)) - cmplx.Conj(q)/q)
}

// maxPade bounds the order of the approximants.
const maxPade = 40

// padeOrder returns the least order n ≤ maxPade whose error padeError
// stays at most tol on [0, x] (checked on 64 points; the error grows
// with x over the range used), and false if none does.
func padeOrder(x, tol float64) (int, bool) {
	for n := 1; n <= maxPade; n++ {
		ok := true
		for i := 1; i <= 64 && ok; i++ {
			ok = padeError(n, x*float64(i)/64) <= tol
		}
		if ok {
			return n, true
		}
	}
	return maxPade, false
}

// padeLoop returns l with e^(−Ls) replaced by its (n, n) Padé
// approximant, as a rational loop.
func padeLoop(l Loop, n int) Loop {
	den, num := padePolys(n, l.Delay)
	r := l
	r.PlantNum, r.PlantDen, r.Delay = poly.Mul(l.PlantNum, num), poly.Mul(l.PlantDen, den), 0
	return r
}

// gainFloor is the loop gain |C·G(jω)| above which the frequency range
// of a dead-time loop must be resolved: roots of 1 + C·G·e^(−Ls) with
// decay rate σ satisfy |C·G(s)| = e^(−σL) at them, so those with
// σ < ln(1/gainFloor)/L lie where the loop gain exceeds gainFloor.
const gainFloor = 0.1

// bandwidth returns the greatest ω with |C·G(jω)| ≥ gainFloor, scanning
// ω·L over 10⁻⁶ … 10⁶ at 40 points per decade and refining the last
// crossing by bisection; 0 if the gain never reaches the floor, +Inf if
// it is still above it at the top of the scan.
func bandwidth(l Loop) float64 {
	gain := func(w float64) float64 {
		s := complex(0, w)
		return cmplx.Abs(l.CtrlNum.Eval(s) * l.PlantNum.Eval(s) / (l.CtrlDen.Eval(s) * l.PlantDen.Eval(s)))
	}
	const decades, per = 12, 40
	at := func(i int) float64 { return math.Pow(10, -6+float64(i)/per) / l.Delay }
	top := decades * per
	if gain(at(top)) >= gainFloor {
		return math.Inf(1)
	}
	for i := top - 1; i >= 0; i-- {
		if gain(at(i)) >= gainFloor {
			lo, hi := at(i), at(i+1)
			for j := 0; j < 60; j++ {
				m := math.Sqrt(lo * hi)
				if gain(m) >= gainFloor {
					lo = m
				} else {
					hi = m
				}
			}
			return lo
		}
	}
	return 0
}

// dominantRoots returns the roots of Δ(s) = P(s) + Q(s)·e^(−Ls) near
// the given starting points (roots of a Padé approximant), each refined
// by Newton's method on Δ itself, Δ' = P' + (Q' − L·Q)·e^(−Ls), slowest
// first; roots that coincide to 1e-9 of their size are kept once. The
// starts that do not converge within 50 steps are returned apart.
func dominantRoots(p, q poly.Poly, delay float64, starts []complex128) (roots, failed []complex128) {
	dp, dq := p.Derivative(), q.Derivative()
	var out []complex128
	for _, start := range starts {
		s := start
		ok := false
		for i := 0; i < 50 && !ok; i++ {
			e := cmplx.Exp(complex(-delay, 0) * s)
			qs := q.Eval(s)
			df := dp.Eval(s) + (dq.Eval(s)-complex(delay, 0)*qs)*e
			if df == 0 {
				break
			}
			step := (p.Eval(s) + qs*e) / df
			s -= step
			ok = cmplx.Abs(step) <= 1e-13*(cmplx.Abs(s)+1/delay)
		}
		if !ok || cmplx.IsNaN(s) {
			failed = append(failed, start)
			continue
		}
		if !slices.ContainsFunc(out, func(r complex128) bool { return cmplx.Abs(r-s) <= 1e-9*(cmplx.Abs(s)+1/delay) }) {
			out = append(out, s)
		}
	}
	slices.SortFunc(out, func(a, b complex128) int {
		if c := cmp.Compare(real(b), real(a)); c != 0 {
			return c
		}
		return cmp.Compare(imag(b), imag(a))
	})
	return out, failed
}
