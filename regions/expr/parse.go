package expr

import (
	"fmt"
	"math"
	"strconv"

	"gainscape/regions/poly"
)

// MaxLen is the longest input, in bytes, that Parse and ParseList accept.
// A plant typed by hand is far shorter; the cap bounds the work any input
// can cause.
const MaxLen = 4096

// MaxDepth is how deeply Parse lets parentheses and unary signs nest. The
// parser recurses once per level, so the cap bounds its stack.
const MaxDepth = 200

// MaxExponent is the largest exponent Parse accepts after "^".
const MaxExponent = 64

// MaxDegree is the largest degree Parse lets any numerator or denominator
// reach, including intermediate results. Roots of polynomials of higher
// degree are not meaningful in double precision, and the cap keeps
// nested powers such as (((s+1)^64)^64)^64 from running for minutes.
const MaxDegree = 128

// Parse returns the numerator and denominator polynomials of the transfer
// function written in src, such as "2.5*(s+0.4)/(s*(s+1.5)^2*(0.2*s+1))".
//
// The grammar, from loosest to tightest binding, is
//
//	expr     = term { ("+" | "-") term }
//	term     = unary { ("*" | "/") unary }
//	unary    = ("+" | "-") unary | power
//	power    = primary [ "^" exponent ]
//	exponent = integer | "(" exponent ")"
//	primary  = number | "s" | "(" expr ")"
//
// so -s^2 is -(s^2) and 1/s*2 is (1/s)*2. Numbers are decimal, as in 3,
// 0.5, .5, 5. and 1e-3. Multiplication is always written with "*":
// 2s and (s+1)(s+2) are errors, which keeps every input unambiguous. An
// exponent is a non-negative integer of at most MaxExponent written in
// digits; a chain such as s^2^3 must be parenthesised. Spaces, tabs and
// newlines may appear between tokens.
//
// The expression is evaluated as a ratio of polynomials: with a = an/ad
// and b = bn/bd, a/b = (an·bd)/(ad·bn). Common factors of numerator and denominator are
// never cancelled: the loop's characteristic polynomial must contain every
// pole the user typed, and whether a pole and zero cancel is a modelling
// decision for the user, not for the parser. A sum over one denominator
// keeps it once (1/s + 2/s is 3/s); a sum over different denominators
// multiplies them, so a factor the two share appears twice. Dividing by
// an expression that is zero, exactly or to within the rounding of its
// computation (as 0.1+0.2-0.3 is), is an error, and so is overflow, or
// underflow that would turn a numerator or denominator into zero.
//
// The only normalisation is of sign: both polynomials are negated if
// needed so that the denominator's leading coefficient is positive.
// Leading coefficients that are exactly zero, which exact cancellation
// leaves behind, are dropped without changing the polynomial, so len(p)-1
// is the degree of each result unless it is the zero polynomial {0}.
//
// A dead time factor exp(-L*s) is refused with a message that suggests a
// rational approximation; ParsePlant reads plants that keep the delay.
// Parse does not check that the plant is proper; callers that need it call
// Check. Inputs longer than MaxLen bytes, nested deeper than MaxDepth or
// with a result of degree above MaxDegree are rejected, so no input can
// take long or exhaust the stack. Every error is a *SyntaxError.
func Parse(src string) (num, den poly.Poly, err error) {
	pl, err := parse(src, 's', false)
	return pl.Num, pl.Den, err
}

// parse reads src as a transfer function in the variable v, with one dead
// time factor if delays is set; see Parse and ParsePlant.
func parse(src string, v byte, delays bool) (Plant, error) {
	if len(src) > MaxLen {
		return Plant{}, &SyntaxError{Src: src, Pos: MaxLen,
			Msg: fmt.Sprintf("the expression is %d bytes long, more than the limit of %d", len(src), MaxLen)}
	}
	toks, err := scan(src, v)
	if err != nil {
		return Plant{}, err
	}
	if toks[0].kind == tEOF {
		return Plant{}, &SyntaxError{Src: src, Pos: 0,
			Msg: fmt.Sprintf("the expression is empty; write a transfer function in %c such as 1/(%c+1)", v, v)}
	}
	p := &parser{src: src, toks: toks, v: v, delays: delays, delayPos: -1}
	r, err := p.expr()
	if err != nil {
		return Plant{}, err
	}
	if t := p.peek(); t.kind != tEOF {
		return Plant{}, p.misplaced(t, nil)
	}
	num, den := r.num.p, r.den.p
	if den[den.Degree()] < 0 {
		num, den = poly.Sub(nil, num), poly.Sub(nil, den)
	}
	pl := Plant{Num: num, Den: den, Var: v}
	if r.delayed {
		pl.Delay = p.delay
	}
	return pl, nil
}

// parser is a recursive-descent parser over the tokens of one expression.
// Each method parses one rule of the grammar in Parse's doc comment.
type parser struct {
	src      string
	toks     []token
	i        int  // index of the next token
	depth    int  // current nesting of parentheses and unary signs
	v        byte // the variable, s or z
	delays   bool // a dead time factor is allowed
	delayPos int  // byte offset of the exp met, −1 before one
	delay    float64
}

func (p *parser) peek() token { return p.toks[p.i] }

func (p *parser) next() token {
	t := p.toks[p.i]
	if t.kind != tEOF {
		p.i++
	}
	return t
}

func (p *parser) errorf(pos int, format string, args ...any) error {
	return &SyntaxError{Src: p.src, Pos: pos, Msg: fmt.Sprintf(format, args...)}
}

// enter records one more level of nesting at t, failing past MaxDepth.
func (p *parser) enter(t token) error {
	p.depth++
	if p.depth > MaxDepth {
		return p.errorf(t.pos, "the expression is nested more than %d levels deep", MaxDepth)
	}
	return nil
}

func (p *parser) expr() (ratio, error) {
	a, err := p.term()
	if err != nil {
		return ratio{}, err
	}
	for {
		op := p.peek()
		if op.kind != tPlus && op.kind != tMinus {
			return a, nil
		}
		p.next()
		b, err := p.term()
		if err != nil {
			return ratio{}, err
		}
		if a.delayed || b.delayed {
			return ratio{}, p.errorf(p.delayPos, "the dead time must multiply the whole plant, not one term of this %q", op.text)
		}
		n, d := sumSizes(a, b)
		if err := p.checkDegree(op, n, d); err != nil {
			return ratio{}, err
		}
		if a, err = p.checked(op, sum(a, b, op.kind == tMinus), false); err != nil {
			return ratio{}, err
		}
	}
}

func (p *parser) term() (ratio, error) {
	a, err := p.unary()
	if err != nil {
		return ratio{}, err
	}
	for {
		op := p.peek()
		if op.kind != tStar && op.kind != tSlash {
			return a, nil
		}
		p.next()
		b, err := p.unary()
		if err != nil {
			return ratio{}, err
		}
		var r ratio
		// A product or quotient of non-zero numerators can only come out
		// zero by underflow, which would silently change the plant.
		nonzero := !a.num.isZero()
		if op.kind == tStar {
			nonzero = nonzero && !b.num.isZero()
			if err := p.checkDegree(op, a.num.size()+b.num.size(), a.den.size()+b.den.size()); err != nil {
				return ratio{}, err
			}
			r = product(a, b)
		} else {
			if b.num.isZero() {
				return ratio{}, p.errorf(op.pos, "division by zero: the divisor after this \"/\" is identically zero")
			}
			if b.delayed {
				return ratio{}, p.errorf(p.delayPos, "a dead time in a divisor is a predictor e^(+L*s), which no plant has; write exp(-L*s) in the numerator")
			}
			if err := p.checkDegree(op, a.num.size()+b.den.size(), a.den.size()+b.num.size()); err != nil {
				return ratio{}, err
			}
			r = quotient(a, b)
		}
		if a, err = p.checked(op, r, nonzero); err != nil {
			return ratio{}, err
		}
	}
}

func (p *parser) unary() (ratio, error) {
	t := p.peek()
	if t.kind != tPlus && t.kind != tMinus {
		return p.power()
	}
	p.next()
	if err := p.enter(t); err != nil {
		return ratio{}, err
	}
	a, err := p.unary()
	p.depth--
	if err != nil || t.kind == tPlus {
		return a, err
	}
	return a.negated(), nil
}

func (p *parser) power() (ratio, error) {
	a, err := p.primary()
	if err != nil {
		return ratio{}, err
	}
	op := p.peek()
	if op.kind != tCaret {
		return a, nil
	}
	p.next()
	k, err := p.exponent()
	if err != nil {
		return ratio{}, err
	}
	if t := p.peek(); t.kind == tCaret {
		return ratio{}, p.errorf(t.pos, "a second \"^\" is ambiguous; use parentheses, as in (s^2)^3")
	}
	if a.delayed && k != 1 {
		return ratio{}, p.errorf(op.pos, "a power of the dead time factor; write the total delay in one factor, as in exp(-%s*s)",
			strconv.FormatFloat(p.delay*float64(k), 'g', -1, 64))
	}
	if err := p.checkDegree(op, a.num.size()*k, a.den.size()*k); err != nil {
		return ratio{}, err
	}
	return p.checked(op, a.pow(k), k > 0 && !a.num.isZero())
}

func (p *parser) exponent() (int, error) {
	t := p.next()
	switch {
	case t.kind == tLParen:
		if err := p.enter(t); err != nil {
			return 0, err
		}
		k, err := p.exponent()
		if err != nil {
			return 0, err
		}
		switch c := p.next(); c.kind {
		case tRParen:
		case tEOF:
			return 0, p.errorf(c.pos, "expected \")\" after the exponent %d but the expression ended", k)
		default:
			return 0, p.errorf(c.pos, "expected \")\" after the exponent %d but found %s", k, c.describe())
		}
		p.depth--
		return k, nil
	case t.kind == tEOF:
		return 0, p.errorf(t.pos, "expected an exponent after \"^\" but the expression ended")
	case t.kind == tMinus:
		return 0, p.errorf(t.pos, "negative exponents are not supported; divide instead, as in 1/s^2")
	case t.kind != tNum:
		return 0, p.errorf(t.pos, "the exponent must be a non-negative integer, found %s", t.describe())
	case !allDigits(t.text) && t.val != math.Trunc(t.val):
		return 0, p.errorf(t.pos, "fractional exponent %s: only non-negative integer exponents are supported", t.text)
	case !allDigits(t.text) && t.val <= MaxExponent:
		return 0, p.errorf(t.pos, "write the exponent %s as a plain integer, as in ^%d", t.text, int(t.val))
	}
	k, err := strconv.Atoi(t.text)
	if err != nil || k > MaxExponent || !allDigits(t.text) {
		return 0, p.errorf(t.pos, "exponent %s is larger than the limit of %d", t.text, MaxExponent)
	}
	return k, nil
}

func (p *parser) primary() (ratio, error) {
	t := p.next()
	switch t.kind {
	case tNum:
		return polynomial(constant(t.val)), nil
	case tVar:
		return polynomial(variable()), nil
	case tLParen:
		if err := p.enter(t); err != nil {
			return ratio{}, err
		}
		a, err := p.expr()
		if err != nil {
			return ratio{}, err
		}
		if c := p.peek(); c.kind != tRParen {
			return ratio{}, p.misplaced(c, &t)
		}
		p.next()
		p.depth--
		return a, nil
	case tName:
		if t.text == "exp" {
			return p.delayFactor(t)
		}
		return ratio{}, p.unknownName(t)
	case tEOF:
		return ratio{}, p.errorf(t.pos, "expected a number, %c or \"(\" but the expression ended", p.v)
	}
	if t.kind == tStar && p.i >= 2 && p.toks[p.i-2].kind == tStar {
		return ratio{}, p.errorf(t.pos, "\"**\" is not an operator; use \"^\" for powers, as in s^2")
	}
	return ratio{}, p.errorf(t.pos, "expected a number, %c or \"(\" but found %s", p.v, t.describe())
}

// misplaced reports token t, found where an operator was expected, or the
// end of the expression if open is nil, or else the ")" closing open.
func (p *parser) misplaced(t token, open *token) error {
	switch {
	case t.kind == tNum || t.kind == tVar || t.kind == tLParen || t.kind == tName && t.text == "exp":
		return p.errorf(t.pos, "expected \"*\" before %s; multiplication must be written out", t.describe())
	case t.kind == tName:
		return p.unknownName(t)
	case t.kind == tRParen:
		return p.errorf(t.pos, "unexpected \")\" with no matching \"(\"")
	}
	// The loops in expr, term and power consume every operator, so what
	// is left is the end of the text.
	if open == nil {
		return p.errorf(t.pos, "unexpected %s", t.describe())
	}
	return p.errorf(t.pos, "expected \")\" but the expression ended; the \"(\" at column %d is still open",
		column(p.src, open.pos))
}

// unknownHints adds advice to the message for names a user is likely to
// try in a plant.
var unknownHints = map[string]string{
	"S": "; names are case-sensitive",
	"Z": "; names are case-sensitive",
	"s": "; an expression in z describes a sampled-data plant and cannot contain s",
	"z": "; z belongs to sampled-data plants, which are read as expressions in z",
}

func (p *parser) unknownName(t token) error {
	return p.errorf(t.pos, "unknown name %q: the only variable is %c%s", t.text, p.v, unknownHints[t.text])
}

// checkDegree fails at op if a result would exceed MaxDegree.
func (p *parser) checkDegree(op token, num, den int) error {
	if d := max(num, den); d > MaxDegree {
		return p.errorf(op.pos, "the result of this %q would have degree %d, more than the limit of %d", op.text, d, MaxDegree)
	}
	return nil
}

// checked returns r, or an error at op if computing r overflowed, left
// a denominator that is zero, or left a numerator that is zero although
// nonzero says it cannot be.
func (p *parser) checked(op token, r ratio, nonzero bool) (ratio, error) {
	if !r.finite() {
		return ratio{}, p.errorf(op.pos, "the result of this %q is too large for double precision", op.text)
	}
	if nonzero && r.num.isZero() {
		return ratio{}, p.errorf(op.pos, "the result of this %q is too small for double precision: it would become 0", op.text)
	}
	if r.den.isZero() {
		return ratio{}, p.errorf(op.pos, "the denominator becomes zero at this %q: its coefficients are too small for double precision", op.text)
	}
	return r, nil
}

func allDigits(s string) bool {
	for i := 0; i < len(s); i++ {
		if !isDigit(s[i]) {
			return false
		}
	}
	return s != ""
}
