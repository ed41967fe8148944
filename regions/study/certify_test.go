package study

import (
	"context"
	"fmt"
	"math/rand/v2"
	"path/filepath"
	"strings"
	"testing"

	"gainscape/regions/boundary"
	"gainscape/regions/grid"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
	"gainscape/regions/stability"
)

// sameMaps reports the first node where the certified map differs from
// the fully evaluated one, in either count.
func sameMaps(t *testing.T, name string, got, want *grid.Map) {
	t.Helper()
	for k := range want.RHP {
		if got.RHP[k] != want.RHP[k] || got.Axis[k] != want.Axis[k] {
			nx := want.XAxis.N
			t.Fatalf("%s: node (%d, %d) certified %d/%d, full evaluation %d/%d", name, k%nx, k/nx,
				got.RHP[k], got.Axis[k], want.RHP[k], want.Axis[k])
		}
	}
}

// checkCertified maps the scenario with certified cells and compares it
// node by node with a full evaluation of every node; it returns the
// share of nodes evaluated.
func checkCertified(t *testing.T, name string, sc scenario.Scenario) (float64, EdgeReport) {
	t.Helper()
	job, err := NewMap(sc)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	m, _, rep, err := mapAndEdges(context.Background(), job.setup, Options{Workers: 2})
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	full, err := grid.Evaluate(context.Background(), job.setup, grid.Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	sameMaps(t, name, m, full)
	// A loop with dead time whose sweep has no frequency bound (derivative
	// action: neutral at high frequency) falls back to bisection, and so
	// does every sampled loop.
	bisected := job.setup.Plant.Delay > 0 || job.setup.Plant.Sample > 0
	if (rep.Method != boundary.Swept && !bisected) || rep.Unexplained != 0 || rep.Conflicts != 0 {
		t.Errorf("%s: edges by %s, %d unexplained grid edges, %d conflicts", name, rep.Method, rep.Unexplained, rep.Conflicts)
	}
	return float64(m.Evaluated) / float64(len(m.RHP)), rep
}

// TestCertifiedGallery maps every scenario of the gallery at its own grid
// and at 800×800 nodes with certified cells, node by node identical to
// evaluating every node, and at 800×800 evaluating at most a tenth of the
// nodes.
func TestCertifiedGallery(t *testing.T) {
	files, err := filepath.Glob("../../examples/*.toml")
	if err != nil || len(files) < 5 {
		t.Fatalf("gallery: %v, %d files", err, len(files))
	}
	for _, f := range files {
		if strings.HasSuffix(f, "-compare.toml") {
			continue // a comparison of structures, not a map
		}
		sc, err := scenario.Load(f)
		if err != nil {
			t.Fatal(err)
		}
		sc.Overlays = scenario.Overlays{}
		name := filepath.Base(f)
		checkCertified(t, name, sc)
		sc.Axes.Columns, sc.Axes.Rows = 800, 800
		share, rep := checkCertified(t, name+" at 800×800", sc)
		if rep.Certified && share > 0.1 {
			t.Errorf("%s at 800×800: %.1f%% of the nodes evaluated", name, 100*share)
		}
		t.Logf("%s: %.2f%% of the nodes evaluated at 800×800 (certified %v)", name, 100*share, rep.Certified)
	}
}

// TestCertifiedRandomLoops maps random invented plants (2 to 6 poles,
// some unstable, up to 2 zeros, some non-minimum-phase, some with dead
// time) under PI, PD, PID and lead in planes of two of their parameters
// and compares the maps with full evaluation node by node, and the swept
// edges with the counts.
func TestCertifiedRandomLoops(t *testing.T) {
	rng := rand.New(rand.NewPCG(12, 34))
	planes := []struct{ ctrl, set, x, y string }{
		{"pi", "", "kp", "ki"},
		{"pd", "", "kp", "kd"},
		{"pid", "kd=0.3,tau=0.05", "kp", "ki"},
		{"pid", "kp=1,tau=0.02", "ki", "kd"},
		{"pid", "ki=0.5", "kp", "kd"},
		{"lead", "", "k", "z"}, // k·z: bilinear, edges checked but every node evaluated
		{"lead", "z=1", "k", "p"},
	}
	for trial := 0; trial < 120; trial++ {
		pl := planes[trial%len(planes)]
		plant := "1"
		for range 1 + rng.IntN(2) {
			if rng.IntN(3) == 0 {
				plant = fmt.Sprintf("%s*(%.3g-s)", plant, 0.5+3*rng.Float64())
				continue
			}
			plant = fmt.Sprintf("%s*(s+%.3g)", plant, 0.2+4*rng.Float64())
		}
		plant = fmt.Sprintf("%.3g*%s/(1", 0.5+4*rng.Float64(), plant)
		for range 2 + rng.IntN(5) {
			p := 0.1 + 3*rng.Float64()
			if rng.IntN(6) == 0 {
				p = -p
			}
			plant = fmt.Sprintf("%s*(s+%.3g)", plant, p)
		}
		plant += ")"
		if trial%7 == 3 {
			// Dead time: swept edges, every node evaluated.
			plant = fmt.Sprintf("%s*exp(-%.3g*s)", plant, 0.05+rng.Float64())
		}
		sc := scenarioOf(plant, pl.ctrl, spec.Axis{Param: pl.x, Min: -3 * rng.Float64(), Max: 1 + 10*rng.Float64()},
			spec.Axis{Param: pl.y, Min: -rng.Float64(), Max: 0.5 + 5*rng.Float64()}, 90+rng.IntN(60), 70+rng.IntN(60))
		if pl.set != "" {
			vals, err := spec.ParseValues(pl.set)
			if err != nil {
				t.Fatal(err)
			}
			sc.Fixed = vals
		}
		checkCertified(t, fmt.Sprintf("%s on %s, fixed %v, window %v × %v, %d×%d", pl.ctrl, plant, sc.Fixed, sc.Axes.X, sc.Axes.Y, sc.Axes.Columns, sc.Axes.Rows), sc)
	}
}

// TestIslandOnCoarseGrid maps PI on (s+6)²/(s(s+1)²(s+36)), whose
// second, small stable region lies below ki ≈ 0.61 (invented for this
// project's tests; the D-partition test of regions/dpartition derives the
// figure from PI's curve kp = −Re[1/G(jω)], ki = ω·Im[1/G(jω)]), on a
// 20×10 grid of kp 0…80, ki 0…8: no row of nodes passes through the
// region, yet its edge is drawn, an arch from (0, 0) back to ki = 0.
func TestIslandOnCoarseGrid(t *testing.T) {
	sc := scenarioOf("(s+6)^2/(s*(s+1)^2*(s+36))", "pi", spec.Axis{Param: "kp", Min: 0, Max: 80}, spec.Axis{Param: "ki", Min: 0, Max: 8}, 20, 10)
	res := runMap(t, sc)
	if res.EdgeReport.Method != boundary.Swept {
		t.Fatalf("edges by %s", res.EdgeReport.Method)
	}
	found := false
	for _, c := range res.Curves {
		if c.Kind != stability.Complex || c.Points[0].X != 0 || c.Points[0].Y != 0 {
			continue
		}
		top, last := 0.0, c.Points[len(c.Points)-1]
		for _, p := range c.Points {
			top = max(top, p.Y)
		}
		// The arch's top is 0.61 to within the chord of the polyline.
		if top > 0.6 && top < 0.62 && last.Y == 0 && last.X > 0 {
			found = true
		}
	}
	if !found {
		t.Fatalf("no arch from (0, 0) back to ki = 0 with its top near ki = 0.61 among %d curves", len(res.Curves))
	}
}

// TestDegree20AgainstEigenvalues maps PI on an invented plant of 19 real
// lags, 1/∏(1 + s/(0.5+0.25i)), i = 0…18 (characteristic degree 20), on
// 200×150 nodes and checks every third node of every third row against
// gonum's eigenvalues, but those with a root within 1e-6 of the axis
// relative to its magnitude.
func TestDegree20AgainstEigenvalues(t *testing.T) {
	plant := "1/(1"
	for i := 0; i < 19; i++ {
		plant += fmt.Sprintf("*(%g*s+1)", 1/(0.5+0.25*float64(i)))
	}
	plant += ")"
	sc := scenarioOf(plant, "pi", spec.Axis{Param: "kp", Min: -1, Max: 4}, spec.Axis{Param: "ki", Min: -0.2, Max: 1}, 200, 150)
	job, err := NewMap(sc)
	if err != nil {
		t.Fatal(err)
	}
	res, err := job.Run(context.Background(), Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	checked := 0
	for j := 0; j < res.Y.N; j += 3 {
		for i := 0; i < res.X.N; i += 3 {
			want, near := eigenCount(t, job.setup.Char.Eval(res.X.At(i), res.Y.At(j)))
			if near {
				continue
			}
			checked++
			if got := res.Map.Count(i, j); got != want {
				t.Fatalf("node (%g, %g): count %d, eigenvalues %d", res.X.At(i), res.Y.At(j), got, want)
			}
		}
	}
	if checked < 3300 || res.Stats.Stable == 0 {
		t.Fatalf("%d nodes checked, %d stable", checked, res.Stats.Stable)
	}
}
