package scenario

import (
	"bytes"
	"errors"
	"reflect"
	"strings"
	"testing"
	"time"
)

// decodeBudget is the processor time one Decode may take. Inputs are at
// most 64 KiB and bounded in nesting, and the reader is then linear: a
// run of milliseconds. The hostile files the bounds refuse took minutes.
const decodeBudget = 2 * time.Second

// checkFuzzError checks that err is made of at most three *Error values
// naming the file fuzz.toml.
func checkFuzzError(t *testing.T, err error) {
	t.Helper()
	errs := flatten(err)
	if len(errs) > maxReported {
		t.Errorf("%d errors joined; want at most %d", len(errs), maxReported)
	}
	for _, e := range errs {
		var se *Error
		if !errors.As(e, &se) || se.File != "fuzz.toml" || se.Msg == "" {
			t.Fatalf("error %v (%T) is not an *Error naming the file", e, e)
		}
	}
}

// FuzzDecode checks that Decode never panics or runs long, that every
// error it returns is made of *Error values naming the file, within
// three lines, and that a scenario it accepts and Validate passes
// survives Encode and Decode unchanged. The seed corpus is in
// testdata/fuzz/FuzzDecode, with the nested structures of nestingSeeds.
func FuzzDecode(f *testing.F) {
	for _, s := range nestingSeeds() {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		start, ok := cpuTime()
		s, err := Decode(bytes.NewReader(data), "fuzz.toml")
		if end, _ := cpuTime(); ok && end-start > decodeBudget {
			t.Errorf("Decode took %v of processor time", end-start)
		}
		if err != nil {
			checkFuzzError(t, err)
			return
		}
		if s.Validate() != nil {
			return
		}
		var b bytes.Buffer
		if err := Encode(&b, s); err != nil {
			t.Fatalf("Encode of a valid scenario: %v", err)
		}
		back, err := Decode(&b, "encoded.toml")
		if err != nil {
			t.Fatalf("Decode of the encoded file: %v\n%s", err, b.String())
		}
		if !reflect.DeepEqual(noOrigins(back), noOrigins(s)) {
			t.Fatalf("round trip changed the scenario\n got %+v\nwant %+v", back, s)
		}
	})
}

// nestingSeeds are files that nest arrays, inline tables, table headers
// and dotted keys, up to the limit and past it, some hiding brackets in
// strings and comments.
func nestingSeeds() []string {
	deep := func(open, close string, n int) string {
		return strings.Repeat(open, n) + "1" + strings.Repeat(close, n)
	}
	return []string{
		"schema = 1\n[overlays]\nmarks = [{kp = {a = 1}}]\n",
		"schema = 1\n[overlays]\nmarks = [{a={a={a={a={a={a={a=1}}}}}}}]\n",
		"schema = 1\n[overlays]\nms_levels = " + deep("[", "]", 6) + "\n",
		"schema = 1\n[overlays]\nms_levels = " + deep("[", "]", 5000) + "\n",
		"schema = 1\n[overlays]\nmarks = [" + deep("{a=", "}", 5000) + "]\n",
		"schema = 1\na.b.c.d.e.f.g = 1\n",
		"schema = 1\n" + strings.Repeat("a.", 3000) + "a = 1\n",
		"schema = 1\n[" + strings.Repeat("t.", 3000) + "t]\nx = 1\n",
		"schema = 1\n[[overlays.marks]]\nkp = 1\n[[overlays.marks]]\nki = {a = [1]}\n",
		"schema = 1\n[loop]\nplant = \"[[[[[[[[[[{{{{{{{{\" # ]]]]]]]]]]\n",
		"schema = 1\n[output]\ntitle = '''a\n[[[[[[[[[[\n'''''\nnote = \"\"\"x.md\\\"\"\"\"\n",
		"schema = 1\n# " + strings.Repeat("[", 100) + "\n[axes]\nx = \"kp=0:1\"\n",
	}
}

// flatten returns the errors joined in err, or err itself.
func flatten(err error) []error {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		return j.Unwrap()
	}
	return []error{err}
}
