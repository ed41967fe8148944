package render

import (
	"bytes"
	"reflect"
	"slices"
	"testing"

	"gainscape/regions/boundary"
	"gainscape/regions/stability"
)

// sampledFigure is sampleFigure as a sampled map with an edge through
// z = −1 and two compared sets of edges.
func sampledFigure() Figure {
	f := sampleFigure()
	f.Marks = nil
	f.Sample = 0.5
	alt := boundary.Curve{Kind: stability.Alternating, Points: []boundary.Point{{X: 1, Y: 0, Omega: 6.283}, {X: 2, Y: 1, Omega: 6.283}}}
	f.Curves = append(f.Curves, alt)
	f.OwnLabel = "T = 0.5 s"
	f.Compare = []EdgeSet{{Label: "T = 1 s", Curves: f.Curves[:1]}, {Label: "continuous", Curves: f.Curves[1:2]}}
	return f
}

// TestSampledLegend checks that a sampled map's legend speaks of the unit
// circle, names the edge through z = −1 apart, and lists the compared
// sample times after the map's own.
func TestSampledLegend(t *testing.T) {
	f := sampledFigure().withDefaults()
	got := entryTexts(legendSections(&f, countColours(false), nil))
	want := map[string][]string{
		"Region":         {"stable", "1 root outside circle", "2 roots outside circle", "3 roots outside circle", "undecided"},
		"Edge":           {"pair crosses at e^(±jωT)", "real root crosses at z = 1", "real root crosses at z = −1", "root crosses at ∞"},
		"Edges compared": {"T = 0.5 s (this map)", "T = 1 s", "continuous"},
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("legend\n got %q\nwant %q", got, want)
	}
}

// TestEdgeStylesDiffer checks that every kind of edge, the alternating
// one included, and every compared set has its own dash pattern, so that
// they stay apart in greyscale.
func TestEdgeStylesDiffer(t *testing.T) {
	var seen [][]float64
	add := func(what string, d []float64) {
		for _, s := range seen {
			if slices.Equal(s, d) {
				t.Errorf("%s shares the dash pattern %v", what, d)
			}
		}
		seen = append(seen, d)
	}
	for _, k := range kindOrder {
		var d []float64
		for _, v := range curveStyle(k).Dashes {
			d = append(d, float64(v))
		}
		add(k.String(), d)
	}
	for i := range compareLooks {
		if i == 0 {
			continue // solid, but coloured and thinner than a complex edge
		}
		var d []float64
		for _, v := range compareStyle(i).Dashes {
			d = append(d, float64(v))
		}
		add("compared set", d)
	}
}

// TestSampledFigureWrites draws the sampled figure, ω = π/T label and
// compared edges included, as PNG and SVG.
func TestSampledFigureWrites(t *testing.T) {
	for _, format := range []string{"png", "svg"} {
		var buf bytes.Buffer
		if err := Write(&buf, format, sampledFigure()); err != nil {
			t.Fatal(err)
		}
		if format == "svg" && !bytes.Contains(buf.Bytes(), []byte("π/T")) {
			t.Errorf("the SVG has no ω = π/T label")
		}
	}
}
