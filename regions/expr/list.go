package expr

import (
	"fmt"
	"strconv"

	"gainscape/regions/poly"
)

// ParseList returns the polynomial whose coefficients src lists highest
// power first, as in "1, 3.5, 0, 2" for s^3 + 3.5·s^2 + 2. Items are
// separated by commas, white space or both; each is a decimal number of
// the form Parse accepts, with an optional sign. Empty items, as between
// two commas or after a final comma, are errors rather than zeros, since
// they are more often a slip than a meant coefficient. Leading zero
// coefficients are kept; Check ignores them when it compares degrees.
// Inputs longer than MaxLen bytes are rejected. Every error is a
// *SyntaxError naming the item and its place in the list.
func ParseList(src string) (poly.Poly, error) {
	fail := func(pos int, format string, args ...any) error {
		return &SyntaxError{What: "coefficient list", Src: src, Pos: pos, Msg: fmt.Sprintf(format, args...)}
	}
	if len(src) > MaxLen {
		return nil, fail(MaxLen, "the list is %d bytes long, more than the limit of %d", len(src), MaxLen)
	}
	var coef []float64
	afterComma := true // at the start, as after a comma, an item must come next
	lastComma := 0
	for i := 0; i < len(src); {
		c := src[i]
		switch {
		case isSpace(c):
			i++
		case c == ',':
			if afterComma {
				return nil, fail(i, "item %d is empty: expected a number before this \",\"", len(coef)+1)
			}
			afterComma, lastComma = true, i
			i++
		default:
			end := i
			for end < len(src) && !isSpace(src[end]) && src[end] != ',' {
				end++
			}
			v, err := listItem(src[i:end], len(coef)+1)
			if err != "" {
				return nil, fail(i, "%s", err)
			}
			coef = append(coef, v)
			afterComma = false
			i = end
		}
	}
	if len(coef) == 0 {
		return nil, fail(0, "the list is empty; give the coefficients highest power first, as in 1, 3, 2")
	}
	if afterComma {
		return nil, fail(lastComma, "item %d is empty: the list ends with a \",\"", len(coef)+1)
	}
	return poly.FromDescending(coef), nil
}

// listItem converts item number n of a coefficient list, or returns a
// message naming it.
func listItem(item string, n int) (float64, string) {
	digits := item
	if digits[0] == '+' || digits[0] == '-' {
		digits = digits[1:]
	}
	if digits == "" || !(isDigit(digits[0]) || digits[0] == '.') {
		return 0, notNumber(item, n)
	}
	if end, msg := scanNumber(digits, 0); msg != "" || end != len(digits) {
		return 0, notNumber(item, n)
	}
	v, msg := numberValue(digits)
	if msg != "" {
		return 0, "item " + strconv.Itoa(n) + ": " + msg
	}
	if item[0] == '-' {
		v = -v
	}
	return v, ""
}

func notNumber(item string, n int) string {
	return fmt.Sprintf("item %d %q is not a number; give the coefficients alone, highest power first, separated by commas or spaces", n, item)
}

func isSpace(c byte) bool { return c == ' ' || c == '\t' || c == '\n' || c == '\r' }
