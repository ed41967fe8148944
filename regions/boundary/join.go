package boundary

import (
	"gainscape/regions/grid"
	"gainscape/regions/isoline"
	"gainscape/regions/stability"
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
	// A cell crossed on three edges pairs the two of one kind (a complex
	// edge meeting a real edge that runs along marginal nodes), or else
	// the first two. A saddle whose crossings pair by kind across the cell
	// is joined that way; otherwise it joins bottom-left and top-right
	// when those two corners share a count and the bottom-right one
	// differs.
	resolve := func(i, j int, at [4]int) [][2]int {
		var hit []int
		for _, c := range at {
			if c >= 0 {
				hit = append(hit, c)
			}
		}
		kind := func(c int) stability.Kind { return found[c].kind }
		if len(hit) == 3 {
			for _, p := range [][2]int{{0, 1}, {1, 2}, {0, 2}} {
				a, b := hit[p[0]], hit[p[1]]
				other := hit[3-p[0]-p[1]]
				if kind(a) == kind(b) && kind(other) != kind(a) {
					return [][2]int{{a, b}}
				}
			}
			return [][2]int{{hit[0], hit[1]}}
		}
		b, r, t, l := kind(at[0]), kind(at[1]), kind(at[2]), kind(at[3])
		pairs := func(p, q, u, v stability.Kind) bool { return p == q && u == v }
		switch {
		case pairs(b, t, l, r) && !pairs(b, r, t, l) && !pairs(b, l, r, t):
			return isoline.Saddle(at, isoline.Across)
		case m.Count(i, j) == m.Count(i+1, j+1) && m.Count(i+1, j) != m.Count(i, j):
			return isoline.Saddle(at, isoline.JoinDiagonal)
		}
		return isoline.Saddle(at, isoline.CutDiagonal)
	}
	segs := isoline.Segments(m.XAxis.N, m.YAxis.N, nil, crossingAt, resolve)
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
