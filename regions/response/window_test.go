package response

import (
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// The window rule on loops whose poles are known by hand (invented
// plants; the rule is that of the doc comment of rule).
func TestWindowRule(t *testing.T) {
	ln := math.Log(1000)
	for _, tc := range []struct {
		name      string
		l         Loop
		o         Options
		duration  float64
		samples   int
		oscillate float64
	}{
		{
			// Δ = s² + 2s + 2, poles −1 ± j: visible (σ·2π/ω = 2π < ln 1000),
			// three periods 6π outlast the decay ln 1000.
			name: "periods rule", l: Loop{PlantNum: p(1), PlantDen: p(1, 2, 0), CtrlNum: p(2), CtrlDen: p(1)},
			duration: 6 * math.Pi, samples: DefaultMinSamples, oscillate: 1,
		},
		{
			// Δ = s² + 0.2s + 100, poles −0.1 ± j√99.99: the decay sets the
			// length ln 1000/0.1 and 20 samples per period the count.
			name: "resolution rule", l: Loop{PlantNum: p(100), PlantDen: p(1, 0.2, 0), CtrlNum: p(1), CtrlDen: p(1)},
			duration: ln / 0.1, samples: int(math.Ceil(20 * ln / 0.1 * math.Sqrt(99.99) / (2 * math.Pi))), oscillate: math.Sqrt(99.99),
		},
		{
			// The same loop with a cap on the count.
			name: "sample cap", l: Loop{PlantNum: p(100), PlantDen: p(1, 0.2, 0), CtrlNum: p(1), CtrlDen: p(1)},
			o:        Options{MaxSamples: 1500, MinSamples: 10},
			duration: ln / 0.1, samples: 1500, oscillate: math.Sqrt(99.99),
		},
		{
			// Δ = s² + 2s + 2 again, with a decay fraction of 1e-6 that
			// outlasts three periods: 6·ln 10/1.
			name: "decay fraction", l: Loop{PlantNum: p(1), PlantDen: p(1, 2, 0), CtrlNum: p(2), CtrlDen: p(1)},
			o:        Options{DecayTo: 1e-9},
			duration: 9 * math.Log(10), samples: DefaultMinSamples, oscillate: 1,
		},
		{
			name: "fixed window", l: Loop{PlantNum: p(1), PlantDen: p(1, 2, 0), CtrlNum: p(2), CtrlDen: p(1)},
			o:        Options{Duration: 5, Samples: 50},
			duration: 5, samples: 50, oscillate: 1,
		},
		{
			// z-plane pole b = 0.3: |b|^N ≤ 1e-3 from N = 6.
			name: "sampled, monotone", l: Loop{PlantNum: p(0.5), PlantDen: p(1, -0.8), CtrlNum: p(1), CtrlDen: p(1), Period: 0.1},
			duration: 0.6, samples: 6,
		},
		{
			// b = −0.4: |b|^N ≤ 1e-3 from N = 8; the alternation (θ = π,
			// a period of two samples) is visible, three periods are 6.
			name: "sampled, alternating", l: Loop{PlantNum: p(0.5), PlantDen: p(1, -0.8), CtrlNum: p(2.4), CtrlDen: p(1), Period: 0.1},
			duration: 0.8, samples: 8, oscillate: math.Pi / 0.1,
		},
		{
			// Dead beat: G = 1/(z − 1), C = 1 gives Δ = z, the pole at 0;
			// one sample settles it and the window keeps deg Δ + 1 = 2
			// samples.
			name: "sampled, dead beat", l: Loop{PlantNum: p(1), PlantDen: p(1, -1), CtrlNum: p(1), CtrlDen: p(1), Period: 0.01},
			duration: 0.02, samples: 2,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sp, err := Window(tc.l, tc.o)
			if err != nil {
				t.Fatal(err)
			}
			check(t, "duration", sp.Duration, tc.duration, 1e-12, tc.duration)
			if sp.Samples != tc.samples {
				t.Errorf("samples %d, want %d", sp.Samples, tc.samples)
			}
			check(t, "step", sp.Step*float64(sp.Samples), sp.Duration, 1e-14, sp.Duration)
			check(t, "oscillation", sp.Oscillation, tc.oscillate, 1e-12, math.Max(tc.oscillate, 1))
		})
	}
}

// A dead-time loop's window is lengthened by L, and a whole number of
// steps spans L.
func TestWindowDeadTime(t *testing.T) {
	l := fopdtLoop([]float64{0.8}, []float64{1})
	sp, err := Window(l, Options{})
	if err != nil {
		t.Fatal(err)
	}
	r := mustStep(t, l, Options{})
	sigma := -real(r.Poles[0])
	if sp.Duration < fopdtL+math.Log(1000)/sigma*(1-1e-12) {
		t.Errorf("duration %g < L + ln 1000/σ = %g", sp.Duration, fopdtL+math.Log(1000)/sigma)
	}
	m := fopdtL / sp.Step
	if math.Abs(m-math.Round(m)) > 1e-9 {
		t.Errorf("L/step = %g, want a whole number", m)
	}
}

// Options outside their ranges are refused with the value in the error.
func TestOptionErrors(t *testing.T) {
	l := Loop{PlantNum: p(1), PlantDen: p(1, 1), CtrlNum: p(1), CtrlDen: p(1)}
	for _, tc := range []struct {
		name string
		o    Options
		want string
	}{
		{"negative duration", Options{Duration: -1}, "-1"},
		{"too many samples", Options{Samples: 2_000_000}, "2000000"},
		{"decay fraction above one", Options{DecayTo: 2}, "2"},
		{"band of 100%", Options{Band: 1}, "1"},
		{"bounds crossed", Options{MinSamples: 10, MaxSamples: 5}, "10 to 5"},
		{"no periods", Options{Periods: -3}, "-3"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Step(l, tc.o)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("Step with %+v: %v, want an error naming %q", tc.o, err, tc.want)
			}
		})
	}
}

// Figures that do not exist encode as null: a plant with a zero at the
// origin has a setpoint response that returns to zero (invented:
// G = s/((s+1)(s+2)) under kp = 1).
func TestFiguresJSON(t *testing.T) {
	r := mustStep(t, Loop{PlantNum: p(1, 0), PlantDen: p(1, 3, 2), CtrlNum: p(1), CtrlDen: p(1)}, Options{})
	if !math.IsNaN(r.Figures.Overshoot) || !math.IsNaN(r.Figures.RiseTime) || !math.IsNaN(r.Figures.SettlingTime) {
		t.Errorf("figures relative to a zero final value: %+v, want NaN", r.Figures)
	}
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	var back map[string]any
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	f := back["figures"].(map[string]any)
	for _, k := range []string{"overshoot", "rise_time", "settling_time"} {
		if v, ok := f[k]; !ok || v != nil {
			t.Errorf("figures[%q] = %v, want null", k, v)
		}
	}
	for _, k := range []string{"iae_load", "ie_load", "final_setpoint", "peak_load"} {
		if _, ok := f[k].(float64); !ok {
			t.Errorf("figures[%q] = %v, want a number", k, f[k])
		}
	}
	if _, ok := back["span"].(map[string]any)["slowest_decay"].(float64); !ok {
		t.Errorf("span %v has no slowest_decay", back["span"])
	}
	if len(back["time"].([]any)) != r.Span.Samples+1 {
		t.Errorf("time has %d entries, want %d", len(back["time"].([]any)), r.Span.Samples+1)
	}
}
