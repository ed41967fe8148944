// Package overlay computes quantities that grade the stable part of a
// stability map: how fast the slowest closed-loop pole decays, how well
// damped the least damped pole is, and optionally the maximum sensitivity
// Ms; picks best design points from them; and measures how far a design
// point is from the nearest stability boundary.
//
// Values are laid out like grid.Map: one float64 per node, row-major, row
// 0 at the y axis minimum, NaN at nodes that are not stable.
package overlay

import (
	"context"
	"fmt"
	"math"

	"gainscape/internal/pool"
	"gainscape/regions/grid"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Sensitivity evaluates a robustness measure, normally the maximum
// sensitivity Ms = max over ω of 1/|1 + L(jω)|, of the open loop
// L = num/den, where num = Nc·N and den = Dc·D for the controller Nc/Dc
// and plant N/D at one node. The slices are scratch owned by the caller of
// the evaluator: it must not keep or change them. It may be called from
// several goroutines at once.
type Sensitivity func(num, den poly.Poly) float64

// Options controls Compute and the searches that re-evaluate a point.
type Options struct {
	// Workers is the number of goroutines; 0 means runtime.NumCPU().
	Workers int
	// Damping asks for the smallest damping ratio at every stable node.
	Damping bool
	// SkipDecay leaves Grids.Decay nil when nothing needs it (no shading,
	// no iso-line, no search and no data to write); the searches need it.
	SkipDecay bool
	// Sensitivity, if set, is evaluated at every stable node into
	// Grids.Ms.
	Sensitivity Sensitivity
	// Exact, if set, is the refined Ms (as one design point's report
	// gives it) with which the searches check the point they return;
	// Sensitivity stands in for it when it is nil.
	Exact Sensitivity
	// Progress, if set, is called after each finished row with the number
	// of rows done so far, from worker goroutines.
	Progress func(rowsDone int)
}

// exact returns the Ms the searches check their results with.
func (o Options) exact() Sensitivity {
	if o.Exact != nil {
		return o.Exact
	}
	return o.Sensitivity
}

// Grids holds per-node quantities over the axes of a stability map,
// row-major like grid.Map: value k belongs to node (k mod XAxis.N,
// k div XAxis.N). Nodes that are not stable hold NaN.
type Grids struct {
	XAxis, YAxis plane.Axis
	// Decay is the decay rate σ = −max Re(pole): every closed-loop
	// transient decays at least as fast as e^(−σt); nil with
	// Options.SkipDecay.
	Decay []float64
	// Damping is the smallest damping ratio min −Re(p)/|p| over the
	// closed-loop poles p; nil unless Options.Damping.
	Damping []float64
	// Ms holds Options.Sensitivity at every stable node; nil without it.
	Ms []float64
}

// At returns the index of node (i, j) in the value slices.
func (g *Grids) At(i, j int) int { return j*g.XAxis.N + i }

// Compute evaluates the requested quantities at every stable node of m,
// which must be the map of s (same axes; it panics otherwise). Rows are
// shared out among the workers one at a time and every node is computed
// independently, so the result does not depend on the number of workers.
// It returns ctx.Err() if the context is cancelled, with no grids.
//
// The decay rate comes from the sign array on the shifted polynomial
// (allocation-free) when damping is not requested, and from the
// eigenvalues of the companion matrix, which the damping ratio needs
// anyway, when it is; bench_test.go gives the measured costs. The sign
// array path allocates nothing per node. The eigenvalue path allocates a
// few small arrays per node inside gonum's QR iteration (Dlahqr keeps a
// 3-element array on the heap, once per iteration); the Sensitivity
// evaluator may allocate too. Only stable nodes get values: a marginal
// node, with a root on the boundary, is not graded.
func Compute(ctx context.Context, s plane.Setup, m *grid.Map, opt Options) (*Grids, error) {
	checkMap(s, m)
	n := s.X.N * s.Y.N
	g := &Grids{XAxis: s.X, YAxis: s.Y}
	if !opt.SkipDecay || opt.Damping {
		g.Decay = nanSlice(n)
	}
	if opt.Damping {
		g.Damping = nanSlice(n)
	}
	if opt.Sensitivity != nil {
		g.Ms = nanSlice(n)
	}
	err := pool.Each(ctx, s.Y.N, opt.Workers, opt.Progress, func() *evaluator { return newEvaluator(s) }, func(e *evaluator, j int) {
		y := s.Y.At(j)
		for i := 0; i < s.X.N; i++ {
			k := j*s.X.N + i
			if !m.StableAt(k) {
				continue
			}
			x := s.X.At(i)
			f := s.Function(e.buf, x, y)
			switch {
			case opt.Damping:
				g.Decay[k], g.Damping[k] = e.grader.DecayDamping(f)
			case g.Decay != nil:
				g.Decay[k] = e.grader.Decay(f)
			}
			if opt.Sensitivity != nil {
				g.Ms[k] = opt.Sensitivity(s.OpenLoop(e.buf, x, y))
			}
		}
	})
	if err != nil {
		return nil, err
	}
	return g, nil
}

// checkMap panics if m was not computed over the axes of s: passing the
// map of another setup is a programming error.
func checkMap(s plane.Setup, m *grid.Map) {
	if m == nil || m.XAxis != s.X || m.YAxis != s.Y || len(m.RHP) != s.X.N*s.Y.N {
		panic(fmt.Sprintf("overlay: map axes do not match the setup's %v × %v", s.X, s.Y))
	}
}

func nanSlice(n int) []float64 {
	v := make([]float64, n)
	for i := range v {
		v[i] = math.NaN()
	}
	return v
}

// evaluator is one worker's scratch space.
type evaluator struct {
	buf    *plane.Scratch
	grader stability.Grader
}

func newEvaluator(s plane.Setup) *evaluator {
	return &evaluator{buf: s.NewScratch(), grader: s.Test().NewGrader(s.Len())}
}
