package render

import (
	"image/color"
	"math"
	"testing"

	"github.com/lucasb-eyer/go-colorful"
)

// Thresholds for the region shades, in the units go-colorful uses.
const (
	// minStableContrast is the least difference in relative luminance
	// (0 black, 1 white) between the stable shade and any unstable one. A
	// quarter of the full range is chosen because office printers and
	// copiers reproduce grey in coarse halftone steps and commonly blur
	// tints closer than about a tenth of the range (common practice); a
	// quarter keeps the stable region unmistakable after copying.
	minStableContrast = 0.25
	// minCountStep is the least CIE L* step between the shades of
	// consecutive counts, on go-colorful's 0–1 scale (6 L* units). About
	// five L* units is the smallest step reliably told apart between large
	// neighbouring patches on paper (common practice).
	minCountStep = 0.06
	// minCountColourStep is the least CIEDE2000 difference between the
	// shades of consecutive counts, on go-colorful's 0–1 scale: five
	// units, several times the just-noticeable difference of about one
	// unit between large neighbouring patches (common practice). It is
	// below minCountStep because CIEDE2000 weighs a lightness step less
	// away from mid-grey.
	minCountColourStep = 0.05
	// minShadeGap is the least L* by which the darkest end of the shading
	// scale stays lighter than the lightest muted unstable shade, so the
	// shaded stable region never matches an unstable one in greyscale.
	minShadeGap = 0.05
	// maxMutedChroma is the most CIE-LCh chroma a muted shade may have,
	// on go-colorful's scale; at about a fifth of the stable shading's
	// strongest chroma the unstable region reads as grey beside it.
	maxMutedChroma = 0.08
)

func TestRegionShadesInGreyscale(t *testing.T) {
	rc := countColours(false)
	stableY := luminance(rc.count(0))
	for k := 1; k <= distinctCounts; k++ {
		y := luminance(rc.count(k))
		if d := stableY - y; d < minStableContrast {
			t.Errorf("count %d: luminance %.3f, only %.3f below stable %.3f; want at least %.2f", k, y, d, stableY, minStableContrast)
		}
		if k > 1 {
			prev, cur := lightness(rc.count(k-1)), lightness(rc.count(k))
			if prev-cur < minCountStep {
				t.Errorf("counts %d and %d: L* %.3f and %.3f differ by less than %.2f", k-1, k, prev, cur, minCountStep)
			}
		}
	}
	if got, want := rc.count(distinctCounts+3), rc.count(distinctCounts); !sameColour(got, want) {
		t.Errorf("count %d has its own shade; counts above %d should share the darkest", distinctCounts+3, distinctCounts)
	}
	if sameColour(rc.count(-1), rc.count(0)) {
		t.Error("undecided ground equals the stable shade")
	}
}

func TestMutedShadesBelowShadeScale(t *testing.T) {
	muted := countColours(true)
	scale := newShadeScale(0, 1)
	darkest := lightness(scale.colourAt(1))
	for k := 1; k <= distinctCounts; k++ {
		l := lightness(muted.count(k))
		if darkest-l < minShadeGap {
			t.Errorf("muted count %d: L* %.3f within %.2f of the darkest shade %.3f", k, l, minShadeGap, darkest)
		}
		if c := chroma(muted.count(k)); c > maxMutedChroma {
			t.Errorf("muted count %d: chroma %.3f, above %.2f; it no longer reads as muted", k, c, maxMutedChroma)
		}
	}
	// The scale itself must darken monotonically to read in greyscale.
	prev := math.Inf(1)
	for i := 0; i <= 20; i++ {
		l := lightness(scale.colourAt(float64(i) / 20))
		if l >= prev {
			t.Fatalf("shade scale lightness rises at step %d: %.4f after %.4f", i, l, prev)
		}
		prev = l
	}
}

func TestMutedShadesStepDown(t *testing.T) {
	// Neighbouring unstable regions of a shaded map, such as one and two
	// roots, must be told apart in greyscale (by L*) and in colour (by
	// CIEDE2000).
	muted := countColours(true)
	for k := 2; k <= distinctCounts; k++ {
		prev, cur := muted.count(k-1), muted.count(k)
		if d := lightness(prev) - lightness(cur); d < minCountStep {
			t.Errorf("muted counts %d and %d: L* %.3f and %.3f differ by %.3f, want at least %.2f", k-1, k, lightness(prev), lightness(cur), d, minCountStep)
		}
		a, _ := colorful.MakeColor(prev)
		b, _ := colorful.MakeColor(cur)
		if d := a.DistanceCIEDE2000(b); d < minCountColourStep {
			t.Errorf("muted counts %d and %d: colour difference %.3f, want at least %.2f", k-1, k, d, minCountColourStep)
		}
	}
	if got, want := muted.count(distinctCounts+2), muted.count(distinctCounts); !sameColour(got, want) {
		t.Errorf("muted count %d has its own shade; counts above %d should share the darkest", distinctCounts+2, distinctCounts)
	}
}

func TestShadeScaleRange(t *testing.T) {
	s := newShadeScale(-2, 3)
	for _, v := range []float64{-2, 0, 3} {
		if _, err := s.At(v); err != nil {
			t.Errorf("At(%v): %v", v, err)
		}
	}
	for _, v := range []float64{-2.1, 3.1, math.NaN()} {
		if _, err := s.At(v); err == nil {
			t.Errorf("At(%v): no error outside [-2, 3]", v)
		}
	}
	if n := len(s.Palette(7).Colors()); n != 7 {
		t.Errorf("Palette(7) has %d colours", n)
	}
	flat := newShadeScale(4, 4)
	if !(flat.Min() < 4 && flat.Max() > 4) {
		t.Errorf("constant field gives scale [%v, %v]; want one around 4", flat.Min(), flat.Max())
	}
}

// luminance returns the relative luminance (Rec. 709 weights on linear
// RGB) of c, the quantity a greyscale conversion keeps.
func luminance(c color.Color) float64 {
	cf, _ := colorful.MakeColor(c)
	r, g, b := cf.LinearRgb()
	return 0.2126*r + 0.7152*g + 0.0722*b
}

// lightness returns the CIE L* of c on a 0–1 scale.
func lightness(c color.Color) float64 {
	cf, _ := colorful.MakeColor(c)
	l, _, _ := cf.Lab()
	return l
}

// chroma returns the CIE-LCh chroma of c on go-colorful's scale.
func chroma(c color.Color) float64 {
	cf, _ := colorful.MakeColor(c)
	_, ch, _ := cf.Hcl()
	return ch
}
