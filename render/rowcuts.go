package render

import (
	"sort"

	"pare/graph"
)

// What a row break costs. A break between two rows costs an off-row
// connector pair for every net held on both sides of it, and a feedback
// loop cut by it reads as two loose leads whose connectors the reader must
// pair up across the rows: the trade draws a feedback loop whole, its lead
// running back above or below the stages it spans
// (../shared/DRAWING-NOTES.md), and cuts a long sheet where fewest wires
// cross. Breaks measures both on the rows the flow chose (TestRowBreaks);
// the flow does not yet choose by them: moving breaks by these counts alone
// (tried) left review14 b05's faded output page with a stack of five
// connectors and raised the misread and connector-wire ratchets.

// loop is a feedback loop as the stretches it spans, [lo, hi].
type loop struct{ lo, hi int }

// loopsOf are the sheet's feedback loops in stretch indices: for each
// feedback part (graph.FeedbackParts: from a device's control or common
// electrode to a net the signal reaches after the device), from the first
// stretch holding a part on either of its nets to the last stretch holding
// a part on its far net that holds a device or a transformer, the stage
// whose output the loop returns (a coupling capacitor after it takes the
// signal on, it does not close the loop).
func (f *flow) loopsOf() []loop {
	c := f.s.Circuit
	follow := func(n string) bool { return n != "" && n != graph.NotConnected && !c.RoleOf(n).IsACGround() }
	view := graph.NewView(graph.NewIndex(c.Parts, nil), c.Parts)
	fb := graph.FeedbackParts(c.Parts, view, follow)
	on := map[string][]*graph.Part{}
	for _, p := range c.Parts {
		for _, pn := range p.Pins {
			on[pn.Net] = append(on[pn.Net], p)
		}
	}
	var out []loop
	seen := map[loop]bool{}
	for q, into := range fb {
		far := otherNet(q, into)
		if _, ok := f.blockOf[q.Ref]; !ok || gridSide(on, far) {
			continue
		}
		fi, ok1 := f.first[into]
		ff, ok2 := f.first[far]
		if !ok1 || !ok2 {
			continue
		}
		l := loop{lo: min(fi, ff, f.blockOf[q.Ref]), hi: f.closer(far)}
		if l.hi > l.lo && !seen[l] {
			seen[l] = true
			out = append(out, l)
		}
	}
	sortLoops(out)
	return out
}

// gridSide says whether net n is a device's control electrode, or one
// resistor (a grid stopper) from it: a coupling capacitor into a later
// stage's grid is a feedback part to graph.FeedbackParts (it carries the
// signal only into the electrode), but the stretches from it to that
// grid close no loop (a cathodyne's cathode lead to the lower output
// valve, review17 a04).
func gridSide(on map[string][]*graph.Part, n string) bool {
	control := func(n string) bool {
		for _, p := range on[n] {
			if p.IsActive() && graph.RoleOfPin(p.Kind, pinOn(p, n)) == graph.RoleControl {
				return true
			}
		}
		return false
	}
	if control(n) {
		return true
	}
	for _, p := range on[n] {
		if p.Kind == graph.Resistor && len(p.Pins) == 2 && control(otherNet(p, n)) {
			return true
		}
	}
	return false
}

// otherNet is the net of a two-terminal part's pin other than n.
func otherNet(q *graph.Part, n string) string {
	for _, pn := range q.Pins {
		if pn.Net != n {
			return pn.Net
		}
	}
	return n
}

// closer is the last stretch holding a part on net n that holds a device
// or a transformer: the stage driving the loop's far end; the last
// stretch on n when none does.
func (f *flow) closer(n string) int {
	hi := f.last[n]
	for i := hi; i >= f.first[n]; i-- {
		on, driven := false, false
		for _, r := range f.bs[i].refs {
			p := f.part[r]
			if p == nil {
				continue
			}
			driven = driven || p.IsActive() || p.Kind == graph.Transformer
			on = on || p.NetOf(pinOn(p, n)) == n
		}
		if on && driven {
			return i
		}
	}
	return hi
}

// pinOn is the name of p's pin on net n, "" when none.
func pinOn(p *graph.Part, n string) string {
	for _, pn := range p.Pins {
		if pn.Net == n {
			return pn.Name
		}
	}
	return ""
}

// fitsRow says whether the stretches [lo, hi] go on one row of the page:
// by their placed extent first (cheap, and an underestimate: routing
// widens a row), then laid out as that row. A loop too wide for any row
// is split wherever the row breaks fall; it is left to the connector
// count.
func (f *flow) fitsRow(l loop) bool {
	if f.cw <= 0 {
		return true
	}
	if ok, known := f.loopFits[l]; known {
		return ok
	}
	ok := f.bs[l.hi].x1-f.bs[l.lo].x0 <= f.cw-rowSlack && !f.tooBig(l.lo, l.hi+1, f.cw, f.ch)
	if ok {
		r, err := f.layout(l.lo, l.hi+1)
		ok = err == nil && fits(r, f.cw, f.ch)
	}
	if f.loopFits == nil {
		f.loopFits = map[loop]bool{}
	}
	f.loopFits[l] = ok
	return ok
}

// loopsCut counts the loops that fit a row and a row ending before
// stretch c splits.
func (f *flow) loopsCut(c int) int {
	if !f.loopsDone {
		f.loops, f.loopsDone = f.loopsOf(), true
	}
	return f.spansCut(f.loops, c)
}

// spansCut counts the spans among ls that fit a row and a row ending
// before stretch c splits.
func (f *flow) spansCut(ls []loop, c int) int {
	n := 0
	for _, l := range ls {
		if l.lo < c && c <= l.hi && f.fitsRow(l) {
			n++
		}
	}
	return n
}

// crossing counts the nets a row ending before stretch c leaves to
// off-row connectors: wired nets, not at AC ground, held on both sides.
func (f *flow) crossing(c int) int {
	if f.nets == nil {
		f.nets = f.wired()
	}
	n := 0
	for _, w := range f.nets {
		if f.first[w] < c && c <= f.last[w] {
			n++
		}
	}
	return n
}

// wired are the nets of the flow's parts that a connector may carry.
func (f *flow) wired() []string {
	c := f.s.Circuit
	out := []string{}
	seen := map[string]bool{}
	for _, b := range f.bs {
		for _, r := range b.refs {
			if p := f.part[r]; p != nil {
				for _, n := range wiredNets(c, p) {
					if !seen[n] {
						seen[n] = true
						out = append(out, n)
					}
				}
			}
		}
	}
	sort.Strings(out)
	return out
}

// cutCost is what ending a row before stretch c costs: the fitting loops
// it splits, then the nets crossing it.
func (f *flow) cutCost(c int) [2]int {
	if c <= 0 || c >= len(f.bs) {
		return [2]int{}
	}
	return [2]int{f.loopsCut(c), f.crossing(c)}
}

// Break is one place a paged sheet's rows were cut: the feedback loops
// that would fit a row and are split there, and the nets crossing it
// (each an off-row connector on both rows).
type Break struct {
	Loops, Connectors int
	// Cans counts the links from a tuned can to the stage it feeds
	// (cancuts.go) that fit one row and are split there.
	Cans int
}

// Breaks are the row breaks of the sheet cut onto cfg.Page, in order;
// none without a page. Tests measure the rule above with them.
func (cfg Config) Breaks(s *Sheet) ([]Break, error) {
	if cfg.Page == nil {
		return nil, nil
	}
	f, ends, _, err := cfg.flowRows(s)
	if err != nil {
		return nil, err
	}
	loose := looseRow(f.bs, ends)
	var out []Break
	for i, e := range ends {
		if i == len(ends)-1 || i == loose || i+1 == loose && i+2 == len(ends) {
			continue
		}
		k := f.cutCost(e)
		out = append(out, Break{Loops: k[0], Connectors: k[1], Cans: f.cansCut(e)})
	}
	return out, nil
}

// sortLoops orders spans by their first stretch, then their last.
func sortLoops(ls []loop) {
	sort.Slice(ls, func(i, j int) bool {
		if ls[i].lo != ls[j].lo {
			return ls[i].lo < ls[j].lo
		}
		return ls[i].hi < ls[j].hi
	})
}
