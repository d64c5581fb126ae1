package layout

import "pare/graph"

// A padder stands in series beside its winding, as a tuning capacitor does
// (common practice): the coil from its hot net down to AC ground, and
// beside it the padder from the hot net down to a net only it and the
// tuning capacitor share, the tuning capacitor on down to AC ground. The
// pair is found here by its nets alone, before any part is turned, so that
// both stand vertical with the hot end up and padChains (blocks.go) can
// stand them beside the coil; turned by the score alone, a padder between
// two signal nets lay along the signal path and its tank was reached by a
// loop round the stage.

// padderUps maps each part of a coil's series pair to the net its upper pin
// is on: the coil's hot net for the padder, the shared net for the part
// under it.
func (ly *state) padderUps() map[string]string {
	acg := func(n string) bool { return ly.c.RoleOf(n).IsACGround() }
	pins := map[string][]*graph.Part{} // two-terminal parts by net
	for _, cl := range ly.cells {
		p := cl.part
		if cl.edge != 0 || p.Kind == graph.Port || p.IsActive() || len(p.Pins) != 2 {
			continue
		}
		for _, pn := range p.Pins {
			pins[pn.Net] = append(pins[pn.Net], p)
		}
	}
	other := func(p *graph.Part, n string) string {
		if p.Pins[0].Net == n {
			return p.Pins[1].Net
		}
		return p.Pins[0].Net
	}
	out := map[string]string{}
	for _, cl := range ly.cells {
		hot, ok := coilHot(cl.part, acg)
		if !ok {
			continue
		}
		for _, a := range pins[hot] {
			mid := other(a, hot)
			if _, done := out[a.Ref]; done || a.Kind == graph.Inductor || acg(mid) || ly.netCount[mid] != 2 {
				continue
			}
			for _, b := range pins[mid] {
				if _, done := out[b.Ref]; !done && b != a && acg(other(b, mid)) {
					out[a.Ref], out[b.Ref] = hot, mid
					break
				}
			}
			if _, found := out[a.Ref]; found {
				break
			}
		}
	}
	return out
}

// coilHot is the hot net of a coil whose other end is at AC ground (a
// tapped coil's ends are its pins 1 and 2).
func coilHot(p *graph.Part, acg func(string) bool) (string, bool) {
	if p.Kind != graph.Inductor || len(p.Pins) < 2 || len(p.Pins) > 3 {
		return "", false
	}
	a, b := p.NetOf("1"), p.NetOf("2")
	switch {
	case a == "" || b == "":
		return "", false
	case acg(a) && !acg(b):
		return b, true
	case acg(b) && !acg(a):
		return a, true
	}
	return "", false
}
