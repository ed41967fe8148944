package study

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"gainscape/regions/expr"
	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
	"gainscape/regions/spec"
	"gainscape/regions/zoh"
)

// LoopSpec is a loop as the user gives it: a plant expression or
// coefficient lists (highest power first), a controller family name and
// values for some of its parameters.
type LoopSpec struct {
	Plant      string
	Num, Den   []float64
	Controller string
	Fixed      []spec.Value
	// TimeUnit is the unit of time of s (scenario.TimeUnits); it labels
	// the reports only.
	TimeUnit string
	// Sample, when positive, makes the loop a sampled-data loop with a
	// digital controller: a plant in s is discretised with a zero-order
	// hold (zoh.Discretise, its dead time included), a plant in z is
	// taken as it is, and the controller is the digital form of its
	// structure with Integral the rule for its integral (family.Digital;
	// "" is the default, backward).
	Sample   float64
	Integral string
	// Prewarp, when positive, pre-warps the trapezoidal rule of a digital
	// lead, lag or lead-lag at that frequency (rad per time unit,
	// family.DigitalPrewarped); 0 leaves it unwarped.
	Prewarp float64
}

// PlantText is the plant as the user gave it, for titles and reports.
func (ls LoopSpec) PlantText() string {
	if ls.Plant != "" {
		return ls.Plant
	}
	return fmt.Sprintf("(%s)/(%s)", numbersText(ls.Num), numbersText(ls.Den))
}

// Build parses and checks the plant, looks up the controller family and
// sets the fixed values over the family defaults. Errors are
// *InputError values naming the flag of the faulty input.
func (ls LoopSpec) Build() (loop.Loop, error) {
	var pn, pd poly.Poly
	var delay float64
	inZ := false
	switch {
	case ls.Plant != "" && (ls.Num != nil || ls.Den != nil):
		return loop.Loop{}, inputErr("--plant", "loop.plant", "", "cannot be combined with --num/--den; give the plant one way")
	case ls.Plant != "":
		pl, err := ls.parsePlant()
		if err != nil {
			return loop.Loop{}, &InputError{Flag: "--plant", Key: "loop.plant", Err: err}
		}
		pn, pd, delay, inZ = pl.Num, pl.Den, pl.Delay, pl.Var == 'z'
		if err := expr.Check(pn, pd); err != nil {
			return loop.Loop{}, &InputError{Flag: "--plant", Key: "loop.plant", Value: strconv.Quote(ls.Plant), Err: err}
		}
	case ls.Num != nil && ls.Den != nil:
		pn, pd = poly.FromDescending(ls.Num), poly.FromDescending(ls.Den)
		if err := expr.Check(pn, pd); err != nil {
			return loop.Loop{}, &InputError{Flag: "--num", Key: "loop.numerator", Value: listText(ls.Num) + " --den " + listText(ls.Den), Err: err}
		}
	default:
		return loop.Loop{}, inputErr("--plant", "loop.plant", "", "give the plant as --plant EXPR, or as both --num and --den")
	}
	if pn.Degree() < 0 {
		flag, key := "--plant", "loop.plant"
		if ls.Plant == "" {
			flag, key = "--num", "loop.numerator"
		}
		return loop.Loop{}, inputErr(flag, key, "", "the plant numerator is zero: the loop would have no feedback")
	}
	fam, err := family.Lookup(ls.Controller)
	if err != nil {
		return loop.Loop{}, &InputError{Flag: "--ctrl", Key: "loop.controller", Err: err}
	}
	plant := loop.Plant{Num: pn, Den: pd, Delay: delay}
	if err := ls.checkSampling(inZ); err != nil {
		return loop.Loop{}, err
	}
	if ls.Sample > 0 {
		if plant, err = ls.sampled(plant, inZ); err != nil {
			return loop.Loop{}, err
		}
		if fam, err = ls.digital(fam); err != nil {
			return loop.Loop{}, err
		}
	}
	l := loop.New(plant, fam)
	if n, d := l.Open(); max(len(n), len(d))-1 > MaxDegree {
		flag, key := "--plant", "loop.plant"
		if ls.Plant == "" {
			flag, key = "--den", "loop.denominator"
		}
		return loop.Loop{}, inputErr(flag, key, "", "plant and controller %s make a loop of degree %d; the limit is %d", fam.Name(), max(len(n), len(d))-1, MaxDegree)
	}
	for _, v := range ls.Fixed {
		i, err := family.Index(fam, v.Param)
		if err != nil {
			return loop.Loop{}, &InputError{Flag: "--set", Key: "fixed." + v.Param, Value: fmt.Sprintf("%s=%g", v.Param, v.V), Err: err}
		}
		l.Values[i] = v.V
	}
	return l, nil
}

// parsePlant reads the plant expression: in s, with at most one dead
// time, or, for a sampled loop, in z when it is written in z.
func (ls LoopSpec) parsePlant() (expr.Plant, error) {
	pl, err := expr.ParsePlant(ls.Plant)
	if err == nil {
		return pl, nil
	}
	if zp, zerr := expr.ParseIn(ls.Plant, 'z'); zerr == nil {
		return zp, nil
	}
	return expr.Plant{}, err
}

// sampled returns the plant a digital controller sampling every
// ls.Sample sees: the plant itself when it is given in z, its zero-order
// hold discretisation when it is given in s.
func (ls LoopSpec) sampled(p loop.Plant, inZ bool) (loop.Plant, error) {
	T := ls.Sample
	if inZ {
		return loop.Plant{Num: p.Num, Den: p.Den, Sample: T}, nil
	}
	num, den, err := zoh.Discretise(p.Num, p.Den, T, p.Delay)
	if err != nil {
		return loop.Plant{}, &InputError{Flag: "--sample", Key: "loop.sample", Value: strconv.FormatFloat(T, 'g', -1, 64), Err: err}
	}
	return loop.Plant{Num: num, Den: den, Sample: T}, nil
}

// MaxDegree is the highest degree of the closed-loop characteristic
// polynomial (plant and controller together) a study accepts. The cost of
// a node grows with the cube of the degree and the answers with the
// conditioning of the roots, and loops of practical use stay far below it.
const MaxDegree = 40

// Value is a named parameter value, for reports that list parameters in
// the family's order.
type Value struct {
	Name  string
	Value float64
}

// valuesOf lists the parameters of l other than skip, in family order.
func valuesOf(l loop.Loop, skip ...int) []Value {
	var out []Value
	for i, p := range l.Family.Params() {
		if !slices.Contains(skip, i) {
			out = append(out, Value{p.Name, l.Values[i]})
		}
	}
	return out
}

// valueMap is valuesOf as a map, for JSON.
func valueMap(l loop.Loop, skip ...int) map[string]float64 {
	out := map[string]float64{}
	for _, v := range valuesOf(l, skip...) {
		out[v.Name] = v.Value
	}
	return out
}

// ValuesText lists values as "kd = 0.5, tau = 0".
func ValuesText(vs []Value) string {
	parts := make([]string, len(vs))
	for i, v := range vs {
		parts[i] = fmt.Sprintf("%s = %g", v.Name, v.Value)
	}
	return strings.Join(parts, ", ")
}

// listText writes coefficients as the --num and --den flags take them.
func listText(c []float64) string {
	return strconv.Quote(strings.Join(formatAll(c), ", "))
}

func numbersText(v []float64) string { return strings.Join(formatAll(v), ",") }

func formatAll(v []float64) []string {
	parts := make([]string, len(v))
	for i, x := range v {
		parts[i] = strconv.FormatFloat(x, 'g', -1, 64)
	}
	return parts
}
