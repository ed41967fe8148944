package render

import (
	"math"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// arch returns a half ellipse of radii rx, ry standing on (cx, cy), from
// its left foot over the top to its right foot.
func arch(cx, cy, rx, ry vg.Length) []vg.Point {
	var pts []vg.Point
	for k := 0; k <= 60; k++ {
		a := math.Pi * float64(60-k) / 60
		pts = append(pts, vg.Point{X: cx + rx*vg.Length(math.Cos(a)), Y: cy + ry*vg.Length(math.Sin(a))})
	}
	return pts
}

func TestIsoLabelsOnShortNestedLines(t *testing.T) {
	// Two short nested arches 8 units apart, the shape of the Ms = 1.4
	// and Ms = 2 lines inside a small stable region, standing on a
	// boundary along the bottom, with two design points on the inner
	// arch's top. Each level must get a label on or beside its own line.
	area := vg.Rectangle{Max: vg.Point{X: 320, Y: 240}}
	pl := &placer{area: area}
	pl.addLine([]vg.Point{{X: 0, Y: 20}, {X: 320, Y: 20}}, boundaryCover)
	outer := arch(100, 20, 30, 36)
	inner := arch(100, 20, 22, 28)
	levels := []isoText{
		{text: "Ms=1.4", lines: []isoLine{{pts: inner, id: pl.addLine(inner, isoCover)}}},
		{text: "Ms=2", lines: []isoLine{{pts: outer, id: pl.addLine(outer, isoCover)}}},
	}
	marks := []vg.Point{{X: 94, Y: 48}, {X: 106, Y: 47}}
	for _, m := range marks {
		pl.addSymbol(m)
	}
	got := placeIsoLabels(pl, levels, marks)
	if len(got) != 2 {
		t.Fatalf("%d labels, want one per level: %v", len(got), got)
	}
	for i, l := range got {
		if !inside(l.bg, area) {
			t.Errorf("label %q leaves the area", l.text)
		}
		for _, m := range marks {
			if overlaps(l.bg, symbolBox(m)) {
				t.Errorf("label %q %v covers the symbol at %v", l.text, l.bg, m)
			}
		}
		for _, o := range got[i+1:] {
			if overlaps(grow(l.bg, labelGap), grow(o.bg, labelGap)) {
				t.Errorf("labels %q %v and %q %v overlap", l.text, l.bg, o.text, o.bg)
			}
		}
		// On or beside its line: the line passes within a label
		// height of the label's centre.
		line := inner
		if l.text == "Ms=2" {
			line = outer
		}
		c := vg.Point{X: (l.bg.Min.X + l.bg.Max.X) / 2, Y: (l.bg.Min.Y + l.bg.Max.Y) / 2}
		near := vg.Length(math.Inf(1))
		for _, p := range line {
			near = min(near, dist(c, p))
		}
		if h := l.bg.Size().Y; near > h {
			t.Errorf("label %q centred %v from its line, more than its height %v", l.text, near, h)
		}
	}
}

func TestFigureLabelsDoNotOverlap(t *testing.T) {
	// The shaded sample with five design points crowded round A and
	// two nested iso-line levels: no two labels of any kind may
	// overlap, none may cover a symbol or leave the plot, no leader may
	// run across a label, and every level gets its label.
	f := shadedFigure()
	f.Marks = append(f.Marks,
		Mark{X: 2.55, Y: 1.75, Label: "best decay: σ=0.767, Ms=1.71"},
		Mark{X: 2.3, Y: 1.9, Label: "best ki: σ=0.291, Ms=1.4"},
		Mark{X: 2.5, Y: 1.55, Label: "C: σ=0.333, Ms=1.72"},
		Mark{X: 2.2, Y: 1.6, Label: "D: σ=0.278, Ms=2.17"},
	)
	f = f.withDefaults()
	img := vgimg.New(f.Width, f.Height)
	dc := draw.New(img)
	p, ann := buildPlot(&f, countColours(true), newShadeScale(0, 0.9), 0)
	data := p.DataCanvas(dc)
	trX, trY := p.Transforms(&data)
	lay := ann.place(data.Rectangle, trX, trY)

	for i, l := range lay.labels {
		if !inside(l.bg, data.Rectangle) {
			t.Errorf("label %q %v leaves the plot %v", l.text, l.bg, data.Rectangle)
		}
		for _, o := range lay.labels[i+1:] {
			if overlaps(l.bg, o.bg) {
				t.Errorf("labels %q %v and %q %v overlap", l.text, l.bg, o.text, o.bg)
			}
		}
		for _, s := range lay.symbols {
			if overlaps(l.bg, symbolBox(s)) {
				t.Errorf("label %q %v covers the symbol at %v", l.text, l.bg, s)
			}
		}
		for _, ld := range lay.leaders {
			if ld.text != l.text && segmentHits(ld.from, ld.to, l.bg) {
				t.Errorf("leader of %q runs across label %q", ld.text, l.text)
			}
		}
	}
	for _, want := range []string{"Ms=1.8", "Ms=3", "A", "B (tuned)"} {
		found := false
		for _, l := range lay.labels {
			found = found || l.text == want
		}
		if !found {
			t.Errorf("no label %q", want)
		}
	}
}
