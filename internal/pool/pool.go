// Package pool spreads independent pieces of work over goroutines: the
// rows of a map, the edges of a grid to refine. It is the one place where
// gainscape decides how many goroutines to start.
package pool

import (
	"context"
	"runtime"
	"sync"
	"sync/atomic"
)

// MaxWorkers is the most goroutines Each starts, whatever is asked: more
// than a machine has cores buys nothing, and an absurd request (a typo
// such as --workers 1000000000) must not exhaust memory.
const MaxWorkers = 256

// Workers returns the number of goroutines Each uses for n items when
// asked for workers: runtime.NumCPU() for workers ≤ 0, never more than n
// or MaxWorkers, never fewer than 1.
func Workers(workers, n int) int {
	if workers <= 0 {
		workers = runtime.NumCPU()
	}
	return max(1, min(workers, n, MaxWorkers))
}

// Each calls fn(w, i) for every i in [0, n), spread over Workers(workers,
// n) goroutines. Each goroutine first makes its own scratch state with
// newWorker and hands it to every item it takes, so fn needs no locking
// for it. Items are taken one at a time from a shared counter: a worker
// that finishes early takes the next item, and a result computed item by
// item does not depend on the number of workers. progress, if not nil, is
// called after each item with the number of items done, from the worker
// goroutines. Each stops taking items once ctx is cancelled and then
// returns ctx.Err().
func Each[W any](ctx context.Context, n, workers int, progress func(done int), newWorker func() W, fn func(w W, i int)) error {
	if n <= 0 {
		return ctx.Err()
	}
	var next, done atomic.Int64
	var wg sync.WaitGroup
	for range Workers(workers, n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := newWorker()
			for {
				i := int(next.Add(1) - 1)
				if i >= n || ctx.Err() != nil {
					return
				}
				fn(w, i)
				if d := done.Add(1); progress != nil {
					progress(int(d))
				}
			}
		}()
	}
	wg.Wait()
	return ctx.Err()
}
