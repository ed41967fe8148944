package expr

import (
	"strings"
	"testing"
)

// TestParsePlant checks plants with and without dead time. Expected
// coefficients are derived by hand beside each case, highest power first.
func TestParsePlant(t *testing.T) {
	tests := []struct {
		name     string
		src      string
		num, den []float64
		delay    float64
	}{
		// (4s + 1)(s + 1) = 4s² + 5s + 1.
		{"delay in front", "2*exp(-1.5*s)/((4*s+1)*(s+1))", []float64{2}, []float64{4, 5, 1}, 1.5},
		{"delay at the end", "2/((4*s+1)*(s+1))*exp(-1.5*s)", []float64{2}, []float64{4, 5, 1}, 1.5},
		{"delay in the middle", "2/(4*s+1)*exp(-1.5*s)/(s+1)", []float64{2}, []float64{4, 5, 1}, 1.5},
		{"s before the number", "exp(-s*0.25)/(s+1)", []float64{1}, []float64{1, 1}, 0.25},
		{"unit delay written exp(-s)", "exp(-s)/(s+1)", []float64{1}, []float64{1, 1}, 1},
		{"delay inside parentheses", "(exp(-2*s)*3)/(s+2)", []float64{3}, []float64{1, 2}, 2},
		// -e^(−s)/(s−1) keeps the sign on the numerator.
		{"negated", "-exp(-s)/(s-1)", []float64{-1}, []float64{1, -1}, 1},
		{"delay alone", "exp(-0.5*s)", []float64{1}, []float64{1}, 0.5},
		{"no delay, minus zero", "exp(-0*s)/(s+1)", []float64{1}, []float64{1, 1}, 0},
		{"no delay, plus zero", "exp(0*s)/(s+1)", []float64{1}, []float64{1, 1}, 0},
		// A zero delay is no factor, so a sum may hold it: 1 + 1 = 2.
		{"zero delay in a sum", "(1 + exp(0*s))/(s+1)", []float64{2}, []float64{1, 1}, 0},
		{"delay with exponent notation", "exp(-1e-3*s)/s", []float64{1}, []float64{1, 0}, 0.001},
		{"plus sign and zero", "exp(+0*s)", []float64{1}, []float64{1}, 0},
		{"power one of the delay", "exp(-2*s)^1/(s+1)", []float64{1}, []float64{1, 1}, 2},
		{"no delay at all", "1/(s+1)", []float64{1}, []float64{1, 1}, 0},
		{"white space inside exp", "exp( - 3 * s )/(s+1)", []float64{1}, []float64{1, 1}, 3},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			pl, err := ParsePlant(tt.src)
			if err != nil {
				t.Fatalf("ParsePlant(%q): %v", tt.src, err)
			}
			if !closeTo(pl.Num.Descending(), tt.num, coefTol) || !closeTo(pl.Den.Descending(), tt.den, coefTol) {
				t.Errorf("ParsePlant(%q) = %v / %v, want %v / %v", tt.src, pl.Num.Descending(), pl.Den.Descending(), tt.num, tt.den)
			}
			if pl.Delay != tt.delay || pl.Var != 's' {
				t.Errorf("ParsePlant(%q) delay %g in %c, want %g in s", tt.src, pl.Delay, pl.Var, tt.delay)
			}
		})
	}
}

// TestParsePlantErrors checks every refused form of the dead time factor.
func TestParsePlantErrors(t *testing.T) {
	tests := []struct {
		name    string
		src     string
		col     int
		phrases []string
	}{
		{"positive exponent", "exp(2*s)/(s+1)", 1, []string{"predictor", "exp(-2*s)"}},
		{"positive exponent with a plus", "exp(+2*s)", 1, []string{"predictor"}},
		{"square in the argument", "exp(-s^2)", 7, []string{"must be -L*s", `found "^"`}},
		{"product of two s", "exp(-2*s*s)", 9, []string{"must be -L*s", `found "*"`}},
		{"sum in the argument", "exp(-2*s+1)", 9, []string{"must be -L*s"}},
		{"implicit product", "exp(-2 s)", 8, []string{`expected "*" before s`}},
		{"constant argument", "exp(-1)/(s+1)", 6, []string{"exp(-1) is a constant", "write its value"}},
		{"named delay", "exp(-L*s)", 6, []string{"must be -L*s", `found "L"`}},
		{"number after s missing", "exp(-s*)", 8, []string{"expected a number after s*"}},
		{"s missing after the number", "exp(-2*)", 8, []string{"expected s after 2*"}},
		{"s missing after the number, other name", "exp(-2*x)", 8, []string{"expected s after 2*", `found "x"`}},
		{"no parenthesis", "exp*2", 4, []string{`expected "(" after exp`}},
		{"unclosed", "exp(-2*s", 9, []string{`expected ")" to close exp(`}},
		{"ended inside", "exp(", 5, []string{"expression ended"}},
		{"empty argument", "exp()", 5, []string{"must be -L*s", `found ")"`}},
		{"two delays in a product", "exp(-s)*exp(-2*s)/(s+1)", 9, []string{"second dead time", "column 1"}},
		{"the same delay twice", "exp(-s)/(s+1) + exp(-s)/(s+2)", 17, []string{"second dead time"}},
		{"delay in a denominator", "1/((s+1)*exp(-2*s))", 10, []string{"divisor", "predictor"}},
		{"delay alone in a denominator", "1/exp(-2*s)", 3, []string{"divisor"}},
		{"delay in one term of a sum", "exp(-s)/(s+1) + 1", 1, []string{"whole plant", `"+"`}},
		{"delay in the second term of a difference", "1 - exp(-s)", 5, []string{"whole plant", `"-"`}},
		{"delay inside a factor's sum", "(1 + exp(-s))/(s+1)", 6, []string{"whole plant"}},
		{"square of the delay", "exp(-s)^2/(s+1)", 8, []string{"power of the dead time", "exp(-2*s)"}},
		{"zeroth power of the delay", "exp(-s)^0", 8, []string{"power of the dead time"}},
		{"number glued to exp", "2exp(-s)", 2, []string{`expected "*" before "exp"`}},
		{"exp after a closing parenthesis", "(s+1)exp(-s)", 6, []string{`expected "*" before "exp"`}},
		{"z in an expression in s", "1/(z+1)", 4, []string{`unknown name "z"`, "sampled-data"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			pl, err := ParsePlant(tt.src)
			if err == nil {
				t.Fatalf("ParsePlant(%q) = %+v; want an error", tt.src, pl)
			}
			checkSyntaxError(t, "ParsePlant", "plant expression ", tt.src, err, tt.col, tt.phrases)
		})
	}
}

// TestParseInZ checks plants in z, and that s and exp are refused there.
func TestParseInZ(t *testing.T) {
	// (z − 0.9)(z − 0.5) = z² − 1.4z + 0.45; 0.2(z + 0.8) = 0.2z + 0.16.
	pl, err := ParseIn("0.2*(z+0.8)/((z-0.9)*(z-0.5))", 'z')
	if err != nil {
		t.Fatal(err)
	}
	if !closeTo(pl.Num.Descending(), []float64{0.2, 0.16}, coefTol) || !closeTo(pl.Den.Descending(), []float64{1, -1.4, 0.45}, coefTol) || pl.Var != 'z' || pl.Delay != 0 {
		t.Errorf("plant %+v", pl)
	}
	// Two samples of delay as 1/z^2: 1/(z²(z − 0.5)) = 1/(z³ − 0.5z²).
	pl, err = ParseIn("1/(z^2*(z-0.5))", 'z')
	if err != nil || !closeTo(pl.Den.Descending(), []float64{1, -0.5, 0, 0}, coefTol) {
		t.Errorf("delayed plant %+v, %v", pl, err)
	}
	if pl, err = ParseIn("exp(-s)/(s+1)", 's'); err != nil || pl.Delay != 1 {
		t.Errorf("ParseIn in s: %+v, %v", pl, err)
	}
	for _, tt := range []struct {
		name    string
		src     string
		col     int
		phrases []string
	}{
		{"s in z", "1/(s+1)", 4, []string{`unknown name "s"`, "only variable is z", "cannot contain s"}},
		{"exp in z", "exp(-2*z)", 1, []string{"exp is not allowed", "1/z^d"}},
		{"upper-case Z", "1/(Z-1)", 4, []string{"case-sensitive"}},
		{"empty", "", 1, []string{"in z such as 1/(z+1)"}},
		{"operand missing", "z+", 3, []string{`expected a number, z or "("`}},
		{"too long", strings.Repeat("z+", 2100) + "1", MaxLen + 1, []string{"limit of 4096"}},
	} {
		t.Run(tt.name, func(t *testing.T) {
			_, err := ParseIn(tt.src, 'z')
			if err == nil {
				t.Fatalf("ParseIn(%q, 'z') accepted", tt.src)
			}
			checkSyntaxError(t, "ParseIn", "plant expression ", tt.src, err, tt.col, tt.phrases)
		})
	}
	defer func() {
		if recover() == nil {
			t.Error("no panic for the variable x")
		}
	}()
	ParseIn("1", 'x')
}
