package routh

import (
	"math"
	"math/cmplx"
	"strconv"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Test is the Routh sign array as a stability.Test, for continuous-time
// loops without dead time: the characteristic function is the polynomial
// Function.P and the boundary is the imaginary axis. Counts come from the
// fast path FastCount (Count's answer, sooner) where it certifies the
// array, from root inclusion disks (Inclusion) where its error bound
// alone was too wide, and from Analyze, with its special cases, where
// neither decides.
type Test struct{}

// Name implements stability.Test.
func (Test) Name() string { return "Routh sign array" }

// NewCounter implements stability.Test.
func (Test) NewCounter(n int) stability.Counter {
	return &counter{work: make([]float64, WorkLen(n)), size: n}
}

type counter struct {
	work []float64
	size int
	inc  *Inclusion // made on first need
}

// Count implements stability.Counter. The regular case allocates nothing.
func (c *counter) Count(f stability.Function) stability.Verdict {
	p := f.P
	if need := WorkLen(len(p)); len(c.work) < need {
		c.work = make([]float64, need)
	}
	rhp, zeros, st := FastCount(p, c.work)
	switch st {
	case Decided:
		return stability.Verdict{Unstable: rhp, Boundary: zeros}
	case NeedsAnalysis:
		if v, ok := c.included(p); ok {
			return v
		}
		return Analyze(p).Verdict()
	}
	return stability.Verdict{Unstable: stability.Undecided}
}

// included counts p with the inclusion disks, after taking out its exact
// roots at s = 0; a vanishing leading coefficient is left to Analyze.
func (c *counter) included(p poly.Poly) (stability.Verdict, bool) {
	n := len(p) - 1
	if n < 1 || p[n] == 0 {
		return stability.Verdict{}, false
	}
	lo := 0
	for lo < n && p[lo] == 0 {
		lo++
	}
	if c.inc == nil || len(c.inc.z) < len(p) {
		c.inc = NewInclusion(max(len(p), c.size+1))
	}
	rhp, ok := c.inc.Count(p[lo:])
	return stability.Verdict{Unstable: rhp, Boundary: lo}, ok
}

// Verdict returns the report's counts as a stability.Verdict.
func (r Report) Verdict() stability.Verdict {
	if r.Undecided {
		return stability.Verdict{Unstable: stability.Undecided}
	}
	return stability.Verdict{Unstable: r.RHP, Boundary: r.JW, Infinite: r.DegreeDrop}
}

// Classify implements stability.Test by what changes between a and b,
// the D-partition classification (Yu. I. Neimark, Avtomatika i
// Telemekhanika 9(3), 1948): a real root crosses through s = 0 exactly
// when the constant coefficient changes sign, a root passes through
// infinity exactly when the leading coefficient does, and otherwise the
// roots that cross form a complex pair at ±jω, whose ω is read from the
// pair of the midway polynomial nearest the axis, polished by Newton's
// method. A coefficient that is zero on both sides (the constant term all
// along ki = 0, say) has a root that stays on the axis, which is not what
// crosses. Sign changes of coefficients formed exactly cannot be made up
// by rounding, so the kind does not depend on how the loop is scaled.
// When a and b are one point on the edge, its roots on the axis decide.
func (Test) Classify(a, b stability.Function) stability.Crossing {
	p, q := a.P, b.P
	n := max(len(p), len(q))
	at := func(c poly.Poly, k int) float64 {
		if k < len(c) {
			return c[k]
		}
		return 0
	}
	mid := make(poly.Poly, n)
	for k := range mid {
		mid[k] = 0.5 * (at(p, k) + at(q, k))
	}
	changes := func(k int) bool {
		u, v := at(p, k), at(q, k)
		return u*v < 0 || (u == 0) != (v == 0)
	}
	top := n - 1
	for top > 0 && at(p, top) == 0 && at(q, top) == 0 {
		top--
	}
	switch {
	case changes(0):
		return stability.Crossing{Kind: stability.Real, Omega: 0}
	case changes(top):
		return stability.Crossing{Kind: stability.Infinite, Omega: math.NaN()}
	case same(p, q):
		return onAxis(mid)
	}
	if w, ok := pairFrequency(mid); ok {
		return stability.Crossing{Kind: stability.Complex, Omega: w}
	}
	return onAxis(mid)
}

// same reports whether p and q have the same coefficients.
func same(p, q poly.Poly) bool {
	if len(p) != len(q) {
		return false
	}
	for k := range p {
		if p[k] != q[k] {
			return false
		}
	}
	return true
}

// pairFrequency returns ω of the complex root pair of p nearest the
// imaginary axis (smallest |Re r|/|r|), polished by Newton's method on p.
func pairFrequency(p poly.Poly) (float64, bool) {
	roots, err := p.Trim(0).Roots()
	if err != nil {
		return 0, false
	}
	best, ok := math.Inf(1), false
	var pick complex128
	for _, r := range roots {
		if imag(r) <= 0 {
			continue
		}
		if d := math.Abs(real(r)) / cmplx.Abs(r); d < best {
			best, pick, ok = d, r, true
		}
	}
	if !ok {
		return 0, false
	}
	return math.Abs(imag(p.Polish(pick))), true
}

// onAxis classifies a polynomial that lies on an edge by its own roots
// on the boundary: a pair on the imaginary axis first, then a root at
// s = 0, then a degree drop.
func onAxis(p poly.Poly) stability.Crossing {
	r := Analyze(p)
	for _, w := range r.Omegas {
		if w > 0 {
			return stability.Crossing{Kind: stability.Complex, Omega: w}
		}
	}
	switch {
	case r.ZeroRoots > 0 || len(r.Omegas) > 0:
		return stability.Crossing{Kind: stability.Real, Omega: 0}
	case r.DegreeDrop > 0:
		return stability.Crossing{Kind: stability.Infinite, Omega: math.NaN()}
	}
	if w, ok := pairFrequency(p); ok {
		return stability.Crossing{Kind: stability.Complex, Omega: w}
	}
	return stability.Crossing{Kind: stability.Real, Omega: 0}
}

// Report implements stability.Test with Analyze.
func (Test) Report(f stability.Function) stability.Report {
	ra := Analyze(f.P)
	rep := stability.Report{Verdict: ra.Verdict(), Reason: ra.Reason, Method: "sign array"}
	if ra.FromEigenvalues {
		rep.Method = "eigenvalues"
	}
	for _, r := range ra.Rows {
		rep.Table = append(rep.Table, stability.Row{
			Label: "s^" + itoa(r.Power), Power: r.Power, Entries: r.Entries,
			Epsilon: r.Epsilon, Auxiliary: r.Auxiliary,
		})
	}
	if ra.Aux != nil {
		rep.Auxiliary = poly.Poly(ra.Aux).Clone()
	}
	rep.Omegas = append([]float64{}, ra.Omegas...)
	if ra.DegreeDrop > 0 {
		rep.Notes = append(rep.Notes, "the leading coefficient vanishes: a root has gone to infinity")
	}
	return rep
}

func itoa(n int) string { return strconv.Itoa(n) }
