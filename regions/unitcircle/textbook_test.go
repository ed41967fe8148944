package unitcircle

import (
	"math"
	"strconv"
	"testing"

	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// TestJuryExamples runs the test on worked examples of Jury's table and on
// its singular cases. Every polynomial is also factored by hand in the
// comment, so that the expected count does not rest on memory.
func TestJuryExamples(t *testing.T) {
	const T = 0.1
	tests := []struct {
		name     string
		desc     []float64 // coefficients, highest power first
		outside  int
		boundary int
		thetas   []float64 // angles of the boundary roots, ascending
	}{
		// K. Ogata, Discrete-Time Control Systems, 2nd ed., Sec. 4-3,
		// Example 4-3 (from memory): stable. By hand,
		// (z² − 0.25)(z² − 1.2z + 0.32) = z⁴ − 1.2z³ + 0.07z² + 0.3z − 0.08,
		// roots ±0.5, 0.4, 0.8.
		{"Ogata example 4-3", []float64{1, -1.2, 0.07, 0.3, -0.08}, 0, 0, nil},
		// Ogata, same section, Example 4-4 (from memory): P(1) = 0, a root
		// on the circle. By hand, (z − 1)(z² − 0.1z − 0.2) =
		// z³ − 1.1z² − 0.1z + 0.2, roots 1, 0.5, −0.4.
		{"Ogata example 4-4, root at z = 1", []float64{1, -1.1, -0.1, 0.2}, 0, 1, []float64{0}},
		// Invented: the root at 1 of the previous example moved to 1.2,
		// (z − 1.2)(z² − 0.1z − 0.2) = z³ − 1.3z² − 0.08z + 0.24.
		{"one root outside", []float64{1, -1.3, -0.08, 0.24}, 1, 0, nil},
		// Invented singular case without a root on the circle: the
		// reciprocal pair 2, 0.5, (z − 2)(z − 0.5) = z² − 2.5z + 1, has
		// |a0| = |a2|, so the first step of the table is singular.
		{"reciprocal pair", []float64{1, -2.5, 1}, 1, 0, nil},
		// Invented: a regular first step followed by a zero first entry.
		// Built by inverting one step of the recursion: with
		// P' = z² − 2.5z + 1 (singular) and γ = 0.5,
		// P = (z·P' + γ·P'*)/(1 − γ²) ∝ z³ − 2z² − 0.25z + 0.5
		// = (z − 2)(z − 0.5)(z + 0.5) by hand.
		{"zero first entry in the second step", []float64{1, -2, -0.25, 0.5}, 1, 0, nil},
		// Invented: e^(±jπ/3) and 0.5, (z² − z + 1)(z − 0.5) =
		// z³ − 1.5z² + 1.5z − 0.5.
		{"pair on the circle", []float64{1, -1.5, 1.5, -0.5}, 0, 2, []float64{math.Pi / 3}},
		// Invented: −1 and 0.3, (z + 1)(z − 0.3) = z² + 0.7z − 0.3.
		{"root at z = −1", []float64{1, 0.7, -0.3}, 0, 1, []float64{math.Pi}},
		// Invented: every root on the circle, z⁴ − 1 = (z² − 1)(z² + 1).
		{"four roots on the circle", []float64{1, 0, 0, 0, -1}, 0, 4, []float64{0, math.Pi / 2, math.Pi}},
		// Invented: a double root at z = 1 and one at 3,
		// (z − 1)²(z − 3) = z³ − 5z² + 7z − 3.
		{"double root at z = 1 and one outside", []float64{1, -5, 7, -3}, 1, 2, []float64{0}},
	}
	test := Test{T: T}
	counter := test.NewCounter(5)
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f := stability.Function{P: poly.FromDescending(tc.desc)}
			want := stability.Verdict{Unstable: tc.outside, Boundary: tc.boundary}
			if v := counter.Count(f); v != want {
				t.Errorf("Count = %+v, want %+v", v, want)
			}
			rep := test.Report(f)
			if rep.Verdict != want {
				t.Errorf("Report verdict %+v, want %+v", rep.Verdict, want)
			}
			if len(rep.Omegas) != len(tc.thetas) {
				t.Fatalf("Omegas %v, want angles %v over T", rep.Omegas, tc.thetas)
			}
			for i, th := range tc.thetas {
				if math.Abs(rep.Omegas[i]-th/T) > 1e-9*(1+th/T) {
					t.Errorf("Omegas %v, want angles %v over T = %g", rep.Omegas, tc.thetas, T)
				}
			}
			if len(rep.Table) == 0 || rep.Method == "" {
				t.Errorf("report without working: %+v", rep)
			}
		})
	}
}

// TestRecursionRowsAreJuryRows compares the first reduction of the
// recursion with Jury's table for Ogata's Example 4-3 (from memory; the
// entries are computed by hand here). Jury's second row is
// b_k = a0·a_k − a4·a_(4−k): b0 = 0.0064 − 1 = −0.9936,
// b1 = (−0.08)(0.3) − (−1.2) = 1.176, b2 = 0.07·(−0.08) − 0.07 = −0.0756,
// b3 = (−0.08)(−1.2) − 0.3 = −0.204. The recursion's row,
// (P − γP*)/z with γ = a0/a4, is −(b0, b1, b2, b3) highest power first,
// since a4 = 1.
func TestRecursionRowsAreJuryRows(t *testing.T) {
	rep := Test{T: 1}.Report(stability.Function{P: poly.FromDescending([]float64{1, -1.2, 0.07, 0.3, -0.08})})
	if len(rep.Table) < 2 {
		t.Fatalf("table %+v", rep.Table)
	}
	want := []float64{0.9936, -1.176, 0.0756, 0.204}
	row := rep.Table[1]
	if len(row.Entries) != len(want) {
		t.Fatalf("row %+v", row)
	}
	for i, w := range want {
		v, err := strconv.ParseFloat(row.Entries[i], 64)
		// The entries are printed to six significant digits.
		if err != nil || math.Abs(v-w) > 1e-6 {
			t.Errorf("entry %d = %q, want %g", i, row.Entries[i], w)
		}
	}
}

// TestReportOfASingularCase: for (z² − z + 1)(z − 0.5) (invented; roots
// e^(±jπ/3) and 0.5) the first step of the recursion is regular
// (γ = −0.5) and leaves 0.75(z² − z + 1), which is singular; the report
// shows the sign array of Q(w) and its auxiliary polynomial mapped back
// to z, whose roots are the pair on the circle. By hand,
// Q(w) = (3w² + 1)(1.5w + 0.5), and the even factor 3w² + 1 maps back to
// a multiple of z² − z + 1.
func TestReportOfASingularCase(t *testing.T) {
	rep := Test{T: 1}.Report(stability.Function{P: poly.FromDescending([]float64{1, -1.5, 1.5, -0.5})})
	if rep.Method != "bilinear map z = (1 + w)/(1 − w) and sign array" {
		t.Fatalf("method %q", rep.Method)
	}
	if len(rep.Table) == 0 || rep.Table[0].Label[:2] != "w^" {
		t.Errorf("table %+v", rep.Table)
	}
	roots, err := rep.Auxiliary.Roots()
	if err != nil || len(roots) != 2 {
		t.Fatalf("auxiliary %v: roots %v, %v", rep.Auxiliary, roots, err)
	}
	for _, r := range roots {
		if math.Abs(real(r)-0.5) > 1e-12 || math.Abs(math.Abs(imag(r))-math.Sqrt(3)/2) > 1e-12 {
			t.Errorf("auxiliary root %v, want e^(±jπ/3)", r)
		}
	}
}
