package render

import (
	"flag"
	"image"
	"image/color"
	"image/png"
	"math"
	"os"
	"testing"

	"gainscape/regions/boundary"
	"gainscape/regions/grid"
	"gainscape/regions/isoline"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// writeSamples, when set, makes TestSampleImages write the sample figures
// and their greyscale copies to the system's temporary directory for
// inspection: go test ./render/ -run SampleImages -args -samples
var writeSamples = flag.Bool("samples", false, "write sample images to the temporary directory")

// Geometry of the synthetic map, made up for these tests: a stable disc
// (an ellipse in parameter units), a band with one right-half-plane root
// around it, a corner with two, a strip with three and a patch the test
// could not decide.
var (
	sampleX = plane.Axis{Param: "kp", Min: 0, Max: 6, N: 60}
	sampleY = plane.Axis{Param: "ki", Min: 0, Max: 4, N: 40}
)

const (
	discX, discY, discRX, discRY = 2.6, 1.9, 1.7, 1.3
	cornerX, cornerY             = 4.6, 3.0
)

// discR returns the normalised radius of (x, y) in the stable disc: below
// 1 inside.
func discR(x, y float64) float64 {
	return math.Hypot((x-discX)/discRX, (y-discY)/discRY)
}

// sampleMap builds the synthetic count map.
func sampleMap() *grid.Map { return sampleMapOn(sampleX, sampleY) }

// sampleMapOn builds the synthetic count map on the nodes of axes xa and
// ya, which should span the sample ranges.
func sampleMapOn(xa, ya plane.Axis) *grid.Map {
	m := grid.NewMap(xa, ya)
	for j := 0; j < ya.N; j++ {
		for i := 0; i < xa.N; i++ {
			x, y := xa.At(i), ya.At(j)
			var c int8 = 1
			switch {
			case x < 0.5 && y > 3.3:
				c = grid.Undecided
			case discR(x, y) < 1:
				c = 0
			case x > cornerX && y > cornerY:
				c = 2
			case x > cornerX+0.8 && y < 0.8:
				c = 3
			}
			m.RHP[j*xa.N+i] = c
		}
	}
	return m
}

// sampleCurves traces the edges of the synthetic map: the disc's upper
// arc as a complex-pair edge whose ω rises with the angle, its lower arc
// as a real-root edge, the two-root corner as complex-pair edges, and a
// vertical edge through infinity.
func sampleCurves() []boundary.Curve {
	arc := func(a0, a1 float64, n int, omega func(a float64) float64) []boundary.Point {
		pts := make([]boundary.Point, n)
		for k := range pts {
			a := a0 + (a1-a0)*float64(k)/float64(n-1)
			pts[k] = boundary.Point{X: discX + discRX*math.Cos(a), Y: discY + discRY*math.Sin(a), Omega: omega(a)}
		}
		return pts
	}
	line := func(x0, y0, x1, y1 float64, n int, w0, w1 float64) []boundary.Point {
		pts := make([]boundary.Point, n)
		for k := range pts {
			t := float64(k) / float64(n-1)
			pts[k] = boundary.Point{X: x0 + t*(x1-x0), Y: y0 + t*(y1-y0), Omega: w0 + t*(w1-w0)}
		}
		return pts
	}
	return []boundary.Curve{
		{Kind: stability.Complex, Points: arc(-0.35, math.Pi+0.35, 200, func(a float64) float64 { return 0.6 + 0.45*a })},
		{Kind: stability.Real, Points: arc(math.Pi+0.35, 2*math.Pi-0.35, 80, func(float64) float64 { return 0 })},
		{Kind: stability.Complex, Points: line(cornerX, 4.05, cornerX, cornerY, 30, 2.9, 2.4)},
		{Kind: stability.Complex, Points: line(cornerX, cornerY, 6.05, cornerY, 30, 2.4, 3.1)},
		{Kind: stability.Infinite, Points: line(cornerX+0.8, -0.05, cornerX+0.8, 0.8, 10, math.NaN(), math.NaN())},
		{Kind: stability.Real, Points: line(cornerX+0.8, 0.8, 6.05, 0.8, 10, 0, 0)},
	}
}

// contourOf traces the iso-lines of field at levels, as the caller of
// the package does.
func contourOf(field *Field, levels []float64, name string, look int) ContourSet {
	cs := ContourSet{Levels: levels, Name: name, Look: look}
	for _, level := range levels {
		cs.Lines = append(cs.Lines, isoline.Trace(field.XAxis, field.YAxis, field.Values, level))
	}
	return cs
}

// sampleField returns a field over the sample axes computed by f, NaN
// outside the stable disc.
func sampleField(name string, f func(r float64) float64) *Field {
	return sampleFieldOn(sampleX, sampleY, name, f)
}

// sampleFieldOn is sampleField on the nodes of axes xa and ya.
func sampleFieldOn(xa, ya plane.Axis, name string, f func(r float64) float64) *Field {
	fd := &Field{XAxis: xa, YAxis: ya, Name: name, Values: make([]float64, xa.N*ya.N)}
	for j := 0; j < ya.N; j++ {
		for i := 0; i < xa.N; i++ {
			r := discR(xa.At(i), ya.At(j))
			v := math.NaN()
			if r < 1 {
				v = f(r)
			}
			fd.Values[j*xa.N+i] = v
		}
	}
	return fd
}

// sampleFigure is the plain synthetic figure.
func sampleFigure() Figure {
	return Figure{
		Map:    sampleMap(),
		Curves: sampleCurves(),
		Title:  "plant 2.5(s+0.4)/(s(s+1.5)²(0.2s+1)) under PID",
		Notes:  []string{"fixed: kd = 0.5, tau = 0", "synthetic map for testing the renderer"},
		Marks:  []Mark{{X: 2.4, Y: 1.7, Label: "A"}, {X: 3.4, Y: 2.5, Label: "B (tuned)"}},
	}
}

// shadedFigure adds a decay-rate shading and sensitivity iso-lines.
func shadedFigure() Figure { return shadedFigureOn(sampleX, sampleY) }

// shadedFigureOn is shadedFigure with the map and fields on the nodes of
// axes xa and ya.
func shadedFigureOn(xa, ya plane.Axis) Figure {
	f := sampleFigure()
	f.Map = sampleMapOn(xa, ya)
	f.Shade = sampleFieldOn(xa, ya, "decay rate σ (1/s)", decayOfRadius)
	ms := sampleFieldOn(xa, ya, "Ms", msOfRadius)
	f.Contours = []ContourSet{contourOf(ms, []float64{1.8, 3}, "Ms", 0)}
	return f
}

// decayOfRadius is a made-up decay rate at normalised radius r in the
// stable disc; it falls to zero towards the disc's edge, as the real one
// does towards a stability boundary.
func decayOfRadius(r float64) float64 { return 0.9 * (1 - r*r) }

// msOfRadius is a made-up peak sensitivity at normalised radius r in the
// stable disc; it grows steeply towards the disc's edge, as Ms does
// towards a stability boundary.
func msOfRadius(r float64) float64 { return 1.2 + 0.5/(1.02-r) }

// isoFigure is the shaded figure with four iso-line sets, one of each
// look, crossing one another inside the stable disc: decay rate, a
// made-up damping ratio falling from left to right, Ms, and a fourth
// made-up quantity rising from bottom to top.
func isoFigure() Figure {
	f := shadedFigure()
	f.Title = "four iso-line sets over a shaded map"
	damping := &Field{XAxis: sampleX, YAxis: sampleY, Name: "ζ", Values: make([]float64, sampleX.N*sampleY.N)}
	fourth := &Field{XAxis: sampleX, YAxis: sampleY, Name: "q", Values: make([]float64, sampleX.N*sampleY.N)}
	for j := 0; j < sampleY.N; j++ {
		for i := 0; i < sampleX.N; i++ {
			x, y := sampleX.At(i), sampleY.At(j)
			z, q := math.NaN(), math.NaN()
			if discR(x, y) < 1 {
				z = 0.5 + 0.4*(x-discX)/discRX - 0.1*(y-discY)/discRY
				q = 0.5 + 0.4*(y-discY)/discRY + 0.1*(x-discX)/discRX
			}
			damping.Values[j*sampleX.N+i], fourth.Values[j*sampleX.N+i] = z, q
		}
	}
	ms := f.Contours[0]
	ms.Look = 2
	f.Contours = []ContourSet{
		contourOf(f.Shade, []float64{0.3, 0.6}, "σ", 0),
		contourOf(damping, []float64{0.4, 0.7}, "ζ", 1),
		ms,
		contourOf(fourth, []float64{0.4}, "q", 3),
	}
	return f
}

// TestSampleImages draws the sample figures to PNG and checks the stable
// colour appears; with -samples it keeps them, greyscale copies and SVG
// versions for viewing.
func TestSampleImages(t *testing.T) {
	for name, f := range map[string]Figure{
		"render-sample":       sampleFigure(),
		"render-sample-shade": shadedFigure(),
		"render-sample-dense": denseFigure(),
		"render-sample-iso":   isoFigure(),
	} {
		path := t.TempDir() + "/" + name + ".png"
		if *writeSamples {
			path = os.TempDir() + "/" + name + ".png"
		}
		if err := WriteFile(path, f); err != nil {
			t.Fatal(err)
		}
		img := readPNG(t, path)
		if name == "render-sample" && !hasColour(img, countColours(false).stable) {
			t.Errorf("%s: no pixel of the stable colour", name)
		}
		if *writeSamples {
			writeGrey(t, img, os.TempDir()+"/"+name+"-grey.png")
			if err := WriteFile(os.TempDir()+"/"+name+".svg", f); err != nil {
				t.Fatal(err)
			}
		}
	}
}

// readPNG decodes the PNG file at path.
func readPNG(t *testing.T, path string) image.Image {
	t.Helper()
	r, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer r.Close()
	img, err := png.Decode(r)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return img
}

// hasColour reports whether some pixel of img equals c exactly.
func hasColour(img image.Image, c color.Color) bool {
	want := color.RGBAModel.Convert(c)
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 2 {
		for x := b.Min.X; x < b.Max.X; x += 2 {
			if color.RGBAModel.Convert(img.At(x, y)) == want {
				return true
			}
		}
	}
	return false
}

// writeGrey writes img converted to grey by relative luminance.
func writeGrey(t *testing.T, img image.Image, path string) {
	t.Helper()
	b := img.Bounds()
	g := image.NewGray(b)
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			// Encode the luminance back to sRGB so the grey copy looks
			// as a greyscale print would.
			lin := luminance(img.At(x, y))
			g.SetGray(x, y, color.Gray{Y: uint8(255*srgbEncode(lin) + 0.5)})
		}
	}
	w, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	defer w.Close()
	if err := png.Encode(w, g); err != nil {
		t.Fatal(err)
	}
}

// srgbEncode applies the sRGB transfer curve to a linear value in [0, 1].
func srgbEncode(v float64) float64 {
	if v <= 0.0031308 {
		return 12.92 * v
	}
	return 1.055*math.Pow(v, 1/2.4) - 0.055
}

// denseFigure is a finer map with every count up to seven, wavy
// complex-pair edges between the bands and a long title, to check
// wrapping, the "or more" legend entry and crowded ω labels.
func denseFigure() Figure {
	x := plane.Axis{Param: "kp", Min: -1, Max: 1, N: 200}
	y := plane.Axis{Param: "kd", Min: 0, Max: 0.5, N: 150}
	m := grid.NewMap(x, y)
	band := func(xv float64, k int) float64 { return 0.06*float64(k) + 0.02*math.Sin(9*xv+float64(k)) }
	var curves []boundary.Curve
	for k := 1; k <= 7; k++ {
		pts := make([]boundary.Point, 400)
		for i := range pts {
			xv := x.Min + (x.Max-x.Min)*float64(i)/float64(len(pts)-1)
			pts[i] = boundary.Point{X: xv, Y: band(xv, k), Omega: 0.3*float64(k) + 0.1*xv}
		}
		curves = append(curves, boundary.Curve{Kind: stability.Complex, Points: pts})
	}
	for j := 0; j < y.N; j++ {
		for i := 0; i < x.N; i++ {
			var c int8
			for k := 1; k <= 7; k++ {
				if y.At(j) > band(x.At(i), k) {
					c = int8(k)
				}
			}
			m.RHP[j*x.N+i] = c
		}
	}
	return Figure{
		Map:    m,
		Curves: curves,
		Title:  "plant 1.7(s+0.25)(s+3)/(s(s+0.8)(s²+0.6s+2.5)(0.05s+1)²) under PID with derivative filter, swept over a wide range",
		Notes:  []string{"fixed: ki = 0.4, tau = 0.02", "caution: counts near kd = 0 rest on a nearly singular leading coefficient"},
	}
}
