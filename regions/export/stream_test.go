package export

import (
	"bytes"
	"encoding/json"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"

	"gainscape/regions/isoline"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// TestAppendNumberAsEncodingJSON checks the number writer of the stream
// against encoding/json on special and random values over the whole
// exponent range.
func TestAppendNumberAsEncodingJSON(t *testing.T) {
	vals := []float64{0, math.Copysign(0, -1), 1, -1, 0.1, 1e-6, 9.99e-7, 1e21, 9.9e20, 1e-300, -2.5e-7, 123456789.125, math.MaxFloat64, math.SmallestNonzeroFloat64}
	rng := rand.New(rand.NewPCG(3, 4))
	for range 2000 {
		vals = append(vals, (rng.Float64()-0.5)*math.Pow(10, float64(rng.IntN(60)-30)))
	}
	for _, v := range vals {
		want, _ := json.Marshal(v)
		if got := appendNumber(nil, v); string(got) != string(want) {
			t.Fatalf("%v: stream writes %s, encoding/json %s", v, got, want)
		}
	}
	for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		if got := appendNumber(nil, v); string(got) != "null" {
			t.Fatalf("%v: %s, want null", v, got)
		}
	}
}

// TestWriteRegionSameValues writes a document with grids, edges and
// overlays streamed and checks that it reads back to the very values
// encoding/json gives the same struct, with one line per grid row.
func TestWriteRegionSameValues(t *testing.T) {
	nx, ny := 7, 5
	rhp := make([]int8, nx*ny)
	ms := make([]float64, nx*ny)
	for k := range rhp {
		rhp[k] = int8(k % 3)
		ms[k] = 1 + float64(k)/7
		if k%4 == 0 {
			ms[k] = math.NaN()
		}
	}
	rhp[3] = -1
	doc := &Region{
		Plant: "1/(s+1)^3", Controller: "pi", TimeUnit: "s", Fixed: map[string]float64{"kd": 0.5, "a": 1e-9},
		X: plane.Axis{Param: "kp", Min: 0, Max: 6, N: nx}, Y: plane.Axis{Param: "ki", Min: 0, Max: 2, N: ny},
		RHP: Counts{nx, ny, rhp}, Axis: Counts{nx, ny, make([]int8, nx*ny)},
		Boundaries: []Boundary{
			{Kind: stability.Complex, Points: [][3]Number{{1, 2, 0.5}, {1.5, 2.5, Number(math.Inf(1))}}},
			{Kind: stability.Infinite, Points: [][3]Number{{0, 1, Number(math.NaN())}}},
		},
		Summary: Summary{Nodes: nx * ny, StableBox: &[4]float64{0, 1, 2, 3}, EdgeMethod: "frequency sweep", EdgeCheck: new(int)},
		Extra: &Extra{Best: []Point{}, Marks: []Point{{Label: "A", Values: map[string]float64{"kp": 1}, Ms: 1.3, Decay: Number(math.NaN())}},
			Overlays: Overlays{Ms: &Layer{Levels: []float64{1.4}, Values: Grid{nx, ny, ms},
				Contours: []Contour{{Level: 1.4, Lines: []isoline.Line{{{0.5, 0.25}, {1, 0.5}}}}}}}},
	}
	var streamed bytes.Buffer
	if err := WriteRegion(&streamed, doc); err != nil {
		t.Fatal(err)
	}
	whole, err := json.Marshal(doc)
	if err != nil {
		t.Fatal(err)
	}
	var a, b any
	if err := json.Unmarshal(streamed.Bytes(), &a); err != nil {
		t.Fatalf("streamed document does not parse: %v\n%s", err, streamed.String())
	}
	if err := json.Unmarshal(whole, &b); err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(a, b) {
		t.Fatalf("streamed and encoded documents differ:\n%s\n%s", streamed.String(), whole)
	}
	// Each row of each grid on a line of its own: rhp, axis and ms.
	rows := 0
	for _, line := range strings.Split(streamed.String(), "\n") {
		if strings.HasPrefix(line, "[") && strings.Count(line, ",") >= nx-1 {
			rows++
		}
	}
	if rows != 3*ny {
		t.Fatalf("%d lines hold a grid row, want %d:\n%s", rows, 3*ny, streamed.String())
	}
}
