package study

import (
	"errors"
	"fmt"
	"strings"

	"gainscape/regions/loop"
	"gainscape/regions/response"
)

// StepResponse returns the closed-loop responses of the design point l to
// a unit setpoint step and a unit load step at the plant input
// (response.Step: exact for loops without dead time, the method of steps
// with it, difference equations for sampled loops), over a window of
// the given duration, or over the window response.Window chooses from
// the slowest closed-loop pole when duration is 0. A loop that is not
// stable, or whose stability rounding could decide, is an *InputError:
// its responses are no design figures.
func StepResponse(l loop.Loop, duration float64) (*response.Result, error) {
	r, err := response.Step(responseLoop(l), response.Options{Duration: duration})
	if errors.Is(err, response.ErrUnstable) || errors.Is(err, response.ErrUndecided) {
		return nil, inputErr("--set", "fixed", "", "no step response: %s", strings.TrimPrefix(err.Error(), "response: "))
	}
	if err != nil {
		return nil, fmt.Errorf("step response: %w", err)
	}
	return r, nil
}

// ResponseWindow returns the duration of the window response.Window
// chooses for l.
func ResponseWindow(l loop.Loop) (float64, error) {
	sp, err := response.Window(responseLoop(l), response.Options{})
	if err != nil {
		return 0, err
	}
	return sp.Duration, nil
}

// responseLoop is the loop l as package response takes it.
func responseLoop(l loop.Loop) response.Loop {
	cn, cd := l.Controller()
	return response.Loop{PlantNum: l.Plant.Num, PlantDen: l.Plant.Den, CtrlNum: cn, CtrlDen: cd,
		Delay: l.Plant.Delay, Period: l.Plant.Sample}
}

// probeResponse adds the step responses of the probed design point to
// the report, with their figures in its document, or the reason there
// are none.
func probeResponse(rep *ProbeReport, l loop.Loop) {
	r, err := StepResponse(l, 0)
	if ie, ok := err.(*InputError); ok {
		rep.Doc.ResponseFailed = ie.Err.Error()
		return
	}
	if err != nil {
		rep.Doc.ResponseFailed = err.Error()
		return
	}
	rep.Response = r
	f := r.Figures
	rep.Doc.Response = &f
}
