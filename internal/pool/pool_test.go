package pool

import (
	"context"
	"runtime"
	"sync/atomic"
	"testing"
)

// TestWorkers checks the cap: the default, fewer items than workers, an
// absurd request and no items at all.
func TestWorkers(t *testing.T) {
	all := min(runtime.NumCPU(), 1000)
	for _, c := range [][3]int{{0, 1000, all}, {-3, 1000, all}, {8, 3, 3}, {1 << 62, 1 << 40, MaxWorkers}, {4, 0, 1}} {
		if got := Workers(c[0], c[1]); got != c[2] {
			t.Errorf("Workers(%d, %d) = %d; want %d", c[0], c[1], got, c[2])
		}
	}
}

// TestEachVisitsEveryItemOnce runs with several worker counts, including
// one far beyond the cap, and checks each item is handled exactly once
// and progress reaches n.
func TestEachVisitsEveryItemOnce(t *testing.T) {
	for _, workers := range []int{1, 2, 7, 1 << 40} {
		const n = 500
		var seen [n]atomic.Int32
		var last atomic.Int64
		err := Each(context.Background(), n, workers, func(d int) {
			for {
				old := last.Load()
				if int64(d) <= old || last.CompareAndSwap(old, int64(d)) {
					return
				}
			}
		}, func() int { return 0 }, func(_ int, i int) { seen[i].Add(1) })
		if err != nil {
			t.Fatal(err)
		}
		for i := range seen {
			if c := seen[i].Load(); c != 1 {
				t.Fatalf("workers %d: item %d handled %d times", workers, i, c)
			}
		}
		if last.Load() != n {
			t.Fatalf("workers %d: progress ended at %d", workers, last.Load())
		}
	}
}

func TestEachStopsOnCancel(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	var handled atomic.Int32
	err := Each(ctx, 1000, 2, nil, func() int { return 0 }, func(_ int, i int) {
		if handled.Add(1) == 10 {
			cancel()
		}
	})
	if err != context.Canceled {
		t.Fatalf("err %v; want context.Canceled", err)
	}
	if h := handled.Load(); h >= 1000 {
		t.Fatalf("all %d items handled after cancel", h)
	}
}
