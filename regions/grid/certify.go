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
	regions := joinCells(nx, ny, touched)
	// label[r] is the count of region r (by its root cell), from its
	// evaluated nodes; bad[r] marks a region that cannot be filled.
	const unset = -2
	label := make([]int8, len(regions))
	bad := make([]bool, len(regions))
	for c := range label {
		label[c] = unset
	}
	corners := func(c int) [4]int {
		k := (c/cells)*nx + c%cells
		return [4]int{k, k + 1, k + nx, k + nx + 1}
	}
	for c, t := range touched {
		if t {
			continue
		}
		r := regions[c]
		for _, k := range corners(c) {
			if !need[k] {
				continue
			}
			switch {
			case m.RHP[k] == Undecided || m.Axis[k] != 0:
				bad[r] = true
			case label[r] == unset:
				label[r] = m.RHP[k]
			case label[r] != m.RHP[k]:
				bad[r] = true
			}
		}
	}
	for c, t := range touched {
		if r := regions[c]; !t && r == int32(c) && (bad[r] || label[r] == unset) {
			bad[r] = true
			conflicts++
		}
	}
	// Every node of a region that cannot be filled is evaluated.
	redo := make([]bool, nx*ny)
	any := false
	for c, t := range touched {
		if !t && bad[regions[c]] {
			for _, k := range corners(c) {
				if !need[k] {
					redo[k], need[k], any = true, true, true
				}
			}
		}
	}
	if any {
		if err := evaluateNodes(ctx, s, m, redo, Options{Workers: opt.Workers}); err != nil {
			return nil, 0, err
		}
	}
	for c, t := range touched {
		if t || bad[regions[c]] {
			continue
		}
		for _, k := range corners(c) {
			if !need[k] {
				m.RHP[k], m.Axis[k] = label[regions[c]], 0
			}
		}
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

// joinCells returns, for every cell, the root cell of its set of
// untouched cells joined across shared sides (union–find with path
// halving); a touched cell is its own root.
func joinCells(nx, ny int, touched []bool) []int32 {
	cells := nx - 1
	parent := make([]int32, len(touched))
	for c := range parent {
		parent[c] = int32(c)
	}
	find := func(c int32) int32 {
		for parent[c] != c {
			parent[c] = parent[parent[c]]
			c = parent[c]
		}
		return c
	}
	union := func(a, b int) {
		ra, rb := find(int32(a)), find(int32(b))
		// The smaller index stays the root, so roots do not depend on
		// the order of the unions.
		if ra < rb {
			parent[rb] = ra
		} else if rb < ra {
			parent[ra] = rb
		}
	}
	for j := 0; j < ny-1; j++ {
		for i := 0; i < cells; i++ {
			c := j*cells + i
			if touched[c] {
				continue
			}
			if i+1 < cells && !touched[c+1] {
				union(c, c+1)
			}
			if j+1 < ny-1 && !touched[c+cells] {
				union(c, c+cells)
			}
		}
	}
	for c := range parent {
		parent[c] = find(int32(c))
	}
	return parent
}
