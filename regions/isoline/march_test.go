package isoline

import (
	"reflect"
	"testing"
)

// TestChain checks the order and direction of chains on small graphs
// drawn by hand: an open path given out of order, a crossing no segment
// reaches, and a closed square.
func TestChain(t *testing.T) {
	tests := []struct {
		name string
		n    int
		segs [][2]int
		want [][]int
	}{
		{"path out of order", 4, [][2]int{{2, 3}, {1, 2}, {0, 1}}, [][]int{{0, 1, 2, 3}}},
		{"path from its lower end", 3, [][2]int{{2, 1}, {1, 0}}, [][]int{{0, 1, 2}}},
		{"lone crossing", 3, [][2]int{{0, 2}}, [][]int{{0, 2}, {1}}},
		{"square closes on itself", 4, [][2]int{{1, 2}, {0, 1}, {3, 0}, {2, 3}}, [][]int{{0, 1, 2, 3, 0}}},
		{"path then loop", 6, [][2]int{{3, 4}, {4, 5}, {5, 3}, {1, 0}, {1, 2}}, [][]int{{0, 1, 2}, {3, 4, 5, 3}}},
	}
	for _, tc := range tests {
		if got := Chain(tc.n, tc.segs); !reflect.DeepEqual(got, tc.want) {
			t.Errorf("%s: %v; want %v", tc.name, got, tc.want)
		}
	}
}

// TestSegmentsSaddle checks the pairing in a saddle cell both ways and
// that cells left out yield nothing.
func TestSegmentsSaddle(t *testing.T) {
	// One cell (2 × 2 nodes); crossings numbered bottom 0, right 1, top 2,
	// left 3.
	crossing := func(i, j int, horiz bool) int {
		switch {
		case horiz && j == 0:
			return 0
		case !horiz && i == 1:
			return 1
		case horiz && j == 1:
			return 2
		}
		return 3
	}
	join := Segments(2, 2, nil, crossing, func(_, _ int, at [4]int) [][2]int { return Saddle(at, JoinDiagonal) })
	if want := [][2]int{{0, 1}, {2, 3}}; !reflect.DeepEqual(join, want) {
		t.Errorf("joined diagonal: %v; want %v", join, want)
	}
	cut := Segments(2, 2, nil, crossing, func(_, _ int, at [4]int) [][2]int { return Saddle(at, CutDiagonal) })
	if want := [][2]int{{0, 3}, {1, 2}}; !reflect.DeepEqual(cut, want) {
		t.Errorf("other diagonal: %v; want %v", cut, want)
	}
	across := Segments(2, 2, nil, crossing, func(_, _ int, at [4]int) [][2]int { return Saddle(at, Across) })
	if want := [][2]int{{0, 2}, {3, 1}}; !reflect.DeepEqual(across, want) {
		t.Errorf("across: %v; want %v", across, want)
	}
	if none := Segments(2, 2, func(int, int) bool { return false }, crossing, nil); len(none) != 0 {
		t.Errorf("cell left out gave %v", none)
	}
}
