package pipeline

import (
	"slices"

	"pare/graph"
	"pare/render"
)

// pairPlaces extends a push-pull stage's template (the two devices one
// above the other, the output transformer between their output electrodes)
// with the parts the pattern does not name but the stage holds, where the
// trade draws them: each device's stopper in line with its control pin,
// just left of it, so the stopper reads as at the holder; and the shared
// common-electrode network between the two devices, the halves mirrored
// about it. Only a stage whose template places a second device straight
// below the first (row 2) is a pair; any other template is returned as is.
// On a reduced sheet (mirror) a pair of one kind stands mirrored
// (mirrorPair); on the full and faded sheets the lower device stays
// upright, where its heater pins would otherwise point up into the middle
// of the pair and crowd the common network.
func pairPlaces(places []render.Place, parts []string, c *graph.Circuit, mirror bool) []render.Place {
	if len(places) == 0 {
		return places
	}
	devs := map[int]*graph.Part{0: c.Part(places[0].Ref)}
	placed := map[string]bool{}
	for _, p := range places {
		placed[p.Ref] = true
		if q := c.Part(p.Ref); q != nil && p.Col == 0 && p.Row == 2 && isDevice(q) {
			devs[2] = q
		}
	}
	if devs[0] == nil || devs[2] == nil || !isDevice(devs[0]) {
		return places
	}
	common := [2]string{netOf(devs[0], graph.RoleCommon), netOf(devs[2], graph.RoleCommon)}
	supply := supplyOf(c, places, devs[0], devs[2])
	out := slices.Clone(places)
	flipped := mirror && mirrorPair(c, devs[0], devs[2], common)
	feedRow := [3]int{-1, -1, 3} // the upper half's, a shared, the lower half's feed
	feedStand := "vertical"
	if flipped {
		// the transformer a column further right: each half's screen
		// feed stands in the column between, level with its device,
		// inside the bend of its output lead, which it would cross
		// from above or below (review17 a04's anode lead round R13)
		// lying level with its screen pin, so the screen lead is one
		// straight run clear of the output lead under (over) it
		feedRow, feedStand = [3]int{0, 1, 2}, "horizontal"
		for i := range out {
			switch {
			case out[i].Ref == devs[2].Ref:
				out[i].Stand = render.StandFlipped
			case out[i].Col >= 1:
				out[i].Col++
			}
		}
	}
	anchor := places[0].Anchor
	add := func(ref string, col, row int, stand string) {
		placed[ref] = true
		out = append(out, render.Place{Ref: ref, Anchor: anchor, Col: col, Row: row, Stand: stand})
	}
	// a flipped pair's common network stands left of the centre line,
	// in the stoppers' column and further out, when no grid leak of the
	// stage stands there; else under the upper device, beside the
	// common leads (a template slot of col 0 takes both)
	left := flipped && !leaksIn(c, parts, devs[0], devs[2])
	shared := 0
	if left {
		shared = -1
	}
	for _, row := range []int{0, 2} {
		if r := stopperOf(c, devs[row], parts, placed); r != "" {
			add(r, -1, row, "horizontal")
		}
	}
	// the shared cathode (emitter) network: parts on a common net of both
	// halves, to AC ground, between the devices; a bypass no pattern
	// claimed goes with its resistor (the drawing leaves another stage's
	// part where it is)
	for _, q := range c.Parts {
		ref := q.Ref
		if placed[ref] || len(q.Pins) != 2 {
			continue
		}
		on := func(n string) bool { return n != "" && (q.Pins[0].Net == n || q.Pins[1].Net == n) }
		switch {
		case !touchesGround(c, q):
		case flipped && on(common[0]):
			// beside the two common electrodes meeting on the centre
			// line, clear of the transformer on the right
			add(ref, shared, 1, "vertical")
			if left {
				shared--
			}
		case common[0] == common[1] && on(common[0]):
			add(ref, 0, 1, "vertical")
		case common[0] != common[1] && on(common[0]) && slices.Contains(parts, ref):
			// each half's own emitter (cathode) resistor straight
			// below its device, the lower device under the upper's
			add(ref, 0, 1, "vertical")
		case common[0] != common[1] && on(common[1]) && slices.Contains(parts, ref):
			add(ref, 0, 3, "vertical")
		}
	}
	// a feed shared by both halves (a screen-grid resistor from the
	// supply) above the transformer, clear of the pair; a half's own feed
	// above the upper device or below the lower, mirrored, so neither
	// stands in the transformer's slot between them
	for _, ref := range parts {
		q := c.Part(ref)
		if q == nil || placed[ref] || len(q.Pins) != 2 || q.Kind == graph.Capacitor {
			continue // a bypass is no feed: it comes with its feed (feedBypass)
		}
		switch {
		case sharedFeed(c, q, devs[0], devs[2], supply):
			add(ref, 1, feedRow[1], "vertical")
			if cap := feedBypass(c, q, placed, supply); cap != "" {
				// above the transformer, clear of the pair; on a
				// flipped pair, in the feeds' column under the feed,
				// level with the lower device (a shared feed leaves no
				// own feed there): left to the generic placement it
				// stood in the transformer's slot (review14 a04's C8,
				// the centre tap off the pair's middle)
				col, row := 2, -1
				if flipped {
					col, row = 1, 2
				}
				add(cap, col, row, "vertical")
			}
		case ownFeed(c, q, devs[0], supply):
			add(ref, 1, feedRow[0], feedStand)
		case ownFeed(c, q, devs[2], supply):
			add(ref, 1, feedRow[2], feedStand)
		}
	}
	return out
}

// mirrorPair says whether the lower device of a pair stands upside down:
// two devices of one kind and type (a push-pull pair, not a complementary
// one, whose lower half turns by its own polarity) on one common net off
// AC ground, so their common electrodes meet on the centre line with the
// shared network beside them, and neither one's common lead runs round
// its device across the control lead (review17 a04's V3 cathode lead
// across V4's grid lead).
func mirrorPair(c *graph.Circuit, d1, d2 *graph.Part, common [2]string) bool {
	return d1.Kind == d2.Kind && d1.Type == d2.Type && common[0] != "" && common[0] == common[1] &&
		!c.RoleOf(common[0]).IsACGround()
}

// leaksIn says whether the stage's parts hold a two-terminal part from
// either device's control net to AC ground (a grid leak, a base
// resistor): it stands left of its device, where the common network
// would go.
func leaksIn(c *graph.Circuit, parts []string, d1, d2 *graph.Part) bool {
	nets := map[string]bool{netOf(d1, graph.RoleControl): true, netOf(d2, graph.RoleControl): true}
	for _, ref := range parts {
		q := c.Part(ref)
		if q == nil || len(q.Pins) != 2 || !touchesGround(c, q) {
			continue
		}
		if nets[q.Pins[0].Net] || nets[q.Pins[1].Net] {
			return true
		}
	}
	return false
}

// sharedFeed says whether two-terminal q joins a net both devices have a
// pin on, other than their common electrode's and AC ground (a heater
// return is on chassis), to a supply (supplyNet).
func sharedFeed(c *graph.Circuit, q, d1, d2 *graph.Part, supplyNet func(string) bool) bool {
	on := func(d *graph.Part, net string) bool {
		for _, p := range d.Pins {
			if p.Net == net && graph.RoleOfPin(d.Kind, p.Name) != graph.RoleCommon {
				return true
			}
		}
		return false
	}
	shared, supply := false, false
	for _, p := range q.Pins {
		ground := supplyNet(p.Net)
		shared = shared || !ground && on(d1, p.Net) && on(d2, p.Net)
		supply = supply || ground
	}
	return shared && supply
}

// feedBypass is the capacitor from a shared feed's far end (the screens)
// to AC ground, drawn beside the feed; "" for none.
func feedBypass(c *graph.Circuit, feed *graph.Part, placed map[string]bool, supplyNet func(string) bool) string {
	far := ""
	for _, p := range feed.Pins {
		if !supplyNet(p.Net) {
			far = p.Net
		}
	}
	for _, q := range c.Parts {
		if far == "" || placed[q.Ref] || q.Kind != graph.Capacitor || len(q.Pins) != 2 || !touchesGround(c, q) {
			continue
		}
		if q.Pins[0].Net == far || q.Pins[1].Net == far {
			return q.Ref
		}
	}
	return ""
}

// ownFeed says whether two-terminal q joins a further grid of device d
// (its screen) to a supply (supplyNet): a screen resistor of its own.
func ownFeed(c *graph.Circuit, q, d *graph.Part, supplyNet func(string) bool) bool {
	grid, supply := false, false
	for _, p := range q.Pins {
		ground := supplyNet(p.Net)
		for _, dp := range d.Pins {
			grid = grid || !ground && dp.Net == p.Net && graph.RoleOfPin(d.Kind, dp.Name) == graph.RoleGrid
		}
		supply = supply || ground
	}
	return grid && supply
}

// stopperOf is the stage's resistor in series with dev's control
// electrode: one pin on the control net, the other off AC ground, and
// nothing else but dev on the control net.

func stopperOf(c *graph.Circuit, dev *graph.Part, parts []string, placed map[string]bool) string {
	g := netOf(dev, graph.RoleControl)
	if g == "" {
		return ""
	}
	for _, ref := range parts {
		q := c.Part(ref)
		if q == nil || placed[ref] || q.Kind != graph.Resistor || len(q.Pins) != 2 || touchesGround(c, q) {
			continue
		}
		if (q.Pins[0].Net == g || q.Pins[1].Net == g) && len(c.ConnsOf(g)) == 2 {
			return ref
		}
	}
	return ""
}

func isDevice(p *graph.Part) bool {
	return p.PinWithRole(graph.RoleControl) != "" && p.PinWithRole(graph.RoleOutput) != ""
}

// netOf is the net of p's first terminal of the role, "" if none.
func netOf(p *graph.Part, r graph.TermRole) string {
	if pin := p.Pin(p.PinWithRole(r)); pin != nil {
		return pin.Net
	}
	return ""
}

func touchesGround(c *graph.Circuit, q *graph.Part) bool {
	for _, p := range q.Pins {
		if c.RoleOf(p.Net).IsACGround() {
			return true
		}
	}
	return false
}

// supplyOf says which nets a pair's feeds come from: AC ground, and the
// net of the output transformer's centre tap (the winding end both
// halves' output windings share), which the reduction keeps as a line of
// its own where only the smoothing capacitor grounds it (review21 a04's
// HT): a screen stopper to it is a feed as one to a rail is.
func supplyOf(c *graph.Circuit, places []render.Place, d1, d2 *graph.Part) func(string) bool {
	ct := ""
	for _, pl := range places {
		if t := c.Part(pl.Ref); t != nil && t.Kind == graph.Transformer && ct == "" {
			ct = centreTap(t, netOf(d1, graph.RoleOutput), netOf(d2, graph.RoleOutput))
		}
	}
	return func(net string) bool {
		return c.RoleOf(net).IsACGround() || net != "" && net == ct
	}
}

// centreTap is the net where the windings from outputs o1 and o2 meet
// on transformer t (the centre tap of a push-pull primary), "" if none.
func centreTap(t *graph.Part, o1, o2 string) string {
	ends := func(o string) map[string]bool {
		out := map[string]bool{}
		for _, w := range t.Windings {
			a, b := t.NetOf(w.From), t.NetOf(w.To)
			switch {
			case a == o && b != o:
				out[b] = true
			case b == o && a != o:
				out[a] = true
			}
		}
		return out
	}
	e2 := ends(o2)
	ct := ""
	for n := range ends(o1) {
		if e2[n] && n != "" && (ct == "" || n < ct) {
			ct = n
		}
	}
	return ct
}
