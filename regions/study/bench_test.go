package study

import (
	"context"
	"testing"

	"gainscape/regions/spec"
)

// The window rule against the map it serves: PI on 1/(s+1)⁴, the window
// chosen, then a default 300 × 225 map over it without overlays. Compare
// the two in one run.

func BenchmarkChooseWindow(b *testing.B) {
	l, err := LoopSpec{Plant: migoPlant, Controller: "pi"}.Build()
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := ChooseWindow(context.Background(), l, spec.Axis{Param: "kp"}, spec.Axis{Param: "ki"}, true, true, Options{Workers: 1}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkMapOfChosenWindow(b *testing.B) {
	sc := scenarioOf(migoPlant, "pi", spec.Axis{Param: "kp", Min: -1.5, Max: 4.5}, spec.Axis{Param: "ki", Min: -0.1, Max: 1.1}, 300, 225)
	job, err := NewMap(sc)
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := job.Run(context.Background(), Options{Workers: 1}); err != nil {
			b.Fatal(err)
		}
	}
}
