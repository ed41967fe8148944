package expr

import (
	"fmt"
	"strconv"

	"gainscape/regions/poly"
)

// Plant is a plant read from text: Num/Den·e^(−Delay·s) in continuous
// time, or Num/Den in z for a sampled-data plant (Var 'z', Delay 0).
// Num and Den hold ascending coefficients, as from Parse.
type Plant struct {
	Num, Den poly.Poly
	// Delay is the dead time L ≥ 0 in the time unit of s; 0 for none.
	Delay float64
	// Var is the variable the plant is written in, 's' or 'z'.
	Var byte
}

// ParsePlant returns the plant written in src, a transfer function in s as
// Parse reads it that may carry one dead time factor exp(-L*s) anywhere in
// a product, as in "2*exp(-1.5*s)/((4*s+1)*(s+1))". The factor extends
// the grammar of Parse with
//
//	primary = … | "exp" "(" [ "-" | "+" ] delay ")"
//	delay   = number "*" "s" | "s" "*" number | "s"
//
// where the number is L, a non-negative decimal literal, and exp(-s) means
// L = 1. exp(-0*s) and exp(0*s) are allowed and mean no delay. Refused,
// each with a *SyntaxError at the place: a positive exponent exp(L*s)
// with L > 0 (a predictor, not a delay); any other argument, such as
// exp(-s^2), exp(-2*s*s), exp(-L s) without "*" or exp(-1), a constant
// (write its value); a second exp anywhere, even with the same L (write
// the total delay in one factor); the factor in a divisor, 1/exp(...),
// which would be a predictor; the factor in a term of a sum, since a
// delay must multiply the whole plant; and a power of it other than 1.
func ParsePlant(src string) (Plant, error) { return parse(src, 's', true) }

// ParseIn returns the plant written in src as a transfer function in the
// variable v: 's' as ParsePlant reads it, or 'z' for a sampled-data plant
// given directly in z, as in "0.2*(z+0.8)/((z-0.9)*(z-0.5))", with the
// grammar of Parse and z in place of s. In z, s is refused and so is exp:
// a delay of d whole samples is written 1/z^d. It panics if v is neither
// 's' nor 'z'.
func ParseIn(src string, v byte) (Plant, error) {
	switch v {
	case 's':
		return ParsePlant(src)
	case 'z':
		return parse(src, 'z', false)
	}
	panic(fmt.Sprintf("expr: variable %q is neither s nor z", v))
}

// delayFactor parses the rest of exp( … ) after the name t, returning
// the factor as the constant 1 marked as delayed.
func (p *parser) delayFactor(t token) (ratio, error) {
	switch {
	case p.v != 's':
		return ratio{}, p.errorf(t.pos, "exp is not allowed in an expression in %c; a delay of d samples is 1/%c^d", p.v, p.v)
	case !p.delays:
		return ratio{}, p.errorf(t.pos, "a dead time exp(-L*s) is not accepted in this expression; replace it by a rational approximation such as a Padé approximant")
	case p.delayPos >= 0:
		return ratio{}, p.errorf(t.pos, "a second dead time factor: only one exp(-L*s) may appear, the first is at column %d; write the total delay in one factor",
			column(p.src, p.delayPos))
	}
	if o := p.next(); o.kind != tLParen {
		return ratio{}, p.errorf(o.pos, "expected \"(\" after exp, as in exp(-2*s), but found %s", o.describe())
	}
	sign := p.peek()
	negative := sign.kind == tMinus
	if negative || sign.kind == tPlus {
		p.next()
	}
	signText := ""
	if negative {
		signText = "-"
	}
	L, err := p.delayArgument(signText)
	if err != nil {
		return ratio{}, err
	}
	if c := p.next(); c.kind != tRParen {
		if c.kind == tCaret || c.kind == tStar || c.kind == tSlash || c.kind == tPlus || c.kind == tMinus {
			return ratio{}, p.errorf(c.pos, "the argument of exp must be -L*s with L a number; found %s after it", c.describe())
		}
		return ratio{}, p.errorf(c.pos, "expected \")\" to close exp( but found %s", c.describe())
	}
	if !negative && L != 0 {
		return ratio{}, p.errorf(t.pos, "exp(%s*s) with a positive exponent is a predictor, not a dead time; write exp(-%s*s)",
			strconv.FormatFloat(L, 'g', -1, 64), strconv.FormatFloat(L, 'g', -1, 64))
	}
	p.delayPos, p.delay = t.pos, L
	r := polynomial(constant(1))
	r.delayed = L > 0
	return r, nil
}

// delayArgument reads L*s, s*L or s inside exp( and returns L; sign is
// the sign typed before it, for messages.
func (p *parser) delayArgument(sign string) (float64, error) {
	a := p.next()
	switch a.kind {
	case tNum:
		if st := p.peek(); st.kind != tStar {
			if st.kind == tRParen {
				return 0, p.errorf(a.pos, "exp(%s%s) is a constant; write its value, or exp(-L*s) for a dead time", sign, a.text)
			}
			return 0, p.errorf(st.pos, "expected \"*\" before s in exp(-L*s) but found %s; multiplication must be written out", st.describe())
		}
		p.next()
		if v := p.next(); v.kind != tVar {
			return 0, p.errorf(v.pos, "expected s after %s* in exp(-L*s) but found %s", a.text, v.describe())
		}
		return a.val, nil
	case tVar:
		if p.peek().kind != tStar {
			return 1, nil
		}
		p.next()
		n := p.next()
		if n.kind != tNum {
			return 0, p.errorf(n.pos, "expected a number after s* in exp(-s*L) but found %s", n.describe())
		}
		return n.val, nil
	case tEOF:
		return 0, p.errorf(a.pos, "expected -L*s after exp( but the expression ended")
	}
	return 0, p.errorf(a.pos, "the argument of exp must be -L*s with L a number; found %s", a.describe())
}
