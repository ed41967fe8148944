// Package stability is the one seam through which every part of gainscape
// asks where the roots of a closed loop lie: how many are on the unstable
// side, how many on the stability boundary, and, where the loop sits on an
// edge of a stability map, how its roots cross there and at which
// frequency.
//
// The boundary is the imaginary axis for continuous-time loops (with or
// without dead time) and the unit circle for sampled-data loops. Each
// kind of loop has its own Test: the Routh sign array for rational
// continuous-time loops (package routh) is the first; a unit-circle test
// and a test for loops with dead time are further implementations of the
// same interface, so that the grid, the edges, the intervals, the overlays,
// the searches and the probe need no change to serve them.
package stability

import (
	"gainscape/regions/poly"
)

// Function is the closed-loop characteristic function at one point of
// parameter space:
//
//	Δ(s) = P(s) + Q(s)·e^(−Delay·s)
//
// in continuous time, or P(z) in discrete time (Q empty). P and Q hold
// ascending coefficients. A loop without dead time has Q empty and Delay
// zero, and Δ is the characteristic polynomial P.
type Function struct {
	P, Q  poly.Poly
	Delay float64
}

// Rational reports whether f has no delayed part, so that it is the
// polynomial P alone.
func (f Function) Rational() bool { return len(f.Q) == 0 || f.Delay == 0 }

// Undecided is the count of a Verdict when rounding could decide where a
// root lies, so that no count can be trusted.
const Undecided = -1

// Verdict says where the roots of a characteristic function lie.
type Verdict struct {
	// Unstable counts the roots strictly on the unstable side (the open
	// right half plane, or outside the unit circle), with multiplicity;
	// Undecided when rounding could move a root across the boundary.
	Unstable int
	// Boundary counts the roots on the stability boundary (the imaginary
	// axis, s = 0 included, or the unit circle), with multiplicity.
	Boundary int
	// Infinite counts the roots that have gone to infinity: the leading
	// coefficient has vanished, so the degree has dropped.
	Infinite int
}

// Class is how a point of parameter space stands.
type Class int8

// The classes of a point. A marginal point has no root on the unstable
// side but at least one on the boundary (or at infinity): it is neither
// stable nor drawn as such.
const (
	ClassUndecided Class = iota - 1
	ClassStable
	ClassMarginal
	ClassUnstable
)

// String names the class as reports write it.
func (c Class) String() string {
	switch c {
	case ClassStable:
		return "stable"
	case ClassMarginal:
		return "marginal"
	case ClassUnstable:
		return "unstable"
	}
	return "undecided"
}

// Class returns the class of the verdict.
func (v Verdict) Class() Class {
	switch {
	case v.Unstable < 0:
		return ClassUndecided
	case v.Unstable > 0:
		return ClassUnstable
	case v.Boundary > 0 || v.Infinite > 0:
		return ClassMarginal
	}
	return ClassStable
}

// Stable reports whether every root is strictly on the stable side and
// none has gone to infinity.
func (v Verdict) Stable() bool { return v.Class() == ClassStable }

// Counter decides verdicts for characteristic functions of one size,
// reusing its own scratch space: Count allocates nothing on the common
// path. A Counter is not safe for concurrent use; give each goroutine its
// own.
type Counter interface {
	Count(f Function) Verdict
}

// Test is a stability test for one kind of loop.
type Test interface {
	// Name names the method in reports, e.g. "Routh sign array".
	Name() string
	// NewCounter returns a Counter for functions whose polynomials have
	// at most n coefficients.
	NewCounter(n int) Counter
	// Classify says which roots cross the boundary between a and b, two
	// characteristic functions on either side of an edge of a stability
	// map and within rounding of it (the two ends of a bisection), and at
	// which frequency. a and b may be the same function, a point on the
	// edge itself (a marginal node); then the roots on the boundary there
	// decide.
	Classify(a, b Function) Crossing
	// Report is the full verdict for one point, with the working of the
	// test as a person would write it down.
	Report(f Function) Report
	// NewGrader returns a Grader for functions whose polynomials have at
	// most n coefficients.
	NewGrader(n int) Grader
}

// Grader measures how deep inside the stable side a point lies, for the
// overlays and searches of a map. It is meant for stable points; at an
// unstable one the decay rate is negative. A Grader is not safe for
// concurrent use.
type Grader interface {
	// Decay returns the decay rate σ: every transient decays at least as
	// fast as e^(−σt). For a continuous-time loop it is −max Re s over
	// the roots; for a sampled-data loop the continuous equivalent
	// −ln(max |z|)/T.
	Decay(f Function) float64
	// DecayDamping returns the decay rate and the smallest damping ratio
	// of the roots (of their continuous equivalents, for a sampled loop).
	DecayDamping(f Function) (decay, damping float64)
}

// Crossing says how roots cross the stability boundary at one point.
type Crossing struct {
	Kind Kind
	// Omega is the frequency of the crossing roots in rad/s: 0 for Real,
	// π/T for Alternating, NaN for Infinite.
	Omega float64
}

// Report is everything a Test says about one characteristic function.
type Report struct {
	Verdict
	// Omegas lists the distinct frequencies ω ≥ 0 (rad/s) of the roots on
	// the boundary, ascending.
	Omegas []float64
	// Method says what decided the count, e.g. "sign array" or
	// "eigenvalues".
	Method string
	// Table is the test's working, row by row, as printed by probe.
	Table []Row
	// Auxiliary is the auxiliary polynomial of an all-zero row of a sign
	// array, nil if none; its roots include the boundary roots.
	Auxiliary poly.Poly
	// Notes are remarks on special cases met, for reports.
	Notes []string
	// Reason says why the verdict is undecided; empty otherwise.
	Reason string
}

// Row is one row of a test's working: for the sign array, the row of
// s^Power with its entries as ε → 0+.
type Row struct {
	// Label names the row, e.g. "s^3".
	Label string
	// Power is the power of the row's variable, where the method has one.
	Power int
	// Entries are the row's entries, formatted.
	Entries []string
	// Epsilon is set when a zero first entry of a non-zero row was
	// replaced by ε (the ε rule of the sign array).
	Epsilon bool
	// Auxiliary is set when an all-zero row was replaced by the
	// derivative of the auxiliary polynomial formed from the row above.
	Auxiliary bool
}
