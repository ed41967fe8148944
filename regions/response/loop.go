package response

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gainscape/regions/family"
	"gainscape/regions/poly"
)

// Loop is a unity negative-feedback loop. The controller C =
// CtrlNum/CtrlDen acts on the error e = r − y; the load d adds to the
// controller output u at the plant input; the plant gives
// y = G·(u + d) with G = PlantNum/PlantDen, times e^(−Delay·s) when
// Delay > 0. All four polynomials hold ascending coefficients, as
// family.Controller returns them.
//
// Period > 0 makes the loop sampled: the four polynomials are then in z,
// G(z) already discretised (a zero-order hold and any whole-sample dead
// time z^(−d) included), and Delay must be zero.
type Loop struct {
	PlantNum, PlantDen poly.Poly
	CtrlNum, CtrlDen   poly.Poly
	// Delay is the dead time L ≥ 0 of a continuous plant.
	Delay float64
	// Period is the sample period T of a sampled-data loop; 0 for
	// continuous time.
	Period float64
}

// ErrUnstable is wrapped by the error Step returns for a loop that is
// not asymptotically stable: a root on the unstable side, on the
// stability boundary, or gone to infinity (an ill-posed loop). Responses
// of such a loop are not design figures.
var ErrUnstable = errors.New("closed loop is not stable")

// ErrUndecided is wrapped by the error Step returns when rounding could
// decide whether the loop is stable.
var ErrUndecided = errors.New("stability of the closed loop is undecided")

// String writes the loop as a person would, for error messages.
func (l Loop) String() string {
	v := "s"
	if l.Period > 0 {
		v = "z"
	}
	g := fmt.Sprintf("G(%s) = (%s)/(%s)", v, name(l.PlantNum, v), name(l.PlantDen, v))
	if l.Delay != 0 {
		g += fmt.Sprintf("·e^(−%gs)", l.Delay)
	}
	c := fmt.Sprintf("C(%s) = (%s)/(%s)", v, name(l.CtrlNum, v), name(l.CtrlDen, v))
	if l.Period > 0 {
		return fmt.Sprintf("%s, %s, T = %g", g, c, l.Period)
	}
	return g + ", " + c
}

// name writes p in the variable v.
func name(p poly.Poly, v string) string {
	return strings.ReplaceAll(p.String(), "s", v)
}

// check returns an error, carrying the loop, for input Step cannot use.
func (l Loop) check() error {
	for _, p := range []struct {
		what string
		p    poly.Poly
	}{{"plant numerator", l.PlantNum}, {"plant denominator", l.PlantDen},
		{"controller numerator", l.CtrlNum}, {"controller denominator", l.CtrlDen}} {
		if !p.p.Finite() {
			return fmt.Errorf("response: %s has a coefficient that is not a finite number in %v", p.what, l)
		}
	}
	if l.PlantDen.Degree() < 0 || l.CtrlDen.Degree() < 0 {
		return fmt.Errorf("response: a denominator is zero in %v", l)
	}
	if !(l.Delay >= 0) || math.IsInf(l.Delay, 0) {
		return fmt.Errorf("response: dead time %g is not a finite number ≥ 0 in %v", l.Delay, l)
	}
	if !(l.Period >= 0) || math.IsInf(l.Period, 0) {
		return fmt.Errorf("response: sample period %g is not a finite number ≥ 0 in %v", l.Period, l)
	}
	if l.Period > 0 && l.Delay > 0 {
		return fmt.Errorf("response: a sampled loop carries its dead time in G(z) as a factor z^(−d), not as Delay, in %v", l)
	}
	return nil
}

// trimmed returns p without leading coefficients that are exactly zero.
func trimmed(p poly.Poly) poly.Poly { return p[:p.Degree()+1] }

// closedLoop holds the characteristic polynomial and the numerators of
// the closed-loop transfer functions that the responses need, all over
// the one denominator Δ = Dc·D + Nc·N:
//
//	setpoint → y: Nc·N/Δ    setpoint → u: Nc·D/Δ    load → y: N·Dc/Δ
//
// The other responses follow exactly: e = r − y, and the controller
// output under the load step is u = −Nc·N/Δ, the negated setpoint → y.
//
// illPosed is set when the leading coefficients of Dc·D and Nc·N cancel
// exactly, 1 + C·G = 0 at infinity: a root of Δ has gone to infinity.
// roundedLead is set when they cancel to within a bound on the rounding
// of the sum, so that the degree of Δ is noise.
type closedLoop struct {
	delta                       poly.Poly
	setpointY, setpointU, loadY poly.Poly
	illPosed, roundedLead       bool
}

func newClosedLoop(l Loop) closedLoop {
	n, d, nc, dc := trimmed(l.PlantNum), trimmed(l.PlantDen), trimmed(l.CtrlNum), trimmed(l.CtrlDen)
	delta := family.Characteristic(n, d, nc, dc)
	c := closedLoop{
		delta:     trimmed(delta),
		setpointY: poly.Mul(nc, n),
		setpointU: poly.Mul(nc, d),
		loadY:     poly.Mul(n, dc),
		illPosed:  delta.Degree() < len(delta)-1,
	}
	if !c.illPosed && len(delta) > 0 {
		// The sum of the magnitudes of the products that form the leading
		// coefficient bounds its rounding: each product and the sum add
		// at most one unit of rounding per term.
		abs := family.Characteristic(absPoly(n), absPoly(d), absPoly(nc), absPoly(dc))
		k := len(delta) - 1
		c.roundedLead = math.Abs(delta[k]) <= 4*float64(len(delta))*epsilon*abs[k]
	}
	return c
}

// epsilon is the unit of rounding of float64.
const epsilon = 0x1p-52

// absPoly returns p with every coefficient replaced by its magnitude.
func absPoly(p poly.Poly) poly.Poly {
	a := make(poly.Poly, len(p))
	for i, v := range p {
		a[i] = math.Abs(v)
	}
	return a
}

// finals returns the final values of the setpoint and load responses of
// y, H(0) for continuous loops and H(1) for sampled ones, from the
// polynomials themselves.
func (c closedLoop) finals(sampled bool) (setpoint, load float64) {
	at := func(p poly.Poly) float64 {
		if sampled {
			return p.EvalReal(1)
		}
		if len(p) == 0 {
			return 0
		}
		return p[0]
	}
	d := at(c.delta)
	return at(c.setpointY) / d, at(c.loadY) / d
}
