package render

import (
	"bufio"
	"compress/zlib"
	"encoding/binary"
	"hash/crc32"
	"image"
	"io"
	"math"
)

// writeOpaquePNG writes img, which must be opaque, as an 8-bit RGB PNG
// (ISO/IEC 15948) with a pHYs chunk of dpi, and reports false without
// writing anything when img has a transparent pixel.
//
// It exists beside image/png, whose encoder tries all five row filters on
// every row to pick one: on a figure that choice takes most of the
// encoding time. Here every row uses the Up filter (each byte less the one
// above it), which turns the rows of a map that repeat the row above, most
// of them, into zeros; the result is a few per cent larger than the best
// choice and is compressed for speed.
func writeOpaquePNG(w io.Writer, img *image.RGBA, dpi int) (bool, error) {
	b := img.Bounds()
	width, height := b.Dx(), b.Dy()
	rowOf := func(y int) []byte {
		off := img.PixOffset(b.Min.X, b.Min.Y+y)
		return img.Pix[off : off+4*width]
	}
	for y := 0; y < height; y++ {
		row := rowOf(y)
		for x := 3; x < len(row); x += 4 {
			if row[x] != 0xff {
				return false, nil
			}
		}
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	bw.WriteString("\x89PNG\r\n\x1a\n")
	var ihdr [13]byte
	binary.BigEndian.PutUint32(ihdr[0:], uint32(width))
	binary.BigEndian.PutUint32(ihdr[4:], uint32(height))
	ihdr[8], ihdr[9] = 8, 2 // 8 bits per sample, truecolour
	writeChunk(bw, "IHDR", ihdr[:])
	var phys [9]byte
	ppm := uint32(math.Round(float64(dpi) / 0.0254))
	binary.BigEndian.PutUint32(phys[0:], ppm)
	binary.BigEndian.PutUint32(phys[4:], ppm)
	phys[8] = 1 // unit: the metre
	writeChunk(bw, "pHYs", phys[:])
	idat := &chunkWriter{w: bw, typ: "IDAT", buf: make([]byte, 0, 1<<16)}
	zw, err := zlib.NewWriterLevel(idat, zlib.BestSpeed)
	if err != nil {
		return false, err
	}
	prev := make([]byte, 3*width)
	cur := make([]byte, 3*width)
	out := make([]byte, 1+3*width)
	out[0] = 2 // the Up filter
	for y := 0; y < height; y++ {
		row := rowOf(y)
		for x := 0; x < width; x++ {
			cur[3*x], cur[3*x+1], cur[3*x+2] = row[4*x], row[4*x+1], row[4*x+2]
		}
		for i, v := range cur {
			out[1+i] = v - prev[i]
		}
		if _, err := zw.Write(out); err != nil {
			return false, err
		}
		prev, cur = cur, prev
	}
	if err := zw.Close(); err != nil {
		return false, err
	}
	if err := idat.flush(); err != nil {
		return false, err
	}
	writeChunk(bw, "IEND", nil)
	return true, bw.Flush()
}

// writeChunk writes one PNG chunk: length, type, data and the CRC of type
// and data.
func writeChunk(w *bufio.Writer, typ string, data []byte) {
	var n [4]byte
	binary.BigEndian.PutUint32(n[:], uint32(len(data)))
	w.Write(n[:])
	w.WriteString(typ)
	w.Write(data)
	crc := crc32.NewIEEE()
	crc.Write([]byte(typ))
	crc.Write(data)
	binary.BigEndian.PutUint32(n[:], crc.Sum32())
	w.Write(n[:])
}

// chunkWriter cuts what is written to it into chunks of one type.
type chunkWriter struct {
	w   *bufio.Writer
	typ string
	buf []byte
}

func (c *chunkWriter) Write(p []byte) (int, error) {
	n := len(p)
	for len(p) > 0 {
		k := min(len(p), cap(c.buf)-len(c.buf))
		c.buf = append(c.buf, p[:k]...)
		p = p[k:]
		if len(c.buf) == cap(c.buf) {
			if err := c.flush(); err != nil {
				return 0, err
			}
		}
	}
	return n, nil
}

func (c *chunkWriter) flush() error {
	if len(c.buf) > 0 {
		writeChunk(c.w, c.typ, c.buf)
		c.buf = c.buf[:0]
	}
	return nil
}
