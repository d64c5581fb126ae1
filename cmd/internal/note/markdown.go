package note

import (
	"fmt"
	"strings"

	"pare/internal/esc"
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

// mdCode makes text safe inside a code span (esc.MarkdownCode): a gang
// name or a file name with a backtick or a line break in it cannot leave
// the span.
func mdCode(s string) string { return esc.MarkdownCode(s) }

// mdText escapes free text (a rule's justification, a title) for the note:
// no emphasis, link, image, HTML, entity, heading or list can start from
// it, and control and bidi characters are shown as escapes (esc.Markdown).
func mdText(s string) string { return esc.Markdown(s) }

// mdCell is mdText for a table cell, where a bar would start a new column.
func mdCell(s string) string { return esc.MarkdownCell(s) }
