package family

// Proportional is C(s) = kp.
type Proportional struct{}

// Name implements Family.
func (Proportional) Name() string { return "p" }

// Formula implements Family.
func (Proportional) Formula() string { return "C(s) = kp" }

// Params implements Family.
func (Proportional) Params() []Param {
	return []Param{{"kp", 1, "proportional gain"}}
}

// Transfer implements Family.
func (Proportional) Transfer() Transfer {
	const kp = 0
	return Transfer{Num: []Form{{Times(1, kp)}}, Den: []Form{{Const(1)}}}
}

// ProportionalIntegral is C(s) = kp + ki/s = (kp·s + ki)/s.
type ProportionalIntegral struct{}

// Name implements Family.
func (ProportionalIntegral) Name() string { return "pi" }

// Formula implements Family.
func (ProportionalIntegral) Formula() string { return "C(s) = kp + ki/s" }

// Params implements Family.
func (ProportionalIntegral) Params() []Param {
	return []Param{{"kp", 1, "proportional gain"}, {"ki", 0, "integral gain"}}
}

// Transfer implements Family.
func (ProportionalIntegral) Transfer() Transfer {
	const kp, ki = 0, 1
	return Transfer{
		Num: []Form{{Times(1, ki)}, {Times(1, kp)}},
		Den: []Form{nil, {Const(1)}},
	}
}

// ProportionalDerivative is the ideal C(s) = kp + kd·s.
type ProportionalDerivative struct{}

// Name implements Family.
func (ProportionalDerivative) Name() string { return "pd" }

// Formula implements Family.
func (ProportionalDerivative) Formula() string { return "C(s) = kp + kd·s" }

// Params implements Family.
func (ProportionalDerivative) Params() []Param {
	return []Param{{"kp", 1, "proportional gain"}, {"kd", 0, "derivative gain"}}
}

// Transfer implements Family.
func (ProportionalDerivative) Transfer() Transfer {
	const kp, kd = 0, 1
	return Transfer{Num: []Form{{Times(1, kp)}, {Times(1, kd)}}, Den: []Form{{Const(1)}}}
}

// PID is C(s) = kp + ki/s + kd·s/(tau·s + 1); tau = 0 is the ideal
// derivative. Over a common denominator:
//
//	C(s) = ((kp·tau + kd)·s² + (kp + ki·tau)·s + ki) / (tau·s² + s)
//
// Each coefficient is affine in each parameter alone, as Family requires.
type PID struct{}

// Name implements Family.
func (PID) Name() string { return "pid" }

// Formula implements Family.
func (PID) Formula() string { return "C(s) = kp + ki/s + kd·s/(tau·s+1)" }

// Params implements Family.
func (PID) Params() []Param {
	return []Param{
		{"kp", 1, "proportional gain"},
		{"ki", 0, "integral gain"},
		{"kd", 0, "derivative gain"},
		{"tau", 0, "derivative filter time constant (0 = ideal derivative)"},
	}
}

// Transfer implements Family.
func (PID) Transfer() Transfer {
	const kp, ki, kd, tau = 0, 1, 2, 3
	return Transfer{
		Num: []Form{{Times(1, ki)}, {Times(1, kp), Times(1, ki, tau)}, {Times(1, kp, tau), Times(1, kd)}},
		Den: []Form{nil, {Const(1)}, {Times(1, tau)}},
	}
}

// FirstOrderCompensator is C(s) = k·(s + z)/(s + p). It is called a lead
// when z < p and a lag when z > p; the two names are offered so that
// scenario files read naturally, and share one formula.
type FirstOrderCompensator struct {
	name string
}

// Name implements Family.
func (f FirstOrderCompensator) Name() string { return f.name }

// Formula implements Family.
func (FirstOrderCompensator) Formula() string { return "C(s) = k·(s+z)/(s+p)" }

// Params implements Family.
func (f FirstOrderCompensator) Params() []Param {
	if f.name == "lag" {
		return []Param{{"k", 1, "gain"}, {"z", 1, "zero location (s = -z)"}, {"p", 0.1, "pole location (s = -p)"}}
	}
	return []Param{{"k", 1, "gain"}, {"z", 1, "zero location (s = -z)"}, {"p", 10, "pole location (s = -p)"}}
}

// Transfer implements Family.
func (FirstOrderCompensator) Transfer() Transfer {
	const k, z, p = 0, 1, 2
	return Transfer{
		Num: []Form{{Times(1, k, z)}, {Times(1, k)}},
		Den: []Form{{Times(1, p)}, {Const(1)}},
	}
}

// LeadLag is C(s) = k·(s + z1)(s + z2)/((s + p1)(s + p2)).
type LeadLag struct{}

// Name implements Family.
func (LeadLag) Name() string { return "leadlag" }

// Formula implements Family.
func (LeadLag) Formula() string { return "C(s) = k·(s+z1)(s+z2)/((s+p1)(s+p2))" }

// Params implements Family.
func (LeadLag) Params() []Param {
	return []Param{
		{"k", 1, "gain"},
		{"z1", 1, "lead zero (s = -z1)"},
		{"p1", 10, "lead pole (s = -p1)"},
		{"z2", 0.1, "lag zero (s = -z2)"},
		{"p2", 0.01, "lag pole (s = -p2)"},
	}
}

// Transfer implements Family.
func (LeadLag) Transfer() Transfer {
	const k, z1, p1, z2, p2 = 0, 1, 2, 3, 4
	return Transfer{
		Num: []Form{{Times(1, k, z1, z2)}, {Times(1, k, z1), Times(1, k, z2)}, {Times(1, k)}},
		Den: []Form{{Times(1, p1, p2)}, {Times(1, p1), Times(1, p2)}, {Const(1)}},
	}
}
