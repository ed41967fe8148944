package export

// The parts of the documents that belong to loops with dead time.

// DelayMargin is the further dead time one gain crossover tolerates: the
// phase margin there divided by the crossover frequency.
type DelayMargin struct {
	// Freq is the gain crossover frequency (|L| = 1).
	Freq float64 `json:"freq"`
	// PhaseMarginDeg is the phase margin at Freq, the loop's own dead time
	// included.
	PhaseMarginDeg float64 `json:"phase_margin_deg"`
	// Extra is the dead time, in the time unit, that brings this
	// crossover to −180°.
	Extra float64 `json:"delay_margin"`
}

// WorkingRow is one row of a stability test's working other than the
// sign array: for a loop with dead time, one band of frequencies between
// two points where |P(jω)| = |Q(jω)|, with the part that dominates there
// and the change of arg Δ over it.
type WorkingRow struct {
	Label   string   `json:"label"`
	Entries []string `json:"entries"`
}

// Neutral describes a loop with dead time of neutral type, whose delayed
// part Q has the degree of the delay-free part P (an ideal derivative on
// a first-order plant).
type Neutral struct {
	// Ratio is |q_n/p_n|, the limit of |L(s)| as s → ∞ (|kd·lim s·G(s)|
	// for an ideal derivative).
	Ratio float64 `json:"ratio"`
	// InfinitelyMany is set when Ratio ≥ 1: infinitely many roots lie in
	// the right half plane (or approach the imaginary axis).
	InfinitelyMany bool   `json:"infinitely_many"`
	Note           string `json:"note"`
}

// PadeProbe compares one design point of a loop with dead time with the
// same loop whose delay is replaced by a Padé approximant.
type PadeProbe struct {
	// Order is the order of the (n, n) approximant; Chosen is set when it
	// was chosen from OmegaL rather than given.
	Order  int  `json:"order"`
	Chosen bool `json:"chosen"`
	// OmegaL is ω·L at the highest frequency that matters at this point
	// (the gain and phase crossovers and the ultimate frequency).
	OmegaL float64 `json:"omega_l"`
	// RangeOmegaL is the ω·L up to which the approximant's phase stays
	// within 1° of the delay's.
	RangeOmegaL float64 `json:"range_omega_l"`
	// RHP and Stable are the approximate loop's verdict by the sign array;
	// Agrees says whether it matches the exact one.
	RHP    int  `json:"rhp"`
	Stable bool `json:"stable"`
	Agrees bool `json:"agrees"`
	// Ku is the ultimate gain of the approximate proportional-only loop,
	// KuExact that of the loop with its dead time, KuError their relative
	// difference (null where either is missing).
	Ku      Number `json:"ku"`
	KuExact Number `json:"ku_exact"`
	KuError Number `json:"ku_relative_error"`
	// Note says in words how far the approximation would mislead.
	Note string `json:"note"`
}

// PadeVary compares the stable intervals of one parameter of a loop with
// dead time with those of its Padé-approximated loop.
type PadeVary struct {
	Order  int  `json:"order"`
	Chosen bool `json:"chosen"`
	// OmegaL is ω·L at the highest crossing frequency of an interval end.
	OmegaL float64 `json:"omega_l"`
	// Intervals are those of the approximate loop.
	Intervals []Interval `json:"intervals"`
	// Largest is the largest distance between an end of the exact
	// intervals and the nearest end of the approximate ones (or the other
	// way round), and Relative that distance over the exact end's
	// magnitude; At is the exact end concerned (null when the interval
	// lists agree in nothing to compare).
	Largest  Number `json:"largest_displacement"`
	Relative Number `json:"relative_displacement"`
	At       Number `json:"at"`
	Note     string `json:"note"`
}

// PadeMap is the comparison of a map of a loop with dead time with the
// map of the same window for the Padé-approximated loop, by the sign
// array.
type PadeMap struct {
	Order  int  `json:"order"`
	Chosen bool `json:"chosen"`
	// OmegaL is the largest ω·L of the window: the highest frequency on a
	// complex edge or at a gain crossover, times the dead time.
	OmegaL float64 `json:"omega_l"`
	// Disagree counts the nodes stable in one map and not in the other;
	// CountDiffers the nodes whose right-half-plane counts differ.
	Disagree     int `json:"disagree_nodes"`
	CountDiffers int `json:"count_differs_nodes"`
	// Largest is the largest displacement of the stability edge along a
	// grid line (see Displacement); nil when either map has no stability
	// edge in the window.
	Largest *Displacement `json:"largest_displacement"`
	Note    string        `json:"note"`
}

// Displacement is how far the approximate stability edge lies from the
// exact one at its worst: the point of one map's edge farthest from the
// other map's edge, and the nearest point there.
type Displacement struct {
	// Exact and Approximate are the two points, [x, y].
	Exact       [2]float64 `json:"exact"`
	Approximate [2]float64 `json:"approximate"`
	// DX and DY are Approximate − Exact in parameter units; Share is
	// their length in the window scaled to a unit square (each axis
	// divided by its span).
	DX    float64 `json:"dx"`
	DY    float64 `json:"dy"`
	Share float64 `json:"share"`
}

// Confirmation is the check of a map's counts by a second method, at one
// node of every region of equal count.
type Confirmation struct {
	Method    string `json:"method"`
	Regions   int    `json:"regions"`
	Confirmed int    `json:"confirmed"`
	// Disagree lists the nodes where the second method found another
	// count; Unconfirmed the nodes where it could not decide.
	Disagree    []CheckedNode `json:"disagree"`
	Unconfirmed []CheckedNode `json:"unconfirmed"`
}

// CheckedNode is one node checked by the second method.
type CheckedNode struct {
	// Point is the node, [x, y].
	Point [2]float64 `json:"point"`
	// Count is the map's count; Other the second method's (-1 when it
	// could not decide, with Reason).
	Count  int    `json:"count"`
	Other  int    `json:"other"`
	Reason string `json:"reason,omitempty"`
}
