package response

import (
	"encoding/json"
	"fmt"
	"math"
	"math/cmplx"
)

// Options set the time window and the figures of Step. The zero value
// asks for every default.
type Options struct {
	// Duration fixes the window length; 0 chooses it by the rule of
	// Window.
	Duration float64
	// Samples fixes the number of steps of the window (Time then has
	// Samples+1 entries); 0 chooses it by the rule of Window. Dead-time
	// loops may use more, so that a whole number of steps spans the delay.
	Samples int
	// DecayTo is the fraction to which the slowest mode must have decayed
	// at the end of the window (default 1e-3: 0.1%).
	DecayTo float64
	// Periods is the least number of periods of the slowest visible
	// oscillation the window shows (default 3).
	Periods float64
	// SamplesPerPeriod is the number of samples per period of the fastest
	// visible oscillation (default 20).
	SamplesPerPeriod float64
	// MinSamples and MaxSamples bound the number of steps the rule picks
	// (defaults 1000 and 20000).
	MinSamples, MaxSamples int
	// Band is the settling band as a fraction of the final value
	// (default 0.02).
	Band float64
}

// Defaults of Options.
const (
	DefaultDecayTo          = 1e-3
	DefaultPeriods          = 3
	DefaultSamplesPerPeriod = 20
	DefaultMinSamples       = 1000
	DefaultMaxSamples       = 20000
	DefaultBand             = 0.02
	// maxSteps bounds any count of steps, whatever the options say, so
	// that a response stays a few megabytes.
	maxSteps = 1_000_000
)

// resolve fills in the defaults and checks the options.
func (o Options) resolve() (Options, error) {
	def := func(v *float64, d float64) {
		if *v == 0 {
			*v = d
		}
	}
	def(&o.DecayTo, DefaultDecayTo)
	def(&o.Periods, DefaultPeriods)
	def(&o.SamplesPerPeriod, DefaultSamplesPerPeriod)
	def(&o.Band, DefaultBand)
	if o.MinSamples == 0 {
		o.MinSamples = DefaultMinSamples
	}
	if o.MaxSamples == 0 {
		o.MaxSamples = DefaultMaxSamples
	}
	switch {
	case !(o.Duration >= 0) || math.IsInf(o.Duration, 0):
		return o, fmt.Errorf("response: window duration %g is not a finite number ≥ 0", o.Duration)
	case o.Samples < 0 || o.Samples > maxSteps:
		return o, fmt.Errorf("response: %d samples is outside 0 to %d", o.Samples, maxSteps)
	case !(o.DecayTo > 0 && o.DecayTo < 1):
		return o, fmt.Errorf("response: decay fraction %g is not between 0 and 1", o.DecayTo)
	case !(o.Periods > 0) || math.IsInf(o.Periods, 0):
		return o, fmt.Errorf("response: %g periods is not a positive number", o.Periods)
	case !(o.SamplesPerPeriod > 0) || math.IsInf(o.SamplesPerPeriod, 0):
		return o, fmt.Errorf("response: %g samples per period is not a positive number", o.SamplesPerPeriod)
	case o.MinSamples < 1 || o.MaxSamples < o.MinSamples || o.MaxSamples > maxSteps:
		return o, fmt.Errorf("response: sample bounds %d to %d are not 1 ≤ min ≤ max ≤ %d", o.MinSamples, o.MaxSamples, maxSteps)
	case !(o.Band > 0 && o.Band < 1):
		return o, fmt.Errorf("response: settling band %g is not between 0 and 1", o.Band)
	}
	return o, nil
}

// Span is the time window of a response: Samples steps of length Step,
// t_k = k·Step for k = 0 … Samples, Duration = Samples·Step.
// Its JSON names are duration, step, samples, slowest_decay (null when
// infinite) and oscillation.
type Span struct {
	Duration float64 `json:"duration"`
	Step     float64 `json:"step"`
	Samples  int     `json:"samples"`
	// SlowestDecay is the least decay rate σ of the closed-loop poles
	// (1/time unit): −max Re p for continuous loops, −ln(max |z|)/T for
	// sampled ones. +Inf for a loop with no poles or only poles at z = 0.
	SlowestDecay float64 `json:"slowest_decay"`
	// Oscillation is the angular frequency (rad per time unit) of the
	// slowest visible oscillation (see rule), 0 if none.
	Oscillation float64 `json:"oscillation"`
}

// mode is one closed-loop pole seen as a mode of the response: decay
// rate σ and angular frequency ω ≥ 0, per time unit.
type mode struct{ sigma, omega float64 }

// modesContinuous turns s-plane poles into modes.
func modesContinuous(poles []complex128) []mode {
	m := make([]mode, len(poles))
	for i, p := range poles {
		m[i] = mode{-real(p), math.Abs(imag(p))}
	}
	return m
}

// modesSampled turns z-plane poles of a loop with period T into modes:
// z = e^((−σ + jω)T).
func modesSampled(poles []complex128, period float64) []mode {
	m := make([]mode, len(poles))
	for i, z := range poles {
		r := cmplx.Abs(z)
		sigma := math.Inf(1)
		if r > 0 {
			sigma = -math.Log(r) / period
		}
		m[i] = mode{sigma, math.Abs(cmplx.Phase(z)) / period}
	}
	return m
}

// rule is the window rule of Window on modes; without modes the window
// lasts empty time units.
func rule(modes []mode, o Options, empty float64) Span {
	lnD := math.Log(1 / o.DecayTo)
	sp := Span{SlowestDecay: math.Inf(1)}
	wFast := 0.0
	for _, m := range modes {
		sp.SlowestDecay = min(sp.SlowestDecay, m.sigma)
		if m.omega > 0 && m.sigma*2*math.Pi/m.omega < lnD {
			if sp.Oscillation == 0 || m.omega < sp.Oscillation {
				sp.Oscillation = m.omega
			}
			wFast = max(wFast, m.omega)
		}
	}
	d := 0.0
	if !math.IsInf(sp.SlowestDecay, 1) {
		d = lnD / sp.SlowestDecay
	}
	if sp.Oscillation > 0 {
		d = max(d, o.Periods*2*math.Pi/sp.Oscillation)
	}
	if d == 0 {
		d = empty
	}
	if o.Duration > 0 {
		d = o.Duration
	}
	n := o.Samples
	if n == 0 {
		want := math.Ceil(o.SamplesPerPeriod * d * wFast / (2 * math.Pi))
		n = int(min(max(want, float64(o.MinSamples)), float64(o.MaxSamples)))
	}
	sp.Duration, sp.Samples, sp.Step = d, n, d/float64(n)
	return sp
}

// ruleSampled is the window of a sampled loop of period T whose
// characteristic polynomial has degree deg: the rule of rule in time,
// rounded up to whole samples and at least deg+1 of them (a dead-beat
// loop settles within deg samples), with Samples bounded by MaxSamples
// only. Options.Samples fixes the count.
func ruleSampled(modes []mode, period float64, deg int, o Options) Span {
	n := o.Samples
	o.MinSamples, o.Samples = 1, 0
	sp := rule(modes, o, 0)
	if n == 0 {
		// The quotient is rounded up, less a few rounding errors so that a
		// Duration of exactly k periods gives k samples.
		q := sp.Duration / period
		n = int(min(math.Ceil(q*(1-1e-12)), float64(o.MaxSamples)))
		n = min(max(n, deg+1), maxSteps)
	}
	sp.Samples, sp.Step, sp.Duration = n, period, float64(n)*period
	return sp
}

// MarshalJSON implements json.Marshaler, writing an infinite
// SlowestDecay as null.
func (s Span) MarshalJSON() ([]byte, error) {
	type plain Span
	type withNull struct {
		plain
		SlowestDecay *float64 `json:"slowest_decay"`
	}
	w := withNull{plain: plain(s)}
	if !math.IsInf(s.SlowestDecay, 0) {
		w.SlowestDecay = &s.SlowestDecay
	}
	return json.Marshal(w)
}
