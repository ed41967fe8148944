// Package dpartition finds the edges of the stability regions of a loop in
// the plane of two parameters without a grid: the D-partition
// (D-decomposition) of Yu. I. Neimark (1948; survey: E. N. Gryazina and
// B. T. Polyak, Automatica 42, 2006), traced in frequency.
//
// The input is a characteristic function bilinear in the two axis
// parameters x and y,
//
//	Δ(s; x, y) = P(s; x, y) + Q(s; x, y)·e^(−L·s),
//	P = Pa + x·Pb + y·Pc + x·y·Pe, Q likewise,
//
// over a window of the plane (Problem). A root of Δ reaches the imaginary
// axis only on three kinds of edge:
//
//   - Real: Δ(0; x, y) = 0, a line or hyperbola, ω = 0;
//   - Complex: Re Δ(jω) = 0 and Im Δ(jω) = 0 for some ω > 0, two equations
//     in (x, y) solved for each ω, so that each point of the curve is
//     computed from its ω;
//   - Infinite: the leading coefficient of P vanishes, where a root passes
//     through infinity; for a neutral loop (deg Q = deg P), where
//     |q_n/p_n| = 1 and a whole chain of roots crosses.
//
// Edges returns them all as polylines, each with the side that has fewer
// right-half-plane roots and the number of roots that cross; Crossings
// does the same along one parameter. For a loop without dead time the
// complex edge is found exactly (every critical frequency is a root of a
// polynomial formed exactly), so no branch or island is missed however
// small; for a loop with dead time, ω is swept with step control up to a
// proven bound above which no edge can meet the window.
package dpartition
