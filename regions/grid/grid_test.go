package grid

import (
	"context"
	"math/rand/v2"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// TestEvaluateAgainstEigenvalues checks every node of a PID map of a
// fourth-order plant against the right-half-plane count from gonum's
// eigenvalues, skipping nodes whose closed-loop roots are too close to
// the axis for either method to be expected to agree.
func TestEvaluateAgainstEigenvalues(t *testing.T) {
	// Invented plant 2/((s+1)(s+0.5)(0.3s+1)²) under PID with kd = 0.4, tau = 0.1.
	den := poly.Mul(poly.Poly{1, 1}, poly.Mul(poly.Poly{0.5, 1}, poly.Poly{1, 0.3}.Pow(2)))
	loop := loop.Loop{Plant: loop.Plant{Num: poly.Poly{2}, Den: den}, Family: family.PID{}, Values: []float64{0, 0, 0.4, 0.1}}
	s, err := plane.NewSetup(loop, plane.Axis{Param: "kp", Min: -2, Max: 10, N: 61}, plane.Axis{Param: "ki", Min: -1, Max: 5, N: 41})
	if err != nil {
		t.Fatal(err)
	}
	m, err := Evaluate(context.Background(), s, Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	checked := 0
	for j := 0; j < s.Y.N; j++ {
		for i := 0; i < s.X.N; i++ {
			want, near := eigenCount(t, s.With(s.XIndex, s.X.At(i), s.YIndex, s.Y.At(j)).Characteristic())
			if near {
				continue
			}
			checked++
			if got := m.Count(i, j); got != want {
				t.Fatalf("node (%g, %g): count %d, eigenvalues %d", s.X.At(i), s.Y.At(j), got, want)
			}
		}
	}
	if checked < 2400 {
		t.Fatalf("only %d nodes checked", checked)
	}
	st := m.Stats()
	if st.Stable == 0 || st.Stable == st.Nodes || st.Undecided != 0 {
		t.Fatalf("stats %+v: want a mix of stable and unstable nodes", st)
	}
	if rows := m.Rows(); len(rows) != 41 || len(rows[0]) != 61 || rows[3][5] != m.Count(5, 3) {
		t.Fatal("Rows layout differs from Count")
	}
}

// eigenCount returns the right-half-plane root count of p from gonum's
// eigenvalues, the independent reference, and whether a root lies within
// 1e-6 of the imaginary axis relative to its magnitude, where neither
// method is expected to be decisive.
func eigenCount(t *testing.T, p poly.Poly) (rhp int, near bool) {
	t.Helper()
	roots, err := p.Roots()
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range roots {
		if real(r) > 0 {
			rhp++
		}
		if abs(real(r)) <= 1e-6*max(1e-300, abs(real(r))+abs(imag(r))) {
			near = true
		}
	}
	return rhp, near
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// BenchmarkEvaluate measures whole-map throughput, nodes per second, on
// the demo-like PID plane.
func BenchmarkEvaluate(b *testing.B) {
	den := poly.Mul(poly.Poly{0.5, 1}, poly.Mul(poly.Poly{2, 1}, poly.Poly{1, 0.4}.Pow(2)))
	loop := loop.Loop{Plant: loop.Plant{Num: poly.Poly{3}, Den: den}, Family: family.PID{}, Values: []float64{0, 0, 0.5, 0.05}}
	s, _ := plane.NewSetup(loop, plane.Axis{Param: "kp", Min: -1, Max: 8, N: 400}, plane.Axis{Param: "ki", Min: -0.5, Max: 4, N: 300})
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Evaluate(context.Background(), s, Options{Workers: 1}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.N*400*300)/b.Elapsed().Seconds(), "nodes/s")
}

// TestEveryFamilyAgainstEigenvalues maps random invented plants under
// every controller family, in the plane of its first two parameters, and
// checks each node against gonum's eigenvalues, skipping nodes with a root
// within 1e-6 of the axis (relative to its magnitude).
func TestEveryFamilyAgainstEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	for trial := 0; trial < 24; trial++ {
		fam := family.All()[trial%len(family.All())]
		// A plant with 2 to 5 poles, some unstable, and up to 2 zeros.
		var poles, zeros []complex128
		for len(poles) < 2+rng.IntN(4) {
			re := -(0.2 + 3*rng.Float64())
			if rng.IntN(5) == 0 {
				re = -re
			}
			poles = append(poles, complex(re, 0))
		}
		for range rng.IntN(min(3, len(poles))) {
			zeros = append(zeros, complex(-(0.1+4*rng.Float64()), 0))
		}
		num := poly.FromRoots(zeros).Scaled(1 + 5*rng.Float64())
		den := poly.FromRoots(poles)
		vals := family.Defaults(fam)
		ps := fam.Params()
		x := plane.Axis{Param: ps[0].Name, Min: -2, Max: 10, N: 41}
		y := plane.Axis{Param: "", Min: -1, Max: 5, N: 37}
		if len(ps) < 2 {
			continue
		}
		y.Param = ps[1].Name
		s, err := plane.NewSetup(loop.Loop{Plant: loop.Plant{Num: num, Den: den}, Family: fam, Values: vals}, x, y)
		if err != nil {
			t.Fatal(err)
		}
		m, err := Evaluate(context.Background(), s, Options{})
		if err != nil {
			t.Fatal(err)
		}
		for j := 0; j < y.N; j++ {
			for i := 0; i < x.N; i++ {
				want, near := eigenCount(t, s.With(s.XIndex, x.At(i), s.YIndex, y.At(j)).Characteristic())
				if near {
					continue
				}
				if got := m.Count(i, j); got != want {
					t.Fatalf("%s on poles %v zeros %v: node (%s=%g, %s=%g) count %d, eigenvalues %d",
						fam.Name(), poles, zeros, x.Param, x.At(i), y.Param, y.At(j), got, want)
				}
			}
		}
	}
}
