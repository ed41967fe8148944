package scenario

import (
	"errors"
	"strconv"
	"strings"
	"testing"
)

// TestNesting checks the pre-scan's count: what the schema needs passes,
// one level more than MaxNesting is refused at its line, and brackets,
// braces and dots inside strings and comments do not count.
func TestNesting(t *testing.T) {
	deep := func(open, close string, n int) string {
		return strings.Repeat(open, n) + "1" + strings.Repeat(close, n)
	}
	tests := []struct {
		name string
		src  string
		line int // 0: accepted
	}{
		{"the deepest value of the schema", "schema = 1\n[overlays]\nmarks = [{kp = 2.5, ki = 0.25}]\n", 0},
		{"array of tables header", "[[overlays.marks]]\nkp = 2.5\n", 0},
		{"arrays at the limit", "x = " + deep("[", "]", MaxNesting-1) + "\n", 0},
		{"arrays one past the limit", "\n\nx = " + deep("[", "]", MaxNesting) + "\n", 3},
		{"a number at the limit", "x = " + strings.Repeat("[", MaxNesting-2) + "1.5" + strings.Repeat("]", MaxNesting-2) + "\n", 0},
		{"inline tables past the limit", "x = [" + deep("{a=", "}", MaxNesting) + "]\n", 1},
		{"dotted key at the limit", "a" + strings.Repeat(".a", MaxNesting-1) + " = 1\n", 0},
		{"dotted key past the limit", "# fine\na" + strings.Repeat(".a", MaxNesting) + " = 1\n", 2},
		{"quoted dotted key past the limit", `"a"` + strings.Repeat(` . "a"`, MaxNesting) + " = 1\n", 1},
		{"table header past the limit", "[t" + strings.Repeat(".t", MaxNesting) + "]\n", 1},
		{"dotted key in an inline table", "x = {a" + strings.Repeat(".a", MaxNesting) + " = 1}\n", 1},
		{"brackets in a basic string", `x = "` + strings.Repeat("[{.", 50) + `"` + "\n", 0},
		{"escaped quote in a basic string", `x = "\"` + strings.Repeat("[", 50) + `"` + "\n", 0},
		{"brackets in a literal string", "x = '" + strings.Repeat("[", 50) + `\'` + "\n", 0},
		{"brackets in a comment", "# " + strings.Repeat("[", 50) + "\nx = 1\n", 0},
		{"brackets in multi-line strings", "x = \"\"\"\n" + strings.Repeat("[", 50) + "\n\"\"\"\ny = '''\n" + strings.Repeat("{", 50) + "\n'''\n", 0},
		{"multi-line string ending in quotes", "x = \"\"\"a\"\"\"\"\"\ny = " + deep("[", "]", MaxNesting) + "\n", 2},
		{"lines counted inside multi-line strings", "x = '''\n\n\n'''\ny = " + deep("[", "]", MaxNesting) + "\n", 5},
		{"line continuation in a multi-line string", "x = \"\"\"a \\\n b\"\"\"\ny = " + deep("[", "]", MaxNesting) + "\n", 3},
		{"unterminated string", "x = \"" + strings.Repeat("[", 50) + "\ny = 1\n", 0},
		{"stray closers lend no depth", strings.Repeat("]", 50) + "\nx = " + deep("[", "]", MaxNesting) + "\n", 2},
		{"nested 20,000 deep", "schema = 1\n[overlays]\nmarks = [" + deep("{a=", "}", 20000) + "]\n", 3},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := nesting([]byte(tc.src)); got != tc.line {
				t.Errorf("nesting = line %d; want %d", got, tc.line)
			}
		})
	}
}

// TestDecodeHostileFiles decodes files built to keep a reader busy and
// checks that each is refused, or read, within a small processor-time
// budget, with a short message naming the file.
func TestDecodeHostileFiles(t *testing.T) {
	lines := func(n int, f func(i int) string) string {
		var b strings.Builder
		b.WriteString("schema = 1\n")
		for i := range n {
			b.WriteString(f(i))
		}
		return b.String()
	}
	tests := []struct {
		name string
		src  string
		line int
		msg  string // "" when the file is read
	}{
		{"marks nested 12,000 deep", "schema = 1\n[overlays]\nmarks = [" + strings.Repeat("{a=", 12000) + "1" + strings.Repeat("}", 12000) + "]\n",
			3, "nested deeper than 8 levels"},
		{"dotted key 20,000 parts long", "schema = 1\n" + strings.Repeat("a.", 20000) + "a = 1\n", 2, "nested deeper"},
		{"larger than the bound", "schema = 1\n" + strings.Repeat("#\n", maxFileSize), 0, "larger than"},
		{"thousands of unknown keys", lines(5000, func(i int) string { return "k" + strings.Repeat("x", i%7) + strconv.Itoa(i) + " = 1\n" }), 2,
			"and 4998 more problems"},
		{"thousands of fixed values", lines(5000, func(i int) string {
			if i == 0 {
				return "[fixed]\n"
			}
			return "p" + strconv.Itoa(i) + " = 1\n"
		}), 0, "4999 values; a scenario fixes at most 32"},
		{"thousands of array tables", lines(2000, func(int) string { return "[[overlays.marks]]\nkp = 1\n" }), 0, ""},
		{"thousands of levels", "schema = 1\n[overlays]\nms_levels = [" + strings.Repeat("1.5, ", 10000) + "2]\n", 0, ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			start, ok := cpuTime()
			_, err := Decode(strings.NewReader(tc.src), "hostile.toml")
			if end, _ := cpuTime(); ok && end-start > decodeBudget {
				t.Errorf("Decode took %v of processor time", end-start)
			}
			if tc.msg == "" {
				if err != nil {
					t.Fatalf("refused: %v", err)
				}
				return
			}
			var e *Error
			if !errors.As(err, &e) || e.File != "hostile.toml" || e.Line != tc.line || !strings.Contains(err.Error(), tc.msg) {
				t.Fatalf("error %v; want one naming the file, line %d and %q", err, tc.line, tc.msg)
			}
			if n := strings.Count(err.Error(), "\n"); n > 2 {
				t.Errorf("message has %d lines", n+1)
			}
		})
	}
}
