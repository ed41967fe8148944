package response

import "math"

// wave is one response signal on the window: its values at the samples
// t_k = k·h, and, for continuous loops, its one-sided slopes there, its
// running integral and an exact evaluator between samples.
//
// Sampled loops have at == nil: the signal exists at the samples only,
// and run[k] = h·Σ_{j<k} v[j], the integral of the signal held over each
// period.
type wave struct {
	h  float64
	v  []float64
	sR []float64 // slope just after t_k
	sL []float64 // slope just before t_k
	// run[k] is ∫₀^{t_k} of the signal.
	run []float64
	// at returns value, slope and running integral at t_k + θ·h,
	// 0 ≤ θ ≤ 1, computed from the state at t_k by the matrix exponential.
	at func(k int, theta float64) (v, s, run float64)
	// turns[k] are the turning points of the Hermite cubic of step k,
	// filled by shaped for continuous waves.
	turns []turn
}

// turn holds the turning points θ in (0, 1) of the Hermite cubic of one
// step, ascending, and the cubic's values there.
type turn struct {
	at, v [2]float64
	n     int
}

// shaped returns w with its turns filled: the scans of figures look at
// every step several times and need them each time.
func (w wave) shaped() wave {
	w.turns = make([]turn, w.steps())
	for k := range w.turns {
		c := w.hermite(k)
		tr := &w.turns[k]
		tr.at, tr.n = c.critical()
		for i := 0; i < tr.n; i++ {
			tr.v[i] = c.at(tr.at[i])
		}
	}
	return w
}

// steps returns the number of steps of the window.
func (w wave) steps() int { return len(w.v) - 1 }

// affine returns the wave α + β·w, the error e = r − y from y.
func (w wave) affine(alpha, beta float64) wave {
	n := len(w.v)
	a := wave{h: w.h, v: make([]float64, n), run: make([]float64, n)}
	for k := range w.v {
		a.v[k] = alpha + beta*w.v[k]
		a.run[k] = alpha*float64(k)*w.h + beta*w.run[k]
	}
	if w.at == nil {
		return a
	}
	a.sR, a.sL = make([]float64, n), make([]float64, n)
	for k := range w.v {
		a.sR[k], a.sL[k] = beta*w.sR[k], beta*w.sL[k]
	}
	a.at = func(k int, theta float64) (float64, float64, float64) {
		v, s, r := w.at(k, theta)
		return alpha + beta*v, beta * s, alpha*(float64(k)+theta)*w.h + beta*r
	}
	return a.shaped()
}

// cubic is the Hermite cubic through the values and slopes (per unit θ)
// at the two ends of one step, the guide that tells where to look
// between samples.
type cubic struct{ a0, a1, a2, a3 float64 }

// hermite returns the cubic of step k.
func (w wave) hermite(k int) cubic {
	p0, p1 := w.v[k], w.v[k+1]
	m0, m1 := w.h*w.sR[k], w.h*w.sL[k+1]
	return cubic{p0, m0, 3*(p1-p0) - 2*m0 - m1, 2*(p0-p1) + m0 + m1}
}

func (c cubic) at(t float64) float64 { return c.a0 + t*(c.a1+t*(c.a2+t*c.a3)) }

func (c cubic) slope(t float64) float64 { return c.a1 + t*(2*c.a2+t*3*c.a3) }

// critical returns the points in (0, 1) where the cubic's slope
// vanishes, ascending, in an array with their count, so that the scans
// over every step allocate nothing.
func (c cubic) critical() (pts [2]float64, n int) {
	a, b, d := 3*c.a3, 2*c.a2, c.a1
	var r [2]float64
	m := 0
	if a == 0 {
		if b != 0 {
			r[0], m = -d/b, 1
		}
	} else if disc := b*b - 4*a*d; disc >= 0 {
		// The root of larger magnitude first, then the other from the
		// product of the roots, which loses no digits to cancellation.
		q := -(b + math.Copysign(math.Sqrt(disc), b)) / 2
		r[0], m = q/a, 1
		if q != 0 {
			r[1], m = d/q, 2
		}
		if m == 2 && r[0] > r[1] {
			r[0], r[1] = r[1], r[0]
		}
	}
	for _, t := range r[:m] {
		if t > 0 && t < 1 {
			pts[n] = t
			n++
		}
	}
	return pts, n
}

// root returns a θ in [a, b] where the cubic equals level, by bisection,
// given a sign change of cubic − level between a and b.
func (c cubic) root(level, a, b float64) float64 {
	fa := c.at(a) - level
	for i := 0; i < 60 && b-a > 1e-15; i++ {
		m := (a + b) / 2
		if fm := c.at(m) - level; (fm < 0) == (fa < 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return (a + b) / 2
}

// thetaTol is the resolution of θ at which refinement stops: a few
// units of rounding of the time t_k + θ·h.
const thetaTol = 1e-14

// crossing returns θ in [a, b] where the exact signal of step k equals
// level, given fa = v(a) − level and fb = v(b) − level of opposite signs
// (or fb = 0): safeguarded Newton iteration on the exact evaluator,
// started at the root of the Hermite cubic and falling back to
// bisection whenever a Newton step leaves the bracket.
func (w wave) crossing(k int, level, a, fa, b, fb float64) float64 {
	if fb == 0 {
		return b
	}
	x := w.hermite(k).root(level, a, b)
	for i := 0; i < 60; i++ {
		v, s, _ := w.at(k, x)
		f := v - level
		if f == 0 {
			return x
		}
		if (f < 0) == (fa < 0) {
			a, fa = x, f
		} else {
			b = x
		}
		next := x - f/(s*w.h)
		if !(next > a && next < b) || i > 20 {
			next = (a + b) / 2
		}
		if math.Abs(next-x) <= thetaTol || b-a <= thetaTol {
			return next
		}
		x = next
	}
	return x
}

// stationary returns θ in [a, b] where the slope of the exact signal of
// step k vanishes, given slopes sa and sb of opposite signs at a and b:
// the Illinois variant of regula falsi (Dowell & Jarratt, BIT 11, 1971),
// started at guess, with a bisection whenever two steps have not halved
// the bracket, so that a root close to one end of a wide bracket costs
// no more than bisection. The value there is stationary, so the error of
// θ enters it squared.
func (w wave) stationary(k int, a, sa, b, sb, guess float64) float64 {
	x := guess
	side := 0
	width := b - a
	for i := 0; i < 200 && b-a > thetaTol; i++ {
		_, s, _ := w.at(k, x)
		if s == 0 {
			return x
		}
		if (s < 0) == (sa < 0) {
			a, sa = x, s
			if side == -1 {
				sb /= 2
			}
			side = -1
		} else {
			b, sb = x, s
			if side == 1 {
				sa /= 2
			}
			side = 1
		}
		x = (a*sb - b*sa) / (sb - sa)
		if i%2 == 1 {
			if b-a > width/2 {
				x = (a + b) / 2
			}
			width = b - a
		}
		if !(x > a && x < b) {
			x = (a + b) / 2
		}
	}
	return x
}
