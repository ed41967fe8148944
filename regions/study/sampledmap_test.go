package study

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"

	"gainscape/regions/export"
	"gainscape/regions/grid"
	"gainscape/regions/spec"
	"gainscape/regions/stability"
)

// TestMapDigitalPITriangle maps a digital PI (backward integral) on the
// held plant 1/(s + 1). Derived by hand in this test: with a = e^(−T),
// G(z) = (1 − a)/(z − a), C(z) = ((kp + T·ki)·z − kp)/(z − 1), and
//
//	P(z) = z² + b1·z + b0,  b1 = (1 − a)(kp + T·ki) − (1 + a),  b0 = a − (1 − a)·kp.
//
// The Jury conditions of a second-order P give the three edges of a
// triangle: P(1) = (1 − a)·T·ki > 0 (ki = 0, a root at z = 1),
// P(−1) = 2(1 + a) − (1 − a)(2kp + T·ki) > 0 (2kp + T·ki = 2·coth(T/2), a
// root at z = −1) and b0 < 1 (kp = −1, a pair on the circle at
// cos θ = −b1/2). Its vertices are (−1, 0), (coth(T/2), 0) and
// (−1, 2(coth(T/2) + 1)/T). The window puts ki = 0 on a row of nodes,
// where the integrator's root sits at z = 1: that row is marginal.
func TestMapDigitalPITriangle(t *testing.T) {
	const T = 0.5
	a, c := math.Exp(-T), 1/math.Tanh(T/2)
	apex := 2 * (c + 1) / T
	sc := scenarioOf("1/(s+1)", "pi", spec.Axis{Param: "kp", Min: -2, Max: 6}, spec.Axis{Param: "ki", Min: -1, Max: 24}, 81, 101)
	sc.Loop.Sample = T
	res := runMap(t, sc)
	seen := map[stability.Kind]int{}
	top, right := 0.0, math.Inf(1)
	for _, cv := range res.Curves {
		for _, p := range cv.Points {
			seen[cv.Kind]++
			// Edges are bisected to 1e-9 of the spans (8 and 25); 1e-7
			// leaves a margin.
			switch cv.Kind {
			case stability.Real:
				if math.Abs(p.Y) > 1e-7 || p.Omega != 0 {
					t.Fatalf("z = 1 point (%g, %g) is off ki = 0", p.X, p.Y)
				}
			case stability.Alternating:
				if math.Abs(2*p.X+T*p.Y-2*c) > 1e-7 || math.Abs(p.Omega-math.Pi/T) > 1e-12 {
					t.Fatalf("z = −1 point (%g, %g), ω %g, is off 2kp + T·ki = 2coth(T/2)", p.X, p.Y, p.Omega)
				}
				right = math.Min(right, math.Hypot(p.X-c, p.Y))
			case stability.Complex:
				b1 := (1-a)*(p.X+T*p.Y) - (1 + a)
				if math.Abs(p.X+1) > 1e-7 || math.Abs(p.Omega-math.Acos(-b1/2)/T) > 1e-5 {
					t.Fatalf("pair point (%g, %g), ω %g, is off kp = −1 or its frequency %g", p.X, p.Y, p.Omega, math.Acos(-b1/2)/T)
				}
				top = math.Max(top, p.Y)
			default:
				t.Fatalf("an edge of kind %v at (%g, %g)", cv.Kind, p.X, p.Y)
			}
		}
	}
	for _, k := range []stability.Kind{stability.Real, stability.Alternating, stability.Complex} {
		if seen[k] == 0 {
			t.Fatalf("no edge of kind %v", k)
		}
	}
	// The two vertices inside the window: the apex ends the pair's edge,
	// the z = −1 edge passes through (coth(T/2), 0). One cell (0.25 in
	// ki) is as near as marching squares carries an edge to a vertex.
	if math.Abs(top-apex) > 0.25 || right > 0.25 {
		t.Fatalf("the pair's edge ends at ki = %g, want %g; the z = −1 edge passes %g from (coth(T/2), 0)", top, apex, right)
	}
	// The row ki = 0 (j = 4) is marginal between the vertices on it.
	m := res.Map
	for i := 0; i < m.XAxis.N; i++ {
		x := m.XAxis.At(i)
		if x > -1+0.05 && x < c-0.05 && m.Class(i, 4) != stability.ClassMarginal {
			t.Fatalf("node (%g, 0) is %v, want marginal (the integrator at z = 1)", x, m.Class(i, 4))
		}
	}
	var buf bytes.Buffer
	if err := export.Write(&buf, res.Data()); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		SampleTime float64 `json:"sample_time"`
		Integral   string  `json:"integral"`
		Boundaries []struct {
			Kind string `json:"kind"`
		} `json:"boundaries"`
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	kinds := map[string]bool{}
	for _, b := range doc.Boundaries {
		kinds[b.Kind] = true
	}
	if doc.SampleTime != T || doc.Integral != "backward" || !kinds["alternating"] || !kinds["real"] || !kinds["complex"] {
		t.Fatalf("data: sample time %g, integral %q, kinds %v", doc.SampleTime, doc.Integral, kinds)
	}
}

// TestMapSampledCountsAgainstEigenvalues compares the count outside the
// unit circle at every node of maps of invented random held plants under
// digital PI and PID with the eigenvalue magnitudes of the
// characteristic polynomial (gonum), the independent reference.
func TestMapSampledCountsAgainstEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 43))
	plants := []string{"2/((s+1)*(s+3))", "1/(s*(s+2))", "3/((s+1)^3)", "(s+4)/((s+1)*(s^2+0.6*s+4))", "1/((s-0.5)*(s+2))"}
	ctrls := []string{"pi", "pid"}
	for trial := 0; trial < 10; trial++ {
		plant, ctrl := plants[trial%len(plants)], ctrls[trial%2]
		T := math.Exp(-3 + 3*rng.Float64())
		sc := scenarioOf(plant, ctrl, spec.Axis{Param: "kp", Min: -1, Max: 6}, spec.Axis{Param: "ki", Min: -0.5, Max: 4}, 31, 23)
		sc.Loop.Sample = T
		if ctrl == "pid" {
			sc.Fixed = []spec.Value{{Param: "kd", V: 0.3 * rng.Float64()}, {Param: "tau", V: 0.1}}
		}
		job, err := NewMap(sc)
		if err != nil {
			t.Fatal(err)
		}
		res, err := job.Run(context.Background(), Options{Workers: 2})
		if err != nil {
			t.Fatal(err)
		}
		s := job.setup
		for j := 0; j < s.Y.N; j++ {
			for i := 0; i < s.X.N; i++ {
				p := s.Char.Eval(s.X.At(i), s.Y.At(j)).Trim(0)
				roots, err := p.Roots()
				if err != nil {
					t.Fatal(err)
				}
				want, near := 0, false
				for _, r := range roots {
					m := cmplx.Abs(r)
					if m > 1 {
						want++
					}
					// A root within 1e-6 of the circle is one rounding may
					// place on either side, for the map and the reference.
					near = near || math.Abs(m-1) <= 1e-6
				}
				got := res.Map.RHP[j*s.X.N+i]
				if near || got == grid.Undecided {
					continue
				}
				if int(got) != want {
					t.Fatalf("%s under %s, T = %g, node (%g, %g): %d outside, eigenvalues say %d (%v)", plant, ctrl, T, s.X.At(i), s.Y.At(j), got, want, roots)
				}
			}
		}
	}
}

// TestMapCompareSamples checks the gain limits along kp that a map of a
// digital PI on K/(s(s+1)) prints for several sample times: at ki → 0+
// they are the P-only limits of ogataLimit (K. Ogata, Discrete-Time
// Control Systems, from memory, 2.3925 at T = 1 s with rounded
// coefficients), and the continuous loop, stable for every kp > 0 at
// small ki, reaches the window's side.
func TestMapCompareSamples(t *testing.T) {
	sc := scenarioOf("1/(s*(s+1))", "pi", spec.Axis{Param: "kp", Min: 0, Max: 5}, spec.Axis{Param: "ki", Min: 0, Max: 1}, 41, 21)
	sc.Loop.Sample = 1
	sc.Overlays.CompareSamples = []float64{0.5, 2, 1}
	res := runMap(t, sc)
	var ts []float64
	for _, e := range res.Compare {
		ts = append(ts, e.T)
		if !e.Above || e.LimitY <= 0 || e.LimitY > 1e-8 {
			t.Fatalf("T = %g: limit taken at ki = %g (above %v); the row ki = 0 is marginal", e.T, e.LimitY, e.Above)
		}
		if len(e.Limits) != 1 || e.Limits[0].Lo != 0 {
			t.Fatalf("T = %g: limits %+v, want one from 0", e.T, e.Limits)
		}
		hi := e.Limits[0].Hi
		if e.T == 0 {
			if hi != 5 || e.Limits[0].HiKind.String() != "none" {
				t.Fatalf("continuous: limit %g (%v), want the window's side", hi, e.Limits[0].HiKind)
			}
			continue
		}
		k, _, _ := ogataLimit(e.T)
		// ki = 1e-9 moves the limit by about 1e-9.
		if math.Abs(hi-k) > 1e-6 && k < 5 {
			t.Fatalf("T = %g: gain limit %.10g, want %.10g", e.T, hi, k)
		}
		if e.Own != (e.T == 1) || (e.Own && e.Curves != nil) || (!e.Own && len(e.Curves) == 0) {
			t.Fatalf("T = %g: own %v with %d curves", e.T, e.Own, len(e.Curves))
		}
	}
	if want := []float64{2, 1, 0.5, 0}; len(ts) != len(want) || ts[0] != 2 || ts[3] != 0 {
		t.Fatalf("sample times compared %v, want %v", ts, want)
	}
	data := res.Data()
	if len(data.Compare) != 4 || data.Compare[0].SampleTime != 2 {
		t.Fatalf("data holds %d compared sets", len(data.Compare))
	}
}

// TestSampledInputErrors checks that sampling inputs that do not fit
// together are refused, naming the flag and the value.
func TestSampledInputErrors(t *testing.T) {
	cases := []struct {
		name string
		ls   LoopSpec
		want []string
	}{
		{"plant in z without a sample time", LoopSpec{Plant: "0.5/(z-0.5)", Controller: "p"}, []string{"--plant", "--sample"}},
		{"negative sample time", LoopSpec{Plant: "1/(s+1)", Controller: "p", Sample: -1}, []string{"--sample -1"}},
		{"integral without sampling", LoopSpec{Plant: "1/(s+1)", Controller: "pi", Integral: "forward"}, []string{"--integral forward", "--sample"}},
		{"unknown integral rule", LoopSpec{Plant: "1/(s+1)", Controller: "pi", Sample: 0.1, Integral: "simpson"}, []string{"--integral", "simpson"}},
		{"pre-warp without sampling", LoopSpec{Plant: "1/(s+1)", Controller: "lead", Prewarp: 2}, []string{"--prewarp 2", "--sample"}},
		{"pre-warp of a PI", LoopSpec{Plant: "1/(s+1)", Controller: "pi", Sample: 0.1, Prewarp: 2}, []string{"--prewarp 2", "lead"}},
		{"pre-warp above π/T", LoopSpec{Plant: "1/(s+1)", Controller: "lead", Sample: 0.1, Prewarp: 40}, []string{"--prewarp 40", "π/T"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := c.ls.Build()
			if err == nil || !IsInput(err) {
				t.Fatalf("error %v, want an input error", err)
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Fatalf("error %q does not name %q", err, w)
				}
			}
		})
	}
	// A plant in z with a sample time is taken as it is: 0.5/(z − 0.5)
	// under kp has its root at z = 0.5 − 0.5·kp, inside for −1 < kp < 3
	// (derived by hand), the upper end at z = −1.
	rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: "0.5/(z-0.5)", Controller: "p", Sample: 0.1}, Range: spec.Axis{Param: "kp", Min: -5, Max: 5}})
	if err != nil {
		t.Fatal(err)
	}
	if iv := rep.Doc.Intervals; len(iv) != 1 || math.Abs(iv[0].Lo+1) > 1e-12 || math.Abs(iv[0].Hi-3) > 1e-12 || iv[0].HiKind != "alternating" {
		t.Fatalf("plant in z: intervals %+v, want −1 < kp < 3 ending at z = −1", rep.Doc.Intervals)
	}
}
