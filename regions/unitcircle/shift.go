package unitcircle

import (
	"math"

	"gainscape/regions/poly"
)

// Shift writes into dst (of len(p)) the Taylor coefficients of p at
// z0 = 1 or z0 = −1: p(z0 + δ) = Σ_k dst[k]·δ^k, so that p can be
// evaluated near z0, where a sampled loop's roots crowd, from δ = z − z0
// computed without cancellation (e^(jθ) − 1 = −2·sin²(θ/2) + j·sin θ).
// It panics for any other z0 or a dst of another length, and allocates
// nothing.
//
// dst[k] = Σ_{j≥k} C(j, k)·z0^(j−k)·p_j, the binomials being integers
// exact in double precision for len(p) ≤ 50. Each is summed by the
// compensated dot product of mapToHalfPlane (Ogita, Rump and Oishi's
// Dot2), which forms it as in twice the working precision; a coefficient
// no larger than the input's own rounding can make of it (inputUlps
// units in the last place of each p_j, propagated) is zero exactly, as the
// count judges it: a plant with an integrator has p(1) = 0, not 1e-17.
func Shift(dst, p poly.Poly, z0 float64) {
	if z0 != 1 && z0 != -1 {
		panic("unitcircle: Shift is at z = 1 or z = −1")
	}
	if len(dst) != len(p) {
		panic("unitcircle: Shift needs a destination of the polynomial's length")
	}
	n := len(p) - 1
	for k := 0; k <= n; k++ {
		var sum, comp, size float64
		c := 1.0 // C(j, k)·z0^(j−k), from j = k up
		for j := k; j <= n; j++ {
			h := c * p[j]
			r := math.FMA(c, p[j], -h)
			s := sum + h
			z := s - sum
			comp += (sum - (s - z)) + (h - z) + r
			sum = s
			size += math.Abs(h)
			c = c * float64(j+1) / float64(j+1-k) * z0
		}
		v := sum + comp
		if math.Abs(v) <= (inputUlps+1)*unit*size {
			v = 0
		}
		dst[k] = v
	}
}
