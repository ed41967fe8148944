package study

import (
	"context"
	"math"

	"gainscape/internal/pool"
	"gainscape/regions/export"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// confirmMethod names the second method of confirmCounts in reports.
const confirmMethod = "argument principle on the boundary of a right half disc, arg Δ followed point by point with step control"

// clippedCount is the largest count a grid.Map holds; a loop with
// infinitely many unstable roots is stored with it.
const clippedCount = 127

// confirmCounts checks the counts of a map of a loop with dead time by a
// second method at one node of every region: a region is a largest set
// of decided nodes with one count and no root on the imaginary axis, joined through the four
// neighbours of each node (flood fill). Its node checked is the one
// farthest, in grid steps along rows and columns, from any node outside
// the region (two passes of a city-block distance transform; the first
// such node in row order on ties), so that it lies as far from the edges
// as the grid allows. The second method is contourCount; a region whose
// nodes have infinitely many unstable roots (a neutral loop with
// |q_n/p_n| > 1, stored as clippedCount) is confirmed where that ratio
// exceeds 1 at its node. Regions are checked in parallel and reported in
// the order of their first node, so the result does not depend on the
// worker count.
func confirmCounts(ctx context.Context, s plane.Setup, m *grid.Map, workers int) (*export.Confirmation, error) {
	picks := regionsOf(m)
	out := &export.Confirmation{Method: confirmMethod, Regions: len(picks), Disagree: []export.CheckedNode{}, Unconfirmed: []export.CheckedNode{}}
	checked := make([]export.CheckedNode, len(picks))
	err := pool.Each(ctx, len(picks), workers, nil, s.NewScratch, func(sc *plane.Scratch, r int) {
		k := picks[r]
		i, j := k%m.XAxis.N, k/m.XAxis.N
		x, y := m.XAxis.At(i), m.YAxis.At(j)
		f := s.Function(sc, x, y)
		f = stability.Function{P: f.P.Clone(), Q: f.Q.Clone(), Delay: f.Delay}
		node := export.CheckedNode{Point: [2]float64{x, y}, Count: int(m.RHP[k])}
		if node.Count == clippedCount {
			if n := neutralOf(f); n != nil && n.Ratio > 1 {
				node.Other = node.Count
			} else {
				node.Other, node.Reason = -1, "the count is too large to check"
			}
			checked[r] = node
			return
		}
		n, ok, reason := contourCount(f)
		node.Other = n
		if !ok {
			node.Other, node.Reason = -1, reason
		}
		checked[r] = node
	})
	if err != nil {
		return nil, err
	}
	for _, c := range checked {
		switch {
		case c.Other < 0:
			out.Unconfirmed = append(out.Unconfirmed, c)
		case c.Other != c.Count:
			out.Disagree = append(out.Disagree, c)
		default:
			out.Confirmed++
		}
	}
	return out, nil
}

// regionsOf finds the regions of m (see confirmCounts) and returns each
// region's node to check, in the order of the regions' first nodes.
func regionsOf(m *grid.Map) []int {
	nx, ny := m.XAxis.N, m.YAxis.N
	n := nx * ny
	label := make([]int32, n)
	for k := range label {
		label[k] = -1
	}
	in := func(k int) bool { return m.RHP[k] >= 0 && m.Axis[k] == 0 }
	var stack []int
	regions := int32(0)
	for start := 0; start < n; start++ {
		if label[start] >= 0 || !in(start) {
			continue
		}
		label[start] = regions
		stack = append(stack[:0], start)
		for len(stack) > 0 {
			k := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			i, j := k%nx, k/nx
			for _, nb := range [4][2]int{{i - 1, j}, {i + 1, j}, {i, j - 1}, {i, j + 1}} {
				if nb[0] < 0 || nb[1] < 0 || nb[0] >= nx || nb[1] >= ny {
					continue
				}
				q := nb[1]*nx + nb[0]
				if label[q] < 0 && in(q) && m.RHP[q] == m.RHP[start] {
					label[q] = regions
					stack = append(stack, q)
				}
			}
		}
		regions++
	}
	// City-block distance to the nearest node outside the own region
	// (the window's border does not count as outside).
	const far = math.MaxInt32
	dist := make([]int32, n)
	for k := range dist {
		dist[k] = far
		if label[k] < 0 {
			dist[k] = 0
		}
	}
	relax := func(k, q int) {
		if label[q] != label[k] {
			dist[k] = min(dist[k], 1)
		} else if dist[q] < far {
			dist[k] = min(dist[k], dist[q]+1)
		}
	}
	for j := 0; j < ny; j++ {
		for i := 0; i < nx; i++ {
			k := j*nx + i
			if i > 0 {
				relax(k, k-1)
			}
			if j > 0 {
				relax(k, k-nx)
			}
		}
	}
	for j := ny - 1; j >= 0; j-- {
		for i := nx - 1; i >= 0; i-- {
			k := j*nx + i
			if i+1 < nx {
				relax(k, k+1)
			}
			if j+1 < ny {
				relax(k, k+nx)
			}
		}
	}
	picks := make([]int, regions)
	best := make([]int32, regions)
	for r := range best {
		best[r] = -1
	}
	for k, r := range label {
		if r >= 0 && dist[k] > best[r] {
			best[r], picks[r] = dist[k], k
		}
	}
	return picks
}

// neutralNodes counts the nodes of a map of a loop with dead time at
// which |q_n| ≥ |p_n|, the leading coefficients of the delayed and the
// delay-free part having one degree (the neutral type with |lim L(s)| ≥ 1
// as s → ∞): there infinitely many roots lie in the right half plane or
// approach the imaginary axis.
func neutralNodes(s plane.Setup, m *grid.Map) int {
	sc := s.NewScratch()
	count := 0
	for j := 0; j < m.YAxis.N; j++ {
		for i := 0; i < m.XAxis.N; i++ {
			if r, ok := leadRatio(s.Function(sc, m.XAxis.At(i), m.YAxis.At(j))); ok && r >= 1 {
				count++
			}
		}
	}
	return count
}
