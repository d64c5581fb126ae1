package main

import (
	"bytes"
	"fmt"
	"html"
	"net/url"
	"os"
	"path/filepath"
	"strings"
)

// The batch index: one row per set, in input order, linking its pack's
// repair note. Every string that came from a netlist or a file name is
// escaped for the page it goes into (a title may hold `|`, `<`, `]`).

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
				html.EscapeString(name), html.EscapeString(p.title), html.EscapeString(p.verdict))
			continue
		}
		link := relLink(at, filepath.Join(p.dir, fileNote))
		fmt.Fprintf(&md, "| [%s](%s) | %s | %s | %s | %s |\n", mdEscape(name), link, mdEscape(p.title), parts, stages, mdEscape(p.verdict))
		fmt.Fprintf(&page, "<tr><td><a href=\"%s\">%s</a></td><td>%s</td><td>%s</td><td>%s</td><td>%s</td></tr>\n",
			html.EscapeString(link), html.EscapeString(name), html.EscapeString(p.title), parts, stages, html.EscapeString(p.verdict))
	}
	page.WriteString("</table>\n</body></html>\n")
	if err := writeFileAtomic(filepath.Join(at, indexMarkdown), md.Bytes()); err != nil {
		return err
	}
	return writeFileAtomic(filepath.Join(at, indexHTML), page.Bytes())
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

// mdEscape makes text literal in a Markdown table cell: every punctuation
// mark that Markdown or a table gives a meaning is backslash-escaped, and a
// line break becomes a space.
func mdEscape(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case r == '\n' || r == '\r':
			b.WriteByte(' ')
		case strings.ContainsRune("\\`*_{}[]()<>#+-.!|~&", r):
			b.WriteByte('\\')
			b.WriteRune(r)
		default:
			b.WriteRune(r)
		}
	}
	return b.String()
}
