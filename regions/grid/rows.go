package grid

import (
	"context"
	"runtime"
	"sync"
	"sync/atomic"
)

// EachRow calls row(w, j) for every row j in [0, rows), spread over
// workers goroutines (0 means runtime.NumCPU()). Each goroutine first makes
// its own scratch state with newWorker and hands it to every row it takes,
// so row needs no locking for it. Rows are taken one at a time from a
// shared counter: a worker that finishes early takes the next row, and a
// result computed node by node does not depend on the number of workers.
// progress, if not nil, is called after each row with the number of rows
// done, from the worker goroutines. EachRow stops taking rows once ctx is
// cancelled and then returns ctx.Err().
func EachRow[W any](ctx context.Context, rows, workers int, progress func(rowsDone int), newWorker func() W, row func(w W, j int)) error {
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	workers = max(1, min(workers, rows))
	var next, done atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := newWorker()
			for {
				j := int(next.Add(1) - 1)
				if j >= rows || ctx.Err() != nil {
					return
				}
				row(w, j)
				if d := done.Add(1); progress != nil {
					progress(int(d))
				}
			}
		}()
	}
	wg.Wait()
	return ctx.Err()
}
