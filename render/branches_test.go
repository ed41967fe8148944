package render

import (
	"testing"

	"gonum.org/v1/plot/vg"
)

// TestBranchSitesThinned: the marks of a later branch keep branchSpacing
// from each other, stay inside the area and keep their order.
func TestBranchSitesThinned(t *testing.T) {
	var pts []BranchPoint
	for i := 0; i <= 200; i++ {
		pts = append(pts, BranchPoint{X: float64(i), Y: 0})
	}
	pts = append(pts, BranchPoint{X: -50, Y: 0}) // outside
	area := vg.Rectangle{Min: vg.Point{X: 0, Y: -10}, Max: vg.Point{X: 100, Y: 10}}
	id := func(v float64) vg.Length { return vg.Length(v) / 2 }
	got := branchSites(pts, area, id, id)
	if len(got) != 7 {
		t.Fatalf("%d sites %v, want 7: every 16 units over 100", len(got), got)
	}
	for i := 1; i < len(got); i++ {
		if d := got[i].X - got[i-1].X; d < branchSpacing {
			t.Errorf("sites %v and %v only %v apart", got[i-1], got[i], d)
		}
	}
}

// TestLegendNamesLaterBranches: a figure with later-branch points lists
// them under the edges.
func TestLegendNamesLaterBranches(t *testing.T) {
	f := sampleFigure()
	f.LaterBranches = []BranchPoint{{X: 1, Y: 1}}
	f = f.withDefaults()
	got := entryTexts(legendSections(&f, countColours(false), nil))["Edge"]
	if len(got) == 0 || got[len(got)-1] != "on a later branch" {
		t.Errorf("edge entries %q, want the later branch last", got)
	}
}
