package plane

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
)

// TestPencilIsExactForEveryFamily checks the family.Family contract that
// the characteristic polynomial is affine in each parameter alone: for
// every family and every pair of parameters, the pencil built from four
// corner evaluations must reproduce the directly formed characteristic
// polynomial at random points.
func TestPencilIsExactForEveryFamily(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	// Invented plant 2(s+0.5)/((s+1)(s+2)(s+3)).
	num := poly.Poly{1, 2}
	den := poly.Mul(poly.Poly{1, 1}, poly.Mul(poly.Poly{2, 1}, poly.Poly{3, 1}))
	for _, f := range family.All() {
		np := len(f.Params())
		for xi := 0; xi < np; xi++ {
			for yi := 0; yi < np; yi++ {
				if xi == yi {
					continue
				}
				vals := make([]float64, np)
				for i := range vals {
					vals[i] = rng.Float64()*4 - 1
				}
				l := loop.Loop{Plant: loop.Plant{Num: num, Den: den}, Family: f, Values: vals}
				s, err := NewSetup(l, Axis{Param: f.Params()[xi].Name, Min: 0, Max: 1, N: 2}, Axis{Param: f.Params()[yi].Name, Min: 0, Max: 1, N: 2})
				if err != nil {
					t.Fatal(err)
				}
				pc := s.Char
				for trial := 0; trial < 20; trial++ {
					x, y := rng.Float64()*20-10, rng.Float64()*20-10
					cn, cd := family.Controller(f, s.With(xi, x, yi, y).Values)
					want := family.Characteristic(num, den, cn, cd)
					got := pc.Eval(x, y)
					for k := range got {
						w := 0.0
						if k < len(want) {
							w = want[k]
						}
						if math.Abs(got[k]-w) > 1e-12*(1+want.Scale()) {
							t.Fatalf("%s (%s, %s): coefficient %d = %g; direct %g", f.Name(), f.Params()[xi].Name, f.Params()[yi].Name, k, got[k], w)
						}
					}
				}
			}
		}
	}
}

func TestNewSetupErrors(t *testing.T) {
	l := loop.Loop{Plant: loop.Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 1}}, Family: family.ProportionalIntegral{}, Values: []float64{1, 0}}
	if _, err := NewSetup(l, Axis{Param: "kp"}, Axis{Param: "kp"}); err == nil {
		t.Error("same axis twice accepted")
	}
	if _, err := NewSetup(l, Axis{Param: "kd"}, Axis{Param: "kp"}); err == nil {
		t.Error("unknown parameter accepted")
	}
}

// TestCharacteristicDropsStructuralZeros: an ideal PID (tau = 0) has a
// characteristic polynomial one degree lower, not a root at infinity.
// Derived by hand: 1/(s+1) under kp + ki/s + kd·s gives
// s(s+1) + kd·s² + kp·s + ki = (1+kd)s² + (1+kp)s + ki.
func TestCharacteristicDropsStructuralZeros(t *testing.T) {
	l := loop.Loop{Plant: loop.Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 1}}, Family: family.PID{}, Values: []float64{2, 3, 0.5, 0}}
	got := l.Characteristic()
	want := poly.Poly{3, 3, 1.5}
	if len(got) != len(want) {
		t.Fatalf("got %v; want %v", got, want)
	}
	for k := range want {
		if math.Abs(got[k]-want[k]) > 1e-15 {
			t.Fatalf("got %v; want %v", got, want)
		}
	}
}
