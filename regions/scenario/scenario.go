// Package scenario holds everything one stability map needs — plant,
// controller, window, fixed values, overlays and output files — and reads
// and writes it as a scenario file in TOML, so a map can be re-run,
// versioned and shared. The keys are described in SCHEMA.md.
//
// Decoding is strict: an unknown key, a value of the wrong type, a
// missing or unknown schema version or a file nested deeper than any
// scenario is an *Error naming the file, the key and, where the TOML
// reader knows it, the line. Values on the command line override the
// file; see Override. The scenario remembers where each value was given,
// so that every later message about it names the file, line and key, or
// the flag, that gave it.
//
// A scenario file is data, not a command: the output paths it gives are
// taken relative to its own folder and may not leave it unless the user
// allows it (ResolvePaths), and every list has a bound (MaxLevels,
// MaxMarks, MaxFixed, MaxNesting).
package scenario

import (
	"fmt"

	"gainscape/regions/spec"
)

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
	// Origins says where each value was given. Decode and Override fill
	// it; Validate, Where and Errorf read it; Encode ignores it.
	Origins Origins
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
	// TimeUnit is the unit of time of the plant's s (--time-unit): one of
	// TimeUnits, "s" by default. It labels frequencies (rad per unit),
	// decay rates (1 per unit) and periods; the numbers do not change.
	TimeUnit string
	// Sample, when positive, is the sample time of a digital controller
	// (--sample): the plant in s is held and sampled, a plant in z is
	// taken as it is. 0 means a continuous-time controller.
	Sample float64
	// Integral is the discretisation of a digital controller's integral
	// (--integral): "backward" (the default, also when empty), "forward"
	// or "trapezoid".
	Integral string
	// Prewarp, when positive, pre-warps the trapezoidal rule of a digital
	// lead, lag or lead-lag at that frequency, in rad per time unit
	// (--prewarp); 0 leaves it unwarped.
	Prewarp float64
	// Pade is the order of the Padé approximant with which a loop with
	// dead time is mapped a second time, by the sign array, to show where
	// the approximation would mislead (--pade); 0 chooses it from the
	// window's largest ωL. A loop without dead time ignores it.
	Pade int
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
	// Best names the searches for a best point to run, among Searches
	// (--best).
	Best []string
	// MsBound limits those searches to points with Ms at most MsBound;
	// zero means no limit (--ms-bound).
	MsBound float64
	// CompareSamples are sample times whose edges are drawn over the map
	// of the same window, with the continuous loop's, to show what
	// sampling does (--compare-samples).
	CompareSamples []float64
}

// Output names the files written and sizes the image. An empty path
// means that file is not written, the image included; "-" as the image
// means standard output.
type Output struct {
	Image string // image, .png, .svg or .pdf (-o, --out)
	Data  string // the map as JSON, .json (--data)
	CSV   string // the map as comma-separated values, .csv (--csv)
	Note  string // a short design note, .md or .txt (--note)
	// Title replaces the title naming plant and controller; empty keeps
	// it (--title).
	Title string
	// WidthCm and HeightCm are the image size in centimetres.
	WidthCm, HeightCm float64
	// DPI is the resolution of a PNG image, written into the file so that
	// a document inserts it at its physical size (--dpi).
	DPI int
}

// TimeUnits lists the units of time a scenario may name, as written in
// labels.
var TimeUnits = []string{"s", "ms", "us", "min", "h"}

// MaxPade is the highest order of the Padé approximant (delay.MaxPadeOrder).
const MaxPade = 30

// DPI limits of PNG output.
const (
	MinDPI = 50
	MaxDPI = 1200
)

// Image size limits in centimetres, wide enough for a slide or a poster
// and narrow enough to catch a size given in pixels or millimetres.
const (
	MinSizeCm = 1
	MaxSizeCm = 200
)

// Bounds on what one scenario may ask for, so that a mistyped flag or a
// stranger's file is refused before any work rather than keeping the
// tool busy for minutes.
const (
	// MaxLevels is the most iso-line levels of one quantity. Each level
	// is traced over the whole grid and labelled; beyond a dozen or so
	// the lines of one quantity can no longer be told apart.
	MaxLevels = 16
	// MaxMarks is the most design points of one map, so that each gets
	// its own letter, A to Z (MarkLabel).
	MaxMarks = 26
	// MaxFixed is the most fixed parameter values: a controller has a
	// handful of parameters.
	MaxFixed = 32
	// MaxTitleRunes is the longest title, about two lines over a map.
	MaxTitleRunes = 200
	// MaxCompareSamples is the most sample times compared on one map:
	// each is a map of its own, and beyond a handful their edges can no
	// longer be told apart.
	MaxCompareSamples = 6
)

// MarkLabel returns the label of design point i, counting from 0: "A" to
// "Z". It panics for i outside 0 to MaxMarks−1, which Validate refuses.
func MarkLabel(i int) string {
	if i < 0 || i >= MaxMarks {
		panic(fmt.Sprintf("scenario: mark %d has no label; Validate allows %d marks", i, MaxMarks))
	}
	return string(rune('A' + i))
}

// Names of the searches for a best point.
const (
	SearchDecay    = "decay" // the largest decay rate in the window
	SearchIntegral = "ki"    // the largest integral gain with Ms at most the bound
)

// Searches returns the names of the searches for a best point, in the
// order the help lists them. It is the one list Validate, the flags and
// the help take them from.
func Searches() []string { return []string{SearchDecay, SearchIntegral} }

// Default returns the scenario that an empty file describes, apart from
// the plant, which has no default. Its values are the defaults of the
// map command's flags; the Ms levels 1.4 and 2.0 are the common-practice
// robustness targets.
func Default() Scenario {
	return Scenario{
		Loop: Loop{Controller: "pid", TimeUnit: "s"},
		Axes: Axes{
			X:       spec.Axis{Param: "kp", Min: 0, Max: 10},
			Y:       spec.Axis{Param: "ki", Min: 0, Max: 5},
			Columns: 300, Rows: 225,
		},
		Overlays: Overlays{MsLevels: []float64{1.4, 2.0}},
		Output:   Output{Image: "gainscape-map.png", WidthCm: 16, HeightCm: 12, DPI: 200},
	}
}
