package overlay

import (
	"context"
	"math"
	"math/cmplx"
	"sort"

	"gainscape/internal/pool"
	"gainscape/regions/grid"
	"gainscape/regions/margins"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/routh"
)

// LevelsApply reports whether MsForLevels can serve the setup: a rational
// continuous-time loop, whose |S(jω)|² is a rational function of ω² with
// coefficients formed exactly from the pencils.
func LevelsApply(s plane.Setup) bool { return s.Plant.Delay == 0 && s.Plant.Sample == 0 }

// MsForLevels returns what the iso-lines of Ms at levels need of the Ms
// grid of the stable nodes of m, evaluating ev (the fast Ms of every
// node of a full grid) only near the lines: the value ev gives at every
// corner of a cell that a level crosses, and elsewhere a stand-in that
// lies on the same side of every level as ev's value does (the highest
// level reached, or half the lowest). isoline.Trace of the result is that
// of the full grid. It also returns the number of nodes at which ev ran. Nodes that are not stable hold NaN. The setup
// must satisfy LevelsApply, and levels must be positive.
//
// Method: each row y is fixed and split into its runs of stable nodes;
// each run, for each level L, is bisected in x until every piece is
// decided by one of two certificates or is two nodes long (then
// evaluated):
//
//   - below: Ms < L at every x of the piece. With D = Dc·D and C the
//     characteristic polynomial, affine in x along the row, L²·|C(jω)|² −
//     |D(jω)|² = h(u; x) is a polynomial in u = ω² whose coefficients are
//     quadratics in x, formed exactly from the pencils' even and odd parts.
//     A lower bound ℓ(u) of it on the piece takes each coefficient's
//     minimum (u ≥ 0, so every power is non-negative), less a rounding
//     allowance. ℓ > 0 on [0, ∞) iff ℓ(0) > 0 and ℓ has no positive
//     root, i.e. the even polynomial G(s) = ℓ(−s²) of degree 2d has no
//     root on the imaginary axis, i.e. exactly d roots in the right half
//     plane; and the Routh array of G + G′, whose rows are G's
//     coefficients and its derivative's (Routh's rule for an all-zero row,
//     with G as the auxiliary polynomial), counts them (routh.Count,
//     certified). Since ev never reports more than the supremum of |S|
//     (margins.MsEvaluator), its value is below L too.
//   - above: at the grid frequency where ev found |S| largest at the node
//     last evaluated in the row (or at the piece's middle node),
//     |D|² − L²·|C|² is a quadratic in x whose minimum over the piece is
//     positive: every node of the piece has |S| ≥ L at a frequency of
//     ev's grid, so ev's value is at least L.
//
// The certificates are proofs up to the stated rounding allowances, so no
// node is put on the wrong side of a level; a node that rounding could
// place either way is evaluated. The corners of cells whose corners lie
// on different sides of a level are then evaluated too (repeated until
// none is left unevaluated), so the lines, saddles included, are traced
// from ev's values. Rows are independent and the result does not depend
// on the number of workers.
func MsForLevels(ctx context.Context, s plane.Setup, m *grid.Map, ev *margins.MsEvaluator, levels []float64, workers int) ([]float64, int, error) {
	checkMap(s, m)
	nx, ny := s.X.N, s.Y.N
	levels = append([]float64(nil), levels...)
	sort.Float64s(levels)
	values := nanSlice(nx * ny)
	exact := make([]bool, nx*ny)
	// above[k] has bit l set when node k's Ms is at least levels[l].
	above := make([]uint64, nx*ny)
	if len(levels) > 64 {
		levels = levels[:64]
	}
	newWorker := func() *levelWorker { return newLevelWorker(s, ev, levels) }
	err := pool.Each(ctx, ny, workers, nil, newWorker, func(w *levelWorker, j int) {
		w.row(m, j, values, exact, above)
	})
	if err != nil {
		return nil, 0, err
	}
	// The corners of every crossed cell must hold ev's values; where a
	// value just computed moves a node across a level, more cells may be
	// crossed, so this repeats until none lacks one.
	corner := make([]bool, nx*ny)
	for {
		need := make([]bool, nx*ny)
		missing := false
		for j := 0; j+1 < ny; j++ {
			for i := 0; i+1 < nx; i++ {
				k := j*nx + i
				c := [4]int{k, k + 1, k + nx, k + nx + 1}
				if !m.StableAt(c[0]) || !m.StableAt(c[1]) || !m.StableAt(c[2]) || !m.StableAt(c[3]) {
					continue
				}
				if above[c[0]] == above[c[1]] && above[c[0]] == above[c[2]] && above[c[0]] == above[c[3]] {
					continue
				}
				for _, q := range c {
					corner[q] = true
					if !exact[q] {
						need[q], missing = true, true
					}
				}
			}
		}
		if !missing {
			break
		}
		err := pool.Each(ctx, ny, workers, nil, newWorker, func(w *levelWorker, j int) {
			for i := 0; i < nx; i++ {
				if k := j*nx + i; need[k] {
					values[k], _ = w.exact(s.X.At(i), s.Y.At(j))
					exact[k], above[k] = true, w.sides(values[k])
				}
			}
		})
		if err != nil {
			return nil, 0, err
		}
	}
	// Values away from the lines are stand-ins even where they were
	// computed on the way, so that the result does not depend on which
	// nodes the certificates happened to evaluate.
	evaluated := 0
	for k, e := range exact {
		if e {
			evaluated++
		}
		if m.StableAt(k) && !corner[k] {
			values[k] = standIn(above[k], levels)
		}
	}
	return values, evaluated, nil
}

// standIn is a value on the sides of the levels that the bits of above
// give: the highest level reached, or half the lowest level when none is.
func standIn(above uint64, levels []float64) float64 {
	v := 0.5 * levels[0]
	for l, level := range levels {
		if above&(1<<l) != 0 {
			v = level
		}
	}
	return v
}

// levelWorker is one goroutine's scratch for MsForLevels.
type levelWorker struct {
	s      plane.Setup
	ev     *margins.MsEvaluator
	levels []float64
	buf    *plane.Scratch
	// The row's D = D0 + x·D1 and C = C0 + x·C1, and their magnitudes.
	d0, d1, c0, c1 poly.Poly
	// |D(jω)|² and |C(jω)|² as polynomials in u = ω², each the parts of
	// 1, x and x², with the magnitudes of the terms that formed them.
	dq, cq, dqa, cqa [3][]float64
	lb, p, work      []float64
	side             []uint64 // per node of the row: the certified sides
	known            []uint64 // per node of the row: which sides are known
	// peak is the grid frequency of the largest |S| at the node last
	// evaluated in the row, when havePeak.
	peak, lastValue float64
	havePeak        bool
}

func newLevelWorker(s plane.Setup, ev *margins.MsEvaluator, levels []float64) *levelWorker {
	n := max(s.OpenDen.Len(), s.Char.Len())
	w := &levelWorker{s: s, ev: ev, levels: levels, buf: s.NewScratch(),
		d0: make(poly.Poly, n), d1: make(poly.Poly, n), c0: make(poly.Poly, n), c1: make(poly.Poly, n),
		lb: make([]float64, n), p: make([]float64, 2*n), work: make([]float64, routh.WorkLen(2*n)),
		side: make([]uint64, s.X.N), known: make([]uint64, s.X.N)}
	for t := range 3 {
		w.dq[t], w.cq[t], w.dqa[t], w.cqa[t] = make([]float64, n), make([]float64, n), make([]float64, n), make([]float64, n)
	}
	return w
}

// exact is ev's value at (x, y) with the frequency of its grid peak.
func (w *levelWorker) exact(x, y float64) (float64, float64) {
	return w.ev.Peak(w.s.OpenLoop(w.buf, x, y))
}

// sides returns the bits of the levels that v reaches.
func (w *levelWorker) sides(v float64) uint64 {
	var b uint64
	for l, level := range w.levels {
		if v >= level {
			b |= 1 << l
		}
	}
	return b
}

// row decides row j: every stable node gets its sides, and the nodes it
// evaluated their values.
func (w *levelWorker) row(m *grid.Map, j int, values []float64, exact []bool, above []uint64) {
	s := w.s
	nx := s.X.N
	y := s.Y.At(j)
	w.formRow(y)
	clear(w.side)
	clear(w.known)
	base := j * nx
	w.havePeak = false
	value := func(i int) {
		k := base + i
		v, peak := w.exact(s.X.At(i), y)
		values[k], exact[k] = v, true
		w.side[i], w.known[i] = w.sides(v), ^uint64(0)
		w.peak, w.lastValue, w.havePeak = peak, v, true
	}
	for i := 0; i < nx; {
		if !m.StableAt(base + i) {
			i++
			continue
		}
		lo := i
		for i < nx && m.StableAt(base+i) {
			i++
		}
		for l := range w.levels {
			w.certify(l, lo, i-1, value, exact[base:base+nx])
		}
	}
	for i := 0; i < nx; i++ {
		if m.StableAt(base + i) {
			above[base+i] = w.side[i]
		}
	}
}

// certify decides level l on the stable nodes lo … hi of the row.
func (w *levelWorker) certify(l, lo, hi int, value func(int), exact []bool) {
	bit := uint64(1) << l
	for lo <= hi && w.known[lo]&bit != 0 {
		lo++
	}
	for hi >= lo && w.known[hi]&bit != 0 {
		hi--
	}
	if lo > hi {
		return
	}
	set := func(a bool) {
		for i := lo; i <= hi; i++ {
			if w.known[i]&bit == 0 {
				w.known[i] |= bit
				if a {
					w.side[i] |= bit
				}
			}
		}
	}
	x0, x1 := w.s.X.At(lo), w.s.X.At(hi)
	if w.decide(l, x0, x1, set) {
		return
	}
	mid := (lo + hi) / 2
	switch {
	case hi-lo < 2:
		// Each node on its own; one that neither certificate decides is
		// evaluated. The corners of crossed cells are evaluated later
		// anyway, so a node decided here costs nothing it would not.
		for i := lo; i <= hi; i++ {
			if exact[i] || w.known[i]&bit != 0 {
				continue
			}
			x := w.s.X.At(i)
			one := func(a bool) {
				w.known[i] |= bit
				if a {
					w.side[i] |= bit
				}
			}
			if !w.decide(l, x, x, one) {
				value(i)
			}
		}
		return
	case !w.havePeak:
		value(mid)
		if w.aboveAt(l, w.peak, x0, x1) {
			set(true)
			return
		}
	}
	w.certify(l, lo, mid, value, exact)
	w.certify(l, mid+1, hi, value, exact)
}

// decide tries both certificates on [x0, x1] for level l and calls set
// with the side when one holds. The peak frequency of the node last
// evaluated in the row, which moves little from node to node, serves the
// above certificate, and the side of that node says which certificate to
// try first (the cheaper above one needs no sign array).
func (w *levelWorker) decide(l int, x0, x1 float64, set func(above bool)) bool {
	tryAbove := func() bool { return w.havePeak && w.aboveAt(l, w.peak, x0, x1) }
	if w.havePeak && w.lastValue >= w.levels[l] {
		if tryAbove() {
			set(true)
			return true
		}
		if w.below(l, x0, x1) {
			set(false)
			return true
		}
		return false
	}
	if w.below(l, x0, x1) {
		set(false)
		return true
	}
	if tryAbove() {
		set(true)
		return true
	}
	return false
}

// formRow writes the row's D0, D1, C0, C1 and the u-polynomials of their
// squared magnitudes on the imaginary axis.
func (w *levelWorker) formRow(y float64) {
	along := func(p plane.Pencil, a, b poly.Poly) {
		clear(a)
		clear(b)
		for k := range p.A {
			a[k] = p.A[k] + y*p.C[k]
			b[k] = p.B[k] + y*p.E[k]
		}
	}
	along(w.s.OpenDen, w.d0, w.d1)
	along(w.s.Char, w.c0, w.c1)
	squares(w.d0, w.d1, &w.dq, &w.dqa)
	squares(w.c0, w.c1, &w.cq, &w.cqa)
}

// squares writes |P0(jω) + x·P1(jω)|² = q[0] + x·q[1] + x²·q[2], each a
// polynomial in u = ω², and qa the same with every term's magnitude.
// With P(jω) = E(u) + jω·O(u), E and O from the even and odd
// coefficients with alternating signs, |P|² = E² + u·O².
func squares(p0, p1 poly.Poly, q, qa *[3][]float64) {
	for t := range 3 {
		clear(q[t])
		clear(qa[t])
	}
	n := len(p0)
	part := func(p poly.Poly, odd bool, i int) float64 {
		k := 2 * i
		if odd {
			k++
		}
		if k >= n {
			return 0
		}
		if i%2 == 1 {
			return -p[k]
		}
		return p[k]
	}
	half := (n + 1) / 2
	for i := 0; i < half; i++ {
		for k := 0; k < half; k++ {
			for _, odd := range [2]bool{false, true} {
				shift := i + k
				if odd {
					shift++
				}
				if shift >= len(q[0]) {
					continue
				}
				a0, b0 := part(p0, odd, i), part(p0, odd, k)
				a1, b1 := part(p1, odd, i), part(p1, odd, k)
				q[0][shift] += a0 * b0
				q[1][shift] += a0*b1 + a1*b0
				q[2][shift] += a1 * b1
				qa[0][shift] += math.Abs(a0 * b0)
				qa[1][shift] += math.Abs(a0*b1) + math.Abs(a1*b0)
				qa[2][shift] += math.Abs(a1 * b1)
			}
		}
	}
}

// roundingAllowance is the relative size of the rounding in forming the
// u-polynomials and taking their minima, against the magnitudes of the
// terms: far more than the few dozen roundings involved.
const roundingAllowance = 1e-12

// below reports whether Ms < levels[l] at every x in [x0, x1] of the row.
func (w *levelWorker) below(l int, x0, x1 float64) bool {
	L2 := w.levels[l] * w.levels[l]
	n := len(w.lb)
	top := -1
	for k := 0; k < n; k++ {
		h := [3]float64{L2*w.cq[0][k] - w.dq[0][k], L2*w.cq[1][k] - w.dq[1][k], L2*w.cq[2][k] - w.dq[2][k]}
		ha := [3]float64{L2*w.cqa[0][k] + w.dqa[0][k], L2*w.cqa[1][k] + w.dqa[1][k], L2*w.cqa[2][k] + w.dqa[2][k]}
		ax := math.Max(math.Abs(x0), math.Abs(x1))
		allow := roundingAllowance * (ha[0] + ax*ha[1] + ax*ax*ha[2])
		w.lb[k] = quadMin(h, x0, x1) - allow
		if h != [3]float64{} || allow != 0 {
			top = k
		}
	}
	if top < 1 || !(w.lb[0] > 0) || !(w.lb[top] > 0) {
		return false
	}
	// p = G + G′ with G(s) = ℓ(−s²) = Σ ℓ_k (−1)^k s^(2k).
	p := w.p[:2*top+1]
	clear(p)
	for k := 0; k <= top; k++ {
		g := w.lb[k]
		if k%2 == 1 {
			g = -g
		}
		p[2*k] = g
		if k > 0 {
			p[2*k-1] = 2 * float64(k) * g
		}
	}
	rhp, zeros, st := routh.Count(p, w.work)
	return st == routh.Decided && zeros == 0 && rhp == top
}

// quadMin returns the minimum of h[0] + x·h[1] + x²·h[2] over [x0, x1].
func quadMin(h [3]float64, x0, x1 float64) float64 {
	at := func(x float64) float64 { return h[0] + x*(h[1]+x*h[2]) }
	v := math.Min(at(x0), at(x1))
	if h[2] > 0 {
		if xv := -h[1] / (2 * h[2]); xv > x0 && xv < x1 {
			v = math.Min(v, at(xv))
		}
	}
	return v
}

// aboveAt reports whether |D(jω)|² − L²·|C(jω)|² > 0 at ω = peak for
// every x in [x0, x1] of the row, with a margin for rounding.
func (w *levelWorker) aboveAt(l int, peak, x0, x1 float64) bool {
	L2 := w.levels[l] * w.levels[l]
	s := complex(0, peak)
	d0, d1, c0, c1 := w.d0.Eval(s), w.d1.Eval(s), w.c0.Eval(s), w.c1.Eval(s)
	abs2 := func(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }
	dot := func(a, b complex128) float64 { return real(a)*real(b) + imag(a)*imag(b) }
	h := [3]float64{abs2(d0) - L2*abs2(c0), 2*dot(d0, d1) - 2*L2*dot(c0, c1), abs2(d1) - L2*abs2(c1)}
	ax := math.Max(math.Abs(x0), math.Abs(x1))
	size := func(a, b complex128) float64 { v := cmplx.Abs(a) + ax*cmplx.Abs(b); return v * v }
	allow := 1e-9 * (size(d0, d1) + L2*size(c0, c1))
	return quadMin(h, x0, x1) > allow
}
