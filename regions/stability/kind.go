package stability

import "fmt"

// Kind says how closed-loop roots cross the stability boundary at an edge
// of a stability map: the boundary kinds of the D-partition
// (D-decomposition; Yu. I. Neimark, Avtomatika i Telemekhanika 9(3),
// 1948), with the extra kind the unit circle has.
type Kind uint8

// The edge kinds.
const (
	// None is the zero Kind: no crossing.
	None Kind = iota
	// Real: a real root passes through s = 0 (or through z = 1 for a
	// sampled-data loop); ω = 0.
	Real
	// Complex: a complex pair crosses the boundary at s = ±jω (or at
	// z = e^(±jωT)).
	Complex
	// Infinite: a root passes through infinity (the leading coefficient
	// vanishes); ω is undefined.
	Infinite
	// Alternating: a real root passes through z = −1 in a sampled-data
	// loop, where the output alternates in sign every sample; ω = π/T.
	Alternating
)

var kindNames = [...]string{None: "none", Real: "real", Complex: "complex", Infinite: "infinite", Alternating: "alternating"}

// String returns the name the JSON data and the CSV files use.
func (k Kind) String() string {
	if int(k) < len(kindNames) {
		return kindNames[k]
	}
	return fmt.Sprintf("Kind(%d)", uint8(k))
}

// MarshalText implements encoding.TextMarshaler with the names of String.
func (k Kind) MarshalText() ([]byte, error) {
	if int(k) >= len(kindNames) {
		return nil, fmt.Errorf("stability: unknown kind %d", uint8(k))
	}
	return []byte(kindNames[k]), nil
}

// UnmarshalText implements encoding.TextUnmarshaler.
func (k *Kind) UnmarshalText(b []byte) error {
	for i, n := range kindNames {
		if n == string(b) {
			*k = Kind(i)
			return nil
		}
	}
	return fmt.Errorf("stability: unknown kind %q", b)
}

// Describe says in words what happens to the loop at an edge of kind k
// with frequency omega (rad/s), for reports.
func (k Kind) Describe(omega float64) string {
	switch k {
	case Real:
		return "a real root crosses through s = 0 (the loop drifts away, ω = 0)"
	case Complex:
		return fmt.Sprintf("a complex pair crosses the boundary: the loop oscillates at ω = %.6g rad/s", omega)
	case Infinite:
		return "a root passes through infinity (the leading coefficient vanishes)"
	case Alternating:
		return fmt.Sprintf("a real root crosses through z = −1: the output alternates every sample (ω = π/T = %.6g rad/s)", omega)
	}
	return "no crossing"
}
