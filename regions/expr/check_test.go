package expr

import (
	"errors"
	"math"
	"testing"

	"gainscape/regions/poly"
)

func TestCheck(t *testing.T) {
	tests := []struct {
		name     string
		num, den poly.Poly // ascending powers
		want     string    // the whole message; empty for a usable plant
	}{
		{"strictly proper", poly.Poly{1}, poly.Poly{1, 1}, ""},
		{"biproper", poly.Poly{1, 2}, poly.Poly{3, 4}, ""},
		{"zero numerator", poly.Poly{0}, poly.Poly{1, 1}, ""},
		// s²+1 typed as 0, 0, 1, 0, 1 has degree 2, not 4.
		{"leading zeros ignored", poly.Poly{1, 0, 1, 0, 0}, poly.Poly{1, 1, 1}, ""},
		{"empty numerator", poly.Poly{}, poly.Poly{1}, "plant numerator has no coefficients"},
		{"empty denominator", poly.Poly{1}, nil, "plant denominator has no coefficients"},
		{"NaN in the numerator", poly.Poly{1, math.NaN()}, poly.Poly{1, 1},
			"plant numerator coefficient of s is NaN, not a finite number"},
		{"infinite constant term", poly.Poly{1}, poly.Poly{math.Inf(1), 1},
			"plant denominator constant term is +Inf, not a finite number"},
		{"infinite higher coefficient", poly.Poly{1}, poly.Poly{1, 1, math.Inf(-1)},
			"plant denominator coefficient of s^2 is -Inf, not a finite number"},
		{"zero denominator", poly.Poly{1}, poly.Poly{0, 0}, "plant denominator is zero: every coefficient is 0"},
		{"improper", poly.Poly{1, 0, 0, 1}, poly.Poly{1, 1, 1},
			"plant is not proper: numerator degree 3 exceeds denominator degree 2"},
		// 0·s² + 1 over the constant 2: the numerator has degree 0.
		{"improper only before trimming", poly.Poly{1, 0, 0}, poly.Poly{2}, ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := Check(tt.num, tt.den)
			switch {
			case tt.want == "" && err != nil:
				t.Errorf("Check(%v, %v) = %v, want nil", tt.num, tt.den, err)
			case tt.want != "" && err == nil:
				t.Errorf("Check(%v, %v) = nil, want %q", tt.num, tt.den, tt.want)
			case tt.want != "" && err.Error() != tt.want:
				t.Errorf("Check(%v, %v) = %q, want %q", tt.num, tt.den, err, tt.want)
			}
		})
	}
}

func TestCheckImproperIsErrImproper(t *testing.T) {
	err := Check(poly.Poly{0, 1}, poly.Poly{1})
	if !errors.Is(err, ErrImproper) {
		t.Errorf("Check(s, 1) = %v, want an error wrapping ErrImproper", err)
	}
}

// TestParseLeavesPropernessToCheck checks that Parse accepts an improper
// plant, as documented, and that Check then rejects it.
func TestParseLeavesPropernessToCheck(t *testing.T) {
	num, den, err := Parse("(s+1)^2/(s+3)")
	if err != nil {
		t.Fatalf("Parse: %v", err)
	}
	if err := Check(num, den); !errors.Is(err, ErrImproper) {
		t.Errorf("Check of (s+1)^2/(s+3) = %v, want ErrImproper", err)
	}
}
