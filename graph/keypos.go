package graph

import (
	"strconv"
	"strings"
)

// keyIndex maps key paths ("parts.R1.pins[0]") to where the key and its value
// were written. The TOML decoder gives values without positions, so after it
// has accepted a file we walk the text once more to learn where each key
// stands; every later message can then name file:line:col.
type keyIndex struct {
	file     string
	keys     map[string]Pos // position of the key itself
	vals     map[string]Pos // position of the first character of its value
	comments map[string]Comment
}

func (ix *keyIndex) key(path string) Pos {
	if p, ok := ix.keys[path]; ok {
		return p
	}
	// An array element has no key: fall back to its value, then to the parent.
	if p, ok := ix.vals[path]; ok {
		return p
	}
	if i := strings.LastIndexAny(path, ".["); i > 0 {
		return ix.key(path[:i])
	}
	return Pos{File: ix.file, Line: 1, Col: 1}
}

func (ix *keyIndex) val(path string) Pos {
	if p, ok := ix.vals[path]; ok {
		return p
	}
	return ix.key(path)
}

// KeyPositions tells where each key of a TOML text was written, for other
// TOML formats of the project (stage pattern files) that want the same
// file:line:col messages as netlists. Paths are dotted keys with [i] for
// array elements and for the i-th [[table]] of an array of tables.
type KeyPositions struct{ ix *keyIndex }

// IndexKeys scans TOML text that the decoder has already accepted.
func IndexKeys(file, src string) *KeyPositions { return &KeyPositions{indexKeys(file, src)} }

// Key is where the key of path was written, or the nearest enclosing key's
// position when path itself was not written (a default, an array element).
func (k *KeyPositions) Key(path string) Pos { return k.ix.key(path) }

// Value is where the value of path starts.
func (k *KeyPositions) Value(path string) Pos { return k.ix.val(path) }

type keyScanner struct {
	src     []rune
	i       int
	line    int
	col     int
	ix      *keyIndex
	pending []string       // comment lines waiting for the next statement
	blank   bool           // a blank line since the last statement
	last    string         // the path recorded last, for a comment after it on its line
	arrays  map[string]int // [[name]] headers seen so far
}

// indexKeys scans TOML text that the decoder has already accepted.
func indexKeys(file string, src string) *keyIndex {
	ix := &keyIndex{file: file, keys: map[string]Pos{}, vals: map[string]Pos{}, comments: map[string]Comment{}}
	s := &keyScanner{src: []rune(src), line: 1, col: 1, ix: ix, arrays: map[string]int{}}
	s.document()
	return ix
}

func (s *keyScanner) pos() Pos { return Pos{File: s.ix.file, Line: s.line, Col: s.col} }

func (s *keyScanner) peek() rune {
	if s.i < len(s.src) {
		return s.src[s.i]
	}
	return 0
}

func (s *keyScanner) next() rune {
	if s.i >= len(s.src) {
		return 0
	}
	r := s.src[s.i]
	s.i++
	if r == '\n' {
		s.line++
		s.col = 1
	} else {
		s.col++
	}
	return r
}

func (s *keyScanner) skipSpace() {
	for s.peek() == ' ' || s.peek() == '\t' || s.peek() == '\r' {
		s.next()
	}
}

// skipBlank skips white space, newlines and comments inside arrays and
// (TOML 1.1) multi-line inline tables.
func (s *keyScanner) skipBlank() {
	for {
		switch s.peek() {
		case ' ', '\t', '\r', '\n':
			s.next()
		case '#':
			s.comment()
		default:
			return
		}
	}
}

func (s *keyScanner) comment() string {
	s.next() // '#'
	start := s.i
	for s.i < len(s.src) && s.src[s.i] != '\n' {
		s.next()
	}
	return strings.TrimRight(string(s.src[start:s.i]), "\r")
}

func (s *keyScanner) document() {
	table := ""
	for s.i < len(s.src) {
		start := s.i
		table = s.statement(table)
		if s.i == start {
			// Nothing understood here (a NUL, a stray bracket after a string
			// form the scanner misread): step over it rather than loop.
			s.next()
		}
	}
}

// statement reads one statement, blank line or comment of the document and
// returns the table that the lines after it belong to.
func (s *keyScanner) statement(table string) string {
	s.skipSpace()
	switch r := s.peek(); {
	case r == '\n':
		if len(s.pending) > 0 && len(s.ix.keys) == 0 && s.blankLine() {
			// Comments at the top of the file, parted from the first key by
			// a blank line, describe the file: they stay at the top.
			s.ix.comments[HeaderComment] = Comment{Above: s.pending}
			s.pending = nil
		}
		s.blank = s.blank || s.blankLine()
		s.next()
		return table
	case r == '#':
		s.pending = append(s.pending, s.comment())
		return table
	case r == '[':
		s.blank = false // the writer parts tables itself
		at := s.pos()
		s.next()
		arr := false
		if s.peek() == '[' {
			s.next()
			arr = true
		}
		s.skipSpace()
		table = strings.Join(s.keyParts(), ".")
		s.skipSpace()
		s.next()
		if arr {
			s.next()
			// Each [[name]] header opens the next element of an array of
			// tables: paths inside it read name[0].key, name[1].key, ...
			n := s.arrays[table]
			s.arrays[table] = n + 1
			s.record(table, at, at)
			table += "[" + strconv.Itoa(n) + "]"
		}
		s.record(table, at, at)
		s.last = table
	default:
		at := s.pos()
		path := join(table, strings.Join(s.keyParts(), "."))
		if s.blank && s.last != table { // not the first entry of its table
			c := s.ix.comments[path]
			c.Blank = true
			s.ix.comments[path] = c
		}
		s.blank = false
		s.skipSpace()
		if s.peek() == '=' {
			s.next()
		}
		s.skipSpace()
		s.record(path, at, s.pos())
		s.value(path)
		s.last = path
	}
	s.skipSpace()
	if s.peek() == '#' {
		c := s.ix.comments[s.lastPath()]
		c.After = s.comment()
		s.ix.comments[s.lastPath()] = c
	}
	// Anything else on the line is not expected in valid TOML; skip it.
	for s.peek() != '\n' && s.i < len(s.src) {
		s.next()
	}
	return table
}

func (s *keyScanner) lastPath() string { return s.last }

// blankLine reports whether the line the scanner stands at the end of holds
// nothing but white space.
func (s *keyScanner) blankLine() bool {
	j := s.i - 1
	for j >= 0 && (s.src[j] == ' ' || s.src[j] == '\t' || s.src[j] == '\r') {
		j--
	}
	return j < 0 || s.src[j] == '\n'
}

// HeaderComment is the Comments key of the file's header: the comment lines
// at the very top that a blank line parts from the first key. No key of a
// valid netlist has an empty path, so the key cannot clash.
const HeaderComment = ""

func (s *keyScanner) record(path string, key, val Pos) {
	if _, dup := s.ix.keys[path]; !dup {
		s.ix.keys[path] = key
		s.ix.vals[path] = val
	}
	if len(s.pending) > 0 {
		c := s.ix.comments[path]
		c.Above = append(c.Above, s.pending...)
		s.ix.comments[path] = c
		s.pending = nil
	}
	s.last = path
}

func join(a, b string) string {
	if a == "" {
		return b
	}
	if b == "" {
		return a
	}
	return a + "." + b
}

// keyParts reads a possibly dotted, possibly quoted key.
func (s *keyScanner) keyParts() []string {
	var parts []string
	for {
		s.skipSpace()
		switch s.peek() {
		case '"':
			parts = append(parts, s.basicString())
		case '\'':
			parts = append(parts, s.literalString())
		default:
			start := s.i
			for isBareKey(s.peek()) {
				s.next()
			}
			parts = append(parts, string(s.src[start:s.i]))
		}
		s.skipSpace()
		if s.peek() != '.' {
			return parts
		}
		s.next()
	}
}

func isBareKey(r rune) bool {
	return r == '_' || r == '-' || (r >= 'a' && r <= 'z') || (r >= 'A' && r <= 'Z') || (r >= '0' && r <= '9')
}

func (s *keyScanner) value(path string) {
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
			p := join(path, strings.Join(s.keyParts(), "."))
			s.skipSpace()
			if s.peek() == '=' {
				s.next()
			}
			s.skipBlank()
			s.record(p, at, s.pos())
			s.value(p)
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
		for n := 0; ; n++ {
			s.skipBlank()
			if s.peek() == ']' || s.i >= len(s.src) {
				s.next()
				return
			}
			start := s.i
			p := path + "[" + strconv.Itoa(n) + "]"
			at := s.pos()
			s.ix.vals[p] = at
			s.value(p)
			s.skipBlank()
			if s.peek() == ',' {
				s.next()
			}
			if s.i == start {
				return // as above: never loop on text the scanner cannot place
			}
		}
	case '"':
		s.basicString()
	case '\'':
		s.literalString()
	default:
		for {
			r := s.peek()
			if r == 0 || r == ',' || r == '}' || r == ']' || r == '\n' || r == '#' {
				return
			}
			s.next()
		}
	}
}

func (s *keyScanner) basicString() string {
	if s.hasPrefix(`"""`) {
		s.next()
		s.next()
		s.next()
		var b strings.Builder
		for s.peek() != 0 && !s.hasPrefix(`"""`) {
			if s.peek() == '\\' {
				s.next()
			}
			b.WriteRune(s.next())
		}
		s.next()
		s.next()
		s.next()
		for s.peek() == '"' { // up to two quotes may close a multi-line string
			s.next()
		}
		return b.String()
	}
	s.next()
	start := s.i
	for s.peek() != 0 && s.peek() != '"' && s.peek() != '\n' {
		if s.peek() == '\\' {
			s.next()
		}
		s.next()
	}
	raw := string(s.src[start:s.i])
	s.next()
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
		out := string(s.src[start:s.i])
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
	out := string(s.src[start:s.i])
	s.next()
	return out
}

func (s *keyScanner) hasPrefix(p string) bool {
	rp := []rune(p)
	if s.i+len(rp) > len(s.src) {
		return false
	}
	for k, r := range rp {
		if s.src[s.i+k] != r {
			return false
		}
	}
	return true
}
