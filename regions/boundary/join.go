package boundary

import (
	"gainscape/regions/grid"
	"gainscape/regions/isoline"
)

// join links refined crossings into polylines by marching squares
// (isoline.Segments and isoline.Chain): inside each grid cell the crossings
// on its edges are paired into segments, a saddle cell being resolved by
// its counts, and segments sharing a crossing are chained. Chains are
// then cut where the kind of crossing changes.
func join(m *grid.Map, edges []edgeKey, found []crossing) []Curve {
	at := make(map[edgeKey]int, len(edges))
	for k, e := range edges {
		at[e] = k
	}
	crossingAt := func(i, j int, horiz bool) int {
		if k, ok := at[edgeKey{i, j, horiz}]; ok {
			return k
		}
		return -1
	}
	// A saddle joins bottom-left and top-right when those two corners
	// share a count and the bottom-right one differs.
	saddle := func(i, j int) bool {
		return m.Count(i, j) == m.Count(i+1, j+1) && m.Count(i+1, j) != m.Count(i, j)
	}
	segs := isoline.Segments(m.XAxis.N, m.YAxis.N, nil, crossingAt, saddle)
	var curves []Curve
	for _, chain := range isoline.Chain(len(edges), segs) {
		curves = append(curves, split(chain, found)...)
	}
	return curves
}

// split cuts a chain of crossings into curves of one kind each.
func split(chain []int, found []crossing) []Curve {
	var out []Curve
	for _, k := range chain {
		c := found[k]
		if len(out) == 0 || out[len(out)-1].Kind != c.kind {
			out = append(out, Curve{Kind: c.kind})
		}
		last := &out[len(out)-1]
		last.Points = append(last.Points, c.pt)
	}
	return out
}
