package render

import (
	"bytes"
	"encoding/binary"
	"fmt"
	"hash/crc32"
	"image"
	"image/png"
	"io"
	"math"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgpdf"
	"gonum.org/v1/plot/vg/vgsvg"

	"gainscape/internal/safefile"
)

// svgFillDPI is the resolution of the image that holds the cell fills in
// SVG output: fine enough that a print of the default 16 cm figure shows
// no steps the vector edges over it do not already hide, yet small
// enough to keep a shaded map well under a megabyte.
const svgFillDPI = 200

// Write draws f and writes it to w in format "png", "svg" or "pdf". A
// PNG image records its resolution (f.DPI), so that a word processor
// inserts it at the size it was drawn for; SVG and PDF are vector
// formats whose cell fills are embedded as images of svgFillDPI.
func Write(w io.Writer, format string, f Figure) error {
	if err := f.check(); err != nil {
		return err
	}
	f = f.withDefaults()
	cv, fillDPI, err := newCanvas(format, f.Width, f.Height, f.DPI)
	if err != nil {
		return err
	}
	drawFigure(draw.New(cv), &f, fillDPI)
	_, err = cv.WriteTo(w)
	return err
}

// newCanvas returns a canvas of the given size writing format ("png",
// "svg" or "pdf", dpi the PNG resolution) and the resolution of the
// image that holds cell fills: 0 for PNG, whose fills are drawn
// directly, svgFillDPI for the vector formats.
func newCanvas(format string, width, height vg.Length, dpi int) (vg.CanvasWriterTo, int, error) {
	switch format {
	case "png":
		return pngCanvas{vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseDPI(dpi))}, dpi}, 0, nil
	case "svg":
		return svgCanvas{vgsvg.New(width, height)}, svgFillDPI, nil
	case "pdf":
		pc := vgpdf.New(width, height)
		pc.EmbedFonts(true)
		return pdfCanvas{pc}, svgFillDPI, nil
	}
	return nil, 0, fmt.Errorf("render: unknown image format %q; want \"png\", \"svg\" or \"pdf\"", format)
}

// pngCanvas is a PNG canvas that writes its resolution into the file, as
// the pHYs chunk of the PNG standard (ISO/IEC 15948, Sec. 11.3.5.3):
// pixels per metre in both directions, right after the header chunk.
type pngCanvas struct {
	vgimg.PngCanvas
	dpi int
}

// WriteTo writes the PNG image with its pHYs chunk: an opaque canvas
// by writeOpaquePNG, any other through image/png, compressed for speed.
func (c pngCanvas) WriteTo(w io.Writer) (int64, error) {
	if img, ok := c.Image().(*image.RGBA); ok {
		cw := &countingWriter{w: w}
		if done, err := writeOpaquePNG(cw, img, c.dpi); done || err != nil {
			return cw.n, err
		}
	}
	var buf bytes.Buffer
	enc := png.Encoder{CompressionLevel: png.BestSpeed}
	if err := enc.Encode(&buf, c.Image()); err != nil {
		return 0, err
	}
	b := buf.Bytes()
	// The 8-byte signature and the 25-byte IHDR chunk come first.
	const ihdrEnd = 8 + 25
	if len(b) < ihdrEnd || string(b[12:16]) != "IHDR" {
		return 0, fmt.Errorf("render: the PNG encoder wrote no header")
	}
	ppm := uint32(math.Round(float64(c.dpi) / 0.0254))
	chunk := make([]byte, 0, 21)
	chunk = binary.BigEndian.AppendUint32(chunk, 9)
	chunk = append(chunk, "pHYs"...)
	chunk = binary.BigEndian.AppendUint32(chunk, ppm)
	chunk = binary.BigEndian.AppendUint32(chunk, ppm)
	chunk = append(chunk, 1) // unit: the metre
	chunk = binary.BigEndian.AppendUint32(chunk, crc32.ChecksumIEEE(chunk[4:]))
	out := append(append(append([]byte(nil), b[:ihdrEnd]...), chunk...), b[ihdrEnd:]...)
	n, err := w.Write(out)
	return int64(n), err
}

// countingWriter counts the bytes written through it.
type countingWriter struct {
	w io.Writer
	n int64
}

func (c *countingWriter) Write(p []byte) (int, error) {
	n, err := c.w.Write(p)
	c.n += int64(n)
	return n, err
}

// svgCanvas is an SVG canvas whose embedded images read alike in every
// SVG reader. The vgsvg canvas encodes every image as PNG but labels the
// data "image/jpg", which browsers look past but librsvg, among others,
// does not; and it leaves the SVG default of keeping the image's aspect
// ratio, so the 1-pixel-wide picture of the shading scale was drawn as a
// hairline in the middle of its bar. WriteTo relabels the images as
// "image/png" and stretches each to its rectangle, as the raster canvas
// does.
type svgCanvas struct{ *vgsvg.Canvas }

// svgFixes are the replacements WriteTo makes. Text on the canvas cannot
// produce either pattern: vgsvg escapes the "<" and the quotation mark
// in it.
var svgFixes = []struct{ old, new []byte }{
	{[]byte(`xlink:href="data:image/jpg;base64,`), []byte(`xlink:href="data:image/png;base64,`)},
	{[]byte(`<image `), []byte(`<image preserveAspectRatio="none" `)},
}

// WriteTo writes the SVG document to w with its images fixed.
func (c svgCanvas) WriteTo(w io.Writer) (int64, error) {
	var buf bytes.Buffer
	if _, err := c.Canvas.WriteTo(&buf); err != nil {
		return 0, err
	}
	b := buf.Bytes()
	for _, f := range svgFixes {
		b = bytes.ReplaceAll(b, f.old, f.new)
	}
	n, err := w.Write(b)
	return int64(n), err
}

// WriteFile draws f to the file at path, in the format its extension
// names (.png, .svg or .pdf, in any letter case). It writes to a temporary file
// in the same directory and renames it into place, so a failure never
// leaves a partial image at path.
func WriteFile(path string, f Figure) error {
	ext := filepath.Ext(path)
	format := strings.ToLower(strings.TrimPrefix(ext, "."))
	if format != "png" && format != "svg" && format != "pdf" {
		return fmt.Errorf("render: %s: unknown image extension %q; use .png, .svg or .pdf", path, ext)
	}
	if err := f.check(); err != nil {
		return fmt.Errorf("%w (writing %s)", err, path)
	}
	if err := safefile.Write(path, func(w io.Writer) error { return Write(w, format, f) }); err != nil {
		return fmt.Errorf("render: %w", err)
	}
	return nil
}
