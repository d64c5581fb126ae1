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
	col = duplicateCol(pe, data, line, col)
	// A message quotes the text it stumbled on, line break and all ("not
	// a binary number: '0b\n'"): shown as escapes, it stays on one line.
	l.Add(Pos{File: file, Line: line, Col: col}, "%s", esc.Visible(tomlMessage(pe)))
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

// duplicateCol moves the position of a part "written twice" to where its
// reference designator stands on the line: the start of "R1 = {", the R1
// of a dotted key "parts.R1.r" or of a header "[parts.R1]".
func duplicateCol(pe toml.ParseError, data []byte, line, col int) int {
	m := duplicateKey.FindStringSubmatch(pe.Message)
	if m == nil {
		return col
	}
	rest, ok := strings.CutPrefix(m[1], "parts.")
	if !ok {
		return col
	}
	ref, _, _ := strings.Cut(rest, ".")
	lines := strings.Split(string(data), "\n")
	if line > len(lines) {
		return col
	}
	text := []rune(lines[line-1])
	for i := 0; i+len([]rune(ref)) <= len(text); i++ {
		if string(text[i:i+len([]rune(ref))]) != ref {
			continue
		}
		before := i == 0 || !isBareKey(text[i-1])
		end := i + len([]rune(ref))
		after := end == len(text) || !isBareKey(text[end])
		if before && after {
			return i + 1
		}
	}
	return col
}

// tomlMessage shortens the decoder's message (the position is printed by us)
// and says in the netlist's own terms what a key written twice means.
func tomlMessage(pe toml.ParseError) string {
	msg := pe.Message
	if msg == "" {
		msg = pe.Error()
	}
	if m := duplicateKey.FindStringSubmatch(msg); m != nil {
		key := m[1]
		if rest, ok := strings.CutPrefix(key, "parts."); ok {
			ref, _, _ := strings.Cut(rest, ".")
			return fmt.Sprintf("part %s is written twice: each reference designator names one part", ref)
		}
		return fmt.Sprintf("key %q is written twice", key)
	}
	return msg
}
