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

// deadTimeLines are the lines a map of a loop with dead time adds to the
// summary and the note, each a short label and its text.
func deadTimeLines(res *study.MapResult) [][2]string {
	if res.Delay == 0 {
		return nil
	}
	u := res.Units
	out := [][2]string{{"dead time", fmt.Sprintf("L = %g %s: counts from the quasi-polynomial itself (argument principle along the imaginary axis)", res.Delay, u.TimeLabel())}}
	later := 0
	for _, bs := range res.Branches {
		for _, b := range bs {
			if b > 0 {
				later++
				break
			}
		}
	}
	if later > 0 {
		out = append(out, [2]string{"branches", fmt.Sprintf("%d complex-pair edges lie on D-partition branches beyond the first (the Nyquist curve has turned once more before it passes −1); marked with diamonds", later)})
	}
	if res.NeutralNodes > 0 {
		out = append(out, [2]string{"neutral", fmt.Sprintf("%d nodes have infinitely many roots in the right half plane: neutral type with |lim L(s)| ≥ 1 as s → ∞ (for an ideal derivative, |kd·lim s·G(s)| ≥ 1)", res.NeutralNodes)})
	}
	if c := res.Confirmation; c != nil {
		text := fmt.Sprintf("the count of %d of %d regions agrees with a second method at one node each (%s)", c.Confirmed, c.Regions, c.Method)
		out = append(out, [2]string{"confirmed", text})
		for _, d := range c.Disagree {
			out = append(out, [2]string{"DISAGREE", fmt.Sprintf("at (%s, %s) = (%.6g, %.6g) the map counts %s roots in the right half plane, the second method %d", res.X.Param, res.Y.Param, d.Point[0], d.Point[1], countText(d.Count), d.Other)})
		}
		for _, d := range c.Unconfirmed {
			out = append(out, [2]string{"unconfirmed", fmt.Sprintf("at (%.6g, %.6g), count %s: %s", d.Point[0], d.Point[1], countText(d.Count), d.Reason)})
		}
	}
	if p := res.Pade; p != nil {
		out = append(out, [2]string{"Padé", p.Note})
	}
	return out
}
