package study

import (
	"fmt"
	"math"
	"math/cmplx"

	"gainscape/regions/family"
	"gainscape/regions/loop"
	"gainscape/regions/poly"
)

// gainScale is the size of the loop gain for the window rule: the
// ultimate gain Ku of the proportional-only loop where there is one,
// else 1/|G| at the plant's own frequency, with where it came from.
type gainScale struct {
	gain, freq         float64
	gainFrom, freqFrom string
}

// loopScales returns the gain and frequency scales of the plant of l:
// the gain from the ultimate gain, found by the loop's own stability test
// on the proportional-only loop (so it serves continuous, dead-time and
// sampled loops alike), and the frequency, the plant's own, as the
// geometric mean of the magnitudes of its poles and zeros (in s; for a
// sampled plant from z = e^(sT)) and of 1/L for a dead time L.
func loopScales(l loop.Loop) gainScale {
	sc := gainScale{freq: plantFrequency(l.Plant), freqFrom: "the plant's own frequency"}
	if sc.freq == 0 {
		sc.freq, sc.freqFrom = 1, "1 (the plant has no pole or zero away from the origin)"
	}
	if ku, ok := scannedUltimateGain(l); ok {
		sc.gain, sc.gainFrom = ku, fmt.Sprintf("Ku = %.4g", ku)
		return sc
	}
	g := plantMagnitude(l.Plant, sc.freq)
	if g > 0 && !math.IsInf(g, 0) {
		sc.gain, sc.gainFrom = 1/g, fmt.Sprintf("1/|G| = %.4g at ω = %.4g (no ultimate gain)", 1/g, sc.freq)
	} else {
		sc.gain, sc.gainFrom = 1, "1"
	}
	return sc
}

// parameterScale returns the scale of the named parameter: the gain
// scale K for kp and k, K·ω for ki, K/ω for kd, 1/ω for tau, ω for the
// zeros and poles of lead and lag structures, and the larger of 1 and
// the default's magnitude for any other.
func parameterScale(l loop.Loop, name string, sc gainScale) Scale {
	switch name {
	case "kp", "k":
		return Scale{sc.gain, sc.gainFrom}
	case "ki":
		return Scale{sc.gain * sc.freq, fmt.Sprintf("%s times ω = %.4g", sc.gainFrom, sc.freq)}
	case "kd":
		return Scale{sc.gain / sc.freq, fmt.Sprintf("%s over ω = %.4g", sc.gainFrom, sc.freq)}
	case "tau":
		return Scale{1 / sc.freq, fmt.Sprintf("1/ω, ω = %.4g", sc.freq)}
	case "z", "p", "z1", "z2", "p1", "p2":
		return Scale{sc.freq, fmt.Sprintf("ω = %.4g, %s", sc.freq, sc.freqFrom)}
	}
	i, err := family.Index(l.Family, name)
	v := 1.0
	if err == nil {
		v = math.Max(1, math.Abs(l.Family.Params()[i].Default))
	}
	return Scale{v, "the larger of 1 and its default"}
}

// scannedUltimateGain returns the largest gain of the stable interval of the
// proportional-only loop that starts nearest 0, scanned from 1e-9 to
// 1e9 by factors of 2 and refined by bisection to 1e-9 relative, with
// the loop's stability test; false when there is no such end (the loop
// stays stable, or is never stable, over the scan).
func scannedUltimateGain(l loop.Loop) (float64, bool) {
	pf, err := family.Lookup("p")
	if err != nil {
		panic(err)
	}
	pl := loop.New(l.Plant, pf)
	test := pl.Test()
	counter := test.NewCounter(max(len(pl.Plant.Num), len(pl.Plant.Den)) + 1)
	stable := func(k float64) bool {
		return counter.Count(pl.Set(0, k).Function()).Stable()
	}
	was := false
	for k := 1e-9; k <= 1e9; k *= 2 {
		now := stable(k)
		if was && !now {
			lo, hi := k/2, k
			for hi-lo > 1e-9*hi {
				if m := 0.5 * (lo + hi); stable(m) {
					lo = m
				} else {
					hi = m
				}
			}
			return lo, true
		}
		was = now
	}
	return 0, false
}

// plantFrequency returns the geometric mean of the magnitudes of the
// plant's poles and zeros away from the origin (z = 1 for a sampled
// plant) and of 1/L for a dead time L; 0 if there are none.
func plantFrequency(p loop.Plant) float64 {
	sum, n := 0.0, 0
	add := func(w float64) {
		if w > 0 && !math.IsInf(w, 0) {
			sum += math.Log(w)
			n++
		}
	}
	for _, q := range []poly.Poly{p.Num, p.Den} {
		roots, err := q.Clone().Trim(0).Roots()
		if err != nil {
			continue
		}
		for _, r := range roots {
			if p.Sample > 0 {
				if cmplx.Abs(r) == 0 {
					continue
				}
				r = cmplx.Log(r) / complex(p.Sample, 0)
			}
			if a := cmplx.Abs(r); a > 1e-9*(1+a) {
				add(a)
			}
		}
	}
	if p.Delay > 0 {
		add(1 / p.Delay)
	}
	if n == 0 {
		return 0
	}
	return math.Exp(sum / float64(n))
}

// plantMagnitude returns |G| at frequency w: at s = jw, or at z = e^(jwT)
// for a sampled plant (a dead time does not change it).
func plantMagnitude(p loop.Plant, w float64) float64 {
	s := complex(0, w)
	if p.Sample > 0 {
		s = cmplx.Exp(complex(0, w*p.Sample))
	}
	return cmplx.Abs(p.Num.Eval(s) / p.Den.Eval(s))
}
