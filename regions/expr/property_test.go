package expr

import (
	"fmt"
	"math/cmplx"
	"math/rand/v2"
	"strconv"
	"testing"
)

// node is an expression tree built by the property test. It prints itself
// as Parse input and evaluates itself directly in complex arithmetic, so
// the test has a reference value that never goes through polynomials.
type node struct {
	op   byte    // 'c' constant, 'l' linear factor a·s+b, '~' negation, or + - * / ^
	a, b float64 // value of 'c' is a; 'l' is a·s + b
	k    int     // exponent of '^'
	x, y *node   // operands; y is nil for '~' and '^'
}

func decimal(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

func (n *node) String() string {
	switch n.op {
	case 'c':
		return decimal(n.a)
	case 'l':
		return "(" + decimal(n.a) + "*s + " + decimal(n.b) + ")"
	case '~':
		return "-(" + n.x.String() + ")"
	case '^':
		return fmt.Sprintf("(%v)^%d", n.x, n.k)
	}
	return fmt.Sprintf("(%v %c %v)", n.x, n.op, n.y)
}

func (n *node) eval(z complex128) complex128 {
	switch n.op {
	case 'c':
		return complex(n.a, 0)
	case 'l':
		return complex(n.a, 0)*z + complex(n.b, 0)
	case '~':
		return -n.x.eval(z)
	case '^':
		r := complex(1, 0)
		for range n.k {
			r *= n.x.eval(z)
		}
		return r
	case '+':
		return n.x.eval(z) + n.y.eval(z)
	case '-':
		return n.x.eval(z) - n.y.eval(z)
	case '*':
		return n.x.eval(z) * n.y.eval(z)
	}
	return n.x.eval(z) / n.y.eval(z)
}

// randomTree returns a random expression of the given depth.
// Divisors are products of linear factors with a ≥ 0.5, whose only roots
// are real, so they vanish nowhere off the real axis.
func randomTree(r *rand.Rand, depth int) *node {
	if depth == 0 || r.IntN(4) == 0 {
		if r.IntN(3) == 0 {
			return &node{op: 'c', a: 4*r.Float64() - 2}
		}
		return &node{op: 'l', a: 0.5 + 1.5*r.Float64(), b: 4*r.Float64() - 2}
	}
	switch op := "+-*/^~"[r.IntN(6)]; op {
	case '/':
		return &node{op: op, x: randomTree(r, depth-1), y: randomDivisor(r, depth-1)}
	case '^':
		return &node{op: op, k: r.IntN(4), x: randomTree(r, depth-1)}
	case '~':
		return &node{op: op, x: randomTree(r, depth-1)}
	default:
		return &node{op: op, x: randomTree(r, depth-1), y: randomTree(r, depth-1)}
	}
}

func randomDivisor(r *rand.Rand, depth int) *node {
	f := &node{op: 'l', a: 0.5 + 1.5*r.Float64(), b: 4*r.Float64() - 2}
	if depth == 0 || r.IntN(2) == 0 {
		return f
	}
	if r.IntN(2) == 0 {
		return &node{op: '^', k: 1 + r.IntN(3), x: f}
	}
	return &node{op: '*', x: f, y: randomDivisor(r, depth-1)}
}

// TestParseAgreesWithDirectEvaluation checks, for random expressions,
// that num(z)/den(z) from Parse equals the expression evaluated directly
// at points off the real axis.
func TestParseAgreesWithDirectEvaluation(t *testing.T) {
	points := []complex128{0.3 + 1.1i, -0.7 + 0.4i, 1.9i, -1.2 - 0.8i, 2.5 + 0.2i}
	// The expanded polynomials have degree at most about 20 with
	// coefficients built from a few dozen roundings; evaluating them and
	// the tree each costs a few hundred more. 1e-9 leaves a wide margin
	// above that while still catching any wrong coefficient.
	const tol = 1e-9
	r := rand.New(rand.NewPCG(1, 2))
	for i := range 300 {
		tree := randomTree(r, 4)
		src := tree.String()
		num, den, err := Parse(src)
		if err != nil {
			t.Errorf("case %d: Parse(%q): %v", i, src, err)
			continue
		}
		for _, z := range points {
			want := tree.eval(z)
			got := num.Eval(z) / den.Eval(z)
			if cmplx.Abs(got-want) > tol*cmplx.Abs(want) {
				t.Errorf("case %d: %s at s = %v: Parse gives %v, direct evaluation %v", i, src, z, got, want)
			}
		}
	}
}
