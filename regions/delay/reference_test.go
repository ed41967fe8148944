package delay

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Gauss–Legendre nodes and weights on [−1, 1], 8 and 16 points, computed
// once by Newton's method on the Legendre polynomials (Golub–Welsch would
// do as well; the values are the classical ones, e.g. Abramowitz and
// Stegun, Handbook of Mathematical Functions, Table 25.4).
var gl8x, gl8w, gl16x, gl16w = gaussLegendre(8), gaussLegendreW(8), gaussLegendre(16), gaussLegendreW(16)

func legendre(n int, x float64) (p, dp float64) {
	p0, p1 := 1.0, x
	for k := 2; k <= n; k++ {
		p0, p1 = p1, ((2*float64(k)-1)*x*p1-(float64(k)-1)*p0)/float64(k)
	}
	return p1, float64(n) * (x*p1 - p0) / (x*x - 1)
}

func gaussLegendre(n int) []float64 {
	xs := make([]float64, n)
	for i := range xs {
		x := math.Cos(math.Pi * (float64(i) + 0.75) / (float64(n) + 0.5))
		for range 100 {
			p, dp := legendre(n, x)
			dx := p / dp
			x -= dx
			if math.Abs(dx) < 1e-16 {
				break
			}
		}
		xs[i] = x
	}
	return xs
}

func gaussLegendreW(n int) []float64 {
	ws := make([]float64, n)
	for i, x := range gaussLegendre(n) {
		_, dp := legendre(n, x)
		ws[i] = 2 / ((1 - x*x) * dp * dp)
	}
	return ws
}

// logDerivative returns Δ'(s)/Δ(s) computed directly from f.
func logDerivative(f stability.Function, s complex128) complex128 {
	e := cmplx.Exp(-complex(f.Delay, 0) * s)
	P, Q := poly.Poly(f.P), poly.Poly(f.Q)
	d := P.Eval(s) + Q.Eval(s)*e
	dd := P.Derivative().Eval(s) + (Q.Derivative().Eval(s)-complex(f.Delay, 0)*Q.Eval(s))*e
	return dd / d
}

// panel integrates Δ'/Δ·ds along z(t) = a + (b−a)·t, t ∈ [0, 1], with
// 8- and 16-point Gauss–Legendre rules, halving the panel until the two
// agree to 1e-11 or the depth runs out.
func panel(f stability.Function, a, b complex128, depth int) complex128 {
	rule := func(xs, ws []float64) complex128 {
		var sum complex128
		for i, x := range xs {
			s := a + (b-a)*complex((x+1)/2, 0)
			sum += complex(ws[i]/2, 0) * logDerivative(f, s)
		}
		return sum * (b - a)
	}
	coarse, fine := rule(gl8x, gl8w), rule(gl16x, gl16w)
	if cmplx.Abs(coarse-fine) <= 1e-11 || depth == 0 {
		return fine
	}
	m := (a + b) / 2
	return panel(f, a, m, depth-1) + panel(f, m, b, depth-1)
}

// contourCount is the independent reference: the number of zeros of Δ in
// the right half disc of radius R by the argument principle, N =
// (1/2πj)·∮Δ'/Δ ds, integrated numerically along the imaginary axis from
// jR to −jR and back along the arc, in short panels of adaptive
// Gauss–Legendre quadrature. It reports false if the integral is not
// within 0.05 of a whole number.
func contourCount(f stability.Function, R float64) (int, bool) {
	step := math.Min(0.25, 0.5/math.Max(f.Delay, 1e-3))
	var total complex128
	nAxis := int(math.Ceil(2 * R / step))
	for i := range nAxis {
		y0 := R - 2*R*float64(i)/float64(nAxis)
		y1 := R - 2*R*float64(i+1)/float64(nAxis)
		total += panel(f, complex(0, y0), complex(0, y1), 24)
	}
	nArc := int(math.Ceil(math.Pi * R / step))
	for i := range nArc {
		t0 := -math.Pi/2 + math.Pi*float64(i)/float64(nArc)
		t1 := -math.Pi/2 + math.Pi*float64(i+1)/float64(nArc)
		total += panel(f, cmplx.Rect(R, t0), cmplx.Rect(R, t1), 24)
	}
	n := imag(total) / (2 * math.Pi)
	return int(math.Round(n)), math.Abs(n-math.Round(n)) < 0.05 && math.Abs(real(total)) < 0.3
}

// rootRadius returns a radius beyond which Δ has no root with Re s ≥ 0:
// there |P(s)| ≤ |Q(s)| (as |e^(−Ls)| ≤ 1), so |s| is at most the
// positive root of (|p_n| − |q_n|)·r^n = Σ_(k<n) (|p_k| + |q_k|)·r^k
// (Cauchy's bound), found by bisection; |q_n| counts only for equal degrees.
func rootRadius(f stability.Function) float64 {
	n := len(f.P) - 1
	lead := math.Abs(f.P[n])
	if len(f.Q) == len(f.P) {
		lead -= math.Abs(f.Q[n])
	}
	g := func(r float64) float64 {
		v := lead * math.Pow(r, float64(n))
		for k := 0; k < n; k++ {
			v -= (math.Abs(coef(f.P, k)) + math.Abs(coef(f.Q, k))) * math.Pow(r, float64(k))
		}
		return v
	}
	hi := 1.0
	for g(hi) <= 0 {
		hi *= 2
	}
	lo := 0.0
	for range 100 {
		m := (lo + hi) / 2
		if g(m) > 0 {
			hi = m
		} else {
			lo = m
		}
	}
	return hi
}

// axisClearance returns min |Δ(jω)|/(|P(jω)| + |Q(jω)|) over a fine grid
// of ω in [0, R]: how far the nearest root is from the axis, in effect.
func axisClearance(f stability.Function, R float64) float64 {
	step := math.Min(0.002, 0.01/f.Delay)
	m := math.Inf(1)
	for w := 0.0; w <= R; w += step {
		s := complex(0, w)
		p := poly.Poly(f.P).Eval(s)
		q := poly.Poly(f.Q).Eval(s) * cmplx.Exp(-complex(f.Delay, 0)*s)
		m = math.Min(m, cmplx.Abs(p+q)/(cmplx.Abs(p)+cmplx.Abs(q)))
	}
	return m
}

// newRand returns the generator of invented test data for one seed.
func newRand(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 11)) }

// randomLoop returns an invented delay loop: a plant of degree n with
// real and complex poles of either sign and a numerator of lower degree,
// under a P, PI, PD-with-filter or PID-with-filter controller with gains
// of either sign, and a delay in [0.05, 2]. Most poles are stable, as in
// the plants a map is drawn for.
func randomLoop(rng *rand.Rand, n int) stability.Function {
	var poles []complex128
	for len(poles) < n {
		re := -0.2 - 2*rng.Float64()
		if rng.IntN(6) == 0 {
			re = 0.1 + rng.Float64()
		}
		if n-len(poles) >= 2 && rng.IntN(2) == 0 {
			im := 0.2 + 2*rng.Float64()
			poles = append(poles, complex(re, im), complex(re, -im))
			continue
		}
		poles = append(poles, complex(re, 0))
	}
	D := poly.FromRoots(poles)
	N := poly.Poly{0.5 + rng.Float64()}
	for range rng.IntN(n) {
		N = poly.Mul(N, poly.Poly{2*rng.Float64() - 1, 1})
	}
	kp := 1.6*rng.Float64() - 0.3
	ki := 0.6*rng.Float64() - 0.1
	kd := 0.5 * rng.Float64()
	tf := 0.05 + 0.3*rng.Float64()
	var Nc, Dc poly.Poly
	switch rng.IntN(4) {
	case 0:
		Nc, Dc = poly.Poly{kp}, poly.Poly{1}
	case 1:
		Nc, Dc = poly.Poly{ki, kp}, poly.Poly{0, 1}
	case 2:
		Nc, Dc = poly.Poly{kp, kp*tf + kd}, poly.Poly{1, tf}
	default:
		Nc, Dc = poly.Poly{ki, ki*tf + kp, kp*tf + kd}, poly.Poly{0, 1, tf}
	}
	return stability.Function{P: poly.Mul(Dc, D), Q: poly.Mul(Nc, N), Delay: 0.05 + 1.95*rng.Float64()}
}

// TestCountAgreesWithContourIntegral checks Count against the contour
// integral on random invented delay loops with plants of degree 1 to 6,
// skipping loops with a root close to the imaginary axis, where neither
// count is meant to be robust.
func TestCountAgreesWithContourIntegral(t *testing.T) {
	rng := newRand(3)
	c := NewCounter(10)
	used, unstable := 0, 0
	for i := range 240 {
		f := randomLoop(rng, 1+i%6)
		R := 1.2*rootRadius(f) + 0.5
		if R > 60 || axisClearance(f, R) < 1e-3 {
			continue
		}
		want, ok := contourCount(f, R)
		if !ok {
			t.Errorf("case %d: the reference integral did not close: %+v", i, f)
			continue
		}
		used++
		if want > 0 {
			unstable++
		}
		if v := c.Count(f); v.Unstable != want || v.Boundary != 0 {
			t.Errorf("case %d: Count = %+v, contour integral %d, for %+v", i, v, want, f)
		}
	}
	// The filter keeps most cases, stable and unstable.
	t.Logf("%d cases compared, %d of them unstable", used, unstable)
	if used < 150 || unstable < 30 || used-unstable < 30 {
		t.Errorf("only %d cases compared, %d of them unstable", used, unstable)
	}
}
