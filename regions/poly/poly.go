// Package poly holds real polynomials in one variable and the few
// operations the stability computations need: arithmetic, evaluation,
// differentiation, trimming relative to coefficient scale, and roots.
//
// A Poly stores coefficients in ascending powers: p[k] multiplies s^k.
// User-facing lists (the --num and --den flags) are highest power first;
// FromDescending and Descending convert between the two.
package poly

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/gonum/mat"
)

// Poly is a real polynomial with p[k] the coefficient of s^k.
// The zero-length Poly is the zero polynomial.
type Poly []float64

// RelTol is the relative size below which a coefficient is treated as zero
// when compared with the largest coefficient of the same polynomial.
// It allows for a few hundred rounding errors in double precision.
const RelTol = 1e-12

// FromDescending returns the polynomial whose coefficients are listed
// highest power first, as engineers write them.
func FromDescending(c []float64) Poly {
	p := make(Poly, len(c))
	for i, v := range c {
		p[len(c)-1-i] = v
	}
	return p
}

// Descending returns the coefficients highest power first.
func (p Poly) Descending() []float64 {
	c := make([]float64, len(p))
	for i, v := range p {
		c[len(p)-1-i] = v
	}
	return c
}

// Degree returns the index of the highest non-zero coefficient,
// or -1 for the zero polynomial. Exact zeros only; see Trim.
func (p Poly) Degree() int {
	for k := len(p) - 1; k >= 0; k-- {
		if p[k] != 0 {
			return k
		}
	}
	return -1
}

// Scale returns the largest coefficient magnitude, the reference for
// relative zero tests.
func (p Poly) Scale() float64 {
	m := 0.0
	for _, v := range p {
		if a := math.Abs(v); a > m {
			m = a
		}
	}
	return m
}

// Trim returns p without leading coefficients whose magnitude is at most
// rel times the largest coefficient. It shares storage with p.
func (p Poly) Trim(rel float64) Poly {
	lim := rel * p.Scale()
	n := len(p)
	for n > 0 && math.Abs(p[n-1]) <= lim {
		n--
	}
	return p[:n]
}

// Clone returns a copy of p.
func (p Poly) Clone() Poly { return append(Poly(nil), p...) }

// Add returns p + q.
func Add(p, q Poly) Poly {
	n := max(len(p), len(q))
	r := make(Poly, n)
	copy(r, p)
	for i, v := range q {
		r[i] += v
	}
	return r
}

// Sub returns p - q.
func Sub(p, q Poly) Poly {
	return Add(p, q.Scaled(-1))
}

// Scaled returns c·p.
func (p Poly) Scaled(c float64) Poly {
	r := make(Poly, len(p))
	for i, v := range p {
		r[i] = c * v
	}
	return r
}

// Mul returns p·q.
func Mul(p, q Poly) Poly {
	if len(p) == 0 || len(q) == 0 {
		return Poly{}
	}
	r := make(Poly, len(p)+len(q)-1)
	for i, a := range p {
		if a == 0 {
			continue
		}
		for j, b := range q {
			r[i+j] += a * b
		}
	}
	return r
}

// Pow returns p^k for k ≥ 0. It panics for negative k.
func (p Poly) Pow(k int) Poly {
	if k < 0 {
		panic("poly: negative power")
	}
	r := Poly{1}
	for ; k > 0; k-- {
		r = Mul(r, p)
	}
	return r
}

// Derivative returns dp/ds.
func (p Poly) Derivative() Poly {
	if len(p) <= 1 {
		return Poly{}
	}
	r := make(Poly, len(p)-1)
	for k := 1; k < len(p); k++ {
		r[k-1] = float64(k) * p[k]
	}
	return r
}

// Eval returns p(s) by Horner's rule.
func (p Poly) Eval(s complex128) complex128 {
	var r complex128
	for k := len(p) - 1; k >= 0; k-- {
		r = r*s + complex(p[k], 0)
	}
	return r
}

// EvalReal returns p(x) for real x by Horner's rule.
func (p Poly) EvalReal(x float64) float64 {
	r := 0.0
	for k := len(p) - 1; k >= 0; k-- {
		r = r*x + p[k]
	}
	return r
}

// Finite reports whether every coefficient is a finite number.
func (p Poly) Finite() bool {
	for _, v := range p {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return false
		}
	}
	return true
}

// Roots returns the roots of p as the eigenvalues of its companion matrix,
// computed by gonum's general eigenvalue solver (LAPACK dgeev: Hessenberg
// reduction and the shifted QR algorithm). Leading coefficients that are
// exactly zero are dropped first; the result has Degree() entries.
func (p Poly) Roots() ([]complex128, error) {
	n := p.Degree()
	if n < 0 {
		return nil, fmt.Errorf("poly: roots of the zero polynomial")
	}
	if n == 0 {
		return nil, nil
	}
	if !p.Finite() {
		return nil, fmt.Errorf("poly: roots of a polynomial with non-finite coefficients")
	}
	lead := p[n]
	c := mat.NewDense(n, n, nil)
	for j := 0; j < n; j++ {
		c.Set(0, j, -p[n-1-j]/lead)
	}
	for i := 1; i < n; i++ {
		c.Set(i, i-1, 1)
	}
	var e mat.Eigen
	if !e.Factorize(c, mat.EigenNone) {
		return nil, fmt.Errorf("poly: eigenvalue iteration did not converge for degree %d", n)
	}
	return e.Values(nil), nil
}

// FromRoots returns the monic polynomial with the given roots. Complex
// roots must come in conjugate pairs for the result to be real; the
// imaginary parts of the product are discarded.
func FromRoots(roots []complex128) Poly {
	c := []complex128{1}
	for _, r := range roots {
		next := make([]complex128, len(c)+1)
		for i, v := range c {
			next[i+1] += v
			next[i] -= r * v
		}
		c = next
	}
	p := make(Poly, len(c))
	for i, v := range c {
		p[i] = real(v)
	}
	return p
}

// String writes p in the variable s, highest power first, for reports.
func (p Poly) String() string {
	n := p.Degree()
	if n < 0 {
		return "0"
	}
	var b strings.Builder
	for k := n; k >= 0; k-- {
		c := p[k]
		if c == 0 {
			continue
		}
		if b.Len() > 0 {
			if c < 0 {
				b.WriteString(" - ")
				c = -c
			} else {
				b.WriteString(" + ")
			}
		} else if c < 0 {
			b.WriteString("-")
			c = -c
		}
		if c != 1 || k == 0 {
			b.WriteString(strconv.FormatFloat(c, 'g', 6, 64))
			if k > 0 {
				b.WriteString("·")
			}
		}
		switch {
		case k > 1:
			fmt.Fprintf(&b, "s^%d", k)
		case k == 1:
			b.WriteString("s")
		}
	}
	return b.String()
}

// RootsString formats roots for reports, one "re ± im·j" per pair.
func RootsString(r []complex128) string {
	parts := make([]string, 0, len(r))
	for _, z := range r {
		if imag(z) < 0 {
			continue
		}
		if imag(z) == 0 {
			parts = append(parts, strconv.FormatFloat(real(z), 'g', 6, 64))
			continue
		}
		parts = append(parts, fmt.Sprintf("%s ± %sj", strconv.FormatFloat(real(z), 'g', 6, 64),
			strconv.FormatFloat(math.Abs(imag(z)), 'g', 6, 64)))
	}
	return strings.Join(parts, ", ")
}
