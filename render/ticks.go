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
type readableTicks struct{}

// Ticks returns the ticks for the range [lo, hi].
func (readableTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || !finite(lo) || !finite(hi) {
		return nil
	}
	span := hi - lo
	mag := math.Pow(10, math.Floor(math.Log10(span/8)))
	var step, minor float64
	for _, m := range []float64{1, 2, 5, 10} {
		step = m * mag
		if span/step <= 8 {
			minor = step / 2
			if m == 5 {
				minor = step / 5
			}
			break
		}
	}
	digits := max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	var ticks []plot.Tick
	first := math.Ceil(lo/minor - 1e-9)
	for k := first; k*minor <= hi+minor*1e-9; k++ {
		v := k * minor
		if math.Abs(v) < minor*1e-9 {
			v = 0
		}
		t := plot.Tick{Value: v}
		if r := v / step; math.Abs(r-math.Round(r)) < 1e-6 {
			t.Label = strings.Replace(strconv.FormatFloat(v, 'f', digits, 64), "-", "−", 1)
		}
		ticks = append(ticks, t)
	}
	return ticks
}
