package delay

import (
	"fmt"
	"math"
	"strconv"

	"gainscape/regions/poly"
	"gainscape/regions/routh"
	"gainscape/regions/stability"
)

// Report is the full verdict for f: the count, the frequencies of the
// roots on the axis, one row per band of frequencies with the part of Δ
// that dominates there and the change of arg Δ over it, and notes on the
// type of the loop. A loop without delay gets the sign array's report.
func (c *Counter) Report(f stability.Function) stability.Report {
	c.analyse(f)
	r := &c.res
	if r.form == rational {
		return signArrayReport(f)
	}
	rep := stability.Report{Verdict: r.v, Method: "argument principle along the imaginary axis, cut where |P(jω)| = |Q(jω)|", Reason: r.reason}
	switch r.form {
	case retarded:
		rep.Notes = append(rep.Notes, fmt.Sprintf("retarded type: deg P = %d > deg Q = %d", r.n, r.nq))
	case neutral:
		rep.Notes = append(rep.Notes, fmt.Sprintf("neutral type: deg P = deg Q = %d, |q_n/p_n| = %.6g", r.n, r.ratio))
		if r.onChain {
			rep.Notes = append(rep.Notes, "on the neutral boundary |q_n/p_n| = 1: a chain of roots approaches the imaginary axis at infinity")
		} else if r.ratio > 1 {
			rep.Notes = append(rep.Notes, "|q_n/p_n| > 1: infinitely many roots in the right half plane")
		}
	case advanced:
		rep.Notes = append(rep.Notes, fmt.Sprintf("advanced type: deg Q = %d > deg P = %d, infinitely many roots in the right half plane", r.nq, r.n))
	}
	if r.v.Infinite > 0 && !r.onChain || r.v.Infinite > 1 {
		rep.Notes = append(rep.Notes, "the leading coefficient of P is zero: roots have gone to infinity")
	}
	rho := math.Ldexp(1, r.rhoExp)
	if r.zeroNear || r.zeroRoots > 0 {
		rep.Omegas = append(rep.Omegas, 0)
	}
	for i, w := range c.cross {
		if c.atCut[i].boundary {
			rep.Omegas = append(rep.Omegas, w*rho)
		}
	}
	if r.zeroNear {
		rep.Notes = append(rep.Notes, "Δ(0) is zero to within rounding: a real root at s = 0")
	}
	if r.swept {
		for i := 0; i <= len(c.cross); i++ {
			rep.Table = append(rep.Table, c.bandRow(i, rho))
		}
	}
	return rep
}

// bandRow describes band i of the last sweep.
func (c *Counter) bandRow(i int, rho float64) stability.Row {
	lo, hi := "0", "∞"
	if i > 0 {
		lo = strconv.FormatFloat(c.cross[i-1]*rho, 'g', 6, 64)
	}
	if i < len(c.cross) {
		hi = strconv.FormatFloat(c.cross[i]*rho, 'g', 6, 64)
	}
	part := "P dominates"
	if c.typeQ[i] {
		part = "Q·e^(−jωL) dominates"
	}
	row := stability.Row{
		Label:   fmt.Sprintf("%s ≤ ω < %s", lo, hi),
		Entries: []string{part, fmt.Sprintf("phase change %.6g rad", c.bandTheta[i])},
	}
	if i < len(c.cross) && c.atCut[i].boundary {
		row.Entries = append(row.Entries, "root pair on the axis at the upper end")
	}
	return row
}

// signArrayReport is the report of a loop without delay.
func signArrayReport(f stability.Function) stability.Report {
	p := poly.Poly(f.P)
	if f.Delay == 0 && len(f.Q) > 0 {
		p = poly.Add(f.P, f.Q)
	}
	if len(trimTop(f.P)) == 0 && len(f.Q) > 0 {
		p = poly.Poly(f.Q)
	}
	a := routh.Analyze(p)
	rep := stability.Report{
		Verdict:   stability.Verdict{Unstable: a.RHP, Boundary: a.JW, Infinite: a.DegreeDrop},
		Omegas:    a.Omegas,
		Method:    "Routh sign array (no delay in the loop)",
		Auxiliary: a.Aux,
		Reason:    a.Reason,
	}
	if a.Undecided {
		rep.Verdict = stability.Verdict{Unstable: stability.Undecided}
	}
	if a.FromEigenvalues {
		rep.Method = "eigenvalues of the companion matrix (no delay in the loop)"
	}
	for _, row := range a.Rows {
		rep.Table = append(rep.Table, stability.Row{
			Label: fmt.Sprintf("s^%d", row.Power), Power: row.Power,
			Entries: row.Entries, Epsilon: row.Epsilon, Auxiliary: row.Auxiliary,
		})
	}
	return rep
}
