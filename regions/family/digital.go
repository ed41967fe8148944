package family

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// IntegralRule is how a digital controller approximates the integral
// ki/s over one sample period T.
type IntegralRule int

// The integral rules.
const (
	// Backward is the backward difference (backward rectangle): the
	// integral gains ki·T·e[k] at step k, ki/s ← ki·T·z/(z − 1). The
	// default.
	Backward IntegralRule = iota
	// Forward is the forward difference (forward rectangle): the integral
	// gains ki·T·e[k−1], ki/s ← ki·T/(z − 1), one sample later.
	Forward
	// Trapezoid is the trapezoidal rule (Tustin):
	// ki/s ← ki·(T/2)·(z + 1)/(z − 1).
	Trapezoid
)

var ruleNames = [...]string{Backward: "backward", Forward: "forward", Trapezoid: "trapezoid"}

// String returns the rule's name as flags give it.
func (r IntegralRule) String() string {
	if r >= 0 && int(r) < len(ruleNames) {
		return ruleNames[r]
	}
	return "IntegralRule(" + strconv.Itoa(int(r)) + ")"
}

// IntegralRuleNames returns the names of the integral rules joined by
// commas, for help text.
func IntegralRuleNames() string { return strings.Join(ruleNames[:], ", ") }

// ParseIntegralRule returns the rule with the given name, or an error that
// carries the name and lists the choices.
func ParseIntegralRule(name string) (IntegralRule, error) {
	for i, n := range ruleNames {
		if n == strings.ToLower(strings.TrimSpace(name)) {
			return IntegralRule(i), nil
		}
	}
	return 0, fmt.Errorf("unknown integral rule %q (choose one of %s)", name, IntegralRuleNames())
}

// Sampled is a Family whose transfer function is in z, for a loop sampled
// every SampleTime seconds.
type Sampled interface {
	Family
	SampleTime() float64
}

// Digital returns the digital form of the registered structure name (p,
// pi, pd, pid, lead, lag, leadlag) for sample time T, with the same
// parameters and defaults as the continuous structure. The integral uses
// rule; the derivative the backward difference s ← (z − 1)/(T·z), with
// the filter tau:
//
//	kd·s/(tau·s + 1)  ←  kd·(z − 1)/(tau·(z − 1) + T·z) = kd·(z − 1)/((tau + T)·z − tau)
//
// (substitute s = (z − 1)/(T·z) and multiply through by T·z); lead and lag
// use the trapezoidal rule s ← (2/T)·(z − 1)/(z + 1) without pre-warping
// (see DigitalPrewarped). T is folded into the coefficients, each of which
// is a Form as the Family contract requires. The error carries the input
// when name is unknown, T is not positive and finite, or rule is not one
// of the rules.
func Digital(name string, T float64, rule IntegralRule) (Sampled, error) {
	return digital(name, T, rule, 0)
}

// DigitalPrewarped is Digital with the trapezoidal rule of lead, lag and
// leadlag pre-warped at the fixed frequency omega (rad/s, 0 < omega < π/T):
// s ← (omega/tan(omega·T/2))·(z − 1)/(z + 1), which makes the digital
// controller's frequency response equal the continuous one at omega.
//
// The frequency must be a constant, not a parameter. Pre-warping at, say,
// the zero z of a lead would put tan(z·T/2) into the coefficients: no
// longer affine in z, so no longer a Form, and the plane of two parameters
// could not be written exactly as A + x·B + y·C + x·y·E. With omega fixed
// the substitution's constant is a number and every coefficient stays
// multi-affine. The error carries the input when name is not lead, lag or
// leadlag, or T or omega is out of range.
func DigitalPrewarped(name string, T, omega float64) (Sampled, error) {
	switch strings.ToLower(strings.TrimSpace(name)) {
	case "lead", "lag", "leadlag":
	default:
		return nil, fmt.Errorf("pre-warping applies to lead, lag and leadlag, not %q", name)
	}
	if !(omega > 0) || !(omega*T < math.Pi) {
		return nil, fmt.Errorf("pre-warp frequency %g rad/s is not between 0 and π/T = %g rad/s", omega, math.Pi/T)
	}
	return digital(name, T, Backward, omega)
}

func digital(name string, T float64, rule IntegralRule, omega float64) (Sampled, error) {
	if !(T > 0) || math.IsInf(T, 1) {
		return nil, fmt.Errorf("sample time %g is not positive and finite", T)
	}
	if rule < 0 || int(rule) >= len(ruleNames) {
		return nil, fmt.Errorf("unknown integral rule %d (choose one of %s)", int(rule), IntegralRuleNames())
	}
	cont, err := Lookup(name)
	if err != nil {
		return nil, err
	}
	c := 2 / T
	if omega > 0 {
		c = omega / math.Tan(omega*T/2)
	}
	return discrete{cont: cont, T: T, rule: rule, c: c, omega: omega}, nil
}

// discrete is a continuous structure turned digital.
type discrete struct {
	cont  Family
	T     float64
	rule  IntegralRule
	c     float64 // the constant of s ← c·(z − 1)/(z + 1)
	omega float64 // the pre-warp frequency, 0 for none
}

// Name implements Family: the continuous structure's name.
func (d discrete) Name() string { return d.cont.Name() }

// Params implements Family: those of the continuous structure.
func (d discrete) Params() []Param { return d.cont.Params() }

// SampleTime implements Sampled.
func (d discrete) SampleTime() float64 { return d.T }

// g formats a number for formulas.
func g(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

// integralFormula is the integral term in z, T as a number.
func (d discrete) integralFormula() string {
	switch d.rule {
	case Forward:
		return "ki·" + g(d.T) + "/(z−1)"
	case Trapezoid:
		return "ki·" + g(d.T/2) + "·(z+1)/(z−1)"
	}
	return "ki·" + g(d.T) + "·z/(z−1)"
}

// Formula implements Family: C(z) exactly, with T as a number.
func (d discrete) Formula() string {
	T := g(d.T)
	switch d.cont.Name() {
	case "p":
		return "C(z) = kp"
	case "pi":
		return "C(z) = kp + " + d.integralFormula()
	case "pd":
		return "C(z) = kp + kd·(z−1)/(" + T + "·z)"
	case "pid":
		return "C(z) = kp + " + d.integralFormula() + " + kd·(z−1)/((tau+" + T + ")·z − tau)"
	case "leadlag":
		return "C(z) = k·(s+z1)(s+z2)/((s+p1)(s+p2)) at s = " + g(d.c) + "·(z−1)/(z+1)" + d.warpNote()
	}
	return "C(z) = k·(s+z)/(s+p) at s = " + g(d.c) + "·(z−1)/(z+1)" + d.warpNote()
}

func (d discrete) warpNote() string {
	if d.omega > 0 {
		return ", pre-warped at " + g(d.omega) + " rad/s"
	}
	return ""
}

// Transfer implements Family. Over a common denominator, with T and the
// substitution constant c folded into the coefficients (ascending powers
// of z):
//
//	pi, backward:   ((kp + T·ki)·z − kp) / (z − 1)
//	pi, forward:    (kp·z + T·ki − kp) / (z − 1)
//	pi, trapezoid:  ((kp + (T/2)·ki)·z + (T/2)·ki − kp) / (z − 1)
//	pd:             ((T·kp + kd)·z − kd) / (T·z)
//	pid:            (kp·(z − 1)·Df + I(z)·Df + kd·(z − 1)²) / ((z − 1)·Df),
//	                Df = (tau + T)·z − tau, I(z) = T·ki·z, T·ki or (T/2)·ki·(z + 1)
//	lead, lag:      k·((c + z)·z + z − c) / ((c + p)·z + p − c)
//	leadlag:        k·((c + z1)·z + z1 − c)·((c + z2)·z + z2 − c) / (the same in p1, p2)
//
// the last two from s + a = (c·(z − 1) + a·(z + 1))/(z + 1), the factors
// (z + 1) cancelling. Every coefficient is multi-affine in the parameters.
func (d discrete) Transfer() Transfer {
	T, c := d.T, d.c
	switch d.cont.Name() {
	case "p":
		const kp = 0
		return Transfer{Num: []Form{{Times(1, kp)}}, Den: []Form{{Const(1)}}}
	case "pi":
		const kp, ki = 0, 1
		num := []Form{{Times(-1, kp)}, {Times(1, kp)}}
		d.addIntegral(num, ki, nil)
		return Transfer{Num: num, Den: []Form{{Const(-1)}, {Const(1)}}}
	case "pd":
		const kp, kd = 0, 1
		return Transfer{
			Num: []Form{{Times(-1, kd)}, {Times(T, kp), Times(1, kd)}},
			Den: []Form{nil, {Const(T)}},
		}
	case "pid":
		const kp, ki, kd, tau = 0, 1, 2, 3
		num := []Form{
			{Times(1, kp, tau), Times(1, kd)},
			{Times(-2, kp, tau), Times(-T, kp), Times(-2, kd)},
			{Times(1, kp, tau), Times(T, kp), Times(1, kd)},
		}
		// The integral term times Df = (tau + T)·z − tau.
		d.addIntegral(num, ki, []int{tau})
		return Transfer{
			Num: num,
			Den: []Form{{Times(1, tau)}, {Times(-2, tau), Const(-T)}, {Times(1, tau), Const(T)}},
		}
	case "leadlag":
		const k, z1, p1, z2, p2 = 0, 1, 2, 3, 4
		return Transfer{Num: bilinearPair(c, k, z1, z2), Den: bilinearPair(c, -1, p1, p2)}
	}
	const k, z, p = 0, 1, 2
	return Transfer{
		Num: []Form{{Times(1, k, z), Times(-c, k)}, {Times(c, k), Times(1, k, z)}},
		Den: []Form{{Times(1, p), Const(-c)}, {Const(c), Times(1, p)}},
	}
}

// addIntegral adds the integral term of d's rule, in the parameter ki,
// into num: I(z) alone when filter is nil (pi), or I(z)·((tau + T)·z − tau)
// for filter = {tau} (pid).
func (d discrete) addIntegral(num []Form, ki int, filter []int) {
	T := d.T
	// I(z) = i0 + i1·z, each a multiple of ki.
	var i0, i1 float64
	switch d.rule {
	case Backward:
		i1 = T
	case Forward:
		i0 = T
	case Trapezoid:
		i0, i1 = T/2, T/2
	}
	add := func(k int, ts ...Term) {
		for _, t := range ts {
			if t.Coef != 0 {
				num[k] = append(num[k], t)
			}
		}
	}
	if filter == nil {
		add(0, Times(i0, ki))
		add(1, Times(i1, ki))
		return
	}
	tau := filter[0]
	// (i0 + i1·z)·((tau + T)·z − tau)
	//   = −i0·tau + ((i0 − i1)·tau + i0·T)·z + i1·(tau + T)·z²
	add(0, Times(-i0, ki, tau))
	add(1, Times(i0-i1, ki, tau), Times(i0*T, ki))
	add(2, Times(i1, ki, tau), Times(i1*T, ki))
}

// bilinearPair returns the coefficients of g·((c + a)·z + a − c)·((c + b)·z
// + b − c), g being parameter gain (or 1 for gain < 0):
//
//	z²: c² + c·a + c·b + a·b,  z¹: 2·a·b − 2·c²,  z⁰: a·b − c·a − c·b + c².
func bilinearPair(c float64, gain, a, b int) []Form {
	with := func(coef float64, ps ...int) Term {
		if gain >= 0 {
			ps = append(ps, gain)
		}
		return Times(coef, ps...)
	}
	return []Form{
		{with(c * c), with(-c, a), with(-c, b), with(1, a, b)},
		{with(-2 * c * c), with(2, a, b)},
		{with(c * c), with(c, a), with(c, b), with(1, a, b)},
	}
}
