package render

import (
	"reflect"
	"testing"

	"gainscape/regions/stability"
)

// entryTexts returns the headings and entry texts of a legend.
func entryTexts(secs []legendSection) map[string][]string {
	out := map[string][]string{}
	for _, s := range secs {
		for _, e := range s.entries {
			out[s.heading] = append(out[s.heading], e.text)
		}
	}
	return out
}

func TestLegendListsWhatIsPresent(t *testing.T) {
	plain := sampleFigure()
	withoutUndecided := sampleFigure()
	for i, c := range withoutUndecided.Map.RHP {
		if c < 0 {
			withoutUndecided.Map.RHP[i] = 1
		}
	}
	withoutUndecided.Curves = withoutUndecided.Curves[:1]
	withoutUndecided.Marks = nil
	tests := []struct {
		name string
		f    Figure
		want map[string][]string
	}{
		{"sample", plain, map[string][]string{
			"Region": {"stable", "1 root in RHP", "2 roots in RHP", "3 roots in RHP", "undecided"},
			"Edge":   {kindNames[stability.Complex], kindNames[stability.Real], kindNames[stability.Infinite]},
			"Marks":  {"design point"},
		}},
		{"no undecided, complex edge only, no marks", withoutUndecided, map[string][]string{
			"Region": {"stable", "1 root in RHP", "2 roots in RHP", "3 roots in RHP"},
			"Edge":   {kindNames[stability.Complex]},
		}},
		{"counts above six", denseFigure(), map[string][]string{
			"Region": {"stable", "1 root in RHP", "2 roots in RHP", "3 roots in RHP", "4 roots in RHP", "5 roots in RHP", "6 or more roots in RHP"},
			"Edge":   {kindNames[stability.Complex]},
		}},
		{"shaded with iso-lines", shadedFigure(), map[string][]string{
			"Region":    {"stable", "1 root in RHP", "2 roots in RHP", "3 roots in RHP", "undecided"},
			"Edge":      {kindNames[stability.Complex], kindNames[stability.Real], kindNames[stability.Infinite]},
			"Iso-lines": {"Ms = 1.8, 3"},
			"Marks":     {"design point"},
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f := tc.f.withDefaults()
			var scale *shadeScale
			if f.Shade != nil {
				lo, hi, _ := f.Shade.Range()
				scale = newShadeScale(lo, hi)
			}
			got := entryTexts(legendSections(&f, countColours(scale != nil), scale))
			if !reflect.DeepEqual(got, tc.want) {
				t.Errorf("legend\n got %q\nwant %q", got, tc.want)
			}
		})
	}
}
