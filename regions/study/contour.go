package study

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// contourCount counts the roots of Δ(s) = P(s) + Q(s)·e^(−Ls) in the open
// right half plane by the argument principle on the boundary of a right
// half disc, following arg Δ point by point: a second method, which owes
// nothing to the count of package delay (that one cuts the imaginary axis
// where |P| = |Q| and adds up the phase in closed form), used to confirm
// a map's counts.
//
// Radius: for Re s ≥ 0, |e^(−Ls)| ≤ 1, so |Δ(s)| > 0 wherever
// |p_n|·|s|^n − Σ_(k<n)|p_k|·|s|^k > Σ|q_k|·|s|^k (with |p_n| − |q_n| in
// place of |p_n| when deg Q = n, which needs |q_n| < |p_n|); that holds
// for all |s| ≥ R once it holds at R, R doubled from 1 until it does, and
// the disc of radius 2R holds every right-half-plane root. The path: the
// quarter circle from 2R to 2jR and the imaginary axis from 2jR down to
// 0; by the conjugate symmetry of Δ the lower half turns arg Δ by as
// much, so the count is the upper half's turn over π.
//
// Step control: from each point the step is accepted when arg Δ turns by
// at most π/4 to its midpoint and from there to its end, the two halves
// add up to the whole step's turn, and, where the delayed part is not
// small (|Q·e^(−Ls)| ≥ |P|/4 at either end), e^(−Ls) itself turns by at
// most π/4 over it; otherwise the step is halved. A path point where
// |Δ| is within 1e-9 of |P| + |Q·e^(−Ls)| is a root within reach of
// rounding: the count is refused (ok false), as it is when the turn does
// not come within 0.1 of a whole count or the path needs more than
// maxContourSteps steps. It returns ok false too for an advanced or a
// neutral loop with |q_n| ≥ |p_n|, whose roots have no bound.
func contourCount(f stability.Function) (n int, ok bool, reason string) {
	P, Q := poly.Poly(f.P).Clone().Trim(0), poly.Poly(f.Q).Clone().Trim(0)
	if f.Delay == 0 && len(Q) > 0 {
		P, Q = poly.Add(P, Q).Trim(0), nil
	}
	R, ok := rootRadius(P, Q)
	if !ok {
		return 0, false, "the roots have no bound: the delayed part is as large as the delay-free one at high frequency"
	}
	c := contour{p: P, q: Q, delay: f.Delay}
	arc, ok1 := c.turn(func(t float64) complex128 { return cmplx.Rect(2*R, t*math.Pi/2) })
	axis, ok2 := c.turn(func(t float64) complex128 { return complex(0, 2*R*(1-t)) })
	if !ok1 || !ok2 {
		return 0, false, c.reason
	}
	v := (arc + axis) / math.Pi
	r := math.Round(v)
	if math.Abs(v-r) > 0.1 || r < 0 {
		return 0, false, "the turn of arg Δ does not close to a whole count"
	}
	return int(r), true, ""
}

// maxContourSteps caps the steps of one path of contourCount.
const maxContourSteps = 400000

// rootRadius returns R as contourCount describes it.
func rootRadius(P, Q poly.Poly) (float64, bool) {
	n := len(P) - 1
	if n < 0 || len(Q)-1 > n {
		return 0, false
	}
	lead := math.Abs(P[n])
	if len(Q)-1 == n {
		lead -= math.Abs(Q[n])
	}
	if !(lead > 0) {
		return 0, false
	}
	if n == 0 {
		return 1, true
	}
	for R := 1.0; R < 1e300; R *= 2 {
		rest := 0.0
		for k := 0; k < n; k++ {
			rest += (math.Abs(coefAt(P, k)) + math.Abs(coefAt(Q, k))) * math.Pow(R, float64(k-n))
		}
		if lead > rest {
			return R, true
		}
	}
	return 0, false
}

// coefAt returns p[k], or 0 past its end.
func coefAt(p poly.Poly, k int) float64 {
	if k < len(p) {
		return p[k]
	}
	return 0
}

// contour follows arg Δ along paths for contourCount.
type contour struct {
	p, q   poly.Poly
	delay  float64
	reason string
}

// value is Δ at one path point with what the step control needs.
type value struct {
	d       complex128
	s       complex128
	delayed bool // |Q·e^(−Ls)| ≥ |P|/4
}

func (c *contour) at(s complex128) (value, bool) {
	p := c.p.Eval(s)
	q := c.q.Eval(s) * cmplx.Exp(-complex(c.delay, 0)*s)
	d := p + q
	if cmplx.Abs(d) <= 1e-9*(cmplx.Abs(p)+cmplx.Abs(q)) {
		c.reason = "a root lies within rounding of the path"
		return value{}, false
	}
	return value{d: d, s: s, delayed: 4*cmplx.Abs(q) >= cmplx.Abs(p)}, true
}

// turn returns the continuous change of arg Δ along z(t), t from 0 to 1.
func (c *contour) turn(z func(float64) complex128) (float64, bool) {
	const limit = math.Pi / 4
	a, ok := c.at(z(0))
	if !ok {
		return 0, false
	}
	total, t, dt := 0.0, 0.0, 1.0/64
	for steps := 0; t < 1; steps++ {
		if steps > maxContourSteps || dt < 1e-15 {
			c.reason = "the path needs too many steps"
			return 0, false
		}
		dt = math.Min(dt, 1-t)
		m, ok1 := c.at(z(t + dt/2))
		b, ok2 := c.at(z(t + dt))
		if !ok1 || !ok2 {
			return 0, false
		}
		h1, h2, whole := cmplx.Phase(m.d/a.d), cmplx.Phase(b.d/m.d), cmplx.Phase(b.d/a.d)
		rot := c.delay * math.Abs(imag(b.s)-imag(a.s))
		if math.Abs(h1) > limit || math.Abs(h2) > limit || math.Abs(h1+h2-whole) > 1e-9 ||
			((a.delayed || b.delayed) && rot > limit) {
			dt /= 2
			continue
		}
		total += whole
		t += dt
		a = b
		dt = math.Min(2*dt, 1.0/16)
	}
	return total, true
}
