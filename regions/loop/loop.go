// Package loop is the model of a unity negative-feedback loop: a plant
// under a controller structure with parameter values. It is the one place
// that forms the open loop L = C·G and the closed-loop characteristic
// function, and that chooses the stability test that fits the loop.
package loop

import (
	"fmt"

	"gainscape/regions/delay"
	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
	"gainscape/regions/unitcircle"
)

// Plant is the model of the process under control, with ascending
// coefficients:
//
//	G(s) = Num(s)/Den(s)·e^(−Delay·s)
//
// in continuous time, or, when Sample is positive, G(z) = Num(z)/Den(z),
// the plant as a digital controller sampling every Sample time units sees
// it (through a zero-order hold, any dead time folded into powers of z:
// see package zoh), Delay then being 0.
type Plant struct {
	Num, Den poly.Poly
	// Delay is the dead time of a continuous-time plant, 0 for none.
	Delay float64
	// Sample is the sample time of a sampled-data loop, 0 for a
	// continuous-time loop.
	Sample float64
}

// Kind names the kind of a loop, for reports: "continuous", "dead time"
// or "sampled".
func (p Plant) Kind() string {
	switch {
	case p.Sample > 0:
		return "sampled"
	case p.Delay > 0:
		return "dead time"
	}
	return "continuous"
}

// Loop is a plant under a controller family with one value per parameter.
type Loop struct {
	Plant  Plant
	Family family.Family
	// Values holds one value per Family.Params(), in order.
	Values []float64
}

// New returns the loop of plant under fam with the family's default
// parameter values.
func New(plant Plant, fam family.Family) Loop {
	return Loop{Plant: plant, Family: fam, Values: family.Defaults(fam)}
}

// With returns a copy of l whose parameters xi and yi are set to x and y
// (xi may equal yi, then y wins). The values are copied, so l is unchanged.
func (l Loop) With(xi int, x float64, yi int, y float64) Loop {
	v := append([]float64(nil), l.Values...)
	v[xi], v[yi] = x, y
	l.Values = v
	return l
}

// Set returns a copy of l with parameter i set to v.
func (l Loop) Set(i int, v float64) Loop { return l.With(i, v, i, v) }

// Controller returns the numerator and denominator of C at l's values.
func (l Loop) Controller() (num, den poly.Poly) { return family.Controller(l.Family, l.Values) }

// Open returns the numerator Nc·N and denominator Dc·D of the open loop
// L = C·G without its dead time.
func (l Loop) Open() (num, den poly.Poly) {
	cn, cd := l.Controller()
	return poly.Mul(cn, l.Plant.Num), poly.Mul(cd, l.Plant.Den)
}

// Characteristic returns the closed-loop characteristic polynomial
// Dc·D + Nc·N at the loop's parameter values (in s, or in z for a sampled
// loop), without leading coefficients that are exactly zero: a structure
// that lacks a term (an ideal derivative, tau = 0) has a lower degree,
// not a root at infinity. A loop with dead time has no characteristic
// polynomial; it panics then (use Function).
func (l Loop) Characteristic() poly.Poly {
	if l.Plant.Delay > 0 {
		panic("loop: a loop with dead time has a characteristic function, not a polynomial")
	}
	num, den := l.Open()
	return poly.Add(den, num).Trim(0)
}

// Function returns the closed-loop characteristic function at the loop's
// parameter values, the argument of the loop's stability Test: the
// characteristic polynomial, or for a loop with dead time
// Δ(s) = Dc·D + Nc·N·e^(−Delay·s), both parts without leading
// coefficients that are exactly zero, as Characteristic.
func (l Loop) Function() stability.Function {
	if l.Plant.Delay > 0 {
		num, den := l.Open()
		return stability.Function{P: den.Trim(0), Q: num.Trim(0), Delay: l.Plant.Delay}
	}
	return stability.Function{P: l.Characteristic()}
}

// Test returns the stability test for the loop: the count of roots
// outside the unit circle for a sampled loop, the argument principle on
// the quasi-polynomial for a loop with dead time, the Routh sign array
// otherwise.
func (l Loop) Test() stability.Test {
	switch {
	case l.Plant.Sample > 0:
		return unitcircle.Test{T: l.Plant.Sample}
	case l.Plant.Delay > 0:
		return delay.Test{}
	}
	return routh.Test{}
}

// Param returns the index of the named parameter of l's family.
func (l Loop) Param(name string) (int, error) { return family.Index(l.Family, name) }

// Check reports a loop whose values do not match its family.
func (l Loop) Check() error {
	if n := len(l.Family.Params()); len(l.Values) != n {
		return fmt.Errorf("%d parameter values for controller %q with %d parameters", len(l.Values), l.Family.Name(), n)
	}
	return nil
}
