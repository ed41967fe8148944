package export

import (
	"gainscape/regions/response"
	"gainscape/regions/stability"
)

// Probe is the probe --json document for one design point. Its field
// names are a stable contract.
type Probe struct {
	Plant      string             `json:"plant"`
	Controller string             `json:"controller"`
	TimeUnit   string             `json:"time_unit"`
	Values     map[string]float64 `json:"values"`
	// SampleTime and Integral describe a sampled-data loop, omitted for a
	// continuous-time one: then Characteristic is in z, SignArray holds
	// the rows of the unit-circle test (the Schur–Cohn recursion, or the
	// sign array of the bilinear image Q(w)), RHP counts the roots outside
	// the unit circle, JW those on it, JWOmegas their θ/T, and every
	// frequency lies in [0, π/T].
	SampleTime     float64   `json:"sample_time,omitempty"`
	Integral       string    `json:"integral,omitempty"`
	Characteristic []float64 `json:"characteristic"` // highest power first
	// Delay, Delayed: for a loop with dead time, the characteristic
	// function is Characteristic(s) + Delayed(s)·e^(−Delay·s).
	Delay     float64   `json:"delay,omitempty"`
	Delayed   []float64 `json:"characteristic_delayed,omitempty"`
	SignArray []SignRow `json:"sign_array"`
	// Working is the test's working where it is not a sign array (the
	// bands of the argument principle for a loop with dead time).
	Working []WorkingRow `json:"working,omitempty"`
	// TestNotes are the stability test's remarks on special cases.
	TestNotes  []string  `json:"test_notes,omitempty"`
	Neutral    *Neutral  `json:"neutral,omitempty"`
	Aux        []float64 `json:"auxiliary_polynomial,omitempty"`
	Stable     bool      `json:"stable"`
	CountFrom  string    `json:"count_from"`
	RHP        int       `json:"rhp"`
	JW         int       `json:"jw_roots"`
	JWOmegas   []float64 `json:"jw_omegas"`
	DegreeDrop int       `json:"degree_drop"`
	// Poles are the closed-loop poles: in s, or for a sampled loop in z,
	// largest magnitude first, with ContinuousPoles their equivalents
	// ln(z)/T (null real part for z = 0) and RootRadius the largest |z|;
	// PolesFrom names the method they come from.
	Poles           [][2]float64 `json:"poles"`
	PolesFrom       string       `json:"poles_from"`
	ContinuousPoles []Number2    `json:"continuous_poles,omitempty"`
	RootRadius      *float64     `json:"root_radius,omitempty"`
	// DecayRate is −max Re s, or −ln(max |z|)/T for a sampled loop.
	DecayRate  Number `json:"decay_rate"`
	MinDamping Number `json:"min_damping"`
	// GainMargin is the gain margin nearest 0 dB, as a factor; GainMargins
	// lists every phase crossover with its margin.
	GainMargin     Number       `json:"gain_margin"`
	GainMargins    []GainMargin `json:"gain_margins"`
	GainMarginDB   Number       `json:"gain_margin_db"`
	PhaseCrossover Number       `json:"phase_crossover"`
	PhaseMargin    Number       `json:"phase_margin_deg"`
	GainCrossover  Number       `json:"gain_crossover"`
	Ms             Number       `json:"ms"`
	MsFreq         Number       `json:"ms_freq"`
	Mt             Number       `json:"mt"`
	MtFreq         Number       `json:"mt_freq"`
	// DelayMargins lists, for each gain crossover, the further dead time
	// the loop tolerates; DelayMargin is the smallest (null with no gain
	// crossover). Continuous-time loops only.
	DelayMargins []DelayMargin `json:"delay_margins,omitempty"`
	DelayMargin  Number        `json:"delay_margin"`
	// Robustness says whether the margins and Ms are robustness figures:
	// only for a stable loop are they distances to instability.
	Robustness string     `json:"robustness"`
	Fragility  *Fragility `json:"fragility,omitempty"`
	Ultimate   *Ultimate  `json:"ultimate,omitempty"`
	// Pade compares the point with its Padé-approximated loop (dead time
	// only).
	Pade *PadeProbe `json:"pade,omitempty"`
	// Response holds the figures of the step responses (iae_load,
	// overshoot, settling_time, …) when they were asked for;
	// ResponseFailed says why there are none.
	Response       *response.Figures `json:"response,omitempty"`
	ResponseFailed string            `json:"response_failed,omitempty"`
	Caution        string            `json:"caution"`
}

// Number2 is a pair of numbers, each written as null when it is not
// finite.
type Number2 [2]Number

// GainMargin is the margin of one phase crossover (arg L = −180°): the
// factor by which the loop gain may change there before a pair of roots
// reaches the imaginary axis at ω = Freq. Direction is "rise" for a
// factor above 1 (the gain may rise to Factor times its value) and
// "fall" below 1 (it may fall to Factor times it: a conditionally stable
// loop).
type GainMargin struct {
	Freq      float64 `json:"freq"`
	Factor    float64 `json:"factor"`
	DB        float64 `json:"db"`
	Direction string  `json:"direction"`
}

// SignRow is one row of the sign array, or of another test's table,
// which names its rows by Label.
type SignRow struct {
	Label     string   `json:"label,omitempty"`
	Power     int      `json:"power"`
	Entries   []string `json:"entries"`
	Epsilon   bool     `json:"epsilon_rule,omitempty"`
	Auxiliary bool     `json:"from_auxiliary,omitempty"`
}

// Fragility is the distance from a design point to the nearest stability
// edge in a plane of two parameters.
type Fragility struct {
	// Plane names the two parameters, e.g. ["kp", "ki"].
	Plane [2]string `json:"plane"`
	// Window is [xmin, xmax, ymin, ymax] of the map searched.
	Window [4]float64 `json:"window"`
	// Found is false when no edge lies in the window.
	Found    bool         `json:"found"`
	Absolute *NearestEdge `json:"absolute,omitempty"`
	Relative *NearestEdge `json:"relative,omitempty"`
}

// NearestEdge is the edge point nearest the design point in one metric.
type NearestEdge struct {
	Distance float64        `json:"distance"`
	Point    [2]float64     `json:"point"`
	Kind     stability.Kind `json:"kind"`
	Omega    Number         `json:"omega"`
}

// Ultimate is the ultimate gain and period of the proportional-only loop
// and the tuning rules computed from them.
type Ultimate struct {
	Ku float64 `json:"ku"`
	Tu float64 `json:"tu"`
	// Kind is how the roots cross at Ku: "complex" (a pair), or for a
	// sampled loop "alternating" (a real root at z = −1, Tu = 2T).
	Kind string `json:"kind"`
	// Method says how Ku and Tu were found and the rules applied, where
	// that needs saying (a sampled loop); From names the method that
	// found Ku.
	Method string `json:"method,omitempty"`
	From   string `json:"from,omitempty"`
	Rules  []Rule `json:"rules"`
	// RulesApply is false, with Note saying why, where the rules were not
	// made for the plant (one that is unstable in open loop).
	RulesApply bool   `json:"rules_apply"`
	Note       string `json:"note,omitempty"`
}

// Rule is one setting from a published tuning rule.
type Rule struct {
	Name   string  `json:"Name"`
	Source string  `json:"Source"`
	Family string  `json:"Family"`
	Kp     float64 `json:"Kp"`
	Ki     float64 `json:"Ki"`
	Kd     float64 `json:"Kd"`
	// Stable says whether the loop is stable with these gains, as the
	// stability test finds it; RHP is its count of unstable roots.
	Stable bool `json:"stable"`
	RHP    int  `json:"rhp"`
}

// Vary is the probe --vary --json document: the stable intervals of one
// parameter.
type Vary struct {
	Plant      string             `json:"plant"`
	Controller string             `json:"controller"`
	TimeUnit   string             `json:"time_unit"`
	Param      string             `json:"param"`
	Min        float64            `json:"min"`
	Max        float64            `json:"max"`
	Fixed      map[string]float64 `json:"fixed"`
	// SampleTime and Integral describe a sampled-data loop (the sample
	// time in TimeUnit, the rule of the digital integral); both are
	// omitted for a continuous-time loop.
	SampleTime float64    `json:"sample_time,omitempty"`
	Integral   string     `json:"integral,omitempty"`
	Intervals  []Interval `json:"intervals"`
	// Pade compares the intervals with those of the Padé-approximated
	// loop (dead time only).
	Pade    *PadeVary `json:"pade,omitempty"`
	Caution string    `json:"caution"`
}

// Interval is one stable interval (Lo, Hi) and how each end is reached.
// A kind is "real", "complex", "infinite" or "window" (the end of the
// range scanned), or for a sampled loop "alternating" (a real root
// through z = −1, ω = π/T); "real" is then a root through z = 1.
type Interval struct {
	Lo      float64 `json:"lo"`
	Hi      float64 `json:"hi"`
	LoKind  string  `json:"lo_kind"`
	HiKind  string  `json:"hi_kind"`
	LoOmega Number  `json:"lo_omega"`
	HiOmega Number  `json:"hi_omega"`
}
