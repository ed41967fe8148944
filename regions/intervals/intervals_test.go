package intervals

import (
	"math"
	"strings"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// loopOf builds a loop from plant coefficients listed highest power first.
func loopOf(t testing.TB, num, den []float64, fam string, values ...float64) loop.Loop {
	t.Helper()
	f, err := family.Lookup(fam)
	if err != nil {
		t.Fatal(err)
	}
	if len(values) != len(f.Params()) {
		t.Fatalf("%d values for %s", len(values), fam)
	}
	return loop.Loop{Plant: loop.Plant{Num: poly.FromDescending(num), Den: poly.FromDescending(den)}, Family: f, Values: values}
}

// tol is the comparison tolerance of the hand-derived checks: 1e-9
// relative, or absolute for values near zero.
const tol = 1e-9

func near(got, want float64) bool {
	if math.IsNaN(want) {
		return math.IsNaN(got)
	}
	return math.Abs(got-want) <= tol*math.Max(1, math.Abs(want))
}

var nan = math.NaN()

// TestStableHandDerived checks cases whose intervals follow from the
// Routh array worked by hand; each derivation is beside its case.
func TestStableHandDerived(t *testing.T) {
	tests := []struct {
		name     string
		num, den []float64
		fam      string
		values   []float64
		param    int
		lo, hi   float64
		want     []Interval
	}{
		{
			name: "P on 1/(s+1)^3",
			// Derived by hand: p = s³+3s²+3s+1+kp. Routh column 1, 3,
			// (9−(1+kp))/3, 1+kp: stable for −1 < kp < 8. At kp = −1 the
			// constant vanishes (real, ω = 0); at kp = 8 the s¹ row
			// vanishes and the auxiliary 3s²+9 gives ω = √3.
			num: []float64{1}, den: []float64{1, 3, 3, 1}, fam: "p", values: []float64{1},
			param: 0, lo: -5, hi: 20,
			want: []Interval{{-1, 8, stability.Real, stability.Complex, 0, math.Sqrt(3)}},
		},
		{
			name: "P on 1/(s(s+1)(s+2))",
			// Derived by hand: p = s³+3s²+2s+kp; column 1, 3, (6−kp)/3,
			// kp: stable for 0 < kp < 6. At kp = 6 the s¹ row vanishes and
			// the s² row gives the auxiliary 3s²+6, ω = √2.
			num: []float64{1}, den: []float64{1, 3, 2, 0}, fam: "p", values: []float64{1},
			param: 0, lo: -2, hi: 10,
			want: []Interval{{0, 6, stability.Real, stability.Complex, 0, math.Sqrt2}},
		},
		{
			name: "P on 1/(s(s²+s+1)(s+2))",
			// K. Ogata, Modern Control Engineering, 5th ed., Sec. 5-6,
			// Routh's criterion applied to K/(s(s²+s+1)(s+2)): stable for
			// 0 < K < 14/9 (from memory). Confirmed by hand:
			// p = s⁴+3s³+3s²+2s+K; column 1, 3, 7/3, 2−9K/7, K. At
			// K = 14/9 the auxiliary (7/3)s²+14/9 gives ω = √(2/3).
			num: []float64{1}, den: []float64{1, 3, 3, 2, 0}, fam: "p", values: []float64{1},
			param: 0, lo: -1, hi: 5,
			want: []Interval{{0, 14.0 / 9, stability.Real, stability.Complex, 0, math.Sqrt(2.0 / 3)}},
		},
		{
			name: "PI, ki varied, on 1/(s+1)^2 with kp = 2",
			// Derived by hand: p = s(s+1)²+2s+ki = s³+2s²+3s+ki; column
			// 1, 2, (6−ki)/2, ki: stable for 0 < ki < 6; auxiliary
			// 2s²+6 gives ω = √3.
			num: []float64{1}, den: []float64{1, 2, 1}, fam: "pi", values: []float64{2, 0},
			param: 1, lo: -1, hi: 10,
			want: []Interval{{0, 6, stability.Real, stability.Complex, 0, math.Sqrt(3)}},
		},
		{
			name: "PD, kd varied, plant of relative degree 1",
			// Derived by hand: plant (s+2)/(s²+3s+1), kp = 1:
			// p = s²+3s+1+(1+kd·s)(s+2) = (1+kd)s²+(4+2kd)s+3. A quadratic
			// is stable exactly when its coefficients share a sign; the
			// constant is 3 > 0, so kd > −1 and kd > −2. At kd = −1 the
			// leading coefficient vanishes: a root leaves through
			// infinity. The window cuts the interval at 5.
			num: []float64{1, 2}, den: []float64{1, 3, 1}, fam: "pd", values: []float64{1, 0},
			param: 1, lo: -3, hi: 5,
			want: []Interval{{-1, 5, stability.Infinite, Window, nan, nan}},
		},
		{
			name: "two intervals",
			// Derived by hand: plant (s²+s+4)/(s³−3) under P:
			// p = s³+k·s²+k·s+4k−3. Column 1, k, (k²−4k+3)/k, 4k−3:
			// stable for k > 3/4 and (k−1)(k−3) > 0, so 3/4 < k < 1 or
			// k > 3. At k = 1, p = (s+1)(s²+1): ω = 1; at k = 3,
			// p = (s+3)(s²+3): ω = √3.
			num: []float64{1, 1, 4}, den: []float64{1, 0, 0, -3}, fam: "p", values: []float64{1},
			param: 0, lo: 0, hi: 10,
			want: []Interval{
				{0.75, 1, stability.Real, stability.Complex, 0, 1},
				{3, 10, stability.Complex, Window, math.Sqrt(3), nan},
			},
		},
		{
			name: "roots touching the axis split an interval",
			// Derived by hand: plant (s²+s+2)/(s³−1) under P:
			// p = s³+k·s²+k·s+2k−1. Column 1, k, (k−1)²/k, 2k−1: stable
			// for k > 1/2 except k = 1, where p = (s+1)(s²+1) has a pair
			// at ±j that touches the axis and returns.
			num: []float64{1, 1, 2}, den: []float64{1, 0, 0, -1}, fam: "p", values: []float64{1},
			param: 0, lo: 0, hi: 3,
			want: []Interval{
				{0.5, 1, stability.Real, stability.Complex, 0, 1},
				{1, 3, stability.Complex, Window, 1, nan},
			},
		},
		{
			name: "window inside a stable interval",
			// As the first case: [0, 2] lies inside (−1, 8).
			num: []float64{1}, den: []float64{1, 3, 3, 1}, fam: "p", values: []float64{1},
			param: 0, lo: 0, hi: 2,
			want: []Interval{{0, 2, Window, Window, nan, nan}},
		},
		{
			name: "window inside an unstable interval",
			// As the first case: [10, 20] lies above 8.
			num: []float64{1}, den: []float64{1, 3, 3, 1}, fam: "p", values: []float64{1},
			param: 0, lo: 10, hi: 20,
			want: nil,
		},
		{
			name: "window ends on the boundaries",
			// As the second case with the window [0, 6] equal to the
			// stable interval: the ends are the loop's, not the window's.
			num: []float64{1}, den: []float64{1, 3, 2, 0}, fam: "p", values: []float64{1},
			param: 0, lo: 0, hi: 6,
			want: []Interval{{0, 6, stability.Real, stability.Complex, 0, math.Sqrt2}},
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			loop := loopOf(t, tc.num, tc.den, tc.fam, tc.values...)
			got, err := Stable(loop, tc.param, tc.lo, tc.hi)
			if err != nil {
				t.Fatal(err)
			}
			if len(got) != len(tc.want) {
				t.Fatalf("got %d intervals %+v; want %+v", len(got), got, tc.want)
			}
			for i, w := range tc.want {
				g := got[i]
				if !near(g.Lo, w.Lo) || !near(g.Hi, w.Hi) || g.LoKind != w.LoKind || g.HiKind != w.HiKind ||
					!near(g.LoOmega, w.LoOmega) || !near(g.HiOmega, w.HiOmega) {
					t.Errorf("interval %d = %+v; want %+v (within %g)", i, g, w, tol)
				}
			}
		})
	}
}

// TestStableErrors checks that a bad window is reported with its values.
func TestStableErrors(t *testing.T) {
	loop := loopOf(t, []float64{1}, []float64{1, 1}, "p", 1)
	tests := []struct {
		name   string
		lo, hi float64
	}{
		{"reversed", 2, 1},
		{"empty", 1, 1},
		{"not a number", nan, 1},
		{"infinite", 0, math.Inf(1)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Stable(loop, 0, tc.lo, tc.hi)
			if err == nil || !strings.Contains(err.Error(), "kp") {
				t.Fatalf("error %v; want one naming kp", err)
			}
		})
	}
}

// TestStableZeroCharacteristic checks the error for a loop whose
// characteristic polynomial vanishes: plant 0/1 with the P gain zeroed is
// impossible to form, so use a zero denominator and zero numerator.
func TestStableZeroCharacteristic(t *testing.T) {
	loop := loopOf(t, []float64{0}, []float64{0}, "p", 1)
	if _, err := Stable(loop, 0, 0, 1); err == nil {
		t.Fatal("no error for a zero characteristic polynomial")
	}
}

// TestStablePanicsOnBadIndex checks that a parameter index outside the
// family is treated as a programmer error.
func TestStablePanicsOnBadIndex(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Fatal("no panic for parameter index 3 of a one-parameter family")
		}
	}()
	Stable(loopOf(t, []float64{1}, []float64{1, 1}, "p", 1), 3, 0, 1)
}

// TestStableIsScaleInvariant rescales time in two hand-derived cases:
// replacing s by s/α in the plant leaves the gains at the boundaries
// unchanged and multiplies every crossing frequency by α (derived by hand:
// p(s/α; k) = 0 exactly when p(s; k) = 0 with s scaled). Slow and fast
// plants spread their coefficients over up to 24 orders of magnitude.
func TestStableIsScaleInvariant(t *testing.T) {
	for _, alpha := range []float64{1e-3, 1, 1e3} {
		a := alpha
		tests := []struct {
			name     string
			num, den []float64
			want     Interval
		}{
			{
				name: "P on α³/(s+α)³",
				num:  []float64{a * a * a}, den: []float64{1, 3 * a, 3 * a * a, a * a * a},
				want: Interval{-1, 8, stability.Real, stability.Complex, 0, a * math.Sqrt(3)},
			},
			{
				name: "P on α⁴/(s(s²+αs+α²)(s+2α))",
				num:  []float64{a * a * a * a}, den: poly.Mul(poly.Poly{0, 1}, poly.Mul(poly.Poly{a * a, a, 1}, poly.Poly{2 * a, 1})).Descending(),
				want: Interval{0, 14.0 / 9, stability.Real, stability.Complex, 0, a * math.Sqrt(2.0/3)},
			},
		}
		for _, tc := range tests {
			got, err := Stable(loopOf(t, tc.num, tc.den, "p", 1), 0, -2, 20)
			if err != nil {
				t.Fatal(err)
			}
			w := tc.want
			if len(got) != 1 || !near(got[0].Lo, w.Lo) || !near(got[0].Hi, w.Hi) || got[0].LoKind != w.LoKind ||
				got[0].HiKind != w.HiKind || math.Abs(got[0].HiOmega-w.HiOmega) > tol*w.HiOmega {
				t.Errorf("α = %g, %s: got %+v; want %+v", alpha, tc.name, got, w)
			}
		}
	}
}

// TestWideWindows checks that a window far wider than the loop's own
// scale does not swallow its boundaries: for P on 1/(s+1)³ the stable
// range is −1 < kp < 8 (derived by hand: the sign array of
// s³ + 3s² + 3s + 1 + kp needs 1 + kp > 0 and 9 > 1 + kp), whatever the
// window; and a plant gain of 1e-12 moves the upper end to exactly 6e13
// for 1e-12/((s+1)(s+2)(s+3)) (6·11 > 6 + 1e-12·kp, by hand).
func TestWideWindows(t *testing.T) {
	tests := []struct {
		name     string
		num, den []float64
		lo, hi   float64
		want     [2]float64
	}{
		{"third-order lag to 1e20", []float64{1}, []float64{1, 3, 3, 1}, 0, 1e20, [2]float64{0, 8}},
		{"third-order lag from -1e15", []float64{1}, []float64{1, 3, 3, 1}, -1e15, 1e15, [2]float64{-1, 8}},
		{"tiny plant gain", []float64{1e-12}, []float64{1, 6, 11, 6}, 0, 1e20, [2]float64{0, 6e13}},
	}
	for _, tc := range tests {
		l := loopOf(t, tc.num, tc.den, "p", 1)
		got, err := Stable(l, 0, tc.lo, tc.hi)
		if err != nil {
			t.Fatal(err)
		}
		if len(got) != 1 || !near(got[0].Lo, tc.want[0]) || !near(got[0].Hi, tc.want[1]) {
			t.Errorf("%s: %+v; want %v", tc.name, got, tc.want)
		}
	}
}
