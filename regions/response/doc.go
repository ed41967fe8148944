// Package response computes the closed-loop step responses of one design
// point of a unity negative-feedback loop, the response y, control u and
// error e to a unit setpoint step and to a unit load step at the plant
// input, and the design figures read from them: overshoot, undershoot,
// rise and settling times, final values, and for the load step the
// integrated error IE, the integrated absolute error IAE and the peak
// deviation.
//
// The entry point is Step; Window gives the time window alone. A loop
// that is not asymptotically stable is refused (ErrUnstable), and so is
// one whose stability rounding could decide (ErrUndecided): the
// responses of an unstable loop are not design figures.
//
// # Loops without dead time
//
// All closed-loop transfer functions share the denominator
// Δ = Dc·D + Nc·N, so one state trajectory serves every response: the
// controllable canonical realisation x' = A·x + b of 1/Δ (A the
// companion matrix of Δ made monic, balanced by an exact diagonal
// scaling by powers of two; Parlett & Reinsch, Numer. Math. 13, 1969),
// driven by the unit step from x(0) = 0. Each response is an output
// d + c·x with d and c from the long division of its numerator by Δ.
// No realisation of the controller alone is needed, so biproper
// controllers and the ideal derivative (more zeros than poles) are
// served alike: a numerator of higher degree than Δ puts impulses into
// the response, which is allowed for u (Trace.ControlImpulse holds their
// weights, Control the regular part) and refused for y and e.
//
// At the samples t_k = k·h the response is exact: x_{k+1} = Φ·x_k + Γ
// with Φ = e^(A·h) and Γ = ∫₀ʰ e^(Aτ)·b dτ from one exponential of the
// augmented matrix [[A, b], [0, 0]]·h (Van Loan, IEEE TAC 23, 1978). The
// exponential is a scaling and squaring carried out on e^X − I (see
// expm), which keeps the slow modes of stiff loops to full relative
// accuracy: with poles 1e12 apart, squaring e^X itself loses seven
// digits. The accuracy is that of rounding in the exponential and the
// recurrence: within 2e-14 of the response's size in the tests, from
// first order to degree 20 and for gains from 1e-12 to 1e12, against
// closed forms, partial fractions and a Runge–Kutta integration.
//
// Integrals are exact too: ∫₀ᵗ(d + c·x) = f·t + w·x(t), with f the final
// value and w from the numerator of (H(s) − H(0))/s, formed from the
// coefficients. IAE cuts the window at every sample and at every sign
// change of e and adds the magnitudes of the exact integrals of the
// pieces.
//
// Crossings and extrema between samples (the 10% and 90% levels, the
// edges of the settling band, the peaks, the sign changes of e) are
// bracketed by the Hermite cubic through the sampled values and exact
// slopes, and refined to rounding with the exact state at t_k + θ·h, one
// exponential of the augmented matrix per evaluation. A pair of
// crossings or an extremum that neither the samples nor the cubic show
// within one step is missed: the window rule puts 20 samples in each
// period of the fastest visible oscillation to make that unlikely.
//
// # Sampled-data loops
//
// With Loop.Period = T > 0 the polynomials are in z and the same
// realisation is a difference equation, x_{k+1} = A·x_k + b, exact at
// the sample instants. A controller or plant that would look ahead in
// time (more zeros than poles) is refused. The figures are read from the
// samples as they are: a level is reached at the first sample at or
// beyond it, the settling time is the first sample from which all stay in
// the band, IE = T·Σ_{k<N} e_k and IAE = T·Σ_{k<N} |e_k| (the error held
// over each period). Stability is the sign array of the image of Δ under
// z = (1 + w)/(1 − w).
//
// # Dead time
//
// With Loop.Delay = L > 0 the loop is a delay differential equation,
// which has no exact matrix-exponential solution. Step uses the method
// of steps: plant and controller are realised apart and joined, with the
// delayed plant input w(t) = v(t − L) as an input; the step h divides L,
// so w on each step is v on a step already computed, taken as the
// Hermite cubic through its values and one-sided slopes there, and the
// state and ∫y are carried exactly over the step for that cubic by one
// exponential of an augmented matrix. The error is O(h⁴) (the tests
// show a factor 16 per halving of h and agree with a Runge–Kutta
// integration to 1e-14). The plant must be strictly proper and the
// controller proper, so that the loop is of retarded type; otherwise
// impulses or jumps would travel around the loop at every multiple of L,
// and Step refuses it.
//
// Stability and the window of a dead-time loop come from a Padé
// approximant of e^(−Ls), of the least order whose error stays within
// 1e-6 for ω·L up to twice the larger of the frequency where |C·G(jω)|
// falls below 0.1 and the largest pole or zero of C·G: the roots of its
// characteristic polynomial (gonum eigenvalues) are starting points for
// Newton's method on the exact quasi-polynomial Dc·D + Nc·N·e^(−Ls),
// and the refined roots are Result.Poles. A refined root in the right
// half plane proves instability; stability rests on the roots of a
// retarded loop in the right half plane lying where |C·G(s)| ≥ 1, inside
// the range of the approximant, and on its roots beyond that range lying
// in the left half plane (recalled): it is not a proof. The chain of
// roots a dead time adds at high frequency counts in the window rule as
// far as the approximant reaches, so lightly damped dead-time loops often
// get many samples. A dead time shorter than one step of the window is
// taken by its Padé approximant (order for an error within 1e-10)
// throughout, with the sign array for stability, and Result.Method says
// so.
package response
