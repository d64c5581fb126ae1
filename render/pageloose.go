package render

import (
	"sort"

	"pare/graph"
	"pare/render/geom"
	"pare/render/layout"
)

// ride puts an unframed part on a stretch without widening it (the row
// lays it out afresh), in the piece that shares a wired net with it when
// the stretch was joined from several.
func ride(c *graph.Circuit, b *block, p *graph.Part) {
	b.refs = append(b.refs, p.Ref)
	if len(b.pieces) > 0 {
		k := pieceOf(c, b.pieces, p)
		b.pieces[k].refs = append(b.pieces[k].refs, p.Ref)
		return
	}
	b.riders = append(b.riders, p.Ref)
}

// wiredNets are the nets of a part that carry signal: not chassis, not a
// rail, not left open.
func wiredNets(c *graph.Circuit, p *graph.Part) []string {
	var out []string
	for _, pn := range p.Pins {
		if pn.Net != "" && pn.Net != graph.NotConnected && !c.RoleOf(pn.Net).IsACGround() {
			out = append(out, pn.Net)
		}
	}
	return out
}

// opens says whether a port is on one of the circuit's inputs: a channel's
// input socket opens its first stretch (leadingPorts).
func opens(c *graph.Circuit, p *graph.Part) bool {
	for _, pn := range p.Pins {
		for _, n := range c.Inputs {
			if pn.Net == n {
				return true
			}
		}
	}
	return false
}

// homeSockets puts each socket that is not an input (an output, a pick-up
// or extension speaker socket, the mains inlet) on the last stretch, in
// signal order, holding a part wired to it: the whole sheet's placement
// stands every such socket at its right edge, so by x it rode on the last
// stretch of the sheet (the smoothing filter), and its lead crossed that
// frame to an off-row connector. A socket wired to no part keeps its place
// by x, held to the stretch before it.
func homeSockets(c *graph.Circuit, bs []block, sockets []*graph.Part, ext map[string]geom.Rect) []block {
	at := map[string]int{}
	for i, b := range bs {
		for _, r := range b.refs {
			at[r] = i
		}
	}
	var rest []*graph.Part
	for _, p := range sockets {
		home := -1
		for _, n := range wiredNets(c, p) {
			for _, cn := range c.ConnsOf(n) {
				if i, ok := at[cn.Part.Ref]; ok && cn.Part.Ref != p.Ref {
					home = max(home, i)
				}
			}
		}
		if home >= 0 {
			ride(c, &bs[home], p)
		} else {
			rest = append(rest, p)
		}
	}
	// the rest after: an insertion moves the stretches the index above
	// points at
	for _, p := range rest {
		e := ext[p.Ref]
		k := sort.Search(len(bs), func(i int) bool { return bs[i].ch > 0 || bs[i].x0 > e.X0 })
		b := block{x0: e.X0, x1: e.X1, refs: []string{p.Ref}, port: true}
		bs = append(bs[:k], append([]block{b}, bs[k:]...)...)
	}
	return bs
}

// looseLast gathers the loose parts (beside: heater bypasses, dial lamps,
// an AGC feed from a socket) into one stretch after the last of channel 0 (which holds the supply and
// the heater chain on a set of several channels), measured as their
// footprints side by side.
func looseLast(bs []block, loose []*graph.Part, ext map[string]geom.Rect) []block {
	if len(loose) == 0 {
		return bs
	}
	k, x := 0, 0.0
	for k < len(bs) && bs[k].ch == 0 {
		x = max(x, bs[k].x1)
		k++
	}
	b := block{x0: x + channelGap, x1: x + channelGap, loose: true}
	for _, p := range loose {
		b.refs = append(b.refs, p.Ref)
		b.x1 += ext[p.Ref].W()
	}
	return append(bs[:k], append([]block{b}, bs[k:]...)...)
}

// hostTries is how many rows, from the last, may be laid out again to take
// the loose parts beside their own stretches.
const hostTries = 3

// hostLoose gives the loose parts, when they came out a row of their own, to
// one of the last rows that still fits the page with them: alone they were
// a page of a few grey capacitors when the page before had no room under
// its row. Where they had ridden by overlap in the whole sheet's placement
// (under the valve whose holder a heater bypass sits at) they made a
// stage's row a third taller, and the short row after it a page of its
// own. A row is tried only when the two side by side fit the page's width. A row's off-row connectors do not change (the loose parts carry no
// wired net), so only the host is laid out again.
func (cfg Config) hostLoose(f *flow, ends []int, laid []*layout.Result, cw, ch float64) (*flow, []int, []*layout.Result, error) {
	row := looseRow(f.bs, ends)
	if row < 0 {
		return f, ends, laid, nil
	}
	for j, tried := len(ends)-1, 0; j >= 0 && tried < hostTries; j-- {
		if j == row || laid[j].Geom.Bounds.W()+laid[row].Geom.Bounds.W() > cw {
			continue
		}
		tried++
		rows := make([][]block, len(ends))
		for i := range ends {
			rows[i] = append([]block{}, f.bs[start(ends, i):ends[i]]...)
		}
		rows[j] = append(rows[j], rows[row][0])
		rows = append(rows[:row], rows[row+1:]...)
		var bs []block
		var nends []int
		for _, r := range rows {
			bs = append(bs, r...)
			nends = append(nends, len(bs))
		}
		k := j
		if j > row {
			k--
		}
		g := newFlow(cfg, f.s, bs, f.rows)
		g.starts, g.beside, g.gap = f.starts, f.beside, f.gap // the loose row was the last: the rows before keep their index
		r, err := g.layout(start(nends, k), nends[k])
		if err != nil {
			return nil, nil, nil, err
		}
		if !fits(r, cw, ch) {
			continue
		}
		out := append(append([]*layout.Result{}, laid[:row]...), laid[row+1:]...)
		was := g.pagesOf(out, cw, ch)
		out[k] = r
		// a host made taller may no longer share its page as the rows
		// were planned (balance: review19 b02's faded rows two grid steps
		// apart on two pages took three once a row held the loose parts)
		if g.pagesOf(out, cw, ch) > was {
			continue
		}
		return g, nends, out, nil
	}
	return f, ends, laid, nil
}

// looseRow is the row that holds the loose parts' stretch alone, -1 when
// there is none.
func looseRow(bs []block, ends []int) int {
	for i := range ends {
		if a := start(ends, i); ends[i]-a == 1 && bs[a].loose {
			return i
		}
	}
	return -1
}

// acrossBlock is the stretch of a part that p is wired across (the same two
// nets: an AGC line's return resistor across the filter capacitor), for a
// part that is otherwise loose: wired only to chassis and rails, it went to
// the row of loose parts at the set's end, pages from the filter it is
// across (review17 b05's R12). Several such parts on different stretches
// give none.
func acrossBlock(c *graph.Circuit, p *graph.Part, blockOf map[string]int) (int, bool) {
	k, ok := layout.TwoNets(p)
	if !ok {
		return 0, false
	}
	at := -1
	for _, pn := range p.Pins {
		for _, cn := range c.ConnsOf(pn.Net) {
			h := cn.Part
			i, in := blockOf[h.Ref]
			if hk, two := layout.TwoNets(h); !in || h == p || !two || hk != k {
				continue
			}
			if at >= 0 && at != i {
				return 0, false
			}
			at = i
		}
	}
	return at, at >= 0
}

// pagesOf is the number of pages pageResults stacks the rows laid on
// (a supply row at a page's margin aside), as the flow's plan has them,
// on a page of cw by avail (less the foot).
func (f *flow) pagesOf(laid []*layout.Result, cw, avail float64) int {
	var pg *band
	n := 0
	for i, r := range laid {
		b := r.Geom.Bounds
		big := b.W() > cw || b.H() > avail
		pt, ok := geom.Pt{}, false
		if pg != nil && !big && !f.starts[i] {
			pt, ok = pg.at(b, f.beside[i])
		}
		if !ok {
			pg, n = f.band(cw, avail, f.rowGap()), n+1
		}
		pg.put(b, pt)
		if big {
			pg.alone()
		}
	}
	return n
}
