package study

import (
	"context"
	"math"
	"math/cmplx"

	"gainscape/regions/plane"
	"gainscape/regions/poly"
)

// deadTime adds what a map of a loop with dead time has beyond the
// counts and edges: the branch of each complex edge point (branchesOf),
// the nodes of neutral type with infinitely many unstable roots
// (neutralNodes), the confirmation of the counts by a second method
// (confirmCounts) and the comparison with the Padé-approximated map
// (comparePade, of order pade, 0 to choose it).
func (r *MapResult) deadTime(ctx context.Context, s plane.Setup, pade int, opt Options) error {
	r.Delay = s.Plant.Delay
	r.Branches = branchesOf(s, r.Curves)
	r.NeutralNodes = neutralNodes(s, r.Map)
	var err error
	if r.Confirmation, err = confirmCounts(ctx, s, r.Map, opt.Workers); err != nil {
		return err
	}
	r.Pade, err = comparePade(ctx, s, r.Map, r.Curves, pade, opt.Workers)
	return err
}

// delayMsTop returns the upper end of the Ms grid of a map of a loop with
// dead time: twice the highest frequency of a logarithmic scan of
// [lo, hi] at which |L(jω)| reaches 1e-3 at a corner of the window, and
// no less than 4π/L (two turns of the delay), no more than hi. Every
// coefficient of the open loop is multi-affine in the two axis values,
// so |L(jω)|, convex in each of them, is largest at a corner: above that
// frequency |L| < 1e-3 at every node and |S| lies within 1e-3 of 1, so
// the equally spaced points the delay needs (margins.NewMsEvaluatorDelay)
// are not spent there.
func delayMsTop(s plane.Setup, lo, hi float64) float64 {
	sc := s.NewScratch()
	type part struct{ num, den poly.Poly }
	var corners []part
	for _, x := range []float64{s.X.Min, s.X.Max} {
		for _, y := range []float64{s.Y.Min, s.Y.Max} {
			num, den := s.OpenLoop(sc, x, y)
			corners = append(corners, part{num.Clone(), den.Clone()})
		}
	}
	top := 4 * math.Pi / s.Plant.Delay
	for w := lo; w <= hi; w *= math.Pow(10, 0.01) {
		jw := complex(0, w)
		for _, c := range corners {
			if d := cmplx.Abs(c.den.Eval(jw)); cmplx.Abs(c.num.Eval(jw)) >= 1e-3*d {
				top = math.Max(top, 2*w)
			}
		}
	}
	return math.Min(top, hi)
}
