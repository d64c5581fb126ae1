package main

import (
	"bytes"
	"fmt"
	"net/url"
	"os"
	"path/filepath"
	"strings"

	"pare/internal/esc"
	"pare/internal/outfile"
)

// The batch index: one row per set, in input order, linking its pack's
// repair note. Every string that came from a netlist or a file name is
// escaped for the page it goes into (a title may hold `|`, `<`, `]`), by
// internal/esc.

const (
	indexMarkdown = "index.md"
	indexHTML     = "index.html"
)

func writeIndex(at string, packs []pack) error {
	if err := os.MkdirAll(at, 0o755); err != nil {
		return err
	}
	var md, page bytes.Buffer
	md.WriteString("# Repair packs\n\n| set | title | parts | stages | result |\n|---|---|---|---|---|\n")
	page.WriteString("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><title>Repair packs</title></head><body>\n<h1>Repair packs</h1>\n<table>\n<tr><th>set</th><th>title</th><th>parts</th><th>stages</th><th>result</th></tr>\n")
	for _, p := range packs {
		name := filepath.Base(p.path)
		parts, stages := "", ""
		if p.code != exitBad {
			parts = fmt.Sprintf("%d → %d", p.before.Parts, p.after.Parts)
			stages = fmt.Sprint(p.stages)
		}
		if p.code == exitBad {
			fmt.Fprintf(&md, "| %s | %s | | | %s |\n", mdEscape(name), mdEscape(p.title), mdEscape(p.verdict))
			fmt.Fprintf(&page, "<tr><td>%s</td><td>%s</td><td></td><td></td><td>%s</td></tr>\n",
				esc.HTML(name), esc.HTML(p.title), esc.HTML(p.verdict))
			continue
		}
		// Each index links the note in its own format: a browser reading
		// index.html opens the HTML note, with its sheets inline.
		link := relLink(at, filepath.Join(p.dir, fileNote))
		fmt.Fprintf(&md, "| [%s](%s) | %s | %s | %s | %s |\n", mdEscape(name), link, mdEscape(p.title), parts, stages, mdEscape(p.verdict))
		fmt.Fprintf(&page, "<tr><td><a href=\"%s\">%s</a></td><td>%s</td><td>%s</td><td>%s</td><td>%s</td></tr>\n",
			esc.HTML(relLink(at, filepath.Join(p.dir, fileNoteHTML))), esc.HTML(name), esc.HTML(p.title), parts, stages, esc.HTML(p.verdict))
	}
	page.WriteString("</table>\n</body></html>\n")
	if err := outfile.WriteFile(filepath.Join(at, indexMarkdown), md.Bytes()); err != nil {
		return err
	}
	return outfile.WriteFile(filepath.Join(at, indexHTML), page.Bytes())
}

// relLink is target relative to the index's folder, each segment escaped
// for a URL path.
func relLink(from, target string) string {
	rel, err := filepath.Rel(from, target)
	if err != nil {
		abs, _ := filepath.Abs(target)
		rel = abs
	}
	segs := strings.Split(filepath.ToSlash(rel), "/")
	for i, s := range segs {
		segs[i] = url.PathEscape(s)
	}
	return strings.Join(segs, "/")
}

// mdEscape makes text literal in a Markdown table cell (esc.MarkdownAll:
// every punctuation mark Markdown or a table gives a meaning is escaped).
func mdEscape(s string) string { return esc.MarkdownAll(s) }
