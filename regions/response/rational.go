package response

import (
	"gainscape/regions/poly"
)

// shared is the one state trajectory behind every response of a loop
// without dead time: x' = A·x + b·1 (or x_{k+1} = A·x_k + b in z), x(0)
// = 0, A the companion matrix of the characteristic polynomial Δ made
// monic, balanced by an exact diagonal scaling. Each closed-loop transfer
// function M/Δ is an output d + c·x of it, since all share Δ: this is the
// controllable canonical realisation of the closed loop, which needs no
// realisation of the controller alone and so also serves controllers
// with more zeros than poles.
type shared struct {
	n     int
	a     []float64 // monic Δ
	m     []float64 // balanced A, n×n
	scale []float64 // D of the balancing: x = D·x_balanced
	xs    []float64 // states at the samples, (N+1)×n
	steps int       // N
}

// newShared returns the realisation of Δ (trimmed, degree n ≥ 0).
func newShared(delta poly.Poly) *shared {
	a := monic(delta)
	n := len(a) - 1
	m := companion(a)
	return &shared{n: n, a: a, m: m, scale: balance(m, n)}
}

// b returns the balanced input vector D⁻¹·(0, …, 0, 1).
func (s *shared) b() []float64 {
	b := make([]float64, s.n)
	if s.n > 0 {
		b[s.n-1] = 1 / s.scale[s.n-1]
	}
	return b
}

// state returns the state at sample k (shares storage).
func (s *shared) state(k int) []float64 { return s.xs[k*s.n : (k+1)*s.n] }

// output is one transfer function M/Δ read from the shared state:
// value d + c·x, slope ca·x + cb, running integral f·t + w·x.
type output struct {
	c, ca, w []float64
	d, cb, f float64
	impulse  []float64
}

// output returns the balanced output for numerator m.
func (s *shared) output(m poly.Poly, delta poly.Poly) output {
	p := split(m, delta)
	w, f := antiderivative(p.c, s.a, p.d)
	for j := range p.c {
		p.c[j] *= s.scale[j]
		w[j] *= s.scale[j]
	}
	return output{c: p.c, ca: rowTimes(p.c, s.m), w: w, d: p.d, cb: dot(p.c, s.b()), f: f, impulse: p.impulse}
}

// continuous runs the trajectory over the span: Φ = e^(A·h) and
// Γ = ∫₀ʰ e^(Aτ)·b dτ from the exponential of the augmented matrix
// [[A, b], [0, 0]]·h (Van Loan, IEEE TAC 23, 1978), and x_{k+1} = Φ·x_k + Γ,
// exact at the samples for the constant input of a step. It returns the
// evaluator of the state at t_k + θ·h, which takes one exponential of
// the augmented matrix per call.
func (s *shared) continuous(sp Span) func(k int, theta float64) []float64 {
	n := s.n
	aug := make([]float64, (n+1)*(n+1))
	b := s.b()
	for i := 0; i < n; i++ {
		copy(aug[i*(n+1):i*(n+1)+n], s.m[i*n:(i+1)*n])
		aug[i*(n+1)+n] = b[i]
	}
	e := expm(aug, n+1, sp.Step)
	phi, gamma := make([]float64, n*n), make([]float64, n)
	for i := 0; i < n; i++ {
		copy(phi[i*n:(i+1)*n], e[i*(n+1):i*(n+1)+n])
		gamma[i] = e[i*(n+1)+n]
	}
	s.march(sp.Samples, phi, gamma)

	lastK, lastTheta := -1, 0.0
	x := make([]float64, n)
	return func(k int, theta float64) []float64 {
		if k == lastK && theta == lastTheta {
			return x
		}
		e := expm(aug, n+1, theta*sp.Step)
		xk := s.state(k)
		for i := 0; i < n; i++ {
			row := e[i*(n+1) : (i+1)*(n+1)]
			x[i] = dot(row[:n], xk) + row[n]
		}
		lastK, lastTheta = k, theta
		return x
	}
}

// march fills the states x_0 = 0, x_{k+1} = Φ·x_k + Γ for k < steps.
func (s *shared) march(steps int, phi, gamma []float64) {
	n := s.n
	s.steps = steps
	s.xs = make([]float64, (steps+1)*n)
	for k := 0; k < steps; k++ {
		x, next := s.state(k), s.xs[(k+1)*n:(k+2)*n]
		for i := 0; i < n; i++ {
			next[i] = dot(phi[i*n:(i+1)*n], x) + gamma[i]
		}
	}
}

// values returns o at every sample.
func (s *shared) values(o output) []float64 {
	v := make([]float64, s.steps+1)
	for k := range v {
		v[k] = o.d + dot(o.c, s.state(k))
	}
	return v
}

// wave returns the continuous wave of o on the span, evaluating between
// samples through state.
func (s *shared) wave(o output, sp Span, state func(int, float64) []float64) wave {
	v := s.values(o)
	w := wave{h: sp.Step, v: v, sR: make([]float64, len(v)), run: make([]float64, len(v))}
	for k := range v {
		x := s.state(k)
		w.sR[k] = dot(o.ca, x) + o.cb
		w.run[k] = o.f*float64(k)*sp.Step + dot(o.w, x)
	}
	w.sL = w.sR
	w.at = func(k int, theta float64) (float64, float64, float64) {
		x := state(k, theta)
		return o.d + dot(o.c, x), dot(o.ca, x) + o.cb, o.f*(float64(k)+theta)*sp.Step + dot(o.w, x)
	}
	return w.shaped()
}
