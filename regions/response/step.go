package response

import (
	"fmt"
)

// Step returns the closed-loop responses of l to a unit setpoint step
// and to a unit load step at the plant input, with their design figures.
// It refuses a loop that is not asymptotically stable (ErrUnstable) or
// whose stability rounding could decide (ErrUndecided): the responses of
// such a loop are not design figures. See the package documentation for
// the methods and their limits.
func Step(l Loop, opt Options) (*Result, error) {
	p, err := newPlan(l, opt)
	if err != nil {
		return nil, err
	}
	switch {
	case p.sampled:
		return p.sampledRun(l)
	case p.steps > 0:
		return p.delayed(l)
	}
	return p.rational(l)
}

// Window returns the time window Step would use for l with opt. With
// σmin the least decay rate of the closed-loop poles and the visible
// oscillations those poles with ω > 0 that keep more than DecayTo of
// their amplitude over one period (σ·2π/ω < ln(1/DecayTo)):
//
//	Duration = max(ln(1/DecayTo)/σmin, Periods·2π/ωslow)
//	Samples  = clamp(⌈SamplesPerPeriod·Duration·ωfast/(2π)⌉, MinSamples, MaxSamples)
//
// ωslow and ωfast being the least and greatest visible ω: the slowest
// mode decays to DecayTo (0.1%, about 6.9 time constants, by default),
// the slowest visible oscillation shows Periods periods (3), and the
// fastest gets SamplesPerPeriod samples per period (20). A loop without
// poles gets one time unit. Options.Duration and Options.Samples override
// either part.
//
// Sampled loops take the poles' modes z = e^((−σ + jω)T) and round the
// duration up to whole periods T, at least deg Δ + 1 of them (a
// dead-beat loop settles within deg Δ samples), at most MaxSamples.
// Dead-time loops take the dominant roots of the quasi-polynomial (see
// the package documentation), lengthen the duration by L, and shorten
// the step so that a whole number of steps spans L: this raises the
// count, to at most twice the rule's when L is longer than the rule's
// step and to Duration/L otherwise, unless that exceeds MaxSamples,
// when the response takes a Padé approximant of the delay instead.
func Window(l Loop, opt Options) (Span, error) {
	p, err := newPlan(l, opt)
	if err != nil {
		return Span{}, err
	}
	return p.span, nil
}

// plan is what Step settles before computing anything: the closed loop
// it realises, its poles and window, and the method.
type plan struct {
	opt   Options
	cl    closedLoop
	poles []complex128
	span  Span
	// steps > 0 marks a dead-time loop solved by the method of steps,
	// with steps time steps per dead time.
	steps   int
	sampled bool
	method  string
}

func newPlan(l Loop, opt Options) (*plan, error) {
	o, err := opt.resolve()
	if err != nil {
		return nil, err
	}
	if err := l.check(); err != nil {
		return nil, err
	}
	if l.Delay > 0 {
		return planDelay(l, o)
	}
	p := &plan{opt: o, cl: newClosedLoop(l), sampled: l.Period > 0}
	if err := wellPosed(p.cl, l); err != nil {
		return nil, err
	}
	what := "the characteristic polynomial " + name(p.cl.delta, "s")
	if l.Period > 0 {
		what = "the characteristic polynomial " + name(p.cl.delta, "z") + " mapped by z = (1+w)/(1−w)"
		if err := requireStable(bilinear(p.cl.delta), what, dropMinusOne, l); err != nil {
			return nil, err
		}
		if p.poles, err = polesSampled(p.cl.delta, l); err != nil {
			return nil, err
		}
		p.span = ruleSampled(modesSampled(p.poles, l.Period), l.Period, len(p.cl.delta)-1, o)
		p.method = "exact difference equations of the closed loop in controllable canonical form"
		return p, nil
	}
	if err := requireStable(p.cl.delta, what, dropInfinity, l); err != nil {
		return nil, err
	}
	if p.poles, err = polesContinuous(p.cl.delta, l); err != nil {
		return nil, err
	}
	p.span = rule(modesContinuous(p.poles), o, 1)
	p.method = "matrix exponential of the closed loop in controllable canonical form"
	return p, nil
}

// times returns t_k = k·h for k = 0 … N.
func (p *plan) times() []float64 {
	t := make([]float64, p.span.Samples+1)
	for k := range t {
		t[k] = float64(k) * p.span.Step
	}
	return t
}

// outputs realises the three closed-loop transfer functions over the
// shared state and refuses an output that would hold an impulse (or, in
// z, look ahead in time).
func (p *plan) outputs(l Loop) (sh *shared, ys, us, yl output, err error) {
	d := p.cl.delta
	sh = newShared(d)
	ys, us, yl = sh.output(p.cl.setpointY, d), sh.output(p.cl.setpointU, d), sh.output(p.cl.loadY, d)
	if len(ys.impulse) > 0 || len(yl.impulse) > 0 {
		return nil, ys, us, yl, fmt.Errorf("response: the plant output would hold an impulse (a plant with more zeros than poles), in %v", l)
	}
	if l.Period > 0 && len(us.impulse) > 0 {
		return nil, ys, us, yl, fmt.Errorf("response: the controller output would depend on future errors (C(z) has more zeros than poles), in %v", l)
	}
	return sh, ys, us, yl, nil
}

// rational computes the responses of a loop without dead time.
func (p *plan) rational(l Loop) (*Result, error) {
	sh, ys, us, yl, err := p.outputs(l)
	if err != nil {
		return nil, err
	}
	state := sh.continuous(p.span)
	wys, wyl := sh.wave(ys, p.span, state), sh.wave(yl, p.span, state)
	return p.result(wys, wyl, sh.values(us), us.impulse), nil
}

// sampledRun computes the responses of a sampled-data loop.
func (p *plan) sampledRun(l Loop) (*Result, error) {
	sh, ys, us, yl, err := p.outputs(l)
	if err != nil {
		return nil, err
	}
	sh.march(p.span.Samples, sh.m, sh.b())
	wys := sampledWave(sh.values(ys), l.Period)
	wyl := sampledWave(sh.values(yl), l.Period)
	return p.result(wys, wyl, sh.values(us), nil), nil
}

// sampledWave returns the wave of samples v with period T, its running
// integral being that of the signal held over each period.
func sampledWave(v []float64, period float64) wave {
	w := wave{h: period, v: v, run: make([]float64, len(v))}
	for k := 1; k < len(v); k++ {
		w.run[k] = w.run[k-1] + period*v[k-1]
	}
	return w
}

// result assembles the traces and figures from the output waves of the
// two steps and the controller output of the setpoint step.
func (p *plan) result(ys, yl wave, u, impulse []float64) *Result {
	fs, fl := p.cl.finals(p.sampled)
	r := &Result{Time: p.times(), Span: p.span, Poles: p.poles, Method: p.method}
	neg := func(v []float64) []float64 {
		out := make([]float64, len(v))
		for i, x := range v {
			out[i] = -x
		}
		return out
	}
	r.Setpoint = Trace{Output: ys.v, Control: u, Error: ys.affine(1, -1).v, ControlImpulse: impulse}
	r.Load = Trace{Output: yl.v, Control: neg(ys.v), Error: neg(yl.v)}
	r.Figures = figures(ys, yl, fs, fl, p.opt.Band)
	return r
}
