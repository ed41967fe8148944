// Package family defines the controller structures a loop can be built
// from (P, PI, PD, PID, lead, lag, lead-lag) as transfer functions whose
// coefficients depend on named parameters, and forms the closed-loop
// characteristic polynomial of the unity negative-feedback loop.
//
// Adding a structure is one self-contained change: write a Family and
// add it to the list in registry.go.
package family

import (
	"fmt"

	"gainscape/regions/poly"
)

// Param describes one tunable parameter of a controller structure.
type Param struct {
	Name    string  // name used on the command line, e.g. "kp"
	Default float64 // value used when the parameter is neither an axis nor set
	Doc     string  // one line for help text
}

// Family is a controller structure C(s) = Nc(s)/Dc(s) whose coefficients
// depend on named parameters.
//
// Every coefficient of Nc and Dc is a Form: affine in each parameter
// taken alone (no parameter multiplies itself). Then the characteristic
// polynomial Dc·D + Nc·N is affine in each parameter too, which lets a
// two-parameter plane be written exactly as A + x·B + y·C + x·y·E
// (see package plane).
type Family interface {
	// Name is the family's command-line name, e.g. "pid".
	Name() string
	// Formula is a one-line transfer function for titles and help.
	Formula() string
	// Params lists the parameters in a fixed order; Controller's values
	// argument follows the same order.
	Params() []Param
	// Transfer returns C(s) with coefficients that are Forms of the
	// parameters, in the order of Params.
	Transfer() Transfer
}

// Controller returns the numerator and denominator of C(s) of f at the
// given parameter values. It panics if len(values) != len(f.Params()).
func Controller(f Family, values []float64) (num, den poly.Poly) {
	checkLen(f, values)
	return f.Transfer().Eval(values)
}

// Characteristic returns Dc·D + Nc·N, the characteristic polynomial of the
// unity negative-feedback loop around the plant N/D and controller Nc/Dc.
func Characteristic(plantNum, plantDen, ctrlNum, ctrlDen poly.Poly) poly.Poly {
	return poly.Add(poly.Mul(ctrlDen, plantDen), poly.Mul(ctrlNum, plantNum))
}

// Index returns the position of the named parameter in f.Params(),
// or an error that lists the parameters f has.
func Index(f Family, name string) (int, error) {
	for i, p := range f.Params() {
		if p.Name == name {
			return i, nil
		}
	}
	return -1, fmt.Errorf("controller %q has no parameter %q (it has %s)", f.Name(), name, ParamNames(f))
}

// ParamNames returns the parameter names of f joined by commas.
func ParamNames(f Family) string {
	s := ""
	for i, p := range f.Params() {
		if i > 0 {
			s += ", "
		}
		s += p.Name
	}
	return s
}

// Defaults returns the default value of every parameter of f, in order.
func Defaults(f Family) []float64 {
	ps := f.Params()
	v := make([]float64, len(ps))
	for i, p := range ps {
		v[i] = p.Default
	}
	return v
}

func checkLen(f Family, values []float64) {
	if len(values) != len(f.Params()) {
		panic(fmt.Sprintf("family %s: %d values for %d parameters", f.Name(), len(values), len(f.Params())))
	}
}
