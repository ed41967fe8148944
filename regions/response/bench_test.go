package response

import (
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/margins"
)

// benchLoops are invented design points: a filtered PID on a third-order
// lag, a PI on the plant with dead time of fopdtLoop, and a sampled PI.
func benchLoops() map[string]Loop {
	num, den := family.Controller(family.PID{}, []float64{2, 0.8, 1, 0.05})
	return map[string]Loop{
		"pid":     {PlantNum: p(1), PlantDen: p(1, 3, 3, 1), CtrlNum: num, CtrlDen: den},
		"delay":   fopdtLoop([]float64{0.6, 0.8}, []float64{1, 0}),
		"sampled": {PlantNum: p(0.5), PlantDen: p(1, -0.8), CtrlNum: p(1.2, -1), CtrlDen: p(1, -1), Period: 0.1},
	}
}

func benchStep(b *testing.B, name string) {
	l := benchLoops()[name]
	for b.Loop() {
		if _, err := Step(l, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkStepPID is the cost of both responses and every figure of
// one design point of degree 5.
func BenchmarkStepPID(b *testing.B)     { benchStep(b, "pid") }
func BenchmarkStepDelay(b *testing.B)   { benchStep(b, "delay") }
func BenchmarkStepSampled(b *testing.B) { benchStep(b, "sampled") }

// BenchmarkPolesPID is the reference for the ratio: gonum's eigenvalues
// of the characteristic polynomial of the same design point.
func BenchmarkPolesPID(b *testing.B) {
	l := benchLoops()["pid"]
	delta := family.Characteristic(l.PlantNum, l.PlantDen, l.CtrlNum, l.CtrlDen)
	for b.Loop() {
		if _, err := margins.Poles(delta); err != nil {
			b.Fatal(err)
		}
	}
}
