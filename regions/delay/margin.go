package delay

import (
	"math"
	"math/cmplx"

	"gainscape/regions/poly"
)

// OpenLoop returns the open-loop frequency response with delay,
// N(jω)/D(jω)·e^(−jωL), for the loop transfer function N/D (plant times
// controller) and dead time L.
func OpenLoop(num, den poly.Poly, L, omega float64) complex128 {
	s := complex(0, omega)
	return num.Eval(s) / den.Eval(s) * cmplx.Exp(complex(0, -omega*L))
}

// Crossover is a gain crossover of an open loop with delay: a frequency
// where |N(jω)/D(jω)| = 1.
type Crossover struct {
	// Omega is the crossover frequency in rad/s, > 0.
	Omega float64
	// PhaseMargin is π + arg L(jω) in radians, in (−π, π], the delay's
	// own phase −ωL included.
	PhaseMargin float64
}

// DelayMargin returns the further dead time, in seconds, that brings this
// crossover to the phase −π: PhaseMargin/Omega, with a negative phase
// margin taken as PhaseMargin + 2π (the next crossing of −π as the delay
// grows). An added delay turns the phase at ω by −ω·ΔL and leaves the
// gain alone, so this is exact (common practice; e.g. K. J. Åström and
// R. M. Murray, Feedback Systems, 2nd ed., Princeton 2021, Sec. 10.3). It is
// the margin of a loop that is stable as it stands.
func (c Crossover) DelayMargin() float64 {
	phi := c.PhaseMargin
	if phi < 0 {
		phi += 2 * math.Pi
	}
	return phi / c.Omega
}

// GainCrossovers returns the gain crossovers of N/D·e^(−Ls), ascending:
// the positive roots ω² of |N(jω)|² − |D(jω)|², a polynomial whose
// coefficients are formed exactly from those of N and D (the delay does
// not change the gain), each refined on the gain itself, with the phase
// margin there.
func GainCrossovers(num, den poly.Poly, L float64) []Crossover {
	n := max(len(num), len(den))
	e := make([]float64, n)
	for m := range e {
		vn, _ := magSquare(num, m)
		vd, _ := magSquare(den, m)
		e[m] = vn - vd
	}
	e = trimTop(e)
	if len(e) < 2 {
		return nil
	}
	xs := newRootFinder(len(e)).positive(e, make([]float64, 0, len(e)))
	out := make([]Crossover, 0, len(xs))
	for _, x := range xs {
		w := math.Sqrt(x)
		g := OpenLoop(num, den, L, w)
		phi := math.Pi + math.Atan2(imag(g), real(g))
		if phi > math.Pi {
			phi -= 2 * math.Pi
		}
		out = append(out, Crossover{Omega: w, PhaseMargin: phi})
	}
	return out
}

// DelayMargin returns the smallest Crossover.DelayMargin over the gain
// crossovers of N/D·e^(−Ls): the dead time that can be added before the
// loop, stable as it stands, loses stability. It is +Inf for a loop whose
// gain never crosses one.
func DelayMargin(num, den poly.Poly, L float64) float64 {
	m := math.Inf(1)
	for _, c := range GainCrossovers(num, den, L) {
		m = math.Min(m, c.DelayMargin())
	}
	return m
}
