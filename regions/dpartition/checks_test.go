package dpartition

import (
	"math"
	"math/cmplx"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

var sVar = poly.Poly{0, 1}

// piProblem is the PI loop s·D(s) + (kp·s + ki)·N(s)·e^(−Ls) around the
// plant N/D in the (kp, ki) plane.
func piProblem(num, den poly.Poly, delay float64, kp, ki Range) Problem {
	pr := Problem{P: Bilinear{A: poly.Mul(sVar, den)}, Delay: delay, X: kp, Y: ki}
	loop := Bilinear{B: poly.Mul(sVar, num), C: num}
	if delay == 0 {
		pr.P.B, pr.P.C = loop.B, loop.C
	} else {
		pr.Q = loop
	}
	return pr
}

// eigenCount counts the roots of p in the open right half plane from
// gonum's eigenvalues of the companion matrix, the independent reference.
// ok is false when a root lies within 1e-9 of its magnitude from the axis,
// too close for the reference itself to be trusted.
func eigenCount(t testing.TB, p poly.Poly) (rhp int, ok bool) {
	t.Helper()
	roots, err := p.Trim(0).Roots()
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range roots {
		if math.Abs(real(r)) <= 1e-9*math.Max(1e-300, cmplx.Abs(r)) {
			return 0, false
		}
		if real(r) > 0 {
			rhp++
		}
	}
	return rhp, true
}

// residual returns |Δ(jω; x, y)| over the sum of the magnitudes of its
// terms, evaluated afresh from the problem's polynomials.
func residual(pr Problem, pt Point) float64 {
	s := complex(0, pt.Omega)
	z := cmplx.Exp(-s * complex(pr.Delay, 0))
	factors := [4]float64{1, pt.X, pt.Y, pt.X * pt.Y}
	var sum complex128
	mag := 0.0
	pp, qq := pr.P.parts(), pr.Q.parts()
	for k, f := range factors {
		for _, term := range [2]complex128{pp[k].Eval(s) * complex(f, 0), qq[k].Eval(s) * complex(f, 0) * z} {
			sum += term
			mag += cmplx.Abs(term)
		}
	}
	if mag == 0 {
		return 0
	}
	return cmplx.Abs(sum) / mag
}

// residualTol bounds residual at a traced complex point: a few thousand
// units of rounding, allowing for the cancellation between terms that a
// root on the axis implies.
const residualTol = 1e-9

// checkResiduals checks every complex point with finite ω.
func checkResiduals(t *testing.T, pr Problem, cs []Curve) {
	t.Helper()
	for ci, c := range cs {
		if c.Kind != stability.Complex {
			continue
		}
		for _, p := range c.Points {
			if math.IsInf(p.Omega, 1) {
				continue
			}
			if r := residual(pr, p); !(r <= residualTol) {
				t.Fatalf("curve %d point %+v: |Δ(jω)| / Σ|terms| = %.3g > %.0e", ci, p, r, residualTol)
			}
		}
	}
}

// offset returns the point at distance d (window coordinates) from
// points[i] along the left normal of the polyline there.
func offset(w window, pts []Point, i int, d float64) (x, y float64) {
	j, k := max(i-1, 0), min(i+1, len(pts)-1)
	u0, v0 := w.unit(pts[j].X, pts[j].Y)
	u1, v1 := w.unit(pts[k].X, pts[k].Y)
	tu, tv := u1-u0, v1-v0
	l := math.Hypot(tu, tv)
	nu, nv := -tv/l, tu/l
	return pts[i].X + d*nu*w.x.Span(), pts[i].Y + d*nv*w.y.Span()
}

// checkSides confirms, for a rational problem, each curve's Fewer and
// Change by gonum eigenvalue counts on both sides of its interior points:
// the side named Fewer has Change roots fewer in the right half plane. A
// point counts only where the counts at two offsets, d and 2d, agree on
// each side, so that a point next to another edge is passed over; at
// least half the points of every curve must count.
func checkSides(t *testing.T, pr Problem, cs []Curve, d float64) {
	t.Helper()
	w := window{pr.X, pr.Y}
	count := func(x, y float64) (int, bool) {
		f := pr.Function(x, y)
		return eigenCount(t, f.P)
	}
	for ci, c := range cs {
		if c.Fewer == SideUnknown {
			t.Errorf("curve %d (%v): side unknown", ci, c.Kind)
			continue
		}
		pts := c.Points
		if len(pts) == 2 {
			// A straight edge: any point between its ends lies on it. Not
			// the midpoint, which a symmetric window can put on another edge.
			a, b := pts[0], pts[1]
			m := Point{a.X + 0.4*(b.X-a.X), a.Y + 0.4*(b.Y-a.Y), a.Omega}
			pts = []Point{a, m, b}
		}
		checked, tried := 0, 0
		for i := 1; i+1 < len(pts); i++ {
			tried++
			var n [2][2]int // [offset][left, right]
			good := true
			for k, dd := range [2]float64{d, 2 * d} {
				for side, sg := range [2]float64{1, -1} {
					x, y := offset(w, pts, i, sg*dd)
					v, ok := count(x, y)
					good = good && ok
					n[k][side] = v
				}
			}
			if !good || n[0] != n[1] {
				continue
			}
			checked++
			left, right := n[0][0], n[0][1]
			want := right - c.Change
			got := left
			if c.Fewer == Right {
				want, got = left-c.Change, right
			}
			if got != want {
				t.Fatalf("curve %d (%v, fewer %v, change %d) at %+v: %d unstable roots on the left, %d on the right",
					ci, c.Kind, c.Fewer, c.Change, pts[i], left, right)
			}
		}
		if tried > 0 && 2*checked < tried {
			t.Errorf("curve %d (%v): only %d of %d points could be checked", ci, c.Kind, checked, tried)
		}
	}
}

// kinds counts the curves of each kind.
func kinds(cs []Curve) map[stability.Kind]int {
	m := map[stability.Kind]int{}
	for _, c := range cs {
		m[c.Kind]++
	}
	return m
}

func near(a, b, rel float64) bool {
	return math.Abs(a-b) <= rel*math.Max(1, math.Max(math.Abs(a), math.Abs(b)))
}

func mustEdges(t *testing.T, pr Problem) Result {
	t.Helper()
	res, err := Edges(pr, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res
}

// checkAgainstGrid counts the unstable roots by gonum eigenvalues on an
// n×n grid of the window and, wherever two neighbouring nodes differ,
// requires a traced curve to pass between them: within slack (window
// coordinates) of the grid segment joining them. It returns how many grid
// segments showed a change.
func checkAgainstGrid(t *testing.T, pr Problem, cs []Curve, n int, slack float64) int {
	t.Helper()
	w := window{pr.X, pr.Y}
	at := func(i, j int) (float64, float64) {
		return pr.X.Min + pr.X.Span()*float64(i)/float64(n-1), pr.Y.Min + pr.Y.Span()*float64(j)/float64(n-1)
	}
	counts := make([][]int, n)
	for i := range counts {
		counts[i] = make([]int, n)
		for j := range counts[i] {
			x, y := at(i, j)
			c, ok := eigenCount(t, pr.Function(x, y).P)
			if !ok {
				c = -1
			}
			counts[i][j] = c
		}
	}
	changes := 0
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			for _, d := range [2][2]int{{1, 0}, {0, 1}} {
				k, l := i+d[0], j+d[1]
				if k >= n || l >= n || counts[i][j] < 0 || counts[k][l] < 0 || counts[i][j] == counts[k][l] {
					continue
				}
				changes++
				x0, y0 := at(i, j)
				x1, y1 := at(k, l)
				a, b := Point{X: x0, Y: y0}, Point{X: x1, Y: y1}
				if !crossedBy(w, cs, a, b, slack) {
					t.Fatalf("counts %d at (%g, %g) and %d at (%g, %g) but no edge between", counts[i][j], x0, y0, counts[k][l], x1, y1)
				}
			}
		}
	}
	return changes
}

// crossedBy reports whether some curve segment comes within slack of the
// segment ab, in window coordinates.
func crossedBy(w window, cs []Curve, a, b Point, slack float64) bool {
	for _, c := range cs {
		for i := 0; i+1 < len(c.Points); i++ {
			if segmentDistance(w, a, b, c.Points[i], c.Points[i+1]) <= slack {
				return true
			}
		}
	}
	return false
}

// segmentDistance is the distance between segments ab and cd in window
// coordinates: zero when they cross, else the least distance from an end
// of one to the other.
func segmentDistance(w window, a, b, c, d Point) float64 {
	au, av := w.unit(a.X, a.Y)
	bu, bv := w.unit(b.X, b.Y)
	cu, cv := w.unit(c.X, c.Y)
	du, dv := w.unit(d.X, d.Y)
	orient := func(pu, pv, qu, qv, ru, rv float64) float64 { return (qu-pu)*(rv-pv) - (qv-pv)*(ru-pu) }
	o1, o2 := orient(au, av, bu, bv, cu, cv), orient(au, av, bu, bv, du, dv)
	o3, o4 := orient(cu, cv, du, dv, au, av), orient(cu, cv, du, dv, bu, bv)
	if (o1 > 0) != (o2 > 0) && (o3 > 0) != (o4 > 0) {
		return 0
	}
	return math.Min(math.Min(w.deviation(c, a, b), w.deviation(d, a, b)), math.Min(w.deviation(a, c, d), w.deviation(b, c, d)))
}

// distanceToCurves is the least distance, in window coordinates, from p to
// the polylines of the curves of one kind.
func distanceToCurves(w window, cs []Curve, kind stability.Kind, p Point) float64 {
	best := math.Inf(1)
	for _, c := range cs {
		if c.Kind != kind {
			continue
		}
		for i := 0; i+1 < len(c.Points); i++ {
			best = math.Min(best, w.deviation(p, c.Points[i], c.Points[i+1]))
		}
		if len(c.Points) == 1 {
			best = math.Min(best, w.length(p, c.Points[0]))
		}
	}
	return best
}

// checkCovers samples a known parametrisation of the complex edge densely
// in ω and requires every sample inside the window to lie within tol of a
// traced curve: nothing is missing, and the polylines follow the curve.
func checkCovers(t *testing.T, pr Problem, cs []Curve, edge func(omega float64) Point, omegas []float64, tol float64) int {
	t.Helper()
	w := window{pr.X, pr.Y}
	inside := 0
	for _, om := range omegas {
		p := edge(om)
		if !w.contains(p.X, p.Y) {
			continue
		}
		inside++
		if d := distanceToCurves(w, cs, stability.Complex, p); !(d <= tol) {
			t.Fatalf("edge point %+v is %.3g from every traced curve (tolerance %.3g)", p, d, tol)
		}
	}
	return inside
}

// span returns n+1 values spread evenly over [a, b].
func span(a, b float64, n int) []float64 {
	v := make([]float64, n+1)
	for i := range v {
		v[i] = a + (b-a)*float64(i)/float64(n)
	}
	return v
}

// checkRational runs the checks every rational case shares: residuals at
// the complex points, eigenvalue counts on both sides of every curve, and
// the n×n eigenvalue grid, all against gonum.
func checkRational(t *testing.T, pr Problem, cs []Curve, n int) {
	t.Helper()
	if kinds(cs)[stability.Complex] == 0 {
		t.Fatal("no complex edge: the case tests little")
	}
	checkResiduals(t, pr, cs)
	checkSides(t, pr, cs, 1e-6)
	checkAgainstGrid(t, pr, cs, n, 3e-3)
}

// complexPoints returns the points of every complex curve.
func complexPoints(cs []Curve) []Point {
	var out []Point
	for _, c := range cs {
		if c.Kind == stability.Complex {
			out = append(out, c.Points...)
		}
	}
	return out
}
