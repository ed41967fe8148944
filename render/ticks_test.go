package render

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"gonum.org/v1/plot"
)

func TestReadableTicks(t *testing.T) {
	tests := []struct {
		name   string
		lo, hi float64
		want   []string
	}{
		{"map of 0 to 6 with half cells", -0.05, 6.05, []string{"0", "1", "2", "3", "4", "5", "6"}},
		{"tenths", 0, 0.5, []string{"0.0", "0.1", "0.2", "0.3", "0.4", "0.5"}},
		{"negative", -1, 1, []string{"−1.0", "−0.5", "0.0", "0.5", "1.0"}},
		{"fives", 0, 32, []string{"0", "5", "10", "15", "20", "25", "30"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var got []string
			for _, tk := range (readableTicks{}).Ticks(tc.lo, tc.hi) {
				if tk.Value < tc.lo || tk.Value > tc.hi {
					t.Errorf("tick %v outside [%v, %v]", tk.Value, tc.lo, tc.hi)
				}
				if tk.Label != "" {
					got = append(got, tk.Label)
				}
			}
			if !reflect.DeepEqual(got, tc.want) {
				t.Errorf("labels %q, want %q", got, tc.want)
			}
		})
	}
}

// TestReadableTicksHostileRanges gives tick placement ranges that
// floating point can barely hold or not at all. Each must come back
// small, in increasing order, inside the range and with distinct
// labels; the loop is bounded by maxTicks, so a case that would not end
// fails on the count instead.
func TestReadableTicksHostileRanges(t *testing.T) {
	up := func(x float64, n int) float64 {
		for range n {
			x = math.Nextafter(x, math.Inf(1))
		}
		return x
	}
	tests := []struct {
		name   string
		lo, hi float64
		ends   bool // only the two ends can be labelled
	}{
		{"a few ulps above 1", 1, 1.000000000000001, true},
		{"one ulp above 1", 1, up(1, 1), true},
		{"eight values above 1e15", 1e15, 1000000000000001, true},
		{"beyond 2^53", 1e17, up(1e17, 100), false},
		{"width overflows", -1e308, 1e308, true},
		{"largest floats", -math.MaxFloat64, math.MaxFloat64, true},
		{"one subnormal step", 0, 5e-324, true},
		{"subnormal range", 0, 1e-320, false},
		{"near the largest float", 1e307, 1e308, false},
		{"tiny gains", 1e-12, 3e-12, false},
		{"huge gains", 1e12, 1e12 + 7, false},
		{"negative tiny window", -1e-300, -0.5e-300, false},
		{"1024 ulps above 1", 1, up(1, 1024), false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			ticks := (readableTicks{}).Ticks(tc.lo, tc.hi)
			checkTicks(t, tc.lo, tc.hi, ticks)
			if tc.ends && len(ticks) != 2 {
				t.Errorf("%d ticks; want the two ends alone", len(ticks))
			}
		})
	}
}

// TestReadableTicksRandomRanges checks the same properties on ranges
// drawn from the whole float64 line, at every scale.
func TestReadableTicksRandomRanges(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for range 5000 {
		a := math.Float64frombits(r.Uint64())
		b := a + math.Float64frombits(r.Uint64()&^(1<<63))
		if r.IntN(2) == 0 {
			b = math.Nextafter(a, math.Inf(1))
			for range r.IntN(5000) {
				b = math.Nextafter(b, math.Inf(1))
			}
		}
		if !(b > a) || math.IsInf(b, 0) || math.IsNaN(a) {
			continue
		}
		checkTicks(t, a, b, (readableTicks{}).Ticks(a, b))
		if t.Failed() {
			t.Fatalf("range [%v, %v]", a, b)
		}
	}
}

// checkTicks checks the properties every tick list must have.
func checkTicks(t *testing.T, lo, hi float64, ticks []plot.Tick) {
	t.Helper()
	if len(ticks) < 2 || len(ticks) > maxTicks {
		t.Fatalf("%d ticks for [%v, %v]; want 2 to %d", len(ticks), lo, hi, maxTicks)
	}
	labels := map[string]bool{}
	for i, tk := range ticks {
		if tk.Value < lo || tk.Value > hi {
			t.Errorf("tick %v outside [%v, %v]", tk.Value, lo, hi)
		}
		if i > 0 && !(tk.Value > ticks[i-1].Value) {
			t.Errorf("tick %v does not follow %v", tk.Value, ticks[i-1].Value)
		}
		if tk.Label != "" {
			if labels[tk.Label] {
				t.Errorf("label %q twice", tk.Label)
			}
			labels[tk.Label] = true
		}
	}
	if len(labels) < 2 {
		t.Errorf("%d labels for [%v, %v]; want at least 2", len(labels), lo, hi)
	}
}
