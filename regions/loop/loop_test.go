package loop

import (
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// TestCharacteristic checks Dc·D + Nc·N against products worked by hand.
func TestCharacteristic(t *testing.T) {
	tests := []struct {
		name   string
		plant  Plant
		fam    family.Family
		values []float64
		want   poly.Poly // ascending
	}{
		// PI on 1/(s+1)³: s(s+1)³ + kp·s + ki = s⁴ + 3s³ + 3s² + (1+kp)s + ki.
		{"PI on a triple lag", Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 3, 3, 1}}, family.ProportionalIntegral{}, []float64{2, 0.5}, poly.Poly{0.5, 3, 3, 3, 1}},
		// Ideal PID (tau = 0) on 1/(s+1): s(s+1) + kd·s² + kp·s + ki; the
		// s² term of Dc is exactly zero, so the degree is 2, not 3.
		{"ideal PID has no root at infinity", Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 1}}, family.PID{}, []float64{1, 2, 3, 0}, poly.Poly{2, 2, 4}},
	}
	for _, tc := range tests {
		l := Loop{Plant: tc.plant, Family: tc.fam, Values: tc.values}
		got := l.Characteristic()
		if len(got) != len(tc.want) {
			t.Fatalf("%s: %v; want %v", tc.name, got, tc.want)
		}
		for i := range got {
			if got[i] != tc.want[i] {
				t.Fatalf("%s: %v; want %v", tc.name, got, tc.want)
			}
		}
		if f := l.Function(); !f.Rational() || len(f.P) != len(tc.want) {
			t.Errorf("%s: function %+v", tc.name, f)
		}
	}
}

func TestWithCopies(t *testing.T) {
	l := New(Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 1}}, family.ProportionalIntegral{})
	m := l.With(0, 5, 1, 7)
	if l.Values[0] != 1 || l.Values[1] != 0 || m.Values[0] != 5 || m.Values[1] != 7 {
		t.Fatalf("With changed the original or failed: %v %v", l.Values, m.Values)
	}
	if s := l.Set(1, 3); s.Values[1] != 3 || l.Values[1] != 0 {
		t.Fatal("Set")
	}
	if _, ok := l.Test().(routh.Test); !ok {
		t.Fatalf("test %T; want the sign array for a rational continuous loop", l.Test())
	}
	if err := (Loop{Plant: l.Plant, Family: family.PID{}, Values: []float64{1}}).Check(); err == nil {
		t.Error("wrong number of values accepted")
	}
}

// TestFunctionWithDeadTime: ideal PID (tau = 0) on e^(−s)/(s+1), worked by
// hand: P = Dc·D = s(s+1) = s² + s, whose s³ term from tau·s² is exactly
// zero and so absent (no root at infinity), and Q = Nc·N = kd·s² + kp·s + ki.
func TestFunctionWithDeadTime(t *testing.T) {
	l := Loop{Plant: Plant{Num: poly.Poly{1}, Den: poly.Poly{1, 1}, Delay: 1}, Family: family.PID{}, Values: []float64{1, 2, 3, 0}}
	f := l.Function()
	want := struct{ p, q poly.Poly }{poly.Poly{0, 1, 1}, poly.Poly{2, 1, 3}}
	if f.Delay != 1 || len(f.P) != len(want.p) || len(f.Q) != len(want.q) {
		t.Fatalf("function %+v; want P %v, Q %v", f, want.p, want.q)
	}
	for i := range f.P {
		if f.P[i] != want.p[i] || f.Q[i] != want.q[i] {
			t.Fatalf("function %+v; want P %v, Q %v", f, want.p, want.q)
		}
	}
}
