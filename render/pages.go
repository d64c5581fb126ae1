package render

import (
	"fmt"
	"sort"
	"strings"

	"pare/graph"
	"pare/render/check"
	"pare/render/geom"
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
// IEC 61082-1 and ISO 3098 allow on a drawing (taken as the font size); the
// checker holds the number, and reports a page's text under it.
const (
	MinTextMM = check.MinTextMM
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
	ch     int  // the channel it belongs to (channels), 0 on a set of one
	loose  bool // the parts wired to no stretch nor to the signal path's ends (beside)
	// pieces are the stretches this one was joined from (a supply's
	// smoothing frame after its rectifier, frames overlapping in x), in
	// signal order, when there are several: a stretch too big for the
	// page on its own is cut between them (pieces), never through a
	// frame.
	pieces []block
	// chain is, on each piece of a joined stretch cut apart (pieceOut),
	// a number the pieces share (0 on any other stretch): a page break
	// between two is avoided where the pages allow (plan.splits).
	chain int
	// apart marks a supply filter's stretch on a reduced sheet (apartLast):
	// it goes on rows of its own after the signal's, never on a row beside
	// a signal stage.
	apart bool
	// riders are the unframed parts ride put on a stretch without pieces:
	// a stretch too big for the page is cut between them and its own
	// parts where they share no wired net (riderPieces)
	riders []string
}

// join is the stretch a followed by b, remembering both as pieces.
func join(a, b block) block {
	return block{x0: min(a.x0, b.x0), x1: max(a.x1, b.x1), port: a.port, ch: min(a.ch, b.ch), apart: a.apart && b.apart,
		refs:   append(append([]string{}, a.refs...), b.refs...),
		pieces: append(append([]block{}, a.split()...), b.split()...)}
}

// split is the stretch as its pieces, itself when it has none.
func (b block) split() []block {
	if len(b.pieces) == 0 {
		return []block{b}
	}
	return b.pieces
}

// blocks are the uncuttable stretches of a sheet in signal order, from a
// placement without routing: channel after channel, each left to right,
// with x measured as if the channels stood in one line (inLine), so the
// widths and gaps of a run of stretches read as on one row.
func blocks(s *Sheet, ext map[string]geom.Rect) []block {
	chOf := channels(s.Circuit)
	framed := map[string]bool{}
	var bs []block
	add := func(refs []string, joined, apart bool) {
		b := block{x0: 1e18, x1: -1e18, ch: -1, apart: apart}
		for _, r := range refs {
			if e, ok := ext[r]; ok && !framed[r] {
				framed[r] = true
				b.refs = append(b.refs, r)
				b.x0, b.x1 = min(b.x0, e.X0), max(b.x1, e.X1)
				if c := chOf[r]; b.ch < 0 || c < b.ch {
					b.ch = c
				}
			}
		}
		n := len(bs)
		switch {
		case len(b.refs) == 0:
		case joined && n > 0:
			bs[n-1] = join(bs[n-1], b)
		default:
			bs = append(bs, b)
		}
	}
	for i, f := range s.Frames {
		add(f.Parts, f.Joined && i > 0, s.View == Reduced && f.Apart)
	}
	blockOf := map[string]int{}
	for i, b := range bs {
		for _, r := range b.refs {
			blockOf[r] = i
		}
	}
	with := beside(s.Circuit, blockOf)
	if rides := deviceRides(s.Circuit, blockOf, with, ext); len(rides) > 0 {
		for _, p := range s.Circuit.Parts {
			if i, ok := rides[p.Ref]; ok && !framed[p.Ref] {
				framed[p.Ref] = true
				ride(s.Circuit, &bs[i], p)
			}
		}
		with = beside(s.Circuit, blockOf)
	}
	var loose, sockets []*graph.Part
	for _, p := range s.Circuit.Parts {
		if framed[p.Ref] || ext[p.Ref] == (geom.Rect{}) {
			continue
		}
		if i, ok := with[p.Ref]; ok {
			framed[p.Ref] = true
			if h, ok := acrossBlock(s.Circuit, p, blockOf); i < 0 && ok {
				ride(s.Circuit, &bs[h], p)
			} else if i < 0 {
				loose = append(loose, p)
			} else {
				ride(s.Circuit, &bs[i], p)
			}
			continue
		}
		if p.Kind == graph.Port && !opens(s.Circuit, p) {
			sockets = append(sockets, p)
			continue
		}
		add([]string{p.Ref}, false, false)
		if n := len(bs); n > 0 && bs[n-1].refs[0] == p.Ref && p.Kind == graph.Port {
			bs[n-1].port = true
		}
	}
	sort.SliceStable(bs, func(i, j int) bool {
		if bs[i].ch != bs[j].ch {
			return bs[i].ch < bs[j].ch
		}
		return bs[i].x0 < bs[j].x0
	})
	// stretches of a channel that overlap in x are cut apart only when
	// together they do not fit a page (pieces)
	var out []block
	for _, b := range bs {
		if n := len(out); n > 0 && b.ch == out[n-1].ch && b.x0 < out[n-1].x1 && b.apart == out[n-1].apart {
			out[n-1] = join(out[n-1], b)
			continue
		}
		out = append(out, b)
	}
	if moved := false; len(out) > 0 {
		if out, moved = branchesBeside(s.Circuit, out); moved {
			inLine(out)
		}
		if out, moved = unitsWhole(s.Circuit, out); moved {
			inLine(out)
		}
		if out, moved = fedFirst(s.Circuit, out); moved {
			inLine(out)
		}
		if out, moved = apartLast(out); moved {
			inLine(out)
		}
	}
	out = looseLast(out, loose, ext)
	out = homeSockets(s.Circuit, out, sockets, ext)
	if len(out) > 0 && out[len(out)-1].ch > 0 {
		inLine(out)
	}
	return leadingPorts(out)
}

// pieceOf is the piece of a joined stretch an unframed part riding on it
// (beside) goes with: the first that holds a part sharing a wired net with
// it, else the first.
func pieceOf(c *graph.Circuit, pieces []block, p *graph.Part) int {
	at := map[string]int{}
	for k, pc := range pieces {
		for _, r := range pc.refs {
			if _, ok := at[r]; !ok {
				at[r] = k
			}
		}
	}
	best := -1
	for _, pn := range p.Pins {
		if pn.Net == "" || pn.Net == graph.NotConnected || c.RoleOf(pn.Net).IsACGround() {
			continue
		}
		for _, cn := range c.ConnsOf(pn.Net) {
			if k, ok := at[cn.Part.Ref]; ok && (best < 0 || k < best) {
				best = k
			}
		}
	}
	return max(best, 0)
}

// beside gives the unframed parts wired only among themselves and to one
// frame's stretch (chassis, rails and ports aside) that stretch: a mains
// switch, fuse and capacitor across the transformer's primary go on the
// rectifier's row, not on the row before it with connectors to the
// primary. Their x spans are left out of the stretch's: the row lays them
// out afresh, and a span reaching back would swallow the stretches
// between. Parts wired to no stretch at all and to neither end of the
// signal path (a heater bypass, a dial lamp, an AGC feed resistor from a
// socket to the AGC line) are loose (-1): on a sheet with stages they have
// no place in signal order (looseLast).
func beside(c *graph.Circuit, blockOf map[string]int) map[string]int {
	ends := map[string]bool{}
	for _, n := range append(append([]string{}, c.Inputs...), c.Outputs...) {
		ends[n] = true
	}
	free := func(p *graph.Part) bool { _, in := blockOf[p.Ref]; return !in && p.Kind != graph.Port }
	seen := map[string]bool{}
	out := map[string]int{}
	for _, p := range c.Parts {
		if seen[p.Ref] || !free(p) {
			continue
		}
		group, at, ok, signal := []string{}, -1, true, false
		loads, fed := map[int]bool{}, false
		queue := []*graph.Part{p}
		seen[p.Ref] = true
		for len(queue) > 0 {
			q := queue[0]
			queue = queue[1:]
			group = append(group, q.Ref)
			for _, pn := range q.Pins {
				if pn.Net == "" || pn.Net == graph.NotConnected {
					continue
				}
				if c.RoleOf(pn.Net).IsACGround() {
					fed = fed || c.RoleOf(pn.Net) == graph.Supply
					continue
				}
				signal = signal || ends[pn.Net]
				for _, cn := range c.ConnsOf(pn.Net) {
					r := cn.Part
					if i, in := blockOf[r.Ref]; in {
						ok = ok && (at < 0 || at == i)
						at = i
						if loadOn(c, r, pn.Net) {
							loads[i] = true
						}
					} else if free(r) && !seen[r.Ref] {
						seen[r.Ref] = true
						queue = append(queue, r)
					}
				}
			}
		}
		if at < 0 && (signal || len(blockOf) == 0) {
			continue
		}
		// a decoupler (a group fed from a supply rail) whose line reaches
		// several stretches goes with the one stretch whose device's load
		// it feeds, the stage it was put in for (the others take only
		// bias or a follower's collector from the line): review16 b01's
		// oscillator decoupler stood in its follower's frame, a page from
		// the oscillator
		if !ok && fed && !signal && len(loads) == 1 {
			for i := range loads {
				ok, at = true, i
			}
		}
		if ok {
			for _, r := range group {
				out[r] = at
			}
		}
	}
	return out
}

// loadOn says whether part p is a load fed from line: a two-terminal
// passive part from line to a device's output electrode (an anode,
// collector or drain load).
func loadOn(c *graph.Circuit, p *graph.Part, line string) bool {
	if len(p.Pins) != 2 || p.IsActive() || p.Kind == graph.Port {
		return false
	}
	other := p.Pins[0].Net
	if other == line {
		other = p.Pins[1].Net
	}
	if other == line || other == "" || other == graph.NotConnected || c.RoleOf(other).IsACGround() {
		return false
	}
	for _, cn := range c.ConnsOf(other) {
		if d := cn.Part; d != nil && d.IsActive() && d.NetOf(d.PinWithRole(graph.RoleOutput)) == other {
			return true
		}
	}
	return false
}

// leadingPorts joins the ports that open a channel (its input sockets) to
// the channel's first stretch: a port is otherwise held to the stretch
// before it, which on a sheet of several channels is the last channel's
// end (a row with room to spare took the next channel's socket alone),
// and on the first row nothing, so a row too wide was cut after the input
// socket, leaving it alone on a row with a connector to the next.
func leadingPorts(bs []block) []block {
	var out []block
	lead := 0 // ports opening the channel, at the end of out
	for i, b := range bs {
		if i == 0 || b.ch != bs[i-1].ch {
			lead = 0
		}
		if lead > 0 && !b.port {
			n := len(out) - lead
			p := out[n]
			for _, q := range out[n+1:] {
				p = join(p, q)
			}
			// the ports are pieces: a stretch too big for the page with
			// them gives them a row of their own rather than small text
			x1, port := b.x1, b.port
			b = join(p, b)
			b.x1, b.port = x1, port
			out, lead = out[:n], -1
		}
		out = append(out, b)
		if b.port && lead >= 0 && (i == 0 || b.ch != bs[i-1].ch || lead > 0) {
			lead++
		}
	}
	return out
}

// inLine measures the stretches of several channels as if they stood in
// one line: each channel after the last one's end, a gap no wider than
// channelGap between stretches (the whole sheet's gaps are as wide as the
// widest channel's part in each column, and it puts every channel's ports
// at its edges).
func inLine(bs []block) {
	end, was := 0.0, 0.0 // where the last stretch ends, in line and as placed
	for i := range bs {
		w, gap := bs[i].x1-bs[i].x0, float64(channelGap)
		switch {
		case i == 0:
			gap = 0
		case bs[i].ch == bs[i-1].ch:
			gap = min(gap, max(0, bs[i].x0-was))
		}
		was = bs[i].x1
		shift := end + gap - bs[i].x0
		bs[i].x0 += shift
		bs[i].x1 = bs[i].x0 + w
		end = bs[i].x1
		if len(bs[i].pieces) > 0 {
			bs[i].pieces = append([]block{}, bs[i].pieces...)
			for k := range bs[i].pieces {
				bs[i].pieces[k].x0 += shift
				bs[i].pieces[k].x1 += shift
			}
		}
	}
}

// channelGap is the widest gap, in grid units, between two stretches of a
// sheet of several channels measured in one line: about the gap between
// two stages of a placed chain.
const channelGap = 8

// channels numbers the parts of a circuit by the channel they are on: the
// parts joined by wired nets that are not at AC ground, numbered in the
// order of the first input each group holds (the netlist's order). A set
// of several receivers side by side (a bank) is drawn channel after
// channel, each in the order its signal passes, rather than stage type by
// stage type across channels as the whole sheet's layered placement puts
// them. Parts of a group with no input (a supply, a heater chain), and
// every part of a set with one channel or none, are on channel 0: a
// single set keeps the order of its placement.
func channels(c *graph.Circuit) map[string]int {
	var sets graph.NamedSets
	wired := func(n string) bool { return n != "" && n != "nc" && !c.RoleOf(n).IsACGround() }
	first := map[string]string{} // part ref → one of its wired nets
	for _, p := range c.Parts {
		for _, pn := range p.Pins {
			if !wired(pn.Net) {
				continue
			}
			if f, ok := first[p.Ref]; ok {
				sets.Union(f, pn.Net)
			} else {
				first[p.Ref] = pn.Net
			}
		}
	}
	rank := map[string]int{}
	for _, n := range c.Inputs {
		if g := sets.Find(n); wired(n) {
			if _, ok := rank[g]; !ok {
				rank[g] = len(rank)
			}
		}
	}
	out := make(map[string]int, len(first))
	if len(rank) < 2 {
		return out
	}
	for ref, n := range first {
		out[ref] = rank[sets.Find(n)]
	}
	return out
}
