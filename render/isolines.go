package render

import "gonum.org/v1/plot/plotter"

// Iso-lines are traced here rather than by plotter.Contour because the
// fields have no value (NaN) outside the stable region: a cell with a
// missing corner must yield no line at all, and the label placement
// needs the lines as joined polylines. The method is marching squares on
// the grid, with linear interpolation along cell edges and saddle cells
// resolved by the mean of the four corners.

// edgeID numbers the grid edges: 2·node for the edge to the right of a
// node, 2·node+1 for the edge above it.
type edgeID int

// isoLines returns the polylines, in data units, on which g equals level.
// Closed lines end where they start.
func isoLines(g plotter.GridXYZ, level float64) []plotter.XYs {
	nc, nr := g.Dims()
	node := func(c, r int) int { return r*nc + c }
	points := map[edgeID]plotter.XY{}
	// cross records the crossing on the edge between nodes (c0, r0) and
	// (c1, r1), the second to the right of or above the first.
	cross := func(id edgeID, c0, r0, c1, r1 int) {
		if _, ok := points[id]; ok {
			return
		}
		z0, z1 := g.Z(c0, r0), g.Z(c1, r1)
		t := (level - z0) / (z1 - z0)
		points[id] = plotter.XY{
			X: g.X(c0) + t*(g.X(c1)-g.X(c0)),
			Y: g.Y(r0) + t*(g.Y(r1)-g.Y(r0)),
		}
	}
	var segs [][2]edgeID
	for r := 0; r+1 < nr; r++ {
		for c := 0; c+1 < nc; c++ {
			z := [4]float64{g.Z(c, r), g.Z(c+1, r), g.Z(c+1, r+1), g.Z(c, r+1)}
			if !finite(z[0]) || !finite(z[1]) || !finite(z[2]) || !finite(z[3]) {
				continue
			}
			var up [4]bool
			for k := range z {
				up[k] = z[k] >= level
			}
			// Edges of the cell: bottom, right, top, left.
			ids := [4]edgeID{
				edgeID(2 * node(c, r)), edgeID(2*node(c+1, r) + 1),
				edgeID(2 * node(c, r+1)), edgeID(2*node(c, r) + 1),
			}
			ends := [4][4]int{{c, r, c + 1, r}, {c + 1, r, c + 1, r + 1}, {c, r + 1, c + 1, r + 1}, {c, r, c, r + 1}}
			corners := [4][2]int{{0, 1}, {1, 2}, {3, 2}, {0, 3}}
			var hit []int
			for e, cn := range corners {
				if up[cn[0]] != up[cn[1]] {
					cross(ids[e], ends[e][0], ends[e][1], ends[e][2], ends[e][3])
					hit = append(hit, e)
				}
			}
			switch len(hit) {
			case 2:
				segs = append(segs, [2]edgeID{ids[hit[0]], ids[hit[1]]})
			case 4:
				centreUp := (z[0]+z[1]+z[2]+z[3])/4 >= level
				if centreUp == up[0] {
					// Corners 0 and 2 join through the centre; cut off 1 and 3.
					segs = append(segs, [2]edgeID{ids[0], ids[1]}, [2]edgeID{ids[2], ids[3]})
				} else {
					segs = append(segs, [2]edgeID{ids[0], ids[3]}, [2]edgeID{ids[1], ids[2]})
				}
			}
		}
	}
	return joinSegments(segs, points)
}

// joinSegments chains segments that share an edge crossing into
// polylines. Every crossing belongs to at most two cells, so each chain
// is a simple path or a loop; a loop's walk returns to its first
// crossing, so its polyline ends where it starts.
func joinSegments(segs [][2]edgeID, points map[edgeID]plotter.XY) []plotter.XYs {
	at := map[edgeID][]int{}
	for i, s := range segs {
		at[s[0]] = append(at[s[0]], i)
		at[s[1]] = append(at[s[1]], i)
	}
	used := make([]bool, len(segs))
	// walk follows segments from edge e, away from segment i.
	walk := func(i int, e edgeID) []edgeID {
		var out []edgeID
		for {
			next := -1
			for _, k := range at[e] {
				if k != i && !used[k] {
					next = k
					break
				}
			}
			if next < 0 {
				return out
			}
			used[next] = true
			s := segs[next]
			if s[0] == e {
				e = s[1]
			} else {
				e = s[0]
			}
			out = append(out, e)
			i = next
		}
	}
	var lines []plotter.XYs
	for i, s := range segs {
		if used[i] {
			continue
		}
		used[i] = true
		fwd := walk(i, s[1])
		back := walk(i, s[0])
		chain := make([]edgeID, 0, len(back)+len(fwd)+2)
		for k := len(back) - 1; k >= 0; k-- {
			chain = append(chain, back[k])
		}
		chain = append(chain, s[0], s[1])
		chain = append(chain, fwd...)
		line := make(plotter.XYs, len(chain))
		for k, e := range chain {
			line[k] = points[e]
		}
		lines = append(lines, line)
	}
	return lines
}
