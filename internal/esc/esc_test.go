package esc

import (
	"bytes"
	"strings"
	"testing"
)

// hostile are the texts a red-team run put into titles, labels, notes, gang
// names and file names (from its report): terminal escapes, bidi overrides,
// HTML, Markdown links and images, entities, line breaks out of a span.
var hostile = []string{
	"\x1b[2J\x1b[31mred\x1b]0;title\x07",
	"abc\u202edcba\u202c",
	"\u2066isolate\u2069 \u200fmark",
	"<img src=x onerror=alert(1)>",
	"[x](javascript:alert(1))",
	"![i](http://example.invalid/x.png)",
	"a`b\n\n<script>alert(1)</script>`",
	"&amp; &lt;b&gt;",
	"- item\n# heading\n> quote",
	"1. one",
	"nul\x00del\x7fc1\u0085",
	"bad \xff\xfe utf-8",
	"line\u2028sep",
}

// acting lists what must not reach a sink raw: the hidden characters.
func acting(s string) bool {
	for _, r := range s {
		if hidden(r) && r != '\n' && r != '\t' {
			return true
		}
	}
	return strings.ToValidUTF8(s, "") != s
}

func TestVisible(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"plain 4k7 µΩ ±5 % – ok", "plain 4k7 µΩ ±5 % – ok"}, // unchanged: nothing hidden
		{"\x1b[31mred", `\x1b[31mred`},
		{"abc\u202edef", `abc\u202edef`},
		{"a\xffb", `a\xffb`},
		{"two\nlines\ttab", `two\nlines\ttab`},
		{"c1\u009bx", `c1\x9bx`},
	} {
		if got := Visible(c.in); got != c.want {
			t.Errorf("Visible(%q) = %q, want %q", c.in, got, c.want)
		}
	}
	if got := Terminal("two\nlines\x1b"); got != "two\nlines\\x1b" {
		t.Errorf("Terminal keeps newlines: got %q", got)
	}
}

// Every sink's function leaves nothing that acts: no hidden character, no
// invalid UTF-8, and for each sink none of its own markup.
func TestSinks(t *testing.T) {
	for _, h := range hostile {
		for name, f := range map[string]func(string) string{
			"Visible": Visible, "HTML": HTML, "SVG": SVG, "SVGAttr": SVGAttr, "Markdown": Markdown, "MarkdownCell": MarkdownCell, "MarkdownAll": MarkdownAll, "MarkdownCode": MarkdownCode,
		} {
			if got := f(h); acting(got) {
				t.Errorf("%s(%q) = %q still holds a hidden character", name, h, got)
			}
		}
		if got := HTML(h); strings.ContainsAny(got, `<>"'`) {
			t.Errorf("HTML(%q) = %q holds markup", h, got)
		}
		if got := SVGAttr(h); strings.ContainsAny(got, `<>"'`) {
			t.Errorf("SVGAttr(%q) = %q holds markup", h, got)
		}
		if got := MarkdownCode(h); strings.ContainsAny(got, "`\n\r") {
			t.Errorf("MarkdownCode(%q) = %q can leave its code span", h, got)
		}
		if got := Markdown(h); !markdownInert(got, "*`[]#<>&!~") {
			t.Errorf("Markdown(%q) = %q holds unescaped markup", h, got)
		}
		if got := MarkdownAll(h); !markdownInert(got, "*`[]#<>&!~|()_-+.{}") {
			t.Errorf("MarkdownAll(%q) = %q holds unescaped markup", h, got)
		}
		if got := MarkdownCell(h); !markdownInert(got, "*`[]#<>&!~|") {
			t.Errorf("MarkdownCell(%q) = %q holds unescaped markup", h, got)
		}
	}
}

// markdownInert checks that every character that can open markup is
// escaped by a backslash, that the text is one line, and that it does not
// start a block (list, heading, quote).
func markdownInert(s, markup string) bool {
	if strings.ContainsAny(s, "\n\r") {
		return false
	}
	rs := []rune(s)
	for i := 0; i < len(rs); i++ {
		if rs[i] == '\\' {
			i++ // the escaped character
			continue
		}
		if strings.ContainsRune(markup, rs[i]) {
			return false
		}
	}
	return len(rs) < 2 || !(strings.ContainsRune("-+", rs[0]) && rs[1] == ' ')
}

// The Markdown escapes themselves (CommonMark: a backslash before ASCII
// punctuation makes it literal).
func TestMarkdown(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"rf_tank", "rf_tank"},
		{"_x_", `\_x\_`},
		{"&amp;", `\&amp;`},
		{"- item", `\- item`},
		{"1. one", `1\. one`},
		{"--no-verify", "--no-verify"},
		{"1.5 MHz", "1.5 MHz"},
		{"a\nb", "a b"},
		{"|Xc| < 0.1·|Z|", `|Xc| \< 0.1·|Z|`},
	} {
		if got := Markdown(c.in); got != c.want {
			t.Errorf("Markdown(%q) = %q, want %q", c.in, got, c.want)
		}
	}
}

// A character split over two writes comes out whole, and escapes still
// apply across the split.
func TestTerminalWriter(t *testing.T) {
	var out bytes.Buffer
	w := NewTerminalWriter(&out)
	mu := []byte("µ")
	w.Write([]byte("a"))
	w.Write(mu[:1])
	w.Write(mu[1:])
	w.Write([]byte("\x1b[2J\n"))
	w.Write([]byte{0xe2, 0x80}) // first two bytes of U+202E
	w.Write([]byte{0xae, 'z'})
	w.Write([]byte{0xc3})
	w.Flush()
	if got, want := out.String(), "aµ\\x1b[2J\n\\u202ez\\xc3"; got != want {
		t.Errorf("got %q, want %q", got, want)
	}
}
