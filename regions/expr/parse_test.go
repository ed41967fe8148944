package expr

import (
	"testing"
)

// Every expected value below is derived by hand in this test; the
// derivation is in the comment beside each case. Coefficients are listed
// highest power first, as engineers write them.
func TestParseExpansion(t *testing.T) {
	tests := []struct {
		name     string
		src      string
		num, den []float64
	}{
		// A constant is the ratio c/1.
		{"constant", "4", []float64{4}, []float64{1}},
		// s is the ratio s/1.
		{"variable", "s", []float64{1, 0}, []float64{1}},
		// (s+1)^2 = s² + 2s + 1.
		{"square", "(s+1)^2", []float64{1, 2, 1}, []float64{1}},
		// (s+1)^3 = s³ + 3s² + 3s + 1 (binomial coefficients 1 3 3 1).
		{"cube", "(s+1)^3", []float64{1, 3, 3, 1}, []float64{1}},
		// (s+2)(s-3) = s² - 3s + 2s - 6 = s² - s - 6.
		{"product of factors", "(s+2)*(s-3)", []float64{1, -1, -6}, []float64{1}},
		// (0.2s+1)(0.5s+1) = 0.1s² + 0.2s + 0.5s + 1 = 0.1s² + 0.7s + 1.
		{"product of time constants", "(0.2*s+1)*(0.5*s+1)", []float64{0.1, 0.7, 1}, []float64{1}},
		// 2.5/s: numerator 2.5, denominator s.
		{"integrator", "2.5/s", []float64{2.5}, []float64{1, 0}},
		// 3/(0.5s+1).
		{"first-order lag", "3/(0.5*s+1)", []float64{3}, []float64{0.5, 1}},
		// 2.5(s+0.4) = 2.5s + 1. (s+1.5)² = s² + 3s + 2.25;
		// times (0.2s+1): 0.2s³ + 0.6s² + 0.45s + s² + 3s + 2.25
		// = 0.2s³ + 1.6s² + 3.45s + 2.25; times s: 0.2s⁴ + 1.6s³ + 3.45s² + 2.25s.
		{"mixed factors", "2.5*(s+0.4)/(s*(s+1.5)^2*(0.2*s+1))",
			[]float64{2.5, 1}, []float64{0.2, 1.6, 3.45, 2.25, 0}},
		// ωn = 2, ζ = 0.5: s² + 2ζωn·s + ωn² = s² + 2s + 4, and 2·0.5·2 = 2.
		{"second order", "4/(s^2+2*0.5*2*s+4)", []float64{4}, []float64{1, 2, 4}},
		// Unary minus binds looser than ^: -s^2+1 = -(s²) + 1.
		{"minus before power", "-s^2+1", []float64{-1, 0, 1}, []float64{1}},
		// / and * associate to the left: 1/s*2 = (1/s)·2 = 2/s.
		{"left association of * and /", "1/s*2", []float64{2}, []float64{1, 0}},
		// - associates to the left: 1-s-1 = (1-s)-1 = -s.
		{"left association of -", "1-s-1", []float64{-1, 0}, []float64{1}},
		// 1/(s+1) + 1/(s+2) = ((s+2) + (s+1)) / ((s+1)(s+2)) = (2s+3)/(s² + 3s + 2).
		{"sum over different denominators", "1/(s+1) + 1/(s+2)", []float64{2, 3}, []float64{1, 3, 2}},
		// 1/s - 1/(s+1) = ((s+1) - s)/(s(s+1)) = 1/(s² + s).
		{"difference over different denominators", "1/s - 1/(s+1)", []float64{1}, []float64{1, 1, 0}},
		// Both terms are over s, which is kept once: (1+2)/s.
		{"sum over one denominator", "1/s + 2/s", []float64{3}, []float64{1, 0}},
		// 1 + 1/s = (1·s + 1·1)/(1·s) = (s+1)/s.
		{"constant plus integrator", "1 + 1/s", []float64{1, 1}, []float64{1, 0}},
		// 1 - s/2 = (1·2 - s·1)/(1·2) = (-s + 2)/2: constant denominators
		// multiply like any other, which adds no pole.
		{"constant denominators", "1 - s/2", []float64{-1, 2}, []float64{2}},
		// No cancellation: (s+1)/(s+1) keeps both factors.
		{"common factor kept", "(s+1)/(s+1)", []float64{1, 1}, []float64{1, 1}},
		// s(s+1)/(s(s+2)) = (s² + s)/(s² + 2s), the pole and zero at 0 both kept.
		{"pole and zero at the origin kept", "s*(s+1)/(s*(s+2))", []float64{1, 1, 0}, []float64{1, 2, 0}},
		// 1/(1/(s+2)) = (1·(s+2))/(1·1) = s + 2.
		{"division by a ratio", "1/(1/(s+2))", []float64{1, 2}, []float64{1}},
		// 1/(-s-1) has denominator leading coefficient -1; negating both
		// gives -1/(s+1).
		{"sign normalised", "1/(-s-1)", []float64{-1}, []float64{1, 1}},
		// -s/(s+1) already has a positive leading denominator coefficient.
		{"sign kept", "-s/(s+1)", []float64{-1, 0}, []float64{1, 1}},
		// (2/s)^2 = 4/s².
		{"power of a ratio", "(2/s)^2", []float64{4}, []float64{1, 0, 0}},
		// Any expression to the power 0 is 1.
		{"power zero", "(s+3)^0", []float64{1}, []float64{1}},
		// An exponent in parentheses is the same exponent.
		{"exponent in parentheses", "s^(3)", []float64{1, 0, 0, 0}, []float64{1}},
		// 1e-3·s + .5 = 0.001s + 0.5.
		{"number forms", "1e-3*s + .5", []float64{0.001, 0.5}, []float64{1}},
		// 0e-400 is zero written with an exponent, not an underflow: s.
		{"zero with an exponent", "0e-400 + s", []float64{1, 0}, []float64{1}},
		// 5. is 5 and 2E1 is 20: 5s + 20.
		{"trailing point and capital E", "5.*s+2E1", []float64{5, 20}, []float64{1}},
		// (s+1)(s-1) = s² - 1, spread over spaces, a tab and a newline.
		{"white space", " ( s + 1 ) *\t( s - 1 )\n", []float64{1, 0, -1}, []float64{1}},
		// +s is s.
		{"unary plus", "+s", []float64{1, 0}, []float64{1}},
		// 2 - (-s) = s + 2.
		{"double minus", "2--s", []float64{1, 2}, []float64{1}},
		// 2·(-s) = -2s.
		{"minus after *", "2*-s", []float64{-2, 0}, []float64{1}},
		// (s+1)² - s² = 2s + 1: the s² terms cancel exactly and are dropped.
		{"exact cancellation of the leading term", "(s+1)^2 - s^2", []float64{2, 1}, []float64{1}},
		// s - s = 0, kept as the single coefficient 0.
		{"zero numerator", "(s-s)/(s+1)", []float64{0}, []float64{1, 1}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			num, den, err := Parse(tt.src)
			if err != nil {
				t.Fatalf("Parse(%q): %v", tt.src, err)
			}
			if got := num.Descending(); !closeTo(got, tt.num, coefTol) {
				t.Errorf("Parse(%q) numerator = %v, want %v", tt.src, got, tt.num)
			}
			if got := den.Descending(); !closeTo(got, tt.den, coefTol) {
				t.Errorf("Parse(%q) denominator = %v, want %v", tt.src, got, tt.den)
			}
		})
	}
}
