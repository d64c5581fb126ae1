package render

import (
	"fmt"
	"sort"
	"strings"

	"pare/graph"
	"pare/render/geom"
	"pare/render/layout"
	"pare/render/symbol"
)

// Paper is a sheet of paper, landscape, in millimetres.
type Paper struct {
	Name string
	W, H float64
}

// Papers pare prints on (ISO 216 A4 and A3, ANSI letter), landscape.
var Papers = []Paper{
	{Name: "A4", W: 297, H: 210},         // ISO 216
	{Name: "A3", W: 420, H: 297},         // ISO 216
	{Name: "letter", W: 279.4, H: 215.9}, // ANSI/ASME Y14.1 size A, 11 × 8.5 in
}

// ParsePaper reads a --page value: a paper name (any case), or "none" (or
// nothing, as ParseStyle and ParseView read nothing as their default) for
// one long sheet as wide as the drawing (nil).
func ParsePaper(s string) (*Paper, error) {
	if s == "" || strings.EqualFold(s, "none") {
		return nil, nil
	}
	for i := range Papers {
		if strings.EqualFold(s, Papers[i].Name) {
			return &Papers[i], nil
		}
	}
	return nil, fmt.Errorf("unknown page %q (want A4, A3, letter or none)", s)
}

// Text on paper: the smallest text pare sets (the small class, SmallScale
// of a label) is at least MinTextMM high, the smallest character height
// IEC 61082-1 and ISO 3098 allow on a drawing (taken as the font size).
const (
	MinTextMM = 2.5
	marginMM  = 10  // a printer's unprintable edge, common practice
	rowGap    = 4.0 // grid units between rows on a page
)

// mmPerUnit is the scale on paper: one grid unit in millimetres.
func mmPerUnit() float64 { return MinTextMM / min(symbol.SmallScale, furnitureW) }

// content is the page's printable area in grid units, less the margins.
func (p *Paper) content() (w, h float64) {
	k := mmPerUnit()
	return (p.W - 2*marginMM) / k, (p.H - 2*marginMM) / k
}

// block is a stretch of the signal path that cannot be cut: a stage frame
// with its parts, or a part no frame holds, with the x span it needs. A
// port (the set's connection to what is cut away) is never cut from the
// stretch before it.
type block struct {
	x0, x1 float64
	refs   []string
	port   bool
}

// blocks are the uncuttable stretches of a sheet left to right, from a
// placement without routing.
func blocks(s *Sheet, ext map[string]geom.Rect) []block {
	framed := map[string]bool{}
	var bs []block
	add := func(refs []string) {
		b := block{x0: 1e18, x1: -1e18}
		for _, r := range refs {
			if e, ok := ext[r]; ok && !framed[r] {
				framed[r] = true
				b.refs = append(b.refs, r)
				b.x0, b.x1 = min(b.x0, e.X0), max(b.x1, e.X1)
			}
		}
		if len(b.refs) > 0 {
			bs = append(bs, b)
		}
	}
	for _, f := range s.Frames {
		add(f.Parts)
	}
	for _, p := range s.Circuit.Parts {
		add([]string{p.Ref})
		if n := len(bs); n > 0 && bs[n-1].refs[0] == p.Ref && p.Kind == graph.Port {
			bs[n-1].port = true
		}
	}
	sort.SliceStable(bs, func(i, j int) bool { return bs[i].x0 < bs[j].x0 })
	// stretches that overlap in x cannot be cut apart
	var out []block
	for _, b := range bs {
		if n := len(out); n > 0 && b.x0 < out[n-1].x1 {
			out[n-1].x1 = max(out[n-1].x1, b.x1)
			out[n-1].refs = append(out[n-1].refs, b.refs...)
			continue
		}
		out = append(out, b)
	}
	return out
}

// splitRows packs the blocks into rows no wider than width, in signal
// order; a block wider than a row gets a row of its own.
func splitRows(bs []block, width float64) [][]block {
	var rows [][]block
	x0 := 0.0
	for _, b := range bs {
		if len(rows) == 0 || (b.x1-x0 > width && !b.port) {
			rows = append(rows, nil)
			x0 = b.x0
		}
		rows[len(rows)-1] = append(rows[len(rows)-1], b)
	}
	return rows
}

// peel moves the last stretch of row i to the start of the next row (a
// new row after the last): the row came out wider or taller than the page
// once routed. Rows stay as full as they can, so a sheet takes few pages.
func peel(rows [][]block, i int) [][]block {
	r := rows[i]
	cut := len(r) - 1
	for cut > 1 && r[cut].port {
		cut--
	}
	out := append([][]block{}, rows[:i]...)
	out = append(out, r[:cut])
	moved := append([]block{}, r[cut:]...)
	if i+1 < len(rows) {
		return append(append(out, append(moved, rows[i+1]...)), rows[i+2:]...)
	}
	return append(out, moved)
}

// pull moves the first stretch of row i+1 (with the ports that follow it)
// to the end of row i, dropping row i+1 when nothing is left of it: row i
// came out with room to spare.
func pull(rows [][]block, i int) [][]block {
	next := rows[i+1]
	k := 1
	for k < len(next) && next[k].port {
		k++
	}
	out := append([][]block{}, rows[:i]...)
	out = append(out, append(append([]block{}, rows[i]...), next[:k]...))
	if k < len(next) {
		out = append(out, append([]block{}, next[k:]...))
	}
	return append(out, rows[i+2:]...)
}

// rowRefs are the parts of each row.
func rowRefs(rows [][]block) []map[string]bool {
	out := make([]map[string]bool, len(rows))
	for i, r := range rows {
		out[i] = map[string]bool{}
		for _, b := range r {
			for _, ref := range b.refs {
				out[i][ref] = true
			}
		}
	}
	return out
}

// rowSheets are the rows as sheets of their own: the circuit cut to the
// row's parts, its frames, and an off-row connector for every net that
// runs on in another row.
func rowSheets(s *Sheet, rows []map[string]bool) []*Sheet {
	rowsOf := map[string][]int{}
	for i, r := range rows {
		for _, p := range s.Circuit.Parts {
			if !r[p.Ref] {
				continue
			}
			for _, pn := range p.Pins {
				if l := rowsOf[pn.Net]; len(l) == 0 || l[len(l)-1] != i {
					rowsOf[pn.Net] = append(l, i)
				}
			}
		}
	}
	out := make([]*Sheet, len(rows))
	for i, r := range rows {
		sub := *s
		sub.Circuit = subCircuit(s.Circuit, r)
		sub.Frames = nil
		for _, f := range s.Frames {
			g := Frame{Title: f.Title, Subtitle: f.Subtitle, Places: f.Places}
			for _, p := range f.Parts {
				if r[p] {
					g.Parts = append(g.Parts, p)
				}
			}
			if len(g.Parts) > 0 {
				sub.Frames = append(sub.Frames, g)
			}
		}
		sub.continues = continues(sub.Circuit, rowsOf, i)
		out[i] = &sub
	}
	return out
}

// continues are the off-row connectors of row i: the wired nets of its parts
// that other rows share, incoming from an earlier row, outgoing to a later.
func continues(c *graph.Circuit, rowsOf map[string][]int, i int) []layout.Continuation {
	var nets []string
	seen := map[string]bool{}
	for _, p := range c.Parts {
		for _, pn := range p.Pins {
			n := pn.Net
			if n == "" || n == "nc" || seen[n] || c.RoleOf(n).IsACGround() || len(rowsOf[n]) < 2 {
				continue
			}
			seen[n] = true
			nets = append(nets, n)
		}
	}
	sort.Strings(nets)
	var out []layout.Continuation
	for _, n := range nets {
		l := rowsOf[n]
		if l[0] < i {
			out = append(out, layout.Continuation{Net: n, Label: n, In: true})
		}
		if l[len(l)-1] > i {
			out = append(out, layout.Continuation{Net: n, Label: n})
		}
	}
	return out
}

// subCircuit is the circuit cut to some parts: its nets and rails as they
// are, the inputs and outputs that still have a part on them.
func subCircuit(c *graph.Circuit, keep map[string]bool) *graph.Circuit {
	sub := &graph.Circuit{File: c.File, Title: c.Title, Band: c.Band, Freqs: c.Freqs, Regions: c.Regions,
		Nets: c.Nets, Rails: c.Rails}
	on := map[string]bool{}
	for _, p := range c.Parts {
		if keep[p.Ref] {
			sub.Parts = append(sub.Parts, p)
			for _, pn := range p.Pins {
				on[pn.Net] = true
			}
		}
	}
	for _, n := range c.Inputs {
		if on[n] {
			sub.Inputs = append(sub.Inputs, n)
		}
	}
	for _, n := range c.Outputs {
		if on[n] {
			sub.Outputs = append(sub.Outputs, n)
		}
	}
	return sub
}
