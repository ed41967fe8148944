package expr

import (
	"errors"
	"testing"
	"time"
	"unicode/utf8"
)

// FuzzParse checks that Parse never panics or runs long, that every error
// is a *SyntaxError positioned inside the input, and that every result is
// a usable pair: finite coefficients, a denominator that is not zero with
// a positive leading coefficient, and degrees within MaxDegree. The seed
// corpus is in testdata/fuzz/FuzzParse.
func FuzzParse(f *testing.F) {
	f.Fuzz(func(t *testing.T, src string) {
		start := time.Now()
		num, den, err := Parse(src)
		// Any input within MaxLen parses in milliseconds; a second means
		// a limit is not doing its job.
		if d := time.Since(start); d > time.Second {
			t.Errorf("Parse(%q) took %v", src, d)
		}
		if err != nil {
			var se *SyntaxError
			if !errors.As(err, &se) {
				t.Fatalf("Parse(%q) error %v is %T, want *SyntaxError", src, err, err)
			}
			if se.Src != src || se.Pos < 0 || se.Pos > len(src) {
				t.Fatalf("Parse(%q) error has source %q and position %d", src, se.Src, se.Pos)
			}
			if msg := err.Error(); msg == "" || !utf8.ValidString(msg) {
				t.Fatalf("Parse(%q) error message %q", src, msg)
			}
			return
		}
		if len(num) == 0 || len(den) == 0 {
			t.Fatalf("Parse(%q) = %v, %v: empty polynomial", src, num, den)
		}
		if !num.Finite() || !den.Finite() {
			t.Fatalf("Parse(%q) = %v, %v: coefficients not finite", src, num, den)
		}
		d := den.Degree()
		if d < 0 {
			t.Fatalf("Parse(%q) denominator is zero", src)
		}
		if den[d] <= 0 {
			t.Fatalf("Parse(%q) denominator %v has a leading coefficient that is not positive", src, den)
		}
		if len(num)-1 > MaxDegree || len(den)-1 > MaxDegree {
			t.Fatalf("Parse(%q) degrees %d, %d exceed MaxDegree", src, len(num)-1, len(den)-1)
		}
	})
}

// FuzzParseList checks that ParseList never panics, that its errors are
// positioned inside the input, and that its results are finite.
func FuzzParseList(f *testing.F) {
	for _, s := range []string{"1, 3.5, 0, 2", "1 2 3", "-1,+2", "1,,2", ",", "1e999", ".", "1.2.3", "\xff"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		p, err := ParseList(src)
		if err != nil {
			var se *SyntaxError
			if !errors.As(err, &se) || se.Pos < 0 || se.Pos > len(src) {
				t.Fatalf("ParseList(%q) error %v", src, err)
			}
			return
		}
		if len(p) == 0 || !p.Finite() {
			t.Fatalf("ParseList(%q) = %v", src, p)
		}
	})
}
