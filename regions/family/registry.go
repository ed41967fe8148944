package family

import (
	"fmt"
	"strings"
)

// all lists the families offered on the command line, in help order.
var all = []Family{
	Proportional{},
	ProportionalIntegral{},
	ProportionalDerivative{},
	PID{},
	FirstOrderCompensator{name: "lead"},
	FirstOrderCompensator{name: "lag"},
	LeadLag{},
}

// All returns every registered family in help order.
func All() []Family { return append([]Family(nil), all...) }

// Lookup returns the family with the given command-line name.
func Lookup(name string) (Family, error) {
	for _, f := range all {
		if f.Name() == strings.ToLower(strings.TrimSpace(name)) {
			return f, nil
		}
	}
	return nil, fmt.Errorf("unknown controller %q (choose one of %s)", name, Names())
}

// Names returns the registered names joined by commas.
func Names() string {
	n := make([]string, len(all))
	for i, f := range all {
		n[i] = f.Name()
	}
	return strings.Join(n, ", ")
}

// Title returns a structure's name as titles and tables write it: the
// letter names in capitals (P, PI, PD, PID), the others capitalised
// (Lead, Lag, Lead-lag).
func Title(name string) string {
	switch name {
	case "p", "pi", "pd", "pid":
		return strings.ToUpper(name)
	case "leadlag":
		return "Lead-lag"
	case "":
		return ""
	}
	return strings.ToUpper(name[:1]) + name[1:]
}
