// Package export defines the JSON documents gainscape writes: the map
// with its edges and overlays (--data) and the reports of one design
// point (probe --json). Every document is a typed struct, and every
// number that may be missing is a Number, which writes NaN and ±Inf as
// null: the one way a missing number is written.
package export

import (
	"encoding/json"
	"io"
	"math"

	"gainscape/regions/isoline"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

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

// Valid reports whether n is a number that is written, neither NaN nor
// infinite.
func (n Number) Valid() bool {
	f := float64(n)
	return !math.IsNaN(f) && !math.IsInf(f, 0)
}

// Region is the --data document. Its fields x, y, rhp and boundaries are
// the stable contract; the others describe the scenario and may grow.
// WriteRegion writes it streamed.
type Region struct {
	Plant      string `json:"plant"`
	Controller string `json:"controller"`
	// TimeUnit is the unit of time of the plant's s: ω is in rad per it,
	// decay rates in 1 per it.
	TimeUnit string             `json:"time_unit"`
	Fixed    map[string]float64 `json:"fixed"`
	// SampleTime and Integral describe a sampled-data loop (the sample
	// time in TimeUnit, the rule of the digital integral); both are
	// omitted for a continuous-time loop. In a sampled map rhp counts the
	// roots outside the unit circle, axis those on it, and a boundary of
	// kind "real" is a root through z = 1, "alternating" one through
	// z = −1 (ω = π/T), "complex" a pair through e^(±jωT).
	SampleTime float64    `json:"sample_time,omitempty"`
	Integral   string     `json:"integral,omitempty"`
	X          plane.Axis `json:"x"`
	Y          plane.Axis `json:"y"`
	// RHP[j][i] is the right-half-plane root count at (x_i, y_j), row 0
	// at y = min; -1 where the test could not decide.
	RHP Counts `json:"rhp"`
	// Axis[j][i] is the number of roots on the imaginary axis at the same
	// node (s = 0 and roots gone to infinity included): a node with rhp 0
	// and axis above 0 is marginal, on an edge, not stable.
	Axis       Counts     `json:"axis"`
	Boundaries []Boundary `json:"boundaries"`
	Summary    Summary    `json:"summary"`
	// Delay is the loop's dead time (0: none). For a loop with dead time,
	// Pade compares the map with that of its Padé-approximated loop and
	// Confirmation checks the counts by a second method.
	Delay        float64       `json:"delay,omitempty"`
	Pade         *PadeMap      `json:"pade,omitempty"`
	Confirmation *Confirmation `json:"confirmation,omitempty"`
	// Extra holds the overlays and the marked and found points, when any
	// were asked for.
	Extra *Extra `json:"extra,omitempty"`
	// Compare holds the edges of the same window at other sample times
	// (and of the continuous loop), when they were asked for.
	Compare []SampleEdges `json:"compare_samples,omitempty"`
}

// SampleEdges are the stability edges of a map's window for one sample
// time (0: the continuous loop), with the gain limit along the x axis.
type SampleEdges struct {
	SampleTime float64    `json:"sample_time"`
	Boundaries []Boundary `json:"boundaries"`
	// Limits are the stable intervals of x at the window's lowest y (or
	// just above it, Above set, where that row is marginal); an end of
	// kind "window" is the window's side.
	Limits []Interval `json:"x_limits"`
	Above  bool       `json:"limit_above_lowest_y,omitempty"`
	// LimitY is the y at which Limits were taken.
	LimitY float64 `json:"limit_y"`
	// Own marks the map's own loop, whose edges are the map's boundaries
	// (its Boundaries are empty here).
	Own bool `json:"own,omitempty"`
}

// Boundary is one boundary polyline; each point is [x, y, ω] with ω null
// where it is undefined (roots through infinity).
type Boundary struct {
	Kind   stability.Kind `json:"kind"`
	Points [][3]Number    `json:"points"`
	// Branches gives, for a complex edge of a loop with dead time, the
	// D-partition branch of each point (0 the first, -1 where it cannot
	// be told).
	Branches []int `json:"branches,omitempty"`
}

// Summary repeats the figures of the text summary.
type Summary struct {
	Nodes          int     `json:"nodes"`
	StableNodes    int     `json:"stable_nodes"`
	MarginalNodes  int     `json:"marginal_nodes"`
	UndecidedNodes int     `json:"undecided_nodes"`
	StableFraction float64 `json:"stable_fraction"`
	// StableBox is [xmin, xmax, ymin, ymax] of the stable nodes, or null.
	StableBox *[4]float64 `json:"stable_box"`
	// OmegaRange is [min, max] of ω along complex-root boundaries, or null.
	OmegaRange *[2]float64 `json:"omega_range"`
	// NeutralNodes counts the nodes of a loop with dead time of neutral
	// type with |lim L(s)| ≥ 1 as s → ∞: infinitely many roots in the right
	// half plane (or on the axis).
	NeutralNodes int `json:"neutral_nodes,omitempty"`
	// EvaluatedNodes is the number of nodes at which the stability test
	// ran; the others were filled from cells certified to hold one count.
	EvaluatedNodes int `json:"evaluated_nodes"`
	// EdgeMethod says how the edges were found: "frequency sweep" (the
	// D-partition curves traced in ω) or "bisection" (grid crossings
	// refined by bisection).
	EdgeMethod string `json:"edge_method"`
	// EdgeCheck is the number of grid edges whose change of count the
	// swept edges do not explain, or null for bisected edges.
	EdgeCheck *int `json:"edge_check"`
}

// Extra holds what is drawn over the map.
type Extra struct {
	Best     []Point  `json:"best"`
	Marks    []Point  `json:"marks"`
	Overlays Overlays `json:"overlays"`
}

// Overlays holds each overlay grid that was computed.
type Overlays struct {
	DecayRate  *Layer `json:"decay_rate,omitempty"`
	MinDamping *Layer `json:"min_damping,omitempty"`
	Ms         *Layer `json:"ms,omitempty"`
}

// Layer is one overlay: its value at every node, row by row (row 0 at
// y = min, null outside the stable region), the levels asked for and the
// very iso-lines drawn at each.
type Layer struct {
	Contours []Contour `json:"contours"`
	Levels   []float64 `json:"levels"`
	Values   Grid      `json:"values"`
}

// Contour is the iso-lines of one level.
type Contour struct {
	Level float64        `json:"level"`
	Lines []isoline.Line `json:"lines"`
}

// Point is a marked or found design point with its figures. A search
// that found nothing has Failed set to the reason, no values and null
// numbers.
type Point struct {
	Label     string             `json:"label"`
	Criterion string             `json:"criterion,omitempty"`
	Values    map[string]float64 `json:"values"`
	X         Number             `json:"x"`
	Y         Number             `json:"y"`
	Stable    bool               `json:"stable"`
	Decay     Number             `json:"decay_rate"`
	Damping   Number             `json:"min_damping"`
	Ms        Number             `json:"ms"`
	// Failed says why a search found no point; Warning flags a point to
	// read with care (one on the window's edge, where the true optimum
	// may lie outside).
	Failed  string `json:"failed,omitempty"`
	Warning string `json:"warning,omitempty"`
}

// Write encodes doc as indented JSON.
func Write(w io.Writer, doc any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	return enc.Encode(doc)
}
