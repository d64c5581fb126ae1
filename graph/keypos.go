package graph

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// keyIndex maps key paths ("parts.R1.pins[0]") to where the key and its value
// were written. The TOML decoder gives values without positions, so after it
// has accepted a file we walk the text once more to learn where each key
// stands; every later message can then name file:line:col.
//
// One map holds both places of a path, as line and column numbers without
// the file name (every entry has the same file): a netlist of ten thousand
// parts has some fifty thousand paths, and two maps of whole positions
// were a fifth of its load (docs/performance.md, "Loading, and `pare
// sweep` against ngspice").
type keyIndex struct {
	file     string
	at       map[string]keyAt
	elems    []elemAt // the elements of keyed arrays, each array's in a run (keyAt.elems)
	rescans  bool     // a keyed array was scanned twice: its elements went to the map too
	comments map[string]Comment
}

// keyAt is where a path's key and value stand. An array element has a value
// and no key (keyLine 0); a path has no value position only when the scanner
// met its key and then lost its way in text the decoder accepted. The
// elements of an array written under a key (pins = ["a", "b"]) are not
// paths of their own but a run of elems: two of the five paths of a
// two-pin part.
type keyAt struct {
	keyLine, keyCol, valLine, valCol int32
	elems, nElems                    int32 // the array's run in keyIndex.elems
}

// elemAt is where an element of a keyed array starts.
type elemAt struct{ line, col int32 }

func (a keyAt) hasKey() bool { return a.keyLine > 0 }
func (a keyAt) hasVal() bool { return a.valLine > 0 }

func (ix *keyIndex) pos(line, col int32) Pos {
	return Pos{File: ix.file, Line: int(line), Col: int(col)}
}

// lookup finds what the scanner recorded for path, a path of its own or an
// element of a keyed array (path ends in [i]).
func (ix *keyIndex) lookup(path string) (keyAt, bool) {
	if a, ok := ix.at[path]; ok {
		return a, true
	}
	n := len(path)
	if n < 3 || path[n-1] != ']' {
		return keyAt{}, false
	}
	open := strings.LastIndexByte(path, '[')
	digits := path[open+1 : n-1]
	if open <= 0 || digits == "" || !isDigit(digits[0]) || (digits[0] == '0' && len(digits) > 1) {
		return keyAt{}, false // only the spelling strconv.Itoa gives names an element
	}
	i, err := strconv.Atoi(digits)
	if err != nil {
		return keyAt{}, false
	}
	return ix.element(path[:open], i)
}

// element is the i-th element of the keyed array at path, from its run.
func (ix *keyIndex) element(path string, i int) (keyAt, bool) {
	a, ok := ix.at[path]
	if !ok || i < 0 || i >= int(a.nElems) {
		return keyAt{}, false
	}
	e := ix.elems[int(a.elems)+i]
	return keyAt{valLine: e.line, valCol: e.col}, true
}

func (ix *keyIndex) key(path string) Pos {
	a, ok := ix.lookup(path)
	if ok && a.hasKey() {
		return ix.pos(a.keyLine, a.keyCol)
	}
	// An array element has no key: fall back to its value, then to the parent.
	if ok && a.hasVal() {
		return ix.pos(a.valLine, a.valCol)
	}
	if i := strings.LastIndexAny(path, ".["); i > 0 {
		return ix.key(path[:i])
	}
	return Pos{File: ix.file, Line: 1, Col: 1}
}

func (ix *keyIndex) val(path string) Pos {
	if a, ok := ix.lookup(path); ok && a.hasVal() {
		return ix.pos(a.valLine, a.valCol)
	}
	return ix.key(path)
}

// elemVal is val(path + "[i]") without making the path: where the i-th
// element of the array at path starts.
func (ix *keyIndex) elemVal(path string, i int) Pos {
	if !ix.rescans {
		if a, ok := ix.element(path, i); ok {
			return ix.pos(a.valLine, a.valCol)
		}
	}
	return ix.val(path + "[" + strconv.Itoa(i) + "]")
}

// written tells whether the file gave path a value (a key or an element).
func (ix *keyIndex) written(path string) bool {
	a, ok := ix.lookup(path)
	return ok && a.hasVal()
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
	src     string
	i       int
	line    int
	col     int
	ix      *keyIndex
	pending []string       // comment lines waiting for the next statement
	blank   bool           // a blank line since the last statement
	last    string         // the path recorded last, for a comment after it on its line
	arrays  map[string]int // [[name]] headers seen so far
	stack   []elemAt       // elements of the keyed arrays being read
}

// indexKeys scans TOML text that the decoder has already accepted.
func indexKeys(file string, src string) *keyIndex {
	ix := &keyIndex{file: file, at: make(map[string]keyAt, pathsAbout(src)), comments: map[string]Comment{}}
	s := &keyScanner{src: src, line: 1, col: 1, ix: ix, arrays: map[string]int{}}
	s.document()
	return ix
}

// pathsAbout is about the number of paths a text holds, to size the map once
// rather than grow it: a key has an equals sign, a table header or an array
// inside an array a bracket (a keyed array's elements are no paths).
// Counting bytes costs a thousandth of the scan.
func pathsAbout(src string) int {
	return strings.Count(src, "=") + strings.Count(src, "[")
}

func (s *keyScanner) pos() Pos { return Pos{File: s.ix.file, Line: s.line, Col: s.col} }

// peek is the byte at the scanner: every character the scanner decides on
// is ASCII, and a byte of a longer character is none of them.
func (s *keyScanner) peek() byte {
	if s.i < len(s.src) {
		return s.src[s.i]
	}
	return 0
}

// next steps over one character; columns count characters, as they did
// when the scanner walked the text's runes (a byte that is no UTF-8 is one).
func (s *keyScanner) next() {
	if s.i >= len(s.src) {
		return
	}
	c := s.src[s.i]
	switch {
	case c == '\n':
		s.i++
		s.line++
		s.col = 1
		return
	case c < utf8.RuneSelf:
		s.i++
	default:
		_, size := utf8.DecodeRuneInString(s.src[s.i:])
		s.i += size
	}
	s.col++
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

// comment reads a comment to the end of its line. Its text is a copy, so
// a circuit that keeps its comments does not keep the whole file.
func (s *keyScanner) comment() string {
	s.next() // '#'
	start := s.i
	for s.i < len(s.src) && s.src[s.i] != '\n' {
		s.next()
	}
	return strings.Clone(strings.TrimRight(s.src[start:s.i], "\r"))
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
		if len(s.pending) > 0 && len(s.ix.at) == 0 && s.blankLine() {
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
		table = s.keyPath()
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
		path := join(table, s.keyPath())
		if s.blank && s.last != table { // not the first entry of its table
			s.note(path, func(c *Comment) { c.Blank = true })
		}
		s.blank = false
		s.skipSpace()
		if s.peek() == '=' {
			s.next()
		}
		s.skipSpace()
		s.record(path, at, s.pos())
		s.value(path, true)
		s.last = path
	}
	s.skipSpace()
	if s.peek() == '#' {
		after := s.comment()
		s.note(s.last, func(c *Comment) { c.After = after })
	}
	// Anything else on the line is not expected in valid TOML; skip it.
	for s.peek() != '\n' && s.i < len(s.src) {
		s.next()
	}
	return table
}

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
	if a, dup := s.ix.at[path]; !dup || !a.hasKey() {
		s.ix.at[path] = keyAt{keyLine: int32(key.Line), keyCol: int32(key.Col), valLine: int32(val.Line), valCol: int32(val.Col)}
	}
	if len(s.pending) > 0 {
		pending := s.pending
		s.note(path, func(c *Comment) { c.Above = append(c.Above, pending...) })
		s.pending = nil
	}
	s.last = path
}

// element records where an array element's value starts (it has no key).
func (s *keyScanner) element(path string, val Pos) {
	a := s.ix.at[path]
	a.valLine, a.valCol = int32(val.Line), int32(val.Col)
	s.ix.at[path] = a
}

// note changes the comments kept for path. A new entry's path is a copy:
// a path may be a piece of the file's text, which the circuit need not keep.
func (s *keyScanner) note(path string, change func(*Comment)) {
	c, ok := s.ix.comments[path]
	if !ok {
		path = strings.Clone(path)
	}
	change(&c)
	s.ix.comments[path] = c
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

// keyPath reads a possibly dotted, possibly quoted key and returns it with
// its parts joined by dots. A bare key of one part is a piece of the text,
// not a copy.
func (s *keyScanner) keyPath() string {
	s.skipSpace()
	first := s.keyPart()
	s.skipSpace()
	if s.peek() != '.' {
		return first
	}
	parts := []string{first}
	for s.peek() == '.' {
		s.next()
		s.skipSpace()
		parts = append(parts, s.keyPart())
		s.skipSpace()
	}
	return strings.Join(parts, ".")
}

func (s *keyScanner) keyPart() string {
	switch s.peek() {
	case '"':
		return s.basicString(true)
	case '\'':
		return s.literalString()
	}
	start := s.i
	for isBareKey(rune(s.peek())) {
		s.next()
	}
	return s.src[start:s.i]
}

func isBareKey(r rune) bool {
	return r == '_' || r == '-' || (r >= 'a' && r <= 'z') || (r >= 'A' && r <= 'Z') || (r >= '0' && r <= '9')
}
