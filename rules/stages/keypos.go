package stages

import (
	"strconv"
	"strings"

	"pare/graph"
)

// positions maps key paths in a pattern file ("parts.L.pins[1]",
// "figure[0].calc") to where they were written. The TOML decoder accepts the
// file but forgets positions; one more pass over the accepted text gives
// every later message a file:line:col. Pattern files are small and written by
// people, so this scanner only needs to follow what valid TOML can contain.
type positions struct {
	file string
	at   map[string]graph.Pos
}

func (p *positions) of(path string) graph.Pos {
	for {
		if pos, ok := p.at[path]; ok {
			return pos
		}
		i := strings.LastIndexAny(path, ".[")
		if i <= 0 {
			return graph.Pos{File: p.file, Line: 1, Col: 1}
		}
		path = path[:i]
	}
}

type posScanner struct {
	src       []rune
	i         int
	line, col int
	out       *positions
	arrays    map[string]int // [[name]] seen so far, for the element index
}

func scanPositions(file, text string) *positions {
	out := &positions{file: file, at: map[string]graph.Pos{}}
	s := &posScanner{src: []rune(text), line: 1, col: 1, out: out, arrays: map[string]int{}}
	s.document()
	return out
}

func (s *posScanner) pos() graph.Pos { return graph.Pos{File: s.out.file, Line: s.line, Col: s.col} }

func (s *posScanner) peek() rune {
	if s.i < len(s.src) {
		return s.src[s.i]
	}
	return 0
}

func (s *posScanner) next() {
	if s.i >= len(s.src) {
		return
	}
	if s.src[s.i] == '\n' {
		s.line++
		s.col = 1
	} else {
		s.col++
	}
	s.i++
}

func (s *posScanner) note(path string, p graph.Pos) {
	if _, dup := s.out.at[path]; !dup {
		s.out.at[path] = p
	}
}

func (s *posScanner) skipSpace() {
	for r := s.peek(); r == ' ' || r == '\t' || r == '\r'; r = s.peek() {
		s.next()
	}
}

func (s *posScanner) skipBlank() {
	for {
		switch s.peek() {
		case ' ', '\t', '\r', '\n':
			s.next()
		case '#':
			s.skipLine()
		default:
			return
		}
	}
}

func (s *posScanner) skipLine() {
	for s.peek() != '\n' && s.peek() != 0 {
		s.next()
	}
}

func (s *posScanner) document() {
	table := ""
	for s.i < len(s.src) {
		s.skipBlank()
		if s.peek() == 0 {
			return
		}
		at := s.pos()
		if s.peek() == '[' {
			s.next()
			arr := s.peek() == '['
			if arr {
				s.next()
			}
			name := strings.Join(s.key(), ".")
			if arr {
				n := s.arrays[name]
				s.arrays[name] = n + 1
				table = name + "[" + strconv.Itoa(n) + "]"
			} else {
				table = name
			}
			s.note(table, at)
			s.skipLine()
			continue
		}
		path := joinPath(table, strings.Join(s.key(), "."))
		s.skipSpace()
		if s.peek() == '=' {
			s.next()
		}
		s.skipSpace()
		s.note(path, at)
		s.value(path)
		s.skipLine()
	}
}

func joinPath(a, b string) string {
	if a == "" {
		return b
	}
	return a + "." + b
}

func (s *posScanner) key() []string {
	var parts []string
	for {
		s.skipSpace()
		switch s.peek() {
		case '"', '\'':
			parts = append(parts, s.quoted())
		default:
			start := s.i
			for r := s.peek(); r == '_' || r == '-' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9'; r = s.peek() {
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

// quoted reads a one-line basic or literal string and returns its text.
func (s *posScanner) quoted() string {
	q := s.peek()
	s.next()
	var b strings.Builder
	for r := s.peek(); r != 0 && r != q && r != '\n'; r = s.peek() {
		if q == '"' && r == '\\' {
			s.next()
			r = s.peek()
		}
		b.WriteRune(r)
		s.next()
	}
	s.next()
	return b.String()
}

func (s *posScanner) value(path string) {
	switch s.peek() {
	case '{':
		s.next()
		for {
			s.skipBlank()
			if s.peek() == '}' || s.peek() == 0 {
				s.next()
				return
			}
			at := s.pos()
			p := joinPath(path, strings.Join(s.key(), "."))
			s.skipSpace()
			if s.peek() == '=' {
				s.next()
			}
			s.skipBlank()
			s.note(p, at)
			s.value(p)
			s.skipBlank()
			if s.peek() == ',' {
				s.next()
			}
		}
	case '[':
		s.next()
		for n := 0; ; n++ {
			s.skipBlank()
			if s.peek() == ']' || s.peek() == 0 {
				s.next()
				return
			}
			p := path + "[" + strconv.Itoa(n) + "]"
			s.note(p, s.pos())
			s.value(p)
			s.skipBlank()
			if s.peek() == ',' {
				s.next()
			}
		}
	case '"', '\'':
		if strings.HasPrefix(string(s.src[s.i:min(s.i+3, len(s.src))]), `"""`) || strings.HasPrefix(string(s.src[s.i:min(s.i+3, len(s.src))]), `'''`) {
			s.multiline()
			return
		}
		s.quoted()
	default:
		for r := s.peek(); r != 0 && r != ',' && r != '}' && r != ']' && r != '\n' && r != '#'; r = s.peek() {
			s.next()
		}
	}
}

func (s *posScanner) multiline() {
	q := string(s.src[s.i : s.i+3])
	s.next()
	s.next()
	s.next()
	for s.i < len(s.src) && !strings.HasPrefix(string(s.src[s.i:min(s.i+3, len(s.src))]), q) {
		s.next()
	}
	s.next()
	s.next()
	s.next()
}
