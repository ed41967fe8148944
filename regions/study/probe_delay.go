package study

import (
	"fmt"
	"math"

	"gainscape/regions/delay"
	"gainscape/regions/export"
	"gainscape/regions/family"
	"gainscape/regions/intervals"
	"gainscape/regions/loop"
	"gainscape/regions/margins"
	"gainscape/regions/stability"
)

// probeRoots is how many rightmost roots a probe of a loop with dead time
// lists (a pair counts twice).
const probeRoots = 8

// Methods that find a probe's poles, as reports name them.
const (
	polesByEigenvalues = "eigenvalues of the companion matrix (gonum)"
	polesByCollocation = "rightmost roots of the quasi-polynomial: spectral collocation of the delay equation's generator (Breda, Maset and Vermiglio 2005), each polished by Newton's method on Δ and the set checked with the count (delay.Rightmost)"
)

// probePoles sets the poles of the probe, their decay rate and least
// damping: the eigenvalues of the characteristic polynomial, or for a
// loop with dead time its rightmost roots. A neutral loop's chain of
// roots bounds its decay rate by −ln|q_n/p_n|/L however far right the
// roots found lie; with |q_n/p_n| ≥ 1 the decay rate is −∞ and no root
// is listed.
func probePoles(doc *export.Probe, l loop.Loop, f stability.Function) error {
	doc.Poles = [][2]float64{}
	if T := l.Plant.Sample; T > 0 {
		doc.PolesFrom = polesByEigenvalues
		return poleFigures(doc, f.P, T)
	}
	if f.Rational() {
		poles, err := margins.Poles(f.P)
		if err != nil {
			return err
		}
		for _, p := range poles {
			doc.Poles = append(doc.Poles, [2]float64{real(p), imag(p)})
		}
		doc.PolesFrom = polesByEigenvalues
		doc.DecayRate, doc.MinDamping = export.Number(margins.DecayRate(poles)), export.Number(margins.MinDamping(poles))
		return nil
	}
	doc.PolesFrom = polesByCollocation
	chain, neutral := delay.ChainAbscissa(f)
	if neutral && math.IsInf(chain, 1) {
		doc.DecayRate, doc.MinDamping = export.Number(math.Inf(-1)), export.Number(math.NaN())
		return nil
	}
	roots, err := delay.Rightmost(f, probeRoots)
	if err != nil {
		return fmt.Errorf("the rightmost roots of the loop with dead time: %w", err)
	}
	for _, r := range roots {
		doc.Poles = append(doc.Poles, [2]float64{real(r), imag(r)})
	}
	decay := delay.DecayRate(roots)
	if neutral {
		decay = math.Min(decay, -chain)
	}
	doc.DecayRate, doc.MinDamping = export.Number(decay), export.Number(delay.LeastDamping(roots))
	return nil
}

// probeWorking copies the stability test's working into the probe: the
// sign array of a rational loop, or the bands of the argument principle
// of a loop with dead time with the test's notes.
func probeWorking(doc *export.Probe, rep stability.Report, f stability.Function) {
	doc.SignArray = []export.SignRow{}
	if f.Rational() {
		for _, r := range rep.Table {
			doc.SignArray = append(doc.SignArray, export.SignRow{Power: r.Power, Entries: r.Entries, Epsilon: r.Epsilon, Auxiliary: r.Auxiliary})
		}
		return
	}
	for _, r := range rep.Table {
		doc.Working = append(doc.Working, export.WorkingRow{Label: r.Label, Entries: r.Entries})
	}
	doc.TestNotes = rep.Notes
	doc.Neutral = neutralOf(f)
}

// leadRatio returns |q_n/p_n| for a loop with dead time whose delayed and
// delay-free parts have one degree n (leading coefficients that are
// exactly zero left out), and whether they have: the neutral type. It
// does not allocate.
func leadRatio(f stability.Function) (float64, bool) {
	top := func(p []float64) int {
		n := len(p) - 1
		for n >= 0 && p[n] == 0 {
			n--
		}
		return n
	}
	n, m := top(f.P), top(f.Q)
	if f.Rational() || n < 0 || n != m {
		return 0, false
	}
	return math.Abs(f.Q[m] / f.P[n]), true
}

// neutralOf describes a loop of neutral type, nil for any other.
func neutralOf(f stability.Function) *export.Neutral {
	r, ok := leadRatio(f)
	if !ok {
		return nil
	}
	n := &export.Neutral{Ratio: r, InfinitelyMany: r >= 1}
	switch {
	case r > 1:
		n.Note = fmt.Sprintf("neutral type with |lim L(s)| = %.4g > 1 as s → ∞ (for an ideal derivative, |kd·lim s·G(s)|): infinitely many roots in the right half plane", r)
	case r == 1:
		n.Note = "neutral type with |lim L(s)| = 1 as s → ∞ (for an ideal derivative, |kd·lim s·G(s)|): a chain of infinitely many roots approaches the imaginary axis"
	default:
		n.Note = fmt.Sprintf("neutral type with |lim L(s)| = %.4g < 1 as s → ∞: a chain of infinitely many roots approaches Re s = %.4g, which bounds the decay rate", r, math.Log(r)/f.Delay)
	}
	return n
}

// delayMargins lists the further dead time each gain crossover of a
// continuous-time loop tolerates (delay.Crossover.DelayMargin: the phase
// margin over the crossover frequency, a negative margin taken as the
// next crossing of −180°), and the smallest of them.
func delayMargins(mg margins.Margins) ([]export.DelayMargin, export.Number) {
	smallest := math.Inf(1)
	var out []export.DelayMargin
	for _, c := range mg.GainCrossings {
		d := delay.Crossover{Omega: c.Freq, PhaseMargin: c.Margin * math.Pi / 180}.DelayMargin()
		out = append(out, export.DelayMargin{Freq: c.Freq, PhaseMarginDeg: c.Margin, Extra: d})
		smallest = math.Min(smallest, d)
	}
	return out, export.Number(smallest)
}

// ultimateWithDelay returns the ultimate gain and period of the plant
// under proportional control: for a plant with dead time, the upper end
// of the first interval of kp > 0 in which the loop is stable and which
// a pair of roots ends (intervals.Stable on the exact quasi-polynomial),
// tu = 2π/ω there; for a plant without, margins.Ultimate. The window of
// kp searched reaches twice the largest 1/|G(jω)| over the first three
// phase crossovers of G (the gains at which the Nyquist curve passes −1
// there), grown 16-fold while the last interval runs into its end.
func ultimateWithDelay(l loop.Loop) (ku, tu float64, ok bool, from string, err error) {
	if l.Plant.Delay == 0 {
		ku, tu, ok = margins.Ultimate(l.Plant.Num, l.Plant.Den, l.Test())
		return ku, tu, ok, "the roots of Im(D(jω)·conj N(jω)) = 0 and a sign-array test of each gain interval (margins.Ultimate)", nil
	}
	from = "the upper end of the first stable kp interval ended by a pair of roots, from the D-partition of the quasi-polynomial in kp (intervals.Stable)"
	pm, err := margins.Loop{Num: l.Plant.Num, Den: l.Plant.Den, Delay: l.Plant.Delay}.Margins()
	if err != nil {
		return 0, 0, false, from, err
	}
	top := 1.0
	for i, c := range pm.PhaseCrossings {
		if i == 3 {
			break
		}
		top = math.Max(top, 2*c.Margin)
	}
	fam, err := family.Lookup("p")
	if err != nil {
		return 0, 0, false, from, err
	}
	pl := loop.New(l.Plant, fam)
	for try := 0; try < 4; try, top = try+1, 16*top {
		ivs, err := intervals.Stable(pl, 0, 0, top)
		if err != nil {
			return 0, 0, false, from, err
		}
		for _, iv := range ivs {
			if iv.HiKind == stability.Complex {
				return iv.Hi, 2 * math.Pi / iv.HiOmega, true, from, nil
			}
		}
		if len(ivs) == 0 || ivs[len(ivs)-1].HiKind != intervals.Window {
			return 0, 0, false, from, nil
		}
	}
	return 0, 0, false, from, nil
}
