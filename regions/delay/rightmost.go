package delay

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"sort"

	"gonum.org/v1/gonum/mat"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Rightmost returns the k rightmost roots of f's characteristic function,
// largest real part first, a conjugate pair kept together (so one more
// than k when the k-th root is half of a pair), each with the positive
// imaginary part first.
//
// Method, retarded type: spectral collocation of the infinitesimal
// generator of the delay equation x' = A0·x(t) + A1·x(t − L), A0 and A1
// the companion matrices whose last rows hold −p_k/p_n and −q_k/p_n, so
// that det(sI − A0 − A1·e^(−Ls)) = Δ(s)/p_n, on N + 1 Chebyshev points
// of [−L, 0] (D. Breda, S. Maset and R. Vermiglio, "Pseudospectral
// differencing methods for characteristic roots of delay differential
// equations", SIAM J. Sci. Comput. 27, 2005; the differentiation matrix
// as in L. N. Trefethen, Spectral Methods in MATLAB, SIAM 2000, Ch. 6). Its
// eigenvalues, from gonum, approximate the roots of Δ with spectral
// accuracy for |λ|·L small against N. Neutral type: the roots of the
// polynomial loop with the delay replaced by a Padé approximant of order
// PadeOrder of the frequency range sought. Loops without delay: the
// eigenvalues of the companion matrix.
//
// Every candidate is polished by Newton's method on Δ itself and kept only
// if |Δ| is then a few hundred units in the last place of its terms (see
// Newton). The result is checked with the count: Count of Shift(f, σ), σ
// just left of the last root returned, must equal the number of roots
// returned right of σ; otherwise N is doubled, and an error is returned
// if that does not settle it. On the neutral type only roots right of the
// chain abscissa (ChainAbscissa) are returned, fewer than k if there are
// fewer there.
func Rightmost(f stability.Function, k int) ([]complex128, error) {
	if k <= 0 {
		return nil, nil
	}
	P, Q := poly.Poly(trimTop(f.P)), poly.Poly(trimTop(f.Q))
	if len(P) == 0 || !P.Finite() || !Q.Finite() || !(f.Delay >= 0) || math.IsInf(f.Delay, 1) {
		return nil, fmt.Errorf("delay: no roots for the characteristic function %v + (%v)·e^(−%g·s)", P, Q, f.Delay)
	}
	if f.Rational() {
		p := P
		if len(Q) > 0 {
			p = poly.Add(P, Q)
		}
		r, err := p.Roots()
		if err != nil {
			return nil, err
		}
		return pick(r, k), nil
	}
	if len(Q) > len(P) {
		return nil, errors.New("delay: an advanced-type loop has roots of unbounded real part")
	}
	chain, neutralType := ChainAbscissa(f)
	if neutralType && math.IsInf(chain, 1) {
		return nil, errors.New("delay: the characteristic function is of neutral type with |q_n/p_n| ≥ 1")
	}
	c := NewCounter(max(len(P), len(Q)))
	nodes := 16 + 2*k
	for attempt := 0; attempt < 4; attempt++ {
		var seeds []complex128
		var err error
		if neutralType {
			seeds, err = padeSeeds(P, Q, f.Delay, nodes)
		} else {
			seeds, err = collocationSeeds(P, Q, f.Delay, nodes)
		}
		if err != nil {
			return nil, err
		}
		roots := polished(f, seeds, chain)
		got := pick(roots, k)
		if ok := confirmed(c, f, roots, got, chain); ok {
			return got, nil
		}
		nodes *= 2
	}
	return nil, errors.New("delay: the rightmost roots could not be confirmed by the count")
}

// ChainAbscissa returns ln|q_n/p_n|/L for a loop of neutral type, the real
// part that its infinite chain of high-frequency roots approaches (+Inf
// when |q_n/p_n| ≥ 1, as then infinitely many lie on the right), and
// reports whether f is of neutral type. For other types it returns −Inf.
func ChainAbscissa(f stability.Function) (float64, bool) {
	P, Q := trimTop(f.P), trimTop(f.Q)
	if len(P) == 0 || len(P) != len(Q) || f.Delay <= 0 {
		return math.Inf(-1), false
	}
	r := math.Abs(Q[len(Q)-1] / P[len(P)-1])
	if r >= 1 {
		return math.Inf(1), true
	}
	return math.Log(r) / f.Delay, true
}

// collocationSeeds returns the eigenvalues of the collocated infinitesimal
// generator on nodes + 1 Chebyshev points.
func collocationSeeds(P, Q poly.Poly, L float64, nodes int) ([]complex128, error) {
	n := len(P) - 1
	N := nodes
	size := n * (N + 1)
	a := mat.NewDense(size, size, nil)
	// Row block 0: x'(0) = A0·x(0) + A1·x(−L), x(−L) at the last node.
	for r := 0; r+1 < n; r++ {
		a.Set(r, r+1, 1)
	}
	for j, v := range P[:n] {
		a.Set(n-1, j, -v/P[n])
	}
	for j, v := range Q {
		a.Set(n-1, n*N+j, a.At(n-1, n*N+j)-v/P[n])
	}
	// Row blocks 1 … N: the derivative at node i from the Chebyshev
	// differentiation matrix mapped to θ = L·(x − 1)/2 on [−L, 0].
	x := make([]float64, N+1)
	for i := range x {
		x[i] = math.Cos(math.Pi * float64(i) / float64(N))
	}
	weight := func(i int) float64 {
		w := 1.0
		if i == 0 || i == N {
			w = 2
		}
		if i%2 == 1 {
			w = -w
		}
		return w
	}
	for i := 1; i <= N; i++ {
		diag := 0.0
		for j := 0; j <= N; j++ {
			if j == i {
				continue
			}
			d := weight(i) / weight(j) / (x[i] - x[j]) * 2 / L
			diag -= d
			for r := 0; r < n; r++ {
				a.Set(n*i+r, n*j+r, d)
			}
		}
		for r := 0; r < n; r++ {
			a.Set(n*i+r, n*i+r, diag)
		}
	}
	var eig mat.Eigen
	if !eig.Factorize(a, mat.EigenNone) {
		return nil, errors.New("delay: the eigenvalues of the collocated generator did not converge")
	}
	return eig.Values(nil), nil
}

// padeSeeds returns the roots of P·den + Q·num for the Padé approximant
// num/den of e^(−Ls) of an order that covers |s| up to about nodes/L.
func padeSeeds(P, Q poly.Poly, L float64, nodes int) ([]complex128, error) {
	num, den := Pade(L, min(PadeOrder(float64(nodes)), MaxPadeOrder))
	return poly.Add(poly.Mul(P, den), poly.Mul(Q, num)).Roots()
}

// polished returns the distinct roots Newton's method reaches from the
// seeds, right of the limit.
func polished(f stability.Function, seeds []complex128, limit float64) []complex128 {
	var out []complex128
	for _, s := range seeds {
		if imag(s) < 0 {
			continue // conjugates are added below
		}
		r, ok := Newton(f, s)
		if !ok || real(r) <= limit {
			continue
		}
		if math.Abs(imag(r)) <= 1e-10*cmplx.Abs(r) {
			r = complex(real(r), 0)
		}
		if imag(r) < 0 {
			r = cmplx.Conj(r)
		}
		dup := false
		for _, o := range out {
			if cmplx.Abs(o-r) <= 1e-8*(1+cmplx.Abs(r)) {
				dup = true
				break
			}
		}
		if !dup {
			out = append(out, r)
			if imag(r) != 0 {
				out = append(out, cmplx.Conj(r))
			}
		}
	}
	return out
}

// pick sorts roots rightmost first (positive imaginary part first within a
// pair) and returns the first k, completing a split pair.
func pick(roots []complex128, k int) []complex128 {
	sort.SliceStable(roots, func(i, j int) bool {
		if real(roots[i]) != real(roots[j]) {
			return real(roots[i]) > real(roots[j])
		}
		return imag(roots[i]) > imag(roots[j])
	})
	if k >= len(roots) {
		return roots
	}
	if imag(roots[k-1]) > 0 {
		k++
	}
	return roots[:k]
}

// confirmed checks got, the first of the sorted roots, with the count:
// there are exactly as many roots right of a line just left of the last
// one as were found there; with none found, there are none right of the
// chain abscissa limit.
func confirmed(c *Counter, f stability.Function, roots, got []complex128, limit float64) bool {
	if len(got) == 0 {
		if math.IsInf(limit, -1) {
			return false
		}
		return c.Count(Shift(f, limit+1e-9*(1+math.Abs(limit)))).Unstable == 0
	}
	last := real(got[len(got)-1])
	sigma := last - 1e-6*(1+math.Abs(last))
	for _, r := range roots[len(got):] {
		if real(r) > sigma {
			sigma = 0.5 * (last + real(r))
		}
	}
	want := 0
	for _, r := range roots {
		if real(r) > sigma {
			want++
		}
	}
	v := c.Count(Shift(f, sigma))
	return v.Unstable == want
}

// Shift returns the characteristic function of f moved by a, Δ(s + a) =
// P(s + a) + e^(−La)·Q(s + a)·e^(−Ls), whose roots are those of f less a:
// Count of the result counts the roots of f with real part above a, so
// Shift(f, −α) tests for a decay rate α. The shifted coefficients are
// formed by Horner's synthetic division (the Taylor coefficients at a).
func Shift(f stability.Function, a float64) stability.Function {
	g := stability.Function{P: taylorShift(f.P, a), Q: taylorShift(f.Q, a), Delay: f.Delay}
	if len(g.Q) > 0 && f.Delay != 0 {
		e := math.Exp(-f.Delay * a)
		for k := range g.Q {
			g.Q[k] *= e
		}
	}
	return g
}

// taylorShift returns the coefficients of p(s + a).
func taylorShift(p []float64, a float64) poly.Poly {
	out := append(poly.Poly(nil), p...)
	n := len(out)
	for i := 0; i < n; i++ {
		for j := n - 2; j >= i; j-- {
			out[j] += a * out[j+1]
		}
	}
	return out
}

// DecayRate returns −max Re λ over the roots: the rate at which the
// slowest of them decays (negative when one grows).
func DecayRate(roots []complex128) float64 {
	m := math.Inf(-1)
	for _, r := range roots {
		m = math.Max(m, real(r))
	}
	return -m
}

// LeastDamping returns the smallest damping ratio −Re λ/|λ| over the
// roots: 1 for a root on the negative real axis, 0 on the imaginary axis,
// negative on the right.
func LeastDamping(roots []complex128) float64 {
	m := math.Inf(1)
	for _, r := range roots {
		if a := cmplx.Abs(r); a > 0 {
			m = math.Min(m, -real(r)/a)
		}
	}
	return m
}
