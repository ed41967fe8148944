package render

import (
	"bytes"
	"image"
	"image/color"
	"image/png"
	"math"
	"strings"
	"testing"
)

// samplePanels returns n panels of the synthetic maps, every second one
// shaded over a different range.
func samplePanels(n int) Panels {
	p := Panels{Title: "synthetic panels: plant under PI and PID", Notes: []string{"a note"}}
	for i := range n {
		f := sampleFigure()
		if i%2 == 1 {
			f = shadedFigure()
			scaled := *f.Shade
			scaled.Values = append([]float64(nil), f.Shade.Values...)
			for k := range scaled.Values {
				scaled.Values[k] *= float64(i)
			}
			f.Shade = &scaled
		}
		f.Title = "panel " + string(rune('A'+i))
		p.Maps = append(p.Maps, f)
	}
	return p
}

func TestWritePanels(t *testing.T) {
	for _, format := range []string{"png", "svg", "pdf"} {
		for _, n := range []int{1, 2, 3, 6} {
			var buf bytes.Buffer
			if err := WritePanels(&buf, format, samplePanels(n)); err != nil {
				t.Fatalf("%s, %d panels: %v", format, n, err)
			}
			if buf.Len() == 0 {
				t.Fatalf("%s, %d panels: empty", format, n)
			}
		}
	}
	bad := []struct {
		name string
		p    Panels
	}{
		{"none", Panels{}},
		{"ten", samplePanels(10)},
		{"no map", Panels{Maps: []Figure{{Title: "x"}}}},
		{"negative size", func() Panels { p := samplePanels(1); p.Width = -1; return p }()},
	}
	for _, tc := range bad {
		if err := WritePanels(&bytes.Buffer{}, "png", tc.p); err == nil {
			t.Errorf("%s: no error", tc.name)
		}
	}
}

// TestPanelsPageWidth: with up to six panels the default figure is a
// printed page's 17 cm wide and each panel's plot keeps about a map's
// shape, so type set for a 16 cm map stays readable.
func TestPanelsPageWidth(t *testing.T) {
	for _, n := range []int{1, 3, 4, 6} {
		var buf bytes.Buffer
		if err := WritePanels(&buf, "png", samplePanels(n)); err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(&buf)
		if err != nil {
			t.Fatal(err)
		}
		// 17 cm at 200 dpi is 1338.6 px.
		size := img.Bounds().Size()
		if size.X != 1339 {
			t.Errorf("%d panels: %d px wide; want 1339", n, size.X)
		}
		cols := map[int]int{1: 1, 3: 3, 4: 2, 6: 3}[n]
		rows := (n + cols - 1) / cols
		perRow := float64(size.Y) / float64(rows)
		if perRow < 0.5*float64(size.X)/float64(cols) {
			t.Errorf("%d panels: %d px tall, %.0f px per row for panels %d px wide", n, size.Y, perRow, size.X/cols)
		}
	}
}

func TestSharedScale(t *testing.T) {
	p := samplePanels(4)
	s := sharedScale(p.Maps)
	// The shaded panels are the second (×1) and fourth (×3) of a decay
	// rate 0.9(1 − r²), whose largest value on the grid is just below 0.9.
	lo1, hi1, _ := p.Maps[1].Shade.Range()
	lo3, hi3, _ := p.Maps[3].Shade.Range()
	if s == nil || s.Min() != math.Min(lo1, lo3) || s.Max() != math.Max(hi1, hi3) {
		t.Fatalf("scale %v; want %g to %g", s, math.Min(lo1, lo3), math.Max(hi1, hi3))
	}
	if sharedScale(samplePanels(1).Maps) != nil {
		t.Error("a scale without shaded panels")
	}
}

// TestMergedLegend: entries shared by panels appear once; an iso-line
// set lists the levels any panel draws.
func TestMergedLegend(t *testing.T) {
	a, b := shadedFigure(), shadedFigure()
	ms := sampleField("Ms", msOfRadius)
	a.Contours = []ContourSet{contourOf(ms, []float64{1.8}, "Ms", 0)}
	b.Contours = []ContourSet{contourOf(ms, []float64{3, 1.8}, "Ms", 0)}
	maps := []Figure{a.withDefaults(), b.withDefaults()}
	secs := mergeSections(maps, countColours(true), sharedScale(maps))
	got := entryTexts(secs)
	if iso := got[isoHeading]; len(iso) != 1 || iso[0] != "Ms = 1.8, 3" {
		t.Errorf("iso-lines %q", iso)
	}
	for heading, texts := range got {
		seen := map[string]bool{}
		for _, tx := range texts {
			if seen[tx] {
				t.Errorf("%s lists %q twice", heading, tx)
			}
			seen[tx] = true
		}
	}
}

func TestWriteResponses(t *testing.T) {
	if len(seriesLooks) != MaxSeries {
		t.Fatalf("%d looks for %d series", len(seriesLooks), MaxSeries)
	}
	// y = 1 − e^(−t), a first-order lag's step response, and its load
	// counterpart e^(−t) − e^(−2t).
	n := 200
	s := Series{Label: "first order", Time: make([]float64, n), Setpoint: make([]float64, n), Load: make([]float64, n)}
	for k := range n {
		tk := 0.05 * float64(k)
		s.Time[k], s.Setpoint[k], s.Load[k] = tk, 1-math.Exp(-tk), math.Exp(-tk)-math.Exp(-2*tk)
	}
	for _, format := range []string{"png", "svg", "pdf"} {
		var buf bytes.Buffer
		if err := WriteResponses(&buf, format, Responses{Title: "responses σ ≤ 1", Series: []Series{s, s}, TimeUnit: "s"}); err != nil {
			t.Fatalf("%s: %v", format, err)
		}
	}
	short := s
	short.Load = short.Load[:10]
	for name, r := range map[string]Responses{
		"none":       {},
		"too many":   {Series: make([]Series, MaxSeries+1)},
		"mismatched": {Series: []Series{short}},
	} {
		if err := WriteResponses(&bytes.Buffer{}, "png", r); err == nil {
			t.Errorf("%s: no error", name)
		}
	}
}

// TestPDFText: a PDF of a figure with a bold title and σ, ω and ≤ in its
// text is written; the PDF canvas alone refuses bold faces.
func TestPDFText(t *testing.T) {
	f := shadedFigure()
	f.Title = "bold title with σ ≤ 1 and ω"
	var buf bytes.Buffer
	if err := Write(&buf, "pdf", f); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(buf.String(), "%PDF-") {
		t.Fatal("not a PDF")
	}
}

// TestFlipped: the image handed to the PDF canvas is the given one
// upside down, which the canvas turns back.
func TestFlipped(t *testing.T) {
	img := image.NewNRGBA(image.Rect(0, 0, 2, 3))
	img.Set(0, 0, color.NRGBA{R: 255, A: 255})
	img.Set(1, 2, color.NRGBA{B: 255, A: 255})
	got := flipped(img)
	if r, _, _, _ := got.At(0, 2).RGBA(); r != 0xffff {
		t.Error("the top row is not at the bottom")
	}
	if _, _, b, _ := got.At(1, 0).RGBA(); b != 0xffff {
		t.Error("the bottom row is not at the top")
	}
	if got.Bounds() != img.Bounds() {
		t.Errorf("bounds %v", got.Bounds())
	}
}
