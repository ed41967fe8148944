package response

import (
	"math"
	"reflect"
	"strconv"
)

// Result is the closed-loop response of one design point to a unit
// setpoint step and to a unit load step at the plant input.
// Its JSON names are time, setpoint, load, figures, span and method.
type Result struct {
	// Time holds t_k = k·Span.Step, k = 0 … Span.Samples.
	Time []float64 `json:"time"`
	// Setpoint is the response to r = 1 (d = 0); Load the response to
	// d = 1 (r = 0), where e = −y.
	Setpoint Trace   `json:"setpoint"`
	Load     Trace   `json:"load"`
	Figures  Figures `json:"figures"`
	Span     Span    `json:"span"`
	// Poles are the closed-loop poles the window was chosen from, slowest
	// first: the roots of Δ for rational loops (in z for sampled ones);
	// for dead-time loops the roots of the quasi-polynomial found from
	// its Padé approximant (see the package documentation).
	Poles []complex128 `json:"-"`
	// Method says how the responses were computed, in a sentence.
	Method string `json:"method"`
}

// Trace holds the three signals of one step response at the times of
// Result.Time. A value at t = 0 is the value just after the step
// (t = 0+). Its JSON names are output, control, error and
// control_impulse.
type Trace struct {
	// Output is the plant output y.
	Output []float64 `json:"output"`
	// Control is the controller output u (without the load d).
	Control []float64 `json:"control"`
	// Error is e = r − y.
	Error []float64 `json:"error"`
	// ControlImpulse is set when the controller has more zeros than poles
	// (an ideal derivative) so that u holds impulses at t = 0:
	// ControlImpulse[j] is the weight of the j-th derivative of the Dirac
	// impulse. Control then holds the regular part of u. Empty otherwise.
	ControlImpulse []float64 `json:"control_impulse,omitempty"`
}

// Figures are the design figures of the two responses. Times are in the
// loop's time unit. A figure that does not exist is NaN and encodes as
// JSON null: the percentages, rise and settling times when the final
// value of the setpoint response is zero, a level the window never
// reaches, a response still outside its band at the end of the window.
//
// JSON names: final_setpoint, overshoot, undershoot, peak_setpoint,
// peak_time_setpoint, rise_time, settling_time, iae_setpoint, final_load,
// iae_load, ie_load, peak_load, peak_time_load.
type Figures struct {
	// FinalSetpoint is lim y(t) for the setpoint step, Nc·N/Δ at s = 0
	// (z = 1), from the polynomials: 1 with integral action, kp·K/(1 +
	// kp·K) for a proportional loop of static gain K.
	FinalSetpoint float64 `json:"final_setpoint"`
	// Overshoot is how far y goes beyond its final value, in percent of
	// it; Undershoot how far it first goes the wrong way (below zero for
	// a positive final value), in percent of the final value: the mark
	// of a non-minimum-phase loop.
	Overshoot  float64 `json:"overshoot"`
	Undershoot float64 `json:"undershoot"`
	// PeakSetpoint is the extreme value of y in the direction of its
	// final value, at PeakTimeSetpoint.
	PeakSetpoint     float64 `json:"peak_setpoint"`
	PeakTimeSetpoint float64 `json:"peak_time_setpoint"`
	// RiseTime is the time from the first reaching of 10% of the final
	// value to the first reaching of 90% (common practice).
	RiseTime float64 `json:"rise_time"`
	// SettlingTime is the first time after which y stays within Band
	// (2%) of its final value to the end of the window.
	SettlingTime float64 `json:"settling_time"`
	// IAESetpoint is ∫|e| over the window for the setpoint step.
	IAESetpoint float64 `json:"iae_setpoint"`

	// FinalLoad is lim y(t) for the load step, N·Dc/Δ at s = 0 (z = 1):
	// 0 with integral action in the controller.
	FinalLoad float64 `json:"final_load"`
	// IAELoad = ∫|e| dt and IELoad = ∫e dt over the window for the load
	// step, e = −y. With integral action and the window long enough,
	// IELoad → −1/ki: its magnitude is the 1/ki of Åström & Hägglund,
	// Advanced PID Control (ISA 2006), for a unit load step at the plant
	// input; IAELoad ≥ |IELoad|, equal when e keeps one sign.
	IAELoad float64 `json:"iae_load"`
	IELoad  float64 `json:"ie_load"`
	// PeakLoad is the value of y of largest magnitude under the load
	// step (the peak deviation), at PeakTimeLoad.
	PeakLoad     float64 `json:"peak_load"`
	PeakTimeLoad float64 `json:"peak_time_load"`
}

// MarshalJSON implements json.Marshaler, writing NaN and infinite
// figures as null under the names of the json tags.
func (f Figures) MarshalJSON() ([]byte, error) {
	v := reflect.ValueOf(f)
	t := v.Type()
	b := []byte{'{'}
	for i := range t.NumField() {
		if i > 0 {
			b = append(b, ',')
		}
		b = strconv.AppendQuote(b, t.Field(i).Tag.Get("json"))
		b = append(b, ':')
		if x := v.Field(i).Float(); math.IsNaN(x) || math.IsInf(x, 0) {
			b = append(b, "null"...)
		} else {
			b = strconv.AppendFloat(b, x, 'g', -1, 64)
		}
	}
	return append(b, '}'), nil
}
