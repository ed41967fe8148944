package render

import (
	"bytes"
	"image"
	"image/color"
	"image/png"
	"math/rand/v2"
	"testing"
)

// TestWriteOpaquePNG writes a random opaque image and a sub-image of it,
// decodes both with image/png and compares every pixel; the pHYs chunk
// records 200 dots per inch as 7874 pixels per metre. A transparent
// pixel makes it decline.
func TestWriteOpaquePNG(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 1))
	img := image.NewRGBA(image.Rect(0, 0, 37, 23))
	for k := range img.Pix {
		img.Pix[k] = byte(rng.IntN(4) * 60)
		if k%4 == 3 {
			img.Pix[k] = 0xff
		}
	}
	for _, src := range []*image.RGBA{img, img.SubImage(image.Rect(3, 2, 30, 20)).(*image.RGBA)} {
		var buf bytes.Buffer
		ok, err := writeOpaquePNG(&buf, src, 200)
		if !ok || err != nil {
			t.Fatalf("not written: %v, %v", ok, err)
		}
		if !bytes.Contains(buf.Bytes(), []byte{'p', 'H', 'Y', 's', 0, 0, 0x1e, 0xc2}) {
			t.Error("no pHYs chunk of 7874 pixels per metre")
		}
		back, err := png.Decode(&buf)
		if err != nil {
			t.Fatal(err)
		}
		b := src.Bounds()
		if back.Bounds().Dx() != b.Dx() || back.Bounds().Dy() != b.Dy() {
			t.Fatalf("size %v, want %v", back.Bounds(), b)
		}
		for y := 0; y < b.Dy(); y++ {
			for x := 0; x < b.Dx(); x++ {
				if got, want := color.RGBAModel.Convert(back.At(x, y)), src.At(b.Min.X+x, b.Min.Y+y); got != want {
					t.Fatalf("pixel (%d, %d): %v, want %v", x, y, got, want)
				}
			}
		}
	}
	img.Pix[7] = 0x80
	if ok, _ := writeOpaquePNG(&bytes.Buffer{}, img, 200); ok {
		t.Error("an image with a transparent pixel was written")
	}
}
