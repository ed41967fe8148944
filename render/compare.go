package render

import (
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"

	"gainscape/regions/boundary"
	"gainscape/regions/stability"
)

// EdgeSet is a set of stability edges of the same window drawn over the
// map in one style, such as the edges of the loop at another sample time.
type EdgeSet struct {
	// Label names the set in the legend, e.g. "T = 0.2 s".
	Label  string
	Curves []boundary.Curve
}

// compareLines returns the lines of the compared edge sets, each set in
// its own style (compareStyle), every kind of edge alike.
func compareLines(f *Figure) []plot.Plotter {
	var out []plot.Plotter
	for i, set := range f.Compare {
		for _, cv := range set.Curves {
			for _, piece := range finitePieces(cv.Points) {
				xys := make(plotter.XYs, len(piece))
				for k, pt := range piece {
					xys[k].X, xys[k].Y = pt.X, pt.Y
				}
				out = append(out, plotOnly{&plotter.Line{XYs: xys, LineStyle: compareStyle(i)}})
			}
		}
	}
	return out
}

// compareSection is the legend section of the compared edge sets, with
// the map's own loop first, in the style of its edges.
func compareSection(f *Figure) legendSection {
	s := legendSection{heading: "Edges compared"}
	if len(f.Compare) == 0 {
		return s
	}
	own := f.OwnLabel
	if own == "" {
		own = "this map"
	}
	s.entries = append(s.entries, legendEntry{own + " (this map)", []plot.Thumbnailer{lineThumb{haloStyle(), curveStyle(stability.Complex)}}})
	for i, set := range f.Compare {
		s.entries = append(s.entries, legendEntry{set.Label, []plot.Thumbnailer{lineThumb{compareStyle(i)}}})
	}
	return s
}
