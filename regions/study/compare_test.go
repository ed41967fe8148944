package study

import (
	"context"
	"math"
	"slices"
	"testing"

	"gainscape/regions/spec"
)

// migoPlant is the fourth-order lag 1/(s+1)⁴, one of the test processes
// of K. J. Åström, H. Panagopoulos, T. Hägglund, "Design of PI
// controllers based on non-convex optimization", Automatica 34(5), 1998.
const migoPlant = "1/(s+1)^4"

func runCompare(t *testing.T, req CompareRequest) *Comparison {
	t.Helper()
	c, err := Compare(context.Background(), req, Options{Workers: 2})
	if err != nil {
		t.Fatal(err)
	}
	return c
}

// TestComparePIAgainstMIGO: the PI panel, its window chosen automatically,
// reproduces the MIGO design of Åström, Panagopoulos & Hägglund
// (Automatica 34(5), 1998) for 1/(s+1)⁴ at Ms = 1.4: K ≈ 0.43,
// Ti ≈ 2.25 (values from memory), within 2% in kp and in ki = K/Ti;
// its IE is 1/ki, and so is the integral of the load error of its step
// response, integrated here by the trapezoidal rule over the samples.
func TestComparePIAgainstMIGO(t *testing.T) {
	c := runCompare(t, CompareRequest{Panels: []PanelSpec{{Loop: LoopSpec{Plant: migoPlant, Controller: "pi"}}}, MsBound: 1.4})
	p := c.Panels[0]
	b := p.Table.BestKi
	kp, ki := b.Values["kp"], b.Values["ki"]
	const K, Ti = 0.43, 2.25
	if math.Abs(kp-K)/K > 0.02 || math.Abs(ki-K/Ti)/(K/Ti) > 0.02 {
		t.Errorf("kp %.4g, ki %.4g; MIGO gives K ≈ %g, ki ≈ %.4g", kp, ki, K, K/Ti)
	}
	if float64(b.Ms) > 1.4*(1+1e-9) {
		t.Errorf("Ms %.6g beyond the bound", float64(b.Ms))
	}
	if math.Abs(float64(b.IE)-1/ki) > 1e-12/ki {
		t.Errorf("IE %g; 1/ki = %g", float64(b.IE), 1/ki)
	}
	if p.Response == nil {
		t.Fatalf("no response: %s", p.ResponseFailed)
	}
	r := p.Response
	area := 0.0
	for k := 1; k < len(r.Time); k++ {
		area += 0.5 * (r.Time[k] - r.Time[k-1]) * (r.Load.Error[k] + r.Load.Error[k-1])
	}
	// The window ends when the slowest mode is down to 0.1%, which
	// leaves the integral within that of its final value; the
	// trapezoidal rule adds far less at a thousand samples or more.
	if math.Abs(-area-1/ki) > 2e-3/ki {
		t.Errorf("integrated load error %.6g; 1/ki = %.6g", area, 1/ki)
	}
	f := r.Figures
	if math.Abs(f.FinalSetpoint-1) > 1e-12 || math.Abs(f.FinalLoad) > 1e-12 {
		t.Errorf("final values %g, %g; want 1 and 0 with integral action", f.FinalSetpoint, f.FinalLoad)
	}
	if u := p.Table.Ultimate; u == nil || math.Abs(float64(u.Ku)-4) > 1e-9 || math.Abs(float64(u.Tu)-2*math.Pi) > 1e-9 {
		// By hand: (jω+1)⁴ is real negative at ω = 1, where |(jω+1)⁴| = 4.
		t.Errorf("ultimate %+v; want Ku = 4, Tu = 2π", u)
	}
}

// TestCompareKdZeroSliceIsPI: a PID with kd = 0 and tau = 0 is a PI, so
// its panel equals the PI panel node by node, edge point by edge point;
// its best ki over kd is at least the PI value (derivative action only
// adds freedom), and equals it when the search is held at kd = 0.
func TestCompareKdZeroSliceIsPI(t *testing.T) {
	pid := LoopSpec{Plant: migoPlant, Controller: "pid", Fixed: []spec.Value{{Param: "kd", V: 0}, {Param: "tau", V: 0}}}
	req := CompareRequest{Panels: []PanelSpec{{Loop: LoopSpec{Plant: migoPlant, Controller: "pi"}}, {Loop: pid}}, Columns: 120, Rows: 90}
	c := runCompare(t, req)
	pi, pd := c.Panels[0].Map, c.Panels[1].Map
	if pi.X != pd.X || pi.Y != pd.Y {
		t.Fatalf("windows differ: %v × %v and %v × %v", pi.X, pi.Y, pd.X, pd.Y)
	}
	if !slices.Equal(pi.Map.RHP, pd.Map.RHP) || !slices.Equal(pi.Map.Axis, pd.Map.Axis) {
		t.Fatal("the kd = 0 map differs from the PI map")
	}
	if len(pi.Curves) != len(pd.Curves) {
		t.Fatalf("%d and %d edges", len(pi.Curves), len(pd.Curves))
	}
	for k := range pi.Curves {
		if !slices.Equal(pi.Curves[k].Points, pd.Curves[k].Points) {
			t.Fatalf("edge %d differs", k)
		}
	}
	kiPI := c.Panels[0].Table.BestKi.Values["ki"]
	over := c.Panels[1].Table.OverKd
	if over == nil || over.Failed != "" {
		t.Fatalf("no search over kd: %+v", over)
	}
	// The searches refine to 1e-10 of the window and back off to meet
	// the refined Ms; 1e-6 covers both.
	if got := over.Values["ki"]; got < kiPI*(1-1e-6) {
		t.Errorf("best ki over kd %.8g below the PI value %.8g", got, kiPI)
	}
	req.KdRange = &[2]float64{0, 0}
	req.Panels = req.Panels[1:]
	held := runCompare(t, req).Panels[0].Table.OverKd
	if got := held.Values["ki"]; math.Abs(got-kiPI) > 1e-6*kiPI || held.Values["kd"] != 0 {
		t.Errorf("held at kd = 0: ki %.8g, kd %g; PI gives ki %.8g", got, held.Values["kd"], kiPI)
	}
}

// TestCompareSharedWindow: panels of the same plane share the smallest
// window holding each one's, and say so.
func TestCompareSharedWindow(t *testing.T) {
	c := runCompare(t, CompareRequest{Panels: []PanelSpec{
		{Loop: LoopSpec{Plant: migoPlant, Controller: "pi"}},
		{Loop: LoopSpec{Plant: "0.5/(s+1)^4", Controller: "pi"}, PlantLabel: "worn"},
	}, Columns: 60, Rows: 45})
	a, b := c.Panels[0], c.Panels[1]
	if a.Map.X != b.Map.X || a.Map.Y != b.Map.Y {
		t.Errorf("windows %v × %v and %v × %v", a.Map.X, a.Map.Y, b.Map.X, b.Map.Y)
	}
	// Half the plant gain doubles the gains: Ku = 8 for the worn plant.
	if a.Map.X.Max < 8 || b.Label != "worn: PI" {
		t.Errorf("window to kp = %g, label %q", a.Map.X.Max, b.Label)
	}
	// The lower gain allows twice the gains: twice the best ki.
	r := b.Table.BestKi.Values["ki"] / a.Table.BestKi.Values["ki"]
	if math.Abs(r-2) > 1e-5 {
		t.Errorf("best ki ratio %g; want 2", r)
	}
}

// TestCompareWithoutIntegralAction: a lead panel has no best-ki design
// and says why; its other figures are there.
func TestCompareWithoutIntegralAction(t *testing.T) {
	c := runCompare(t, CompareRequest{Panels: []PanelSpec{{Loop: LoopSpec{Plant: migoPlant, Controller: "lead"}}}, Columns: 60, Rows: 45})
	p := c.Panels[0]
	if p.Table.BestKi.Failed == "" || p.Response != nil || p.ResponseFailed == "" {
		t.Errorf("best ki %+v, response failed %q", p.Table.BestKi, p.ResponseFailed)
	}
	if p.Table.BestDecay.Failed != "" || !(p.Table.StableShare > 0) {
		t.Errorf("best decay %+v, share %g", p.Table.BestDecay, p.Table.StableShare)
	}
}

// TestCompareRefusals: no panel, too many, and a bad plant in one panel,
// each an input error naming the panel where there is one.
func TestCompareRefusals(t *testing.T) {
	pi := PanelSpec{Loop: LoopSpec{Plant: migoPlant, Controller: "pi"}}
	tests := []struct {
		name   string
		panels []PanelSpec
	}{
		{"none", nil},
		{"ten", slices.Repeat([]PanelSpec{pi}, 10)},
		{"bad plant", []PanelSpec{pi, {Loop: LoopSpec{Plant: "1/(s", Controller: "pi"}}}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Compare(context.Background(), CompareRequest{Panels: tc.panels, Columns: 20, Rows: 20}, Options{})
			if err == nil || !IsInput(err) {
				t.Fatalf("error %v; want an input error", err)
			}
		})
	}
}

// TestCompareDeadTimeAndSampled: panels of a loop with dead time and of a
// sampled loop (invented plants) get their best designs like any other,
// and each design, probed on its own, is stable with Ms within the bound
// (Ms taken with the delay in the loop, and on the unit circle). Sampling
// behind a hold only adds phase lag, so the sampled PI's best integral
// gain lies below the continuous one's (common practice).
func TestCompareDeadTimeAndSampled(t *testing.T) {
	plant := "2/((4*s+1)*(s+1))"
	panels := []PanelSpec{
		{Loop: LoopSpec{Plant: "2*exp(-1.5*s)/((4*s+1)*(s+1))", Controller: "pi"}},
		{Loop: LoopSpec{Plant: plant, Controller: "pi", Sample: 0.5}},
		{Loop: LoopSpec{Plant: plant, Controller: "pi"}},
	}
	c := runCompare(t, CompareRequest{Panels: panels, Columns: 60, Rows: 50})
	for k, p := range c.Panels {
		b := p.Table.BestKi
		if b.Failed != "" || !(p.Table.StableShare > 0) || p.Response == nil {
			t.Fatalf("panel %d: best ki %+v, share %g, response %v", k+1, b, p.Table.StableShare, p.Response != nil)
		}
		ls := panels[k].Loop
		ls.Fixed = []spec.Value{{Param: "kp", V: b.Values["kp"]}, {Param: "ki", V: b.Values["ki"]}}
		rep, err := Probe(context.Background(), ProbeRequest{Loop: ls})
		if err != nil {
			t.Fatal(err)
		}
		ms := float64(rep.Doc.Ms)
		if !rep.Doc.Stable || ms > c.Bound*(1+1e-3) || math.Abs(ms-float64(b.Ms)) > 1e-3*ms {
			t.Errorf("panel %d: design %v stable %v, Ms %g by probe and %g in the table, bound %g", k+1, b.Values, rep.Doc.Stable, ms, float64(b.Ms), c.Bound)
		}
	}
	if sampled, cont := c.Panels[1].Table.BestKi.Values["ki"], c.Panels[2].Table.BestKi.Values["ki"]; !(sampled < cont) {
		t.Errorf("best ki sampled every 0.5 s %g, continuous %g: sampling should lower it", sampled, cont)
	}
}
