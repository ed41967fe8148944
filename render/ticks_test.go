package render

import (
	"reflect"
	"testing"
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
