package render

import (
	"fmt"
	"math"
	"reflect"
	"testing"

	"gonum.org/v1/plot/vg"
)

// markTexts are labels as the map command writes them, of the widths
// met in practice.
var markTexts = []string{
	"A: σ=0.342, Ms=2.74",
	"best decay: σ=0.767, Ms=1.71",
	"best ki: σ=0.291, Ms=1.4",
	"B: σ=0.482, Ms=2.19",
	"C: unstable",
}

// checkMarkLabels fails if a mark label leaves the area, overlaps
// another label (mark labels and the boxes in fixed alike) or a symbol,
// or has a leader running across a label, or if a mark went without a
// label; and, if roomy is set, if a label is poorly placed.
func checkMarkLabels(t *testing.T, area vg.Rectangle, marks []markText, fixed []vg.Rectangle, got []markLabel, roomy bool) {
	t.Helper()
	if len(got) != len(marks) {
		t.Fatalf("%d labels for %d marks", len(got), len(marks))
	}
	boxes := append([]vg.Rectangle(nil), fixed...)
	for _, l := range got {
		boxes = append(boxes, l.bg)
	}
	for i, l := range got {
		if !inside(l.bg, area) {
			t.Errorf("label %q at %v leaves the area %v", l.text, l.bg, area)
		}
		if roomy && l.poor {
			t.Errorf("label %q is poorly placed", l.text)
		}
		for j := len(fixed) + i + 1; j < len(boxes); j++ {
			if overlaps(l.bg, boxes[j]) {
				t.Errorf("label %q %v overlaps label %q %v", l.text, l.bg, got[j-len(fixed)].text, boxes[j])
			}
		}
		for j, b := range fixed {
			if overlaps(l.bg, b) {
				t.Errorf("label %q %v overlaps fixed label %d %v", l.text, l.bg, j, b)
			}
		}
		for _, m := range marks {
			if overlaps(l.bg, symbolBox(m.at)) {
				t.Errorf("label %q %v covers the symbol at %v", l.text, l.bg, m.at)
			}
		}
		if !l.leader {
			continue
		}
		for j, b := range boxes {
			if j != len(fixed)+i && segmentHits(l.from, l.to, b) {
				t.Errorf("leader of %q from %v to %v runs across label box %v", l.text, l.from, l.to, b)
			}
		}
	}
}

func TestMarkLabelsInClusterDoNotOverlap(t *testing.T) {
	// A plot area the size of the default figure's data area, and a
	// label height of about 14 units: every cluster below fits its five
	// symbols within three label heights, so most labels cannot sit
	// next to their symbols.
	area := vg.Rectangle{Max: vg.Point{X: 320, Y: 240}}
	ring := func(cx, cy, r vg.Length) []vg.Point {
		var pts []vg.Point
		for k := range 5 {
			a := 2 * math.Pi * float64(k) / 5
			pts = append(pts, vg.Point{X: cx + r*vg.Length(math.Cos(a)), Y: cy + r*vg.Length(math.Sin(a))})
		}
		return pts
	}
	line := func(x, y, dx, dy vg.Length) []vg.Point {
		var pts []vg.Point
		for k := range 5 {
			pts = append(pts, vg.Point{X: x + vg.Length(k)*dx, Y: y + vg.Length(k)*dy})
		}
		return pts
	}
	tests := []struct {
		name  string
		pts   []vg.Point
		roomy bool           // room for every label without a poor leader
		fixed []vg.Rectangle // labels already placed, such as ω labels
	}{
		{"ring of one label height", ring(160, 120, 14), true, nil},
		{"ring of half a label height", ring(160, 120, 8), true, nil},
		{"row", line(130, 120, 11, 0), true, nil},
		{"column", line(160, 90, 0, 11), true, nil},
		{"diagonal", line(130, 90, 9, 9), true, nil},
		{"left edge", line(14, 80, 3, 12), true, nil},
		// Hemmed in by two edges, one leader may have to cross another
		// or pass a symbol; labels still must not overlap.
		{"top right corner", ring(295, 215, 12), false, nil},
		{"among ω labels", ring(160, 120, 12), true, []vg.Rectangle{
			{Min: vg.Point{X: 120, Y: 140}, Max: vg.Point{X: 160, Y: 152}},
			{Min: vg.Point{X: 175, Y: 128}, Max: vg.Point{X: 215, Y: 140}},
			{Min: vg.Point{X: 150, Y: 92}, Max: vg.Point{X: 190, Y: 104}},
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			pl := &placer{area: area}
			for _, b := range tc.fixed {
				pl.block(grow(b, labelGap))
			}
			var marks []markText
			for i, pt := range tc.pts {
				pl.addSymbol(pt)
				marks = append(marks, markText{at: pt, text: markTexts[i%len(markTexts)]})
			}
			got := placeMarkLabels(pl, marks)
			checkMarkLabels(t, area, marks, tc.fixed, got, tc.roomy)
		})
	}
}

func TestMarkLabelsAvoidDrawnLines(t *testing.T) {
	// A boundary runs vertically 20 units right of a lone mark: the
	// label has room on the left, so it must not cover the boundary.
	area := vg.Rectangle{Max: vg.Point{X: 320, Y: 240}}
	pl := &placer{area: area}
	pl.addLine([]vg.Point{{X: 180, Y: 0}, {X: 180, Y: 240}}, boundaryCover)
	pt := vg.Point{X: 160, Y: 120}
	pl.addSymbol(pt)
	got := placeMarkLabels(pl, []markText{{at: pt, text: markTexts[0]}})
	if c := pl.coverCost(got[0].bg, -1); c != 0 {
		t.Errorf("label %v covers the boundary (cost %v)", got[0].bg, c)
	}
}

func TestMarkLabelsAreDeterministic(t *testing.T) {
	area := vg.Rectangle{Max: vg.Point{X: 320, Y: 240}}
	place := func() []markLabel {
		pl := &placer{area: area}
		var marks []markText
		for k := range 7 {
			pt := vg.Point{X: 150 + vg.Length(7*(k%3)), Y: 110 + vg.Length(6*k)}
			pl.addSymbol(pt)
			marks = append(marks, markText{at: pt, text: fmt.Sprintf("point %d: σ=0.%d", k, k)})
		}
		return placeMarkLabels(pl, marks)
	}
	first := place()
	for range 3 {
		if again := place(); !reflect.DeepEqual(first, again) {
			t.Fatalf("placement differs between runs:\n%v\n%v", first, again)
		}
	}
}

func TestSegmentHits(t *testing.T) {
	r := vg.Rectangle{Min: vg.Point{X: 0, Y: 0}, Max: vg.Point{X: 10, Y: 10}}
	tests := []struct {
		name string
		a, b vg.Point
		want bool
	}{
		{"through", vg.Point{X: -5, Y: 5}, vg.Point{X: 15, Y: 5}, true},
		{"inside", vg.Point{X: 2, Y: 2}, vg.Point{X: 3, Y: 3}, true},
		{"ends inside", vg.Point{X: -5, Y: -5}, vg.Point{X: 5, Y: 5}, true},
		{"passes by", vg.Point{X: -5, Y: 12}, vg.Point{X: 15, Y: 11}, false},
		{"along an edge", vg.Point{X: -5, Y: 10}, vg.Point{X: 15, Y: 10}, false},
		{"stops short", vg.Point{X: -5, Y: 5}, vg.Point{X: 0, Y: 5}, false},
		{"cuts a corner", vg.Point{X: 7, Y: 12}, vg.Point{X: 12, Y: 7}, true},
		{"misses a corner", vg.Point{X: 9, Y: 13}, vg.Point{X: 13, Y: 9}, false},
	}
	for _, tc := range tests {
		if got := segmentHits(tc.a, tc.b, r); got != tc.want {
			t.Errorf("%s: segmentHits(%v, %v) = %v, want %v", tc.name, tc.a, tc.b, got, tc.want)
		}
	}
}
