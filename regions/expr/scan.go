package expr

import (
	"fmt"
	"math"
	"strconv"
	"unicode/utf8"
)

// kind is the class of a token.
type kind int

const (
	tEOF kind = iota
	tNum
	tVar   // the variable, s or z
	tName  // any other name; always an error, reported by the parser with context
	tPlus  // +
	tMinus // -
	tStar  // *
	tSlash // /
	tCaret // ^
	tLParen
	tRParen
)

// token is one lexical item of an expression.
type token struct {
	kind kind
	pos  int     // byte offset of the first character
	text string  // the characters as typed
	val  float64 // value of a tNum
}

// describe names the token for "found ..." in error messages.
func (t token) describe() string {
	switch t.kind {
	case tEOF:
		return "the end of the expression"
	case tNum, tVar:
		return t.text
	default:
		return strconv.Quote(t.text)
	}
}

// lookalikes maps characters that users paste from documents or type by
// habit to the operator this grammar expects in their place.
var lookalikes = map[rune]string{
	'·': `"*"`, '×': `"*"`, '∙': `"*"`, '⋅': `"*"`,
	'÷': `"/"`,
	'−': `"-"`, '–': `"-"`, '—': `"-"`,
	'²': `"^2"`, '³': `"^3"`,
	'[': `"("`, ']': `")"`, '{': `"("`, '}': `")"`,
	',': `"." as the decimal point, and "*" or "+" between terms`,
}

// scan splits src into tokens, ending with a tEOF token at len(src). The
// name v is the variable; every other name is a tName.
func scan(src string, v byte) ([]token, error) {
	var toks []token
	i := 0
	for i < len(src) {
		c := src[i]
		switch {
		case c == ' ' || c == '\t' || c == '\n' || c == '\r':
			i++
			continue
		case isDigit(c) || c == '.':
			end, msg := scanNumber(src, i)
			if msg != "" {
				return nil, &SyntaxError{Src: src, Pos: i, Msg: msg}
			}
			v, msg := numberValue(src[i:end])
			if msg != "" {
				return nil, &SyntaxError{Src: src, Pos: i, Msg: msg}
			}
			toks = append(toks, token{kind: tNum, pos: i, text: src[i:end], val: v})
			i = end
			continue
		case isLetter(c):
			end := i + 1
			for end < len(src) && (isLetter(src[end]) || isDigit(src[end])) {
				end++
			}
			k := tName
			if end == i+1 && src[i] == v {
				k = tVar
			}
			toks = append(toks, token{kind: k, pos: i, text: src[i:end]})
			i = end
			continue
		}
		k, ok := operators[c]
		if !ok {
			return nil, &SyntaxError{Src: src, Pos: i, Msg: unexpectedChar(src[i:])}
		}
		toks = append(toks, token{kind: k, pos: i, text: src[i : i+1]})
		i++
	}
	return append(toks, token{kind: tEOF, pos: len(src)}), nil
}

var operators = map[byte]kind{
	'+': tPlus, '-': tMinus, '*': tStar, '/': tSlash, '^': tCaret,
	'(': tLParen, ')': tRParen,
}

// unexpectedChar describes the character at the start of rest, with a
// hint when it is a common stand-in for one of the operators.
func unexpectedChar(rest string) string {
	r, size := utf8.DecodeRuneInString(rest)
	if r == utf8.RuneError && size <= 1 {
		return fmt.Sprintf("unexpected byte %#02x, which is not valid UTF-8 text", rest[0])
	}
	msg := fmt.Sprintf("unexpected character %q", r)
	if hint, ok := lookalikes[r]; ok {
		msg += "; use " + hint
	}
	return msg
}

// scanNumber returns the end of the decimal number that starts at
// src[i], or a message saying why the text there is not one. The form is
// digits with at most one decimal point and at least one digit, then an
// optional exponent: "e" or "E", an optional sign, and digits. Hexadecimal
// forms, digit separators, "Inf" and "NaN" are not part of it, because
// they are never how a plant is written and would only hide typing errors.
func scanNumber(src string, i int) (end int, msg string) {
	j := i
	digits := 0
	for j < len(src) && isDigit(src[j]) {
		j++
		digits++
	}
	if j < len(src) && src[j] == '.' {
		j++
		for j < len(src) && isDigit(src[j]) {
			j++
			digits++
		}
	}
	if digits == 0 {
		return j, `expected a digit before or after "."`
	}
	if j < len(src) && (src[j] == 'e' || src[j] == 'E') {
		k := j + 1
		if k < len(src) && (src[k] == '+' || src[k] == '-') {
			k++
		}
		switch {
		case k < len(src) && isDigit(src[k]):
			for k < len(src) && isDigit(src[k]) {
				k++
			}
			j = k
		case k == j+1 && k < len(src) && isLetter(src[k]):
			// A name follows the mantissa directly, as in "2exp"; leave
			// it to the parser, which reports the missing operator.
		default:
			return j, fmt.Sprintf("malformed number %q: the exponent has no digits", src[i:k])
		}
	}
	if j < len(src) && src[j] == '.' {
		k := j
		for k < len(src) && (src[k] == '.' || isDigit(src[k])) {
			k++
		}
		return k, fmt.Sprintf("malformed number %q", src[i:k])
	}
	return j, ""
}

// numberValue converts the text of a number accepted by scanNumber,
// refusing values that do not survive the conversion to float64.
func numberValue(text string) (float64, string) {
	v, err := strconv.ParseFloat(text, 64)
	if err != nil || math.IsInf(v, 0) {
		return 0, fmt.Sprintf("number %s is too large for double precision", text)
	}
	if v == 0 && hasNonzeroMantissa(text) {
		return 0, fmt.Sprintf("number %s is too small for double precision: it would become 0", text)
	}
	return v, ""
}

// hasNonzeroMantissa reports whether a digit before the exponent of a
// number's text is not 0.
func hasNonzeroMantissa(text string) bool {
	for i := 0; i < len(text); i++ {
		switch c := text[i]; {
		case c == 'e' || c == 'E':
			return false
		case c >= '1' && c <= '9':
			return true
		}
	}
	return false
}

func isDigit(c byte) bool  { return '0' <= c && c <= '9' }
func isLetter(c byte) bool { return 'a' <= c && c <= 'z' || 'A' <= c && c <= 'Z' || c == '_' }
