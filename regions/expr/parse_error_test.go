package expr

import (
	"errors"
	"strings"
	"testing"
)

// TestParseErrors checks that each rejected input reports the column of
// the problem and says what is wrong there.
func TestParseErrors(t *testing.T) {
	tests := []struct {
		name    string
		src     string
		col     int
		phrases []string
	}{
		{"empty", "", 1, []string{"empty"}},
		{"only white space", "  \t ", 1, []string{"empty"}},
		{"too long", strings.Repeat("s+", 2100) + "1", MaxLen + 1, []string{"limit of 4096"}},

		{"unclosed parenthesis", "2*(s+1", 7, []string{`expected ")" but the expression ended`, "column 3"}},
		{"unclosed parenthesis before name", "(s+1 x", 6, []string{`unknown name "x"`}},
		{"unmatched closing parenthesis", "s+1)", 4, []string{`unexpected ")"`, `no matching "("`}},
		{"empty parentheses", "()", 2, []string{`expected a number, s or "("`, `found ")"`}},
		{"missing operand at the end", "2*", 3, []string{"expected a number", "expression ended"}},
		{"missing operand before )", "(s+)", 4, []string{`found ")"`}},
		{"operator first", "*s", 1, []string{`found "*"`}},

		{"implicit product with a number", "2s", 2, []string{`expected "*" before s`}},
		{"implicit product of factors", "(s+1)(s+2)", 6, []string{`expected "*" before "("`}},
		{"implicit product after s", "s 2", 3, []string{`expected "*" before 2`}},

		{"unknown name x", "x+1", 1, []string{`unknown name "x"`, "variable is s"}},
		{"unknown name z", "1/(z+1)", 4, []string{`unknown name "z"`, "variable is s"}},
		{"upper-case S", "1/(S+1)", 4, []string{`unknown name "S"`, "case-sensitive"}},
		{"time delay", "exp(-2*s)/(s+1)", 1, []string{"dead time", "not accepted", "Padé"}},
		{"name glued to a number", "2exp", 2, []string{`expected "*" before "exp"`}},
		{"other name glued to a number", "2x", 2, []string{`unknown name "x"`}},

		{"negative exponent", "s^-1", 3, []string{"negative exponents"}},
		{"fractional exponent", "(s+1)^0.5", 7, []string{"fractional exponent 0.5"}},
		{"exponent with a decimal point", "s^2.0", 3, []string{"plain integer", "^2"}},
		{"exponent in exponent form", "s^1e1", 3, []string{"plain integer", "^10"}},
		{"exponent too large", "s^65", 3, []string{"exponent 65", "limit of 64"}},
		{"exponent beyond int", "s^99999999999999999999", 3, []string{"limit of 64"}},
		{"exponent is s", "2^s", 3, []string{"non-negative integer", "found s"}},
		{"exponent missing", "s^", 3, []string{"expected an exponent"}},
		{"exponent parenthesis unclosed", "s^(2", 5, []string{`expected ")" after the exponent 2`}},
		{"exponent parenthesis holding s", "s^(2 s)", 6, []string{`expected ")"`, "found s"}},
		{"chained powers", "s^2^3", 4, []string{"ambiguous", "(s^2)^3"}},
		{"double star", "s**2", 3, []string{`"**"`, `use "^"`}},

		{"number too large", "1e400*s", 1, []string{"1e400", "too large"}},
		{"number too small", "s+1e-400", 3, []string{"1e-400", "too small"}},
		{"lone decimal point", "s+.", 3, []string{"digit"}},
		{"two decimal points", "s*1.2.3", 3, []string{`malformed number "1.2.3"`}},
		{"exponent without digits", "2e+s", 1, []string{"exponent has no digits"}},

		{"middle dot", "2·s", 2, []string{"unexpected character", `use "*"`}},
		{"unicode minus", "s−1", 2, []string{`use "-"`}},
		{"decimal comma", "2,5*s", 2, []string{`"." as the decimal point`}},
		{"square brackets", "[s+1]", 1, []string{`use "("`}},
		{"stray semicolon", "s+1;", 4, []string{"unexpected character ';'"}},
		{"invalid UTF-8", "s+\xff", 3, []string{"not valid UTF-8"}},

		{"division by literal zero", "1/0", 2, []string{"division by zero"}},
		{"division by an identically zero expression", "1/(s-s)", 2, []string{"division by zero", "identically zero"}},
		// 0.1 + 0.2 - 0.3 is about 5.6e-17 in double precision, rounding
		// residue of terms of size 0.6: zero relative to their scale.
		{"division by rounding residue", "(s+1)/(0.1+0.2-0.3)", 6, []string{"identically zero"}},
		{"sum overflows", "1e308+1e308+s", 6, []string{`this "+"`, "too large"}},
		{"product overflows", "1e300*1e300*s", 6, []string{`this "*"`, "too large"}},
		// (1e100·s)^4 has the coefficient 1e400.
		{"power overflows", "(1e100*s+1)^4", 12, []string{`this "^"`, "too large"}},
		{"product underflows", "1e-200*1e-200*s", 7, []string{`this "*"`, "too small"}},
		// The denominator 1e-200·s times 1e-200·s is 1e-400·s², below the
		// smallest double.
		{"denominator underflows", "1/(1e-200*s)/(1e-200*s)", 13, []string{"denominator becomes zero"}},
		{"degree limit in a power", "((s+1)^64)^64", 11, []string{"degree 4096", "limit of 128"}},
		// s^64·s^64 has degree 128, at the limit; one more s exceeds it.
		{"degree limit in a product", "(s^64)*(s^64)*s", 14, []string{"degree 129"}},
		// Denominators s^64 and s^65 differ, so the sum's is s^129.
		{"degree limit in a sum", "1/s^64 + 1/(s^64*s)", 8, []string{`this "+"`, "degree 129"}},
		// The quotient's denominator is s^64 times s^65.
		{"degree limit in a quotient", "(1/s^64)/(s^64*s)", 9, []string{`this "/"`, "degree 129"}},
		{"degree limit in a sum of ratios", "1/s^64 + 1/(s+1)^64 + 1/s", 21, []string{"degree 129"}},
		{"parentheses nested too deep", strings.Repeat("(", MaxDepth+1) + "s" + strings.Repeat(")", MaxDepth+1),
			MaxDepth + 1, []string{"nested more than 200"}},
		{"exponent nested too deep", "s^" + strings.Repeat("(", MaxDepth+1) + "2" + strings.Repeat(")", MaxDepth+1),
			MaxDepth + 3, []string{"nested more than 200"}},
		{"signs nested too deep", strings.Repeat("-", MaxDepth+1) + "s", MaxDepth + 1, []string{"nested more than 200"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			num, den, err := Parse(tt.src)
			if err == nil {
				t.Fatalf("Parse(%q) = %v, %v; want an error", tt.src, num, den)
			}
			checkSyntaxError(t, "Parse", "plant expression ", tt.src, err, tt.col, tt.phrases)
			var se *SyntaxError
			if errors.As(err, &se) && se.Src != tt.src {
				t.Errorf("Parse(%q) error carries source %q", tt.src, se.Src)
			}
		})
	}
}

// TestSyntaxErrorMessage checks the layout of the message, character
// columns for non-ASCII text and the excerpt quoted for long inputs.
func TestSyntaxErrorMessage(t *testing.T) {
	long := strings.Repeat("(s+1)*", 30) + "x"
	tests := []struct {
		name string
		err  *SyntaxError
		want string
	}{
		{"example from the documentation",
			&SyntaxError{Src: "2*(s+1", Pos: 6, Msg: `expected ")" but the expression ended`},
			`plant expression "2*(s+1": at column 7: expected ")" but the expression ended`},
		{"coefficient list",
			&SyntaxError{What: "coefficient list", Src: "1, x", Pos: 3, Msg: "m"},
			`coefficient list "1, x": at column 4: m`},
		// "ω" is two bytes, so byte offset 4 is the fourth character.
		{"column counts characters",
			&SyntaxError{Src: "ω=s+", Pos: 4, Msg: "m"},
			`plant expression "ω=s+": at column 4: m`},
		{"position past the end is clamped",
			&SyntaxError{Src: "s", Pos: 9, Msg: "m"},
			`plant expression "s": at column 2: m`},
		// 180 bytes; the window is the last 80 bytes, ending at the "x".
		{"long input is quoted around the position",
			&SyntaxError{Src: long, Pos: len(long) - 1, Msg: "m"},
			`plant expression ..."` + long[len(long)-80:] + `": at column 181: m`},
		// "ω" is two bytes. The 80-byte window would start at byte 121,
		// inside an "ω", so it starts one byte earlier.
		{"window start moved off a split character",
			&SyntaxError{Src: strings.Repeat("ω", 100) + "x", Pos: 201, Msg: "m"},
			`plant expression ..."` + strings.Repeat("ω", 40) + `x": at column 102: m`},
		// Here the window would end at byte 80, inside an "ω", so it ends
		// one byte later.
		{"window end moved off a split character",
			&SyntaxError{Src: "x" + strings.Repeat("ω", 100), Pos: 0, Msg: "m"},
			`plant expression "x` + strings.Repeat("ω", 40) + `"...: at column 1: m`},
		{"long input quoted from its start",
			&SyntaxError{Src: long, Pos: 0, Msg: "m"},
			`plant expression "` + long[:80] + `"...: at column 1: m`},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := tt.err.Error(); got != tt.want {
				t.Errorf("Error() =\n%s\nwant\n%s", got, tt.want)
			}
		})
	}
}

// checkSyntaxError asserts that err from fn(src) is a *SyntaxError at
// column col whose message starts with prefix and contains every phrase.
func checkSyntaxError(t *testing.T, fn, prefix, src string, err error, col int, phrases []string) {
	t.Helper()
	var se *SyntaxError
	if !errors.As(err, &se) {
		t.Fatalf("%s(%q) error %v is %T, want *SyntaxError", fn, src, err, err)
	}
	if got := se.Column(); got != col {
		t.Errorf("%s(%q) error at column %d, want %d: %v", fn, src, got, col, err)
	}
	msg := err.Error()
	if !strings.HasPrefix(msg, prefix) {
		t.Errorf("%s(%q) error %q does not start with %q", fn, src, msg, prefix)
	}
	for _, p := range phrases {
		if !strings.Contains(msg, p) {
			t.Errorf("%s(%q) error %q does not contain %q", fn, src, msg, p)
		}
	}
}
