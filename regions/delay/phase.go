package delay

import "math"

// polyArg returns the continuous change of arg F(jω) from ω = a to ω = b
// (b may be +Inf) for F = P, or Q when q is set, which has no zero on
// [a, b]. Between consecutive zeros of Im F(jω) the value stays in one
// half plane, where the principal argument is continuous; at those zeros
// it is 0 or ±π, the sign taken from the half plane of the piece. So the
// change is exact, whatever the number of turns. It reports false if F
// vanishes at an end of a piece.
func (c *Counter) polyArg(q bool, a, b float64) (float64, bool) {
	f, re, im, zeros := c.scaledP(), c.rp, c.ip, c.zp
	if q {
		f, re, im, zeros = c.scaledQ(), c.rq, c.iq, c.zq
	}
	total := 0.0
	lo := a
	idx := 0
	for idx < len(zeros) && zeros[idx] <= a {
		idx++
	}
	for {
		hi := b
		if idx < len(zeros) && zeros[idx] < b {
			hi = zeros[idx]
		}
		s := pieceSign(im, lo, hi)
		v1, ok1 := argAt(f, re, im, hi, s)
		v0, ok0 := argAt(f, re, im, lo, s)
		if !ok0 || !ok1 {
			return 0, false
		}
		total += v1 - v0
		if hi == b {
			return total, true
		}
		lo = hi
		idx++
	}
}

// pieceSign returns the sign of Im F(jω) = ω·im(ω²) on (lo, hi), where im
// has no zero: from its leading coefficient when hi is infinite, else from
// its value inside the piece. 0 means im is the zero polynomial.
func pieceSign(im []float64, lo, hi float64) float64 {
	if len(im) == 0 {
		return 0
	}
	if math.IsInf(hi, 1) {
		return math.Copysign(1, im[len(im)-1])
	}
	for _, t := range [...]float64{0.5, 0.3, 0.7} {
		w := lo + t*(hi-lo)
		if v := horner(im, w*w); v != 0 {
			return math.Copysign(1, v)
		}
	}
	return 0
}

// argAt returns arg F(jω) in the half plane of sign s (0 when F(jω) is
// real for every ω), or its limit as ω → ∞ when w is +Inf.
func argAt(f, re, im []float64, w, s float64) (float64, bool) {
	var x, y float64
	if math.IsInf(w, 1) {
		// F(jω) ≈ f_n·j^n·ω^n.
		n := len(f) - 1
		x, y = f[n], 0
		if n%2 == 1 {
			x, y = 0, f[n]
		}
		if n%4 >= 2 {
			x, y = -x, -y
		}
	} else {
		x = horner(re, w*w)
		y = w * horner(im, w*w)
	}
	if s != 0 && y != 0 && (y > 0) == (s > 0) {
		return math.Atan2(y, x), true
	}
	// On the real axis: at a zero of Im F, or everywhere if F(jω) is real.
	switch {
	case x > 0:
		return 0, true
	case x < 0 && s < 0:
		return -math.Pi, true
	case x < 0:
		return math.Pi, true
	}
	return 0, false
}

// evalPart returns F(jω) from its even and odd parts.
func evalPart(re, im []float64, w float64) complex128 {
	x := w * w
	return complex(horner(re, x), w*horner(im, x))
}

// evalDeriv returns F'(s).
func evalDeriv(f []float64, s complex128) complex128 {
	var v complex128
	for k := len(f) - 1; k >= 1; k-- {
		v = v*s + complex(float64(k)*f[k], 0)
	}
	return v
}

// magnitude returns Σ |f_k|·ω^k, which bounds |F(jω)| and sizes its
// rounding.
func magnitude(f []float64, w float64) float64 {
	v := 0.0
	for k := len(f) - 1; k >= 0; k-- {
		v = v*w + math.Abs(f[k])
	}
	return v
}

// magnitudeDeriv returns Σ k·|f_k|·ω^(k−1).
func magnitudeDeriv(f []float64, w float64) float64 {
	v := 0.0
	for k := len(f) - 1; k >= 1; k-- {
		v = v*w + float64(k)*math.Abs(f[k])
	}
	return v
}

func abs(z complex128) float64 { return math.Hypot(real(z), imag(z)) }

func abs2(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }

// trimTop returns p without its exact zero leading coefficients.
func trimTop(p []float64) []float64 {
	n := len(p)
	for n > 0 && p[n-1] == 0 {
		n--
	}
	return p[:n]
}

// finite reports whether every coefficient is a finite number.
func finite(p []float64) bool {
	for _, v := range p {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}
