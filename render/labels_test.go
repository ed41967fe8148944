package render

import (
	"math"
	"testing"

	"gonum.org/v1/plot/vg"
)

// omegaBoxFor is the ω label box used on the map.
func omegaBoxFor(pt vg.Point, w float64) (vg.Rectangle, bool) {
	return labelBox(centredStyle(labelSize, inkColour), omegaText(w, ""), pt), true
}

// checkPlaced fails if any two boxes overlap or one leaves the area.
func checkPlaced(t *testing.T, area vg.Rectangle, sites []site) {
	t.Helper()
	for i, a := range sites {
		if !inside(a.Box, area) {
			t.Errorf("label %d box %v leaves the area %v", i, a.Box, area)
		}
		for j := i + 1; j < len(sites); j++ {
			if overlaps(a.Box, sites[j].Box) {
				t.Errorf("labels %d (%v) and %d (%v) overlap", i, a.Box, j, sites[j].Box)
			}
		}
	}
}

func TestOmegaLabelsDoNotOverlapOnDenseCurves(t *testing.T) {
	area := vg.Rectangle{Max: vg.Point{X: 320, Y: 240}}
	// An Archimedean spiral whose turns lie 9 units apart, closer than a
	// label is tall, from the centre out beyond the area, plus a zigzag
	// crossing it: every candidate has close neighbours on other turns.
	var spiral []pathPoint
	for k := 0; k <= 4000; k++ {
		a := float64(k) * 0.01
		r := 9 * a / (2 * math.Pi)
		spiral = append(spiral, pathPoint{
			At:    vg.Point{X: 160 + vg.Length(r*math.Cos(a)), Y: 120 + vg.Length(r*math.Sin(a))},
			Value: 0.1 + a/10,
		})
	}
	var zigzag []pathPoint
	for k := 0; k <= 40; k++ {
		zigzag = append(zigzag, pathPoint{At: vg.Point{X: vg.Length(8 * k), Y: vg.Length(100 + 60*(k%2))}, Value: 12.5})
	}
	pl := &placer{area: area}
	// Spacing shorter than a label is wide, so placing every candidate
	// would certainly overlap.
	sites := pl.along(spiral, 5, 15, 2, omegaBoxFor)
	sites = append(sites, pl.along(zigzag, 5, 15, 2, omegaBoxFor)...)
	if len(sites) < 20 {
		t.Errorf("only %d labels placed; the area has room for many more", len(sites))
	}
	checkPlaced(t, area, sites)
}

func TestAlongSpacesLabelsByArcLength(t *testing.T) {
	// A straight line 1000 units long with ω rising from 0 to 10: labels
	// 20 units wide fit everywhere, so they fall exactly at 50, 150, …,
	// 950 with ω equal to a hundredth of the arc length.
	line := []pathPoint{{At: vg.Point{X: 0, Y: 50}}, {At: vg.Point{X: 1000, Y: 50}, Value: 10}}
	box := func(pt vg.Point, _ float64) (vg.Rectangle, bool) {
		return grow(vg.Rectangle{Min: pt, Max: pt}, 10), true
	}
	pl := &placer{area: vg.Rectangle{Max: vg.Point{X: 1000, Y: 100}}}
	sites := pl.along(line, 50, 100, 5, box)
	if len(sites) != 10 {
		t.Fatalf("%d labels, want 10", len(sites))
	}
	for i, s := range sites {
		wantX := 50 + 100*float64(i)
		if math.Abs(float64(s.At.X)-wantX) > 1e-9 || math.Abs(s.Value-wantX/100) > 1e-9 {
			t.Errorf("label %d at x=%v ω=%v, want x=%v ω=%v", i, s.At.X, s.Value, wantX, wantX/100)
		}
	}
}

func TestAlongSkipsBlockedAndOutside(t *testing.T) {
	line := []pathPoint{{At: vg.Point{X: -50, Y: 50}}, {At: vg.Point{X: 300, Y: 50}}}
	box := func(pt vg.Point, _ float64) (vg.Rectangle, bool) {
		return grow(vg.Rectangle{Min: pt, Max: pt}, 10), true
	}
	pl := &placer{area: vg.Rectangle{Max: vg.Point{X: 200, Y: 100}}}
	blocked := vg.Rectangle{Min: vg.Point{X: 0, Y: 0}, Max: vg.Point{X: 120, Y: 100}}
	pl.block(blocked)
	sites := pl.along(line, 0, 1000, 1, box)
	// The first free spot: the box must start at x ≥ 120, so the
	// centre is at 130, 180 units along the line from x = −50.
	if len(sites) != 1 || math.Abs(float64(sites[0].At.X)-130) > 1 {
		t.Fatalf("sites %v, want one at x≈130", sites)
	}
}

func TestFormatOmega(t *testing.T) {
	tests := []struct {
		w    float64
		want string
	}{
		{1.8349, "ω=1.83"},
		{0, "ω=0"},
		{12.54, "ω=12.5"},
		{0.05234, "ω=0.0523"},
		{250.4, "ω=250"},
		{0.70031, "ω=0.700"},
		{-3.14159, "ω=-3.14"},
		{123456, "ω=1.23e+05"},
	}
	for _, tc := range tests {
		if got := omegaText(tc.w, ""); got != tc.want {
			t.Errorf("omegaText(%v) = %q, want %q", tc.w, got, tc.want)
		}
	}
}

func TestMarkLabelsAvoidEachOther(t *testing.T) {
	area := vg.Rectangle{Max: vg.Point{X: 300, Y: 200}}
	pl := &placer{area: area}
	// Three marks in a tight row: the second and third labels must move
	// off the default right-hand position.
	var marks []markText
	for _, pt := range []vg.Point{{X: 100, Y: 100}, {X: 118, Y: 100}, {X: 136, Y: 100}} {
		pl.addSymbol(pt)
		marks = append(marks, markText{at: pt, text: "design"})
	}
	var sites []site
	for _, l := range placeMarkLabels(pl, marks) {
		sites = append(sites, site{At: l.at, Box: grow(l.bg, labelGap)})
	}
	checkPlaced(t, area, sites)
}
