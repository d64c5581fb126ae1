package graph

import "iter"

// Where decodeTOML may cut a TOML text (tomlsplit.go): a scanner that
// follows strings, comments and brackets as the decoder's lexer does and
// names each line that starts a statement inside a table opened by a plain
// [name] header.

// splitTOML cuts src into at most n pieces of about equal length at cut
// points (cutPoints); fewer when the text has fewer.
func splitTOML(src string, n int) []piece {
	var pieces []piece
	start, table := 0, ""
	next := len(src) / n
	for at, name := range cutPoints(src) {
		if at < next {
			continue
		}
		pieces = append(pieces, piece{table: table, text: src[start:at]})
		start, table = at, name
		next = at + (len(src)-at)/(n-len(pieces))
		if len(pieces) == n-1 {
			break
		}
	}
	return append(pieces, piece{table: table, text: src[start:]})
}

// cutPoints yields the byte offset of every line that starts a statement
// (a key, or a blank or comment line) outside strings, arrays and inline
// tables and after a header of one bare key ([parts], not [parts.R1],
// [[x]] or ["a b"]), with that key. A header of any other form ends the
// cut points until the next plain one.
func cutPoints(src string) iter.Seq2[int, string] {
	return func(yield func(int, string) bool) {
		sc := cutScanner{s: src}
		table := ""
		for sc.i < len(sc.s) {
			at := sc.i
			sc.skipBlanks()
			if sc.i < len(sc.s) && sc.s[sc.i] == '[' {
				table = plainHeader(sc.s[sc.i:])
			} else if table != "" && at > 0 && !yield(at, table) {
				return
			}
			sc.statement()
		}
	}
}

// plainHeader returns name when line (from its "[") is "[name]" with a
// bare key, spaces about it and an optional comment after; "" otherwise.
func plainHeader(line string) string {
	i := 1
	for i < len(line) && (line[i] == ' ' || line[i] == '\t') {
		i++
	}
	start := i
	for i < len(line) && isBareKeyByte(line[i]) {
		i++
	}
	name := line[start:i]
	for i < len(line) && (line[i] == ' ' || line[i] == '\t') {
		i++
	}
	if name == "" || i >= len(line) || line[i] != ']' {
		return ""
	}
	for i++; i < len(line) && (line[i] == ' ' || line[i] == '\t'); i++ {
	}
	if i == len(line) || line[i] == '\n' || line[i] == '#' || (line[i] == '\r' && i+1 < len(line) && line[i+1] == '\n') {
		return name
	}
	return ""
}

func isBareKeyByte(c byte) bool {
	return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '_' || c == '-'
}

// cutScanner steps over TOML statements.
type cutScanner struct {
	s string
	i int
}

func (sc *cutScanner) skipBlanks() {
	for sc.i < len(sc.s) && (sc.s[sc.i] == ' ' || sc.s[sc.i] == '\t') {
		sc.i++
	}
}

// statement steps to the start of the next line outside every string,
// array and inline table (or to the end of the text).
func (sc *cutScanner) statement() {
	depth := 0
	for sc.i < len(sc.s) {
		c := sc.s[sc.i]
		sc.i++
		switch c {
		case '\n':
			if depth == 0 {
				return
			}
		case '[', '{':
			depth++
		case ']', '}':
			depth = max(0, depth-1)
		case '#':
			for sc.i < len(sc.s) && sc.s[sc.i] != '\n' {
				sc.i++
			}
		case '"', '\'':
			sc.str(c)
		}
	}
}

// str steps over a string whose opening quote q was just read: one line
// or three quotes long, a basic one with its escapes. A closing run of
// three quotes may have one or two more before it (`"""a""""` is `a"`).
// An unclosed string ends at the end of its line or of the text; the
// decoder refuses it, in the piece that holds it.
func (sc *cutScanner) str(q byte) {
	if sc.i+1 < len(sc.s) && sc.s[sc.i] == q && sc.s[sc.i+1] == q {
		sc.i += 2
		sc.long(q)
		return
	}
	for sc.i < len(sc.s) {
		c := sc.s[sc.i]
		switch {
		case c == '\n':
			return
		case c == '\\' && q == '"':
			sc.i++
		case c == q:
			sc.i++
			return
		}
		sc.i++
	}
}

func (sc *cutScanner) long(q byte) {
	for sc.i < len(sc.s) {
		c := sc.s[sc.i]
		sc.i++
		switch {
		case c == '\\' && q == '"':
			sc.i++
		case c == q:
			run := 1
			for run < 5 && sc.i < len(sc.s) && sc.s[sc.i] == q {
				sc.i++
				run++
			}
			if run >= 3 {
				return
			}
		}
	}
}
