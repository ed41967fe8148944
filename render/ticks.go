package render

import (
	"math"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
)

// readableTicks labels about five to eight values at a step of 1, 2 or 5
// times a power of ten, with unlabelled ticks between them, so a reader
// can take parameter values off a printed map. Negative values carry a
// true minus sign.
//
// Whatever range it is given, it returns at most maxTicks ticks in
// increasing order, inside the range, with distinct labels: where
// floating point cannot hold the steps (a range a few units in the last
// place wide, or one too wide for its width to be a float64) it labels
// the two ends alone.
type readableTicks struct{}

// maxTicks bounds the ticks of one axis: eight labelled steps with four
// unlabelled ticks between each and the ends, with room to spare.
const maxTicks = 64

// maxFixedDigits is the most decimals a label is written with before it
// changes to exponent form, and the largest magnitude, as a power of ten,
// written in full.
const maxFixedDigits = 9

// Ticks returns the ticks for the range [lo, hi].
func (readableTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || !finite(lo) || !finite(hi) {
		return nil
	}
	if ticks, ok := steppedTicks(lo, hi); ok {
		return ticks
	}
	return endTicks(lo, hi)
}

// steppedTicks returns the ticks at multiples of a readable step, or
// false when floating point cannot place them distinctly in [lo, hi].
func steppedTicks(lo, hi float64) ([]plot.Tick, bool) {
	span := hi - lo
	if !finite(span) {
		return nil, false
	}
	mag := math.Pow(10, math.Floor(log10(span/8)))
	var step, minor float64
	per := 2 // unlabelled intervals per labelled step
	for _, m := range []float64{1, 2, 5, 10} {
		step = m * mag
		if span/step <= 8 {
			minor = step / 2
			if m == 5 {
				minor, per = step/5, 5
			}
			break
		}
	}
	if !(minor > 0) || !finite(step) {
		return nil, false
	}
	first := math.Ceil(lo/minor - 1e-9)
	last := math.Floor(hi/minor + 1e-9)
	// Tick k is k·minor. Beyond 2^52 consecutive k are no longer
	// distinct floats, and the count bounds the loop whatever rounding did.
	const exact = 1 << 52
	if !(first <= last) || last-first+1 > maxTicks || math.Abs(first) > exact || math.Abs(last) > exact {
		return nil, false
	}
	n := int(last-first) + 1
	ticks := make([]plot.Tick, 0, n)
	seen := make(map[string]bool, n)
	format := labelFormat(step, math.Max(math.Abs(lo), math.Abs(hi)))
	for i := 0; i < n; i++ {
		k := first + float64(i)
		v := k * minor
		if math.Abs(v) < minor*1e-9 {
			v = 0
		}
		v = math.Min(math.Max(v, lo), hi)
		if len(ticks) > 0 && !(v > ticks[len(ticks)-1].Value) {
			return nil, false
		}
		t := plot.Tick{Value: v}
		// k is an exact integer, so whether the tick falls on a labelled
		// step does not depend on rounding v.
		if math.Mod(k, float64(per)) == 0 {
			t.Label = format(v)
			if seen[t.Label] {
				return nil, false
			}
			seen[t.Label] = true
		}
		ticks = append(ticks, t)
	}
	if len(seen) < 2 {
		return nil, false
	}
	return ticks, true
}

// labelFormat returns the function that writes the labels of ticks at
// the given step for values up to size in magnitude: in full with as
// many decimals as the step needs, or in exponent form with as many
// significant digits as the step needs when that would be long.
func labelFormat(step, size float64) func(float64) string {
	digits := max(0, -int(math.Floor(log10(step)+1e-9)))
	if digits <= maxFixedDigits && size < math.Pow(10, maxFixedDigits) {
		return func(v float64) string { return withMinus(strconv.FormatFloat(v, 'f', digits, 64)) }
	}
	sig := min(17, max(1, int(math.Ceil(log10(size/step)))+1))
	return func(v float64) string { return withMinus(strconv.FormatFloat(v, 'g', sig, 64)) }
}

// endTicks labels lo and hi alone, each with the shortest decimal that
// reads back as it, which tells two distinct floats apart.
func endTicks(lo, hi float64) []plot.Tick {
	return []plot.Tick{
		{Value: lo, Label: withMinus(strconv.FormatFloat(lo, 'g', -1, 64))},
		{Value: hi, Label: withMinus(strconv.FormatFloat(hi, 'g', -1, 64))},
	}
}

// withMinus writes every minus sign, of the number and of its exponent,
// as the true minus.
func withMinus(s string) string { return strings.ReplaceAll(s, "-", "−") }

// log10 is math.Log10 for x > 0, also below the normal range, where
// math.Log10 is far off on some machines (on amd64, log10 of 1.25e-321
// comes out near −308): there the binary logarithm, which takes the
// exponent apart exactly, is scaled instead.
func log10(x float64) float64 {
	if x >= 0x1p-1022 {
		return math.Log10(x)
	}
	return math.Log2(x) * (math.Ln2 / math.Ln10)
}
