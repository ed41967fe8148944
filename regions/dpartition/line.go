package dpartition

import (
	"math"
	"math/cmplx"
	"sort"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Affine is the polynomial A(s) + k·B(s), ascending coefficients.
type Affine struct {
	A, B poly.Poly
}

// LineProblem is a loop along one parameter k in K:
//
//	Δ(s; k) = P(s; k) + Q(s; k)·e^(−Delay·s),
//
// Q zero for a loop without dead time.
type LineProblem struct {
	P, Q  Affine
	Delay float64
	K     Range
}

// Crossing is a value of k at which Δ has a root on the imaginary axis or
// at infinity.
type Crossing struct {
	K float64
	// Omega is the frequency of the boundary roots: 0 for Real, NaN for
	// Infinite.
	Omega float64
	Kind  stability.Kind
	// Delta is the change in the number of right-half-plane roots as k
	// increases through K: ±1 (Real, Infinite), ±2 (Complex), ±Unbounded
	// (a neutral-type edge), 0 when it cannot be decided (a double root).
	Delta int
	// Branch is ⌊ωL/2π⌋ for a complex crossing of a delay loop, else 0.
	Branch int
}

// LineResult is every crossing of a LineProblem.
type LineResult struct {
	// Crossings in increasing K (and ω where K ties).
	Crossings []Crossing
	// OmegaMax and Complete are as in Result.
	OmegaMax float64
	Complete bool
}

// Crossings returns every k in lp.K at which a root of Δ(s; k) lies on the
// imaginary axis or at infinity, with its kind, frequency and direction:
//
//   - Real: Δ(0; k) = 0, k = −A(0)/B(0) with A, B the whole parts
//     (P + Q at s = 0);
//   - Complex: A(jω) + k·B(jω) = 0 for ω > 0, which needs
//     Im(conj A(jω)·B(jω)) = 0, and then k = −A(jω)/B(jω) is real;
//   - Infinite: the leading coefficient of P vanishes (retarded or
//     rational loop), or |q_n/p_n| = 1 (neutral loop), as in Edges.
//
// For a rational loop the complex crossings are the positive roots of a
// polynomial in ω², formed exactly and solved by gonum's eigenvalues with
// Newton polishing: none is missed. For a delay loop ω is swept with the
// step control and the frequency bound of Edges. The direction comes from
// the root's motion: ds/dk = −B(jω)/Δ_s(jω) at the crossing.
func Crossings(lp LineProblem, opt Options) (LineResult, error) {
	pr, err := Problem{
		P: Bilinear{A: lp.P.A, B: lp.P.B}, Q: Bilinear{A: lp.Q.A, B: lp.Q.B},
		Delay: lp.Delay, X: lp.K, Y: Range{0, 1},
	}.normalized()
	if err != nil {
		if ie, ok := err.(*InputError); ok && ie.Field == "X" {
			ie.Field = "K"
		}
		return LineResult{}, err
	}
	a := split{input(pr.P.A), input(pr.Q.A)}
	b := split{input(pr.P.B), input(pr.Q.B)}
	if pr.P.B.Degree() < 0 && pr.Q.B.Degree() < 0 {
		return LineResult{}, &InputError{"P, Q", "parts B", "k does not enter the characteristic function"}
	}
	form := crossOf(a, b)
	if form.zero() {
		return LineResult{}, &InputError{"P, Q", "parts A and B", "A(jω) and B(jω) are parallel at every frequency, so every ω gives a crossing"}
	}
	cr := form.compile()
	sw := sweeper{delay: pr.Delay}
	for _, p := range []poly.Poly{pr.P.A, pr.P.B, pr.Q.A, pr.Q.B} {
		if err := sw.addRoots(p); err != nil {
			return LineResult{}, err
		}
	}
	if sw.scale == 0 {
		sw.scale = 1
	}
	res := LineResult{OmegaMax: math.Inf(1), Complete: true}
	var omegas []float64
	if pr.Delay == 0 {
		nus, err := positiveRoots(cr.even)
		if err != nil {
			return LineResult{}, err
		}
		for _, nu := range nus {
			omegas = append(omegas, math.Sqrt(nu))
		}
	} else {
		bound, ok := frequencyBound(pr)
		if !ok {
			bound = 2 * math.Pi * float64(opt.maxBranches()) / pr.Delay
			res.Complete = false
		}
		res.OmegaMax = bound
		omegas = sw.sweep(func(f *freq, v []float64) { v[0] = cr.at(f) }, 1, bound)
	}
	pa, pb := partOf(pr.P.A), partOf(pr.P.B)
	qa, qb := partOf(pr.Q.A), partOf(pr.Q.B)
	for _, om := range dedupe(omegas) {
		if om <= 0 {
			continue
		}
		f := newFreq(om, pr.Delay)
		ca, cb := evalPart(&pa, &qa, &f), evalPart(&pb, &qb, &f)
		den := cb.re*cb.re + cb.im*cb.im
		if den == 0 {
			continue
		}
		k := -(ca.re*cb.re + ca.im*cb.im) / den
		if !(k >= lp.K.Min && k <= lp.K.Max) {
			continue
		}
		ds := slopeAt(pr.P.A, pr.Q.A, pr.Delay, om) + complex(k, 0)*slopeAt(pr.P.B, pr.Q.B, pr.Delay, om)
		bj := complex(cb.re, om*cb.im)
		var branch int
		if pr.Delay > 0 {
			branch = int(math.Floor(om * pr.Delay / (2 * math.Pi)))
		}
		v := -bj / ds
		if math.Abs(real(v)) <= sideTol*cmplx.Abs(v) {
			v = 0 // the pair moves along the axis: a double root
		}
		res.Crossings = append(res.Crossings, Crossing{k, om, stability.Complex, 2 * signOf(real(v)), branch})
	}
	res.Crossings = append(res.Crossings, lineFixed(pr, lp.K)...)
	sort.SliceStable(res.Crossings, func(i, j int) bool {
		ci, cj := res.Crossings[i], res.Crossings[j]
		if ci.K != cj.K {
			return ci.K < cj.K
		}
		return ci.Omega < cj.Omega
	})
	return res, nil
}

// signOf is the sign of v as ±1, and 0 for zero or NaN (undecided).
func signOf(v float64) int {
	if v == 0 || math.IsNaN(v) {
		return 0
	}
	return int(math.Copysign(1, v))
}

// lineFixed returns the real and infinite crossings, with the directions
// derived in fixedEdges taken along k.
func lineFixed(pr Problem, kr Range) []Crossing {
	var out []Crossing
	in := func(k float64) bool { return k >= kr.Min && k <= kr.Max }
	zero := pr.P.coefficient(0).add(pr.Q.coefficient(0))
	slope := pr.P.coefficient(1).add(pr.Q.coefficient(1)).add(pr.Q.coefficient(0).scale(-pr.Delay))
	if zero.b != 0 {
		// s ≈ −Δ(0; k)/Δ'(0) with dΔ(0)/dk = b: ds/dk = −b/Δ'(0).
		if k := -zero.a / zero.b; in(k) {
			out = append(out, Crossing{k, 0, stability.Real, signOf(-zero.b / slope.at(k, 0)), 0})
		}
	}
	n := pr.P.degree()
	if n < 1 {
		return out
	}
	pn, qn := pr.P.coefficient(n), pr.Q.coefficient(n)
	nan := math.NaN()
	if pr.Q.degree() == n {
		for _, sg := range [2]float64{-1, 1} {
			e := pn.add(qn.scale(sg))
			if e.b == 0 {
				continue
			}
			if k := -e.a / e.b; in(k) {
				// d(q_n² − p_n²)/dk: more roots to the right as it grows.
				d := qn.at(k, 0)*qn.b - pn.at(k, 0)*pn.b
				out = append(out, Crossing{k, nan, stability.Infinite, Unbounded * signOf(d), 0})
			}
		}
		return out
	}
	if pn.b != 0 {
		if k := -pn.a / pn.b; in(k) {
			d := 0
			if pr.Q.degree() <= n-2 {
				// Beyond k the large root −p_(n−1)/p_n is in the right
				// half plane when p_n·p_(n−1) < 0, p_n having the sign of b.
				d = -signOf(pn.b * pr.P.coefficient(n-1).at(k, 0))
			}
			out = append(out, Crossing{k, nan, stability.Infinite, d, 0})
		}
	}
	return out
}
