package study

import (
	"fmt"
	"math"

	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/intervals"
	"gainscape/regions/spec"
	"gainscape/regions/stability"
)

// VaryRequest asks for the stable intervals of one parameter of a loop
// over a range, every other parameter at its value. Text is the range as
// the user wrote it, for messages.
type VaryRequest struct {
	Loop  LoopSpec
	Range spec.Axis
	Text  string
	// Pade is the order of the Padé approximant a loop with dead time is
	// compared with; 0 chooses it (padeVary).
	Pade int
}

// VaryReport is the answer to a VaryRequest.
type VaryReport struct {
	// Doc is the probe --vary --json document.
	Doc *export.Vary
	// Formula is the controller's transfer function; Fixed the other
	// parameters in family order.
	Formula string
	Fixed   []Value
	// Sampled describes the sampling of a sampled-data loop; nil for a
	// continuous-time one.
	Sampled *Sampling
	// Intervals are the stable intervals, ascending.
	Intervals []Interval
}

// Interval is one stable interval and how the loop loses stability at
// each end.
type Interval struct {
	Lo, Hi float64
	// LoEnd and HiEnd describe the ends in words.
	LoEnd, HiEnd string
}

// Vary returns every interval of the parameter in which the loop is
// stable (intervals.Stable).
func Vary(req VaryRequest) (*VaryReport, error) {
	l, err := req.Loop.Build()
	if err != nil {
		return nil, err
	}
	ax := req.Range
	idx, err := family.Index(l.Family, ax.Param)
	if err != nil {
		return nil, &InputError{Flag: "--vary", Value: fmt.Sprintf("%q", req.Text), Err: err}
	}
	ivs, err := intervals.Stable(l, idx, ax.Min, ax.Max)
	if err != nil {
		return nil, &InputError{Flag: "--vary", Value: fmt.Sprintf("%q", req.Text), Err: err}
	}
	units := Units{req.Loop.TimeUnit}
	T := l.Plant.Sample
	rep := &VaryReport{Formula: l.Family.Formula(), Fixed: valuesOf(l, idx), Sampled: sampledOf(l, req.Loop)}
	rep.Doc = &export.Vary{
		Plant: req.Loop.PlantText(), Controller: l.Family.Name(), TimeUnit: units.Key(), Param: ax.Param, Min: ax.Min, Max: ax.Max,
		Fixed: valueMap(l, idx), Intervals: []export.Interval{}, Caution: Caution,
	}
	if rep.Sampled != nil {
		rep.Doc.SampleTime, rep.Doc.Integral = rep.Sampled.T, rep.Sampled.Integral
	}
	dead := l.Plant.Delay > 0
	for _, iv := range ivs {
		rep.Doc.Intervals = append(rep.Doc.Intervals, exportInterval(iv))
		// Adding zero turns a negative zero from the search into +0.
		rep.Intervals = append(rep.Intervals, Interval{Lo: iv.Lo + 0, Hi: iv.Hi + 0, LoEnd: endText(iv.LoKind, iv.LoOmega, units, T, dead), HiEnd: endText(iv.HiKind, iv.HiOmega, units, T, dead)})
	}
	if dead {
		if rep.Doc.Pade, err = padeVary(l, idx, ax.Min, ax.Max, ivs, req.Pade); err != nil {
			return nil, err
		}
	}
	return rep, nil
}

// exportInterval writes an interval for JSON.
func exportInterval(iv intervals.Interval) export.Interval {
	return export.Interval{
		Lo: iv.Lo, Hi: iv.Hi, LoKind: endKind(iv.LoKind), HiKind: endKind(iv.HiKind),
		LoOmega: export.Number(iv.LoOmega), HiOmega: export.Number(iv.HiOmega),
	}
}

// endKind names an interval end for JSON: a boundary kind ("alternating"
// for a real root through z = −1 of a sampled loop), or "window".
func endKind(k stability.Kind) string {
	if k == intervals.Window {
		return "window"
	}
	return k.String()
}

// endText says in words how the loop loses stability at an interval end;
// T is the sample time of a sampled loop, 0 for a continuous one; dead
// says the loop has dead time, where a crossing through infinity is a
// whole chain of roots (the neutral type).
func endText(k stability.Kind, omega float64, u Units, T float64, dead bool) string {
	if T > 0 {
		return circleEndText(k, omega, u, T)
	}
	if k == stability.Infinite && dead {
		return "a chain of infinitely many roots reaches the imaginary axis: |lim L(s)| as s → ∞ reaches 1 (neutral type; for an ideal derivative, |kd·lim s·G(s)| = 1)"
	}
	switch k {
	case stability.Real:
		return "a real root crosses through s = 0 (the loop drifts away, ω = 0)"
	case stability.Complex:
		return fmt.Sprintf("a complex pair crosses the imaginary axis: the loop oscillates at ω = %.6g %s (period %.4g %s)", omega, u.Freq(), 2*math.Pi/omega, u.TimeLabel())
	case stability.Infinite:
		return "a root passes through infinity (the leading coefficient vanishes)"
	}
	return "the end of the range scanned"
}
