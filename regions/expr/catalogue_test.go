package expr

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// catalogue is the shared file of plants with hand-derived expansions.
var catalogue = filepath.Join("..", "..", "testdata", "expr", "plants.txt")

type plantRecord struct {
	line           int // line of the "expr:" entry, for messages
	expr, num, den string
}

// readCatalogue returns the records of the plant file.
func readCatalogue(t *testing.T) []plantRecord {
	t.Helper()
	f, err := os.Open(catalogue)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var recs []plantRecord
	var cur plantRecord
	flush := func() {
		if cur != (plantRecord{}) {
			if cur.expr == "" || cur.num == "" || cur.den == "" {
				t.Fatalf("%s:%d: record lacks expr, num or den", catalogue, cur.line)
			}
			recs = append(recs, cur)
		}
		cur = plantRecord{}
	}
	sc := bufio.NewScanner(f)
	for n := 1; sc.Scan(); n++ {
		line := strings.TrimSpace(sc.Text())
		key, val, _ := strings.Cut(line, ":")
		switch {
		case line == "":
			flush()
		case strings.HasPrefix(line, "#"):
		case key == "expr":
			cur.expr, cur.line = strings.TrimSpace(val), n
		case key == "num":
			cur.num = strings.TrimSpace(val)
		case key == "den":
			cur.den = strings.TrimSpace(val)
		default:
			t.Fatalf("%s:%d: unknown line %q", catalogue, n, line)
		}
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	flush()
	return recs
}

// TestPlantCatalogue checks every plant in the shared file: Parse of the
// expression must match ParseList of the listed coefficients, and Check
// must accept the plant.
func TestPlantCatalogue(t *testing.T) {
	recs := readCatalogue(t)
	if len(recs) == 0 {
		t.Fatalf("%s has no records", catalogue)
	}
	for _, rec := range recs {
		t.Run(rec.expr, func(t *testing.T) {
			num, den, err := Parse(rec.expr)
			if err != nil {
				t.Fatalf("line %d: %v", rec.line, err)
			}
			wantNum, err := ParseList(rec.num)
			if err != nil {
				t.Fatalf("line %d: %v", rec.line, err)
			}
			wantDen, err := ParseList(rec.den)
			if err != nil {
				t.Fatalf("line %d: %v", rec.line, err)
			}
			if got, want := num.Descending(), wantNum.Descending(); !closeTo(got, want, coefTol) {
				t.Errorf("line %d: numerator %v, want %v", rec.line, got, want)
			}
			if got, want := den.Descending(), wantDen.Descending(); !closeTo(got, want, coefTol) {
				t.Errorf("line %d: denominator %v, want %v", rec.line, got, want)
			}
			if err := Check(num, den); err != nil {
				t.Errorf("line %d: %v", rec.line, err)
			}
		})
	}
}
