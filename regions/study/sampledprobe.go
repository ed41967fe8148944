package study

import (
	"cmp"
	"math"
	"math/cmplx"
	"slices"

	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/margins"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
	"gainscape/regions/unitcircle"
)

// poleFigures fills the poles, decay rate and damping of doc from the
// characteristic polynomial: poles in s, or for a loop sampled every T
// (T > 0) poles in z, slowest (largest |z|) first, with their continuous
// equivalents ln(z)/T, the largest root magnitude, the decay rate
// −ln(max |z|)/T and the damping of the equivalents (unitcircle.Grade).
func poleFigures(doc *export.Probe, char poly.Poly, T float64) error {
	poles, err := margins.Poles(char)
	if err != nil {
		return err
	}
	if T <= 0 {
		for _, p := range poles {
			doc.Poles = append(doc.Poles, [2]float64{real(p), imag(p)})
		}
		doc.DecayRate, doc.MinDamping = export.Number(margins.DecayRate(poles)), export.Number(margins.MinDamping(poles))
		return nil
	}
	slices.SortStableFunc(poles, func(a, b complex128) int {
		if c := cmp.Compare(cmplx.Abs(b), cmplx.Abs(a)); c != 0 {
			return c
		}
		return cmp.Compare(imag(b), imag(a))
	})
	doc.ContinuousPoles = []export.Number2{}
	for _, z := range poles {
		doc.Poles = append(doc.Poles, [2]float64{real(z), imag(z)})
		s := complex(math.Inf(-1), 0)
		if z != 0 {
			s = cmplx.Log(z) / complex(T, 0)
		}
		doc.ContinuousPoles = append(doc.ContinuousPoles, export.Number2{export.Number(real(s)), export.Number(imag(s))})
	}
	g := unitcircle.GradeRoots(poles, T)
	r := g.Radius
	doc.RootRadius = &r
	doc.DecayRate, doc.MinDamping = export.Number(g.Decay), export.Number(g.Damping)
	return nil
}

// loopMargins returns the margins of the open loop of l: on ω ≥ 0 for a
// continuous loop, on 0 ≤ ω ≤ π/T on the unit circle for a sampled one.
func loopMargins(l loop.Loop) (margins.Margins, error) {
	num, den := l.Open()
	if T := l.Plant.Sample; T > 0 {
		return margins.SampledLoop{Num: num, Den: den, T: T}.Margins()
	}
	return margins.Loop{Num: num, Den: den, Delay: l.Plant.Delay}.Margins()
}

// ultimateGain returns the ultimate gain and period of the
// proportional-only loop of l's plant, nil when there is none. For a
// sampled loop they come from the crossing of the unit circle
// (margins.SampledUltimate): a pair at e^(±jθ) with Tu = 2π·T/θ, or a real
// root at z = −1 with Tu = 2T; the ultimate-cycle rules, which were made
// for continuous-time controllers, are then applied as they stand to the
// digital controller of the same structure, and each setting is checked
// with the unit-circle test, as the note says.
func ultimateGain(l loop.Loop) (*export.Ultimate, error) {
	if T := l.Plant.Sample; T > 0 {
		ku, tu, kind, ok := margins.SampledUltimate(l.Plant.Num, l.Plant.Den, T, l.Test())
		if !ok {
			return nil, nil
		}
		return &export.Ultimate{Ku: ku, Tu: tu, Kind: kind.String(), RulesApply: true,
			Method: "Ku and Tu of the sampled proportional-only loop, where its roots cross the unit circle; the rules were made for continuous-time controllers and are applied as they stand to the digital controller of the same structure, each setting checked with the unit-circle test"}, nil
	}
	ku, tu, ok, from, err := ultimateWithDelay(l)
	if err != nil || !ok {
		return nil, err
	}
	return &export.Ultimate{Ku: ku, Tu: tu, Kind: stability.Complex.String(), From: from, RulesApply: true}, nil
}

// ruleFamily returns the controller structure a tuning rule sets: the
// continuous one, or its digital form for a sampled loop.
func ruleFamily(name string, sampling *Sampling) (family.Family, error) {
	if sampling == nil {
		return family.Lookup(name)
	}
	rule, err := family.ParseIntegralRule(sampling.Integral)
	if err != nil {
		return nil, err
	}
	return family.Digital(name, sampling.T, rule)
}

// unstableSide names the unstable side of the loop's stability boundary.
func unstableSide(l loop.Loop) string {
	if l.Plant.Sample > 0 {
		return "outside the unit circle"
	}
	return "in the right half plane"
}
