package boundary

import "gainscape/regions/grid"

// join links refined crossings into polylines by marching squares: inside
// each grid cell the crossings on its four edges are paired into segments,
// and segments sharing a crossing are chained.
func join(m *grid.Map, edges []edgeKey, found []crossing, at map[edgeKey]int) []Curve {
	n := len(edges)
	adj := make([][]int, n)
	link := func(a, b int) {
		adj[a] = append(adj[a], b)
		adj[b] = append(adj[b], a)
	}
	nx, ny := m.XAxis.N, m.YAxis.N
	for j := 0; j+1 < ny; j++ {
		for i := 0; i+1 < nx; i++ {
			// Edges in order around the cell: bottom, right, top, left.
			around := [4]edgeKey{{i, j, true}, {i + 1, j, false}, {i, j + 1, true}, {i, j, false}}
			var idx []int
			for _, e := range around {
				if v, ok := at[e]; ok {
					idx = append(idx, v)
				}
			}
			switch len(idx) {
			case 2, 3:
				link(idx[0], idx[1])
			case 4:
				// Saddle: the corners that share a count with the
				// bottom-left corner across the diagonal decide the pairing.
				if m.Count(i, j) == m.Count(i+1, j+1) && m.Count(i+1, j) != m.Count(i, j) {
					// Bottom-left and top-right joined: cut off the other corners.
					link(idx[0], idx[1]) // bottom–right around (i+1, j)
					link(idx[2], idx[3]) // top–left around (i, j+1)
				} else {
					link(idx[3], idx[0]) // left–bottom around (i, j)
					link(idx[1], idx[2]) // right–top around (i+1, j+1)
				}
			}
		}
	}
	seen := make([]bool, n)
	var curves []Curve
	walk := func(start int) {
		chain := []int{start}
		seen[start] = true
		for cur := start; ; {
			next := -1
			for _, v := range adj[cur] {
				if !seen[v] {
					next = v
					break
				}
			}
			if next < 0 {
				break
			}
			seen[next] = true
			chain = append(chain, next)
			cur = next
		}
		curves = append(curves, split(chain, found)...)
	}
	for k := 0; k < n; k++ {
		if !seen[k] && len(adj[k]) != 2 {
			walk(k)
		}
	}
	for k := 0; k < n; k++ {
		if !seen[k] {
			walk(k)
		}
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
