package render

import (
	"slices"

	"pare/graph"
)

// Signal flows from row to row the way it flows along a row: a stage's row
// comes after the rows of the stages feeding it. The whole sheet's layered
// placement ranks parts by their distance from the input over every wire,
// so an overall feedback lead (a loudspeaker winding back to the first
// valve's cathode) brings the output stage within a few steps of the input
// and stood it before the phase splitter driving it: cut into rows, the
// output stage's grids went off to the right to the splitter's row after
// it, read backwards.

// signalFrom are, for an active part with a control electrode, the parts the
// signal into it comes from, with every part met on the way: a walk from
// the control electrode's net through passive parts, over nets not at AC
// ground, that stops at another active part, a source when met on its
// output or common electrode (a cathodyne drives from its cathode too;
// a further grid is no source), and at a port on a
// declared input; the walk does not go on through the part's own other
// electrodes' nets (an oscillator's tap back to its own cathode, and a
// valve sharing that cathode beyond it, is its loop, not its signal's
// source). dist gives each part met its step from the electrode;
// srcs are the nearest sources, ordered by ref: a feedback lead from a later
// stage (or an AGC line from the detector) reaches the electrode by a
// longer way than the stage driving it.
func signalFrom(c *graph.Circuit, d *graph.Part) (srcs []string, dist map[string]int) {
	pin := d.PinWithRole(graph.RoleControl)
	start := d.NetOf(pin)
	if pin == "" || start == "" || start == graph.NotConnected || c.RoleOf(start).IsACGround() {
		return nil, nil
	}
	dist = map[string]int{d.Ref: 0}
	seenNet := map[string]bool{start: true}
	for _, pn := range d.Pins {
		seenNet[pn.Net] = true // its own loop (a Hartley's cathode tap) is no source
	}
	front := []string{start}
	for step := 1; len(front) > 0; step++ {
		var next []string
		for _, n := range front {
			for _, cn := range c.ConnsOf(n) {
				p := cn.Part
				if _, met := dist[p.Ref]; met {
					continue
				}
				dist[p.Ref] = step
				switch {
				case p.IsActive():
					if r := graph.RoleOfPin(p.Kind, cn.Pin); r == graph.RoleOutput || r == graph.RoleCommon {
						srcs = append(srcs, p.Ref)
					}
					continue
				case p.Kind == graph.Port:
					if slices.Contains(c.Inputs, n) {
						srcs = append(srcs, p.Ref)
					}
					continue
				}
				for _, m := range wiredNets(c, p) {
					if !seenNet[m] {
						seenNet[m] = true
						next = append(next, m)
					}
				}
			}
		}
		front = next
	}
	near := -1
	for _, s := range srcs {
		if near < 0 || dist[s] < near {
			near = dist[s]
		}
	}
	srcs = slices.DeleteFunc(srcs, func(s string) bool { return dist[s] > near })
	slices.Sort(srcs)
	return srcs, dist
}

// fedFirst moves each stretch whose active parts' signal comes only from
// stretches after it (every source signalFrom finds stands later) to stand
// after the last stretch holding one of those sources or a part nearer the
// control electrode than the nearest source (the coupling capacitor and
// grid stopper between them), with the branches hung on it (branchOf)
// that follow it, unless one of the stretches it would pass takes its
// signal from it (feedsAny): that one would then read backwards. A stretch with one source before it stays: a feedback
// lead from later on is not its signal. Stretches of another channel,
// ports and loose parts are not moved, nor moved past. It reports whether
// it moved one; each stretch is moved at most once, so a ring of stages
// each fed by the next cannot turn for ever.
func fedFirst(c *graph.Circuit, bs []block) ([]block, bool) {
	moved, done := false, map[string]bool{}
	// where each part's stretch stands, built again only after a move:
	// built for every stretch it cost the square of the stretches
	var at map[string]int
	for i := 0; i < len(bs); i++ {
		b := bs[i]
		if b.port || b.loose || len(b.refs) == 0 || done[b.refs[0]] {
			continue
		}
		if at == nil {
			at = stretchOf(bs)
		}
		to := feedTarget(c, bs, at, i)
		if to <= i {
			continue
		}
		done[b.refs[0]] = true
		end := i + 1
		holders := netHolders(c, bs)
		for end < to && branchOf(c, bs, holders, end) == i && !holdsActive(c, bs[end]) {
			end++
		}
		run := append([]block{}, bs[i:end]...)
		rest := append(append([]block{}, bs[:i]...), bs[end:to+1]...)
		bs = append(append(rest, run...), bs[to+1:]...)
		moved, at = true, nil
		i-- // the stretch now at i is another
	}
	return bs, moved
}

// feedTarget is the last stretch of stretch i's channel that its active
// parts need before them (fedFirst), or -1 when they need none after i;
// at is stretchOf(bs).
func feedTarget(c *graph.Circuit, bs []block, at map[string]int, i int) int {
	to := -1
	for _, r := range bs[i].refs {
		d := c.Part(r)
		if d == nil || !d.IsActive() {
			continue
		}
		srcs, dist := signalFrom(c, d)
		if len(srcs) == 0 || slices.ContainsFunc(srcs, func(s string) bool { k, ok := at[s]; return !ok || k <= i }) {
			continue
		}
		if fedBy(c, srcs, d.Ref) {
			continue // a ring (an oscillator's two devices) reads either way
		}
		near := dist[srcs[0]]
		for ref, n := range dist {
			k, ok := at[ref]
			if !ok || (n >= near && !slices.Contains(srcs, ref)) {
				continue
			}
			for m := i + 1; m <= k && m < len(bs) && bs[m].ch == bs[i].ch && !bs[m].loose; m++ {
				to = max(to, m)
			}
		}
	}
	if to > i && feedsAny(c, bs[i], bs[i+1:to+1]) {
		return -1 // moved past a stage it feeds, that one would read backwards
	}
	return to
}

// stretchOf is the index in bs of the stretch holding each part.
func stretchOf(bs []block) map[string]int {
	at := map[string]int{}
	for k, b := range bs {
		for _, r := range b.refs {
			at[r] = k
		}
	}
	return at
}

// feedsAny says whether an active part of b is a nearest source (signalFrom)
// of an active part in one of the stretches later.
func feedsAny(c *graph.Circuit, b block, later []block) bool {
	for _, l := range later {
		for _, r := range l.refs {
			if q := c.Part(r); q != nil && q.IsActive() {
				srcs, _ := signalFrom(c, q)
				if slices.ContainsFunc(srcs, func(s string) bool { return slices.Contains(b.refs, s) }) {
					return true
				}
			}
		}
	}
	return false
}

// netHolders lists, for each wired net, the stretches holding a part on it
// in order (branchesBeside's holders).
func netHolders(c *graph.Circuit, bs []block) map[string][]int {
	holders := map[string][]int{}
	for i, b := range bs {
		for _, r := range b.refs {
			if p := c.Part(r); p != nil {
				for _, n := range wiredNets(c, p) {
					if h := holders[n]; len(h) == 0 || h[len(h)-1] != i {
						holders[n] = append(h, i)
					}
				}
			}
		}
	}
	return holders
}

// Rows are the parts of each row of the sheet cut onto cfg.Page, in
// reading order (the row of loose parts, stacked where it finds room,
// last); the whole sheet as one row without a page. Tests read the order
// of the rows from it.
func (cfg Config) Rows(s *Sheet) ([][]string, error) {
	if cfg.Page == nil {
		var refs []string
		for _, p := range s.Circuit.Parts {
			refs = append(refs, p.Ref)
		}
		return [][]string{refs}, nil
	}
	f, ends, _, err := cfg.flowRows(s)
	if err != nil {
		return nil, err
	}
	loose := looseRow(f.bs, ends)
	var out, last [][]string
	for i := range ends {
		var refs []string
		for _, b := range f.bs[start(ends, i):ends[i]] {
			refs = append(refs, b.refs...)
		}
		if i == loose {
			last = append(last, refs)
			continue
		}
		out = append(out, refs)
	}
	return append(out, last...), nil
}

// fedBy says whether the signal of one of the parts srcs comes, source
// after source (signalFrom), from ref: ref is then in a ring with them.
func fedBy(c *graph.Circuit, srcs []string, ref string) bool {
	seen := map[string]bool{}
	for len(srcs) > 0 {
		s := srcs[0]
		srcs = srcs[1:]
		if s == ref {
			return true
		}
		if p := c.Part(s); p != nil && !seen[s] {
			seen[s] = true
			back, _ := signalFrom(c, p)
			srcs = append(srcs, back...)
		}
	}
	return false
}
