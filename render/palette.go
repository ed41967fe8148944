package render

import (
	"image/color"
	"math"

	"github.com/lucasb-eyer/go-colorful"
	"gonum.org/v1/plot/palette"
)

// The region colours carry their meaning in CIE lightness L* first and in
// hue second, so a greyscale print or a reader with any form of colour
// vision deficiency still sees the order: the stable region is the
// lightest shade and every further right-half-plane root makes the cell
// darker. Hue only helps readers with full colour vision: a cool
// blue-green for stable, warm amber through brick red for unstable.

// distinctCounts is the largest right-half-plane count with a shade of its
// own; higher counts share the darkest shade.
const distinctCounts = 6

// hcl returns the colour of CIE-LCh hue h (degrees), chroma c and
// lightness l (both on go-colorful's 0–1 scale). If the colour lies
// outside the sRGB gamut, chroma is reduced until it fits, so lightness
// and hue stay exactly as asked.
func hcl(h, c, l float64) colorful.Color {
	col := colorful.Hcl(h, c, l)
	for !col.IsValid() && c > 0.001 {
		c *= 0.97
		col = colorful.Hcl(h, c, l)
	}
	return col.Clamped()
}

// regionColours are the fills of the count map.
type regionColours struct {
	stable    color.Color
	unstable  [distinctCounts]color.Color // unstable[k-1] is k roots
	undecided color.Color                 // ground under the hatching
	// marginal fills nodes on an edge: a violet of middle lightness that
	// no count's shade has, darker than the stable fill and lighter than
	// the edge lines drawn over it.
	marginal color.Color
}

// mutedLightness holds the CIE L* (0–1) of the muted shades, index k-1
// for k roots. The counts most maps show step down by 0.08 and 0.075,
// the rest by 0.07 and 0.065, so even in greyscale each count is a
// clearly different grey. The lightest stays 0.08 below the darkest end
// of the shading scale (0.72) and the darkest stays light enough for the
// black boundary curves, cased in white, to read against it.
var mutedLightness = [distinctCounts]float64{0.64, 0.56, 0.485, 0.415, 0.35, 0.285}

// countColours returns the fills for a plain map. With muted set, used
// when a Field shades the stable region, the unstable shades keep their
// order but become warm greys of low chroma, all darker than the whole
// shading scale, so the shaded stable region stands out and never looks
// like an unstable one; their hue drifts from sand towards umber as the
// count rises, a second cue beside lightness for readers with colour
// vision.
func countColours(muted bool) regionColours {
	rc := regionColours{
		stable:    hcl(200, 0.20, 0.94),
		undecided: color.White,
		marginal:  hcl(310, 0.30, 0.52),
	}
	for k := 1; k <= distinctCounts; k++ {
		f := float64(k - 1)
		if muted {
			rc.unstable[k-1] = hcl(80-9*f, 0.035+0.008*f, mutedLightness[k-1])
		} else {
			rc.unstable[k-1] = hcl(82-13*f, 0.34-0.01*f, 0.76-0.075*f)
		}
	}
	return rc
}

// count returns the fill for a cell with k right-half-plane roots, or
// the undecided ground for k < 0.
func (rc regionColours) count(k int) color.Color {
	switch {
	case k < 0:
		return rc.undecided
	case k == 0:
		return rc.stable
	case k > distinctCounts:
		k = distinctCounts
	}
	return rc.unstable[k-1]
}

// shadeScale is the continuous scale that shades a Field inside the
// stable region. Low values are nearly white with a hint of blue-green;
// high values are a deeper, more saturated blue. Lightness falls
// linearly from 0.97 to 0.72, so the scale reads in greyscale and stays
// lighter than every muted unstable shade (0.64 and below).
type shadeScale struct {
	min, max float64
	alpha    float64
}

var _ palette.ColorMap = (*shadeScale)(nil)

// newShadeScale returns the scale over [min, max].
func newShadeScale(min, max float64) *shadeScale {
	if min == max {
		min, max = min-0.5, max+0.5
	}
	return &shadeScale{min: min, max: max, alpha: 1}
}

// colourAt returns the colour at fraction t of the way from min to max.
func (s *shadeScale) colourAt(t float64) color.Color {
	t = math.Max(0, math.Min(1, t))
	c := hcl(195+60*t, 0.07+0.30*t, 0.97-0.25*t)
	r, g, b := c.RGB255()
	return color.NRGBA{R: r, G: g, B: b, A: uint8(255*s.alpha + 0.5)}
}

// At returns the colour of value v; it is an error for v outside the
// scale's range, as palette.ColorMap requires.
func (s *shadeScale) At(v float64) (color.Color, error) {
	switch {
	case math.IsNaN(v):
		return nil, palette.ErrNaN
	case v < s.min:
		return nil, palette.ErrUnderflow
	case v > s.max:
		return nil, palette.ErrOverflow
	}
	return s.colourAt((v - s.min) / (s.max - s.min)), nil
}

// Min returns the lower end of the scale.
func (s *shadeScale) Min() float64 { return s.min }

// Max returns the upper end of the scale.
func (s *shadeScale) Max() float64 { return s.max }

// SetMin sets the lower end of the scale.
func (s *shadeScale) SetMin(v float64) { s.min = v }

// SetMax sets the upper end of the scale.
func (s *shadeScale) SetMax(v float64) { s.max = v }

// Alpha returns the opacity of the scale's colours.
func (s *shadeScale) Alpha() float64 { return s.alpha }

// SetAlpha sets the opacity of the scale's colours.
func (s *shadeScale) SetAlpha(a float64) {
	if a < 0 || a > 1 {
		panic("render: alpha outside [0, 1]")
	}
	s.alpha = a
}

// Palette returns n colours evenly spread over the scale.
func (s *shadeScale) Palette(n int) palette.Palette {
	cols := make([]color.Color, n)
	for i := range cols {
		t := 0.0
		if n > 1 {
			t = float64(i) / float64(n-1)
		}
		cols[i] = s.colourAt(t)
	}
	return colourList(cols)
}

// colourList is a fixed palette.Palette.
type colourList []color.Color

// Colors returns the list.
func (l colourList) Colors() []color.Color { return l }
