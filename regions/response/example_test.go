package response_test

import (
	"fmt"

	"gainscape/regions/family"
	"gainscape/regions/poly"
	"gainscape/regions/response"
)

// The invented plant G = 2/(3s + 1) under a PI controller, kp = 1,
// ki = 1: the closed loop 3s² + 3s + 2 has poles −0.5 ± j0.645 (worked by
// hand in the package tests). The load error integrates to −1/ki over a
// long window, its magnitude the 1/ki of Åström & Hägglund; the load
// peak is K/(τω)·e^(−σt)·sin ωt at tan ωt = ω/σ, and IAE is
// coth(σπ/(2ω))/ki.
func ExampleStep() {
	num, den := family.Controller(family.ProportionalIntegral{}, []float64{1, 1})
	loop := response.Loop{
		PlantNum: poly.Poly{2},
		PlantDen: poly.FromDescending([]float64{3, 1}),
		CtrlNum:  num,
		CtrlDen:  den,
	}
	r, err := response.Step(loop, response.Options{DecayTo: 1e-9})
	if err != nil {
		fmt.Println(err)
		return
	}
	f := r.Figures
	fmt.Printf("overshoot %.2f%% at t = %.3f, rise time %.3f, settling time %.3f\n", f.Overshoot, f.PeakTimeSetpoint, f.RiseTime, f.SettlingTime)
	fmt.Printf("load: peak %.4f at t = %.3f, IE %.6f, IAE %.4f\n", f.PeakLoad, f.PeakTimeLoad, f.IELoad, f.IAELoad)
	// Output:
	// overshoot 14.52% at t = 3.454, rise time 1.539, settling time 6.215
	// load: peak 0.4029 at t = 1.412, IE -1.000000, IAE 1.1923
}

// A sampled loop: G(z) = 0.5/(z − 0.8) under kp = 1 has its closed-loop
// pole at z = 0.3, so y_k = (5/7)(1 − 0.3^k) (worked by hand in the
// package tests), and the window ends once 0.3^k ≤ 0.001.
func ExampleWindow() {
	loop := response.Loop{
		PlantNum: poly.Poly{0.5},
		PlantDen: poly.FromDescending([]float64{1, -0.8}),
		CtrlNum:  poly.Poly{1},
		CtrlDen:  poly.Poly{1},
		Period:   0.1,
	}
	sp, err := response.Window(loop, response.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d samples of %g: %.3g\n", sp.Samples, sp.Step, sp.Duration)
	// Output:
	// 6 samples of 0.1: 0.6
}
