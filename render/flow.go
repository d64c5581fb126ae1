package render

import (
	"fmt"
	"slices"
	"sort"
	"strings"

	"pare/graph"
	"pare/render/layout"
)

// flow is a sheet's stretches (blocks, in signal order) being cut into
// rows. A row is a run of stretches [a, b): its parts, its frames and its
// off-row connectors follow from a and b alone (a net comes in from an
// earlier row when a stretch before a holds it, goes on to a later one
// when a stretch from b on does), so a row is laid out once however often
// the cutting asks for it.
type flow struct {
	cfg         Config
	s           *Sheet
	bs          []block
	first, last map[string]int // wired net → the first and last stretch holding one of its parts
	part        map[string]*graph.Part
	at          map[string]int // part ref → its place in the circuit's (sorted) parts
	frameSpan   [][2]int       // per frame: the first and last stretch holding its parts
	blockOf     map[string]int // part ref → its stretch
	laid        map[[2]int]*layout.Result
	ahead       map[[2]int]*layout.Result // rows laid out ahead of the walk (rowsahead.go), not yet asked for
	sheets      map[[2]int][2]*Sheet      // rowSheets
	// rows are the rows laid out so far by what they hold (rowKey), kept
	// from one flow of the sheet to the next: a sheet flowed afresh with
	// a stretch cut into its pieces has the same rows before the cut.
	rows map[string]*layout.Result
	// shared are the rows of the flow this one was forked from to lay a
	// row out ahead (rowsahead.go), read beside rows and never written
	shared     map[string]*layout.Result
	supplyFlow map[string]int  // the whole sheet's (layout.SupplyFlow)
	returns    map[string]bool // the whole sheet's bias returns (layout.BiasReturns)
	cw, ch     float64         // the page's room for a row (0: no page)
	// the page's printable height and its footer set in the corner
	// (footcorner.go), where a page's lowest rows may go beside it
	pageH  float64
	corner footCorner
	// starts are the rows, by index, that open a page where the rows
	// were chosen with their pages (balance); nil: rows stack on a page
	// while they fit
	starts map[int]bool
	// beside are the rows, by index, that stand right of the row before
	// on its page where the rows were chosen with their pages (band)
	beside map[int]bool
	gap    float64 // between rows on a page, rowGap when 0 (balance)
	// the feedback loops and connector nets a row break is judged by
	// (rowcuts.go), found when first asked for
	loops     []loop
	loopsDone bool
	loopFits  map[loop]bool // fitsRow's answers
	// the links from a tuned can to the stage it feeds (cancuts.go), and
	// whether the rows keep each that fits a row whole (canRows)
	feedLinks []loop
	feedsDone bool
	keepCans  bool
	nets      []string
	// per stretch, the framed stretches an unframed one is wired to
	// (strand.go), found when first asked for
	home [][]int
}

// rowGap is the gap between rows on the flow's pages.
func (f *flow) rowGap() float64 {
	if f.gap > 0 {
		return f.gap
	}
	return rowGap
}

// newFlow starts the flow of the sheet's stretches; rows are the rows an
// earlier flow of the same sheet laid out (rowKey), nil for none.
func newFlow(cfg Config, s *Sheet, bs []block, rows map[string]*layout.Result) *flow {
	if rows == nil {
		rows = map[string]*layout.Result{}
	}
	f := &flow{cfg: cfg, s: s, bs: bs, first: map[string]int{}, last: map[string]int{},
		part: map[string]*graph.Part{}, at: map[string]int{}, blockOf: map[string]int{},
		laid: map[[2]int]*layout.Result{}, sheets: map[[2]int][2]*Sheet{}, rows: rows}
	f.supplyFlow = layout.SupplyFlow(s.Circuit, cfg.options(s))
	f.returns = s.returns
	if f.returns == nil {
		f.returns = layout.BiasReturns(s.Circuit)
	}
	if cfg.Page != nil {
		f.cw, f.ch = cfg.Page.content()
		f.pageH = f.ch
		fl := (&drawer{cfg: cfg, sheet: s}).sharedFoot().layout
		f.ch -= 1 + fl.h
		f.corner = fl.corner()
	}
	for i, p := range s.Circuit.Parts {
		f.part[p.Ref], f.at[p.Ref] = p, i
	}
	for i, b := range bs {
		for _, ref := range b.refs {
			f.blockOf[ref] = i
			p := f.part[ref]
			if p == nil {
				continue
			}
			for _, pn := range p.Pins {
				if _, ok := f.first[pn.Net]; !ok {
					f.first[pn.Net] = i
				}
				f.last[pn.Net] = i
			}
		}
	}
	for _, fr := range s.Frames {
		sp := [2]int{len(bs), -1}
		for _, ref := range fr.Parts {
			if i, ok := f.blockOf[ref]; ok {
				sp = [2]int{min(sp[0], i), max(sp[1], i)}
			}
		}
		f.frameSpan = append(f.frameSpan, sp)
	}
	return f
}

// layout lays out the row of stretches [a, b), the sheet itself when the
// row holds them all; a row asked for again is not laid out again.
func (f *flow) layout(a, b int) (*layout.Result, error) {
	if r, ok := f.laid[[2]int{a, b}]; ok {
		return r, nil
	}
	if r, ok := f.ahead[[2]int{a, b}]; ok {
		f.laid[[2]int{a, b}] = r
		return r, nil
	}
	if a == 0 && b == len(f.bs) {
		r, err := f.cfg.layout(f.s)
		if err != nil {
			return nil, err
		}
		f.laid[[2]int{a, b}] = r
		return r, nil
	}
	sh, again := f.rowSheets(a, b)
	key := rowKey(sh) + "\x00" + rowKey(again)
	if r, ok := f.rows[key]; ok {
		f.laid[[2]int{a, b}] = r
		return r, nil
	}
	if r, ok := f.shared[key]; ok {
		f.laid[[2]int{a, b}] = r
		return r, nil
	}
	r, err := f.cfg.layout(sh)
	if err != nil {
		return nil, err
	}
	// a net that comes in and goes on ends at its incoming connector
	// (continues); where the router then fails a net the row is laid out
	// again with the outgoing ends, and the one with fewer flags kept
	if len(r.Geom.Failed) > 0 {
		if len(again.continues) > len(sh.continues) {
			o, err := f.cfg.layout(again)
			if err != nil {
				return nil, err
			}
			if len(o.Geom.Failed) < len(r.Geom.Failed) {
				r = o
			}
		}
	}
	if r, err = f.orFromFirst(a, b, r); err != nil {
		return nil, err
	}
	if r, err = f.orCloser(a, b, r); err != nil {
		return nil, err
	}
	f.laid[[2]int{a, b}] = r
	f.rows[key] = r
	return r, nil
}

// orFromFirst is the row [a, b), laid out as r, or the same row ranked
// from its first part where r left nets unrouted (drawn as flags) and that
// one leaves fewer, or where r is a row of one stretch too big for the page
// and that one, routed as well, is less so. Ranked from the nets that come
// in, a row's parts follow the signal on from the row before (an IF can
// right of the valve feeding it); but a stretch is never cut, and a stage
// whose every part stands a column further on for it (a frequency
// changer's oscillator parts behind its mixer) can come out bigger than
// the page, printed under 2.5 mm, where ranked from its first part it fits.
func (f *flow) orFromFirst(a, b int, r *layout.Result) (*layout.Result, error) {
	over := func(r *layout.Result) float64 {
		bd := r.Geom.Bounds
		return max(bd.W()/f.cw, bd.H()/f.ch)
	}
	big := b-a == 1 && f.cw > 0 && f.ch > 0 && over(r) > 1
	if !big && len(r.Geom.Failed) == 0 {
		return r, nil
	}
	sh := f.sheet(a, b, false)
	if !slices.ContainsFunc(sh.continues, func(k layout.Continuation) bool { return k.In }) {
		return r, nil
	}
	sh.fromFirst = true
	o, err := f.cfg.layout(sh)
	if err != nil {
		return nil, err
	}
	if n, m := len(o.Geom.Failed), len(r.Geom.Failed); n < m || n == m && big && over(o) < over(r) {
		return o, nil
	}
	return r, nil
}

// tooBig says whether the row [a, b), not laid out yet, is known not to
// fit cw by ch from its placement alone (layout.LeastBounds): the layout
// f.layout would make of it, of either sheet it may take, is at least
// that big. A row grown by a stretch mostly ends so, and is then not
// routed at all.
func (f *flow) tooBig(a, b int, cw, ch float64) bool {
	if _, ok := f.laid[[2]int{a, b}]; ok {
		return false // laid out already: its fit is known for nothing
	}
	if untangles(f.s) {
		return false // laid out with the untangle search: no least box
	}
	over := func(sh *Sheet) bool {
		r, ok, pl := layout.LeastBoundsPlaced(sh.Circuit, f.cfg.options(sh))
		big := ok && (r.W() > cw || r.H() > ch)
		if pl != nil && (!big || b-a == 1) {
			// the row's layout, if it is laid out, starts from it; a row
			// of several stretches too big is cut, not laid out, and its
			// placement kept in f.sheets held 15 MB at once on a
			// 10,000-part sheet (docs/performance.md): were it laid out
			// after all, it is placed again, the same way
			sh.placed = pl
		}
		return big
	}
	if a == 0 && b == len(f.bs) {
		return over(f.s)
	}
	sh, again := f.rowSheets(a, b)
	if !over(sh) {
		return false
	}
	return len(again.continues) <= len(sh.continues) || over(again)
}

// rowSheets are the row [a, b)'s two sheets (flow.sheet: without and with
// the nets that run through it going out again), built once per row: the
// fit test and the layout read the same ones, and each sub-circuit builds
// its connection index once.
func (f *flow) rowSheets(a, b int) (*Sheet, *Sheet) {
	k := [2]int{a, b}
	if s, ok := f.sheets[k]; ok {
		return s[0], s[1]
	}
	s := [2]*Sheet{f.sheet(a, b, false), f.sheet(a, b, true)}
	f.sheets[k] = s
	return s[0], s[1]
}

// rowKey is everything a row's sheet (flow.sheet) holds that differs from
// one row of the sheet to another: its parts, inputs and outputs, its
// frames with their parts, and its off-row connectors. The rest (the
// options, the nets, the whole sheet's supply flow) is the sheet's own,
// so two rows of one sheet with the same key are laid out the same.
func rowKey(sh *Sheet) string {
	var b strings.Builder
	c := sh.Circuit
	for _, p := range c.Parts {
		b.WriteString(p.Ref)
		b.WriteByte(0)
	}
	for _, ns := range [][]string{c.Inputs, c.Outputs} {
		b.WriteByte(1)
		for _, n := range ns {
			b.WriteString(n)
			b.WriteByte(0)
		}
	}
	for _, fr := range sh.Frames {
		fmt.Fprintf(&b, "\x02%q %q %v %v %q %#v", fr.Title, fr.Subtitle, fr.Joined, fr.Supply, fr.Parts, fr.Places)
	}
	for _, k := range sh.continues {
		fmt.Fprintf(&b, "\x03%q %q %v", k.Net, k.Label, k.In)
	}
	return b.String()
}

// sheet is the row [a, b) as a sheet of its own: the circuit cut to the
// row's parts, its frames, and an off-row connector for every net that
// runs on in another row. It costs the row's size (and a look at each
// frame's span), not the whole sheet's.
func (f *flow) sheet(a, b int, through bool) *Sheet {
	sub := *f.s
	sub.placed = nil // the whole sheet's, not the row's
	keep := map[string]bool{}
	var parts []*graph.Part
	for _, bl := range f.bs[a:b] {
		for _, ref := range bl.refs {
			if p := f.part[ref]; p != nil && !keep[ref] {
				keep[ref] = true
				parts = append(parts, p)
			}
		}
	}
	sort.Slice(parts, func(i, j int) bool { return f.at[parts[i].Ref] < f.at[parts[j].Ref] })
	sub.Circuit = subCircuit(f.s.Circuit, parts)
	sub.Frames = nil
	for k, fr := range f.s.Frames {
		if sp := f.frameSpan[k]; sp[1] < a || sp[0] >= b {
			continue
		}
		g := Frame{Title: fr.Title, Subtitle: fr.Subtitle, Places: fr.Places, Joined: fr.Joined, Supply: fr.Supply}
		for _, p := range fr.Parts {
			if keep[p] {
				g.Parts = append(g.Parts, p)
			}
		}
		if len(g.Parts) > 0 {
			sub.Frames = append(sub.Frames, g)
		}
	}
	sub.continues = f.continues(parts, a, b, through)
	sub.Circuit.Inputs, sub.Circuit.Outputs = endsHere(sub.Circuit.Inputs, sub.continues, true), endsHere(sub.Circuit.Outputs, sub.continues, false)
	sub.supplyFlow = f.supplyFlow
	sub.returns = f.returns
	sub.row = true
	return &sub
}

// endsHere are the circuit's inputs (in) or outputs of a row that do not
// come in from an earlier row (an input) or go on to a later one (an
// output): the end's flag belongs where the net starts or stops. A row that
// only passes the net on (an overall feedback resistor's row, whose lead
// comes back from the loudspeaker two rows on) drew the output's flag too,
// beside the connector to the row holding it, and read as a second output.
func endsHere(ends []string, cs []layout.Continuation, in bool) []string {
	var out []string
	for _, n := range ends {
		passed := false
		for _, c := range cs {
			passed = passed || (c.Net == n && c.In == in)
		}
		if !passed {
			out = append(out, n)
		}
	}
	return out
}

// continues are the off-row connectors of the row [a, b) of these parts:
// the wired nets of its parts that other rows share, incoming from an
// earlier row, outgoing to a later. A net that comes in from an earlier row
// goes out again only when through is set: every later row takes it from
// the same label, as a line fed to several sheets is, rather than by a lead
// from the row's left edge to its right looping over the stages between
// (an AGC line across a frequency changer's row). A net's role is read on
// the whole circuit (the row's shares its nets), whose index is built once.
func (f *flow) continues(parts []*graph.Part, a, b int, through bool) []layout.Continuation {
	c := f.s.Circuit
	var nets []string
	seen := map[string]bool{}
	for _, p := range parts {
		for _, pn := range p.Pins {
			n := pn.Net
			if n == "" || n == "nc" || seen[n] || (f.first[n] >= a && f.last[n] < b) || c.RoleOf(n).IsACGround() {
				continue
			}
			seen[n] = true
			nets = append(nets, n)
		}
	}
	sort.Strings(nets)
	var out []layout.Continuation
	for _, n := range nets {
		if f.first[n] < a {
			out = append(out, layout.Continuation{Net: n, Label: f.connectorLabel(n), In: true})
		}
		if f.last[n] >= b && (through || f.first[n] >= a) {
			out = append(out, layout.Continuation{Net: n, Label: f.connectorLabel(n)})
		}
	}
	return out
}
