package main

import (
	"fmt"
	"io"
	"math"
	"strings"

	"gainscape/regions/export"
	"gainscape/regions/study"
)

// shownCrossovers is how many phase crossovers of a loop with dead time
// the text report shows; the delay makes one per 2π/L of frequency.
const shownCrossovers = 3

// maxPade is the highest order --pade takes (delay.MaxPadeOrder).
const maxPade = 30

// padeFlag checks the value of --pade.
func padeFlag(n int) error {
	if n < 0 || n > maxPade {
		return userErr("--pade %d: give an order from 1 to %d, or 0 to have it chosen", n, maxPade)
	}
	return nil
}

// infinitelyMany is the count the stability test gives a loop with
// infinitely many roots in the right half plane (delay.InfinitelyMany).
const infinitelyMany = math.MaxInt32

// countText writes a count of roots.
func countText(n int) string {
	if n == infinitelyMany {
		return "infinitely many"
	}
	return fmt.Sprint(n)
}

// printDelayWorking writes the characteristic function of a loop with
// dead time and the working of its count, band by band.
func printDelayWorking(w io.Writer, r *export.Probe, u study.Units) {
	fmt.Fprintf(w, "closed loop  Δ(s) = P(s) + Q(s)·e^(−L·s), L = %g %s (dead time), a quasi-polynomial\n", r.Delay, u.TimeLabel())
	fmt.Fprintf(w, "             P(s) = %s\n", polyText(r.Characteristic))
	fmt.Fprintf(w, "             Q(s) = %s\n\n", polyText(r.Delayed))
	fmt.Fprintf(w, "Count (%s):\n", r.CountFrom)
	for _, row := range r.Working {
		fmt.Fprintf(w, "  %-28s │ %s\n", row.Label, strings.Join(row.Entries, "; "))
	}
	for _, n := range r.TestNotes {
		fmt.Fprintf(w, "  %s\n", n)
	}
	if r.Neutral != nil {
		fmt.Fprintf(w, "  %s\n", r.Neutral.Note)
	}
}
