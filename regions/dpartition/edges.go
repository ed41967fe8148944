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
// s = jω, Re Δ = 0 and Im Δ = 0 are two equations in (x, y) for each ω; see
// pencil for how they are solved (a 2×2 linear solve when Δ is affine in
// x and y, a quadratic when it is bilinear). The side comes from Šiljak's
// rule (D. D. Šiljak, Nonlinear Systems, 1969, recalled): walking along
// increasing ω, the side with fewer unstable roots is on the left when
// J = det ∂(Re Δ, Im Δ)/∂(x, y) > 0. Its sign convention follows from
// the root's motion: with t = (x', y') the tangent and Δ_ω = j·Δ_s, a step
// along the left normal moves the root by Re ds = −J·|t|²/|Δ_ω|², into the
// left half plane when J > 0.
//
// Completeness, rational loop: the critical frequencies (rationalCriticals)
// are found exactly as roots of polynomials in ω², formed exactly from the
// coefficients and solved by gonum's eigenvalues with Newton polishing.
// Between two of them each solution is continuous and monotone in x and in
// y, so it lies entirely inside or entirely outside the window, and one
// evaluation decides which. No branch or closed curve is missed however
// small it is: a closed curve has points of vertical and horizontal
// tangent, which are critical frequencies. The limit is the root finder's:
// a curve that only touches a window side, a double root, is still found,
// since its stationary point is critical too.
//
// Completeness, delay loop: the equations are transcendental, so ω is
// swept with step control (sweeper) up to the bound of frequencyBound,
// above which no point of the window can be on the edge. The sweep stops
// at Options.MaxBranches branches instead when no bound exists, and the
// result says so. Sign changes closer together than one step are the
// limit: a curve that dips into the window and out again within one step
// (ωL moving by less than π/16) is missed.
//
// Each traced point is computed from its ω; the polylines follow the
// curves to Options.Chord in window coordinates and end on the window
// sides.
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
