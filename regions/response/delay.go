package response

import (
	"fmt"
	"math"

	"gainscape/regions/poly"
)

// Tolerances of the Padé approximants a dead-time loop uses: for its
// poles and stability (the roots are then refined on the exact
// quasi-polynomial), and for the whole response when the dead time is
// shorter than one step of the window.
const (
	padeTolPoles    = 1e-6
	padeTolResponse = 1e-10
	// padeReach stretches the frequency range over which the approximant
	// must hold beyond the bandwidth.
	padeReach = 2
)

// planDelay settles the window and method of a loop with dead time.
//
// Poles and stability: e^(−Ls) is replaced by its (n, n) Padé
// approximant with n the least order whose error stays within 1e-6 up to
// twice the bandwidth ω_b (the greatest ω with |C·G(jω)| ≥ 0.1); the
// approximant's characteristic polynomial must pass the sign array at
// orders n and n+1 alike (for a retarded loop the approximants' roots
// converge to those of the quasi-polynomial in any bounded region;
// recalled), and its roots are refined by Newton's method on the exact
// quasi-polynomial Dc·D + Nc·N·e^(−Ls). The window rule then runs on the
// refined roots and the window is lengthened by L.
//
// Response: the method of steps (see delayRun) with the step shortened
// so that a whole number of steps spans L; when L is shorter than the
// step the rule gives and such a step would need more than MaxSamples
// steps, the response is that of the Padé approximant of order chosen
// for an error within 1e-10 up to twice ω_b.
func planDelay(l Loop, o Options) (*plan, error) {
	if l.PlantNum.Degree() >= l.PlantDen.Degree() || l.CtrlNum.Degree() > l.CtrlDen.Degree() {
		return nil, fmt.Errorf("response: a loop with dead time needs a strictly proper plant and a proper controller "+
			"(otherwise impulses or jumps would travel around the loop at every multiple of the delay), in %v", l)
	}
	wb := bandwidth(l)
	if math.IsInf(wb, 1) {
		return nil, fmt.Errorf("response: %w: the loop gain |C·G| is still above %g at ω = 10⁶/L, in %v", ErrUndecided, gainFloor, l)
	}
	x := padeReach * wb * l.Delay
	n, ok := padeOrder(x, padeTolPoles)
	if !ok {
		return nil, fmt.Errorf("response: %w: no Padé approximant up to order %d holds the dead time to %g up to ω·L = %.3g, in %v",
			ErrUndecided, maxPade, padeTolPoles, x, l)
	}
	p := &plan{opt: o, cl: newClosedLoop(l)}
	deltas, errs := make([]poly.Poly, 2), make([]error, 2)
	for i, order := range []int{n, n + 1} {
		deltas[i] = newClosedLoop(padeLoop(l, order)).delta
		what := fmt.Sprintf("the characteristic polynomial with the (%d, %d) Padé approximant of the dead time", order, order)
		errs[i] = requireStable(deltas[i], what, dropInfinity, l)
	}
	if (errs[0] == nil) != (errs[1] == nil) {
		return nil, fmt.Errorf("response: %w: the Padé approximants of orders %d and %d of the dead time disagree on stability, in %v",
			ErrUndecided, n, n+1, l)
	}
	if errs[0] != nil {
		return nil, errs[0]
	}
	delta := deltas[0]
	starts, err := delta.Roots()
	if err != nil {
		return nil, fmt.Errorf("response: %w in %v", err, l)
	}
	p.poles = dominantRoots(poly.Mul(l.CtrlDen, l.PlantDen), p.cl.setpointY, l.Delay, starts)
	if len(p.poles) == 0 || real(p.poles[0]) >= 0 {
		return nil, fmt.Errorf("response: %w: the Padé approximant is stable but the refined roots of the quasi-polynomial are not, in %v", ErrUndecided, l)
	}
	span := rule(modesContinuous(p.poles), o, 1)
	if o.Duration == 0 {
		span.Duration += l.Delay
	}
	h := span.Duration / float64(span.Samples)
	// Quotients are rounded up, less a few rounding errors, so that a
	// delay of exactly k steps is k steps.
	p.steps = int(math.Ceil(l.Delay / h * (1 - 1e-12)))
	h = l.Delay / float64(p.steps)
	samples := math.Ceil(span.Duration / h * (1 - 1e-12))
	if samples > float64(o.MaxSamples) && p.steps == 1 {
		return p.padeResponse(l, span, x)
	}
	span.Step, span.Samples = h, int(samples)
	span.Duration = h * samples
	p.span = span
	p.method = fmt.Sprintf("method of steps with %d steps per dead time: matrix exponential of plant and controller, "+
		"the delayed plant input taken as the Hermite cubic through its values and slopes one delay earlier", p.steps)
	return p, nil
}

// padeResponse turns p into the plan for a dead time shorter than one
// step of span: a rational loop with the Padé approximant of the order
// that holds the delay to 1e-10 up to ω·L = x.
func (p *plan) padeResponse(l Loop, span Span, x float64) (*plan, error) {
	n, _ := padeOrder(x, padeTolResponse)
	pl := padeLoop(l, n)
	p.cl = newClosedLoop(pl)
	what := fmt.Sprintf("the characteristic polynomial with the (%d, %d) Padé approximant of the dead time", n, n)
	if err := requireStable(p.cl.delta, what, dropInfinity, l); err != nil {
		return nil, err
	}
	p.steps = 0
	span.Step = span.Duration / float64(span.Samples)
	p.span = span
	p.method = fmt.Sprintf("matrix exponential of the closed loop in controllable canonical form with the (%d, %d) Padé approximant "+
		"of a dead time shorter than one step", n, n)
	return p, nil
}
