package dpartition

import "math"

// Edges returns every edge of the D-partition of p inside its window: the
// curves in the (x, y) plane where a root of Δ(s; x, y) lies on the
// imaginary axis or at infinity, each with its kind, its frequency, the
// side with fewer right-half-plane roots and the number of roots that
// cross. No grid is involved: the complex edge is followed in ω.
//
// Method: the D-partition (D-decomposition) of Yu. I. Neimark (1948),
// surveyed by E. N. Gryazina and B. T. Polyak, "Stability regions in the
// parameter space: D-decomposition revisited", Automatica 42 (2006). At
// s = jω, Re Δ = 0 and Im Δ = 0 are two equations in (x, y) for each ω.
// Seen as linear in y they are consistent only where the columns A + x·B
// and C + x·E are parallel, a quadratic in x whose coefficients are cross
// products [U, V] = Re U·Im V − Im U·Re V of the parts (linear when E = 0:
// x = −[A, C]/[B, C], Cramer's rule for the 2×2 solve); y then follows by
// least squares. Where the 2×2 system is singular at every ω (B and C
// real multiples of each other on the axis, as for ideal PID in the
// (kd, ki) plane), the edges are whole lines, one per frequency at which
// the system is consistent.
//
// The side comes from Šiljak's rule (D. D. Šiljak, Nonlinear Systems,
// 1969, recalled): walking along increasing ω, the side with fewer
// unstable roots is on the left when J = det ∂(Re Δ, Im Δ)/∂(x, y) > 0.
// Its sign convention follows from the root's motion: with t = (x', y')
// the tangent and w = Δ_x·x' + Δ_y·y' = −j·Δ_s, a step along the left
// normal moves the root by Re ds = −J·|t|²/|w|², into the left half plane
// when J > 0. The tests confirm it by eigenvalue counts on both sides.
//
// Completeness, rational loop: every frequency where a solution appears,
// vanishes or goes to infinity, meets a window side, or has a stationary
// x or y (a vertical or horizontal tangent, from the resultant of the
// quadratic and its derivative in ω²) is a root of a polynomial in ω²
// formed exactly from the coefficients, found by gonum's eigenvalues and
// polished by Newton's method. Between two of them each solution is
// continuous and monotone in x and in y, so it lies entirely inside or
// entirely outside the window and one evaluation decides which. No branch
// or closed curve is missed however small it is: a closed curve has
// points of vertical and horizontal tangent, which are among those
// frequencies. The limit is the root finder's on ill-conditioned
// polynomials; a critical frequency too many only cuts a curve in two.
//
// Completeness, delay loop: the equations are transcendental, so ω is
// swept from 0 with a step that keeps the change of ωL below π/16 and
// below a fifth of the distance from jω to the nearest root of a part, and
// the sign changes of the same functions (discriminants, leading
// coefficients, the quadratics at the window sides) are located by
// bracketing to full precision. The sweep stops at a bound Ω above which
// |P(jω)| > |Q(jω)| at every point of the window, so that no edge can
// return (see Result.OmegaMax; the argument is written at
// frequencyBound). Where no bound exists (a neutral-type edge, or a
// vanishing leading coefficient, inside the window) it stops after
// Options.MaxBranches branches and Result.Complete is false. Two sign
// changes within one step are the limit: a curve that dips into the
// window and out again within one step is missed.
//
// Each point is computed from its ω. Polylines follow their curves to
// Options.Chord in window coordinates, checked at a quarter, half and
// three quarters of each segment's parameter interval, with segments no
// longer than 1/8 of a window side; they end exactly on the window sides.
func Edges(p Problem, opt Options) (Result, error) {
	p, err := p.normalized()
	if err != nil {
		return Result{}, err
	}
	pc, err := newPencil(p)
	if err != nil {
		return Result{}, err
	}
	w := window{p.X, p.Y}
	tol := opt.chord()
	res := Result{OmegaMax: math.Inf(1), Complete: true}
	res.Curves = w.fixedEdges(p, tol)
	if p.Delay > 0 {
		bound, ok := frequencyBound(p)
		if !ok {
			bound = 2 * math.Pi * float64(opt.maxBranches()) / p.Delay
			res.Complete = false
		}
		res.OmegaMax = bound
	}
	if pc.singular {
		cs, err := pc.singularLines(p, w, res.OmegaMax, tol)
		if err != nil {
			return Result{}, err
		}
		res.Curves = append(res.Curves, cs...)
		return res, nil
	}
	var crit []float64
	if p.Delay == 0 {
		if crit, err = pc.rationalCriticals(w); err != nil {
			return Result{}, err
		}
	} else {
		crit = pc.delayCriticals(w, res.OmegaMax)
	}
	res.Curves = append(res.Curves, pc.complexCurves(pc.pieces(crit, w), w, tol)...)
	return res, nil
}
