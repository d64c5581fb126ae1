package graph

import (
	"errors"
	"fmt"
	"regexp"
	"strings"
	"unicode/utf8"

	"github.com/BurntSushi/toml"

	"pare/internal/esc"
)

// DecodeError turns an error of the TOML decoder into a positioned error
// list, for netlists and pattern files alike.
//
// The position is worked out from the decoder's byte offset, not from its
// line and column: the decoder gives the column of an error at the very
// start of a line (invalid UTF-8, a stray "µ") as one past the end of the
// line before, and the line after an unclosed header. The column counts
// characters, as every other message does (a line with "µF" before the
// mistake would otherwise point past it).
func DecodeError(file string, data []byte, err error) ErrorList {
	var l ErrorList
	var pe toml.ParseError
	if !errors.As(err, &pe) {
		l.Add(Pos{File: file, Line: 1, Col: 1}, "%s", esc.Visible(err.Error()))
		return l
	}
	line, col := offsetPos(data, pe.Position.Start)
	if pe.Position.Start <= 0 && pe.Position.Line > 1 {
		line, col = pe.Position.Line, max(1, pe.Position.Col) // no offset given: the decoder's own
	}
	col, keyTwice := duplicateCol(pe, data, line, col)
	if strings.HasPrefix(pe.Message, "invalid UTF-8") {
		line, col = badUTF8Pos(data, pe.Position.Start, line, col)
	}
	// A message quotes the text it stumbled on, line break and all ("not
	// a binary number: '0b\n'"): shown as escapes, it stays on one line.
	l.Add(Pos{File: file, Line: line, Col: col}, "%s", esc.Visible(tomlMessage(pe, keyTwice)))
	return l
}

// offsetPos gives the line and character column of a byte offset.
func offsetPos(data []byte, off int) (int, int) {
	off = max(0, min(off, len(data)))
	before := data[:off]
	line := 1 + strings.Count(string(before), "\n")
	start := strings.LastIndexByte(string(before), '\n') + 1
	return line, utf8.RuneCount(before[start:]) + 1
}

// duplicateKey matches the decoder's message for a key written twice.
var duplicateKey = regexp.MustCompile(`^Key '(.*)' has already been defined\.?$`)

// duplicateCol moves the position of a key written twice under parts to
// where the mistake stands on the line, and tells which mistake it is. The
// decoder names the same path ("parts.R1.r") for a part entered twice as
// for a key given twice within one part, so the line decides: a key that
// stands twice on it, or once on a line that does not name the part (a
// [parts.R1] table), is a key written twice, shown at its second place;
// otherwise the part is written twice, shown at its reference designator
// (the start of "R1 = {", the R1 of "parts.R1.r" or of "[parts.R1]").
func duplicateCol(pe toml.ParseError, data []byte, line, col int) (int, bool) {
	m := duplicateKey.FindStringSubmatch(pe.Message)
	if m == nil {
		return col, false
	}
	rest, ok := strings.CutPrefix(m[1], "parts.")
	if !ok {
		return col, false
	}
	ref, sub, inPart := strings.Cut(rest, ".")
	lines := strings.Split(string(data), "\n")
	if line > len(lines) {
		return col, false
	}
	at := refCol([]rune(lines[line-1]), ref)
	if inPart {
		keys := keyCols(lines[line-1], lastSegment(sub))
		switch {
		case len(keys) >= 2:
			return keys[1], true
		case len(keys) == 1 && at == 0:
			return keys[0], true
		}
	}
	if at > 0 {
		return at, false
	}
	return col, false
}

// refCol is the column of ref standing as a whole bare key on the line, or 0.
func refCol(text []rune, ref string) int {
	n := len([]rune(ref))
	for i := 0; i+n <= len(text); i++ {
		if string(text[i:i+n]) != ref {
			continue
		}
		before := i == 0 || !isBareKey(text[i-1])
		after := i+n == len(text) || !isBareKey(text[i+n])
		if before && after {
			return i + 1
		}
	}
	return 0
}

// lastSegment is the last part of a dotted key ("windings.p" gives "p").
func lastSegment(key string) string {
	return key[strings.LastIndexByte(key, '.')+1:]
}

// keyCols gives the columns where the bare key stands before an "=" on
// the line, outside strings.
func keyCols(line, key string) []int {
	text := []rune(line)
	k := []rune(key)
	var found []int
	for i := 0; i < len(text); i++ {
		if q := text[i]; q == '"' || q == '\'' {
			i = skipQuoted(text, i)
			continue
		}
		if i > 0 && isBareKey(text[i-1]) || i+len(k) > len(text) || string(text[i:i+len(k)]) != key {
			continue
		}
		j := i + len(k)
		if j < len(text) && isBareKey(text[j]) {
			continue
		}
		for j < len(text) && (text[j] == ' ' || text[j] == '\t') {
			j++
		}
		if j < len(text) && text[j] == '=' {
			found = append(found, i+1)
		}
	}
	return found
}

// skipQuoted returns the index of the quote that closes the string opened
// at i (or the last index when it stays open); a basic string's escapes
// are stepped over.
func skipQuoted(text []rune, i int) int {
	q := text[i]
	for j := i + 1; j < len(text); j++ {
		switch {
		case text[j] == '\\' && q == '"':
			j++
		case text[j] == q:
			return j
		}
	}
	return len(text) - 1
}

// badUTF8Pos moves an "invalid UTF-8" error from where the decoder puts it
// (the start of the string or comment holding the byte) to the byte
// itself, the first invalid one from the decoder's offset on.
func badUTF8Pos(data []byte, from, line, col int) (int, int) {
	from = max(0, min(from, len(data)))
	for i := from; i < len(data); {
		r, n := utf8.DecodeRune(data[i:])
		if r == utf8.RuneError && n <= 1 {
			return offsetPos(data, i)
		}
		i += n
	}
	return line, col
}

// tomlMessage shortens the decoder's message (the position is printed by us)
// and says in the netlist's own terms what a key written twice means.
func tomlMessage(pe toml.ParseError, keyTwice bool) string {
	msg := pe.Message
	if msg == "" {
		msg = pe.Error()
	}
	if m := duplicateKey.FindStringSubmatch(msg); m != nil {
		key := m[1]
		if rest, ok := strings.CutPrefix(key, "parts."); ok {
			ref, sub, inPart := strings.Cut(rest, ".")
			if inPart && keyTwice {
				return fmt.Sprintf("part %s: key %s is written twice: give each key of a part once", ref, sub)
			}
			return fmt.Sprintf("part %s is written twice: each reference designator names one part", ref)
		}
		return fmt.Sprintf("key %q is written twice", key)
	}
	return msg
}
