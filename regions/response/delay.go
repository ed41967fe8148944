package response

import (
	"fmt"
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
)

// Tolerances of the Padé approximants a dead-time loop uses: for the
// starting points of its roots (refined on the exact quasi-polynomial),
// and for the whole response when the dead time is shorter than one step
// of the window.
const (
	padeTolPoles    = 1e-6
	padeTolResponse = 1e-10
	// padeReach stretches the frequency range over which the approximant
	// must hold beyond the bandwidth.
	padeReach = 2
)

// planDelay settles the window and method of a loop with dead time.
//
// Poles and stability (see delayPoles) come from a Padé approximant of
// e^(−Ls) of order n, the least whose error stays within 1e-6 for ω·L up
// to x = 2·L·max(ω_b, |poles and zeros of C·G|), ω_b the greatest ω with
// |C·G(jω)| ≥ 0.1. The window rule then runs on the refined roots and
// the window is lengthened by L.
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
	x := padeReach * l.Delay * max(wb, rootScale(poly.Mul(l.CtrlDen, l.PlantDen)), rootScale(poly.Mul(l.CtrlNum, l.PlantNum)))
	n, ok := padeOrder(x, padeTolPoles)
	if !ok {
		return nil, fmt.Errorf("response: %w: no Padé approximant up to order %d holds the dead time to %g up to ω·L = %.3g, in %v",
			ErrUndecided, maxPade, padeTolPoles, x, l)
	}
	p := &plan{opt: o, cl: newClosedLoop(l)}
	var err error
	if p.poles, err = delayPoles(l, n, x); err != nil {
		return nil, err
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

// rootScale returns the largest magnitude of the roots of p, 0 if it
// has none or they cannot be found.
func rootScale(p poly.Poly) float64 {
	r, err := trimmed(p).Roots()
	if err != nil {
		return 0
	}
	m := 0.0
	for _, z := range r {
		m = max(m, cmplx.Abs(z))
	}
	return m
}

// delayPoles returns the roots of Δ(s) = Dc·D + Nc·N·e^(−Ls) that
// matter, slowest first, or an error when the loop is not stable or that
// cannot be told. The roots of the characteristic polynomial with the
// (n, n) Padé approximant (gonum eigenvalues) with |s|·L ≤ x are
// refined by Newton's method on Δ itself (dominantRoots). A refined root
// with Re s > 0 is an exact certificate of instability. For a retarded
// loop the roots in the right half plane satisfy |C·G(s)| = |e^(sL)| ≥ 1,
// so they lie where the approximant holds; its roots outside that range
// lie near the zeros of the Padé denominator, in the left half plane
// (recalled). An approximant root in the right half plane that does not
// refine, or lies outside the range, leaves stability undecided, and so
// does a refined root within 1e-9 of its size of the imaginary axis.
func delayPoles(l Loop, n int, x float64) ([]complex128, error) {
	starts, err := newClosedLoop(padeLoop(l, n)).delta.Roots()
	if err != nil {
		return nil, fmt.Errorf("response: %w in %v", err, l)
	}
	var near []complex128
	for _, s := range starts {
		if cmplx.Abs(s)*l.Delay <= x {
			near = append(near, s)
		} else if real(s) >= 0 {
			return nil, fmt.Errorf("response: %w: the (%d, %d) Padé approximant puts a root at %v, outside the range where it holds, in %v",
				ErrUndecided, n, n, s, l)
		}
	}
	roots, failed := dominantRoots(poly.Mul(l.CtrlDen, l.PlantDen), poly.Mul(l.CtrlNum, l.PlantNum), l.Delay, near)
	for _, s := range failed {
		if real(s) >= 0 {
			return nil, fmt.Errorf("response: %w: Newton's method from the approximant's root %v does not converge, in %v", ErrUndecided, s, l)
		}
	}
	if len(roots) == 0 {
		return nil, fmt.Errorf("response: %w: no root of the quasi-polynomial found near the approximant's, in %v", ErrUndecided, l)
	}
	top := roots[0]
	switch {
	case real(top) > 1e-9*cmplx.Abs(top):
		return nil, fmt.Errorf("response: %w: the quasi-polynomial of the dead-time loop has a root at %v, in %v", ErrUnstable, top, l)
	case real(top) >= -1e-9*cmplx.Abs(top):
		return nil, fmt.Errorf("response: %w: the quasi-polynomial has a root at %v, on the imaginary axis within rounding, in %v", ErrUndecided, top, l)
	}
	return roots, nil
}
