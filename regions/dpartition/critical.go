package dpartition

import (
	"fmt"
	"math"
	"sort"

	"gainscape/regions/poly"
)

// realRootTol is how far off the real axis, relative to its magnitude, an
// eigenvalue of a companion matrix may lie and still be taken as a real
// root. It is generous on purpose: a critical frequency too many only cuts
// a piece of curve in two, while one too few could merge a piece inside
// the window with one outside.
const realRootTol = 1e-5

// positiveRoots returns the real roots ν > 0 of p, each polished by Newton's
// method on p, from gonum's eigenvalues of the companion matrix.
func positiveRoots(p poly.Poly) ([]float64, error) {
	lo := 0
	for lo < len(p) && p[lo] == 0 {
		lo++ // roots at ν = 0 are ω = 0, always an end of the sweep
	}
	p = p[lo:]
	if p.Degree() < 1 {
		return nil, nil
	}
	rs, err := p.Roots()
	if err != nil {
		return nil, err
	}
	var out []float64
	for _, r := range rs {
		re, im := real(r), imag(r)
		if re > 0 && math.Abs(im) <= realRootTol*math.Abs(re) {
			if v := p.PolishReal(re); v > 0 {
				out = append(out, v)
			}
		}
	}
	return out, nil
}

// sideForm returns F(v) = c2·v² + c1·v + c0 for the quadratic's formed
// coefficients at a window side v: the crossings of that side are its
// roots.
func sideForm(f [3]formed, deg int, v float64) formed {
	s := f[0].add(f[1].scale(v))
	if deg == 2 {
		s = s.add(f[2].scale(v * v))
	}
	return s
}

// stationaryForm returns the resultant in t of F(t, ν) and ∂F/∂ν, whose
// roots ν include every frequency where t has a stationary value on the
// edge (a vertical or horizontal tangent). For F = c1·t + c0 it is
// c1·c0' − c0·c1'; for two quadratics (a, b, c) and (d, e, f) it is
// (af − cd)² − (ae − bd)(bf − ce).
func stationaryForm(f [3]formed, deg int) formed {
	d := [3]formed{f[0].derivative(), f[1].derivative(), f[2].derivative()}
	if deg == 1 {
		return f[1].mul(d[0]).sub(f[0].mul(d[1]))
	}
	af := f[2].mul(d[0]).sub(f[0].mul(d[2]))
	ae := f[2].mul(d[1]).sub(f[1].mul(d[2]))
	bf := f[1].mul(d[0]).sub(f[0].mul(d[1]))
	return af.mul(af).sub(ae.mul(bf))
}

// rationalCriticals returns, for a loop without delay, every ω > 0 where
// the complex edge can change what it does: where a solution appears,
// disappears or goes to infinity, where it meets a window side, and where
// either coordinate is stationary. Each is a root of a polynomial in
// ν = ω² formed exactly from the parts. Between two consecutive ones,
// every solution is continuous and monotone in both coordinates, so it is
// entirely inside the window or entirely outside.
func (pc *pencil) rationalCriticals(w window) ([]float64, error) {
	var forms []formed
	for _, side := range []struct {
		q  *quadratic
		r  Range
		nm string
	}{{&pc.x, w.x, "x"}, {&pc.y, w.y, "y"}} {
		q := side.q
		f := [3]formed{q.form[0].even, q.form[1].even, q.form[2].even}
		if q.deg == 2 {
			forms = append(forms, f[2], f[1].mul(f[1]).sub(f[2].mul(f[0]).scale(4)))
		} else {
			forms = append(forms, f[1])
		}
		forms = append(forms, sideForm(f, q.deg, side.r.Min), sideForm(f, q.deg, side.r.Max))
		st := stationaryForm(f, q.deg)
		if st.zero() {
			if q.deg == 2 {
				return nil, &InputError{"P, Q", "parts B, C and E", fmt.Sprintf("the %s-equation of the edge has a root that does not move with ω; write the pencil in a shifted parameter", side.nm)}
			}
			continue // the coordinate is constant along the edge: monotone
		}
		forms = append(forms, st)
	}
	var nus []float64
	for _, f := range forms {
		rs, err := positiveRoots(f.clean())
		if err != nil {
			return nil, err
		}
		nus = append(nus, rs...)
	}
	omegas := make([]float64, 0, len(nus)+2)
	omegas = append(omegas, 0)
	for _, nu := range nus {
		omegas = append(omegas, math.Sqrt(nu))
	}
	omegas = append(omegas, math.Inf(1))
	return dedupe(omegas), nil
}

// dedupe sorts ω values and merges those that agree to rounding.
func dedupe(v []float64) []float64 {
	sort.Float64s(v)
	out := v[:0]
	for _, x := range v {
		if len(out) > 0 && (x == out[len(out)-1] || !math.IsInf(x, 1) && x-out[len(out)-1] <= 1e-13*x) {
			continue
		}
		out = append(out, x)
	}
	return out
}
