package margins

// Rule is one controller tuning from a published rule, in the parallel
// form C(s) = Kp + Ki/s + Kd·s used by the "p", "pi" and "pid" families
// (Ki = Kp/Ti, Kd = Kp·Td from the rule's Kc, Ti, Td).
type Rule struct {
	// Name names the rule and the structure, e.g. "Ziegler-Nichols PI".
	Name string
	// Source cites where the constants come from.
	Source string
	// Family is the controller family the gains are for: "p", "pi" or
	// "pid" (family.Lookup names).
	Family string
	// Kp, Ki, Kd are the parallel-form gains; zero when the structure
	// lacks the term.
	Kp, Ki, Kd float64
}

// Sources of the ultimate-cycle rules. The constants below are those the
// papers are commonly reproduced with in textbooks (common practice);
// they were not transcribed from the papers here.
const (
	sourceZN = `J. G. Ziegler and N. B. Nichols, "Optimum settings for automatic controllers", Trans. ASME 64, 1942 (ultimate-sensitivity method)`
	sourceTL = `B. D. Tyreus and W. L. Luyben, "Tuning PI controllers for integrator/dead time processes", Ind. Eng. Chem. Res. 31, 1992`
)

// UltimateCycleRules returns the classical tunings computed from the
// ultimate gain ku and ultimate period tu (see Ultimate):
//
//	Ziegler-Nichols P:    Kc = 0.5·Ku
//	Ziegler-Nichols PI:   Kc = 0.45·Ku,  Ti = Tu/1.2
//	Ziegler-Nichols PID:  Kc = 0.6·Ku,   Ti = Tu/2,    Td = Tu/8
//	Tyreus-Luyben PI:     Kc = Ku/3.2,   Ti = 2.2·Tu
//	Tyreus-Luyben PID:    Kc = Ku/2.2,   Ti = 2.2·Tu,  Td = Tu/6.3
//
// The constants are those commonly reproduced from the cited papers (see
// Rule.Source). The
// PID rules were stated for the series ("interacting") or ideal form of
// the time; they are converted here as the ideal form,
// Ki = Kc/Ti and Kd = Kc·Td, as textbooks commonly do.
func UltimateCycleRules(ku, tu float64) []Rule {
	pi := func(name, src string, kc, ti float64) Rule {
		return Rule{Name: name, Source: src, Family: "pi", Kp: kc, Ki: kc / ti}
	}
	pid := func(name, src string, kc, ti, td float64) Rule {
		return Rule{Name: name, Source: src, Family: "pid", Kp: kc, Ki: kc / ti, Kd: kc * td}
	}
	return []Rule{
		{Name: "Ziegler-Nichols P", Source: sourceZN, Family: "p", Kp: 0.5 * ku},
		pi("Ziegler-Nichols PI", sourceZN, 0.45*ku, tu/1.2),
		pid("Ziegler-Nichols PID", sourceZN, 0.6*ku, tu/2, tu/8),
		pi("Tyreus-Luyben PI", sourceTL, ku/3.2, 2.2*tu),
		pid("Tyreus-Luyben PID", sourceTL, ku/2.2, 2.2*tu, tu/6.3),
	}
}
