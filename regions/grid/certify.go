package grid

import (
	"context"

	"gainscape/internal/pool"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// latticeStep is the spacing, in nodes, of the sparse lattice evaluated in
// every region besides the nodes next to the edges: it labels the regions
// no edge comes near and checks that each one holds a single count.
const latticeStep = 16

// EvaluateCertified returns the same map as Evaluate while running the
// stability test at only some of its nodes, for a setup whose axis
// parameters enter the characteristic polynomial affinely (no x·y term),
// given the cells that an edge of the map may enter: touched[j·(nx−1)+i]
// for cell (i, j) between nodes i, i+1 and j, j+1, as the D-partition
// curves traced in ω give them (boundary.Footprint).
//
// Why it may: over a cell the characteristic polynomials form a polytope,
// and by the edge theorem (A. C. Bartlett, C. V. Hollot, H. Lin, "Root
// locations of an entire polytope of polynomials: it suffices to check
// the edges", Math. Control Signals Systems 1, 1988) a root of a
// polynomial inside it can reach the imaginary axis only where one on
// its sides does; a cell whose closed sides no edge of the D-partition
// meets has one count at every point, with no root on the axis. Cells
// that share a side no edge meets share that count, so each connected
// set of untouched cells is one region.
//
// Method: the test runs at every corner of a touched cell and at a sparse
// lattice of nodes (every latticeStep-th node of every latticeStep-th
// row, and the last ones); the untouched cells are joined into regions
// across the sides they share (union–find); every evaluated node on an
// untouched cell labels its region, and the remaining nodes take their
// region's count. A region whose evaluated nodes disagree, or are
// undecided or on an edge, has missed an edge or cannot be labelled; all
// its nodes are then evaluated, and the number of such regions is
// returned as conflicts. m.Evaluated counts the nodes tested. The result
// does not depend on the number of workers.
func EvaluateCertified(ctx context.Context, s plane.Setup, touched []bool, opt Options) (m *Map, conflicts int, err error) {
	nx, ny := s.X.N, s.Y.N
	if nx < 2 || ny < 2 || len(touched) != (nx-1)*(ny-1) {
		panic("grid: touched cells do not match the setup's grid")
	}
	m = NewMap(s.X, s.Y)
	cells := nx - 1
	need := make([]bool, nx*ny)
	for j := 0; j < ny-1; j++ {
		for i := 0; i < cells; i++ {
			if touched[j*cells+i] {
				k := j*nx + i
				need[k], need[k+1], need[k+nx], need[k+nx+1] = true, true, true, true
			}
		}
	}
	for j := 0; j < ny; j++ {
		if j%latticeStep != 0 && j != ny-1 {
			continue
		}
		for i := 0; i < nx; i++ {
			if i%latticeStep == 0 || i == nx-1 {
				need[j*nx+i] = true
			}
		}
	}
	if err := evaluateNodes(ctx, s, m, need, opt); err != nil {
		return nil, 0, err
	}
	rs := untouchedRuns(nx, ny, touched)
	// label[r] is the count of the region whose root run is r, from its
	// evaluated nodes; bad[r] marks a region that cannot be filled.
	const unset = -2
	label := make([]int8, len(rs.runs))
	bad := make([]bool, len(rs.runs))
	for r := range label {
		label[r] = unset
	}
	// nodes calls fn for every node on the cells of run r.
	nodes := func(r int, fn func(k int)) {
		u := rs.runs[r]
		for _, row := range [2]int{int(u.j), int(u.j) + 1} {
			for i := int(u.i0); i <= int(u.i1); i++ {
				fn(row*nx + i)
			}
		}
	}
	for r := range rs.runs {
		root := rs.root[r]
		nodes(r, func(k int) {
			switch {
			case !need[k]:
			case m.RHP[k] == Undecided || m.Axis[k] != 0:
				bad[root] = true
			case label[root] == unset:
				label[root] = m.RHP[k]
			case label[root] != m.RHP[k]:
				bad[root] = true
			}
		})
	}
	for r := range rs.runs {
		if root := rs.root[r]; int(root) == r && (bad[root] || label[root] == unset) {
			bad[root] = true
			conflicts++
		}
	}
	// Every node of a region that cannot be filled is evaluated.
	redo := make([]bool, nx*ny)
	any := false
	for r := range rs.runs {
		if bad[rs.root[r]] {
			nodes(r, func(k int) {
				if !need[k] {
					redo[k], need[k], any = true, true, true
				}
			})
		}
	}
	if any {
		if err := evaluateNodes(ctx, s, m, redo, Options{Workers: opt.Workers}); err != nil {
			return nil, 0, err
		}
	}
	for r := range rs.runs {
		root := rs.root[r]
		if bad[root] {
			continue
		}
		count := label[root]
		nodes(r, func(k int) {
			if !need[k] {
				m.RHP[k], m.Axis[k] = count, 0
			}
		})
	}
	for _, v := range need {
		if v {
			m.Evaluated++
		}
	}
	return m, conflicts, nil
}

// evaluateNodes runs the test at the nodes k with which[k] set, row by
// row in parallel.
func evaluateNodes(ctx context.Context, s plane.Setup, m *Map, which []bool, opt Options) error {
	type scratch struct {
		counter stability.Counter
		buf     *plane.Scratch
	}
	newScratch := func() scratch { return scratch{s.NewCounter(), s.NewScratch()} }
	nx := s.X.N
	return pool.Each(ctx, s.Y.N, opt.Workers, opt.Progress, newScratch, func(w scratch, j int) {
		y := s.Y.At(j)
		row := which[j*nx : (j+1)*nx]
		for i, v := range row {
			if v {
				m.Set(j*nx+i, w.counter.Count(s.Function(w.buf, s.X.At(i), y)))
			}
		}
	})
}

// cellRun is a run of untouched cells i0 … i1−1 in cell row j: its nodes
// are i0 … i1 of node rows j and j+1.
type cellRun struct{ j, i0, i1 int32 }

// runSet is the untouched cells as runs along the rows, each with the
// root run of its region: runs are joined where they share a side,
// which for runs of neighbouring rows means overlapping columns.
type runSet struct {
	runs []cellRun
	root []int32
}

// untouchedRuns returns the runs of untouched cells and their regions
// (union–find with path halving; the first run of a region is its root,
// so roots do not depend on the order of the unions).
func untouchedRuns(nx, ny int, touched []bool) runSet {
	cells := nx - 1
	var rs runSet
	first := make([]int, ny) // index of the first run of each cell row
	for j := 0; j < ny-1; j++ {
		first[j] = len(rs.runs)
		row := touched[j*cells : (j+1)*cells]
		for i := 0; i < cells; {
			if row[i] {
				i++
				continue
			}
			i0 := i
			for i < cells && !row[i] {
				i++
			}
			rs.runs = append(rs.runs, cellRun{int32(j), int32(i0), int32(i)})
		}
	}
	first[ny-1] = len(rs.runs)
	parent := make([]int32, len(rs.runs))
	for r := range parent {
		parent[r] = int32(r)
	}
	find := func(r int32) int32 {
		for parent[r] != r {
			parent[r] = parent[parent[r]]
			r = parent[r]
		}
		return r
	}
	for j := 1; j < ny-1; j++ {
		a, aEnd, b, bEnd := first[j-1], first[j], first[j], first[j+1]
		for a < aEnd && b < bEnd {
			ra, rb := rs.runs[a], rs.runs[b]
			if max(ra.i0, rb.i0) < min(ra.i1, rb.i1) {
				x, y := find(int32(a)), find(int32(b))
				if x < y {
					parent[y] = x
				} else if y < x {
					parent[x] = y
				}
			}
			if ra.i1 < rb.i1 {
				a++
			} else {
				b++
			}
		}
	}
	rs.root = parent
	for r := range parent {
		parent[r] = find(int32(r))
	}
	return rs
}
