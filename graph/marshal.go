package graph

import (
	"bytes"
	"fmt"
	"sort"
	"strings"
)

// Marshal writes c in the canonical layout and proves that the text loads
// back as the same circuit before handing it out: every file pare writes
// (pare fmt, a reduced netlist) goes through it, so that pare never replaces
// a netlist with one its own loader refuses or reads differently. A failure
// is pare's fault, not the input's, and says so.
func Marshal(c *Circuit) ([]byte, error) {
	var buf bytes.Buffer
	if err := Write(&buf, c); err != nil {
		return nil, err
	}
	name := c.File
	if name == "" {
		name = "netlist.toml"
	}
	back, err := Parse(name, buf.Bytes())
	if err != nil {
		return nil, fmt.Errorf("%w: the written netlist does not load back: %v", ErrWriter, err)
	}
	if d := Differences(c, back); len(d) > 0 {
		if len(d) > 3 {
			d = append(d[:3:3], fmt.Sprintf("and %d more", len(d)-3))
		}
		return nil, fmt.Errorf("%w: the written netlist loads back different: %s", ErrWriter, strings.Join(d, "; "))
	}
	return buf.Bytes(), nil
}

// ErrWriter marks a netlist the writer could not put into text that loads
// back unchanged: a bug in pare, never in the input.
var ErrWriter = fmt.Errorf("internal error, please report")

// inSourceOrder returns the items in the order they were written in the
// netlist; items without a position (made by pare) follow, in natural order
// of their names. The list itself is not reordered: Circuit keeps it sorted.
func inSourceOrder[T any](items []T, key func(T) (Pos, string)) []T {
	out := append([]T(nil), items...)
	sort.SliceStable(out, func(i, j int) bool {
		pi, ni := key(out[i])
		pj, nj := key(out[j])
		switch {
		case pi.IsValid() && pj.IsValid():
			if pi.Line != pj.Line {
				return pi.Line < pj.Line
			}
			if pi.Col != pj.Col {
				return pi.Col < pj.Col
			}
			return naturalLess(ni, nj)
		case pi.IsValid() != pj.IsValid():
			return pi.IsValid()
		}
		return naturalLess(ni, nj)
	})
	return out
}

// naturalLess orders names with numbers by value: C2 before C10, V1a before
// V1b before V2.
func naturalLess(a, b string) bool {
	for a != "" && b != "" {
		da, db := isDigitByte(a[0]), isDigitByte(b[0])
		if da && db {
			na, ra := leadingNumber(a)
			nb, rb := leadingNumber(b)
			if na != nb {
				return na < nb
			}
			a, b = ra, rb
			continue
		}
		if a[0] != b[0] {
			return a[0] < b[0]
		}
		a, b = a[1:], b[1:]
	}
	return len(a) < len(b)
}

func isDigitByte(c byte) bool { return '0' <= c && c <= '9' }

// leadingNumber splits off the digits at the start of s; a run too long for
// an int compares by its length, then as text, so the order stays total.
func leadingNumber(s string) (string, string) {
	i := 0
	for i < len(s) && isDigitByte(s[i]) {
		i++
	}
	n := strings.TrimLeft(s[:i], "0")
	return fmt.Sprintf("%020d", len(n)) + n, s[i:]
}
