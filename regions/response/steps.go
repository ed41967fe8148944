package response

// interconnect is the loop opened at the dead time: plant and controller
// realised apart in controllable canonical form and joined, with state
// x = (plant, controller), inputs w (the delayed plant input), r and d:
//
//	x' = A·x + bw·w + br·r,   y = cy·x,   u = cu·x + du·r,   v = u + d
//
// and the loop closed through w(t) = v(t − L). The plant must be
// strictly proper and the controller proper, so that v does not depend on
// w directly: the loop is then of retarded type and w is continuous
// after t = L.
type interconnect struct {
	n              int
	a              []float64
	bw, br, cy, cu []float64
	du             float64
}

func newInterconnect(l Loop) interconnect {
	d, dc := trimmed(l.PlantDen), trimmed(l.CtrlDen)
	plant, ctrl := split(l.PlantNum, d), split(l.CtrlNum, dc)
	ap, ac := companion(monic(d)), companion(monic(dc))
	np, nc := len(d)-1, len(dc)-1
	n := np + nc
	s := interconnect{n: n, a: make([]float64, n*n), bw: make([]float64, n), br: make([]float64, n),
		cy: make([]float64, n), cu: make([]float64, n), du: ctrl.d}
	for i := 0; i < np; i++ {
		copy(s.a[i*n:i*n+np], ap[i*np:(i+1)*np])
	}
	for i := 0; i < nc; i++ {
		copy(s.a[(np+i)*n+np:(np+i+1)*n], ac[i*nc:(i+1)*nc])
	}
	// e = r − cy·x enters the last controller state.
	if nc > 0 {
		for j := 0; j < np; j++ {
			s.a[(n-1)*n+j] = -plant.c[j]
		}
		s.br[n-1] = 1
	}
	s.bw[np-1] = 1
	for j := 0; j < np; j++ {
		s.cy[j] = plant.c[j]
		s.cu[j] = -ctrl.d * plant.c[j]
	}
	copy(s.cu[np:], ctrl.c)
	scale := balance(s.a, n)
	for i := range scale {
		s.bw[i] /= scale[i]
		s.br[i] /= scale[i]
		s.cy[i] *= scale[i]
		s.cu[i] *= scale[i]
	}
	return s
}

// delayRun is the method of steps for one step input (r, d) with the
// time step h = L/m. On each step [t_k, t_k + h] the delayed input w is
// v one delay earlier, on step k − m, which is already known; it is
// taken as the Hermite cubic through the values and one-sided slopes of
// v at the ends of that step (exact from the states there), and the
// state, together with ∫y, is carried over the step exactly for that
// cubic by one exponential of the augmented matrix
//
//	[[A·h, bw·h, 0, 0, 0, br·h, 0], chain ξ₀' = ξ₁, ξ₁' = ξ₂, ξ₂' = ξ₃, 0, 0, [cy·h, 0 …]]
//
// in the unit time θ = (t − t_k)/h (Van Loan, IEEE TAC 23, 1978). The
// error is that of the cubic, O(h⁴) globally; the discontinuities of v
// and its derivatives fall at multiples of L, which are sample times.
type delayRun struct {
	s      interconnect
	m      int
	h      float64
	r, d   float64
	aug    []float64
	step   []float64 // e^(aug)
	xs     []float64 // states, (N+1)×n
	v      []float64 // v(t_k), the value just after t_k at k = 0
	vdR    []float64 // v' just after t_k
	vdL    []float64 // v' just before t_k
	wR, wL []float64 // w just after and before t_k
	run    []float64 // ∫₀^{t_k} y
	deriv  []float64 // scratch of derivative
}

const augExtra = 6 // ξ₀ … ξ₃, r, ∫y

func newDelayRun(s interconnect, m int, h, r, d float64, steps int) *delayRun {
	n := s.n
	k := n + augExtra
	aug := make([]float64, k*k)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			aug[i*k+j] = s.a[i*n+j] * h
		}
		aug[i*k+n] = s.bw[i] * h
		aug[i*k+n+4] = s.br[i] * h
		aug[(n+5)*k+i] = s.cy[i] * h
	}
	for j := 0; j < 3; j++ {
		aug[(n+j)*k+n+j+1] = 1
	}
	dr := &delayRun{s: s, m: m, h: h, r: r, d: d, aug: aug, step: expm(aug, k, 1),
		xs: make([]float64, (steps+1)*n), v: make([]float64, steps+1), vdR: make([]float64, steps+1),
		vdL: make([]float64, steps+1), wR: make([]float64, steps+1), wL: make([]float64, steps+1),
		run: make([]float64, steps+1), deriv: make([]float64, n)}
	dr.march(steps)
	return dr
}

func (dr *delayRun) state(k int) []float64 { return dr.xs[k*dr.s.n : (k+1)*dr.s.n] }

// derivative returns A·x + bw·w + br·r, in storage it reuses.
func (dr *delayRun) derivative(x []float64, w float64) []float64 {
	n := dr.s.n
	f := dr.deriv
	for i := 0; i < n; i++ {
		f[i] = dot(dr.s.a[i*n:(i+1)*n], x) + dr.s.bw[i]*w + dr.s.br[i]*dr.r
	}
	return f
}

// input returns the augmented input (a₀, a₁, 2a₂, 6a₃) of step k: the
// Hermite cubic a₀ + a₁θ + a₂θ² + a₃θ³ of w, zero before the delay.
func (dr *delayRun) input(k int) [4]float64 {
	j := k - dr.m
	if j < 0 {
		return [4]float64{}
	}
	p0, p1 := dr.v[j], dr.v[j+1]
	m0, m1 := dr.h*dr.vdR[j], dr.h*dr.vdL[j+1]
	return [4]float64{p0, m0, 2 * (3*(p1-p0) - 2*m0 - m1), 6 * (2*(p0-p1) + m0 + m1)}
}

// march fills the samples.
func (dr *delayRun) march(steps int) {
	n, k := dr.s.n, dr.s.n+augExtra
	z := make([]float64, k)
	for i := 0; i <= steps; i++ {
		x := dr.state(i)
		if j := i - dr.m; j >= 0 {
			dr.wR[i], dr.wL[i] = dr.v[j], dr.v[j]
			if j == 0 {
				dr.wL[i] = 0
			}
		}
		dr.v[i] = dot(dr.s.cu, x) + dr.s.du*dr.r + dr.d
		dr.vdR[i] = dot(dr.s.cu, dr.derivative(x, dr.wR[i]))
		if i > 0 {
			dr.vdL[i] = dot(dr.s.cu, dr.derivative(x, dr.wL[i]))
		}
		if i == steps {
			break
		}
		copy(z, x)
		in := dr.input(i)
		copy(z[n:n+4], in[:])
		z[n+4], z[n+5] = dr.r, 0
		next := dr.xs[(i+1)*n : (i+2)*n]
		for r := 0; r < n; r++ {
			next[r] = dot(dr.step[r*k:(r+1)*k], z)
		}
		dr.run[i+1] = dr.run[i] + dot(dr.step[(n+5)*k:(n+6)*k], z)
	}
}

// at returns the state, w and ∫ from t_k of y at t_k + θ·h.
func (dr *delayRun) at(k int, theta float64) (x []float64, w, q float64) {
	n, kk := dr.s.n, dr.s.n+augExtra
	e := expm(dr.aug, kk, theta)
	z := make([]float64, kk)
	copy(z, dr.state(k))
	in := dr.input(k)
	copy(z[n:n+4], in[:])
	z[n+4] = dr.r
	x = make([]float64, n)
	for r := 0; r < n; r++ {
		x[r] = dot(e[r*kk:(r+1)*kk], z)
	}
	w = in[0] + theta*(in[1]+theta*(in[2]/2+theta*in[3]/6))
	return x, w, dot(e[(n+5)*kk:(n+6)*kk], z)
}

// outputWave returns the wave of y.
func (dr *delayRun) outputWave() wave {
	n := len(dr.v)
	w := wave{h: dr.h, v: make([]float64, n), sR: make([]float64, n), sL: make([]float64, n), run: dr.run}
	for k := range w.v {
		x := dr.state(k)
		w.v[k] = dot(dr.s.cy, x)
		w.sR[k] = dot(dr.s.cy, dr.derivative(x, dr.wR[k]))
		w.sL[k] = dot(dr.s.cy, dr.derivative(x, dr.wL[k]))
	}
	w.at = func(k int, theta float64) (float64, float64, float64) {
		x, wt, q := dr.at(k, theta)
		return dot(dr.s.cy, x), dot(dr.s.cy, dr.derivative(x, wt)), dr.run[k] + q
	}
	return w.shaped()
}

// control returns u at the samples.
func (dr *delayRun) control() []float64 {
	u := make([]float64, len(dr.v))
	for k := range u {
		u[k] = dot(dr.s.cu, dr.state(k)) + dr.s.du*dr.r
	}
	return u
}

// delayed computes the responses of a dead-time loop by the method of
// steps.
func (p *plan) delayed(l Loop) (*Result, error) {
	s := newInterconnect(l)
	set := newDelayRun(s, p.steps, p.span.Step, 1, 0, p.span.Samples)
	load := newDelayRun(s, p.steps, p.span.Step, 0, 1, p.span.Samples)
	return p.result(set.outputWave(), load.outputWave(), set.control(), nil), nil
}
