package note

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"strings"

	"pare/cmd/internal/align"
	"pare/internal/esc"
	"pare/render"
)

// The views a sheet can play in the HTML note's hover: a part on the
// reduced sheet lights up the originals it stands for on the faded sheet,
// and the other way round. Sheet.View names one of them (or neither).
const (
	ViewReduced = "reduced"
	ViewFaded   = "faded"
)

// WriteHTML writes the repair note as one self-contained HTML page: the
// sections of Write, made from the same Note (never by converting the
// Markdown), the sheets inline as SVG (svgs holds each Sheet.File's
// bytes), a print style sheet that puts each sheet on a landscape page of
// its own, and a few lines of script for the hover. Nothing is loaded from
// outside: no font, no script, no image. Output depends only on its
// arguments, so the same run gives the same bytes.
func WriteHTML(w io.Writer, n *Note, svgs map[string][]byte) error {
	var b bytes.Buffer
	title := n.Title
	if title == "" {
		title = n.Source
	}
	fmt.Fprintf(&b, "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n<title>Repair note: %s</title>\n<style>%s</style>\n</head>\n<body>\n",
		h(title), htmlCSS)
	fmt.Fprintf(&b, "<h1>Repair note: %s</h1>\n", h(title))
	fmt.Fprintf(&b, "<p>Made by pare %s from <code>%s</code> at reduction level <b>%s</b>, symbols %s.</p>\n",
		h(n.Version), h(n.Source), h(n.Level), h(n.Symbols))
	hCaution(&b, n.Caution)
	if n.CircuitNote != "" {
		fmt.Fprintf(&b, "<p>%s</p>\n", h(n.CircuitNote))
	}
	if len(n.Furniture) > 0 {
		fmt.Fprintf(&b, "<h2 id=\"n-legend\">Legend</h2>\n<p>%s</p>\n", h(legendIntro))
		hList(&b, n.Furniture)
	}
	hVerdict(&b, n)
	hFindings(&b, n)
	if err := hSheets(&b, n, svgs); err != nil {
		return err
	}
	if len(n.Sheets) > 0 {
		b.WriteString("<div class=\"n-rest\">\n")
	} else {
		b.WriteString("<div>\n")
	}
	hStages(&b, n)
	hOtherBands(&b, n)
	hDC(&b, n)
	if n.Align != nil {
		if err := align.WriteHTML(&b, n.Align); err != nil {
			return err
		}
	}
	hParts(&b, n)
	hPartNotes(&b, n)
	hSteps(&b, n)
	hVerify(&b, n)
	hWarnings(&b, n)
	b.WriteString("</div>\n")
	hHover(&b, n)
	b.WriteString("</body>\n</html>\n")
	_, err := w.Write(b.Bytes())
	return err
}

// htmlCSS is the page's one style sheet. On screen the two sheets are
// kept short enough to see both at once, so a hovered part and the parts
// it lights up are in view together. In print each sheet takes a landscape
// A4 page of its own, scaled to it whole (the SVG's viewBox is fitted
// inside a box smaller than the page, so no part is cut off), and the text
// flows on pages of its own. The sheets' own style sheets (inline in each
// SVG) use short class names; the page's classes start with n- so the two
// never meet. Only generic font families: nothing is fetched.
const htmlCSS = `
body{font-family:sans-serif;max-width:72em;margin:1em auto;padding:0 1em;line-height:1.4;color:#111;background:#fff}
h1{font-size:1.5em}h2{font-size:1.2em;margin-top:1.4em}
code{font-family:monospace;background:#f3f3f3;padding:0 .2em}
.n-caution{border:2px solid #a00;padding:.3em 1em;margin:1em 0}
.n-caution p{margin:.4em 0}
.n-verdict{font-size:1.05em}
table{border-collapse:collapse;margin:.5em 0}
th,td{border:1px solid #999;padding:.15em .4em;text-align:left;vertical-align:top}
td.n-num{text-align:right}
.n-sheet{margin:1em 0}
.n-sheet figcaption{margin:.3em 0}
.n-sheet svg{display:block;width:100%;height:auto;max-height:46vh;border:1px solid #ccc}
.n-sheet .part{pointer-events:bounding-box;cursor:crosshair}
.n-sheet .part.hl .s{stroke:#d00000}
.n-sheet .part.hl .f{fill:#d00000}
.n-sheet .part.hl text{fill:#d00000}
@page{size:A4 landscape;margin:10mm}
@media print{
body{max-width:none;margin:0;padding:0;font-size:10pt}
.n-screen{display:none}
.n-sheet{break-before:page;break-inside:avoid;height:180mm;margin:0;display:flex;flex-direction:column}
.n-sheet figcaption{flex:none;font-size:9pt;margin:0 0 2mm 0}
.n-sheet svg{flex:1 1 0;min-height:0;height:auto;max-height:none;border:0}
.n-rest{break-before:page}
table{font-size:8.5pt}
tr{break-inside:avoid}
}
`

// hSheets writes each sheet inline, under a caption that repeats the
// caution heading, so the caution is on every printed sheet as well as in
// the sheet's own footer.
func hSheets(b *bytes.Buffer, n *Note, svgs map[string][]byte) error {
	if len(n.Sheets) == 0 {
		return nil
	}
	b.WriteString("<div class=\"n-screen\">\n<h2>Sheets</h2>\n")
	if hasViews(n.Sheets) {
		b.WriteString("<p>Point at a part on the reduced sheet: the original parts it stands for light up on the faded sheet (and a part on the faded sheet lights up the reduced part it went into).</p>\n")
	}
	if len(n.AlignMarks) > 0 {
		fmt.Fprintf(b, "<p>%s</p>\n<ul>\n", h(alignMarksIntro))
		for _, l := range n.AlignMarks {
			fmt.Fprintf(b, "<li>%s</li>\n", h(l))
		}
		b.WriteString("</ul>\n")
	}
	b.WriteString("</div>\n")
	seen := map[string]int{}
	for i, s := range n.Sheets {
		data, ok := svgs[s.File]
		if !ok {
			return fmt.Errorf("the HTML note has no drawing for sheet %s", s.File)
		}
		id := fmt.Sprintf("n-sheet%d", i+1)
		if s.View == ViewReduced || s.View == ViewFaded {
			// a view drawn on several pages: n-reduced, n-reduced-p2, ...
			id = "n-" + s.View
			if seen[s.View]++; seen[s.View] > 1 {
				id += fmt.Sprintf("-p%d", seen[s.View])
			}
		}
		svg, err := inlineSVG(data, id, s.Alt)
		if err != nil {
			return fmt.Errorf("sheet %s: %w", s.File, err)
		}
		fmt.Fprintf(b, "<figure class=\"n-sheet\" id=\"%s\">\n<figcaption>", id)
		if s.Caption != "" {
			fmt.Fprintf(b, "<i>%s</i> ", h(s.Caption))
		}
		fmt.Fprintf(b, "<b>%s</b></figcaption>\n", h(n.Caution.Heading))
		b.Write(svg)
		b.WriteString("\n</figure>\n")
	}
	return nil
}

func hasViews(sheets []Sheet) bool {
	var red, faded bool
	for _, s := range sheets {
		red = red || s.View == ViewReduced
		faded = faded || s.View == ViewFaded
	}
	return red && faded
}

// inlineSVG makes a sheet's SVG file fit inside the page: the XML prolog
// and the generator comment before the root go (an HTML parser would take
// them for bogus comments), the root gets the sheet's alternative text,
// and the sheet's element ids (frames, parts, labels) get the figure's id
// as a prefix, so the two sheets' ids do not clash in one document. The
// renderer writes ids only as fixed words and escapes every user string in
// an attribute (a quote becomes &#34;), so ` id="` in its output is always
// one of its own.
func inlineSVG(data []byte, prefix, alt string) ([]byte, error) {
	i := bytes.Index(data, []byte("<svg"))
	if i < 0 {
		return nil, fmt.Errorf("no <svg> root")
	}
	s := string(bytes.TrimSpace(data[i:]))
	s = strings.ReplaceAll(s, ` id="`, ` id="`+prefix+`-`)
	s = `<svg role="img" aria-label="` + h(alt) + `"` + strings.TrimPrefix(s, "<svg")
	return []byte(s), nil
}

// hHover writes the merge record the hover needs, as JSON in a data block
// (keys and values are render.RefToken words, so nothing in it is markup),
// and the script that reads it. The script does nothing but add and remove
// a class on the sheets' part groups; without it the page reads the same.
func hHover(b *bytes.Buffer, n *Note) {
	if !hasViews(n.Sheets) {
		return
	}
	m := map[string][]string{} // json.Marshal writes map keys sorted
	drawn := n.Drawn
	if drawn == nil {
		drawn = n.Merged
	}
	for _, g := range drawn {
		from := make([]string, len(g.From))
		for i, f := range g.From {
			from[i] = render.RefToken(f)
		}
		m[render.RefToken(g.Into)] = from
	}
	js, _ := json.Marshal(m) // strings and slices of strings always marshal
	fmt.Fprintf(b, "<script type=\"application/json\" id=\"n-merge\">%s</script>\n<script>%s</script>\n", js, hoverJS)
}

// hoverJS lights up, while the pointer is on a part of one sheet, the
// parts it corresponds to on the other: a reduced part's originals (itself
// when it was kept as it is), a faded part's reduced part. Written without
// < and & so the page stays well-formed XML as well as HTML.
const hoverJS = `(function(){
var m=JSON.parse(document.getElementById("n-merge").textContent),back=Object.create(null);
var own=function(o,k){return Object.prototype.hasOwnProperty.call(o,k)};
Object.keys(m).forEach(function(k){m[k].forEach(function(o){back[o]=k})});
function parts(id){return document.querySelectorAll('figure[id="'+id+'"] .part,figure[id^="'+id+'-p"] .part')}
function mark(id,refs,on){
parts(id).forEach(function(g){if(refs.indexOf(g.getAttribute("data-ref"))!==-1)g.classList.toggle("hl",on)})}
function hook(from,to,map){
parts(from).forEach(function(g){var t=map(g.getAttribute("data-ref"));
g.addEventListener("mouseenter",function(){g.classList.add("hl");mark(to,t,true)});
g.addEventListener("mouseleave",function(){g.classList.remove("hl");mark(to,t,false)})})}
hook("n-reduced","n-faded",function(r){return own(m,r)?m[r]:[r]});
hook("n-faded","n-reduced",function(r){return [back[r]||r]});
})();`

// h escapes user text for an HTML text node or attribute (esc.HTML).
func h(s string) string { return esc.HTML(s) }

// hCode writes a ref, net or file name as code.
func hCode(s string) string { return "<code>" + h(s) + "</code>" }

func hCodeList(items []string) string {
	out := make([]string, len(items))
	for i, s := range items {
		out[i] = hCode(s)
	}
	return strings.Join(out, ", ")
}

// hList writes escaped lines as a bulleted list; nothing when empty.
func hList(b *bytes.Buffer, lines []string) {
	if len(lines) == 0 {
		return
	}
	b.WriteString("<ul>\n")
	for _, l := range lines {
		fmt.Fprintf(b, "<li>%s</li>\n", h(l))
	}
	b.WriteString("</ul>\n")
}
