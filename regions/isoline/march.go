package isoline

// Segments runs marching squares, the two-dimensional form of marching
// cubes (W. E. Lorensen and H. E. Cline, "Marching cubes: a high
// resolution 3D surface construction algorithm", SIGGRAPH 1987), over the
// cells of a grid of nx × ny nodes, and returns the segments that join the
// crossings inside each cell, in cell scan order (row by row from cell
// (0, 0), x fastest).
//
// inCell(i, j), when not nil, says whether the cell whose lower-left node
// is (i, j) takes part; a cell that does not yields no segment.
// crossing(i, j, horiz) returns the number of the crossing on the grid
// edge from node (i, j) to node (i+1, j) when horiz, or to node (i, j+1)
// otherwise, or −1 if that edge is not crossed. A cell crossed on two
// edges gets one segment between them. A cell crossed on more edges is
// resolved by resolve(i, j, at), with at its crossings in the order
// bottom, right, top, left (−1 where none), which returns its segments:
// Saddle gives the usual pairings of a cell crossed on all four.
//
// This is the one marching-squares routine: the iso-lines of overlays and
// the stability edges of maps both use it.
func Segments(nx, ny int, inCell func(i, j int) bool, crossing func(i, j int, horiz bool) int, resolve func(i, j int, at [4]int) [][2]int) [][2]int {
	var segs [][2]int
	for j := 0; j+1 < ny; j++ {
		for i := 0; i+1 < nx; i++ {
			if inCell != nil && !inCell(i, j) {
				continue
			}
			at := [4]int{crossing(i, j, true), crossing(i+1, j, false), crossing(i, j+1, true), crossing(i, j, false)}
			var hit []int
			for _, c := range at {
				if c >= 0 {
					hit = append(hit, c)
				}
			}
			switch {
			case len(hit) == 2:
				segs = append(segs, [2]int{hit[0], hit[1]})
			case len(hit) > 2:
				segs = append(segs, resolve(i, j, at)...)
			}
		}
	}
	return segs
}

// Saddle returns the segments of a cell crossed on all four edges (at:
// bottom, right, top, left) for pairing p: JoinDiagonal joins the
// lower-left and upper-right corners through the centre, cutting off the
// other two corners with the segments bottom–right and top–left;
// CutDiagonal joins the other diagonal, with the segments bottom–left and
// right–top; Across gives bottom–top and left–right, for crossings that
// lie on the cell's corners, where the two segments touch rather than
// cross.
func Saddle(at [4]int, p Pairing) [][2]int {
	switch p {
	case JoinDiagonal:
		return [][2]int{{at[0], at[1]}, {at[2], at[3]}}
	case CutDiagonal:
		return [][2]int{{at[0], at[3]}, {at[1], at[2]}}
	}
	return [][2]int{{at[0], at[2]}, {at[3], at[1]}}
}

// Pairing says how a saddle cell joins its four crossings (see Segments).
type Pairing int8

// The pairings of a saddle cell.
const (
	JoinDiagonal Pairing = iota
	CutDiagonal
	Across
)

// Chain joins segments between crossings numbered 0 … n−1 into polylines
// of crossing numbers. Every crossing ends at most two segments (a grid
// edge borders two cells), so each chain is a simple path or a loop. Open
// chains come first, in the order of their lowest-numbered end, each
// running from that end to the other; a crossing that no segment reaches
// is a chain of its own; closed chains follow, each starting at its
// lowest-numbered crossing and ending with it again. The result depends
// only on the arguments.
func Chain(n int, segs [][2]int) [][]int {
	ends := make([][2]int, n) // segments ending at each crossing, −1 when absent
	for c := range ends {
		ends[c] = [2]int{-1, -1}
	}
	for s, seg := range segs {
		for _, c := range seg {
			if ends[c][0] < 0 {
				ends[c][0] = s
			} else {
				ends[c][1] = s
			}
		}
	}
	used := make([]bool, len(segs))
	// walk follows segments from crossing c, away from segment s, and
	// returns the crossings it passes after c.
	walk := func(s, c int) []int {
		var out []int
		for {
			next := -1
			for _, k := range ends[c] {
				if k >= 0 && k != s && !used[k] {
					next = k
					break
				}
			}
			if next < 0 {
				return out
			}
			used[next] = true
			if seg := segs[next]; seg[0] == c {
				c = seg[1]
			} else {
				c = seg[0]
			}
			out = append(out, c)
			s = next
		}
	}
	var chains [][]int
	grow := func(c int) {
		chain := append([]int{c}, walk(-1, c)...)
		chains = append(chains, chain)
	}
	// Open chains (and crossings no segment reaches, as chains of one)
	// from their lowest-numbered end, then closed chains from their
	// lowest-numbered crossing.
	for c := range ends {
		if ends[c][1] < 0 && (ends[c][0] < 0 || !used[ends[c][0]]) {
			grow(c)
		}
	}
	for c := range ends {
		if ends[c][0] >= 0 && !used[ends[c][0]] {
			grow(c)
		}
	}
	return chains
}
