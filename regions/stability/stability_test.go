package stability

import (
	"encoding/json"
	"testing"
)

func TestClass(t *testing.T) {
	tests := []struct {
		v    Verdict
		want Class
	}{
		{Verdict{}, ClassStable},
		{Verdict{Boundary: 1}, ClassMarginal},
		{Verdict{Infinite: 1}, ClassMarginal},
		{Verdict{Unstable: 2, Boundary: 1}, ClassUnstable},
		{Verdict{Unstable: Undecided}, ClassUndecided},
	}
	for _, tc := range tests {
		if got := tc.v.Class(); got != tc.want {
			t.Errorf("%+v: class %v; want %v", tc.v, got, tc.want)
		}
		if tc.v.Stable() != (tc.want == ClassStable) {
			t.Errorf("%+v: Stable wrong", tc.v)
		}
	}
}

func TestKindText(t *testing.T) {
	for _, k := range []Kind{None, Real, Complex, Infinite, Alternating} {
		b, err := json.Marshal(k)
		if err != nil {
			t.Fatal(err)
		}
		var back Kind
		if err := json.Unmarshal(b, &back); err != nil || back != k {
			t.Errorf("%v → %s → %v, %v", k, b, back, err)
		}
	}
	if b, _ := json.Marshal(Complex); string(b) != `"complex"` {
		t.Errorf("Complex writes %s", b)
	}
	if _, err := json.Marshal(Kind(99)); err == nil {
		t.Error("unknown kind written")
	}
	var k Kind
	if err := k.UnmarshalText([]byte("sideways")); err == nil {
		t.Error("unknown name read")
	}
}
