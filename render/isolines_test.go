package render

import (
	"math"
	"testing"

	"gainscape/regions/plane"
)

// bowl returns a field of x² + y² on a 41×41 grid over [−2, 2]², NaN
// where x < cut.
func bowl(cut float64) *Field {
	a := plane.Axis{Param: "x", Min: -2, Max: 2, N: 41}
	f := &Field{XAxis: a, YAxis: a, Values: make([]float64, 41*41)}
	for j := 0; j < 41; j++ {
		for i := 0; i < 41; i++ {
			x, y := a.At(i), a.At(j)
			v := x*x + y*y
			if x < cut {
				v = math.NaN()
			}
			f.Values[j*41+i] = v
		}
	}
	return f
}

func TestIsoLinesCircle(t *testing.T) {
	lines := isoLines(bowl(math.Inf(-1)), 1)
	if len(lines) != 1 {
		t.Fatalf("%d lines for the unit circle, want 1", len(lines))
	}
	l := lines[0]
	if first, last := l[0], l[len(l)-1]; first != last {
		t.Errorf("circle not closed: starts %v, ends %v", first, last)
	}
	// Linear interpolation of x² + y² along an edge of length h = 0.1
	// misplaces the crossing by at most h²/4 = 0.0025 in x²+y² (the
	// quadratic's deviation from its chord), so by about 0.00125 in radius
	// near r = 1 (derived by hand in this test); 0.002 allows for that.
	for _, p := range l {
		if r := math.Hypot(p.X, p.Y); math.Abs(r-1) > 0.002 {
			t.Fatalf("point %v at radius %v, want 1 ± 0.002", p, r)
		}
	}
	// The unit circle crosses each of the 19 grid lines x = k/10 and the
	// 19 lines y = k/10 with |k| < 10 twice: 76 crossings (derived by
	// hand in this test), and a closed polyline repeats its first point.
	if len(l) != 77 {
		t.Errorf("%d points on the circle, want 77", len(l))
	}
}

func TestIsoLinesStopAtMissingValues(t *testing.T) {
	lines := isoLines(bowl(0), 1)
	if len(lines) != 1 {
		t.Fatalf("%d lines for the right half circle, want 1", len(lines))
	}
	l := lines[0]
	for _, p := range l {
		if p.X < 0 {
			t.Fatalf("point %v lies where the field has no value", p)
		}
	}
	if first, last := l[0], l[len(l)-1]; first == last {
		t.Error("half circle came back closed")
	}
}

func TestIsoLinesSaddle(t *testing.T) {
	// z = x·y on a 3×3 grid over [−1, 1]²: level 0.5 passes the corners
	// (1, 1) and (−1, −1) only, as two separate arcs.
	a := plane.Axis{Param: "x", Min: -1, Max: 1, N: 3}
	f := &Field{XAxis: a, YAxis: a, Values: make([]float64, 9)}
	for j := 0; j < 3; j++ {
		for i := 0; i < 3; i++ {
			f.Values[j*3+i] = a.At(i) * a.At(j)
		}
	}
	lines := isoLines(f, 0.5)
	if len(lines) != 2 {
		t.Fatalf("%d lines, want 2", len(lines))
	}
	for _, l := range lines {
		for _, p := range l {
			if p.X*p.Y <= 0 {
				t.Errorf("point %v of level 0.5 lies in a quadrant where x·y ≤ 0", p)
			}
		}
	}
}
