package overlay

import (
	"context"
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// setupOf builds a setup from plant coefficients listed highest power
// first, a family name, its parameter values (those of the axes ignored)
// and two axes.
func setupOf(t testing.TB, num, den []float64, fam string, values []float64, x, y plane.Axis) plane.Setup {
	t.Helper()
	f, err := family.Lookup(fam)
	if err != nil {
		t.Fatal(err)
	}
	loop := loop.Loop{Plant: loop.Plant{Num: poly.FromDescending(num), Den: poly.FromDescending(den)}, Family: f, Values: values}
	s, err := plane.NewSetup(loop, x, y)
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// mapOf evaluates the stability map of s.
func mapOf(t testing.TB, s plane.Setup) *grid.Map {
	t.Helper()
	m, err := grid.Evaluate(context.Background(), s, grid.Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// stablePolys returns the characteristic polynomials at the stable nodes
// of s, in row-major order.
func stablePolys(t testing.TB, s plane.Setup) []poly.Poly {
	m := mapOf(t, s)
	pc := s.Char
	var ps []poly.Poly
	for j := 0; j < s.Y.N; j++ {
		for i := 0; i < s.X.N; i++ {
			if m.Count(i, j) == 0 {
				ps = append(ps, pc.Eval(s.X.At(i), s.Y.At(j)))
			}
		}
	}
	if len(ps) == 0 {
		t.Fatal("no stable node")
	}
	return ps
}

// eigenDecay is the reference decay rate and damping ratio from gonum's
// general eigenvalue solver (poly.Roots, through mat.Eigen).
func eigenDecay(t testing.TB, p poly.Poly) (decay, damping, size float64) {
	roots, err := p.Trim(1e-13).Roots()
	if err != nil {
		t.Fatal(err)
	}
	maxRe, zeta := math.Inf(-1), math.Inf(1)
	for _, r := range roots {
		maxRe = math.Max(maxRe, real(r))
		zeta = math.Min(zeta, -real(r)/cmplx.Abs(r))
		size = math.Max(size, cmplx.Abs(r))
	}
	return -maxRe, zeta, size
}

// sweepMs is a plain maximum-sensitivity evaluator for tests:
// Ms = max over ω of |den/(den + num)|(jω), sampled at 600 frequencies
// from 1e-3 to 1e3 rad/s on a log scale and refined by golden-section
// search around the largest sample. It is independent of the code under
// test.
func sweepMs(num, den poly.Poly) float64 {
	s := func(w float64) float64 {
		d := den.Eval(complex(0, w))
		return cmplx.Abs(d / (d + num.Eval(complex(0, w))))
	}
	const n = 600
	at := func(k float64) float64 { return math.Pow(10, -3+6*k/(n-1)) }
	best, bk := 0.0, 0
	for k := 0; k < n; k++ {
		if v := s(at(float64(k))); v > best {
			best, bk = v, k
		}
	}
	a, b := float64(max(bk-1, 0)), float64(min(bk+1, n-1))
	g := (math.Sqrt(5) - 1) / 2
	for b-a > 1e-9 {
		c, d := b-g*(b-a), a+g*(b-a)
		if s(at(c)) > s(at(d)) {
			b = d
		} else {
			a = c
		}
	}
	return math.Max(best, s(at(0.5*(a+b))))
}
