package export

import (
	"bufio"
	"encoding/json"
	"io"
	"math"
	"strconv"
)

// Counts is a row-major grid of small integers, written as an array of
// rows, row 0 first: V[j·NX+i] is element i of row j. It holds the map's
// counts without copying them.
type Counts struct {
	NX, NY int
	V      []int8
}

// Grid is a row-major grid of numbers written like Counts, NaN and ±Inf
// as null.
type Grid struct {
	NX, NY int
	V      []float64
}

// MarshalJSON implements json.Marshaler, with one row per line.
func (c Counts) MarshalJSON() ([]byte, error) { return c.appendTo(nil), nil }

// MarshalJSON implements json.Marshaler, with one row per line.
func (g Grid) MarshalJSON() ([]byte, error) { return g.appendTo(nil), nil }

// row appends row j of c.
func (c Counts) row(b []byte, j int) []byte {
	b = append(b, '[')
	for i, v := range c.V[j*c.NX : (j+1)*c.NX] {
		if i > 0 {
			b = append(b, ',')
		}
		b = strconv.AppendInt(b, int64(v), 10)
	}
	return append(b, ']')
}

// row appends row j of g.
func (g Grid) row(b []byte, j int) []byte {
	b = append(b, '[')
	for i, v := range g.V[j*g.NX : (j+1)*g.NX] {
		if i > 0 {
			b = append(b, ',')
		}
		b = appendNumber(b, v)
	}
	return append(b, ']')
}

func (c Counts) appendTo(b []byte) []byte { return rows(b, c.NY, c.row) }

func (g Grid) appendTo(b []byte) []byte { return rows(b, g.NY, g.row) }

// rows appends an array of ny rows, one per line.
func rows(b []byte, ny int, row func([]byte, int) []byte) []byte {
	b = append(b, '[')
	for j := 0; j < ny; j++ {
		if j > 0 {
			b = append(b, ',')
		}
		b = append(b, '\n')
		b = row(b, j)
	}
	return append(b, ']')
}

// appendNumber appends f as encoding/json writes a float64 (the shortest
// representation that reads back exactly, in exponent form below 1e-6
// and from 1e21), or null for NaN and ±Inf: the same values a reader of
// the indented documents got.
func appendNumber(b []byte, f float64) []byte {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return append(b, "null"...)
	}
	format := byte('f')
	if a := math.Abs(f); a != 0 && (a < 1e-6 || a >= 1e21) {
		format = 'e'
	}
	b = strconv.AppendFloat(b, f, format, -1, 64)
	if format == 'e' {
		// e-07 → e-7, as encoding/json writes it.
		if n := len(b); n >= 4 && b[n-4] == 'e' && b[n-3] == '-' && b[n-2] == '0' {
			b[n-2] = b[n-1]
			b = b[:n-1]
		}
	}
	return b
}

// streamer writes a document piece by piece to a buffered writer,
// keeping the first error.
type streamer struct {
	w   *bufio.Writer
	buf []byte
	err error
}

func (s *streamer) raw(text string) {
	if s.err == nil {
		_, s.err = s.w.WriteString(text)
	}
}

func (s *streamer) bytes(b []byte) {
	if s.err == nil {
		_, s.err = s.w.Write(b)
	}
}

// value writes v as compact JSON.
func (s *streamer) value(v any) {
	if s.err != nil {
		return
	}
	b, err := json.Marshal(v)
	if err != nil {
		s.err = err
		return
	}
	s.bytes(b)
}

// field writes "name": and, unless v is nil, the value v.
func (s *streamer) field(first bool, name string, v any) {
	if !first {
		s.raw(",")
	}
	s.value(name)
	s.raw(":")
	if v != nil {
		s.value(v)
	}
}

// grid writes the rows of a Counts or Grid one at a time, so that no
// copy of the whole grid is made.
func (s *streamer) grid(ny int, row func([]byte, int) []byte) {
	s.raw("[")
	for j := 0; j < ny && s.err == nil; j++ {
		if j > 0 {
			s.raw(",")
		}
		s.raw("\n")
		s.buf = row(s.buf[:0], j)
		s.bytes(s.buf)
	}
	s.raw("]")
}

// list writes the elements of a slice one per line.
func list[T any](s *streamer, items []T) {
	s.raw("[")
	for k := range items {
		if k > 0 {
			s.raw(",")
		}
		s.raw("\n")
		s.value(items[k])
	}
	s.raw("]")
}

// WriteRegion writes the --data document as compact JSON, streamed: the
// grids row by row, each row on one line, and each edge and iso-line
// level on a line of its own, so that neither the document nor a copy of
// a grid is held in memory. It writes the values, names and order of
// fields that encoding/json gives the Region struct.
func WriteRegion(w io.Writer, doc *Region) error {
	s := &streamer{w: bufio.NewWriterSize(w, 1<<16)}
	s.raw("{")
	s.field(true, "plant", doc.Plant)
	s.field(false, "controller", doc.Controller)
	s.field(false, "time_unit", doc.TimeUnit)
	s.field(false, "fixed", doc.Fixed)
	s.field(false, "x", doc.X)
	s.field(false, "y", doc.Y)
	s.field(false, "rhp", nil)
	s.grid(doc.RHP.NY, doc.RHP.row)
	s.field(false, "axis", nil)
	s.grid(doc.Axis.NY, doc.Axis.row)
	s.field(false, "boundaries", nil)
	list(s, doc.Boundaries)
	s.raw("\n")
	s.field(false, "summary", doc.Summary)
	if ex := doc.Extra; ex != nil {
		s.field(false, "extra", nil)
		s.raw("{")
		s.field(true, "best", ex.Best)
		s.field(false, "marks", ex.Marks)
		s.field(false, "overlays", nil)
		s.raw("{")
		first := true
		for _, l := range []struct {
			name  string
			layer *Layer
		}{{"decay_rate", ex.Overlays.DecayRate}, {"min_damping", ex.Overlays.MinDamping}, {"ms", ex.Overlays.Ms}} {
			if l.layer == nil {
				continue
			}
			s.field(first, l.name, nil)
			first = false
			s.raw("{")
			s.field(true, "contours", nil)
			list(s, l.layer.Contours)
			s.field(false, "levels", l.layer.Levels)
			s.field(false, "values", nil)
			s.grid(l.layer.Values.NY, l.layer.Values.row)
			s.raw("}")
		}
		s.raw("}}")
	}
	s.raw("}\n")
	if s.err != nil {
		return s.err
	}
	return s.w.Flush()
}
