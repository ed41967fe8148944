package boundary

import (
	"context"
	"math"
	"reflect"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

func mapOf(t *testing.T, num, den poly.Poly, f family.Family, values []float64, x, y plane.Axis, workers int) (plane.Setup, *grid.Map, []Curve) {
	t.Helper()
	s, err := plane.NewSetup(loop.Loop{Plant: loop.Plant{Num: num, Den: den}, Family: f, Values: values}, x, y)
	if err != nil {
		t.Fatal(err)
	}
	m, err := grid.Evaluate(context.Background(), s, grid.Options{Workers: workers})
	if err != nil {
		t.Fatal(err)
	}
	curves, err := Trace(context.Background(), s, m, workers)
	if err != nil {
		t.Fatal(err)
	}
	return s, m, curves
}

// TestDPartitionAgainstHandDerivedCurves compares every refined boundary
// point, and its ω, with the D-partition curves derived by hand.
func TestDPartitionAgainstHandDerivedCurves(t *testing.T) {
	tests := []struct {
		name     string
		num, den poly.Poly
		fam      family.Family
		values   []float64
		x, y     plane.Axis
		// complexCurve gives (x, y) on the complex-root boundary at ω.
		complexCurve func(w float64) (float64, float64)
		// onReal reports whether (x, y) lies on the real-root boundary.
		onReal func(x, y float64) bool
	}{
		{
			// PI on 1/(s+1)³. Derived by hand: the characteristic polynomial
			// is s⁴ + 3s³ + 3s² + (1+kp)s + ki. At s = jω the real part
			// ω⁴ − 3ω² + ki = 0 and the imaginary part −3ω³ + (1+kp)ω = 0
			// give kp = 3ω² − 1, ki = 3ω² − ω⁴; s = 0 is a root when ki = 0.
			name: "PI on a triple lag",
			num:  poly.Poly{1}, den: poly.FromDescending([]float64{1, 3, 3, 1}),
			fam: family.ProportionalIntegral{}, values: []float64{0, 0},
			x: plane.Axis{Param: "kp", Min: -2, Max: 8, N: 120}, y: plane.Axis{Param: "ki", Min: -1, Max: 3, N: 90},
			complexCurve: func(w float64) (float64, float64) { return 3*w*w - 1, 3*w*w - w*w*w*w },
			onReal:       func(x, y float64) bool { return math.Abs(y) < 1e-8 },
		},
		{
			// PD on 1/(s(s+1)(s+2)). Derived by hand: s³ + 3s² + (2+kd)s + kp.
			// At s = jω: kp − 3ω² = 0 and (2+kd)ω − ω³ = 0, so kp = 3ω²,
			// kd = ω² − 2; s = 0 is a root when kp = 0.
			name: "PD on a type-1 plant",
			num:  poly.Poly{1}, den: poly.FromDescending([]float64{1, 3, 2, 0}),
			fam: family.ProportionalDerivative{}, values: []float64{0, 0},
			x: plane.Axis{Param: "kp", Min: -2, Max: 20, N: 110}, y: plane.Axis{Param: "kd", Min: -3, Max: 5, N: 100},
			complexCurve: func(w float64) (float64, float64) { return 3 * w * w, w*w - 2 },
			onReal:       func(x, y float64) bool { return math.Abs(x) < 1e-8*22 },
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, _, curves := mapOf(t, tc.num, tc.den, tc.fam, tc.values, tc.x, tc.y, 0)
			var nComplex, nReal int
			for _, c := range curves {
				for _, p := range c.Points {
					switch c.Kind {
					case stability.Complex:
						nComplex++
						wx, wy := tc.complexCurve(p.Omega)
						if math.Abs(wx-p.X) > 1e-6*tc.x.Span() || math.Abs(wy-p.Y) > 1e-6*tc.y.Span() {
							t.Fatalf("complex point (%g, %g) with ω = %g; the hand-derived curve gives (%g, %g)", p.X, p.Y, p.Omega, wx, wy)
						}
					case stability.Real:
						nReal++
						if !tc.onReal(p.X, p.Y) || p.Omega != 0 {
							t.Fatalf("real point (%g, %g) ω = %g is off the hand-derived line", p.X, p.Y, p.Omega)
						}
					default:
						t.Fatalf("unexpected %s boundary at (%g, %g)", c.Kind, p.X, p.Y)
					}
				}
			}
			if nComplex < 50 || nReal < 20 {
				t.Fatalf("%d complex and %d real points; want both boundaries traced", nComplex, nReal)
			}
		})
	}
}

// TestInfiniteBoundary checks the root-through-infinity edge. Derived by
// hand: plant (s+2)/(s²+s+1) under the ideal PD kp + kd·s gives
// (1+kd)s² + (1+kp+2kd)s + (1+2kp), whose leading coefficient vanishes on
// the line kd = −1.
func TestInfiniteBoundary(t *testing.T) {
	_, _, curves := mapOf(t, poly.Poly{2, 1}, poly.Poly{1, 1, 1}, family.ProportionalDerivative{}, []float64{0, 0},
		plane.Axis{Param: "kp", Min: 0, Max: 5, N: 60}, plane.Axis{Param: "kd", Min: -3, Max: 2, N: 60}, 0)
	n := 0
	for _, c := range curves {
		if c.Kind != stability.Infinite {
			continue
		}
		for _, p := range c.Points {
			n++
			if math.Abs(p.Y+1) > 1e-8 {
				t.Fatalf("infinite-root point at kd = %.12g; want -1", p.Y)
			}
		}
	}
	if n < 30 {
		t.Fatalf("%d infinite-root points; want the whole line kd = -1", n)
	}
}

// TestMapIndependentOfWorkers checks that the map and its boundaries are
// identical with one worker and with several.
func TestMapIndependentOfWorkers(t *testing.T) {
	// The demo plant 3/((s+0.5)(s+2)(0.4s+1)²).
	num, den := poly.Poly{3}, poly.Mul(poly.Poly{0.5, 1}, poly.Mul(poly.Poly{2, 1}, poly.Poly{1, 0.4}.Pow(2)))
	x := plane.Axis{Param: "kp", Min: -1, Max: 8, N: 97}
	y := plane.Axis{Param: "ki", Min: -0.5, Max: 4, N: 83}
	values := []float64{0, 0, 0.5, 0.05}
	_, m1, c1 := mapOf(t, num, den, family.PID{}, values, x, y, 1)
	for _, w := range []int{2, 3, 8} {
		_, m2, c2 := mapOf(t, num, den, family.PID{}, values, x, y, w)
		if !reflect.DeepEqual(m1.RHP, m2.RHP) {
			t.Fatalf("map with %d workers differs from 1 worker", w)
		}
		if !reflect.DeepEqual(c1, c2) {
			t.Fatalf("boundaries with %d workers differ from 1 worker", w)
		}
	}
}
