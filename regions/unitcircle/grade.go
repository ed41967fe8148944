package unitcircle

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/lapack"
	lapackgonum "gonum.org/v1/gonum/lapack/gonum"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Grade is how fast and how well damped the roots of a sampled loop are,
// read through their continuous-time equivalents s = ln(z)/T.
type Grade struct {
	// Radius is the largest root magnitude |z|: below 1 for a stable
	// loop; 0 for a loop whose roots are all at z = 0 (deadbeat) or that
	// has no root.
	Radius float64
	// Decay is −ln(Radius)/T (1/s), the decay rate of the slowest mode:
	// a sampled mode z^k = e^(k·T·ln z) decays like e^(−Decay·t). +Inf
	// when Radius is 0.
	Decay float64
	// Damping is the smallest damping ratio ζ = −Re(s)/|s| over the
	// equivalent poles s = ln(z)/T on the principal branch
	// (Im s ∈ (−π/T, π/T]). A root on the negative real axis has no real
	// equivalent: the principal branch puts it at ω = π/T, the fastest
	// oscillation a sampled signal can show (one sign change per sample),
	// with ζ = −ln|z|/√(ln²|z| + π²). A root at z = 0 counts as ζ = 1 (an
	// infinitely fast real mode), one at z = 1 as ζ = 0; a root outside
	// the circle has ζ < 0. 1 with no roots.
	Damping float64
}

// GradeRoots returns the Grade of the roots zs of a loop sampled every T
// seconds.
func GradeRoots(zs []complex128, T float64) Grade {
	g := Grade{Damping: 1}
	for _, z := range zs {
		g.add(real(z), imag(z))
	}
	g.Decay = -math.Log(g.Radius) / T
	return g
}

func (g *Grade) add(re, im float64) {
	m := math.Hypot(re, im)
	g.Radius = math.Max(g.Radius, m)
	if m == 0 {
		return
	}
	sigma, theta := math.Log(m), math.Atan2(im, re)
	if h := math.Hypot(sigma, theta); h > 0 {
		g.Damping = math.Min(g.Damping, -sigma/h)
	} else {
		g.Damping = math.Min(g.Damping, 0)
	}
}

// Grader grades polynomials in z up to a fixed size, reusing its
// buffers: the roots are the eigenvalues of the companion matrix (first
// row −p[n−1…0]/p[n], ones below the diagonal), which is upper Hessenberg
// already, so it is balanced by diagonal scaling (B. N. Parlett,
// C. Reinsch, Numer. Math. 13, 1969; gonum's Dgebal) and handed to the
// double-shift QR algorithm (J. G. F. Francis, Computer Journal 4,
// 1961–62; gonum's Dlahqr): the path poly.Roots takes through mat.Eigen
// without its matrices and workspace. Dlahqr itself still allocates a
// three-entry array per QR step (gonum v0.17: it escapes to the heap),
// about one per root, so the Grader allocates less than poly.Roots but
// not nothing. A Grader is not safe for concurrent use.
type Grader struct {
	T                float64
	h, scale, wr, wi []float64
}

// NewGrader returns a Grader for polynomials with up to n coefficients
// sampled every T seconds.
func NewGrader(n int, T float64) *Grader {
	d := max(n-1, 1)
	return &Grader{T: T, h: make([]float64, d*d), scale: make([]float64, d), wr: make([]float64, d), wi: make([]float64, d)}
}

var impl lapackgonum.Implementation

// Roots returns the real and imaginary parts of the roots of p (leading
// coefficients exactly zero dropped), in slices owned by the Grader and
// overwritten by the next call. It panics if p is longer than the Grader
// was made for.
func (g *Grader) Roots(p poly.Poly) (re, im []float64, err error) {
	p = p.Trim(0)
	n := len(p) - 1
	switch {
	case n < 0:
		return nil, nil, fmt.Errorf("unitcircle: roots of the zero polynomial")
	case n > len(g.wr):
		panic(fmt.Sprintf("unitcircle: degree %d for a grader of degree %d", n, len(g.wr)))
	case !p.Finite():
		return nil, nil, fmt.Errorf("unitcircle: roots of %v, which has coefficients that are not finite", p)
	case n == 0:
		return g.wr[:0], g.wi[:0], nil
	}
	h := g.h[:n*n]
	clear(h)
	for j := 0; j < n; j++ {
		h[j] = -p[n-1-j] / p[n]
	}
	for i := 1; i < n; i++ {
		h[i*n+i-1] = 1
	}
	re, im = g.wr[:n], g.wi[:n]
	lo, hi := impl.Dgebal(lapack.Scale, n, h, n, g.scale[:n])
	if impl.Dlahqr(false, false, n, lo, hi, h, n, re, im, 0, n-1, nil, 1) != 0 {
		return nil, nil, fmt.Errorf("unitcircle: the QR iteration did not converge for %v", p)
	}
	return re, im, nil
}

// Grade returns the Grade of the roots of p.
func (g *Grader) Grade(p poly.Poly) (Grade, error) {
	re, im, err := g.Roots(p)
	if err != nil {
		return Grade{}, err
	}
	gr := Grade{Damping: 1}
	for k := range re {
		gr.add(re[k], im[k])
	}
	gr.Decay = -math.Log(gr.Radius) / g.T
	return gr, nil
}

// NewGrader implements stability.Test: decay rate and damping from the
// roots of P (Grader), through their continuous equivalents.
func (t Test) NewGrader(n int) stability.Grader {
	t.check()
	return testGrader{NewGrader(n, t.T)}
}

type testGrader struct{ g *Grader }

// Decay implements stability.Grader; NaN when the roots cannot be found.
func (t testGrader) Decay(f stability.Function) float64 {
	d, _ := t.DecayDamping(f)
	return d
}

// DecayDamping implements stability.Grader.
func (t testGrader) DecayDamping(f stability.Function) (decay, damping float64) {
	g, err := t.g.Grade(f.P)
	if err != nil {
		return math.NaN(), math.NaN()
	}
	return g.Decay, g.Damping
}
