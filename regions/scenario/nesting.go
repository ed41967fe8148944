package scenario

// MaxNesting is the deepest a scenario file may nest: arrays, inline
// tables, table headers and the parts of dotted keys, counted together.
// The deepest value of the schema, a number in a mark written as an inline
// table in an array (marks = [{kp = 2.5}]), counts 4. The TOML reader
// takes time and memory that grow with the square of the depth, so a
// small file nested tens of thousands deep would keep it busy for
// minutes; checkNesting refuses such a file before the reader sees it.
const MaxNesting = 8

// nesting returns the first line of data at which the nesting exceeds
// MaxNesting, and 0 if it does not. It reads the text as TOML's lexical
// rules have it, skipping comments and the four kinds of string, and
// counts each open bracket or brace, plus, within a stretch of text
// between two of = , [ ] { } and a line break, one for each dot and one
// for the stretch itself. A dotted key gains a level at each dot; a
// number or a date, the only values with a dot, has at most one, which
// counts a level too many at worst. One pass, no allocation.
func nesting(data []byte) int {
	line, depth, dots := 1, 0, 0
	for i := 0; i < len(data); i++ {
		c := data[i]
		switch c {
		case '\n':
			line++
			dots = 0
		case '#':
			for i+1 < len(data) && data[i+1] != '\n' {
				i++
			}
		case '"', '\'':
			var lines int
			i, lines = skipString(data, i)
			line += lines
		case '[', '{':
			depth++
			dots = 0
		case ']', '}':
			// A closer too many is a syntax error the reader stops at; it
			// must not lend depth to what follows.
			depth = max(depth-1, 0)
			dots = 0
		case '=', ',':
			dots = 0
		case '.':
			dots++
		}
		if depth+dots+1 > MaxNesting {
			return line
		}
	}
	return 0
}

// skipString returns the index of the last byte of the string that opens
// at data[i], and the line breaks within it. An unterminated string runs
// to the end of the data; the TOML reader reports it.
func skipString(data []byte, i int) (end, lines int) {
	q := data[i]
	n := 1
	if i+2 < len(data) && data[i+1] == q && data[i+2] == q {
		n = 3
	}
	for j := i + n; j < len(data); j++ {
		switch c := data[j]; {
		case c == '\\' && q == '"':
			if j+1 < len(data) && data[j+1] == '\n' {
				lines++
			}
			j++
		case c == '\n':
			lines++
			if n == 1 {
				// A one-line string cannot go on; the reader reports it.
				return j - 1, lines - 1
			}
		case c == q && (n == 1 || j+2 < len(data) && data[j+1] == q && data[j+2] == q):
			end = j + n - 1
			// A multi-line string may end in up to two more quotes.
			for n == 3 && end+1 < len(data) && data[end+1] == q && end-j < 4 {
				end++
			}
			return end, lines
		}
	}
	return len(data) - 1, lines
}
