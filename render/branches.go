package render

import "pare/graph"

// branchesBeside moves each stretch of passive parts that is a dead end
// hanging on earlier ones (the wired nets it shares with the rest of the sheet reach only
// stretches before it) to stand right after the last of those, after the
// branches of it already there. The whole sheet's placement orders stretches by x, and a
// network hung across a load (a Zobel across the loudspeaker), or a
// bootstrapped load's feed hung on its capacitor, came after every stage
// right of that load: it went onto the last row, often the next page, with
// a connector back to the load it serves. A stretch hanging on a later
// one, the stages of a chain (each shares nets with the next) and a
// stage with an active part, which is on the signal path, keep their
// places. Stretches of another channel, ports and the loose parts are
// never moved. It reports whether it moved one: the stretches' x are then
// measured afresh in line (inLine).
func branchesBeside(c *graph.Circuit, bs []block) ([]block, bool) {
	holders := netHolders(c, bs) // wired net → the stretches holding a part on it
	host := make([]int, len(bs)) // the earlier stretch a branch hangs on, -1 for none
	moved := false
	for i, b := range bs {
		host[i] = -1
		if b.port || b.loose || holdsActive(c, b) {
			continue
		}
		j := branchOf(c, bs, holders, i)
		if j >= 0 && j < i && bs[j].ch == b.ch && !bs[j].port {
			host[i], moved = j, moved || j < i-1
		}
	}
	if !moved {
		return bs, false
	}
	// each host followed by its branches, in their order; everything else
	// in its own
	var out []block
	var place func(i int)
	place = func(i int) {
		out = append(out, bs[i])
		for k := range bs {
			if host[k] == i {
				place(k)
			}
		}
	}
	for i := range bs {
		if host[i] < 0 {
			place(i)
		}
	}
	return out, true
}

// branchOf is the last stretch before stretch i that one of i's wired
// nets reaches, when none reaches a stretch after i: i is a dead end
// hanging on the stretches before it (-1 when it is none, or its nets
// reach no other stretch).
func branchOf(c *graph.Circuit, bs []block, holders map[string][]int, i int) int {
	j := -1
	for _, r := range bs[i].refs {
		p := c.Part(r)
		if p == nil {
			continue
		}
		for _, n := range wiredNets(c, p) {
			for _, k := range holders[n] {
				if k > i {
					return -1
				}
				if k != i {
					j = max(j, k)
				}
			}
		}
	}
	return j
}

// holdsActive says whether a stretch holds an active part.
func holdsActive(c *graph.Circuit, b block) bool {
	for _, r := range b.refs {
		if p := c.Part(r); p != nil && p.IsActive() {
			return true
		}
	}
	return false
}
