package render

import (
	"image/color"
	"math"
	"reflect"
	"strings"
	"testing"

	"github.com/lucasb-eyer/go-colorful"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// Thresholds for the iso-line looks.
const (
	// minContourDifference is the least CIEDE2000 difference, on
	// go-colorful's 0–1 scale (10 units), between the colours of any two
	// contour sets, for full colour vision and for each simulated
	// dichromat. Ten units is a difference seen at a glance between thin
	// lines, where two or three suffice between large patches (common
	// practice).
	minContourDifference = 0.10
	// maxContourLightness keeps every contour colour at least 0.2 in L*
	// below the darkest fill it is drawn over, the end of the shading
	// scale at 0.72, so the lines stay clear of the fills in greyscale.
	maxContourLightness = 0.52
	// minLabelContrast is the least contrast ratio of iso-line label text
	// on its white ground, (Y_light + 0.05)/(Y_dark + 0.05) with Y the
	// relative luminance: 7:1 is the level web accessibility guidance
	// sets for small text (common practice).
	minLabelContrast = 7.0
	// maxContourWidthShare is the largest ratio of contour stroke width
	// to boundary stroke width, so an iso-line never looks as heavy as
	// an edge even in greyscale.
	maxContourWidthShare = 0.75
)

// Dichromat simulations in linear RGB, after Viénot, Brettel and Mollon
// (1999), "Digital video colourmaps for checking the legibility of
// displays by dichromats", Color Research and Application 24(4); the
// coefficients are from memory. Both project every colour onto the
// plane of equal red and green, leaving lightness and blue–yellow.
var (
	protanopia = [3][3]float64{
		{0.11238, 0.88762, 0},
		{0.11238, 0.88762, 0},
		{0.00401, -0.00401, 1},
	}
	deuteranopia = [3][3]float64{
		{0.29275, 0.70725, 0},
		{0.29275, 0.70725, 0},
		{-0.02234, 0.02234, 1},
	}
)

// asSeen returns c as a dichromat with simulation m sees it.
func asSeen(c color.Color, m [3][3]float64) colorful.Color {
	cf, _ := colorful.MakeColor(c)
	r, g, b := cf.LinearRgb()
	in := [3]float64{r, g, b}
	var out [3]float64
	for i := range out {
		out[i] = m[i][0]*in[0] + m[i][1]*in[1] + m[i][2]*in[2]
	}
	return colorful.LinearRgb(out[0], out[1], out[2]).Clamped()
}

// tritanDifference stands in for a tritanope's view, who keeps lightness
// and the red–green contrast: the distance of a and b in the (L*, a*)
// plane of CIELAB, on go-colorful's scale.
func tritanDifference(a, b color.Color) float64 {
	ca, _ := colorful.MakeColor(a)
	cb, _ := colorful.MakeColor(b)
	la, aa, _ := ca.Lab()
	lb, ab, _ := cb.Lab()
	return math.Hypot(la-lb, aa-ab)
}

func TestContourColoursDistinct(t *testing.T) {
	n := len(contourLooks)
	for i := 0; i < n; i++ {
		ci := contourColour(i)
		if l := lightness(ci); l > maxContourLightness {
			t.Errorf("set %d: L* %.3f, above %.2f", i, l, maxContourLightness)
		}
		if r := (1 + 0.05) / (luminance(contourLabelColour(i)) + 0.05); r < minLabelContrast {
			t.Errorf("set %d: label contrast %.1f:1 on white, want at least %.0f:1", i, r, minLabelContrast)
		}
		for j := i + 1; j < n; j++ {
			cj := contourColour(j)
			a, _ := colorful.MakeColor(ci)
			b, _ := colorful.MakeColor(cj)
			views := []struct {
				name string
				d    float64
			}{
				{"full colour vision", a.DistanceCIEDE2000(b)},
				{"protanopia", asSeen(ci, protanopia).DistanceCIEDE2000(asSeen(cj, protanopia))},
				{"deuteranopia", asSeen(ci, deuteranopia).DistanceCIEDE2000(asSeen(cj, deuteranopia))},
				{"tritanopia (L*, a*)", tritanDifference(ci, cj)},
			}
			for _, v := range views {
				if v.d < minContourDifference {
					t.Errorf("sets %d and %d: difference %.3f under %s, want at least %.2f", i, j, v.d, v.name, minContourDifference)
				}
			}
		}
	}
	if !sameColour(contourColour(n), contourColour(0)) {
		t.Errorf("set %d does not repeat the first look", n)
	}
}

func TestContourDashesDistinct(t *testing.T) {
	// Two patterns are told apart at a glance, even in greyscale, if
	// they have a different number of marks per repeat or if the
	// longest mark of one is at least twice that of the other (a rule
	// of thumb chosen for this test).
	marks := func(d []vg.Length) (n int, longest vg.Length) {
		for k := 0; k < len(d); k += 2 {
			n++
			longest = max(longest, d[k])
		}
		return n, longest
	}
	n := len(contourLooks)
	for i := 0; i < n; i++ {
		si := contourStyle(i)
		if len(si.Dashes) == 0 || len(si.Dashes)%2 != 0 {
			t.Fatalf("set %d: dash pattern %v is not pairs of mark and gap", i, si.Dashes)
		}
		for _, k := range kindOrder {
			b := curveStyle(k)
			if reflect.DeepEqual(si.Dashes, b.Dashes) {
				t.Errorf("set %d draws like a %v boundary: %v", i, kindNames[k], si.Dashes)
			}
			if si.Width > maxContourWidthShare*b.Width {
				t.Errorf("set %d: width %v too close to the %v boundary's %v", i, si.Width, kindNames[k], b.Width)
			}
		}
		for j := i + 1; j < n; j++ {
			ni, li := marks(si.Dashes)
			nj, lj := marks(contourStyle(j).Dashes)
			if ni == nj && max(li, lj) < 2*min(li, lj) {
				t.Errorf("sets %d and %d: %d marks each, longest %v and %v", i, j, ni, li, lj)
			}
		}
	}
}

func TestContourLegendAndLabelsMatchLines(t *testing.T) {
	// Every set in the legend shows its own stroke, in the order of
	// Figure.Contours, and every label of a set is written in its hue.
	f := isoFigure().withDefaults()
	lo, hi, _ := f.Shade.Range()
	scale := newShadeScale(lo, hi)
	var iso []legendEntry
	for _, s := range legendSections(&f, countColours(true), scale) {
		if s.heading == "Iso-lines" {
			iso = s.entries
		}
	}
	if len(iso) != len(f.Contours) {
		t.Fatalf("legend lists %d iso-line sets, want %d", len(iso), len(f.Contours))
	}
	for i, e := range iso {
		want := lineThumb{contourStyle(i)}
		if !reflect.DeepEqual(e.thumbs, []plot.Thumbnailer{want}) {
			t.Errorf("legend entry %q shows %v, want the stroke of set %d", e.text, e.thumbs, i)
		}
	}

	p, ann := buildPlot(&f, countColours(true), scale, 0)
	dc := draw.New(vgimg.New(f.Width, f.Height))
	data := p.DataCanvas(dc)
	trX, trY := p.Transforms(&data)
	seen := map[string]bool{}
	for _, l := range ann.place(data.Rectangle, trX, trY).labels {
		for i, cs := range f.Contours {
			if strings.HasPrefix(l.text, cs.Name+"=") {
				seen[cs.Name] = true
				if !sameColour(l.style.Color, contourLabelColour(i)) {
					t.Errorf("label %q in %v, want set %d's %v", l.text, l.style.Color, i, contourLabelColour(i))
				}
			}
		}
	}
	for _, cs := range f.Contours {
		if !seen[cs.Name] {
			t.Errorf("no label of set %q", cs.Name)
		}
	}
}
