package render

import (
	"pare/graph"
	"pare/render/layout"
)

// A tuned can (an IF or RF transformer) is drawn between the valve or
// transistor whose output feeds its primary and the stage its secondary
// feeds: a reader follows the signal from the can's secondary straight into
// the next grid, base or detector diode (common practice,
// ../shared/DRAWING-NOTES.md: "an IF transformer is a pair of tuned windings
// in a can between two stages"). A row break between the can and that
// stage sends the secondary's hot lead through a pair of off-row
// connectors, and on a page break to another sheet: the blind review
// rejected review19 a03, whose detector diode stood a row (and a page)
// away from its IF can. So where the stretches from the can to the stage
// its secondary feeds fit one row, no row ends between them.

// feeds are the links from a transformer to the stages its undriven
// windings feed, as the stretches they span, [lo, hi]: lo the can's
// stretch, hi the last stretch holding a device or diode with its control
// or common electrode, or a diode's pin, on a net of one of those windings.
func (f *flow) feeds() []loop {
	c := f.s.Circuit
	var out []loop
	seen := map[loop]bool{}
	for _, p := range c.Parts {
		lo, ok := f.blockOf[p.Ref]
		if p.Kind != graph.Transformer || !ok {
			continue
		}
		driven := drivenPins(c, p)
		for _, pn := range p.Pins {
			if driven[pn.Name] || pn.Net == "" || pn.Net == graph.NotConnected || c.RoleOf(pn.Net).IsACGround() {
				continue
			}
			for _, cn := range c.ConnsOf(pn.Net) {
				hi, ok := f.blockOf[cn.Part.Ref]
				if !ok || hi <= lo || !takesIn(cn.Part, cn.Pin) {
					continue
				}
				if l := (loop{lo: lo, hi: hi}); !seen[l] {
					seen[l] = true
					out = append(out, l)
				}
			}
		}
	}
	sortLoops(out)
	return out
}

// takesIn says whether pin of part d takes a signal in: a device's control
// electrode (a grid, base or gate), or either pin of a diode, semiconductor
// or valve. A common electrode is left out: a secondary's cold end
// returned to a bypassed cathode (a detector returned to its audio
// valve's bias) carries no signal into that stage.
func takesIn(d *graph.Part, pin string) bool {
	switch {
	case d.Kind == graph.Diode, d.Kind == graph.Valve && !d.IsActive():
		return true
	case d.IsActive():
		return graph.RoleOfPin(d.Kind, pin) == graph.RoleControl
	}
	return false
}

// drivenPins are the pin names of p's windings on a net an active part's
// output electrode drives (a can's primary), with the windings chained to
// them (a tapped primary); none for a transformer no device drives.
func drivenPins(c *graph.Circuit, p *graph.Part) map[string]bool {
	out := map[string]bool{}
	drives := func(n string) bool {
		if n == "" || n == graph.NotConnected || c.RoleOf(n).IsACGround() {
			return false
		}
		for _, cn := range c.ConnsOf(n) {
			if d := cn.Part; d.IsActive() && graph.RoleOfPin(d.Kind, cn.Pin) == graph.RoleOutput {
				return true
			}
		}
		return false
	}
	for _, w := range p.Windings {
		if drives(p.NetOf(w.From)) || drives(p.NetOf(w.To)) {
			out[w.From], out[w.To] = true, true
		}
	}
	for grown := len(out) > 0; grown; {
		grown = false
		for _, w := range p.Windings {
			if out[w.From] != out[w.To] {
				out[w.From], out[w.To], grown = true, true, true
			}
		}
	}
	return out
}

// cansCut counts the links from a can to the stage it feeds that fit one
// row and a row ending before stretch c splits.
func (f *flow) cansCut(c int) int {
	if !f.feedsDone {
		f.feedLinks, f.feedsDone = f.feeds(), true
	}
	return f.spansCut(f.feedLinks, c)
}

// canStart is where a row [a, e) that would end by splitting a can from the
// stage it feeds (a link that fits a row) ends instead: before the can's
// stretch, so the next row opens with the can; e when no link is split, or
// the can's stretch opens the row (nothing to leave behind).
func (f *flow) canStart(a, e int) int {
	if e <= a+1 || e >= len(f.bs) || f.cansCut(e) == 0 {
		return e
	}
	at := e
	for _, l := range f.feedLinks {
		if l.lo < e && e <= l.hi && l.lo > a && f.fitsRow(l) {
			at = min(at, f.canOwn(a, l))
		}
	}
	for at > a+1 && at < e && f.bs[at].port {
		at-- // a port stays with the stretch before it
	}
	// a break before the can that splits as many links (the can before
	// it feeding this can's stage) only moves the split
	if at <= a || f.cansCut(at) >= f.cansCut(e) {
		return e
	}
	return at
}

// canOwn is where the link l's can starts once the stretches before it
// that only hang on the can's windings (hangsOn: its tuning capacitor,
// framed apart on a faded view) go with it; a, for no break, when they
// reach back to the row's start a or do not fit a row with the stage the
// can feeds (a can cut from its own tuning capacitor reads worse than one
// lead to the next row).
func (f *flow) canOwn(a int, l loop) int {
	at := l.lo
	for at > a && f.hangsOn(at-1, l.lo) {
		at--
	}
	if at <= a || at < l.lo && !f.fitsRow(loop{lo: at, hi: l.hi}) {
		return a
	}
	return at
}

// hangsOn says whether stretch i holds only passive parts wired to the nets
// of the transformers of stretch can (and to chassis, rails, ports).
func (f *flow) hangsOn(i, can int) bool {
	if i < 0 || can >= len(f.bs) {
		return false
	}
	on := map[string]bool{}
	for _, r := range f.bs[can].refs {
		if p := f.part[r]; p != nil && p.Kind == graph.Transformer {
			for _, pn := range p.Pins {
				on[pn.Net] = true
			}
		}
	}
	if len(on) == 0 {
		return false
	}
	c := f.s.Circuit
	for _, r := range f.bs[i].refs {
		p := f.part[r]
		if p == nil || p.Kind == graph.Port {
			continue
		}
		for _, pn := range p.Pins {
			n := pn.Net
			if p.IsActive() || p.Kind == graph.Transformer || !on[n] && n != "" && n != graph.NotConnected && !c.RoleOf(n).IsACGround() {
				return false
			}
		}
	}
	return true
}

// canEnd is row i of ends, laid out as r, ended before the can where it
// would split a can from the stage it feeds (canStart) while the rows keep
// cans whole: the can opens the next row.
func (f *flow) canEnd(ends []int, i int, r *layout.Result) ([]int, *layout.Result, error) {
	if !f.keepCans || i+1 >= len(ends) {
		return ends, r, nil
	}
	e := f.canStart(start(ends, i), ends[i])
	if e == ends[i] {
		return ends, r, nil
	}
	ends = moveEnd(ends, i, e)
	r, err := f.layout(start(ends, i), e)
	return ends, r, err
}

// canRows lays the rows out (layoutRows) as the greedy flow cuts them, and
// where that splits a can from the stage it feeds, again with the can
// opening the next row (canStart); the second is kept when it takes no
// more rows: a row more is a break more, every net across it a pair of
// off-row connectors, which cost the reader more than the can's one lead.
func (f *flow) canRows(ends []int, cw, ch float64) ([]int, []*layout.Result, error) {
	f.keepCans = false
	a, laid, err := f.layoutRows(ends, cw, ch)
	if err != nil || f.cw <= 0 {
		return a, laid, err
	}
	split := false
	for i := 0; i+1 < len(a); i++ {
		split = split || f.canStart(start(a, i), a[i]) < a[i]
	}
	if !split {
		return a, laid, nil
	}
	f.keepCans = true
	b, blaid, err := f.layoutRows(ends, cw, ch)
	if err != nil {
		return nil, nil, err
	}
	if len(b) > len(a) {
		f.keepCans = false
		return a, laid, nil
	}
	return b, blaid, nil
}
