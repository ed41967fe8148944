package margins

import (
	"math"
	"slices"

	"gainscape/regions/poly"
)

// Loop is the open loop L(s) = Num(s)/Den(s)·e^(−Delay·s) of a unity
// negative-feedback loop, Num = Nc·N and Den = Dc·D for plant
// N/D·e^(−Delay·s) and controller Nc/Dc. Num and Den are expected to have
// no common root on the imaginary axis.
type Loop struct {
	Num, Den poly.Poly
	// Delay is the dead time of the loop, 0 for none (see delay.go).
	Delay float64
}

// NewLoop returns the open loop of plant N/D under controller Nc/Dc.
func NewLoop(plantNum, plantDen, ctrlNum, ctrlDen poly.Poly) Loop {
	return Loop{Num: poly.Mul(ctrlNum, plantNum), Den: poly.Mul(ctrlDen, plantDen)}
}

// Characteristic returns Den + Num, whose roots are the closed-loop poles.
func (l Loop) Characteristic() poly.Poly { return poly.Add(l.Den, l.Num) }

// At returns L(jω). At a pole on the imaginary axis it returns an infinite
// complex value (cmplx.IsInf reports it).
func (l Loop) At(w float64) complex128 {
	nr, ni, dr, di := l.response(w)
	if dr == 0 && di == 0 {
		return complex(math.Inf(1), math.Inf(1))
	}
	return complex(nr, ni) / complex(dr, di)
}

// evalJW returns the real and imaginary parts of p(jω), from the even and
// odd parts of p evaluated by Horner's rule in x = −ω²:
// p(jω) = E(−ω²) + jω·O(−ω²). It does not allocate.
func evalJW(p poly.Poly, w float64) (re, im float64) {
	x := -w * w
	n := len(p)
	if n == 0 {
		return 0, 0
	}
	top := n - 1
	var e, o float64
	ke, ko := top, top-1
	if top%2 == 1 {
		ke, ko = top-1, top
	}
	for k := ke; k >= 0; k -= 2 {
		e = e*x + p[k]
	}
	for k := ko; k >= 0; k -= 2 {
		o = o*x + p[k]
	}
	return e, w * o
}

// Grid density of the logarithmic frequency scan used by Loop.Margins.
const perDecade = 100

// Default frequency range, rad/s, when no root of Num, Den or Den+Num is
// away from the origin (for example L = k with constant k).
const (
	defaultLo = 1e-3
	defaultHi = 1e3
)

// FrequencyRange returns the frequency range, rad/s, that Margins scans:
// from 1e-3 times the smallest to 1e3 times the largest non-zero root
// magnitude among the open-loop zeros (roots of Num), the open-loop poles
// (roots of Den) and the closed-loop poles (roots of Den+Num). The
// closed-loop poles are included because they carry the loop gain: for
// L = k/s² no open-loop root is away from the origin but the crossover is
// at √k, the closed-loop pole magnitude. When no root is away from the
// origin the range is [1e-3, 1e3]. It is also a sensible range for an
// MsEvaluator built around a nominal loop.
func (l Loop) FrequencyRange() (lo, hi float64) {
	lo, hi, _ = l.rangeAndRoots()
	return lo, hi
}

// rangeAndRoots returns the scan range and every root it was derived from.
func (l Loop) rangeAndRoots() (lo, hi float64, roots []complex128) {
	for _, p := range []poly.Poly{l.Num, l.Den, l.Characteristic()} {
		r, err := p.Roots()
		if err == nil {
			roots = append(roots, r...)
		}
	}
	lo, hi = math.Inf(1), 0.0
	for _, r := range roots {
		m := math.Hypot(real(r), imag(r))
		if m > 0 && m <= math.MaxFloat64 {
			lo, hi = min(lo, m), max(hi, m)
		}
	}
	if hi == 0 {
		return defaultLo, defaultHi, roots
	}
	return 1e-3 * lo, 1e3 * hi, roots
}

// logGrid returns points frequencies from lo to hi, equally spaced in log ω.
func logGrid(lo, hi float64, points int) []float64 {
	w := make([]float64, points)
	a, b := math.Log(lo), math.Log(hi)
	for i := range w {
		w[i] = math.Exp(a + (b-a)*float64(i)/float64(points-1))
	}
	w[0], w[points-1] = lo, hi
	return w
}

// scanGrid returns the frequencies Margins evaluates: a logarithmic grid of
// perDecade points per decade over [lo, hi], enriched as enrichedGrid does.
func scanGrid(lo, hi float64, roots []complex128) []float64 {
	return enrichedGrid(lo, hi, perDecade, roots)
}

// enrichedGrid returns a logarithmic grid of pd points per decade over
// [lo, hi], enriched near every lightly
// damped root r (damping below 0.3) with points Im r + h·t for
// t ∈ {±0.25, ±0.5, ±1, ±2, ±4, ±8}, h = max(|Re r|, 1e-3·|r|), so that
// resonant peaks and the rapid phase swings they cause are bracketed even
// when they are narrower than the grid spacing.
func enrichedGrid(lo, hi float64, pd int, roots []complex128) []float64 {
	decades := math.Log10(hi / lo)
	n := max(int(math.Ceil(decades*float64(pd)))+1, 2)
	w := logGrid(lo, hi, n)
	ts := [...]float64{0.25, 0.5, 1, 2, 4, 8}
	for _, r := range roots {
		im, re := imag(r), math.Abs(real(r))
		m := math.Hypot(re, im)
		if im <= 0 || re > 0.3*m {
			continue
		}
		h := max(re, 1e-3*m)
		for _, t := range ts {
			for _, v := range [2]float64{im - h*t, im + h*t} {
				if v > lo && v < hi {
					w = append(w, v)
				}
			}
		}
	}
	slices.Sort(w)
	return slices.Compact(w)
}
