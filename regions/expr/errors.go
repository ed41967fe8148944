package expr

import (
	"strconv"
	"unicode/utf8"
)

// SyntaxError reports text that Parse or ParseList could not accept,
// with the input and the place in it, so a command can show the user
// exactly where to look.
type SyntaxError struct {
	What string // what the text is, "plant expression" or "coefficient list"; empty reads as the former
	Src  string // the text as given
	Pos  int    // byte offset of the problem in Src, 0-based; len(Src) means at the end
	Msg  string // what was expected or found there
}

// excerptLen is the longest Src that Error quotes whole. Longer inputs are
// quoted as a window around Pos so that a message stays one readable line.
const excerptLen = 80

// Error returns the message in the form
//
//	plant expression "2*(s+1": at column 7: expected ")" but the expression ended
//
// The column is 1-based and counts characters rather than bytes, so it
// matches what the user sees on the terminal even when the text holds
// non-ASCII symbols.
func (e *SyntaxError) Error() string {
	what := e.What
	if what == "" {
		what = "plant expression"
	}
	return what + " " + e.quoted() + ": at column " + strconv.Itoa(e.Column()) + ": " + e.Msg
}

// Column returns the 1-based character column of Pos in Src.
func (e *SyntaxError) Column() int { return column(e.Src, e.Pos) }

// column returns the 1-based character column of byte offset pos in src.
func column(src string, pos int) int {
	pos = min(max(pos, 0), len(src))
	return utf8.RuneCountInString(src[:pos]) + 1
}

// quoted returns Src quoted, or a window of it around Pos marked with
// "..." where text was left out.
func (e *SyntaxError) quoted() string {
	if len(e.Src) <= excerptLen {
		return strconv.Quote(e.Src)
	}
	pos := min(max(e.Pos, 0), len(e.Src))
	lo := max(pos-excerptLen/2, 0)
	hi := min(lo+excerptLen, len(e.Src))
	lo = max(hi-excerptLen, 0)
	// Move the cut points off the middle of a multi-byte character.
	for lo > 0 && !utf8.RuneStart(e.Src[lo]) {
		lo--
	}
	for hi < len(e.Src) && !utf8.RuneStart(e.Src[hi]) {
		hi++
	}
	q := strconv.Quote(e.Src[lo:hi])
	if lo > 0 {
		q = "..." + q
	}
	if hi < len(e.Src) {
		q += "..."
	}
	return q
}
