package study_test

import (
	"context"
	"fmt"

	"gainscape/regions/scenario"
	"gainscape/regions/spec"
	"gainscape/regions/study"
)

// A map of PI on 1/(s+1)³ in the kp–ki plane: its stable share and the
// frequencies at which the loop oscillates on the complex-pair edge
// (kp = 3ω² − 1, ki = 3ω² − ω⁴, derived by hand in the package tests).
func ExampleMapJob_Run() {
	sc := scenario.Default()
	sc.Loop = scenario.Loop{Plant: "1/(s+1)^3", Controller: "pi"}
	sc.Axes = scenario.Axes{X: spec.Axis{Param: "kp", Min: 0, Max: 8}, Y: spec.Axis{Param: "ki", Min: 0, Max: 3}, Columns: 81, Rows: 61}
	sc.Overlays = scenario.Overlays{}
	job, err := study.NewMap(sc)
	if err != nil {
		fmt.Println(err)
		return
	}
	res, err := job.Run(context.Background(), study.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	lo, hi, _ := res.OmegaRange()
	fmt.Printf("stable %.0f%% of the window; ω on the complex-pair edge from %.2f to %.2f rad/s\n", 100*res.Stats.StableFraction(), lo, hi)
	// Output: stable 52% of the window; ω on the complex-pair edge from 0.58 to 1.73 rad/s
}

// Probing P control of 1/(s+1)³ at kp = 2: gain margin 4 at ω = √3.
func ExampleProbe() {
	rep, err := study.Probe(context.Background(), study.ProbeRequest{Loop: study.LoopSpec{
		Plant: "1/(s+1)^3", Controller: "p", Fixed: []spec.Value{{Param: "kp", V: 2}},
	}})
	if err != nil {
		fmt.Println(err)
		return
	}
	d := rep.Doc
	fmt.Printf("stable %v, gain margin %.4g at ω = %.4g rad/s, Ku = %.4g\n", d.Stable, float64(d.GainMargin), float64(d.PhaseCrossover), d.Ultimate.Ku)
	// Output: stable true, gain margin 4 at ω = 1.732 rad/s, Ku = 8
}

// Comparing PI and PI on a plant of half the gain, the process 1/(s+1)⁴
// of Åström, Panagopoulos & Hägglund (Automatica 34(5), 1998): the
// windows are chosen for the user and shared, and halving the plant
// gain doubles the best design's gains.
func ExampleCompare() {
	c, err := study.Compare(context.Background(), study.CompareRequest{Panels: []study.PanelSpec{
		{Loop: study.LoopSpec{Plant: "1/(s+1)^4", Controller: "pi"}},
		{Loop: study.LoopSpec{Plant: "0.5/(s+1)^4", Controller: "pi"}, PlantLabel: "worn"},
	}, Columns: 80, Rows: 60}, study.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range c.Panels {
		b := p.Table.BestKi
		fmt.Printf("%s: kp = %.3f, ki = %.4f, Ms = %.2f, IE = %.3g s; window %s\n", p.Label, b.Values["kp"], b.Values["ki"], float64(b.Ms), float64(b.IE), p.Window.Text())
	}
	// Output:
	// PI: kp = 0.433, ki = 0.1920, Ms = 1.40, IE = 5.21 s; window kp=-3:9 ki=-0.2:2.2
	// worn: PI: kp = 0.865, ki = 0.3839, Ms = 1.40, IE = 2.6 s; window kp=-3:9 ki=-0.2:2.2
}
