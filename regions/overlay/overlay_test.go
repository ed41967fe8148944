package overlay

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/grid"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// decayTol is the agreement required with gonum's eigenvalues, relative to
// the size of the largest root (or absolute below 1).
const decayTol = 1e-6

// randomSetup returns a filtered PID on a random plant of degree 1 to 6
// (poles at magnitudes 0.2 to 5, a quarter of them unstable), in the plane
// of two random parameters over ranges that hold stable and unstable
// nodes.
func randomSetup(t testing.TB, rng *rand.Rand) plane.Setup {
	var roots []complex128
	n := 1 + rng.IntN(6)
	for len(roots) < n {
		mag := 0.2 + 4.8*rng.Float64()
		re := -mag * (0.1 + 0.9*rng.Float64())
		if rng.IntN(4) == 0 {
			re = -re
		}
		if n-len(roots) >= 2 && rng.IntN(2) == 0 {
			im := mag * rng.Float64()
			roots = append(roots, complex(re, im), complex(re, -im))
			continue
		}
		roots = append(roots, complex(re, 0))
	}
	f := family.PID{}
	values := []float64{1, 0.5, 0.2, 0.02 + 0.1*rng.Float64()}
	names := []string{"kp", "ki", "kd", "tau"}
	xi := rng.IntN(3)
	yi := (xi + 1 + rng.IntN(2)) % 3
	loop := loop.Loop{Plant: loop.Plant{Num: poly.Poly{0.5 + 3*rng.Float64()}, Den: poly.FromRoots(roots)}, Family: f, Values: values}
	s, err := plane.NewSetup(loop,
		plane.Axis{Param: names[xi], Min: -1, Max: 1 + 9*rng.Float64(), N: 23},
		plane.Axis{Param: names[yi], Min: -0.5, Max: 1 + 4*rng.Float64(), N: 19})
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// TestDecayAgreesWithEigenvalues compares the decay rate and damping ratio
// at every stable node of 60 random maps with gonum's general eigenvalue
// solver (poly.Roots), for both paths of Compute.
func TestDecayAgreesWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	checked := 0
	for trial := 0; trial < 60; trial++ {
		s := randomSetup(t, rng)
		m := mapOf(t, s)
		shifted, err := Compute(context.Background(), s, m, Options{Workers: 2})
		if err != nil {
			t.Fatal(err)
		}
		eigen, err := Compute(context.Background(), s, m, Options{Workers: 2, Damping: true})
		if err != nil {
			t.Fatal(err)
		}
		pc := s.Char
		for j := 0; j < s.Y.N; j++ {
			for i := 0; i < s.X.N; i++ {
				k := shifted.At(i, j)
				if m.Count(i, j) != 0 {
					if !math.IsNaN(shifted.Decay[k]) || !math.IsNaN(eigen.Decay[k]) || !math.IsNaN(eigen.Damping[k]) {
						t.Fatalf("trial %d node (%d, %d): values at an unstable node", trial, i, j)
					}
					continue
				}
				want, zeta, size := eigenDecay(t, pc.Eval(s.X.At(i), s.Y.At(j)))
				lim := decayTol * math.Max(1, size)
				if math.Abs(shifted.Decay[k]-want) > lim || math.Abs(eigen.Decay[k]-want) > lim {
					t.Fatalf("trial %d node (%d, %d): decay %.12g (shift), %.12g (eigen); reference %.12g",
						trial, i, j, shifted.Decay[k], eigen.Decay[k], want)
				}
				if math.Abs(eigen.Damping[k]-zeta) > decayTol {
					t.Fatalf("trial %d node (%d, %d): damping %.12g; reference %.12g", trial, i, j, eigen.Damping[k], zeta)
				}
				checked++
			}
		}
	}
	if checked < 5000 {
		t.Fatalf("only %d stable nodes checked", checked)
	}
}

// TestDecayOfRandomHurwitzPolynomials checks both decay methods against
// poly.Roots on polynomials built from known roots, over scales from 1e-3
// to 1e3, including decay rates much smaller than the fastest root.
func TestDecayOfRandomHurwitzPolynomials(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 24))
	for trial := 0; trial < 4000; trial++ {
		n := 1 + trial%10
		scale := math.Pow(10, 6*rng.Float64()-3)
		var roots []complex128
		slowest := math.Inf(1)
		for len(roots) < n {
			re := -scale * math.Exp(-3*rng.Float64()) // from e^-3 to 1 of the scale
			slowest = math.Min(slowest, -re)
			if n-len(roots) >= 2 && rng.IntN(2) == 0 {
				im := scale * 2 * rng.Float64()
				roots = append(roots, complex(re, im), complex(re, -im))
				continue
			}
			roots = append(roots, complex(re, 0))
		}
		p := poly.FromRoots(roots).Scaled(0.1 + rng.Float64())
		lim := decayTol * scale
		if got := (routh.Test{}).NewGrader(len(p)).Decay(stability.Function{P: p}); math.Abs(got-slowest) > lim {
			t.Fatalf("trial %d: shift decay %.12g; built %.12g (roots %v)", trial, got, slowest, roots)
		}
		if got, _ := poly.NewFinder(len(p)).DecayAndDamping(p); math.Abs(got-slowest) > lim {
			t.Fatalf("trial %d: eigen decay %.12g; built %.12g", trial, got, slowest)
		}
	}
}

// TestDecayAndDampingHandDerived checks a second-order loop whose poles
// are known in closed form at every node.
func TestDecayAndDampingHandDerived(t *testing.T) {
	// Derived by hand: plant 1/(s(s+2)) under PD, kp + kd·s:
	// p = s² + (2+kd)·s + kp. With b = 2+kd > 0 and kp > 0: if b² < 4kp
	// the poles are −b/2 ± j·√(kp − b²/4), so σ = b/2 and
	// ζ = (b/2)/√kp; otherwise they are real, σ = (b − √(b² − 4kp))/2
	// and ζ = 1.
	s := setupOf(t, []float64{1}, []float64{1, 2, 0}, "pd", []float64{0, 0},
		plane.Axis{Param: "kp", Min: 0.1, Max: 5, N: 15}, plane.Axis{Param: "kd", Min: -1.5, Max: 3, N: 13})
	m := mapOf(t, s)
	for _, damping := range []bool{false, true} {
		g, err := Compute(context.Background(), s, m, Options{Damping: damping})
		if err != nil {
			t.Fatal(err)
		}
		for j := 0; j < s.Y.N; j++ {
			for i := 0; i < s.X.N; i++ {
				kp, b := s.X.At(i), 2+s.Y.At(j)
				sigma, zeta := b/2, b/2/math.Sqrt(kp)
				if b*b >= 4*kp {
					sigma, zeta = (b-math.Sqrt(b*b-4*kp))/2, 1
				}
				k := g.At(i, j)
				if math.Abs(g.Decay[k]-sigma) > decayTol {
					t.Errorf("damping=%v kp=%g kd=%g: decay %.12g; want %.12g", damping, kp, b-2, g.Decay[k], sigma)
				}
				if damping && math.Abs(g.Damping[k]-zeta) > decayTol {
					t.Errorf("kp=%g kd=%g: damping %.12g; want %.12g", kp, b-2, g.Damping[k], zeta)
				}
			}
		}
	}
}

// TestComputeDeterministic checks that 1, 2 and 3 workers give the same
// bits on both paths. Exact equality is the property under test here:
// every node is computed by the same operations whatever the worker.
func TestComputeDeterministic(t *testing.T) {
	rng := rand.New(rand.NewPCG(25, 26))
	for trial := 0; trial < 5; trial++ {
		s := randomSetup(t, rng)
		m := mapOf(t, s)
		for _, damping := range []bool{false, true} {
			var ref *Grids
			for _, w := range []int{1, 2, 3} {
				g, err := Compute(context.Background(), s, m, Options{Workers: w, Damping: damping, Sensitivity: sweepMs})
				if err != nil {
					t.Fatal(err)
				}
				if ref == nil {
					ref = g
					continue
				}
				sameBits(t, "decay", ref.Decay, g.Decay)
				sameBits(t, "damping", ref.Damping, g.Damping)
				sameBits(t, "Ms", ref.Ms, g.Ms)
			}
		}
	}
}

func sameBits(t *testing.T, what string, a, b []float64) {
	t.Helper()
	if len(a) != len(b) {
		t.Fatalf("%s: %d and %d values", what, len(a), len(b))
	}
	for k := range a {
		if math.Float64bits(a[k]) != math.Float64bits(b[k]) {
			t.Fatalf("%s differs at node %d: %v and %v", what, k, a[k], b[k])
		}
	}
}

// TestComputeMs checks that the open loop handed to the evaluator is
// Nc·N/(Dc·D) at the node, formed here directly from the family.
func TestComputeMs(t *testing.T) {
	s := setupOf(t, []float64{1}, []float64{1, 3, 3, 1}, "pid", []float64{1, 0.5, 0.3, 0.05},
		plane.Axis{Param: "kp", Min: 0.2, Max: 3, N: 9}, plane.Axis{Param: "kd", Min: 0, Max: 1.5, N: 7})
	m := mapOf(t, s)
	g, err := Compute(context.Background(), s, m, Options{Sensitivity: sweepMs})
	if err != nil {
		t.Fatal(err)
	}
	stable := 0
	for j := 0; j < s.Y.N; j++ {
		for i := 0; i < s.X.N; i++ {
			if m.Count(i, j) != 0 {
				continue
			}
			l := s.With(s.XIndex, s.X.At(i), s.YIndex, s.Y.At(j))
			cn, cd := family.Controller(l.Family, l.Values)
			want := sweepMs(poly.Mul(cn, l.Plant.Num), poly.Mul(cd, l.Plant.Den))
			if got := g.Ms[g.At(i, j)]; math.Abs(got-want) > 1e-9*want {
				t.Fatalf("node (%d, %d): Ms %.12g; direct %.12g", i, j, got, want)
			}
			stable++
		}
	}
	if stable == 0 {
		t.Fatal("no stable node")
	}
}

// TestComputeCancelled checks that a cancelled context stops Compute.
func TestComputeCancelled(t *testing.T) {
	s := smallSetup(t)
	m := mapOf(t, s)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if g, err := Compute(ctx, s, m, Options{}); err == nil || g != nil {
		t.Fatalf("got %v, %v; want the context's error", g, err)
	}
}

// TestComputeAllocations checks that the work per node allocates nothing
// on the sign-array path: with one worker, a map with 16 times the nodes
// costs the same number of allocations.
func TestComputeAllocations(t *testing.T) {
	count := func(n int) float64 {
		s := setupOf(t, []float64{1}, []float64{1, 3, 3, 1}, "pi", []float64{1, 0},
			plane.Axis{Param: "kp", Min: 0, Max: 6, N: n}, plane.Axis{Param: "ki", Min: 0.05, Max: 3, N: n})
		m := mapOf(t, s)
		return testing.AllocsPerRun(5, func() {
			if _, err := Compute(context.Background(), s, m, Options{Workers: 1}); err != nil {
				t.Fatal(err)
			}
		})
	}
	if small, large := count(10), count(40); large != small {
		t.Fatalf("%v allocations for 100 nodes, %v for 1600", small, large)
	}
}

// TestComputePanicsOnForeignMap checks that a map of other axes is a
// programmer error.
func TestComputePanicsOnForeignMap(t *testing.T) {
	s := smallSetup(t)
	m := grid.NewMap(plane.Axis{Param: "kp", Min: 0, Max: 1, N: 3}, s.Y)
	defer func() {
		if recover() == nil {
			t.Fatal("no panic")
		}
	}()
	Compute(context.Background(), s, m, Options{})
}

// TestOpenLoopLen checks the size of the open-loop pencils on a filtered
// PID and a third-order plant: Dc·D = (tau·s² + s)(s+1)³ has six
// coefficients, Nc·N three (derived by hand).
func TestOpenLoopLen(t *testing.T) {
	s := smallSetup(t)
	if got := max(s.OpenNum.Len(), s.OpenDen.Len()); got != 6 {
		t.Fatalf("open-loop length %d; want 6", got)
	}
}
