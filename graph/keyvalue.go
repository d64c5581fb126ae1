package graph

// The key scanner's values: arrays, strings and the rest of a value are
// stepped over so the walk stays in step with the decoder's reading.

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// value steps over the value of path; keyed says path was recorded under a
// key, so an array there keeps its elements as a run (keyAt.elems).
func (s *keyScanner) value(path string, keyed bool) {
	switch s.peek() {
	case '{':
		s.next()
		for {
			s.skipBlank()
			if s.peek() == '}' || s.i >= len(s.src) {
				s.next()
				return
			}
			start := s.i
			at := s.pos()
			p := join(path, s.keyPath())
			s.skipSpace()
			if s.peek() == '=' {
				s.next()
			}
			s.skipBlank()
			s.record(p, at, s.pos())
			s.value(p, true)
			s.skipBlank()
			if s.peek() == ',' {
				s.next()
			}
			if s.i == start {
				return // not a key: the decoder accepted something misread here; give up on this table
			}
		}
	case '[':
		s.next()
		if a := s.ix.at[path]; keyed && a.nElems == 0 {
			base := len(s.stack)
			s.array(path, true)
			a = s.ix.at[path]
			a.elems, a.nElems = int32(len(s.ix.elems)), int32(len(s.stack)-base)
			s.ix.elems = append(s.ix.elems, s.stack[base:]...)
			s.ix.at[path] = a
			s.stack = s.stack[:base]
			return
		}
		if keyed {
			s.ix.rescans = true
		}
		s.array(path, false)
	case '"':
		s.basicString(false)
	case '\'':
		s.literalString()
	default:
		for {
			c := s.peek()
			if c == 0 || c == ',' || c == '}' || c == ']' || c == '\n' || c == '#' {
				return
			}
			s.next()
		}
	}
}

// array steps over the elements of the array at path, its '[' read. With
// run, each element's place goes on the stack and only a table or array
// in it is given a path; else each element is a path of its own.
func (s *keyScanner) array(path string, run bool) {
	for n := 0; ; n++ {
		s.skipBlank()
		if s.peek() == ']' || s.i >= len(s.src) {
			s.next()
			return
		}
		start := s.i
		p := ""
		if c := s.peek(); !run || c == '{' || c == '[' {
			p = path + "[" + strconv.Itoa(n) + "]"
		}
		if run {
			s.stack = append(s.stack, elemAt{int32(s.line), int32(s.col)})
		} else {
			s.element(p, s.pos())
		}
		s.value(p, false)
		s.skipBlank()
		if s.peek() == ',' {
			s.next()
		}
		if s.i == start {
			return // as above: never loop on text the scanner cannot place
		}
	}
}

// basicString steps over a string in double quotes; with want it returns
// the string's text (a key's), else nothing (a value's: the decoder has
// read it already).
func (s *keyScanner) basicString(want bool) string {
	if s.hasPrefix(`"""`) {
		s.next()
		s.next()
		s.next()
		var b strings.Builder
		for s.peek() != 0 && !s.hasPrefix(`"""`) {
			if s.peek() == '\\' {
				s.next()
			}
			start := s.i
			s.next()
			if want {
				b.WriteString(s.src[start:s.i])
			}
		}
		s.next()
		s.next()
		s.next()
		for s.peek() == '"' { // up to two quotes may close a multi-line string
			s.next()
		}
		return runeString(b.String())
	}
	s.next()
	start := s.i
	for s.peek() != 0 && s.peek() != '"' && s.peek() != '\n' {
		if s.peek() == '\\' {
			s.next()
		}
		s.next()
	}
	end := s.i
	s.next()
	if !want {
		return ""
	}
	raw := runeString(s.src[start:end])
	if strings.IndexByte(raw, '\\') < 0 {
		return raw // nothing to unquote
	}
	if u, err := strconv.Unquote(`"` + raw + `"`); err == nil {
		return u
	}
	return raw
}

func (s *keyScanner) literalString() string {
	if s.hasPrefix(`'''`) {
		s.next()
		s.next()
		s.next()
		start := s.i
		for s.peek() != 0 && !s.hasPrefix(`'''`) {
			s.next()
		}
		out := runeString(s.src[start:s.i])
		s.next()
		s.next()
		s.next()
		for k := 0; k < 2 && s.peek() == '\''; k++ { // up to two quotes may close a multi-line literal
			out += "'"
			s.next()
		}
		return out
	}
	s.next()
	start := s.i
	for s.peek() != 0 && s.peek() != '\'' && s.peek() != '\n' {
		s.next()
	}
	out := runeString(s.src[start:s.i])
	s.next()
	return out
}

func (s *keyScanner) hasPrefix(p string) bool { return strings.HasPrefix(s.src[s.i:], p) }

// runeString is s with each byte that is no UTF-8 made U+FFFD, as reading
// the text as runes made it (text the decoder accepted is UTF-8 throughout).
func runeString(s string) string {
	if utf8.ValidString(s) {
		return s
	}
	return string([]rune(s))
}
