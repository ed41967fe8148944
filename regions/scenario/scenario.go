// Package scenario holds everything one stability map needs — plant,
// controller, window, fixed values, overlays and output files — and reads
// and writes it as a scenario file in TOML, so a map can be re-run,
// versioned and shared. The keys are described in SCHEMA.md.
//
// Decoding is strict: an unknown key, a value of the wrong type or a
// missing or unknown schema version is an *Error naming the file, the key
// and, where the TOML reader knows it, the line. Values on the command
// line override the file; see Override.
package scenario

import "gainscape/regions/spec"

// Version is the schema version this package reads and writes: the value
// of the top-level key schema.
const Version = 1

// Scenario is one stability map: what to compute, what to draw over it and
// where to write it. Lists and maps that are empty are nil, which is how
// Decode returns them.
type Scenario struct {
	Loop     Loop
	Axes     Axes
	Fixed    []spec.Value // values of the parameters that are not axes, in file order (--set)
	Overlays Overlays
	Output   Output
}

// Loop is the plant and the controller structure. The plant is given
// either as an expression (Plant) or as coefficient lists (Numerator and
// Denominator), never both.
type Loop struct {
	// Plant is a rational expression in s, as --plant takes it.
	Plant string
	// Numerator and Denominator are coefficients, highest power first,
	// as --num and --den take them.
	Numerator, Denominator []float64
	// Controller is a controller family name such as "pid" (--ctrl).
	Controller string
}

// Axes is the window: the two swept parameters and the grid over them.
type Axes struct {
	X, Y spec.Axis // horizontal and vertical axis (--x, --y)
	// Columns and Rows are the nodes along X and along Y (--grid).
	Columns, Rows int
}

// Overlays are the quantities drawn over the map.
type Overlays struct {
	// Decay shades the stable region by decay rate, the distance of the
	// slowest closed-loop root from the imaginary axis.
	Decay bool
	// DecayLevels, DampingLevels and MsLevels are the values at which
	// iso-lines of decay rate, damping ratio and Ms (the peak of the
	// sensitivity function) are drawn.
	DecayLevels, DampingLevels, MsLevels []float64
	// Marks are design points, each a list of parameter values (--mark).
	Marks [][]spec.Value
	// Best names the searches for a best point to run (--best).
	Best []string
	// MsBound limits those searches to points with Ms at most MsBound;
	// zero means no limit (--ms-bound).
	MsBound float64
}

// Output names the files written and sizes the image. An empty path
// means that file is not written.
type Output struct {
	Image string // image, .png or .svg (-o, --out)
	Data  string // the map as JSON (--data)
	CSV   string // the map as comma-separated values (--csv)
	Note  string // a short design note (--note)
	// Title replaces the title naming plant and controller; empty keeps
	// it (--title).
	Title string
	// WidthCm and HeightCm are the image size in centimetres.
	WidthCm, HeightCm float64
}

// Image size limits in centimetres, wide enough for a slide or a poster
// and narrow enough to catch a size given in pixels or millimetres.
const (
	MinSizeCm = 1
	MaxSizeCm = 200
)

// Default returns the scenario that an empty file describes, apart from
// the plant, which has no default. Its values are the defaults of the
// map command's flags; the Ms levels 1.4 and 2.0 are the common-practice
// robustness targets.
func Default() Scenario {
	return Scenario{
		Loop: Loop{Controller: "pid"},
		Axes: Axes{
			X:       spec.Axis{Param: "kp", Min: 0, Max: 10},
			Y:       spec.Axis{Param: "ki", Min: 0, Max: 5},
			Columns: 300, Rows: 225,
		},
		Overlays: Overlays{MsLevels: []float64{1.4, 2.0}},
		Output:   Output{Image: "gainscape-map.png", WidthCm: 16, HeightCm: 12},
	}
}
