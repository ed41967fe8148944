package routh

import (
	"math"
	"testing"

	"gainscape/regions/poly"
)

// Published worked examples. Each names its source; the expected values
// were recalled from memory and are also confirmed by the factored form
// given beside them, which is derived by hand in the comment.
func TestAnalyzePublishedExamples(t *testing.T) {
	tests := []struct {
		name       string
		source     string
		desc       []float64 // highest power first
		rhp, jw    int
		omegas     []float64
		eps, aux   bool
		zeroRoots  int
		degreeDrop int
	}{
		{
			name:   "regular array, two sign changes",
			source: "K. Ogata, Modern Control Engineering, 5th ed., Sec. 5-6 (from memory)",
			// s⁴+2s³+3s²+4s+5: first column 1, 2, 1, -6, 5.
			desc: []float64{1, 2, 3, 4, 5}, rhp: 2,
		},
		{
			name:   "zero first-column entry, epsilon rule",
			source: "N. S. Nise, Control Systems Engineering, Example 6.2 (from memory)",
			// s⁵+2s⁴+3s³+6s²+5s+3: the s³ row starts with 0; ε rule gives
			// first column 1, 2, ε, (6ε−7)/ε, ..., 3: two sign changes.
			desc: []float64{1, 2, 3, 6, 5, 3}, rhp: 2, eps: true,
		},
		{
			name:   "all-zero row, roots on the axis only",
			source: "N. S. Nise, Control Systems Engineering, Example 6.4 (from memory)",
			// s⁵+7s⁴+6s³+42s²+8s+56 = (s+7)(s²+2)(s²+4): the s³ row
			// vanishes, auxiliary polynomial s⁴+6s²+8 (scaled), ω = √2, 2.
			desc: []float64{1, 7, 6, 42, 8, 56}, rhp: 0, jw: 4, aux: true,
			omegas: []float64{math.Sqrt2, 2},
		},
		{
			name:   "all-zero row with a mirrored real pair",
			source: "K. Ogata, Modern Control Engineering, 5th ed., Sec. 5-6, special case 2 (from memory)",
			// s⁵+2s⁴+24s³+48s²−25s−50 = (s+2)(s−1)(s+1)(s²+25):
			// auxiliary 2s⁴+48s²−50, one root at s = 1, pair at ω = 5.
			desc: []float64{1, 2, 24, 48, -25, -50}, rhp: 1, jw: 2, aux: true,
			omegas: []float64{5},
		},
		{
			name:   "zero pivot from a conjugate pair, derived by hand",
			source: "derived by hand in this test",
			// s³+2s²+s+2 = (s+2)(s²+1): the s¹ row is (2·1−1·2)/2 = 0, an
			// all-zero row; auxiliary 2s²+2 gives ω = 1.
			desc: []float64{1, 2, 1, 2}, rhp: 0, jw: 2, aux: true, omegas: []float64{1},
		},
		{
			name:   "roots at the origin factored out",
			source: "derived by hand in this test",
			// s⁴+3s³+2s² = s²(s+1)(s+2): two roots at s = 0.
			desc: []float64{1, 3, 2, 0, 0}, rhp: 0, jw: 2, zeroRoots: 2, omegas: []float64{0},
		},
		{
			name:   "leading coefficient vanishes",
			source: "derived by hand in this test",
			// 0·s³+s²+3s+2 = (s+1)(s+2): one root gone to infinity.
			desc: []float64{0, 1, 3, 2}, rhp: 0, degreeDrop: 1,
		},
		{
			name:   "repeated imaginary pair, nested auxiliary",
			source: "derived by hand in this test",
			// (s+1)(s²+4)² = s⁵+s⁴+8s³+8s²+16s+16: the s³ row vanishes
			// (auxiliary s⁴+8s²+16), and later the s¹ row vanishes again.
			desc: []float64{1, 1, 8, 8, 16, 16}, rhp: 0, jw: 4, aux: true, omegas: []float64{2},
		},
		{
			name:   "epsilon rule with a right-half-plane pair",
			source: "derived by hand in this test",
			// s⁴+s³+2s²+2s+3: s² row is (1·2−1·2)/1 = 0 with 3 beside it,
			// ε rule: first column 1, 1, ε, 2−3/ε, 3: two sign changes.
			desc: []float64{1, 1, 2, 2, 3}, rhp: 2, eps: true,
		},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			rep := Analyze(poly.FromDescending(tc.desc))
			if rep.Undecided {
				t.Fatalf("undecided: %s", rep.Reason)
			}
			if rep.RHP != tc.rhp || rep.JW != tc.jw {
				t.Errorf("%s: rhp, jw = %d, %d; want %d, %d", tc.source, rep.RHP, rep.JW, tc.rhp, tc.jw)
			}
			if rep.UsedEpsilon != tc.eps || rep.UsedAux != tc.aux {
				t.Errorf("special cases: epsilon %v aux %v; want %v %v", rep.UsedEpsilon, rep.UsedAux, tc.eps, tc.aux)
			}
			if rep.ZeroRoots != tc.zeroRoots || rep.DegreeDrop != tc.degreeDrop {
				t.Errorf("zero roots %d, degree drop %d; want %d, %d", rep.ZeroRoots, rep.DegreeDrop, tc.zeroRoots, tc.degreeDrop)
			}
			if len(rep.Omegas) != len(tc.omegas) {
				t.Fatalf("omegas %v; want %v", rep.Omegas, tc.omegas)
			}
			for i, w := range tc.omegas {
				if math.Abs(rep.Omegas[i]-w) > 1e-6*math.Max(1, w) {
					t.Errorf("omega[%d] = %.12g; want %.12g", i, rep.Omegas[i], w)
				}
			}
		})
	}
}
