package dpartition

import (
	"math"
)

// The parts of the pencil, in the order of Bilinear's fields.
const (
	partA = iota
	partB
	partC
	partE
)

// pencil is a problem on the imaginary axis: the four parts A, B, C, E
// (each P + Q·e^(−Ls)) and the two quadratics whose roots are the axis
// values of the complex edge at each ω.
//
// At s = jω, Δ = A + x·B + y·C + x·y·E = 0 is two real equations. Seen as
// linear in y, they have a solution only if the columns A + x·B and
// C + x·E are parallel:
//
//	[A + x·B, C + x·E] = x²·[B, E] + x·([A, E] + [B, C]) + [A, C] = 0,
//
// a quadratic in x (linear when E = 0: x = −[A, C]/[B, C], Cramer's rule);
// in the same way y solves y²·[C, E] + y·([A, E] + [C, B]) + [A, B] = 0.
type pencil struct {
	p, q   [4]part
	x, y   quadratic
	sheets int // solutions per ω: 1 (affine) or 2 (bilinear)
	// singular marks the pencil whose x and y columns are parallel at
	// every ω (E = 0 and [B, C] ≡ 0): see singular.go.
	singular bool
	sweeper
}

func newPencil(pr Problem) (*pencil, error) {
	pc := &pencil{sweeper: sweeper{delay: pr.Delay}}
	var sp [4]split
	pp, qq := pr.P.parts(), pr.Q.parts()
	for k := range sp {
		sp[k] = split{input(pp[k]), input(qq[k])}
		pc.p[k], pc.q[k] = partOf(pp[k]), partOf(qq[k])
	}
	zeroPart := func(k int) bool { return pp[k].Degree() < 0 && qq[k].Degree() < 0 }
	if zeroPart(partB) && zeroPart(partE) {
		return nil, &InputError{"P, Q", "parts B and E", "x does not enter the characteristic function"}
	}
	if zeroPart(partC) && zeroPart(partE) {
		return nil, &InputError{"P, Q", "parts C and E", "y does not enter the characteristic function"}
	}
	cr := func(u, v int) crossForm { return crossOf(sp[u], sp[v]) }
	ae := cr(partA, partE)
	pc.x = newQuadratic(cr(partA, partC), ae.add(cr(partB, partC)), cr(partB, partE))
	pc.y = newQuadratic(cr(partA, partB), ae.add(cr(partC, partB)), cr(partC, partE))
	// With C ≡ 0 the column C + x·E vanishes at x = 0 for every ω, so x = 0
	// solves the x-quadratic without solving Δ = 0: drop that root. The
	// same for y when B ≡ 0.
	if pc.x.deg > 0 && pc.x.form[0].zero() && zeroPart(partC) {
		pc.x.dropRoot()
	}
	if pc.y.deg > 0 && pc.y.form[0].zero() && zeroPart(partB) {
		pc.y.dropRoot()
	}
	switch {
	case pc.x.deg <= 0 && zeroPart(partE):
		pc.singular = true
	case pc.x.deg <= 0 || pc.y.deg <= 0:
		return nil, &InputError{"P, Q", "parts B, C and E", "the two parameters enter so that the edge equations are singular at every frequency; only the affine form of that case is handled"}
	}
	pc.x.compile()
	pc.y.compile()
	pc.sheets = pc.x.deg
	for k := range sp {
		if err := pc.addRoots(pp[k]); err != nil {
			return nil, err
		}
		if err := pc.addRoots(qq[k]); err != nil {
			return nil, err
		}
	}
	if pc.scale == 0 {
		pc.scale = 1
	}
	return pc, nil
}

// components evaluates the four parts at jω as (Re U, Im U/ω).
func (pc *pencil) components(f *freq, out *[4]component) {
	for k := range out {
		out[k] = evalPart(&pc.p[k], &pc.q[k], f)
	}
}

// evalPart returns P(jω) + Q(jω)·e^(−jωL) as (Re, Im/ω). With
// Q = R + jω·I, Q·e^(−jωL) has real part R·cos + ω·I·sin and imaginary
// part over ω I·cos − R·sin(ωL)/ω.
func evalPart(p, q *part, f *freq) component {
	re, im := p.re.EvalReal(f.nu), p.im.EvalReal(f.nu)
	if len(q.re)+len(q.im) > 0 {
		qr, qi := q.re.EvalReal(f.nu), q.im.EvalReal(f.nu)
		re += qr*f.cos + f.omega*qi*f.sin
		im += qi*f.cos - qr*f.sinc
	}
	return component{re, im}
}

// sideTol is the size, relative to its terms, below which a quantity
// whose sign gives a side or a direction is taken as zero: its sign is
// then left undecided rather than guessed.
const sideTol = 1e-12

// solution is one point of the complex edge at a frequency, with the sign
// of J/ω, J = det ∂(Re Δ, Im Δ)/∂(x, y).
type solution struct {
	x, y, j float64
}

// solve returns the points of the complex edge at f, in increasing x.
func (pc *pencil) solve(f *freq, clamp bool, out *[2]solution) int {
	var xs [2]float64
	v0, v1, v2 := pc.x.values(f)
	n := roots(v0, v1, v2, clamp, &xs)
	var cm [4]component
	pc.components(f, &cm)
	a, b, c, e := cm[partA], cm[partB], cm[partC], cm[partE]
	k := 0
	for _, x := range xs[:n] {
		// y from the two equations (C + x·E)·y = −(A + x·B), by least
		// squares: exact when x is, and defined wherever the column
		// C + x·E is not zero.
		ur, ui := a.re+x*b.re, a.im+x*b.im
		wr, wi := c.re+x*e.re, c.im+x*e.im
		den := wr*wr + wi*wi
		if den == 0 || math.IsInf(x, 0) || math.IsNaN(x) {
			continue
		}
		y := -(ur*wr + ui*wi) / den
		// ∂Δ/∂x = B + y·E, ∂Δ/∂y = C + x·E.
		dr, di := b.re+y*e.re, b.im+y*e.im
		j := dr*wi - wr*di
		if math.Abs(j) <= sideTol*(math.Abs(dr*wi)+math.Abs(wr*di)) {
			j = 0 // rounding could decide the sign: the side is unknown
		}
		out[k] = solution{x + 0, y + 0, j} // +0: no −0 in reports
		k++
	}
	return k
}
