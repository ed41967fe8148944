package scenario

import (
	"bytes"
	"errors"
	"reflect"
	"testing"
	"time"
)

// FuzzDecode checks that Decode never panics or runs long, that every
// error it returns is made of *Error values naming the file, and that a
// scenario it accepts and Validate passes survives Encode and Decode
// unchanged. The seed corpus is in testdata/fuzz/FuzzDecode.
func FuzzDecode(f *testing.F) {
	f.Fuzz(func(t *testing.T, data []byte) {
		start := time.Now()
		s, err := Decode(bytes.NewReader(data), "fuzz.toml")
		// Inputs are at most a megabyte and the reader is linear; a second
		// means something loops.
		if d := time.Since(start); d > time.Second {
			t.Errorf("Decode took %v", d)
		}
		if err != nil {
			for _, e := range flatten(err) {
				var se *Error
				if !errors.As(e, &se) || se.File != "fuzz.toml" || se.Msg == "" {
					t.Fatalf("error %v (%T) is not an *Error naming the file", e, e)
				}
			}
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
		if !reflect.DeepEqual(back, s) {
			t.Fatalf("round trip changed the scenario\n got %+v\nwant %+v", back, s)
		}
	})
}

// flatten returns the errors joined in err, or err itself.
func flatten(err error) []error {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		return j.Unwrap()
	}
	return []error{err}
}
