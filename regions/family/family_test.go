package family

import (
	"fmt"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"testing"
)

// direct evaluates each structure's C(s) from its textbook form, written
// here independently of the Forms (derived by hand from the Formula of
// each family).
var direct = map[string]func(v []float64, s complex128) complex128{
	"p":  func(v []float64, s complex128) complex128 { return complex(v[0], 0) },
	"pi": func(v []float64, s complex128) complex128 { return complex(v[0], 0) + complex(v[1], 0)/s },
	"pd": func(v []float64, s complex128) complex128 { return complex(v[0], 0) + complex(v[1], 0)*s },
	"pid": func(v []float64, s complex128) complex128 {
		kp, ki, kd, tau := complex(v[0], 0), complex(v[1], 0), complex(v[2], 0), complex(v[3], 0)
		return kp + ki/s + kd*s/(tau*s+1)
	},
	"lead": func(v []float64, s complex128) complex128 {
		return complex(v[0], 0) * (s + complex(v[1], 0)) / (s + complex(v[2], 0))
	},
	"lag": func(v []float64, s complex128) complex128 {
		return complex(v[0], 0) * (s + complex(v[1], 0)) / (s + complex(v[2], 0))
	},
	"leadlag": func(v []float64, s complex128) complex128 {
		k, z1, p1, z2, p2 := complex(v[0], 0), complex(v[1], 0), complex(v[2], 0), complex(v[3], 0), complex(v[4], 0)
		return k * (s + z1) * (s + z2) / ((s + p1) * (s + p2))
	},
}

// TestControllersMatchTheirFormulas evaluates every family's C(s) at
// random parameter values and points of the complex plane and compares
// it with the direct formula.
func TestControllersMatchTheirFormulas(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, f := range All() {
		d, ok := direct[f.Name()]
		if !ok {
			t.Fatalf("no direct formula for %s", f.Name())
		}
		for trial := 0; trial < 50; trial++ {
			v := make([]float64, len(f.Params()))
			for i := range v {
				v[i] = 4*rng.Float64() - 1
			}
			s := complex(2*rng.Float64()-1, 3*rng.Float64()+0.1)
			num, den := Controller(f, v)
			got := num.Eval(s) / den.Eval(s)
			want := d(v, s)
			if cmplx.Abs(got-want) > 1e-12*(1+cmplx.Abs(want)) {
				t.Fatalf("%s at %v, s = %v: C = %v, formula %v", f.Name(), v, s, got, want)
			}
		}
	}
}

// TestSplitRecomposes checks that A + x·B + y·C + x·y·E reproduces the
// forms at other values of the two parameters, for every pair of every
// family, and that a line (xi = yi) gives A + x·B.
func TestSplitRecomposes(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for _, f := range All() {
		tf := f.Transfer()
		n := len(f.Params())
		for xi := 0; xi < n; xi++ {
			for yi := 0; yi < n; yi++ {
				v := make([]float64, n)
				for i := range v {
					v[i] = 3*rng.Float64() - 1
				}
				for _, fs := range [][]Form{tf.Num, tf.Den} {
					a, b, c, e := Split(fs, v, xi, yi)
					for trial := 0; trial < 5; trial++ {
						x, y := 5*rng.Float64()-2, 5*rng.Float64()-2
						w := append([]float64(nil), v...)
						if xi == yi {
							y = 0
						}
						w[yi], w[xi] = y, x
						want := evalForms(fs, w)
						for k := range want {
							got := a[k] + x*b[k] + y*c[k] + x*y*e[k]
							if math.Abs(got-want[k]) > 1e-13*(1+math.Abs(want[k])) {
								t.Fatalf("%s, axes %d and %d, coefficient %d: %g, want %g", f.Name(), xi, yi, k, got, want[k])
							}
						}
					}
				}
			}
		}
	}
}

// TestSplitIsExact shows why the split is formed term by term: with a
// tiny fixed value beside a large one, differencing two evaluations
// loses the small part, the split keeps it to the last digit.
func TestSplitIsExact(t *testing.T) {
	// PID numerator s² coefficient kp·tau + kd; axes kp and ki, with
	// tau = 1e-17 and kd = 1: B = tau exactly (derived by hand).
	fs := PID{}.Transfer().Num
	v := []float64{0, 0, 1, 1e-17}
	_, b, _, _ := Split(fs, v, 0, 1)
	if b[2] != 1e-17 {
		t.Fatalf("B[2] = %g; want 1e-17 exactly", b[2])
	}
	at := func(kp float64) float64 { w := append([]float64(nil), v...); w[0] = kp; return evalForms(fs, w)[2] }
	if diff := at(1) - at(0); diff == 1e-17 {
		t.Fatalf("differencing kept the small term (%g); the example no longer shows the loss", diff)
	}
}

func TestTimesRejectsRepeats(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Fatal("a repeated parameter did not panic")
		}
	}()
	Times(1, 2, 2)
}

func TestLookupAndIndex(t *testing.T) {
	tests := []struct {
		name, param string
		index       int
		ok          bool
	}{
		{"pid", "kd", 2, true}, {" PI ", "ki", 1, true}, {"lead", "p", 2, true},
		{"pid", "zz", -1, false}, {"nosuch", "kp", -1, false},
	}
	for _, tc := range tests {
		f, err := Lookup(tc.name)
		if err != nil {
			if tc.ok {
				t.Errorf("Lookup(%q): %v", tc.name, err)
			}
			continue
		}
		i, err := Index(f, tc.param)
		if (err == nil) != tc.ok || i != tc.index {
			t.Errorf("Index(%s, %q) = %d, %v; want %d", tc.name, tc.param, i, err, tc.index)
		}
	}
}

func TestControllerPanicsOnWrongLength(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Fatal("wrong number of values did not panic")
		}
	}()
	Controller(PID{}, []float64{1, 2})
}

// ExampleController shows the PID structure as a ratio of polynomials.
func ExampleController() {
	num, den := Controller(PID{}, []float64{2, 0.5, 1, 0.1})
	fmt.Println(num, "/", den)
	// Output: 1.2·s^2 + 2.05·s + 0.5 / 0.1·s^2 + s
}
