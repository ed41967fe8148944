package expr

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"
	"time"
	"unicode/utf8"
)

// FuzzParse checks that Parse never panics or runs long and that its
// results pass checkParsed. The seed corpus is in testdata/fuzz/FuzzParse.
func FuzzParse(f *testing.F) {
	f.Fuzz(func(t *testing.T, src string) {
		start := time.Now()
		num, den, err := Parse(src)
		checkParsed(t, "Parse", src, time.Since(start), Plant{Num: num, Den: den, Var: 's'}, err)
	})
}

// FuzzParsePlant checks ParsePlant and ParseIn in z as FuzzParse checks
// Parse, and also that the delay is finite and non-negative, that a plant
// in z has none, and that where the text holds no exp, ParsePlant and
// Parse agree exactly.
func FuzzParsePlant(f *testing.F) {
	for _, s := range []string{
		"2*exp(-1.5*s)/((4*s+1)*(s+1))", "exp(-s*0.25)/(s+1)", "exp(2*s)", "exp(-s^2)",
		"exp(-s)*exp(-s)", "1/exp(-s)", "exp(-s)+1", "exp(-s)^2", "exp(-0*s)",
		"0.2*(z+0.8)/((z-0.9)*(z-0.5))", "exp(-z)", "1/(z^3-0.5)",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		start := time.Now()
		pl, err := ParsePlant(src)
		checkParsed(t, "ParsePlant", src, time.Since(start), pl, err)
		if err == nil && (!(pl.Delay >= 0) || math.IsInf(pl.Delay, 0)) {
			t.Fatalf("ParsePlant(%q) delay %g", src, pl.Delay)
		}
		if !strings.Contains(src, "exp") {
			num, den, err2 := Parse(src)
			if (err == nil) != (err2 == nil) || err == nil && (!slices.Equal(num, pl.Num) || !slices.Equal(den, pl.Den)) {
				t.Fatalf("ParsePlant(%q) = %+v, %v but Parse gives %v, %v, %v", src, pl, err, num, den, err2)
			}
		}
		start = time.Now()
		pz, err := ParseIn(src, 'z')
		checkParsed(t, "ParseIn", src, time.Since(start), pz, err)
		if err == nil && (pz.Delay != 0 || pz.Var != 'z') {
			t.Fatalf("ParseIn(%q, 'z') = %+v", src, pz)
		}
	})
}

// checkParsed checks one result of a plant reader: it returned within a
// second, every error is a *SyntaxError positioned inside the input, and
// every plant is usable: finite coefficients, a denominator that is not
// zero with a positive leading coefficient, and degrees within MaxDegree.
func checkParsed(t *testing.T, fn, src string, took time.Duration, pl Plant, err error) {
	t.Helper()
	// Any input within MaxLen parses in milliseconds; a second means
	// a limit is not doing its job.
	if took > time.Second {
		t.Errorf("%s(%q) took %v", fn, src, took)
	}
	if err != nil {
		var se *SyntaxError
		if !errors.As(err, &se) {
			t.Fatalf("%s(%q) error %v is %T, want *SyntaxError", fn, src, err, err)
		}
		if se.Src != src || se.Pos < 0 || se.Pos > len(src) {
			t.Fatalf("%s(%q) error has source %q and position %d", fn, src, se.Src, se.Pos)
		}
		if msg := err.Error(); msg == "" || !utf8.ValidString(msg) {
			t.Fatalf("%s(%q) error message %q", fn, src, msg)
		}
		return
	}
	num, den := pl.Num, pl.Den
	if len(num) == 0 || len(den) == 0 {
		t.Fatalf("%s(%q) = %v, %v: empty polynomial", fn, src, num, den)
	}
	if !num.Finite() || !den.Finite() {
		t.Fatalf("%s(%q) = %v, %v: coefficients not finite", fn, src, num, den)
	}
	d := den.Degree()
	if d < 0 {
		t.Fatalf("%s(%q) denominator is zero", fn, src)
	}
	if den[d] <= 0 {
		t.Fatalf("%s(%q) denominator %v has a leading coefficient that is not positive", fn, src, den)
	}
	if len(num)-1 > MaxDegree || len(den)-1 > MaxDegree {
		t.Fatalf("%s(%q) degrees %d, %d exceed MaxDegree", fn, src, len(num)-1, len(den)-1)
	}
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
