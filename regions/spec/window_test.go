package spec

import (
	"math"
	"strings"
	"testing"
)

// one is the spacing of float64 values just above 1, 2^−52.
var one = math.Nextafter(1, 2) - 1

// TestCheckWindow checks the resolution and overflow rules on windows at
// both sides of each limit. The boundary cases are exact: 1 + k·2^−52
// is a float64 for the k used, and its spacing is 2^−52, so a window
// from 1 to it holds exactly k steps.
func TestCheckWindow(t *testing.T) {
	tests := []struct {
		name     string
		min, max float64
		nodes    int
		wantErr  string // "" when the window is accepted
	}{
		{"ordinary window, finest grid", 0, 20, MaxNodesPerAxis, ""},
		{"huge gains well resolved", 1e12, 1e12 + 1e6, 4000, ""},
		{"tiny gains well resolved", 1e-12, 2e-12, 4000, ""},
		{"exactly the minimum in one cell", 1, 1 + MinStepsPerCell*one, 2, ""},
		{"one step short in one cell", 1, 1 + (MinStepsPerCell-1)*one, 2, "too narrow"},
		{"exactly the minimum per cell of two", 1, 1 + 2*MinStepsPerCell*one, 3, ""},
		{"one step short per cell of two", 1, 1 + (2*MinStepsPerCell-1)*one, 3, "too narrow"},
		{"a few ulps around 1", 1, 1.000000000000001, 300, "too narrow"},
		{"eight values around 1e15", 1e15, 1000000000000001, 300, "too narrow"},
		{"subnormal window, one cell", 0, 1e-320, 2, ""},
		{"subnormal window, many cells", 0, 1e-320, 300, "too narrow"},
		{"width overflows", -1e308, 1e308, 2, "too wide"},
		{"largest floats both ways", -math.MaxFloat64, math.MaxFloat64, 2, "too wide"},
		{"width finite, one cell", 0, math.MaxFloat64, 2, ""},
		{"width times cells overflows", 0, math.MaxFloat64, 3, "too wide"},
		{"wide window on a fine grid", -1e305, 1e305, 4000, "too wide"},
		{"reversed", 2, 1, 10, "not a finite range"},
		{"not finite", 0, math.Inf(1), 10, "not a finite range"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			err := CheckWindow(Axis{Param: "kp", Min: tc.min, Max: tc.max}, tc.nodes)
			if tc.wantErr == "" {
				if err != nil {
					t.Fatalf("refused: %v", err)
				}
				return
			}
			if err == nil || !strings.Contains(err.Error(), tc.wantErr) {
				t.Fatalf("error %v; want one containing %q", err, tc.wantErr)
			}
			if n := strings.Count(err.Error(), "\n"); n > 2 {
				t.Errorf("message has %d lines", n+1)
			}
		})
	}
}

// TestParseAxisHostileWindows checks that the windows the grid size
// cannot rescue are refused when the axis is read.
func TestParseAxisHostileWindows(t *testing.T) {
	for _, in := range []string{"kp=1:1.000000000000001", "kp=1e15:1000000000000001", "kp=-1e308:1e308", "kp=0:5e-324"} {
		if _, err := ParseAxis(in); err == nil || !strings.Contains(err.Error(), in) || !strings.Contains(err.Error(), "floating point") {
			t.Errorf("%s: error %v; want one quoting the axis and naming the limit", in, err)
		}
	}
}
