package render

import (
	"fmt"
	"gainscape/internal/safefile"
	"io"
	"path/filepath"
	"strings"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Write draws f and writes it to w in format "png" or "svg".
func Write(w io.Writer, format string, f Figure) error {
	if err := f.check(); err != nil {
		return err
	}
	f = f.withDefaults()
	var cv vg.CanvasWriterTo
	switch format {
	case "png":
		cv = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(f.Width, f.Height), vgimg.UseDPI(f.DPI))}
	case "svg":
		cv = vgsvg.New(f.Width, f.Height)
	default:
		return fmt.Errorf("render: unknown image format %q; want \"png\" or \"svg\"", format)
	}
	drawFigure(draw.New(cv), &f)
	_, err := cv.WriteTo(w)
	return err
}

// WriteFile draws f to the file at path, in the format its extension
// names (.png or .svg, in any letter case). It writes to a temporary file
// in the same directory and renames it into place, so a failure never
// leaves a partial image at path.
func WriteFile(path string, f Figure) error {
	ext := filepath.Ext(path)
	format := strings.ToLower(strings.TrimPrefix(ext, "."))
	if format != "png" && format != "svg" {
		return fmt.Errorf("render: %s: unknown image extension %q; use .png or .svg", path, ext)
	}
	if err := f.check(); err != nil {
		return fmt.Errorf("%w (writing %s)", err, path)
	}
	if err := safefile.Write(path, func(w io.Writer) error { return Write(w, format, f) }); err != nil {
		return fmt.Errorf("render: %w", err)
	}
	return nil
}
