// Package margins gives the "how stable and how robust" figures of one
// design point of a unity negative-feedback loop: closed-loop poles, decay
// rate and least damping; gain and phase margins with their crossover
// frequencies; the peaks Ms and Mt of the sensitivity and complementary
// sensitivity functions; the ultimate gain and period of the
// proportional-only loop, and the classical tuning rules built on them.
//
// Conventions:
//
//   - Polynomials are poly.Poly, ascending powers.
//   - The open loop is L(s) = Nc·N / (Dc·D) (see Loop); the closed loop is
//     stable when every root of Dc·D + Nc·N is in the open left half plane.
//   - Frequencies are in rad/s, phase margins in degrees, gain margins as
//     plain factors (DB converts to decibels).
//   - "Infinite" figures (a gain margin with no phase crossover, a phase
//     margin with no gain crossover) are math.Inf(1); a frequency that does
//     not exist is math.NaN(). Neither can be written by encoding/json:
//     Finite tells them apart and Nullable turns them into a nil pointer,
//     which encodes as null. Margins implements json.Marshaler that way.
//
// The decay rate of one design point is DecayRate(Poles(p)), from gonum's
// eigenvalues; over a whole map, package overlay finds it without
// allocating by bisection on the sign array of the shifted polynomial.
// For per-node map overlays of Ms there is MsEvaluator, built once per
// grid of frequencies.
package margins
