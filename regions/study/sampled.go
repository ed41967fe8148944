package study

import (
	"fmt"
	"math"
	"strconv"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/margins"
	"gainscape/regions/overlay"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// Sampling describes how a sampled-data loop samples: every T time units,
// with a digital integral by the named rule.
type Sampling struct {
	T float64
	// Integral names the rule of the digital integral: backward, forward
	// or trapezoid.
	Integral string
	// Prewarp is the frequency at which lead and lag are pre-warped, 0 for
	// none.
	Prewarp float64
}

// Nyquist returns π/T, the highest frequency a sampled signal can show.
func (s Sampling) Nyquist() float64 { return math.Pi / s.T }

// Text says in words how the loop samples, for summaries and notes:
// "sampled every T = 0.5 s (zero-order hold), integral by backward
// difference; ω up to π/T = 6.283 rad/s".
func (s Sampling) Text(u Units) string {
	rule := map[string]string{"backward": "backward difference", "forward": "forward difference", "trapezoid": "the trapezoidal rule"}[s.Integral]
	t := fmt.Sprintf("sampled every T = %g %s (zero-order hold), integral by %s", s.T, u.TimeLabel(), rule)
	if s.Prewarp > 0 {
		t += fmt.Sprintf(", lead/lag pre-warped at %g %s", s.Prewarp, u.Freq())
	}
	return t + fmt.Sprintf("; ω up to π/T = %.4g %s", s.Nyquist(), u.Freq())
}

// sampledOf returns the sampling of l, nil for a continuous-time loop.
func sampledOf(l loop.Loop, ls LoopSpec) *Sampling {
	if l.Plant.Sample <= 0 {
		return nil
	}
	rule := family.Backward.String()
	if r, err := family.ParseIntegralRule(ls.Integral); err == nil && ls.Integral != "" {
		rule = r.String()
	}
	return &Sampling{T: l.Plant.Sample, Integral: rule, Prewarp: ls.Prewarp}
}

// circleEndText says in words how a loop sampled every T loses stability
// at an interval end.
func circleEndText(k stability.Kind, omega float64, u Units, T float64) string {
	switch k {
	case stability.Real:
		return "a real root crosses the unit circle at z = 1 (the loop drifts away, ω = 0)"
	case stability.Alternating:
		return fmt.Sprintf("a real root crosses the unit circle at z = −1: the output alternates in sign every sample (ω = π/T = %.6g %s, period 2T = %.4g %s)",
			omega, u.Freq(), 2*T, u.TimeLabel())
	case stability.Complex:
		return fmt.Sprintf("a complex pair crosses the unit circle at z = e^(±j%.6g): the loop oscillates at ω = %.6g %s (period %.4g %s)",
			omega*T, omega, u.Freq(), 2*math.Pi/omega, u.TimeLabel())
	case stability.Infinite:
		return "a root passes through infinity (the leading coefficient vanishes: 1 + C·G = 0 at z = ∞)"
	}
	return "the end of the range scanned"
}

// checkSampling refuses sampling settings that do not fit together: a
// sample time that is not a positive finite number or 0, a plant in z
// without a sample time, and a digital integral rule or a pre-warp
// frequency for a continuous-time loop.
func (ls LoopSpec) checkSampling(inZ bool) error {
	T := ls.Sample
	tText := strconv.FormatFloat(T, 'g', -1, 64)
	switch {
	case math.IsNaN(T) || math.IsInf(T, 0) || T < 0:
		return inputErr("--sample", "loop.sample", tText, "a sample time is a positive number, or 0 for a continuous-time controller")
	case T > 0:
		return nil
	case inZ:
		return inputErr("--plant", "loop.plant", strconv.Quote(ls.Plant), "a plant in z needs the sample time: give --sample T")
	case ls.Integral != "":
		return inputErr("--integral", "loop.integral", ls.Integral, "a rule for the digital integral needs a sampled loop: give --sample T")
	case ls.Prewarp != 0:
		return inputErr("--prewarp", "loop.prewarp", strconv.FormatFloat(ls.Prewarp, 'g', -1, 64), "pre-warping needs a sampled loop: give --sample T")
	}
	return nil
}

// digital returns the digital form of the continuous structure fam for
// the sample time, integral rule and pre-warping of ls.
func (ls LoopSpec) digital(fam family.Family) (family.Family, error) {
	rule := family.Backward
	if ls.Integral != "" {
		var err error
		if rule, err = family.ParseIntegralRule(ls.Integral); err != nil {
			return nil, &InputError{Flag: "--integral", Key: "loop.integral", Value: ls.Integral, Err: err}
		}
	}
	if ls.Prewarp != 0 {
		w := strconv.FormatFloat(ls.Prewarp, 'g', -1, 64)
		if math.IsNaN(ls.Prewarp) || ls.Prewarp < 0 {
			return nil, inputErr("--prewarp", "loop.prewarp", w, "a pre-warp frequency is a positive number (rad per time unit), or 0 for none")
		}
		d, err := family.DigitalPrewarped(fam.Name(), ls.Sample, ls.Prewarp)
		if err != nil {
			return nil, &InputError{Flag: "--prewarp", Key: "loop.prewarp", Value: w, Err: err}
		}
		return d, nil
	}
	d, err := family.Digital(fam.Name(), ls.Sample, rule)
	if err != nil {
		return nil, &InputError{Flag: "--ctrl", Key: "loop.controller", Err: err}
	}
	return d, nil
}

// msOverlay returns the fast Ms of the map's nodes: an evaluator whose
// frequency grid covers the loop at the centre of the window, on
// 0 ≤ ω ≤ π/T for a sampled loop.
func msOverlay(s plane.Setup) (overlay.Sensitivity, error) {
	T := s.Plant.Sample
	if T <= 0 {
		ev, err := msEvaluator(s)
		if err != nil {
			return nil, err
		}
		return ev.Ms, nil
	}
	centre := s.At(0.5*(s.X.Min+s.X.Max), 0.5*(s.Y.Min+s.Y.Max))
	num, den := centre.Open()
	lo, _ := margins.SampledLoop{Num: num, Den: den, T: T}.FrequencyRange()
	// The plant's own resonances are the same at every node.
	roots := margins.SampledLoop{Num: centre.Plant.Num, Den: centre.Plant.Den, T: T}.EquivalentRoots()
	ev, err := margins.NewSampledMsEvaluator(T, lo, margins.DefaultMsPerDecade, max(s.OpenNum.Len(), s.OpenDen.Len()), margins.DefaultMsSteps, roots)
	if err != nil {
		return nil, err
	}
	return ev.Ms, nil
}
