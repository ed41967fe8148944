package family

import (
	"math"
	"math/cmplx"
	"math/rand/v2"
	"strings"
	"testing"
)

// digitalDirect evaluates each digital structure's C(z) from its formula,
// written here independently of the Forms (derived by hand in Digital's
// and DigitalPrewarped's comments): the integral and derivative
// substitutions and s = c·(z − 1)/(z + 1) applied to the continuous
// structures.
func digitalDirect(name string, T, c float64, rule IntegralRule, v []float64, z complex128) complex128 {
	x := func(i int) complex128 { return complex(v[i], 0) }
	tc := complex(T, 0)
	integral := func(ki complex128) complex128 {
		switch rule {
		case Forward:
			return ki * tc / (z - 1)
		case Trapezoid:
			return ki * tc / 2 * (z + 1) / (z - 1)
		}
		return ki * tc * z / (z - 1)
	}
	s := complex(c, 0) * (z - 1) / (z + 1)
	switch name {
	case "p":
		return x(0)
	case "pi":
		return x(0) + integral(x(1))
	case "pd":
		return x(0) + x(1)*(z-1)/(tc*z)
	case "pid":
		return x(0) + integral(x(1)) + x(2)*(z-1)/((x(3)+tc)*z-x(3))
	case "leadlag":
		return x(0) * (s + x(1)) * (s + x(3)) / ((s + x(2)) * (s + x(4)))
	}
	return x(0) * (s + x(1)) / (s + x(2))
}

type digitalCase struct {
	f    Sampled
	rule IntegralRule
	c    float64
}

// digitalCases returns every structure under every rule at two sample
// times, and lead, lag and leadlag pre-warped.
func digitalCases(t *testing.T) []digitalCase {
	var out []digitalCase
	for _, cont := range All() {
		for _, T := range []float64{0.05, 1.5} {
			for _, rule := range []IntegralRule{Backward, Forward, Trapezoid} {
				f, err := Digital(cont.Name(), T, rule)
				if err != nil {
					t.Fatal(err)
				}
				out = append(out, digitalCase{f, rule, 2 / T})
			}
		}
		if n := cont.Name(); n == "lead" || n == "lag" || n == "leadlag" {
			const T, w = 0.2, 4.0
			f, err := DigitalPrewarped(n, T, w)
			if err != nil {
				t.Fatal(err)
			}
			out = append(out, digitalCase{f, Backward, w / math.Tan(w*T/2)})
		}
	}
	return out
}

// TestDigitalMatchesFormulas evaluates every digital C(z) at random
// parameter values and random points of the complex plane against the
// direct formula.
func TestDigitalMatchesFormulas(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for _, dc := range digitalCases(t) {
		for range 40 {
			v := make([]float64, len(dc.f.Params()))
			for i := range v {
				v[i] = 3*rng.Float64() - 0.5
			}
			z := cmplx.Rect(0.3+1.5*rng.Float64(), 2*math.Pi*rng.Float64())
			num, den := Controller(dc.f, v)
			got := num.Eval(z) / den.Eval(z)
			want := digitalDirect(dc.f.Name(), dc.f.SampleTime(), dc.c, dc.rule, v, z)
			// Relative 1e-11: the direct formula divides by z − 1 and z + 1
			// separately, which costs digits near those points.
			if cmplx.Abs(got-want) > 1e-11*(1+cmplx.Abs(want)) {
				t.Fatalf("%s: C(%v) at %v = %v, formula %v", dc.f.Formula(), z, v, got, want)
			}
		}
	}
}

// TestDigitalSplitRecomposes checks, for every pair of parameters of every
// digital structure, that Split's A + x·B + y·C + x·y·E equals the forms
// evaluated with the two parameters moved, which holds only if every
// coefficient is multi-affine.
func TestDigitalSplitRecomposes(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 14))
	for _, dc := range digitalCases(t) {
		tf := dc.f.Transfer()
		n := len(dc.f.Params())
		base := make([]float64, n)
		for i := range base {
			base[i] = 2*rng.Float64() - 0.5
		}
		for xi := range n {
			for yi := range n {
				x, y := 4*rng.Float64()-2, 4*rng.Float64()-2
				moved := append([]float64(nil), base...)
				moved[xi] = x
				if yi != xi {
					moved[yi] = y
				} else {
					y = 0
				}
				for side, fs := range [][]Form{tf.Num, tf.Den} {
					a, b, c, e := Split(fs, base, xi, yi)
					want := evalForms(fs, moved)
					for k := range want {
						got := a[k] + x*b[k] + y*c[k] + x*y*e[k]
						if math.Abs(got-want[k]) > 1e-12*(1+math.Abs(want[k])) {
							t.Fatalf("%s, side %d, axes %d, %d, z^%d: split gives %g, forms %g", dc.f.Formula(), side, xi, yi, k, got, want[k])
						}
					}
				}
			}
		}
	}
}

// TestPrewarpMatchesAtItsFrequency: at z = e^(jωT),
// (z − 1)/(z + 1) = j·tan(ωT/2), so s ← (ω0/tan(ω0T/2))·(z − 1)/(z + 1)
// gives s = jω0 exactly at ω0 (derived by hand), and the digital lead
// equals the continuous one there; without pre-warping it does not.
func TestPrewarpMatchesAtItsFrequency(t *testing.T) {
	const T, w0 = 0.2, 6.0
	v := []float64{2, 1.5, 12}
	cont := direct["lead"](v, complex(0, w0))
	z := cmplx.Exp(complex(0, w0*T))
	warped, err := DigitalPrewarped("lead", T, w0)
	if err != nil {
		t.Fatal(err)
	}
	plain, err := Digital("lead", T, Backward)
	if err != nil {
		t.Fatal(err)
	}
	at := func(f Family) complex128 { n, d := Controller(f, v); return n.Eval(z) / d.Eval(z) }
	if d := cmplx.Abs(at(warped) - cont); d > 1e-13*cmplx.Abs(cont) {
		t.Errorf("pre-warped lead at ω0: %v, continuous %v", at(warped), cont)
	}
	if d := cmplx.Abs(at(plain) - cont); d < 1e-3*cmplx.Abs(cont) {
		t.Errorf("plain trapezoidal lead matches at ω0 (%v): the example shows nothing", at(plain))
	}
}

// TestDigitalApproachesContinuous: as T → 0 every rule tends to the
// continuous controller at z = e^(jωT) (common practice: all three are
// first-order accurate or better).
func TestDigitalApproachesContinuous(t *testing.T) {
	const w = 0.7
	v := []float64{1.3, 0.6, 0.4, 0.2}
	cont := direct["pid"](v, complex(0, w))
	for _, rule := range []IntegralRule{Backward, Forward, Trapezoid} {
		f, err := Digital("pid", 1e-5, rule)
		if err != nil {
			t.Fatal(err)
		}
		n, d := Controller(f, v)
		z := cmplx.Exp(complex(0, w*1e-5))
		if got := n.Eval(z) / d.Eval(z); cmplx.Abs(got-cont) > 1e-3*cmplx.Abs(cont) {
			t.Errorf("%v: C(e^(jωT)) = %v, continuous %v", rule, got, cont)
		}
	}
}

func TestDigitalFormulas(t *testing.T) {
	tests := []struct {
		name string
		T    float64
		rule IntegralRule
		want string
	}{
		{"p", 0.1, Backward, "C(z) = kp"},
		{"pi", 0.1, Backward, "C(z) = kp + ki·0.1·z/(z−1)"},
		{"pi", 0.1, Forward, "C(z) = kp + ki·0.1/(z−1)"},
		{"pi", 0.1, Trapezoid, "C(z) = kp + ki·0.05·(z+1)/(z−1)"},
		{"pd", 0.5, Backward, "C(z) = kp + kd·(z−1)/(0.5·z)"},
		{"pid", 0.5, Backward, "C(z) = kp + ki·0.5·z/(z−1) + kd·(z−1)/((tau+0.5)·z − tau)"},
		{"lead", 0.1, Backward, "C(z) = k·(s+z)/(s+p) at s = 20·(z−1)/(z+1)"},
	}
	for _, tc := range tests {
		f, err := Digital(tc.name, tc.T, tc.rule)
		if err != nil {
			t.Fatal(err)
		}
		if got := f.Formula(); got != tc.want {
			t.Errorf("%s, %v: %q, want %q", tc.name, tc.rule, got, tc.want)
		}
	}
}

// TestDigitalKeepsParameters: the digital structures have the names,
// defaults and order of the continuous ones.
func TestDigitalKeepsParameters(t *testing.T) {
	for _, cont := range All() {
		f, err := Digital(cont.Name(), 0.1, Trapezoid)
		if err != nil {
			t.Fatal(err)
		}
		got, want := f.Params(), cont.Params()
		if len(got) != len(want) {
			t.Fatalf("%s: %d parameters, want %d", cont.Name(), len(got), len(want))
		}
		for i := range want {
			if got[i] != want[i] {
				t.Errorf("%s parameter %d: %+v, want %+v", cont.Name(), i, got[i], want[i])
			}
		}
		if f.SampleTime() != 0.1 || f.Name() != cont.Name() {
			t.Errorf("%s: name %q, sample time %g", cont.Name(), f.Name(), f.SampleTime())
		}
	}
}

func TestDigitalErrors(t *testing.T) {
	tests := []struct {
		name string
		make func() (Sampled, error)
		want string
	}{
		{"unknown structure", func() (Sampled, error) { return Digital("pidd", 0.1, Backward) }, `"pidd"`},
		{"zero sample time", func() (Sampled, error) { return Digital("pi", 0, Backward) }, "sample time 0"},
		{"NaN sample time", func() (Sampled, error) { return Digital("pi", math.NaN(), Backward) }, "sample time NaN"},
		{"bad rule", func() (Sampled, error) { return Digital("pi", 0.1, IntegralRule(7)) }, "rule 7"},
		{"pre-warp on pi", func() (Sampled, error) { return DigitalPrewarped("pi", 0.1, 3) }, `"pi"`},
		{"pre-warp above Nyquist", func() (Sampled, error) { return DigitalPrewarped("lead", 0.1, 40) }, "40 rad/s"},
		{"pre-warp at zero", func() (Sampled, error) { return DigitalPrewarped("lag", 0.1, 0) }, "0 rad/s"},
	}
	for _, tc := range tests {
		if _, err := tc.make(); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("%s: error %v, want one mentioning %s", tc.name, err, tc.want)
		}
	}
}

func TestParseIntegralRule(t *testing.T) {
	for _, r := range []IntegralRule{Backward, Forward, Trapezoid} {
		got, err := ParseIntegralRule(" " + strings.ToUpper(r.String()))
		if err != nil || got != r {
			t.Errorf("ParseIntegralRule(%q) = %v, %v", r.String(), got, err)
		}
	}
	if _, err := ParseIntegralRule("tustin2"); err == nil || !strings.Contains(err.Error(), "tustin2") {
		t.Errorf("unknown rule: %v", err)
	}
	if IntegralRuleNames() != "backward, forward, trapezoid" {
		t.Errorf("IntegralRuleNames() = %q", IntegralRuleNames())
	}
}
