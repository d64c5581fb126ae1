package layout

import (
	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// How a stage template orients the parts it places, before it moves them
// (template.go): each two-terminal part the way its entry stands, its
// signal pins towards where its neighbours' slots are, and a part beside
// or below its anchor hanging from the anchor's wire. A part the template
// then leaves where it was is laid out again without its say.

// stands are the ways the templates ask two-terminal parts to run, by ref.
//
// It is worked out once per placement (the frames and the refs whose
// templates are off do not change during one) and only read: each
// template asked for it, which made a sheet's templates cost the square
// of its frames.
func (ly *state) stands() map[string]string {
	if ly.standsOf != nil {
		return ly.standsOf
	}
	out := map[string]string{}
	defer func() { ly.standsOf = out }()
	for _, f := range ly.o.Frames {
		for _, p := range f.Places {
			if _, ok := out[p.Ref]; !ok && p.Stand != "" && !ly.tplOff[p.Ref] {
				out[p.Ref] = p.Stand
			}
		}
	}
	return out
}

// standOf is how a two-terminal shape runs: "vertical", "horizontal", or
// "" for any other shape. A pot runs the way its track's two ends do (its
// first and last pins; the wiper leaves sideways), so a preset in a bias
// chain stands in line with the chain.
func standOf(s symbol.Shape) string {
	if len(s.Pins) != 2 && len(s.Pins) != 3 {
		return ""
	}
	a, b := s.Pins[0].Dir, s.Pins[len(s.Pins)-1].Dir
	if len(s.Pins) == 3 && a != geom.Dir((int(b)+2)%4) {
		return ""
	}
	switch {
	case (a == geom.Up || a == geom.Down) && (b == geom.Up || b == geom.Down):
		return "vertical"
	case (a == geom.Left || a == geom.Right) && (b == geom.Left || b == geom.Right):
		return "horizontal"
	}
	return ""
}

// tplSlot is where a stage template puts a part: the column (its anchor's
// plus its slot's) and the row of its slot, and its anchor.
type tplSlot struct {
	col    float64
	row    int
	anchor *cell
}

// templateSlots is, per ref a stage template places, its slot: the side
// of its neighbours it will stand on and the wire it hangs from, which its
// orientation is chosen for (orient.go) before the template moves it.
func (ly *state) templateSlots() map[string]tplSlot {
	byRef := map[string]*cell{}
	for _, cl := range ly.cells {
		byRef[cl.ref] = cl
	}
	out := map[string]tplSlot{}
	for _, f := range ly.o.Frames {
		for _, p := range f.Places {
			a := byRef[p.Anchor]
			if _, done := out[p.Ref]; a == nil || done || p.Ref == p.Anchor || ly.tplOff[p.Ref] {
				continue
			}
			out[p.Ref] = tplSlot{col: float64(a.col + p.Col), row: p.Row, anchor: a}
		}
	}
	return out
}

// slotNets sums, per net, the columns of the parts on it, pin by pin as
// netColumns counts them, a templated part's at its slot's column.
func (ly *state) slotNets() map[string]float64 {
	sum := map[string]float64{}
	for _, cl := range ly.cells {
		c := float64(cl.col)
		if t, ok := ly.slot[cl.ref]; ok {
			c = t.col
		}
		for _, pn := range cl.part.Pins {
			if pn.Net != notConnected {
				sum[pn.Net] += c
			}
		}
	}
	return sum
}

// hangScore favours, for a part its template stands upright beside or
// below its anchor, the turn whose pin on one of the anchor's wires points
// up to it (down to it from a row above): the part hangs from the wire
// into the grid, or rises from the tank to it, as drawn in the trade.
func (ly *state) hangScore(cl *cell, s symbol.Shape) float64 {
	t, ok := ly.slot[cl.ref]
	if !ok || standOf(s) != "vertical" {
		return 0
	}
	want := geom.Up
	if t.row < 0 {
		want = geom.Down
	}
	var above, below *graph.Part
	if t.row != 0 {
		// a part in the anchor's row hangs from the anchor's wire
		above, below = ly.chainNeighbours(cl.ref, t)
	}
	score := 0.0
	for _, p := range s.Pins {
		switch {
		case above != nil && p.Dir == geom.Up && hasNet(above, p.Net):
			score += 3
		case below != nil && p.Dir == geom.Down && hasNet(below, p.Net):
			score += 3
		case above == nil && below == nil && p.Dir == want && ly.anchorNet(t.anchor, p.Net):
			return 3
		}
	}
	return score
}

// chainNeighbours are the parts a template stands nearest above and below
// a part in its own column (its anchor in row 0 counts): in a vertical
// chain (a bias chain between two bases, an emitter resistor between its
// device and the mid-point) each part's pins face the neighbours they
// join. Nil where no part of the template shares a wired net with it.
func (ly *state) chainNeighbours(ref string, t tplSlot) (above, below *graph.Part) {
	me := t.anchor.part
	if ref != t.anchor.ref {
		for _, cl := range ly.slotMates[t.anchor] {
			if cl.ref == ref {
				me = cl.part
			}
		}
	}
	bestUp, bestDown := 0, 0
	consider := func(p *graph.Part, row int) {
		if !sharesWired(ly.c, me, p) {
			return
		}
		switch d := row - t.row; {
		case d < 0 && (above == nil || d > bestUp):
			above, bestUp = p, d
		case d > 0 && (below == nil || d < bestDown):
			below, bestDown = p, d
		}
	}
	if float64(t.anchor.col) == t.col {
		consider(t.anchor.part, 0)
	}
	for _, cl := range ly.slotMates[t.anchor] {
		if o := ly.slot[cl.ref]; cl.ref != ref && o.col == t.col {
			consider(cl.part, o.row)
		}
	}
	return above, below
}

// sharesWired says whether parts a and b share a net that is wired (not
// AC ground, not unconnected).
func sharesWired(c *graph.Circuit, a, b *graph.Part) bool {
	for _, p := range a.Pins {
		if p.Net != "" && p.Net != notConnected && !c.RoleOf(p.Net).IsACGround() && hasNet(b, p.Net) {
			return true
		}
	}
	return false
}

func hasNet(p *graph.Part, net string) bool {
	for _, pn := range p.Pins {
		if pn.Net == net {
			return true
		}
	}
	return false
}

// anchorNet says whether net is a wired net of the anchor's.
func (ly *state) anchorNet(a *cell, net string) bool {
	if net == "" || net == notConnected || ly.c.RoleOf(net).IsACGround() {
		return false
	}
	for _, pn := range a.part.Pins {
		if pn.Net == net {
			return true
		}
	}
	return false
}

// templateMisses are the refs a template would orient that it left where
// the generic placement put them (its slot refused, its block shared with
// a part the template does not place), with those already left out: they
// are oriented as the generic placement would orient them.
func (ly *state) templateMisses() map[string]bool {
	var miss []string
	for ref := range ly.slot {
		if !ly.tplMoved[ref] {
			miss = append(miss, ref)
		}
	}
	if len(miss) == 0 {
		return nil
	}
	out := map[string]bool{}
	for r := range ly.tplOff {
		out[r] = true
	}
	for _, r := range miss {
		out[r] = true
	}
	return out
}

// lineScore favours, for a ladder's series part its template lays along a
// row (Place.Line), the turn whose pins point to the slots of the shunts
// the template stands on the same net (upright, in the row under the line
// or in its own): the series parts joined end to end along the line (a
// phase-shift network drawn under its device), not turned about so that
// each link doubles back under the part. The next series part of the same
// arm on the line counts as such a slot (a trimming resistor in series
// with a ladder's last capacitor, review13 b01's R6, had turned about and
// its own wire ran back under it). A net no such part is on says nothing
// (the mean-column score decides it).
func (ly *state) lineScore(cl *cell, s symbol.Shape) float64 {
	t, ok := ly.slot[cl.ref]
	if !ok || standOf(s) != "horizontal" || !ly.onLine(cl.ref) {
		return 0
	}
	score := 0.0
	for _, p := range s.Pins {
		sum, n := 0.0, 0
		for _, mate := range ly.slotMates[t.anchor] {
			ref, o := mate.ref, ly.slot[mate.ref]
			if ref == cl.ref || !ly.shuntBelow(ref, o, t) && !ly.alongLine(ref, o, t) || !ly.onNet(ref, p.Net) {
				continue
			}
			sum += o.col
			n++
		}
		if n == 0 {
			continue
		}
		switch mean := sum / float64(n); {
		case mean < t.col-0.01 && p.Dir == geom.Left, mean > t.col+0.01 && p.Dir == geom.Right:
			score += 5
		case mean < t.col-0.01 && p.Dir == geom.Right, mean > t.col+0.01 && p.Dir == geom.Left:
			score -= 5
		}
	}
	return score
}

// onNet says whether the part of a cell is on net (a wired net, not AC
// ground).
func (ly *state) onNet(ref, net string) bool {
	if net == "" || net == notConnected || ly.c.RoleOf(net).IsACGround() {
		return false
	}
	p := ly.c.Part(ref)
	if p == nil {
		return false
	}
	for _, pn := range p.Pins {
		if pn.Net == net {
			return true
		}
	}
	return false
}

// shuntBelow says whether the template part ref in slot o stands as a
// ladder's shunt under the line of the part in slot t: upright, in the
// row under it or in its own row.
func (ly *state) shuntBelow(ref string, o, t tplSlot) bool {
	if o.row != t.row+1 && o.row != t.row {
		return false
	}
	return ly.placeStand(ref) == "vertical"
}

// alongLine says whether the template part ref in slot o lies along the
// same ladder line as the part in slot t.
func (ly *state) alongLine(ref string, o, t tplSlot) bool {
	return o.row == t.row && ly.onLine(ref)
}

// placeStand is the way the first template placing ref asks it to run.
func (ly *state) placeStand(ref string) string {
	if p, ok := ly.firstPlace(ref); ok {
		return p.Stand
	}
	return ""
}

// onLine says whether the first template placing ref lays it along a
// ladder's line (Place.Line).
func (ly *state) onLine(ref string) bool {
	p, ok := ly.firstPlace(ref)
	return ok && p.Line
}

// firstPlace is the first template entry placing ref.
func (ly *state) firstPlace(ref string) (Place, bool) {
	for _, f := range ly.o.Frames {
		for _, p := range f.Places {
			if p.Ref == ref {
				return p, true
			}
		}
	}
	return Place{}, false
}
