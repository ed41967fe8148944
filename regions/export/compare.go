package export

import "gainscape/regions/response"

// Compare is the compare --data document. Its fields panels (with
// controller, fixed, x, y, rhp, axis, boundaries, table and responses)
// are the stable contract; the others describe the comparison and may
// grow.
type Compare struct {
	// Title is the figure's title, naming the plant or plants.
	Title    string `json:"title"`
	TimeUnit string `json:"time_unit"`
	// MsBound is the Ms limit of the searches of every panel; Criterion
	// and Source name the load-disturbance criterion and where it comes
	// from.
	MsBound   float64 `json:"ms_bound"`
	Criterion string  `json:"criterion"`
	Source    string  `json:"source"`
	// ResponseWindow is the duration shared by the step responses of the
	// panels' best designs.
	ResponseWindow Number         `json:"response_window"`
	Panels         []ComparePanel `json:"panels"`
	Caution        string         `json:"caution"`
}

// ComparePanel is one panel: its map exactly as map --data writes it
// (the fields of Region, inline), how its window was chosen, its row of
// the table and the step-response figures of its best-ki design (null
// when there is none).
type ComparePanel struct {
	*Region
	// Label is the panel's title: structure and fixed values, and the
	// plant's label when the panels have several plants.
	Label      string `json:"label"`
	PlantLabel string `json:"plant_label,omitempty"`
	// Sample is the sample time of a digital controller, 0 for a
	// continuous one.
	Sample    float64           `json:"sample"`
	Window    WindowChoice      `json:"window"`
	Table     CompareTable      `json:"table"`
	Responses *response.Figures `json:"responses"`
	// ResponseFailed says why there are no responses.
	ResponseFailed string `json:"response_failed,omitempty"`
}

// WindowChoice says how a panel's window was chosen.
type WindowChoice struct {
	AutoX bool   `json:"auto_x"`
	AutoY bool   `json:"auto_y"`
	Rule  string `json:"rule"`
	// Cut lists the sides at which the stable region is unbounded and the
	// window was cut by the rule, such as "kp above".
	Cut []string `json:"cut"`
}

// CompareTable is one panel's row of comparable figures.
type CompareTable struct {
	BestKi    BestKi    `json:"best_ki"`
	BestDecay BestDecay `json:"best_decay"`
	// MinMs is the smallest Ms over the stable grid nodes, at MinMsAt.
	MinMs   Number             `json:"min_ms"`
	MinMsAt map[string]float64 `json:"min_ms_at"`
	// Ultimate is null when the proportional-only loop has no ultimate
	// gain.
	Ultimate    *UltimatePoint `json:"ultimate"`
	StableShare float64        `json:"stable_share"`
	// OverKd is the best-ki design over the derivative gain, for a
	// structure with kd that is not an axis of the panel.
	OverKd *OverGain `json:"best_ki_over_kd,omitempty"`
}

// BestKi is the largest-ki design with Ms at most the bound: its
// parameter values, Ms, gain margin (a factor), phase margin and the
// integrated error IE = 1/ki after a unit load step at the plant input.
// Failed says why there is none.
type BestKi struct {
	Values      map[string]float64 `json:"values"`
	Ms          Number             `json:"ms"`
	GainMargin  Number             `json:"gain_margin"`
	PhaseMargin Number             `json:"phase_margin_deg"`
	IE          Number             `json:"ie"`
	Failed      string             `json:"failed,omitempty"`
	Warning     string             `json:"warning,omitempty"`
}

// BestDecay is the design of largest decay rate with Ms at most the
// bound.
type BestDecay struct {
	Values     map[string]float64 `json:"values"`
	DecayRate  Number             `json:"decay_rate"`
	MinDamping Number             `json:"min_damping"`
	Ms         Number             `json:"ms"`
	Failed     string             `json:"failed,omitempty"`
	Warning    string             `json:"warning,omitempty"`
}

// UltimatePoint is the ultimate gain and period of the proportional-only
// loop; Tu is null where it was not computed.
type UltimatePoint struct {
	Ku Number `json:"ku"`
	Tu Number `json:"tu"`
}

// OverGain is the best-ki design searched over one more parameter within
// Range, from Samples values and a refinement around the best.
type OverGain struct {
	Param   string     `json:"param"`
	Range   [2]float64 `json:"range"`
	Samples int        `json:"samples"`
	BestKi
}
