package intervals

import (
	"math"
	"math/rand/v2"
	"testing"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// randomLoop returns a loop with a random plant (poles and zeros spread
// over both half planes, magnitudes 0.2 to 5) under a random family with
// random parameter values, and the index of a random parameter.
func randomLoop(rng *rand.Rand) (loop.Loop, int) {
	roots := func(n int) []complex128 {
		var r []complex128
		for len(r) < n {
			mag := 0.2 + 4.8*rng.Float64()
			re := mag * (0.1 + 0.9*rng.Float64())
			if rng.IntN(4) == 0 {
				re = -re // a quarter of the roots in the right half plane
			}
			if n-len(r) >= 2 && rng.IntN(2) == 0 {
				im := mag * rng.Float64()
				r = append(r, complex(-re, im), complex(-re, -im))
				continue
			}
			r = append(r, complex(-re, 0))
		}
		return r
	}
	nd := 1 + rng.IntN(5)
	nn := rng.IntN(nd)
	den := poly.FromRoots(roots(nd))
	num := poly.FromRoots(roots(nn)).Scaled(0.5 + 2*rng.Float64())
	fams := family.All()
	f := fams[rng.IntN(len(fams))]
	v := family.Defaults(f)
	for i := range v {
		v[i] = 0.05 + 3*rng.Float64()
	}
	if f.Name() == "pid" && rng.IntN(2) == 0 {
		v[3] = 0 // ideal derivative: the top coefficient vanishes for every value
	}
	return loop.Loop{Plant: loop.Plant{Num: num, Den: den}, Family: f, Values: v}, rng.IntN(len(v))
}

// eigenStability is the independent reference: the closed loop at
// parameter value k is stable when every eigenvalue of the companion
// matrix (gonum, via poly.Roots) has a negative real part and the degree
// equals the generic degree. sure is false when the largest real part is
// within 1e-9 of the root scale of zero, where the reference itself
// cannot decide.
func eigenStability(t *testing.T, loop loop.Loop, param, degree int, k float64) (stable, sure bool) {
	t.Helper()
	p := loop.With(param, k, param, k).Characteristic().Trim(0)
	if p.Degree() < degree {
		return false, true
	}
	roots, err := p.Roots()
	if err != nil {
		t.Fatal(err)
	}
	maxRe, size := math.Inf(-1), 0.0
	for _, r := range roots {
		maxRe = math.Max(maxRe, real(r))
		size = math.Max(size, math.Hypot(real(r), imag(r)))
	}
	if len(roots) == 0 {
		return true, true
	}
	return maxRe < 0, math.Abs(maxRe) > 1e-9*math.Max(size, 1e-3)
}

// genericDegree is the degree of the characteristic polynomial at two
// arbitrary parameter values (the larger).
func genericDegree(loop loop.Loop, param int) int {
	d := 0
	for _, k := range []float64{0.318, -2.71} {
		d = max(d, loop.With(param, k, param, k).Characteristic().Trim(0).Degree())
	}
	return d
}

// TestStableAgreesWithEigenvalues checks 3000 random loops against gonum's
// eigenvalues: the middle of every interval is stable; just outside each
// end that is not a window end (1e-6 relative) the loop is not; and 61
// sample points across the window are stable exactly when they lie in an
// interval, wherever the reference is sure.
func TestStableAgreesWithEigenvalues(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	var ends, samples int
	kinds := map[stability.Kind]int{}
	for trial := 0; trial < 3000; trial++ {
		loop, param := randomLoop(rng)
		w := math.Pow(10, 2*rng.Float64()-0.5)
		lo, hi := -w*rng.Float64(), w*(0.2+rng.Float64())
		got, err := Stable(loop, param, lo, hi)
		if err != nil {
			t.Fatal(err)
		}
		deg := genericDegree(loop, param)
		inside := func(k float64) bool {
			for _, iv := range got {
				if k > iv.Lo && k < iv.Hi {
					return true
				}
			}
			return false
		}
		ref := func(k float64) float64 { return 1e-6 * math.Max(math.Abs(k), nearZero*(hi-lo)) }
		for _, iv := range got {
			if !(iv.Lo < iv.Hi) {
				t.Fatalf("trial %d: empty interval %+v", trial, iv)
			}
			if st, sure := eigenStability(t, loop, param, deg, 0.5*(iv.Lo+iv.Hi)); !st && sure {
				t.Fatalf("trial %d: middle of %+v unstable by eigenvalues; loop %v %v %s %v param %d",
					trial, iv, loop.Plant.Num, loop.Plant.Den, loop.Family.Name(), loop.Values, param)
			}
			for _, e := range []struct {
				k    float64
				kind stability.Kind
			}{{iv.Lo - ref(iv.Lo), iv.LoKind}, {iv.Hi + ref(iv.Hi), iv.HiKind}} {
				kinds[e.kind]++
				if e.kind == Window || inside(e.k) {
					continue
				}
				if st, sure := eigenStability(t, loop, param, deg, e.k); st && sure {
					t.Fatalf("trial %d: %g just outside %+v stable by eigenvalues; loop %v %v %s %v param %d",
						trial, e.k, iv, loop.Plant.Num, loop.Plant.Den, loop.Family.Name(), loop.Values, param)
				}
				ends++
			}
		}
		for i := 0; i <= 60; i++ {
			k := lo + (hi-lo)*float64(i)/60
			skip := false
			for _, iv := range got {
				skip = skip || math.Abs(k-iv.Lo) < ref(iv.Lo) || math.Abs(k-iv.Hi) < ref(iv.Hi)
			}
			st, sure := eigenStability(t, loop, param, deg, k)
			if skip || !sure {
				continue
			}
			if st != inside(k) {
				t.Fatalf("trial %d: at %g eigenvalues say stable=%v, intervals %+v; loop %v %v %s %v param %d",
					trial, k, st, got, loop.Plant.Num, loop.Plant.Den, loop.Family.Name(), loop.Values, param)
			}
			samples++
		}
	}
	t.Logf("%d ends checked outside, %d sample points, end kinds %v", ends, samples, kinds)
	if ends < 1000 || samples < 150000 || kinds[stability.Real] == 0 || kinds[stability.Complex] == 0 || kinds[stability.Infinite] == 0 {
		t.Fatalf("too few checks: %d ends, %d samples, kinds %v", ends, samples, kinds)
	}
}
