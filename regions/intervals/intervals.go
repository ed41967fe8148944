// Package intervals finds, for one controller parameter with every other
// parameter held fixed, the intervals of its values for which the closed
// loop is stable, with how the roots cross the imaginary axis (or, for a
// sampled-data loop, the unit circle) at each end.
//
// Method: the D-partition (D-decomposition) of Yu. I. Neimark, "On the
// determination of the values of parameters for which an automatic
// regulation system is stable", Avtomatika i Telemekhanika 9(3), 1948,
// specialised to one parameter, where it is also known as the root-locus
// crossing condition (common practice). The characteristic polynomial is
// affine in one parameter, p(s; k) = A(s) + k·B(s), so stability can change
// only where a root crosses the imaginary axis: at s = 0 (A(0) + k·B(0) = 0),
// at s = ±jω (A(jω) + k·B(jω) = 0 for a real k, which makes
// Im(A(jω)·conj(B(jω))) vanish) or at infinity (the leading coefficient
// vanishes). These values of k are found from polynomial equations, the
// pieces between them are tested once each with the Routh sign array, and
// every end is confirmed by bisection on the sign-array test. A sampled-data
// loop takes the same path with the unit circle in place of the axis: its
// candidates are where a root passes z = 1, z = −1, e^(±jθ) or infinity
// (see circle.go), and its pieces are tested by the loop's own test.
//
// A loop with dead time has a quasi-polynomial P(s; k) + Q(s; k)·e^(−Ls)
// instead: its crossing values come from dpartition.Crossings and its
// pieces are tested with the quasi-polynomial's count (see delaySearch).
package intervals

import (
	"fmt"
	"math"
	"sort"

	"gainscape/regions/loop"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Window is the kind of an interval end set by the search window, not by
// the loop: stability.None, since no root crosses there.
const Window = stability.None

// Interval is one maximal interval (Lo, Hi) of parameter values for which
// the closed loop is stable. The kinds say what ends it on each side (a
// D-partition boundary kind, or Window) and the omegas give the frequency
// of the crossing roots there (0 for Real, NaN for Infinite and Window).
type Interval struct {
	Lo, Hi           float64
	LoKind, HiKind   stability.Kind
	LoOmega, HiOmega float64
}

// Accuracy is the accuracy of interval ends relative to the value itself,
// or, for values within a millionth of the loop's own scale from zero, to
// that scale: the smallest non-zero |k| at which a root reaches the
// imaginary axis, or the window width if that is smaller. It holds for
// loops whose sign array is well conditioned near the end.
// Bisection is run a hundred times tighter so that it holds with a margin.
const Accuracy = 1e-10

// bisectTol is the bisection stopping width, relative as for Accuracy.
const bisectTol = 1e-12

// nearZero is the fraction of the loop's scale (see Accuracy) below which
// a parameter value counts as near zero for the relative accuracy of its
// end.
const nearZero = 1e-6

// Stable returns every maximal sub-interval of [lo, hi] in which the closed
// loop is stable when parameter param of loop.Family varies and every other
// parameter keeps its value in loop.Values. Stable means no root in the
// closed right half plane and no drop of degree (the loop's stability
// test: the sign array of routh.Analyze, or for a loop with dead time the
// count of package delay). Intervals are returned in increasing order; an unstable
// window gives none. An end at lo or hi is of kind Window unless the loop
// has a boundary there itself. Where a pair of roots touches the imaginary
// axis and returns, the loop is unstable at that one value, which splits
// an interval in two with Complex ends there. Ends are accurate to
// Accuracy.
//
// It returns an error for a window that is not a finite interval with
// lo < hi, or a loop whose characteristic polynomial is not finite or is
// identically zero. It panics if param is not an index of
// loop.Family.Params().
func Stable(l loop.Loop, param int, lo, hi float64) ([]Interval, error) {
	np := len(l.Family.Params())
	if param < 0 || param >= np {
		panic(fmt.Sprintf("intervals: parameter index %d out of range for %d parameters", param, np))
	}
	name := l.Family.Params()[param].Name
	if math.IsNaN(lo) || math.IsNaN(hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) || !(lo < hi) {
		return nil, fmt.Errorf("stable intervals of %s: window [%g, %g] must be finite with lower end below upper end", name, lo, hi)
	}
	if l.Plant.Delay > 0 {
		s, err := delaySearch(l, param, lo, hi)
		if err != nil {
			return nil, fmt.Errorf("stable intervals of %s: %w", name, err)
		}
		return s.run(), nil
	}
	ln, err := newLine(l, param)
	if err != nil {
		return nil, fmt.Errorf("stable intervals of %s: %w", name, err)
	}
	test := l.Test()
	p := make(poly.Poly, ln.len())
	at := func(k float64, fresh bool) stability.Function {
		if fresh {
			return stability.Function{P: ln.at(make(poly.Poly, ln.len()), k)}
		}
		return stability.Function{P: ln.at(p, k)}
	}
	cands := ln.candidates()
	if T := l.Plant.Sample; T > 0 {
		cands = ln.circleCandidates(T)
	}
	s := search{at: at, cands: cands, lo: lo, hi: hi, test: test, counter: test.NewCounter(ln.len())}
	return s.run(), nil
}

// search holds the state of one call of Stable.
type search struct {
	// at returns the characteristic function at k, in scratch space
	// unless fresh is set.
	at func(k float64, fresh bool) stability.Function
	// cands are the solutions of the D-partition equations.
	cands   []candidate
	lo, hi  float64
	test    stability.Test
	counter stability.Counter
	// scale is the loop's own scale of the parameter (see Accuracy).
	scale float64
}

// tol returns the bisection width at parameter value k.
func (s *search) tol(k float64) float64 {
	return bisectTol * math.Max(math.Abs(k), nearZero*s.scale)
}

// stable reports whether the loop is stable at k: no root in the closed
// right half plane and no drop of degree.
func (s *search) stable(k float64) bool {
	return s.counter.Count(s.at(k, false)).Stable()
}

// classify names the crossing between a and b, which bracket a boundary
// to within rounding (or are one point on it).
func (s *search) classify(a, b float64) candidate {
	cr := s.test.Classify(s.at(a, true), s.at(b, true))
	return candidate{kind: cr.Kind, omega: cr.Omega}
}

// group is a set of candidate boundary values that agree to within the
// bisection tolerance, treated as one break point.
type group struct {
	k     float64
	cands []candidate
}

// run splits the window at the candidate values, tests each piece, merges
// stable neighbours and refines the ends.
func (s *search) run() []Interval {
	cands := s.cands
	sort.Slice(cands, func(i, j int) bool { return cands[i].k < cands[j].k })
	// The window width alone is no scale: over kp = 0…1e20 every boundary
	// near kp = 8 would look like zero.
	s.scale = s.hi - s.lo
	for _, c := range cands {
		if a := math.Abs(c.k); a > 0 && a < s.scale {
			s.scale = a
		}
	}
	var atLo, atHi []candidate
	var groups []group
	for _, c := range cands {
		switch {
		case math.Abs(c.k-s.lo) <= s.tol(s.lo):
			atLo = append(atLo, c)
		case math.Abs(c.k-s.hi) <= s.tol(s.hi):
			atHi = append(atHi, c)
		case c.k > s.lo && c.k < s.hi:
			if n := len(groups); n > 0 && c.k-groups[n-1].k <= s.tol(c.k) {
				groups[n-1].cands = append(groups[n-1].cands, c)
				continue
			}
			groups = append(groups, group{k: c.k, cands: []candidate{c}})
		}
	}
	// Break points: the window ends and the groups. Piece i lies between
	// break i and break i+1.
	breaks := make([]float64, 0, len(groups)+2)
	breaks = append(breaks, s.lo)
	for _, g := range groups {
		breaks = append(breaks, g.k)
	}
	breaks = append(breaks, s.hi)
	mids := make([]float64, len(breaks)-1)
	stable := make([]bool, len(breaks)-1)
	for i := range mids {
		mids[i] = 0.5 * (breaks[i] + breaks[i+1])
		stable[i] = s.stable(mids[i])
	}

	var out []Interval
	for i := 0; i < len(mids); {
		if !stable[i] {
			i++
			continue
		}
		j := i
		// Merge stable neighbours unless the shared break point is itself
		// unstable: roots that touch the axis and return (a tangency of the
		// D-partition curve) leave the loop unstable at that one value.
		for j+1 < len(mids) && stable[j+1] && s.stable(breaks[j+1]) {
			j++
		}
		iv := Interval{}
		if i == 0 {
			iv.Lo, iv.LoKind, iv.LoOmega = s.windowEnd(s.lo, atLo)
		} else {
			iv.Lo, iv.LoKind, iv.LoOmega = s.refine(groups[i-1], mids[i-1], mids[i], stable[i-1])
		}
		if j == len(mids)-1 {
			iv.Hi, iv.HiKind, iv.HiOmega = s.windowEnd(s.hi, atHi)
		} else {
			iv.Hi, iv.HiKind, iv.HiOmega = s.refine(groups[j], mids[j], mids[j+1], true)
		}
		out = append(out, iv)
		i = j + 1
	}
	return out
}

// windowEnd describes an interval end at a window end k: a boundary of the
// loop if a candidate lies there or the loop is not stable at k itself
// (then the roots on the boundary at k name the crossing), the window
// otherwise.
func (s *search) windowEnd(k float64, at []candidate) (float64, stability.Kind, float64) {
	if len(at) > 0 {
		c := s.pick(at, k)
		return k, c.kind, c.omega
	}
	if !s.stable(k) {
		c := s.classify(k, k)
		return k, c.kind, c.omega
	}
	return k, Window, math.NaN()
}

// refine locates the boundary of group g between the midpoints a < b of
// the two pieces beside it. The piece at a is stable exactly when
// aStable; the other is not, or the boundary is a point of instability
// between two stable pieces. The bracket starts as a small interval
// centred on the analytic value and widens until the stability test
// confirms it, never beyond a and b, then bisection narrows it to tol.
// The analytic value is kept if bisection confirms it; otherwise the
// bisection midpoint is returned, which guards against rounding in the
// candidate.
func (s *search) refine(g group, a, b float64, aStable bool) (float64, stability.Kind, float64) {
	bStable := s.stable(b)
	if aStable == bStable {
		// A touching point between two stable pieces: no bracket exists,
		// the analytic value is the end.
		c := s.pick(g.cands, g.k)
		return g.k, c.kind, c.omega
	}
	tol := s.tol(g.k)
	x, y := a, b
	for d := 1e3 * tol; ; d *= 64 {
		x, y = math.Max(g.k-d, a), math.Min(g.k+d, b)
		if (x == a || s.stable(x) == aStable) && (y == b || s.stable(y) == bStable) {
			break
		}
	}
	for y-x > tol {
		m := 0.5 * (x + y)
		if m <= x || m >= y {
			break
		}
		if s.stable(m) == aStable {
			x = m
		} else {
			y = m
		}
	}
	k := 0.5 * (x + y)
	if g.k >= x-tol && g.k <= y+tol {
		k = g.k
	}
	c := s.pick(g.cands, k)
	return k, c.kind, c.omega
}

// pick chooses the candidate that describes the crossing at k. With one
// candidate, or several of one kind, it is that kind; when kinds differ,
// the loop's stability test at k decides.
func (s *search) pick(cs []candidate, k float64) candidate {
	same := true
	for _, c := range cs[1:] {
		same = same && c.kind == cs[0].kind
	}
	if same {
		return cs[0]
	}
	d := 4 * s.tol(k)
	want := s.classify(k-d, k+d)
	best := cs[0]
	for _, c := range cs {
		if c.kind == want.kind {
			if want.kind != stability.Complex || math.Abs(c.omega-want.omega) < math.Abs(best.omega-want.omega) || best.kind != stability.Complex {
				best = c
			}
		}
	}
	return best
}
