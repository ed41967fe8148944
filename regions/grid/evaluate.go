package grid

import (
	"context"

	"gainscape/internal/pool"
	"gainscape/regions/plane"
	"gainscape/regions/stability"
)

// Options controls Evaluate.
type Options struct {
	// Workers is the number of goroutines; 0 means runtime.NumCPU().
	Workers int
	// Progress, if set, is called after each finished row with the number
	// of rows done so far. It is called from worker goroutines.
	Progress func(rowsDone int)
}

// Evaluate runs the setup's stability test at every node of its grid.
// Rows are handed to the workers one at a time; each node is computed
// independently, so the map does not depend on the number of workers or
// on scheduling. A node exactly on a boundary gets the count of the
// strictly unstable roots and a boundary count. It returns ctx.Err() if the context is
// cancelled, with no map.
func Evaluate(ctx context.Context, s plane.Setup, opt Options) (*Map, error) {
	m := NewMap(s.X, s.Y)
	type scratch struct {
		counter stability.Counter
		buf     *plane.Scratch
	}
	newScratch := func() scratch { return scratch{s.NewCounter(), s.NewScratch()} }
	err := pool.Each(ctx, s.Y.N, opt.Workers, opt.Progress, newScratch, func(w scratch, j int) {
		y := s.Y.At(j)
		for i := 0; i < s.X.N; i++ {
			m.Set(j*s.X.N+i, w.counter.Count(s.Function(w.buf, s.X.At(i), y)))
		}
	})
	if err != nil {
		return nil, err
	}
	m.Evaluated = len(m.RHP)
	return m, nil
}
