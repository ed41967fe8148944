package intervals

import (
	"errors"

	"gainscape/regions/delay"
	"gainscape/regions/dpartition"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// delaySearch prepares the search along parameter param of a loop with
// dead time L, whose characteristic function is the quasi-polynomial
//
//	Δ(s; k) = P(s; k) + Q(s; k)·e^(−Ls),  P = Dc·D, Q = Nc·N,
//
// both affine in k and formed exactly (plane.NewOpenLines). The values of
// k where a root reaches the imaginary axis or infinity are the
// one-parameter D-partition of Δ: dpartition.Crossings, which solves
// Δ(0; k) = 0 exactly, sweeps ω with step control for the complex
// crossings up to a frequency bound past which no crossing can have k in
// the window, and finds the neutral-type values where |q_n/p_n| = 1. The
// pieces between them are then tested with the quasi-polynomial's own
// count (delay.Test) and the ends confirmed by bisection on it, as for a
// rational loop. Where the sweep had no frequency bound (a neutral-type
// edge inside the window) it stops after dpartition.DefaultMaxBranches
// branches; a crossing above that would be missed, which the test of
// each piece at its midpoint catches only where it changes the verdict
// of the whole piece.
func delaySearch(l loop.Loop, param int, lo, hi float64) (search, error) {
	num, den := plane.NewOpenLines(l, param)
	if !num.A.Finite() || !num.B.Finite() || !den.A.Finite() || !den.B.Finite() {
		return search{}, errors.New("the characteristic function has coefficients that are not finite numbers")
	}
	// Top coefficients that are zero for every k belong to no structure
	// of the loop (an ideal derivative has no s² term in Dc).
	trim := func(ln plane.Line) plane.Line {
		n := len(ln.A)
		for n > 0 && ln.A[n-1] == 0 && ln.B[n-1] == 0 {
			n--
		}
		return plane.Line{A: ln.A[:n], B: ln.B[:n]}
	}
	num, den = trim(num), trim(den)
	if len(den.A) == 0 {
		return search{}, errors.New("the delay-free part of the characteristic function is zero for every value")
	}
	L := l.Plant.Delay
	lp := dpartition.LineProblem{
		P: dpartition.Affine{A: den.A, B: den.B}, Q: dpartition.Affine{A: num.A, B: num.B},
		Delay: L, K: dpartition.Range{Min: lo, Max: hi},
	}
	var cands []candidate
	res, err := dpartition.Crossings(lp, dpartition.Options{})
	var ie *dpartition.InputError
	switch {
	case err == nil:
		for _, c := range res.Crossings {
			cands = append(cands, candidate{k: c.K + 0, kind: c.Kind, omega: c.Omega})
		}
	case errors.As(err, &ie) && ie.Field == "P, Q":
		// k does not enter Δ, or enters so that every ω is a crossing:
		// then no value of k is special and one test decides.
	default:
		return search{}, err
	}
	n := max(len(num.A), len(den.A))
	p, q := make(poly.Poly, len(den.A)), make(poly.Poly, len(num.A))
	at := func(k float64, fresh bool) stability.Function {
		pp, qq := p, q
		if fresh {
			pp, qq = make(poly.Poly, len(p)), make(poly.Poly, len(q))
		}
		for i := range pp {
			pp[i] = den.A[i] + k*den.B[i]
		}
		for i := range qq {
			qq[i] = num.A[i] + k*num.B[i]
		}
		return stability.Function{P: pp, Q: qq, Delay: L}
	}
	test := delay.Test{}
	return search{at: at, cands: cands, lo: lo, hi: hi, test: test, counter: test.NewCounter(n)}, nil
}
