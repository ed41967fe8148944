// Package export writes a stability map and its boundaries as JSON data,
// so that a figure can be re-made or checked with other software.
package export

import (
	"encoding/json"
	"io"
	"math"

	"gainscape/regions/boundary"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
)

// Region is the JSON document. Its fields x, y, rhp and boundaries are the
// stable contract; the others describe the scenario and may grow.
type Region struct {
	Plant      string             `json:"plant"`
	Controller string             `json:"controller"`
	Fixed      map[string]float64 `json:"fixed"`
	X          plane.Axis         `json:"x"`
	Y          plane.Axis         `json:"y"`
	// RHP[j][i] is the right-half-plane root count at (x_i, y_j), row 0
	// at y = min; -1 where the test could not decide.
	RHP        [][]int    `json:"rhp"`
	Boundaries []Boundary `json:"boundaries"`
	Summary    Summary    `json:"summary"`
	// Extra holds further named layers (overlays, searches) added by the
	// caller; each value must be JSON-encodable.
	Extra map[string]any `json:"extra,omitempty"`
}

// Boundary is one boundary polyline; each point is [x, y, ω] with ω null
// where it is undefined (roots through infinity).
type Boundary struct {
	Kind   boundary.Kind `json:"kind"`
	Points [][3]Number   `json:"points"`
}

// Summary repeats the figures of the text summary.
type Summary struct {
	Nodes          int     `json:"nodes"`
	StableNodes    int     `json:"stable_nodes"`
	UndecidedNodes int     `json:"undecided_nodes"`
	StableFraction float64 `json:"stable_fraction"`
	// StableBox is [xmin, xmax, ymin, ymax] of the stable nodes, or null.
	StableBox *[4]float64 `json:"stable_box"`
	// OmegaRange is [min, max] of ω along complex-root boundaries, or null.
	OmegaRange *[2]float64 `json:"omega_range"`
}

// Number is a float64 that encodes NaN and ±Inf as JSON null.
type Number float64

// MarshalJSON implements json.Marshaler.
func (n Number) MarshalJSON() ([]byte, error) {
	f := float64(n)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return json.Marshal(f)
}

// NewRegion assembles the document for a map and its boundaries.
func NewRegion(m *grid.Map, curves []boundary.Curve) *Region {
	r := &Region{X: m.XAxis, Y: m.YAxis, RHP: m.Rows(), Boundaries: []Boundary{}}
	for _, c := range curves {
		b := Boundary{Kind: c.Kind, Points: make([][3]Number, len(c.Points))}
		for k, p := range c.Points {
			b.Points[k] = [3]Number{Number(p.X), Number(p.Y), Number(p.Omega)}
		}
		r.Boundaries = append(r.Boundaries, b)
	}
	st := m.Stats()
	r.Summary = Summary{Nodes: st.Nodes, StableNodes: st.Stable, UndecidedNodes: st.Undecided, StableFraction: st.StableFraction()}
	if st.Stable > 0 {
		r.Summary.StableBox = &[4]float64{st.XMin, st.XMax, st.YMin, st.YMax}
	}
	if lo, hi, ok := OmegaRange(curves); ok {
		r.Summary.OmegaRange = &[2]float64{lo, hi}
	}
	return r
}

// OmegaRange returns the smallest and largest ω on complex-root boundaries.
func OmegaRange(curves []boundary.Curve) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, c := range curves {
		if c.Kind != boundary.Complex {
			continue
		}
		for _, p := range c.Points {
			if !math.IsNaN(p.Omega) {
				lo, hi, ok = math.Min(lo, p.Omega), math.Max(hi, p.Omega), true
			}
		}
	}
	return lo, hi, ok
}

// Write encodes r as indented JSON.
func Write(w io.Writer, r *Region) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	return enc.Encode(r)
}
