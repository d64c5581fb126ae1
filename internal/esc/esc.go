// Package esc is the one place where text that came from a user (a title,
// a label, a note, a gang name, a file name) is made safe for the place it
// is written to. Each sink has one function; every writer of that sink
// calls it, so a new kind of hostile text is fixed here once.
//
//   - Visible: what all sinks share. Control characters (ESC sequences
//     that would drive a terminal, NUL, DEL, the C1 set), the bidirectional
//     formatting characters (an RTL override reverses the text after it)
//     and invalid UTF-8 are shown as escapes (\x1b, \u202e, \xff) instead
//     of being passed on. The text is still readable, and nothing in it
//     acts.
//   - Terminal: Visible, keeping newlines and tabs; NewTerminalWriter
//     applies it to everything a command prints.
//   - Markdown, MarkdownCell, MarkdownAll and MarkdownCode: text in a
//     paragraph, in a table cell, anywhere (every mark escaped), and
//     text inside a code span. Nothing a user writes can open a tag, a
//     link, an image or an entity, or leave a code span.
//   - HTML: text content and attribute values.
//   - SVG: text for the svgo writer, which escapes & < > itself (text and
//     titles), so SVG adds Visible; SVGAttr escapes for attribute values,
//     which svgo passes through raw.
package esc

import (
	"fmt"
	"html"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Hidden reports whether r acts instead of showing (a control or bidi
// character): the TOML writer writes such a character as a \u escape.
func Hidden(r rune) bool { return hidden(r) }

// hidden reports characters that act instead of showing: controls and the
// bidirectional formatting characters (Unicode TR 9), plus the line and
// paragraph separators, which some viewers take for line breaks.
func hidden(r rune) bool {
	switch {
	case r < 0x20, r == 0x7f, r >= 0x80 && r < 0xa0:
		return true
	case r == 0x061c, r == 0x200e, r == 0x200f, r >= 0x202a && r <= 0x202e, r >= 0x2066 && r <= 0x2069:
		return true
	case r == 0x2028, r == 0x2029:
		return true
	}
	return false
}

// escapeRune writes the visible form of a hidden character.
func escapeRune(b *strings.Builder, r rune) {
	switch {
	case r == '\n':
		b.WriteString(`\n`)
	case r == '\r':
		b.WriteString(`\r`)
	case r == '\t':
		b.WriteString(`\t`)
	case r < 0x100:
		fmt.Fprintf(b, `\x%02x`, r)
	default:
		fmt.Fprintf(b, `\u%04x`, r)
	}
}

// Visible returns s with every hidden character and every byte of invalid
// UTF-8 written as an escape. Text without them comes back unchanged.
func Visible(s string) string { return visible(s, false) }

// visible does the work; keepLines leaves newlines and tabs alone (for
// multi-line terminal output).
func visible(s string, keepLines bool) string {
	if clean(s, keepLines) {
		return s
	}
	var b strings.Builder
	for i := 0; i < len(s); {
		r, size := utf8.DecodeRuneInString(s[i:])
		switch {
		case r == utf8.RuneError && size == 1:
			fmt.Fprintf(&b, `\x%02x`, s[i])
		case keepLines && (r == '\n' || r == '\t'):
			b.WriteRune(r)
		case hidden(r):
			escapeRune(&b, r)
		default:
			b.WriteString(s[i : i+size])
		}
		i += size
	}
	return b.String()
}

func clean(s string, keepLines bool) bool {
	for i := 0; i < len(s); {
		r, size := utf8.DecodeRuneInString(s[i:])
		if (r == utf8.RuneError && size == 1) || (hidden(r) && !(keepLines && (r == '\n' || r == '\t'))) {
			return false
		}
		i += size
	}
	return true
}

// Terminal makes text safe to print on a terminal: Visible, but newlines
// and tabs stay, since a message or a log may span lines.
func Terminal(s string) string { return visible(s, true) }

// HTML escapes text for an HTML text node or a quoted attribute value.
func HTML(s string) string { return html.EscapeString(Visible(s)) }

// SVG makes text safe for svgo's Text, Title and Desc, which escape the
// XML characters themselves: what is left is what would act or hide.
func SVG(s string) string { return Visible(s) }

// SVGAttr escapes a value for an SVG attribute written by hand (svgo
// passes attribute strings through as they are).
func SVGAttr(s string) string { return html.EscapeString(Visible(s)) }

// MarkdownCode makes text safe inside a `code span`: the span cannot be
// left (no backtick, no line break, so no blank line either), and nothing
// inside a code span is markup.
func MarkdownCode(s string) string {
	return strings.ReplaceAll(Visible(oneLine.Replace(s)), "`", "'")
}

// Markdown escapes free text for a Markdown paragraph, list item or table
// cell: no emphasis, link, image, autolink, HTML tag, entity, heading,
// list or quote can start from it (MarkdownCell also escapes the bar that
// would split a table cell).
// An underscore inside a word (rf_tank) starts no emphasis in CommonMark,
// so it is left bare and the raw note stays readable.
func Markdown(s string) string {
	rs := []rune(Visible(oneLine.Replace(s)))
	var b strings.Builder
	for i, r := range rs {
		switch r {
		case '\\', '*', '`', '[', ']', '#', '<', '>', '&', '!', '~':
			b.WriteRune('\\')
		case '_':
			if !(i > 0 && i+1 < len(rs) && isWord(rs[i-1]) && isWord(rs[i+1])) {
				b.WriteRune('\\')
			}
		case '-', '+':
			if i == 0 && markerEnd(rs, 1) { // "- item" would be a list item
				b.WriteRune('\\')
			}
		case '.', ')':
			if orderedListStart(rs[:i]) && markerEnd(rs, i+1) { // "1. item"
				b.WriteRune('\\')
			}
		}
		b.WriteRune(r)
	}
	return b.String()
}

// markerEnd reports whether a list marker ending before rs[i] would be
// one: followed by a space or by nothing.
func markerEnd(rs []rune, i int) bool { return i >= len(rs) || rs[i] == ' ' }

// MarkdownCell is Markdown for a table cell, where a bar would start the
// next column.
func MarkdownCell(s string) string { return strings.ReplaceAll(Markdown(s), "|", `\|`) }

// MarkdownAll makes text literal wherever it stands in Markdown, a table
// cell included: every ASCII punctuation mark Markdown or a table gives a
// meaning is backslash-escaped (CommonMark allows the escape before any of
// them), and a line break becomes a space. Less readable as raw text than
// Markdown, for cells of generated tables such as the batch index.
func MarkdownAll(s string) string {
	var b strings.Builder
	for _, r := range Visible(oneLine.Replace(s)) {
		if strings.ContainsRune("\\`*_{}[]()<>#+-.!|~&", r) {
			b.WriteByte('\\')
		}
		b.WriteRune(r)
	}
	return b.String()
}

// orderedListStart reports whether the text before a '.' or ')' is all
// digits from the start, which would make the line an ordered list item.
func orderedListStart(before []rune) bool {
	if len(before) == 0 || len(before) > 9 {
		return false
	}
	for _, r := range before {
		if r < '0' || r > '9' {
			return false
		}
	}
	return true
}

func isWord(r rune) bool { return unicode.IsLetter(r) || unicode.IsDigit(r) }

// oneLine turns line breaks and tabs into spaces: Markdown text and code
// spans are written on one line, and a break could end a paragraph.
var oneLine = strings.NewReplacer("\r\n", " ", "\n", " ", "\r", " ", "\t", " ")
