// Package boundary finds the edges of the regions of a stability map to
// full precision and joins them into curves, each point carrying the
// frequency at which the loop oscillates there.
package boundary

// Kind says how closed-loop roots cross the imaginary axis on a boundary,
// the three cases of the D-partition (D-decomposition) method.
type Kind string

const (
	// Real: a real root passes through s = 0 (the constant coefficient of
	// the characteristic polynomial vanishes); ω = 0.
	Real Kind = "real"
	// Complex: a complex pair crosses at s = ±jω (an all-zero row in the
	// sign array; ω from its auxiliary polynomial).
	Complex Kind = "complex"
	// Infinite: a root passes through infinity (the leading coefficient
	// vanishes, so the degree drops).
	Infinite Kind = "infinite"
)

// Point is one refined boundary point in the parameter plane and the
// frequency of the imaginary-axis roots there (0 for Real, NaN for
// Infinite).
type Point struct {
	X, Y, Omega float64
}

// Curve is a polyline of boundary points of one kind.
type Curve struct {
	Kind   Kind
	Points []Point
}
