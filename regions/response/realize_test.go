package response

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// expm against gonum's mat.Exp (Padé scaling and squaring, Higham's
// Algorithm 10.20) on random invented matrices of moderate norm, where
// both are accurate.
func TestExpmAgainstGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 7))
	for _, k := range []int{1, 2, 5, 12} {
		for _, norm := range []float64{1e-3, 0.3, 4, 40} {
			m := make([]float64, k*k)
			for i := range m {
				m[i] = norm * (2*rng.Float64() - 1) / float64(k)
			}
			got := expm(m, k, 1)
			var want mat.Dense
			want.Exp(mat.NewDense(k, k, append([]float64(nil), m...)))
			scale := mat.Norm(&want, 1)
			for i, v := range got {
				if math.Abs(v-want.RawMatrix().Data[i]) > 1e-12*scale {
					t.Errorf("k=%d norm=%g: entry %d = %.17g, gonum %.17g", k, norm, i, v, want.RawMatrix().Data[i])
					break
				}
			}
		}
	}
}

// A stiff augmented matrix with a closed form, derived by hand in this
// test: M = [[λ₁, 0, 1], [0, λ₂, 1], [0, 0, 0]] has e^(Mt) with diagonal
// e^(λᵢt), last column (e^(λᵢt) − 1)/λᵢ and corner 1. With λ₁ = −0.5,
// λ₂ = −1e12 and t = 0.0138, squaring e^X itself (as mat.Exp does) loses
// about seven digits of e^(λ₁t) and of the corner; the W form must not.
func TestExpmStiff(t *testing.T) {
	const l1, l2, tt = -0.5, -1e12, 0.0138
	m := []float64{l1, 0, 1, 0, l2, 1, 0, 0, 0}
	e := expm(m, 3, tt)
	want := []float64{math.Exp(l1 * tt), 0, math.Expm1(l1*tt) / l1, 0, 0, -1 / l2, 0, 0, 1}
	for i, v := range e {
		if math.Abs(v-want[i]) > 1e-15*math.Max(math.Abs(want[i]), 1e-3) {
			t.Errorf("entry %d = %.17g, want %.17g", i, v, want[i])
		}
	}
}

// balance is an exact similarity by powers of two and leaves each row
// and column of a companion matrix whose coefficients span twelve
// decades within a small factor of each other: Parlett & Reinsch stop
// when no factor of 2 lowers row plus column norm by 5%, which bounds
// their ratio by 4 (derived by hand in this test: c/r > 4 would let
// f = 1/2 turn c + r into c/2 + 2r < 0.95(c + r)). Invented polynomial:
// roots −1e-6, −1, −1e6.
func TestBalanceCompanion(t *testing.T) {
	a := monic(p(1, 1e6+1+1e-6, 1e6+1+1e-6, 1))
	m := companion(a)
	orig := append([]float64(nil), m...)
	d := balance(m, 3)
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			if want := orig[i*3+j] * d[j] / d[i]; m[i*3+j] != want {
				t.Errorf("entry (%d,%d) = %g, want D⁻¹AD = %g", i, j, m[i*3+j], want)
			}
		}
		if f, e := math.Frexp(d[i]); f != 0.5 {
			t.Errorf("scale %g = %g·2^%d is not a power of two", d[i], f, e)
		}
	}
	for i := 0; i < 3; i++ {
		r, c := 0.0, 0.0
		for j := 0; j < 3; j++ {
			if j != i {
				r += math.Abs(m[i*3+j])
				c += math.Abs(m[j*3+i])
			}
		}
		if c > 4*r || r > 4*c {
			t.Errorf("row %d: off-diagonal row norm %g, column norm %g", i, r, c)
		}
	}
}
