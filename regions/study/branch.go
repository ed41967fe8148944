package study

import (
	"math"

	"gainscape/regions/boundary"
	"gainscape/regions/plane"
	"gainscape/regions/poly"
	"gainscape/regions/stability"
)

// Branches of a delay loop's complex edge.
//
// On a complex edge the open loop passes through −1:
// L(jω) = Nc·N/(Dc·D)(jω)·e^(−jωL) = −1, so its phase, followed
// continuously from ω → 0, is −π − 2πk for a whole k ≥ 0 (or below):
// the number of full turns the Nyquist curve of the loop at that point
// has made before it passes −1. That k is the edge's branch: 0 for the
// first, which bounds the stable region of most loops, 1 and up for the
// branches the delay adds. It is constant along a connected arc of the
// edge, since the phase moves continuously with the parameters there.
//
// The rule "branch k holds ωL in (2πk, 2π(k+1)]" is the same count only
// when the delay-free part's own phase stays within (−π, π]; where it does
// not (a third-order lag, whose phase reaches −3π/2, or PI, whose first
// arch of the PI edge of a first-order plant with dead time ends at
// ωL = α1 ∈ (π/2, π) and whose second arch runs from about 4.9 to 8 in
// ωL), that rule splits one arc between two branches. So the branch is
// computed here from the phase itself.
//
// The phase of the delay-free part is the sum over the roots r of Nc·N
// and Dc·D of the continuous arg(jω − r), each followed from ω = 0 (a
// root right of the axis and above the real axis, Im r ∈ (0, ω), turns
// its factor through −π), plus the phase of the leading coefficients
// and π/2 for each root at s = 0; it is then shifted by a whole number of
// turns so that its low-frequency value, arg c + (z_N − z_D)·π/2 with c
// the ratio of the lowest non-zero coefficients, has arg c in [−π, π):
// 0 for c > 0, −π for c < 0. A root within 1e-9 of the imaginary axis
// below ω makes the phase jump there, and the branch is then unknown
// (-1), as it is where the phase does not come within 0.1 rad of
// −π − 2πk.

// branchesOf returns, for each curve of a map of a loop with dead time,
// the branch of each point of its complex curves (-1 for other curves,
// and where it cannot be told).
func branchesOf(s plane.Setup, curves []boundary.Curve) [][]int {
	sc := s.NewScratch()
	out := make([][]int, len(curves))
	for c, cv := range curves {
		out[c] = make([]int, len(cv.Points))
		for i, p := range cv.Points {
			out[c][i] = -1
			if cv.Kind == stability.Complex && p.Omega > 0 && !math.IsInf(p.Omega, 0) {
				num, den := s.OpenLoop(sc, p.X, p.Y)
				out[c][i] = branchAt(num, den, s.Plant.Delay, p.Omega)
			}
		}
	}
	return out
}

// branchAt returns the branch of a point of a complex edge where the
// open loop num/den·e^(−sL) passes −1 at ω (see above), or -1.
func branchAt(num, den poly.Poly, delay, omega float64) int {
	pn, ok1 := unwrappedPhase(num, omega)
	pd, ok2 := unwrappedPhase(den, omega)
	if !ok1 || !ok2 {
		return -1
	}
	c := lowest(num) / lowest(den)
	zero := float64(zeros(num)-zeros(den)) * math.Pi / 2
	ref := zero
	if c < 0 {
		ref -= math.Pi
	}
	p0n, _ := unwrappedPhase(num, 0)
	p0d, _ := unwrappedPhase(den, 0)
	shift := 2 * math.Pi * math.Round((ref-(p0n-p0d))/(2*math.Pi))
	total := pn - pd + shift - omega*delay
	k := (-math.Pi - total) / (2 * math.Pi)
	r := math.Round(k)
	if math.Abs(k-r)*2*math.Pi > 0.1 {
		return -1
	}
	return int(r)
}

// unwrappedPhase returns arg p(jω) followed continuously from ω = 0 (at
// ω = 0, the limit ω → 0+), as the notes above describe, and false where
// a root near the axis makes it jump on the way.
func unwrappedPhase(p poly.Poly, omega float64) (float64, bool) {
	p = p.Clone().Trim(0)
	z := zeros(p)
	if len(p) == 0 {
		return 0, false
	}
	phase := float64(z) * math.Pi / 2
	if p[len(p)-1] < 0 {
		phase += math.Pi
	}
	rest := p[z:]
	if len(rest) < 2 {
		return phase, true
	}
	roots, err := rest.Roots()
	if err != nil {
		return 0, false
	}
	for _, r := range roots {
		a, b := real(r), imag(r)
		if math.Abs(a) <= 1e-9*math.Hypot(a, b) && b > 0 && b <= omega {
			return 0, false
		}
		th := math.Atan2(omega-b, -a)
		if a > 0 && b > 0 && omega > b {
			th -= 2 * math.Pi
		}
		phase += th
	}
	return phase, true
}

// zeros returns the number of roots of p at s = 0: its lowest
// coefficients that are exactly zero.
func zeros(p poly.Poly) int {
	z := 0
	for z < len(p) && p[z] == 0 {
		z++
	}
	return z
}

// lowest returns the lowest non-zero coefficient of p (0 for none).
func lowest(p poly.Poly) float64 {
	if z := zeros(p); z < len(p) {
		return p[z]
	}
	return 0
}
