package main

import (
	"context"
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// The end-to-end benchmarks run the command as a user would (image
// written, one worker) and compare it, in the same run, with the plainest
// per-node alternative: form the characteristic polynomial at every node
// of the same grid and count its right-half-plane roots from gonum's
// eigenvalues of the companion matrix (poly.Finder), on one thread. The
// ratio, to the least time of one map among the runs, is reported as the
// metric "eigen/map".

// eigenLoop counts the right-half-plane roots at every node of s from
// the eigenvalues, into counts, and returns the time it took: with
// poly.Finder (the companion matrix balanced and reduced by gonum's
// Dgebal and Dlahqr in reused buffers, the leanest such loop) or, with
// plain, poly.Roots (gonum's mat.Eigen on a new matrix per node).
func eigenLoop(s plane.Setup, counts []int8, plain bool) time.Duration {
	start := time.Now()
	f := poly.NewFinder(s.Char.Len())
	p := make(poly.Poly, s.Char.Len())
	for j := 0; j < s.Y.N; j++ {
		y := s.Y.At(j)
		for i := 0; i < s.X.N; i++ {
			n := int8(-1)
			s.Char.EvalInto(p, s.X.At(i), y)
			if plain {
				if roots, err := p.Roots(); err == nil {
					n = 0
					for _, r := range roots {
						if real(r) > 0 {
							n++
						}
					}
				}
			} else if re, _, ok := f.Roots(p); ok {
				n = 0
				for _, r := range re {
					if r > 0 {
						n++
					}
				}
			}
			counts[j*s.X.N+i] = n
		}
	}
	return time.Since(start)
}

// benchVersusEigen times the command line args b.N times, then the
// eigenvalue loop over the nodes of s once, and reports their ratio
// ("eigen/map"; with plain, also "roots/map" for poly.Roots).
func benchVersusEigen(b *testing.B, s plane.Setup, plain bool, args ...string) {
	dir := b.TempDir()
	args = append([]string{"map", "--workers", "1", "--quiet", "-o", filepath.Join(dir, "map.png"),
		"--grid", fmt.Sprintf("%dx%d", s.X.N, s.Y.N)}, args...)
	// The least time of a map stands against the eigenvalue loop, so that
	// other work on a shared machine moves the ratio less.
	perMap := time.Duration(1 << 62)
	for b.Loop() {
		var errs strings.Builder
		start := time.Now()
		if code := run(context.Background(), args, io.Discard, &errs); code != 0 {
			b.Fatalf("exit %d: %s", code, errs.String())
		}
		perMap = min(perMap, time.Since(start))
	}
	b.StopTimer()
	b.ReportMetric(float64(perMap.Milliseconds()), "best-map-ms")
	// The eigenvalue loop takes seconds; the lesser of two runs counts.
	counts := make([]int8, s.X.N*s.Y.N)
	eigen := min(eigenLoop(s, counts, false), eigenLoop(s, counts, false))
	b.ReportMetric(float64(eigen)/float64(perMap), "eigen/map")
	b.ReportMetric(float64(eigen.Milliseconds()), "eigen-ms")
	if plain {
		roots := eigenLoop(s, counts, true)
		b.ReportMetric(float64(roots)/float64(perMap), "roots/map")
	}
}

// demoSetup is the built-in demo (map.go's demo: an invented pump loop
// under PID with kd = 0.5, tau = 0.05) on an n×n grid.
func demoSetup(b *testing.B, n int) plane.Setup {
	den := poly.Mul(poly.Mul(poly.Poly{0.5, 1}, poly.Poly{2, 1}), poly.Poly{1, 0.4}.Pow(2))
	l := loop.Loop{Plant: loop.Plant{Num: poly.Poly{3}, Den: den}, Family: family.PID{}, Values: []float64{0, 0, 0.5, 0.05}}
	s, err := plane.NewSetup(l, plane.Axis{Param: "kp", Min: -0.6, Max: 3.6, N: n}, plane.Axis{Param: "ki", Min: -0.4, Max: 1.8, N: n})
	if err != nil {
		b.Fatal(err)
	}
	return s
}

// BenchmarkDemoMap is the default demo map at 800×800 nodes with its Ms
// iso-lines, image included.
func BenchmarkDemoMap(b *testing.B) { benchVersusEigen(b, demoSetup(b, 800), true) }

// BenchmarkDemoMapNoMs is the same map with the Ms iso-lines off.
func BenchmarkDemoMapNoMs(b *testing.B) {
	benchVersusEigen(b, demoSetup(b, 800), true, "--ms-levels", "none")
}

// degree20 is an invented plant of 19 real lags, 1/∏(1 + s/(0.5+0.25i)),
// i = 0…18, as an expression and as polynomials; under PI its
// characteristic polynomial has degree 20.
func degree20() (expr string, num, den poly.Poly) {
	var factors []string
	den = poly.Poly{1}
	for i := 0; i < 19; i++ {
		tau := 1 / (0.5 + 0.25*float64(i))
		factors = append(factors, fmt.Sprintf("(%g*s+1)", tau))
		den = poly.Mul(den, poly.Poly{1, tau})
	}
	return "1/(" + strings.Join(factors, "*") + ")", poly.Poly{1}, den
}

// BenchmarkDegree20Map is a PI map of the degree-20 loop on 200×150
// nodes, Ms iso-lines off, against the eigenvalue loop on the same nodes.
func BenchmarkDegree20Map(b *testing.B) {
	expr, num, den := degree20()
	l := loop.Loop{Plant: loop.Plant{Num: num, Den: den}, Family: family.ProportionalIntegral{}, Values: []float64{0, 0}}
	s, err := plane.NewSetup(l, plane.Axis{Param: "kp", Min: -1, Max: 4, N: 200}, plane.Axis{Param: "ki", Min: -0.2, Max: 1, N: 150})
	if err != nil {
		b.Fatal(err)
	}
	benchVersusEigen(b, s, false, "--plant", expr, "--ctrl", "pi", "--x", "kp=-1:4", "--y", "ki=-0.2:1", "--ms-levels", "none")
}
