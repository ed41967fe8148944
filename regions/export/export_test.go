package export

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"
	"testing"

	"gainscape/regions/stability"
)

func TestNumberWritesMissingAsNull(t *testing.T) {
	tests := []struct {
		v    float64
		want string
	}{
		{1.5, "1.5"}, {0, "0"}, {math.NaN(), "null"}, {math.Inf(1), "null"}, {math.Inf(-1), "null"}, {-2e-300, "-2e-300"},
	}
	for _, tc := range tests {
		b, err := json.Marshal(Number(tc.v))
		if err != nil || string(b) != tc.want {
			t.Errorf("Number(%g) → %s, %v; want %s", tc.v, b, err, tc.want)
		}
		if Number(tc.v).Valid() != (tc.want != "null") {
			t.Errorf("Number(%g).Valid() wrong", tc.v)
		}
	}
}

// TestRegionFieldNames pins the names scripts rely on.
func TestRegionFieldNames(t *testing.T) {
	doc := &Region{
		Boundaries: []Boundary{{Kind: stability.Complex, Points: [][3]Number{{1, 2, Number(math.NaN())}}}},
		Extra:      &Extra{Overlays: Overlays{Ms: &Layer{Contours: []Contour{}, Levels: []float64{1.4}}}},
	}
	var b bytes.Buffer
	if err := WriteRegion(&b, doc); err != nil {
		t.Fatal(err)
	}
	for _, key := range []string{`"x"`, `"y"`, `"rhp"`, `"boundaries"`, `"kind":"complex"`, `"points"`, `null`,
		`"summary"`, `"stable_box"`, `"omega_range"`, `"extra"`, `"overlays"`, `"ms"`, `"levels"`, `"contours"`, `"marks"`, `"best"`} {
		if !strings.Contains(b.String(), key) {
			t.Errorf("document lacks %s:\n%s", key, b.String())
		}
	}
	if strings.Contains(b.String(), `"decay_rate"`) {
		t.Error("a layer not computed is written")
	}
}
