package expr

import (
	"strings"
	"testing"
)

// The expected polynomials are the items read back in order; the
// coefficients are compared highest power first, as they are typed.
func TestParseList(t *testing.T) {
	tests := []struct {
		name string
		src  string
		want []float64
	}{
		{"commas and spaces", "1, 3.5, 0, 2", []float64{1, 3.5, 0, 2}},
		{"spaces only", "1 3.5 0 2", []float64{1, 3.5, 0, 2}},
		{"commas only", "1,3.5,0,2", []float64{1, 3.5, 0, 2}},
		{"space before a comma", "1 ,2", []float64{1, 2}},
		{"tabs and surrounding space", "\t 4\t5 ", []float64{4, 5}},
		{"signs", "-1, +2, -0.5", []float64{-1, 2, -0.5}},
		{"number forms", ".5 5. 1e-3 2E2", []float64{0.5, 5, 0.001, 200}},
		{"one coefficient", "7", []float64{7}},
		{"leading zeros kept", "0, 0, 1", []float64{0, 0, 1}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := ParseList(tt.src)
			if err != nil {
				t.Fatalf("ParseList(%q): %v", tt.src, err)
			}
			if got := p.Descending(); !closeTo(got, tt.want, coefTol) {
				t.Errorf("ParseList(%q) = %v, want %v", tt.src, got, tt.want)
			}
		})
	}
}

func TestParseListErrors(t *testing.T) {
	tests := []struct {
		name    string
		src     string
		col     int
		phrases []string
	}{
		{"empty", "", 1, []string{"list is empty"}},
		{"only white space", "   ", 1, []string{"list is empty"}},
		{"too long", strings.Repeat("1,", 2049), MaxLen + 1, []string{"limit of 4096"}},
		{"leading comma", ", 1, 2", 1, []string{"item 1 is empty"}},
		{"two commas", "1, , 2", 4, []string{"item 2 is empty"}},
		{"final comma", "1, 2,", 5, []string{"item 3 is empty", "ends with"}},
		{"a name", "1, k, 3", 4, []string{`item 2 "k" is not a number`}},
		{"a term of an expression", "1 3*s 2", 3, []string{`item 2 "3*s"`, "coefficients alone"}},
		{"sign alone", "1 - 2", 3, []string{`item 2 "-"`}},
		{"two signs", "--1", 1, []string{`item 1 "--1"`}},
		{"operators between numbers", "1,2-3", 3, []string{`item 2 "2-3"`}},
		{"not a decimal", "1, inf", 4, []string{`item 2 "inf"`}},
		{"hexadecimal", "0x10", 1, []string{`item 1 "0x10"`}},
		{"two decimal points", "1.2.3", 1, []string{`item 1 "1.2.3"`}},
		{"too large", "1, 1e999", 4, []string{"item 2", "too large"}},
		{"too small", "1e-999 1", 1, []string{"item 1", "too small"}},
		{"semicolons", "1;2", 1, []string{`item 1 "1;2"`}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := ParseList(tt.src)
			if err == nil {
				t.Fatalf("ParseList(%q) = %v; want an error", tt.src, p)
			}
			checkSyntaxError(t, "ParseList", "coefficient list ", tt.src, err, tt.col, tt.phrases)
		})
	}
}
