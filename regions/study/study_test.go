package study

import (
	"context"
	"errors"
	"math"
	"testing"

	"gainscape/regions/isoline"
	"gainscape/regions/poly"
	"gainscape/regions/scenario"
	"gainscape/regions/spec"
	"gainscape/regions/stability"
)

// scenarioOf returns a scenario for plant under ctrl in the given window.
func scenarioOf(plant, ctrl string, x, y spec.Axis, nx, ny int) scenario.Scenario {
	sc := scenario.Default()
	sc.Loop = scenario.Loop{Plant: plant, Controller: ctrl}
	sc.Axes = scenario.Axes{X: x, Y: y, Columns: nx, Rows: ny}
	sc.Overlays = scenario.Overlays{}
	return sc
}

func runMap(t *testing.T, sc scenario.Scenario) *MapResult {
	t.Helper()
	job, err := NewMap(sc)
	if err != nil {
		t.Fatal(err)
	}
	res, err := job.Run(context.Background(), Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// eigenCount is the right-half-plane count from gonum's eigenvalues, the
// independent reference, and whether a root is too near the axis for
// either method to be decisive.
func eigenCount(t *testing.T, p poly.Poly) (int, bool) {
	t.Helper()
	roots, err := p.Roots()
	if err != nil {
		t.Fatal(err)
	}
	n, near := 0, false
	for _, r := range roots {
		if real(r) > 0 {
			n++
		}
		if math.Abs(real(r)) <= 1e-6*math.Hypot(real(r), imag(r)) {
			near = true
		}
	}
	return n, near
}

// TestMapAgainstHandDerivedEdges maps PI on 1/(s+1)³. Derived by hand:
// the characteristic polynomial is s⁴ + 3s³ + 3s² + (1+kp)s + ki; at
// s = jω its real part ω⁴ − 3ω² + ki and imaginary part (1+kp)ω − 3ω³
// vanish on kp = 3ω² − 1, ki = 3ω² − ω⁴; a root is at s = 0 where ki = 0.
// Every node is checked against gonum's eigenvalues.
func TestMapAgainstHandDerivedEdges(t *testing.T) {
	sc := scenarioOf("1/(s+1)^3", "pi", spec.Axis{Param: "kp", Min: -2, Max: 8}, spec.Axis{Param: "ki", Min: -1, Max: 3}, 90, 70)
	res := runMap(t, sc)
	var complexPts, realPts int
	realLo, realHi := math.Inf(1), math.Inf(-1)
	for _, c := range res.Curves {
		for _, p := range c.Points {
			switch c.Kind {
			case stability.Complex:
				complexPts++
				w2 := p.Omega * p.Omega
				if math.Abs(3*w2-1-p.X) > 1e-6*10 || math.Abs(3*w2-w2*w2-p.Y) > 1e-6*4 {
					t.Fatalf("complex point (%g, %g) at ω %g is off the hand-derived curve", p.X, p.Y, p.Omega)
				}
			case stability.Real:
				realPts++
				realLo, realHi = math.Min(realLo, p.X), math.Max(realHi, p.X)
				if math.Abs(p.Y) > 1e-8 || p.Omega != 0 {
					t.Fatalf("real point (%g, %g), ω %g, is off ki = 0", p.X, p.Y, p.Omega)
				}
			default:
				t.Fatalf("unexpected %v edge", c.Kind)
			}
		}
	}
	// The real edge is the straight line ki = 0 across the window.
	if complexPts < 40 || realPts < 2 || realLo != -2 || realHi != 8 {
		t.Fatalf("%d complex and %d real points, real edge over kp %g…%g", complexPts, realPts, realLo, realHi)
	}
	stable := 0
	for j := 0; j < res.Y.N; j++ {
		for i := 0; i < res.X.N; i++ {
			kp, ki := res.X.At(i), res.Y.At(j)
			want, near := eigenCount(t, poly.Poly{ki, 1 + kp, 3, 3, 1})
			if near {
				continue
			}
			if got := res.Map.Count(i, j); got != want {
				t.Fatalf("node (%g, %g): count %d, eigenvalues %d", kp, ki, got, want)
			}
			if want == 0 {
				stable++
			}
		}
	}
	if stable == 0 || res.Stats.Stable < stable || res.Edges[stability.Complex] == 0 {
		t.Fatalf("stats %+v, edges %v, %d stable by eigenvalues", res.Stats, res.Edges, stable)
	}
	// The complex edge starts at ω = 0 on ki = 0 and leaves the window
	// at kp = 8, ω = √3 (3ω² − 1 = 8).
	if lo, hi, ok := res.OmegaRange(); !ok || lo < 0 || math.Abs(hi-math.Sqrt(3)) > 1e-9 {
		t.Fatalf("ω range %g…%g", lo, hi)
	}
}

// TestMapOverlaysTracedOnce checks that the iso-lines a map returns are
// those of its grids and that the data hold the very same lines.
func TestMapOverlaysTracedOnce(t *testing.T) {
	sc := scenarioOf("1/(s+1)^3", "pi", spec.Axis{Param: "kp", Min: 0, Max: 6}, spec.Axis{Param: "ki", Min: 0, Max: 2}, 60, 40)
	sc.Overlays = scenario.Overlays{MsLevels: []float64{1.4, 2}, DampingLevels: []float64{0.5}, Best: []string{BestDecay, BestIntegral},
		Marks: [][]spec.Value{{{Param: "kp", V: 1}, {Param: "ki", V: 0.3}}}}
	res := runMap(t, sc)
	ov := res.Overlays
	if ov == nil || ov.Ms == nil || ov.Damping == nil || ov.Decay == nil || len(ov.Marks) != 1 || len(ov.Best) != 2 {
		t.Fatalf("overlays %+v", ov)
	}
	for k, level := range ov.Ms.Levels {
		want := isoline.Trace(ov.XAxis, ov.YAxis, ov.Ms.Values, level)
		if len(want) != len(ov.Ms.Lines[k]) {
			t.Fatalf("Ms = %g: %d lines; tracing again gives %d", level, len(ov.Ms.Lines[k]), len(want))
		}
	}
	doc := res.Data()
	if doc.Extra == nil || doc.Extra.Overlays.Ms == nil || len(doc.Extra.Overlays.Ms.Contours) != 2 {
		t.Fatalf("data overlays %+v", doc.Extra)
	}
	if len(doc.Extra.Overlays.Ms.Contours[0].Lines) != len(ov.Ms.Lines[0]) {
		t.Fatal("data and figure hold different lines")
	}
	for _, p := range ov.Best {
		if !p.Stable || !(float64(p.Ms) >= 1) {
			t.Fatalf("best point %+v", p)
		}
	}
	if ov.Marks[0].Label != "A" || !ov.Marks[0].Stable {
		t.Fatalf("mark %+v", ov.Marks[0])
	}
}

// TestInputErrors checks that what the user gave wrong comes back as an
// *InputError naming the flag.
func TestInputErrors(t *testing.T) {
	kp, ki := spec.Axis{Param: "kp", Min: 0, Max: 5}, spec.Axis{Param: "ki", Min: 0, Max: 1}
	tests := []struct {
		name string
		edit func(*scenario.Scenario)
		flag string
	}{
		{"syntax", func(s *scenario.Scenario) { s.Loop.Plant = "1/(s+1" }, "--plant"},
		{"improper", func(s *scenario.Scenario) { s.Loop.Plant = "s^2/(s+1)" }, "--plant"},
		{"zero denominator", func(s *scenario.Scenario) {
			s.Loop.Plant, s.Loop.Numerator, s.Loop.Denominator = "", []float64{1}, []float64{0, 0}
		}, "--num"},
		{"controller", func(s *scenario.Scenario) { s.Loop.Controller = "pidd" }, "--ctrl"},
		{"fixed name", func(s *scenario.Scenario) { s.Fixed = []spec.Value{{Param: "zz", V: 1}} }, "--set"},
		{"axis name", func(s *scenario.Scenario) { s.Axes.X.Param = "kd" }, "--x"},
		{"mark off the plane", func(s *scenario.Scenario) { s.Overlays.Marks = [][]spec.Value{{{Param: "kp", V: 1}}} }, "--mark"},
		{"ki search without ki", func(s *scenario.Scenario) {
			s.Loop.Controller, s.Axes.Y = "pd", spec.Axis{Param: "kd", Min: 0, Max: 1}
			s.Overlays.Best = []string{BestIntegral}
		}, "--best"},
	}
	for _, tc := range tests {
		sc := scenarioOf("1/(s+1)^3", "pi", kp, ki, 12, 10)
		tc.edit(&sc)
		job, err := NewMap(sc)
		if err == nil {
			_, err = job.Run(context.Background(), Options{})
		}
		var ie *InputError
		if !errors.As(err, &ie) || ie.Flag != tc.flag {
			t.Errorf("%s: error %v; want an input error naming %s", tc.name, err, tc.flag)
		}
	}
}

// TestProbeThirdOrderLag checks probe on 1/(s+1)³ under P against hand
// derivations: s³ + 3s² + 3s + 1 + kp is on the stability boundary at
// kp = 8 with roots ±j√3 (Routh: 3·3 = 1 + kp), so Ku = 8, Tu = 2π/√3;
// at kp = 2 the phase crossover is at ω = √3, where |L| = 2/8, so the
// gain margin is 4.
func TestProbeThirdOrderLag(t *testing.T) {
	probe := func(kp float64) *ProbeReport {
		rep, err := Probe(context.Background(), ProbeRequest{Loop: LoopSpec{Plant: "1/(s+1)^3", Controller: "p", Fixed: []spec.Value{{Param: "kp", V: kp}}}})
		if err != nil {
			t.Fatal(err)
		}
		return rep
	}
	r := probe(2).Doc
	if !r.Stable || r.RHP != 0 || len(r.SignArray) != 4 || r.CountFrom != "sign array" {
		t.Fatalf("kp = 2: %+v", r)
	}
	if math.Abs(float64(r.GainMargin)-4) > 1e-9 || math.Abs(float64(r.PhaseCrossover)-math.Sqrt(3)) > 1e-9 {
		t.Fatalf("gain margin %v at %v; want 4 at √3", r.GainMargin, r.PhaseCrossover)
	}
	if r.Ultimate == nil || math.Abs(r.Ultimate.Ku-8) > 1e-9 || math.Abs(r.Ultimate.Tu-2*math.Pi/math.Sqrt(3)) > 1e-9 {
		t.Fatalf("ultimate %+v", r.Ultimate)
	}
	m := probe(8).Doc
	if m.Stable || m.RHP != 0 || m.JW != 2 || len(m.JWOmegas) != 1 || math.Abs(m.JWOmegas[0]-math.Sqrt(3)) > 1e-9 {
		t.Fatalf("kp = 8: rhp %d, jω %d at %v", m.RHP, m.JW, m.JWOmegas)
	}
	if u := probe(9).Doc; u.RHP != 2 {
		t.Fatalf("kp = 9: %d in the right half plane; want 2", u.RHP)
	}
}

// TestVaryThirdOrderLag: −1 < kp < 8 for 1/(s+1)³ (see above), the lower
// end a real root through 0 (1 + kp = 0).
func TestVaryThirdOrderLag(t *testing.T) {
	rep, err := Vary(VaryRequest{Loop: LoopSpec{Plant: "1/(s+1)^3", Controller: "p"}, Range: spec.Axis{Param: "kp", Min: -10, Max: 100}, Text: "kp=-10:100"})
	if err != nil {
		t.Fatal(err)
	}
	iv := rep.Doc.Intervals
	if len(iv) != 1 || math.Abs(iv[0].Lo+1) > 1e-9 || math.Abs(iv[0].Hi-8) > 1e-9 || iv[0].LoKind != "real" || iv[0].HiKind != "complex" {
		t.Fatalf("intervals %+v", iv)
	}
	if _, err := Vary(VaryRequest{Loop: LoopSpec{Plant: "1/(s+1)^3", Controller: "p"}, Range: spec.Axis{Param: "zz", Min: 0, Max: 1}, Text: "zz=0:1"}); !IsInput(err) {
		t.Fatalf("unknown parameter: %v", err)
	}
}

// TestEveryGainMargin: the conditionally stable loop 4/((s−1)(s+3)(0.1s+1))
// under PI (kp = 2, ki = 0.1; invented) has two phase crossovers. Each
// margin is checked against gonum's eigenvalues: the characteristic
// polynomial with the loop gain scaled by the margin has a pair on the
// imaginary axis at the crossover frequency.
func TestEveryGainMargin(t *testing.T) {
	ls := LoopSpec{Plant: "4/((s-1)*(s+3)*(0.1*s+1))", Controller: "pi", Fixed: []spec.Value{{Param: "kp", V: 2}, {Param: "ki", V: 0.1}}}
	rep, err := Probe(context.Background(), ProbeRequest{Loop: ls})
	if err != nil {
		t.Fatal(err)
	}
	d := rep.Doc
	if !d.Stable || len(d.GainMargins) != 2 || d.GainMargins[0].Direction != "fall" || d.GainMargins[1].Direction != "rise" {
		t.Fatalf("margins %+v", d.GainMargins)
	}
	l, _ := ls.Build()
	num, den := l.Open()
	for _, g := range d.GainMargins {
		p := poly.Add(den, num.Scaled(g.Factor))
		roots, _ := p.Roots()
		found := false
		for _, r := range roots {
			if math.Abs(real(r)) < 1e-6*g.Freq && math.Abs(math.Abs(imag(r))-g.Freq) < 1e-6*g.Freq {
				found = true
			}
		}
		if !found {
			t.Errorf("gain %g: no root at ±j%g among %v", g.Factor, g.Freq, roots)
		}
	}
	if float64(d.GainMargin) != d.GainMargins[0].Factor {
		t.Errorf("gain_margin %v is not the one nearest 0 dB", d.GainMargin)
	}
}

// TestTuningRulesChecked: on the invented plant 900/(s(s+2)(s²+1.2s+900)),
// a lightly damped resonance beyond the ultimate frequency, the
// Ziegler–Nichols PID setting leaves four roots in the right half plane;
// each rule's verdict is checked against gonum's eigenvalues.
func TestTuningRulesChecked(t *testing.T) {
	ls := LoopSpec{Plant: "900/(s*(s+2)*(s^2+1.2*s+900))", Controller: "p"}
	rep, err := Probe(context.Background(), ProbeRequest{Loop: ls})
	if err != nil {
		t.Fatal(err)
	}
	u := rep.Doc.Ultimate
	if u == nil || !u.RulesApply || len(u.Rules) != 5 {
		t.Fatalf("ultimate %+v", u)
	}
	for _, r := range u.Rules {
		fs := []spec.Value{{Param: "kp", V: r.Kp}}
		if r.Family != "p" {
			fs = append(fs, spec.Value{Param: "ki", V: r.Ki})
		}
		if r.Family == "pid" {
			fs = append(fs, spec.Value{Param: "kd", V: r.Kd})
		}
		l, err := LoopSpec{Plant: ls.Plant, Controller: r.Family, Fixed: fs}.Build()
		if err != nil {
			t.Fatal(err)
		}
		want, _ := eigenCount(t, l.Characteristic())
		if r.RHP != want || r.Stable != (want == 0) {
			t.Errorf("%s: rhp %d stable %v; eigenvalues %d", r.Name, r.RHP, r.Stable, want)
		}
		if r.Name == "Ziegler-Nichols PID" && r.RHP != 4 {
			t.Errorf("Ziegler-Nichols PID: %d roots in the right half plane; want 4", r.RHP)
		}
	}
	// An open-loop unstable plant: the rules are printed, marked as not
	// applying.
	rep, err = Probe(context.Background(), ProbeRequest{Loop: LoopSpec{Plant: "4/((s-1)*(s+3)*(0.1*s+1))", Controller: "p", Fixed: []spec.Value{{Param: "kp", V: 2}}}})
	if err != nil {
		t.Fatal(err)
	}
	if u := rep.Doc.Ultimate; u == nil || u.RulesApply || u.Note == "" {
		t.Errorf("rules on an unstable plant: %+v", u)
	}
}
