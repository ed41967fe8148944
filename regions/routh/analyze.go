package routh

import (
	"fmt"
	"math"
	"math/cmplx"
	"sort"
	"strconv"

	"gainscape/regions/poly"
)

// Row is one row of the sign array as Analyze reports it.
type Row struct {
	// Power is k for the row labelled s^k.
	Power int
	// Entries are the row's entries as ε → 0+, formatted: "2.5", "ε",
	// "-4/ε", "3·ε²". Leading orders are shown, which fix every sign.
	Entries []string
	// Values are the lowest-order coefficients of the entries (the numbers
	// in Entries without their power of ε).
	Values []float64
	// Orders are the powers of ε of the entries (0 for plain numbers).
	Orders []int
	// Sign is the sign of the first entry as ε → 0+ (+1 or −1).
	Sign int
	// Epsilon is set when the first entry was zero in a non-zero row and
	// was replaced by ε (the ε rule).
	Epsilon bool
	// Auxiliary is set when the row was all zero and was replaced by the
	// coefficients of the derivative of the auxiliary polynomial Aux,
	// formed from the row above.
	Auxiliary bool
	Aux       poly.Poly
}

// Report is the full result of the sign-array test.
type Report struct {
	// Poly is the polynomial tested, after removing the leading
	// coefficients that vanish and the factor s^ZeroRoots.
	Poly poly.Poly
	// Degree is the degree of the polynomial given, before removals.
	Degree int
	// DegreeDrop counts leading coefficients that vanish relative to the
	// largest: roots that have gone to infinity.
	DegreeDrop int
	// ZeroRoots counts roots at s = 0.
	ZeroRoots int
	Rows      []Row
	// RHP is the number of roots in the open right half plane: the sign
	// changes in the first column.
	RHP int
	// JW is the number of roots on the imaginary axis, s = 0 included,
	// counted with multiplicity.
	JW int
	// Omegas lists the distinct frequencies ω ≥ 0 of the imaginary-axis
	// roots ±jω, ascending.
	Omegas []float64
	// Aux is the first auxiliary polynomial met (nil if none); its roots
	// include every imaginary-axis root other than those at s = 0.
	Aux poly.Poly
	// UsedEpsilon and UsedAux say which special cases occurred.
	UsedEpsilon, UsedAux bool
	// FromEigenvalues is set when an entry that decides the count had no
	// significant digit left and the count was confirmed from the
	// eigenvalues instead (see fromEigenvalues); Rows is then empty.
	FromEigenvalues bool
	// Undecided is set when the test cannot give a count (Reason says why).
	Undecided bool
	Reason    string
}

// Stable reports whether every root is in the open left half plane.
func (r Report) Stable() bool { return !r.Undecided && r.RHP == 0 && r.JW == 0 && r.DegreeDrop == 0 }

// Analyze runs the complete sign-array test on p (ascending coefficients).
// Coefficients are compared with InputTol relative to their balanced
// scale (see balancedScales);
// computed entries are tested by stochastic arithmetic (see samples).
// The ε rule is exact in the limit when the polynomial has no
// imaginary-axis roots; when it does, they reveal themselves as an
// all-zero row, which the auxiliary polynomial resolves.
func Analyze(p poly.Poly) Report {
	rep := Report{Degree: len(p) - 1}
	if len(p) == 0 || !p.Finite() {
		rep.Undecided, rep.Reason = true, "coefficients are not finite numbers"
		return rep
	}
	scale := p.Scale()
	if scale == 0 {
		rep.Undecided, rep.Reason = true, "every coefficient is zero"
		return rep
	}
	scales := balancedScales(p)
	hi := len(p) - 1
	for negligible(p[hi], scales[hi]) {
		hi--
	}
	rep.DegreeDrop = len(p) - 1 - hi
	lo := 0
	for negligible(p[lo], scales[lo]) {
		lo++
	}
	rep.ZeroRoots = lo
	q := p[lo : hi+1].Clone()
	rep.Poly = q
	rep.Degree = len(p) - 1
	m := len(q) - 1
	if m <= 0 {
		rep.JW = rep.ZeroRoots
		if rep.ZeroRoots > 0 {
			rep.Omegas = []float64{0}
		}
		return rep
	}

	// Polynomials whose roots are all very fast or very slow are balanced
	// first (s = ρ·t), which changes no sign and keeps the array clear of
	// overflow and of underflow into subnormal numbers.
	rho := 1.0
	if b, r, ok := balance(q); ok {
		q, rho = b, r
	}
	qScales := balancedScales(q)

	overflow := false
	ar := arith{terms: 3*m + 8, overflow: &overflow}
	w := m/2 + 1
	rows := make([][]series, 0, m+1)
	for r := 0; r < 2; r++ {
		row := make([]series, w)
		for j := range row {
			if i := m - r - 2*j; i >= 0 {
				row[j] = ar.monomial(perturb(q[i], i, math.Exp(qScales[i])), 0)
			} else {
				row[j] = ar.zero()
			}
		}
		rows = append(rows, row)
	}
	auxRow := -1
	var aux poly.Poly
	flags := make([]Row, m+1)
	for k := 1; k <= m; k++ {
		if k >= 2 {
			a, b := rows[k-2], rows[k-1]
			ratio := ar.div(a[0], b[0])
			next := make([]series, w)
			for j := 0; j < w; j++ {
				if j+1 < w {
					next[j] = ar.sub(a[j+1], ar.mul(ratio, b[j+1]))
				} else {
					next[j] = ar.zero()
				}
			}
			rows = append(rows, next)
		}
		row := rows[k]
		power := m - k
		if allZero(row) {
			// All-zero row: the row above holds the auxiliary polynomial
			// A(s) = Σ α_j s^(power+1−2j), an even or odd factor of q whose
			// roots are symmetric about both axes.
			above := rows[k-1]
			order := math.MaxInt
			for _, e := range above {
				if !e.isZero() {
					_, o := e.lead()
					order = min(order, o)
				}
			}
			a := make(poly.Poly, power+2)
			for j, e := range above {
				if d := power + 1 - 2*j; d >= 0 {
					v, _ := e.at(order)
					a[d] = v.mean()
					if d >= 1 && j < len(row) {
						for s := range v {
							v[s] *= float64(d)
						}
						row[j] = ar.monomial(v, order)
					}
				}
			}
			flags[k].Auxiliary, flags[k].Aux = true, a
			if auxRow < 0 {
				auxRow, aux = k-1, a
			}
			rep.UsedAux = true
		}
		if row[0].isZero() {
			// ε rule: a zero pivot in a non-zero row becomes ε times the
			// row's own size, and the limit ε → 0+ is carried by the series.
			order, size := math.MaxInt, 0.0
			for _, e := range row {
				if v, o := e.lead(); v != 0 && o <= order {
					if o < order {
						size = 0
					}
					order, size = o, math.Max(size, math.Abs(v))
				}
			}
			row[0] = ar.monomial(samples{size, size, size}, order+1)
			flags[k].Epsilon = true
			rep.UsedEpsilon = true
		}
	}

	if overflow {
		rep.Undecided, rep.Reason = true, "the sign array overflows double precision"
		return rep
	}
	deciding := rows
	if auxRow >= 0 {
		deciding = rows[:auxRow+1]
	}
	for _, row := range deciding {
		if row[0].doubtful {
			return fromEigenvalues(rep, q)
		}
	}
	prev := rows[0][0].sign()
	changes := make([]int, m+1) // changes[k]: sign changes between rows k-1 and k
	for k := 1; k <= m; k++ {
		s := rows[k][0].sign()
		if s != prev {
			changes[k] = 1
			rep.RHP++
		}
		prev = s
	}
	for k, row := range rows {
		f := flags[k]
		f.Power = m - k
		f.Sign = row[0].sign()
		for _, e := range row[:rowWidth(m, k, w)] {
			v, o := e.lead()
			f.Values = append(f.Values, v)
			f.Orders = append(f.Orders, o)
			f.Entries = append(f.Entries, formatTerm(v, o))
		}
		rep.Rows = append(rep.Rows, f)
	}

	rep.JW = rep.ZeroRoots
	if auxRow >= 0 {
		// Rows down to the auxiliary polynomial A count the right-half-plane
		// roots of the other factor. A itself has roots symmetric about
		// both axes; how many lie on the imaginary axis is read from its
		// roots (A(s) = g(s²), and s is on the axis where u = s² is real and
		// negative), and half of the rest lie in the right half plane. This
		// is what the continued array says too, but the continuation can
		// need the ε rule again, which is unreliable in the presence of
		// imaginary-axis roots; the roots of A are not.
		rep.Aux = unbalance(aux, rho)
		above := 0
		for k := 1; k <= auxRow; k++ {
			above += changes[k]
		}
		omegas, jw, ok := axisRoots(aux, q)
		if !ok {
			rep.Undecided, rep.Reason = true, "the roots of the auxiliary polynomial could not be found"
			return rep
		}
		rep.RHP = above + (len(aux)-1-jw)/2
		rep.JW += jw
		for i := range omegas {
			omegas[i] *= rho
		}
		rep.Omegas = omegas
	}
	if rep.ZeroRoots > 0 {
		rep.Omegas = append([]float64{0}, rep.Omegas...)
	}
	if rep.RHP+rep.JW > rep.Degree-rep.DegreeDrop {
		rep.Undecided, rep.Reason = true, "the special cases of the sign array gave inconsistent counts"
		return rep
	}
	// Analyze is the path for polynomials whose array the fast test could
	// not certify, so every count it gives is confirmed against the
	// eigenvalues: near clustered or mirrored roots an entry can change
	// sign under rounding without the samples showing it.
	return crossCheck(rep, q)
}

// crossCheck confirms a count from the full analysis. Its special cases
// rest on entries judged zero, which may be true zeros (an imaginary-axis
// pair, a structural cancellation) or tiny values that the array, made
// ill-conditioned by clustered or mirrored roots, cannot resolve. The
// eigenvalues of the companion matrix tell the two apart (rootSides):
// roots within their rounding bound of the imaginary axis are ambiguous,
// so the array's count stands if it is one the eigenvalues allow: at
// least the roots certainly in the right half plane, and with its
// imaginary-axis roots no more than those plus the ambiguous ones.
// Otherwise, if no root is ambiguous, the eigenvalues' count is taken; if
// some are, the report is undecided.
func crossCheck(rep Report, q poly.Poly) Report {
	clear, near, ok := rootSides(q)
	if !ok {
		rep.Undecided, rep.Reason = true, "the eigenvalues could not be found to confirm the count"
		return rep
	}
	onAxis := rep.JW - rep.ZeroRoots
	if rep.RHP >= clear && rep.RHP+onAxis <= clear+near {
		return rep
	}
	if near == 0 {
		return fromEigenvalues(rep, q)
	}
	rep.Undecided, rep.Reason = true, "the sign array and the eigenvalues disagree near the imaginary axis"
	return rep
}

// fromEigenvalues settles a polynomial whose sign array lost every digit of
// an entry that decides the count, or disagrees with the eigenvalues of
// its companion matrix. If every root is farther from the imaginary axis
// than rounding could move it (rootSides), their count is taken (and the
// report says so); otherwise the polynomial sits on a boundary within what
// double precision resolves, and the report is undecided.
func fromEigenvalues(rep Report, q poly.Poly) Report {
	rep.Rows = nil
	clear, near, ok := rootSides(q)
	switch {
	case !ok:
		rep.Undecided, rep.Reason = true, "the sign array lost every digit of a deciding entry, and the eigenvalues could not be found"
		return rep
	case near > 0:
		rep.Undecided = true
		rep.Reason = "a root lies within rounding of the imaginary axis: the loop is on a stability boundary as far as double precision can tell"
		return rep
	}
	rep.RHP = clear
	rep.JW = rep.ZeroRoots
	rep.Omegas = nil
	if rep.ZeroRoots > 0 {
		rep.Omegas = []float64{0}
	}
	rep.Aux, rep.UsedAux = nil, false
	rep.FromEigenvalues = true
	return rep
}

// coefficientUlps is the relative uncertainty, in units of the last place,
// granted to each coefficient of a characteristic polynomial when judging
// on which side of the axis a root lies: four times the input rounding
// the fast path carries for each coefficient (inputUlps), so that a root
// the rounding of the coefficients cannot move across the axis is
// counted on its side, and only one it could is left undecided.
const coefficientUlps = 4 * inputUlps

// rootSides counts the roots of q that lie certainly in the open right
// half plane (clear) and those that rounding of the coefficients could
// move across the imaginary axis (near). Each root r from the eigenvalues
// of the companion matrix is polished by Newton's method on q; a
// perturbation of relative size η of every coefficient moves a simple
// root by at most about η·Σ|q_k|·|r|^k / |q'(r)| (the first-order
// condition of a polynomial root: J. H. Wilkinson, Rounding Errors in
// Algebraic Processes, 1963, Ch. 2; N. J. Higham, Accuracy and Stability
// of Numerical Algorithms, 2nd ed., Sec. 26.3), and a root whose real part
// is no larger than that bound, plus the residual of the polished root,
// could lie on either side. A multiple root has q'(r) = 0 and an unbounded
// estimate, so it is near unless it is far from the axis in the bound's
// own terms. ok is false if the eigenvalues could not be found.
func rootSides(q poly.Poly) (clear, near int, ok bool) {
	roots, err := q.Roots()
	if err != nil {
		return 0, 0, false
	}
	dq := q.Derivative()
	eta := coefficientUlps * unit
	for _, r := range roots {
		r = q.Polish(r)
		size := 0.0
		pow := 1.0
		m := cmplx.Abs(r)
		for _, c := range q {
			size += math.Abs(c) * pow
			pow *= m
		}
		bound := (eta*size + cmplx.Abs(q.Eval(r))) / cmplx.Abs(dq.Eval(r))
		switch {
		case !(math.Abs(real(r)) > bound):
			near++
		case real(r) > 0:
			clear++
		}
	}
	return clear, near, true
}

// axisTol is how far, relative to its size, a root u of g(u) = A(s) with
// u = s² may stray from the negative real axis and still be taken for a
// pair of imaginary-axis roots. A root of multiplicity k is found to about
// the k-th root of machine precision; 1e-5 covers double and triple pairs.
const axisTol = 1e-5

// axisRoots returns the distinct frequencies, ascending, of the
// imaginary-axis roots of the even auxiliary polynomial a, and their
// number counted with multiplicity. The values are polished by Newton's
// method on q, of which a is a factor, because rows far down an
// ill-conditioned array carry rounding that the coefficients of q do not.
func axisRoots(a, q poly.Poly) (omegas []float64, count int, ok bool) {
	g := make(poly.Poly, (len(a)+1)/2)
	for k := range g {
		g[k] = a[2*k]
	}
	us, err := g.Trim(0).Roots()
	if err != nil {
		return nil, 0, false
	}
	var om []float64
	for _, u := range us {
		if real(u) < 0 && math.Abs(imag(u)) <= axisTol*cmplx.Abs(u) {
			count += 2
			w := math.Sqrt(-real(u))
			om = append(om, math.Abs(imag(q.Polish(complex(0, w)))))
		}
	}
	sort.Float64s(om)
	for _, v := range om {
		if len(omegas) == 0 || v-omegas[len(omegas)-1] > 1e-6*math.Max(1, v) {
			omegas = append(omegas, v)
		}
	}
	return omegas, count, true
}

// perturb returns the three CESTAC samples of input coefficient v (the
// coefficient of s^i): v itself and two copies moved by up to perturbSize
// times its balanced scale. A characteristic polynomial is formed by sums
// of products, so each coefficient carries rounding of the size of the
// largest terms that formed it, not of itself; the perturbation is a few
// hundred units in the last place of those, enough to dominate the
// rounding of the array itself so that the spread of the samples measures
// sensitivity. The pattern is a fixed function of i, so results are
// reproducible.
func perturb(v float64, i int, scale float64) samples {
	if v == 0 {
		// An exact zero is a term the model does not have (a missing
		// power of s), not a rounded value: perturbing it would hide
		// the zero first-column entries it causes from the ε rule.
		return samples{}
	}
	d := perturbSize * scale
	// Two fixed pseudo-random factors in [0.5, 1) with signs, from i.
	h := uint32(i)*2654435761 + 12345
	f1 := 0.5 + float64(h>>24)/512
	f2 := 0.5 + float64((h>>16)&0xff)/512
	if h&1 == 0 {
		f1 = -f1
	}
	if h&2 == 0 {
		f2 = -f2
	}
	return samples{v, v + f1*d, v + f2*d}
}

// perturbSize is the relative size of the CESTAC input perturbation, 2^-44
// (about 5.7e-14), below InputTol so that perturbed coefficients keep
// their zero pattern.
const perturbSize = 0x1p-44

// rowWidth is the number of meaningful entries in row k of a degree-m array.
func rowWidth(m, k, w int) int {
	n := (m-k)/2 + 1
	return min(n, w)
}

func allZero(row []series) bool {
	for _, e := range row {
		if !e.isZero() {
			return false
		}
	}
	return true
}

// formatTerm writes v·ε^o compactly for reports.
func formatTerm(v float64, o int) string {
	num := strconv.FormatFloat(v, 'g', 6, 64)
	switch {
	case v == 0:
		return "0"
	case o == 0:
		return num
	case o == 1 && v == 1:
		return "ε"
	case o == 1:
		return num + "·ε"
	case o == -1:
		return num + "/ε"
	case o > 0:
		return fmt.Sprintf("%s·ε^%d", num, o)
	default:
		return fmt.Sprintf("%s/ε^%d", num, -o)
	}
}
