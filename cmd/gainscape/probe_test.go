package main

import (
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// TestProbeJSON checks the probe report of a loop with hand-derived
// figures. Derived by hand: L = 4/(s+1)³ has arg L = −180° where
// 3·atan(ω) = π, ω = √3, with |L| = 4/8, so the gain margin is 2; the
// characteristic polynomial s³+3s²+3s+5 has Routh first column 1, 3,
// 4/3, 5 (stable); the ultimate gain of 1/(s+1)³ is 8 at ω = √3.
func TestProbeJSON(t *testing.T) {
	stdout, stderr, code := runBinary(t, t.TempDir(), "probe", "--plant", "1/(s+1)^3", "--ctrl", "p", "--set", "kp=4", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var r map[string]any
	if err := json.Unmarshal([]byte(stdout), &r); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"stable", "rhp", "jw_omegas", "poles", "decay_rate", "min_damping", "gain_margin", "gain_crossover", "phase_margin_deg", "phase_crossover", "ms", "mt", "caution", "sign_array"} {
		if _, ok := r[k]; !ok {
			t.Errorf("JSON lacks %q", k)
		}
	}
	near := func(key string, want float64) {
		got, ok := r[key].(float64)
		if !ok || math.Abs(got-want) > 1e-6*math.Max(1, want) {
			t.Errorf("%s = %v; want %.9g", key, r[key], want)
		}
	}
	near("gain_margin", 2)
	near("phase_crossover", math.Sqrt(3))
	near("rhp", 0)
	if r["stable"] != true {
		t.Error("not reported stable")
	}
	u := r["ultimate"].(map[string]any)
	if math.Abs(u["ku"].(float64)-8) > 1e-9 || math.Abs(u["tu"].(float64)-2*math.Pi/math.Sqrt(3)) > 1e-9 {
		t.Errorf("ultimate %v; want Ku = 8, Tu = 2π/√3", u)
	}
}

// TestProbeVary checks --vary against the interval derived by hand for
// 1/(s+1)³ under P: s³ + 3s² + 3s + (1+kp) has Routh first column
// 1, 3, (8−kp)/3, 1+kp, so −1 < kp < 8; at kp = −1 a root sits at s = 0,
// at kp = 8 the auxiliary polynomial 3s² + 9 gives ω = √3.
func TestProbeVary(t *testing.T) {
	stdout, stderr, code := runBinary(t, t.TempDir(), "probe", "--plant", "1/(s+1)^3", "--ctrl", "p", "--vary", "kp=-5:50", "--json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, stderr)
	}
	var r struct {
		Intervals []struct {
			Lo, Hi  float64
			HiOmega *float64 `json:"hi_omega"`
		}
	}
	if err := json.Unmarshal([]byte(stdout), &r); err != nil {
		t.Fatal(err)
	}
	if len(r.Intervals) != 1 || math.Abs(r.Intervals[0].Lo+1) > 1e-9 || math.Abs(r.Intervals[0].Hi-8) > 1e-9 {
		t.Fatalf("intervals %+v; want one, −1 to 8", r.Intervals)
	}
	if w := r.Intervals[0].HiOmega; w == nil || math.Abs(*w-math.Sqrt(3)) > 1e-9 {
		t.Fatalf("upper-end ω %v; want √3", w)
	}
	if !strings.Contains(stdout, `"lo_kind": "real"`) || !strings.Contains(stdout, `"hi_kind": "complex"`) {
		t.Fatalf("kinds missing: %s", stdout)
	}
	text, _, _ := runBinary(t, t.TempDir(), "probe", "--plant", "1/(s+1)^3", "--ctrl", "p", "--vary", "kp=-5:50")
	if !strings.Contains(text, "stable for -1 < kp < 8") || !strings.Contains(text, "Caution") {
		t.Fatalf("text report:\n%s", text)
	}
}

func TestProbeBadInput(t *testing.T) {
	for _, args := range [][]string{
		{"probe", "--plant", "1/(s+1)", "--set", "kq=1"},
		{"probe", "--plant", "1/(s+1)", "--vary", "kp=3:1"},
		{"probe", "--plant", "1/(s+1)", "--ctrl", "pi", "--x", "zz"},
	} {
		_, stderr, code := runBinary(t, t.TempDir(), args...)
		if code != exitUsage || strings.Count(strings.TrimSpace(stderr), "\n") != 0 {
			t.Errorf("%v: exit %d, stderr %q", args, code, stderr)
		}
	}
}
