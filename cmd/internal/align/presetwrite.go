package align

import (
	"fmt"
	"strings"

	"pare/internal/esc"
)

// presetItem is one preset as it is printed: what it sets, then its
// lines (where to measure, the test points, the caution).
type presetItem struct {
	title string
	lines []string
}

// presetItems are the guide's presets in print order.
func (g *Guide) presetItems() []presetItem {
	var out []presetItem
	for _, p := range g.Presets {
		it := presetItem{title: cap1(p.Job) + "."}
		if p.Job == "" {
			it.title = cap1(p.Why) + "."
		}
		if p.Measure != "" {
			it.lines = append(it.lines, "Measure: "+p.Measure+".")
		}
		for _, t := range p.Points {
			it.lines = append(it.lines, "Test point: "+t+".")
		}
		if p.Caution != "" {
			it.lines = append(it.lines, "Caution: "+p.Caution+".")
		}
		out = append(out, it)
	}
	return out
}

// presetsHead opens the presets' section.
const presetsHead = "Presets, in the order they are set " + practice + ": bias first, with no signal; then hum; then an oscillator's start"

func writePresetsText(b *strings.Builder, g *Guide) {
	items := g.presetItems()
	if len(items) == 0 {
		return
	}
	fmt.Fprintf(b, "\n%s:\n", presetsHead)
	for i, it := range items {
		fmt.Fprintf(b, "  %d. %s\n", i+1, it.title)
		for _, l := range it.lines {
			fmt.Fprintf(b, "     %s\n", l)
		}
	}
}

func writePresetsMarkdown(b *strings.Builder, g *Guide) {
	items := g.presetItems()
	if len(items) == 0 {
		return
	}
	fmt.Fprintf(b, "\n### Presets\n\n%s.\n\n", esc.Markdown(presetsHead))
	for i, it := range items {
		fmt.Fprintf(b, "%d. %s", i+1, esc.Markdown(it.title))
		for _, l := range it.lines {
			fmt.Fprintf(b, "  \n   %s", esc.Markdown(l))
		}
		b.WriteString("\n")
	}
}

func writePresetsHTML(b *strings.Builder, g *Guide) {
	items := g.presetItems()
	if len(items) == 0 {
		return
	}
	fmt.Fprintf(b, "<h3>Presets</h3>\n<p>%s.</p>\n<ol>\n", esc.HTML(presetsHead))
	for _, it := range items {
		fmt.Fprintf(b, "<li>%s", esc.HTML(it.title))
		for _, l := range it.lines {
			fmt.Fprintf(b, "<br/>%s", esc.HTML(l))
		}
		b.WriteString("</li>\n")
	}
	b.WriteString("</ol>\n")
}
