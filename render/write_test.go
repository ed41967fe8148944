package render

import (
	"bytes"
	"encoding/base64"
	"encoding/xml"
	"image"
	"image/color"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"

	"gainscape/regions/grid"
	"gainscape/regions/plane"
)

// pixels returns the pixel count of length l at dpi, rounded as the
// image canvas rounds it.
func pixels(l vg.Length, dpi int) int {
	return int(float64(l/vg.Inch)*float64(dpi) + 0.5)
}

func TestWritePNGSize(t *testing.T) {
	tests := []struct {
		name         string
		w, h         vg.Length
		dpi          int
		wantW, wantH int
	}{
		// 16 cm = 6.299 in; at 200 dpi that is 1259.8 px, rounded 1260.
		// 12 cm = 4.724 in gives 944.9 px, rounded 945.
		{"defaults", 0, 0, 0, 1260, 945},
		// 10 cm at 100 dpi is 393.7 px; 8 cm is 315.0 px.
		{"custom", 10 * vg.Centimeter, 8 * vg.Centimeter, 100, 394, 315},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f := sampleFigure()
			f.Width, f.Height, f.DPI = tc.w, tc.h, tc.dpi
			var buf bytes.Buffer
			if err := Write(&buf, "png", f); err != nil {
				t.Fatal(err)
			}
			img, err := png.Decode(&buf)
			if err != nil {
				t.Fatalf("output is not a PNG: %v", err)
			}
			if got := img.Bounds().Size(); got.X != tc.wantW || got.Y != tc.wantH {
				t.Errorf("size %v, want %dx%d", got, tc.wantW, tc.wantH)
			}
		})
	}
	if got := pixels(DefaultWidth, DefaultDPI); got != 1260 {
		t.Errorf("pixels(DefaultWidth) = %d, want 1260", got)
	}
}

func TestWriteSVG(t *testing.T) {
	f := shadedFigure()
	f.XLabel = "proportional gain kp"
	var buf bytes.Buffer
	if err := Write(&buf, "svg", f); err != nil {
		t.Fatal(err)
	}
	svg := buf.String()
	if !strings.HasPrefix(svg, "<?xml") && !strings.HasPrefix(svg, "<svg") {
		t.Fatalf("output starts %q, want an XML declaration or <svg", svg[:min(len(svg), 20)])
	}
	for _, want := range []string{"proportional gain kp", ">ki<", "decay rate σ (1/s)", "ω=", "Ms=3", "B (tuned)", "1 root in RHP"} {
		if !strings.Contains(svg, want) {
			t.Errorf("SVG lacks %q", want)
		}
	}
	// Every path must open with a move: SVG viewers drop a path that
	// starts with a line or an arc, as the mark circles once did.
	if strings.Contains(svg, `<path d="L`) || strings.Contains(svg, `<path d="A`) {
		t.Error("SVG has a path that does not start with a move")
	}
	d := xml.NewDecoder(strings.NewReader(svg))
	for {
		_, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
	}
}

func TestWriteUnknownFormat(t *testing.T) {
	err := Write(io.Discard, "jpeg", sampleFigure())
	if err == nil || !strings.Contains(err.Error(), `"jpeg"`) {
		t.Errorf("Write(jpeg) error = %v, want one naming the format", err)
	}
}

func TestWriteFileFailuresLeaveNothing(t *testing.T) {
	tests := []struct {
		name string
		rel  string // path relative to a fresh directory
	}{
		{"unknown extension", "map.jpeg"},
		{"no extension", "map"},
		{"missing directory", filepath.Join("absent", "map.png")},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			path := filepath.Join(dir, tc.rel)
			err := WriteFile(path, sampleFigure())
			if err == nil {
				t.Fatal("no error")
			}
			if !strings.Contains(err.Error(), path) {
				t.Errorf("error %q does not name %s", err, path)
			}
			if _, err := os.Stat(path); !os.IsNotExist(err) {
				t.Errorf("%s exists after a failed write", path)
			}
			if left, _ := os.ReadDir(dir); len(left) != 0 {
				t.Errorf("directory holds %d entries after a failed write, e.g. %s", len(left), left[0].Name())
			}
		})
	}
}

func TestWriteFileBadDataKeepsOldFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "map.png")
	old := []byte("previous image")
	if err := os.WriteFile(path, old, 0o644); err != nil {
		t.Fatal(err)
	}
	bad := sampleFigure()
	bad.Map = &grid.Map{XAxis: sampleX, YAxis: sampleY, RHP: make([]int8, 5)}
	err := WriteFile(path, bad)
	if err == nil || !strings.Contains(err.Error(), path) {
		t.Fatalf("error = %v, want one naming %s", err, path)
	}
	got, _ := os.ReadFile(path)
	if !bytes.Equal(got, old) {
		t.Errorf("failed write changed %s", path)
	}
	if left, _ := os.ReadDir(dir); len(left) != 1 {
		t.Errorf("directory holds %d entries, want only map.png", len(left))
	}
}

func TestWriteFileReplaces(t *testing.T) {
	dir := t.TempDir()
	for _, name := range []string{"map.png", "MAP.SVG"} {
		path := filepath.Join(dir, name)
		if err := os.WriteFile(path, []byte("stale"), 0o644); err != nil {
			t.Fatal(err)
		}
		if err := WriteFile(path, sampleFigure()); err != nil {
			t.Fatal(err)
		}
		b, err := os.ReadFile(path)
		if err != nil {
			t.Fatal(err)
		}
		switch filepath.Ext(name) {
		case ".png":
			if _, err := png.Decode(bytes.NewReader(b)); err != nil {
				t.Errorf("%s is not a PNG: %v", name, err)
			}
		default:
			if !bytes.HasPrefix(b, []byte("<?xml")) && !bytes.HasPrefix(b, []byte("<svg")) {
				t.Errorf("%s is not an SVG", name)
			}
		}
	}
	if left, _ := os.ReadDir(dir); len(left) != 2 {
		t.Errorf("directory holds %d entries, want the 2 images only", len(left))
	}
}

func TestWriteRejectsBadData(t *testing.T) {
	okField := func() *Field { return sampleField("σ", func(r float64) float64 { return r }) }
	tests := []struct {
		name   string
		modify func(f *Figure)
		want   string // part of the error message
	}{
		{"no map", func(f *Figure) { f.Map = nil }, "no map"},
		{"short counts", func(f *Figure) { f.Map.RHP = f.Map.RHP[:10] }, "10 counts"},
		{"single node axis", func(f *Figure) {
			f.Map = grid.NewMap(plane.Axis{Param: "kp", Min: 0, Max: 1, N: 1}, sampleY)
		}, `"kp" has 1 nodes`},
		{"empty range", func(f *Figure) {
			f.Map = grid.NewMap(sampleX, plane.Axis{Param: "ki", Min: 2, Max: 2, N: 40})
		}, "[2, 2]"},
		{"shade size", func(f *Figure) { f.Shade = okField(); f.Shade.Values = f.Shade.Values[:3] }, "3 values"},
		{"contour lines missing", func(f *Figure) { f.Contours = []ContourSet{{Name: "Ms", Levels: []float64{1.4}}} }, `("Ms") has 0 line sets for 1 levels`},
		{"negative size", func(f *Figure) { f.Width = -1 }, "negative"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f := sampleFigure()
			tc.modify(&f)
			err := Write(io.Discard, "png", f)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error = %v, want one containing %q", err, tc.want)
			}
		})
	}
}

func TestStableOnlyHidesUnstableNodes(t *testing.T) {
	m := sampleMap()
	s := stableOnly{sampleField("σ", func(float64) float64 { return 1 }), m}
	for j := 0; j < sampleY.N; j++ {
		for i := 0; i < sampleX.N; i++ {
			v := s.Z(i, j)
			if stable := m.Count(i, j) == 0; stable == math.IsNaN(v) {
				t.Fatalf("node (%d, %d): count %d, shaded value %v", i, j, m.Count(i, j), v)
			}
		}
	}
}

// svgImages returns the attributes of every <image> element of an SVG
// document, in document order, and the decoded PNG each embeds.
func svgImages(t *testing.T, svg string) ([]map[string]string, []image.Image) {
	t.Helper()
	var attrs []map[string]string
	var imgs []image.Image
	for _, m := range regexp.MustCompile(`<image ([^>]*)/>`).FindAllStringSubmatch(svg, -1) {
		a := map[string]string{}
		for _, kv := range regexp.MustCompile(`([\w:]+)="([^"]*)"`).FindAllStringSubmatch(m[1], -1) {
			a[kv[1]] = kv[2]
		}
		const prefix = "data:image/png;base64,"
		href := a["xlink:href"]
		if !strings.HasPrefix(href, prefix) {
			t.Fatalf("image data starts %q, want %q", href[:min(len(href), 30)], prefix)
		}
		raw, err := base64.StdEncoding.DecodeString(href[len(prefix):])
		if err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(bytes.NewReader(raw))
		if err != nil {
			t.Fatal(err)
		}
		attrs, imgs = append(attrs, a), append(imgs, img)
	}
	return attrs, imgs
}

func TestSVGShadedMapIsSmall(t *testing.T) {
	// A shaded 400×300 map once took 3.9 MB as one SVG rectangle per
	// cell. With the fills as one embedded image it must stay below 1 MB,
	// while the text and the lines stay vector shapes.
	const limit = 1 << 20
	xa, ya := sampleX, sampleY
	xa.N, ya.N = 400, 300
	f := shadedFigureOn(xa, ya)
	f.XLabel = "proportional gain kp"
	var buf bytes.Buffer
	if err := Write(&buf, "svg", f); err != nil {
		t.Fatal(err)
	}
	svg := buf.String()
	if buf.Len() >= limit {
		t.Errorf("SVG of a shaded 400×300 map takes %d bytes, want under %d", buf.Len(), limit)
	}
	for _, want := range []string{"<text", "proportional gain kp", "decay rate σ (1/s)", "1 root in RHP", "Ms=1.8", "ω=", "B (tuned)"} {
		if !strings.Contains(svg, want) {
			t.Errorf("SVG lacks %q", want)
		}
	}
	// The fills and the shading scale's bar are the only pictures; a
	// path per cell would mean the fills were drawn as vectors again.
	attrs, _ := svgImages(t, svg)
	if len(attrs) != 2 {
		t.Errorf("SVG embeds %d images, want 2 (fills and scale bar)", len(attrs))
	}
	for i, a := range attrs {
		if a["preserveAspectRatio"] != "none" {
			t.Errorf("image %d keeps its aspect ratio, so it may not fill its rectangle", i)
		}
	}
	if n, cells := strings.Count(svg, "<path"), xa.N*ya.N; n > cells/20 {
		t.Errorf("SVG has %d paths for %d cells; the fills are not one image", n, cells)
	}
}

func TestSVGFillImageMatchesCells(t *testing.T) {
	// Each cell's centre in the embedded fill image must have the cell's
	// colour: the muted count shade, or the shading colour of its value
	// where the map is stable. This fixes the image's orientation too:
	// the undecided corner is at the top left.
	f := shadedFigure()
	var buf bytes.Buffer
	if err := Write(&buf, "svg", f); err != nil {
		t.Fatal(err)
	}
	attrs, imgs := svgImages(t, buf.String())
	if len(imgs) == 0 {
		t.Fatal("SVG embeds no image")
	}
	a, img := attrs[0], imgs[0]
	b := img.Bounds()
	w, _ := strconv.ParseFloat(a["width"], 64)
	h, _ := strconv.ParseFloat(a["height"], 64)
	// The image covers the data area at svgFillDPI; its pixel counts are
	// rounded up.
	if px := w / 72 * svgFillDPI; math.Abs(float64(b.Dx())-px) > 1 {
		t.Errorf("fill image is %d pixels wide for %.1f pt; want %.0f at %d dpi", b.Dx(), w, px, svgFillDPI)
	}
	if px := h / 72 * svgFillDPI; math.Abs(float64(b.Dy())-px) > 1 {
		t.Errorf("fill image is %d pixels high for %.1f pt; want %.0f at %d dpi", b.Dy(), h, px, svgFillDPI)
	}
	lo, hi, _ := f.Shade.Range()
	scale := newShadeScale(lo, hi)
	rc := countColours(true)
	shade := stableOnly{f.Shade, f.Map}
	nx, ny := f.Map.XAxis.N, f.Map.YAxis.N
	// The image holds 8 bits per channel, the colours up to 16.
	eight := func(c color.Color) color.Color { return color.RGBAModel.Convert(c) }
	bad := 0
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			want := rc.count(f.Map.Count(i, j))
			if v := shade.Z(i, j); !math.IsNaN(v) {
				want, _ = scale.At(v)
			}
			x := b.Min.X + int((float64(i)+0.5)/float64(nx)*float64(b.Dx()))
			y := b.Min.Y + int((float64(ny-1-j)+0.5)/float64(ny)*float64(b.Dy()))
			if got := img.At(x, y); !sameColour(eight(got), eight(want)) {
				if bad++; bad <= 5 {
					t.Errorf("cell (%d, %d) at pixel (%d, %d): %v, want %v", i, j, x, y, eight(got), eight(want))
				}
			}
		}
	}
	if bad > 5 {
		t.Errorf("and %d more cells", bad-5)
	}
}
