package render

import (
	"image"

	stdfont "golang.org/x/image/font"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/vgpdf"
)

// pdfCanvas is a PDF canvas that sets every character and every weight
// right. The vgpdf canvas registers each face it embeds under the
// regular style but selects a bold or italic face by its style, which it
// never registered ("undefined font"), and writes text in a single-byte
// code page, so that σ, ω, ≤, ± and even the ellipsis come out as other
// characters. pdfCanvas draws bold and italic text, and any text holding
// a character beyond ASCII, as the glyph outlines of its face, filled,
// which every reader shows alike (such text is not selectable in the
// PDF); plain ASCII text in the regular face stays text. It also
// corrects vgpdf's images, which come out upside down.
type pdfCanvas struct{ *vgpdf.Canvas }

// DrawImage implements vg.Canvas. The vgpdf canvas draws an image
// upside down within its rectangle; pdfCanvas hands it the image flipped
// top to bottom, so that it comes out as given.
func (c pdfCanvas) DrawImage(r vg.Rectangle, img image.Image) { c.Canvas.DrawImage(r, flipped(img)) }

// flipped returns img upside down.
func flipped(img image.Image) image.Image {
	b := img.Bounds()
	out := image.NewNRGBA(b)
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			out.Set(x, b.Max.Y-1-(y-b.Min.Y), img.At(x, y))
		}
	}
	return out
}

// FillString implements vg.Canvas.
func (c pdfCanvas) FillString(f font.Face, pt vg.Point, s string) {
	if f.Font.Weight != stdfont.WeightNormal || f.Font.Style != stdfont.StyleNormal {
		c.fillOutlines(f, pt, s)
		return
	}
	for _, r := range s {
		if r > 0x7e {
			c.fillOutlines(f, pt, s)
			return
		}
	}
	c.Canvas.FillString(f, pt, s)
}

// fillOutlines fills the glyph outlines of s in face f, the baseline
// starting at pt, with the current colour: advances and kerning from the
// face, at its size.
func (c pdfCanvas) fillOutlines(f font.Face, pt vg.Point, s string) {
	var buf sfnt.Buffer
	units := f.Face.UnitsPerEm()
	// Loaded at one pixel per font unit, outlines and advances are in
	// font units (as 26.6 fixed point); scale turns them into lengths.
	ppem := fixed.I(int(units))
	scale := f.Font.Size / vg.Length(units) / 64
	at := func(x vg.Length, p fixed.Point26_6) vg.Point {
		// The face's y axis points down, the canvas's up.
		return vg.Point{X: x + vg.Length(p.X)*scale, Y: pt.Y - vg.Length(p.Y)*scale}
	}
	x := pt.X
	var prev sfnt.GlyphIndex
	for i, r := range s {
		g, err := f.Face.GlyphIndex(&buf, r)
		if err != nil {
			continue
		}
		if i > 0 {
			if k, err := f.Face.Kern(&buf, prev, g, ppem, stdfont.HintingNone); err == nil {
				x += vg.Length(k) * scale
			}
		}
		segs, err := f.Face.LoadGlyph(&buf, g, ppem, nil)
		if err == nil && len(segs) > 0 {
			var p vg.Path
			for _, sg := range segs {
				switch sg.Op {
				case sfnt.SegmentOpMoveTo:
					if len(p) > 0 {
						p.Close()
					}
					p.Move(at(x, sg.Args[0]))
				case sfnt.SegmentOpLineTo:
					p.Line(at(x, sg.Args[0]))
				case sfnt.SegmentOpQuadTo:
					p.QuadTo(at(x, sg.Args[0]), at(x, sg.Args[1]))
				case sfnt.SegmentOpCubeTo:
					p.CubeTo(at(x, sg.Args[0]), at(x, sg.Args[1]), at(x, sg.Args[2]))
				}
			}
			p.Close()
			c.Fill(p)
		}
		if adv, err := f.Face.GlyphAdvance(&buf, g, ppem, stdfont.HintingNone); err == nil {
			x += vg.Length(adv) * scale
		}
		prev = g
	}
}
