package align

import (
	"fmt"
	"io"
	"strings"

	"pare/internal/esc"
)

// WriteHTML writes the guide as the HTML note's "Alignment" section, with
// WriteMarkdown's words in the same order (the note's
// TestHTMLSaysWhatMarkdownSays holds the two to the same text).
func WriteHTML(w io.Writer, g *Guide) error {
	var b strings.Builder
	b.WriteString("<h2>Alignment</h2>\n")
	if len(g.Caution) > 0 {
		b.WriteString("<div class=\"n-caution\" role=\"note\">\n")
		for _, l := range g.Caution {
			fmt.Fprintf(&b, "<p>%s</p>\n", esc.HTML(l))
		}
		b.WriteString("</div>\n")
	}
	intro, items, closing := g.procedure()
	if intro != "" {
		fmt.Fprintf(&b, "<p>%s</p>\n", esc.HTML(intro))
	}
	if len(items) > 0 {
		b.WriteString("<ol>\n")
		for _, it := range items {
			fmt.Fprintf(&b, "<li value=\"%d\">%s<br/>%s", it.n, esc.HTML(it.text), esc.HTML(it.how))
			for _, r := range it.repeatsAfter {
				fmt.Fprintf(&b, "<br/><b>%s</b>", esc.HTML(r))
			}
			b.WriteString("</li>\n")
		}
		b.WriteString("</ol>\n")
	}
	htmlItems(&b, closing)
	writePresetsHTML(&b, g)
	fmt.Fprintf(&b, "<h3>Signal injection</h3>\n<p>From the output back to the input; levels from the AC solver on the whole circuit as captured; %s.</p>\n", esc.HTML(g.injectNote()))
	if len(g.Inject) > 0 {
		b.WriteString("<table>\n<tr><th>#</th><th>inject at</th><th>frequency</th><th>level</th><th>gives</th><th>stage gain</th></tr>\n")
		for i, in := range g.Inject {
			fmt.Fprintf(&b, "<tr><td>%d</td><td><code>%s</code> on <code>%s</code></td><td>%s</td><td>%s</td><td>%s</td><td>%s</td></tr>\n", i+1,
				esc.HTML(in.Where), esc.HTML(in.Net), esc.HTML(hz(in.Freq)+freqNote(in)), esc.HTML(levelCell(in)), esc.HTML(in.RefWhat), esc.HTML(gainCell(in)))
		}
		b.WriteString("</table>\n")
	}
	if g.InjectErr != "" {
		fmt.Fprintf(&b, "<p>No table: %s.</p>\n", esc.HTML(g.InjectErr))
	}
	if len(g.Hints) > 0 {
		fmt.Fprintf(&b, "<h3>Symptoms %s</h3>\n<table>\n<tr><th>stage</th><th>fault</th><th>readings</th><th>injection table</th></tr>\n", practice)
		for _, h := range g.Hints {
			fmt.Fprintf(&b, "<tr><td>%s</td><td>%s</td><td>%s</td><td>%s</td></tr>\n", esc.HTML(strings.Join(h.Stages, ", ")), esc.HTML(h.Fault), esc.HTML(h.Readings), esc.HTML(h.Inject))
		}
		b.WriteString("</table>\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func htmlItems(b *strings.Builder, lines []string) {
	if len(lines) == 0 {
		return
	}
	b.WriteString("<ul>\n")
	for _, l := range lines {
		fmt.Fprintf(b, "<li>%s</li>\n", esc.HTML(l))
	}
	b.WriteString("</ul>\n")
}
