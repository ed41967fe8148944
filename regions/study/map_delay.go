package study

import (
	"context"

	"gainscape/regions/plane"
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
