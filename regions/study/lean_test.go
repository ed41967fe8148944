package study

import (
	"testing"

	"gainscape/regions/spec"
)

// TestOverlaysOnlyWhatIsUsed checks that the decay-rate grid is computed
// only when something shows, searches or writes it: not for Ms iso-lines
// alone, but for the data file, the shading and the searches.
func TestOverlaysOnlyWhatIsUsed(t *testing.T) {
	base := scenarioOf("1/(s+1)^3", "pi", spec.Axis{Param: "kp", Min: 0, Max: 6}, spec.Axis{Param: "ki", Min: 0, Max: 2}, 30, 20)
	base.Overlays.MsLevels = []float64{1.4, 2}
	tests := []struct {
		name      string
		data      bool
		shade     bool
		best      []string
		wantDecay bool
	}{
		{name: "Ms iso-lines only"},
		{name: "with data", data: true, wantDecay: true},
		{name: "shaded", shade: true, wantDecay: true},
		{name: "search", best: []string{BestIntegral}, wantDecay: true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			sc := base
			sc.Overlays.Decay, sc.Overlays.Best = tc.shade, tc.best
			if tc.data {
				sc.Output.Data = "region.json"
			}
			res := runMap(t, sc)
			if res.Overlays == nil || res.Overlays.Ms == nil {
				t.Fatal("no Ms layer")
			}
			if got := res.Overlays.Decay != nil; got != tc.wantDecay {
				t.Fatalf("decay layer computed: %v, want %v", got, tc.wantDecay)
			}
			doc := res.Data()
			if got := doc.Extra.Overlays.DecayRate != nil; got != tc.wantDecay {
				t.Fatalf("decay layer in the data: %v, want %v", got, tc.wantDecay)
			}
		})
	}
}
