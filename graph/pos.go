package graph

import (
	"fmt"
	"sort"
	"strings"
)

// Pos is where something was written in a netlist file. The zero Pos means
// "made by pare" (a part created by a reduction, say) and prints as "-".
type Pos struct {
	File string `json:"file,omitempty"`
	Line int    `json:"line,omitempty"`
	Col  int    `json:"col,omitempty"`
}

// IsValid reports whether p points into a file.
func (p Pos) IsValid() bool { return p.Line > 0 }

// String prints file:line:col, the form editors and terminals turn into links.
func (p Pos) String() string {
	if !p.IsValid() {
		if p.File != "" {
			return p.File
		}
		return "-"
	}
	if p.Col > 0 {
		return fmt.Sprintf("%s:%d:%d", p.File, p.Line, p.Col)
	}
	return fmt.Sprintf("%s:%d", p.File, p.Line)
}

// Short prints file:line, enough for a log line that names a part.
func (p Pos) Short() string {
	if !p.IsValid() {
		return p.String()
	}
	return fmt.Sprintf("%s:%d", p.File, p.Line)
}

// Before orders positions by file, line, column.
func (p Pos) Before(q Pos) bool {
	if p.File != q.File {
		return p.File < q.File
	}
	if p.Line != q.Line {
		return p.Line < q.Line
	}
	return p.Col < q.Col
}

// Error is one problem found in a netlist, with the place it was found.
type Error struct {
	Pos Pos
	Msg string
}

func (e *Error) Error() string { return e.Pos.String() + ": " + e.Msg }

// ErrorList collects every problem of one run, so a user fixes them all at
// once instead of one per run (the habit of go/scanner.ErrorList).
type ErrorList []*Error

// Add appends a problem at pos.
func (l *ErrorList) Add(pos Pos, format string, args ...any) {
	*l = append(*l, &Error{Pos: pos, Msg: fmt.Sprintf(format, args...)})
}

// Sort orders the list by position, then message, and drops exact repeats.
func (l *ErrorList) Sort() {
	sort.SliceStable(*l, func(i, j int) bool {
		a, b := (*l)[i], (*l)[j]
		if a.Pos != b.Pos {
			return a.Pos.Before(b.Pos)
		}
		return a.Msg < b.Msg
	})
	out := (*l)[:0]
	for i, e := range *l {
		if i > 0 && e.Pos == (*l)[i-1].Pos && e.Msg == (*l)[i-1].Msg {
			continue
		}
		out = append(out, e)
	}
	*l = out
}

// Error prints every problem on its own line.
func (l ErrorList) Error() string {
	var b strings.Builder
	for i, e := range l {
		if i > 0 {
			b.WriteByte('\n')
		}
		b.WriteString(e.Error())
	}
	return b.String()
}

// Err returns nil for an empty list, so callers can write `if err := l.Err(); err != nil`.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}
