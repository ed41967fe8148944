package grid

import (
	"context"

	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// Counter counts right-half-plane roots of characteristic polynomials of
// one length with the sign-array test, reusing its scratch space. It is
// not safe for concurrent use; give each goroutine its own.
type Counter struct {
	work []float64
}

// NewCounter returns a Counter for polynomials with n coefficients.
func NewCounter(n int) *Counter {
	return &Counter{work: make([]float64, routh.WorkLen(n))}
}

// Count returns the number of right-half-plane roots of p, or Undecided.
// The regular case allocates nothing; special cases of the sign array
// fall back to routh.Analyze. Roots on the imaginary axis are not counted:
// a node exactly on a boundary gets the count of the strictly unstable
// roots.
func (c *Counter) Count(p poly.Poly) int {
	rhp, _, st := routh.Count(p, c.work)
	switch st {
	case routh.Decided:
		return rhp
	case routh.NeedsAnalysis:
		rep := routh.Analyze(p)
		if rep.Undecided {
			return Undecided
		}
		return rep.RHP
	}
	return Undecided
}

// Options controls Evaluate.
type Options struct {
	// Workers is the number of goroutines; 0 means runtime.NumCPU().
	Workers int
	// Progress, if set, is called after each finished row with the number
	// of rows done so far. It is called from worker goroutines.
	Progress func(rowsDone int)
}

// Evaluate runs the sign-array test at every node of the setup's grid.
// Rows are handed to the workers one at a time; each node is computed
// independently, so the map does not depend on the number of workers or
// on scheduling. It returns ctx.Err() if the context is cancelled, with no
// map.
func Evaluate(ctx context.Context, s plane.Setup, opt Options) (*Map, error) {
	m := NewMap(s.X, s.Y)
	pencil := s.Pencil()
	type scratch struct {
		counter *Counter
		p       poly.Poly
	}
	newScratch := func() scratch { return scratch{NewCounter(pencil.Len()), make(poly.Poly, pencil.Len())} }
	err := EachRow(ctx, s.Y.N, opt.Workers, opt.Progress, newScratch, func(w scratch, j int) {
		y := s.Y.At(j)
		row := m.RHP[j*s.X.N : (j+1)*s.X.N]
		for i := range row {
			pencil.EvalInto(w.p, s.X.At(i), y)
			row[i] = int8(min(w.counter.Count(w.p), 127))
		}
	})
	if err != nil {
		return nil, err
	}
	return m, nil
}
