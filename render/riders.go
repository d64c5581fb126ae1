package render

import (
	"pare/graph"
	"pare/render/geom"
)

// A stretch too big for its page with no pieces to cut it between was
// drawn smaller on a page of its own (review16 b05: the mixer's frame with
// its base bias network, which rides on the mixer's stretch for the far
// end of the aerial winding's base link, 147 units against 136, its text
// at 2.31 mm). The parts riding on a stretch (ride) that share no wired
// net with its own parts hang on it only by the nets a row's connectors
// carry anyway: cut off as a piece of their own, the stage keeps the
// paper's scale and they stand on the row their wires come from, or the
// next.
//
// A rider tied to the stretch's own parts only by a net another stretch
// holds too is as loose: that net runs on to the other stretch by a
// connector pair wherever the two stand on different rows, and the rider
// can take such a pair as well. Review21 b05's faded mixer, 147 units
// against 136 with its text at 2.31 mm, carried its base bias divider
// and decoupler (R1, R2, C1) for the far end of the aerial rod's base
// winding, tied to the stage only by the front end's decoupled supply
// line, which its decoupler (another stretch) holds as well.

// riderPieces is stretch bs[a], too big for its page, as two pieces: its
// own parts and the riders wired to none of them (not through another
// rider either) by a net no other stretch holds, those first when a wire of theirs reaches a stretch
// before it, else after; nil when it has pieces already or no such
// riders. The riders' piece takes their width in the whole sheet's
// placement (ext) at the side of the stretch it goes on.
func riderPieces(c *graph.Circuit, bs []block, a int, ext map[string]geom.Rect) []block {
	b := bs[a]
	if len(b.pieces) > 0 || len(b.riders) == 0 {
		return nil
	}
	free := looseRiders(c, b, heldElsewhere(c, bs, a))
	if len(free) == 0 {
		return nil
	}
	own := block{x0: b.x0, x1: b.x1, port: b.port, ch: b.ch, apart: b.apart}
	rid := block{ch: b.ch, apart: b.apart}
	span := geom.Rect{}
	for _, r := range b.refs {
		if !free[r] {
			own.refs = append(own.refs, r)
			continue
		}
		rid.refs = append(rid.refs, r)
		if e, ok := ext[r]; ok {
			span = span.Union(e)
		}
	}
	w := span.W()
	if reachesBack(c, bs[:a], rid.refs) {
		rid.x0, rid.x1 = b.x0-w, b.x0
		return []block{rid, own}
	}
	rid.x0, rid.x1 = b.x1, b.x1+w
	return []block{own, rid}
}

// looseRiders are the riders of stretch b that share no wired net with
// its own parts, directly or through the riders that do, counting only
// the nets no other stretch holds (elsewhere).
func looseRiders(c *graph.Circuit, b block, elsewhere map[string]bool) map[string]bool {
	rider := map[string]bool{}
	for _, r := range b.riders {
		rider[r] = true
	}
	held := map[string]bool{} // wired nets of the stretch's own parts and the riders tied to them
	for _, r := range b.refs {
		if p := c.Part(r); p != nil && !rider[r] {
			for _, n := range wiredNets(c, p) {
				held[n] = !elsewhere[n]
			}
		}
	}
	tied := map[string]bool{}
	for grew := true; grew; {
		grew = false
		for _, r := range b.riders {
			p := c.Part(r)
			if tied[r] || p == nil {
				continue
			}
			nets := wiredNets(c, p)
			for _, n := range nets {
				if held[n] {
					tied[r], grew = true, true
					for _, m := range nets {
						held[m] = !elsewhere[m]
					}
					break
				}
			}
		}
	}
	free := map[string]bool{}
	for _, r := range b.riders {
		if !tied[r] {
			free[r] = true
		}
	}
	return free
}

// heldElsewhere are the wired nets of the parts of every stretch but
// bs[a].
func heldElsewhere(c *graph.Circuit, bs []block, a int) map[string]bool {
	out := map[string]bool{}
	for i, b := range bs {
		if i == a {
			continue
		}
		for _, r := range b.refs {
			if p := c.Part(r); p != nil {
				for _, n := range wiredNets(c, p) {
					out[n] = true
				}
			}
		}
	}
	return out
}

// reachesBack says whether a wired net of one of refs is held by a part
// of the stretches before.
func reachesBack(c *graph.Circuit, before []block, refs []string) bool {
	nets := map[string]bool{}
	for _, r := range refs {
		if p := c.Part(r); p != nil {
			for _, n := range wiredNets(c, p) {
				nets[n] = true
			}
		}
	}
	for _, b := range before {
		for _, r := range b.refs {
			if p := c.Part(r); p != nil {
				for _, n := range wiredNets(c, p) {
					if nets[n] {
						return true
					}
				}
			}
		}
	}
	return false
}
