package note

import (
	"fmt"
	"strings"
	"unicode"
)

// Num prints a deviation or tolerance with at most three decimals and no
// trailing zeros: "0.5", "0.012", "5".
func Num(v float64) string {
	s := fmt.Sprintf("%.3f", v)
	s = strings.TrimRight(s, "0")
	s = strings.TrimSuffix(s, ".")
	if s == "-0" {
		s = "0"
	}
	return s
}

func orDash(s string) string {
	if s == "" {
		return "–"
	}
	return s
}

// codeList writes refs or net names as code spans, so underscores in names
// like osc_g are never read as emphasis.
func codeList(items []string) string {
	out := make([]string, len(items))
	for i, s := range items {
		out[i] = "`" + mdCode(s) + "`"
	}
	return strings.Join(out, ", ")
}

// mdCode keeps a code span intact: a backtick inside would end it.
func mdCode(s string) string { return strings.ReplaceAll(s, "`", "'") }

// mdText escapes the characters that would turn free text (a rule's
// justification, a title) into markup: emphasis, links, HTML, headings.
// An underscore inside a word (rf_tank) starts no emphasis in CommonMark, so
// it is left alone and the raw note stays readable.
func mdText(s string) string {
	var b strings.Builder
	rs := []rune(s)
	for i, r := range rs {
		switch r {
		case '\\', '*', '`', '[', ']', '#':
			b.WriteRune('\\')
			b.WriteRune(r)
		case '_':
			if i > 0 && i+1 < len(rs) && isWordRune(rs[i-1]) && isWordRune(rs[i+1]) {
				b.WriteRune(r)
			} else {
				b.WriteString(`\_`)
			}
		case '<', '>':
			// A backslash escape keeps the raw note readable ("|Xc| \> 0.1·|Z|")
			// and, unlike a bare '<', never opens an HTML tag.
			b.WriteRune('\\')
			b.WriteRune(r)
		case '\n', '\r':
			b.WriteRune(' ')
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}

func isWordRune(r rune) bool { return unicode.IsLetter(r) || unicode.IsDigit(r) }

// mdCell is mdText for a table cell, where a bar would start a new column.
func mdCell(s string) string { return strings.ReplaceAll(mdText(s), "|", `\|`) }
