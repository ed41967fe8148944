// Package unitcircle is the stability test of sampled-data loops: where
// the roots of a characteristic polynomial P(z) lie with respect to the
// unit circle, how they cross it on an edge of a stability map, and how
// fast and how well damped they are.
//
// Method. The count has three stages; each hands over only what it
// cannot decide.
//
//   - The Schur–Cohn recursion (the Jury table, normalised; see
//     schurCohn) works on P itself, costs about n²/2 multiply-adds and
//     carries a running bound on the rounding of every entry, so that a
//     count it gives is one rounding cannot move. It stops wherever a
//     comparison is too close for the bounds: where the table is singular
//     (a root on or next to the circle, or a pair of roots reciprocal to
//     it), and, since such bounds grow with the degree, on many
//     polynomials of degree above about 12 with roots near the circle.
//   - Then the circle is mapped onto the imaginary axis by
//     z = (1 + w)/(1 − w), Q(w) = (1 − w)^n·P((1 + w)/(1 − w)) formed by
//     compensated dot products (see mapToHalfPlane), and the sign array's
//     fast path (routh.Count) counts the roots of Q in the right half
//     plane, trusting Q as the continuous-time test trusts its
//     polynomial: to a few units in the last place.
//   - Its special cases go to the complete sign-array analysis
//     (routh.Analyze: the ε rule, the auxiliary polynomial, the eigenvalue
//     confirmation). Under the map w = 0 ↔ z = 1, a drop of the degree of
//     Q ↔ a root at z = −1, and w = jν ↔ z = e^(jθ) with θ = 2·atan ν; so
//     the singular cases of the table become the special cases of the
//     array that routh already resolves, instead of a second
//     implementation of Jury's or Bistritz's singular rules.
//
// The first two stages allocate nothing. Forming Q costs n² products, more
// than the recursion, which is why the recursion comes first.
//
// Roots at infinity. A polynomial in z whose leading coefficient vanishes
// has lost a root to z = ∞: for a loop 1 + C(z)·G(z) this happens where
// 1 + C(∞)·G(∞) = 0, the direct feedthrough of controller and plant
// cancelling the unit feedback, a loop with no causal solution (an
// algebraic loop). The lost root is outside the circle on both sides of
// such a point, so it is never an edge between stable and unstable; the
// Verdict counts it as Infinite.
package unitcircle

import (
	"fmt"
	"math"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// Test is the unit-circle test for characteristic polynomials in z of a
// loop sampled every T seconds (T > 0; T converts angles on the circle to
// frequencies, ω = θ/T). Functions given to it have P only (Q empty).
type Test struct {
	T float64
}

var _ stability.Test = Test{}

// New returns the test for sample time T, or an error that carries T if
// it is not positive and finite.
func New(T float64) (Test, error) {
	if !(T > 0) || math.IsInf(T, 1) {
		return Test{}, fmt.Errorf("unitcircle: sample time %g is not positive and finite", T)
	}
	return Test{T: T}, nil
}

// Name implements stability.Test.
func (Test) Name() string {
	return "unit-circle test (Schur–Cohn recursion, bilinear map and sign array)"
}

// NewCounter implements stability.Test for polynomials with up to n
// coefficients.
func (Test) NewCounter(n int) stability.Counter { return newCounter(n) }

// Counter counts roots outside the unit circle, reusing its scratch
// space. It is not safe for concurrent use.
type Counter struct {
	n int
	// work is the recursion's scratch, q and signWork the map's and the
	// sign array's; basis[m] is bilinearBasis(m).
	work, q, signWork []float64
	basis             [][][]float64
}

func newCounter(n int) *Counter {
	n = max(n, 1)
	c := &Counter{n: n, work: make([]float64, workLen(n)), q: make([]float64, n),
		signWork: make([]float64, routh.WorkLen(n-1)), basis: make([][][]float64, n)}
	for m := range c.basis {
		c.basis[m] = bilinearBasis(m)
	}
	return c
}

// Stages of the count, for reports.
const (
	byRecursion = iota + 1
	bySignArray
	byAnalysis
)

// Count implements stability.Counter. The recursion and the sign array of
// the mapped polynomial allocate nothing; the full analysis, for their
// special cases, does. It panics if f has a delayed part or more
// coefficients than the Counter was made for.
func (c *Counter) Count(f stability.Function) stability.Verdict {
	v, _ := c.count(f)
	return v
}

func (c *Counter) count(f stability.Function) (stability.Verdict, int) {
	checkFunction(f)
	p := f.P
	if len(p) > c.n {
		panic(fmt.Sprintf("unitcircle: %d coefficients for a counter of %d", len(p), c.n))
	}
	if out, ok := schurCohn(p, c.work, nil); ok {
		return stability.Verdict{Unstable: out}, byRecursion
	}
	if len(p) >= 2 && p[len(p)-1] != 0 && p.Finite() {
		// Roots at z = 0 (exact zeros at the bottom) are inside; the rest
		// is mapped to the half plane and counted by the sign array.
		lo := 0
		for p[lo] == 0 {
			lo++
		}
		core := p[lo:]
		q := c.q[:len(core)]
		// A coefficient judged zero puts a root at z = ±1 that the full
		// analysis confirms.
		if !mapToHalfPlane(q, core, c.basis[len(core)-1]) {
			if rhp, zeros, st := routh.Count(q, c.signWork); st == routh.Decided {
				return stability.Verdict{Unstable: rhp, Boundary: zeros}, bySignArray
			}
		}
	}
	return analyse(p).verdict, byAnalysis
}

// Report implements stability.Test: the verdict, the frequencies of the
// roots on the circle, and the working of whichever stage decided; its
// verdict is always Count's.
func (t Test) Report(f stability.Function) stability.Report {
	checkFunction(f)
	t.check()
	v, stage := newCounter(len(f.P)).count(f)
	if stage == byRecursion {
		var rows []stability.Row
		schurCohn(f.P, make([]float64, workLen(len(f.P))), &rows)
		return stability.Report{
			Verdict: v,
			Method:  "Schur–Cohn recursion",
			Table:   rows,
			Notes:   []string{"each row is the previous one less γ times its reversal, divided by z; a reversed step (|a0| > |an|) turns the count of roots outside into the degree minus that count"},
		}
	}
	an := analyse(f.P)
	if stage == bySignArray {
		// The sign array decided without special cases; the full analysis
		// of the same polynomial shows its working.
		an.verdict, an.reason = v, ""
		an.thetas = nil
		if v.Boundary > 0 {
			an.thetas = []float64{0}
		}
	}
	rep := stability.Report{
		Verdict: an.verdict,
		Method:  "bilinear map z = (1 + w)/(1 − w) and sign array",
		Notes:   an.notes,
		Reason:  an.reason,
	}
	if an.mapped {
		rep.Notes = append([]string{"Q(w) = " + inW(an.q)}, rep.Notes...)
		for _, r := range an.sign.Rows {
			rep.Table = append(rep.Table, stability.Row{
				Label: fmt.Sprintf("w^%d", r.Power), Power: r.Power, Entries: r.Entries,
				Epsilon: r.Epsilon, Auxiliary: r.Auxiliary,
			})
		}
		if an.sign.Aux != nil {
			rep.Auxiliary = fromHalfPlane(an.sign.Aux)
			rep.Notes = append(rep.Notes, "the auxiliary polynomial is mapped back to z: its roots include those on the circle")
		}
		if an.sign.FromEigenvalues {
			rep.Notes = append(rep.Notes, "the sign array lost every digit of a deciding entry; the count is from the eigenvalues of Q")
		}
	}
	for _, th := range an.thetas {
		rep.Omegas = append(rep.Omegas, th/t.T)
	}
	return rep
}

// inW writes a polynomial in the variable w.
func inW(q poly.Poly) string {
	s := []rune(q.String())
	for i, r := range s {
		if r == 's' {
			s[i] = 'w'
		}
	}
	return string(s)
}

func checkFunction(f stability.Function) {
	if len(f.Q) > 0 {
		panic("unitcircle: a characteristic function in z has no delayed part")
	}
}

func (t Test) check() {
	if !(t.T > 0) || math.IsInf(t.T, 1) {
		panic(fmt.Sprintf("unitcircle: sample time %g is not positive and finite", t.T))
	}
}
