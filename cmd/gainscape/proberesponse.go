package main

import (
	"context"
	"fmt"
	"io"

	"gainscape/internal/safefile"
	"gainscape/regions/export"
	"gainscape/regions/study"
	"gainscape/render"
)

// probeWithResponse runs probe with its step responses drawn to
// --response: the file is checked before any work and written whole.
func probeWithResponse(ctx context.Context, ls study.LoopSpec, f probeFlags, stdout io.Writer) error {
	format, err := imageFormat(f.response, "", false)
	if err != nil {
		return userErr("--response: %v", err)
	}
	plan := safefile.NewPlan()
	out := plan.Add("--response", f.response)
	if err := plan.Check(); err != nil {
		return usageError{err}
	}
	defer plan.Abort()
	rep, err := study.Probe(ctx, study.ProbeRequest{Loop: ls, X: f.x, Y: f.y, Response: true})
	if err != nil {
		return err
	}
	if rep.Response == nil {
		return userErr("--response: %s", rep.Doc.ResponseFailed)
	}
	r := rep.Response
	fig := render.Responses{
		Title:    fmt.Sprintf("Step responses: G(s) = %s under %s", rep.Doc.Plant, rep.Formula),
		Notes:    []string{study.ValuesText(rep.Values)},
		Series:   []render.Series{{Label: study.ValuesText(rep.Values), Time: r.Time, Setpoint: r.Setpoint.Output, Load: r.Load.Output}},
		TimeUnit: rep.Units.TimeLabel(),
	}
	if err := out.Write(ctx, func(w io.Writer) error { return render.WriteResponses(w, format, fig) }); err != nil {
		return err
	}
	if err := plan.Commit(); err != nil {
		return err
	}
	if f.json {
		return export.Write(stdout, rep.Doc)
	}
	printProbe(stdout, rep)
	fmt.Fprintf(stdout, "responses    %s\n", f.response)
	return nil
}

// printStepFigures writes the figures of the step responses.
func printStepFigures(w io.Writer, rep *study.ProbeReport) {
	f := rep.Response.Figures
	t := rep.Units.TimeLabel()
	fmt.Fprintf(w, "\nStep responses (exact, over %.4g %s, the slowest pole decayed to 0.1%%):\n", rep.Response.Span.Duration, t)
	fmt.Fprintf(w, "  setpoint step  final value %.4g, overshoot %s%%, rise time (10–90%%) %s %s, settling time (2%%) %s %s\n",
		f.FinalSetpoint, num(export.Number(f.Overshoot)), num(export.Number(f.RiseTime)), t, num(export.Number(f.SettlingTime)), t)
	fmt.Fprintf(w, "  load step      final value %.4g, peak %.4g at %.4g %s, IAE %.4g %s, IE %.4g %s (unit step at the plant input)\n",
		f.FinalLoad, f.PeakLoad, f.PeakTimeLoad, t, f.IAELoad, t, f.IELoad, t)
}
