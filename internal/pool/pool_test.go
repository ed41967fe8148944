package pool

import (
	"context"
	"runtime"
	"sync/atomic"
	"testing"
)

func TestWorkers(t *testing.T) {
	tests := []struct {
		name       string
		workers, n int
		want       int
	}{
		{"default", 0, 1000, min(runtime.NumCPU(), 1000)},
		{"negative means default", -3, 1000, min(runtime.NumCPU(), 1000)},
		{"fewer items than workers", 8, 3, 3},
		{"absurd request is capped", 1 << 62, 1 << 40, MaxWorkers},
		{"no items still one worker", 4, 0, 1},
	}
	for _, tc := range tests {
		if got := Workers(tc.workers, tc.n); got != tc.want {
			t.Errorf("%s: Workers(%d, %d) = %d; want %d", tc.name, tc.workers, tc.n, got, tc.want)
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
