package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// Two places for a tank capacitor when the slot beside its winding is
// taken by the winding's own rail tag or its tap's lead:
//
//   - under the winding's lower end when that end is the hot one and the
//     upper end is chassis or a decoupled line (a transistor IF can drawn
//     chassis end up): the capacitor hangs from the hot end's wire, its
//     ground or rail under it, clear of the tap's lead above;
//   - beside the winding after all, the winding's rail tag on that side
//     turned down (or up) between the winding and the capacitor, its text
//     under (over) the winding: a long tag ("AGC line via R8") straight
//     out of the cold end pushed the capacitor fourteen steps off.

// underWinding stands the capacitor under the winding's lower end p2, its
// pin on p2's net pointing up a step below the pin and two or more steps
// out the way p2 points, its other end (AC ground) down.
func (ly *state) underWinding(cp *cell, p2 *geom.Pin, taken []geom.Rect) bool {
	if p2.Dir != geom.Left && p2.Dir != geom.Right || ly.c.RoleOf(p2.Net).IsACGround() {
		return false
	}
	base := symbol.ForMarked(ly.o.drawnPart(cp.part), ly.o.Style, ly.marksOf(cp.part))
	step := p2.Dir.Step().X
	for i, o := range base.Turns {
		s := base.Oriented(o)
		var hot *geom.Pin
		cold := false
		for k := range s.Pins {
			p := &s.Pins[k]
			switch {
			case p.Net == p2.Net && p.Dir == geom.Up:
				hot = p
			case p.Net != p2.Net && p.Dir == geom.Down && ly.c.RoleOf(p.Net).IsACGround():
				cold = true
			}
		}
		if hot == nil || !cold {
			continue
		}
		old, oldTurn, oldLocals, oldLabel := cp.shape, cp.turn, cp.locals, cp.label
		cp.shape, cp.turn, cp.locals = s, i, nil
		buildLocals(ly.c, cp)
		// the label and rail tag under the winding, inside the block:
		// outside it they stood in the way of the next wire along (a
		// padder's lead squeezed beside another net's)
		side := opposite4(p2.Dir)
		placeLabel(ly.c, cp, []geom.Dir{side, opposite4(side), geom.Down})
		ly.tagsOutward(cp, side)
		for k := 2.0; k <= tankReach; k++ {
			d := geom.Pt{X: math.Round(p2.At.X + step*k - hot.At.X), Y: p2.At.Y + 1 - hot.At.Y}
			cp.move(d)
			if !clashes(cp, taken) {
				return true
			}
			cp.move(geom.Pt{X: -d.X, Y: -d.Y})
		}
		cp.shape, cp.turn, cp.locals, cp.label = old, oldTurn, oldLocals, oldLabel
	}
	return false
}

// besideRetagged stands the capacitor beside the winding with the
// winding's rail tags on that side (those pointing dir) taken off first,
// then hangs each of them again clear of the capacitor, turned towards
// the winding's far end. It keeps the first arrangement where every tag
// finds a place, or leaves the cells as they were.
func (ly *state) besideRetagged(b *block, cp *cell, p1, p2 *geom.Pin, dir geom.Dir, inner bool) bool {
	coil := b.cells[0]
	var moved []int
	for i, l := range coil.locals {
		if l.Kind == geom.LocalRail && l.Side == dir && (l.Pin == p1.Name || l.Pin == p2.Name) {
			moved = append(moved, i)
		}
	}
	if len(moved) == 0 || dir != geom.Left && dir != geom.Right {
		return false
	}
	skip := map[int]bool{}
	for _, i := range moved {
		skip[i] = true
	}
	taken := ly.tankTaken(b, cp, skip)
	oldCap, oldLocals := *cp, cloneLocals(coil.locals)
	oldCap.locals = cloneLocals(cp.locals) // cp.move shifts them in place
	if !ly.besideWinding(cp, p1, p2, dir, inner, taken) {
		*cp = oldCap
		return false
	}
	ly.tagsOutward(cp, dir)
	obs := &obstacles{boxes: append(taken, cp.shape.Box, cp.label.Box)}
	for _, l := range cp.locals {
		obs.boxes = append(obs.boxes, l.Box)
		obs.segs = append(obs.segs, l.Stub...)
	}
	for _, p := range cp.shape.Pins {
		if !ly.c.RoleOf(p.Net).IsACGround() {
			obs.boxes = append(obs.boxes, corridor(p))
		}
	}
	for _, i := range moved {
		pin := coil.shape.Pin(coil.locals[i].Pin)
		turn := geom.Down
		if pin.Name == p1.Name {
			turn = geom.Up
		}
		l, ok := turnedTag(ly.c, coil, *pin, turn, obs)
		if !ok {
			*cp, coil.locals = oldCap, oldLocals
			return false
		}
		coil.locals[i] = l
		obs.boxes = append(obs.boxes, l.Box)
		obs.segs = append(obs.segs, l.Stub...)
	}
	b.fp = b.fp.Union(coil.footprint())
	return true
}

// turnedTag is a rail tag for a pin pointing sideways whose stub runs out
// one step and turns (up or down) a step or two, the bar across the turn
// and the text beside it, reading back over the part first: the first
// such tag clear of obs.
func turnedTag(c *graph.Circuit, cl *cell, p geom.Pin, turn geom.Dir, obs *obstacles) (geom.Local, bool) {
	text := railText(pinReturn(c, cl.part, p), p.Net)
	w := symbol.TextWidth(text) * symbol.SmallScale
	h := symbol.LineH * symbol.SmallScale
	out := p.Dir.Step()
	back := opposite4(p.Dir)
	for d := 2.0; d <= 4; d++ {
		for s := 1.0; s <= 2; s++ {
			bend := geom.Pt{X: p.At.X + s*out.X, Y: p.At.Y}
			end := geom.Pt{X: bend.X, Y: bend.Y + d*turn.Step().Y}
			bar := geom.R(end.X-0.6, end.Y-0.1, end.X+0.6, end.Y+0.1)
			for _, side := range []geom.Dir{back, turn, p.Dir} {
				l := geom.Local{Kind: geom.LocalRail, Net: p.Net, Pin: p.Name, Side: side, Text: text, At: end,
					Down: turn == geom.Down, Owner: cl.ref, Faded: cl.faded || cl.fadedPins[p.Name],
					Stub: []geom.Seg{{A: p.At, B: bend}, {A: bend, B: end}}}
				switch side {
				case geom.Left:
					l.TextBox = geom.R(end.X-0.8-w, end.Y-h/2, end.X-0.8, end.Y+h/2)
				case geom.Right:
					l.TextBox = geom.R(end.X+0.8, end.Y-h/2, end.X+0.8+w, end.Y+h/2)
				case geom.Down: // centred under the bar
					l.TextBox = geom.R(end.X-w/2, end.Y+0.25, end.X+w/2, end.Y+0.25+h)
				default: // centred over it
					l.TextBox = geom.R(end.X-w/2, end.Y-0.25-h, end.X+w/2, end.Y-0.25)
				}
				l.Box = bar.Union(l.TextBox)
				if !obs.hits(l.Box.Inset(0.15), l.Stub) {
					return l, true
				}
			}
		}
	}
	return geom.Local{}, false
}

// tankTaken is what a tank capacitor must keep clear of beside its
// winding: the winding, its label and its locals (but those skipped), the
// way out of each of its wired pins, and the block's capacitors placed
// before cp.
func (ly *state) tankTaken(b *block, cp *cell, skip map[int]bool) []geom.Rect {
	coil := b.cells[0]
	taken := []geom.Rect{coil.shape.Box, coil.label.Box}
	for i, l := range coil.locals {
		if !skip[i] {
			taken = append(taken, localBoxes(l)...)
		}
	}
	for _, p := range coil.shape.Pins {
		if !ly.c.RoleOf(p.Net).IsACGround() {
			taken = append(taken, corridor(p))
		}
	}
	for _, o := range b.chain {
		if o == cp {
			break
		}
		taken = append(taken, o.shape.Box, o.label.Box)
		for _, l := range o.locals {
			taken = append(taken, localBoxes(l)...)
		}
	}
	return taken
}

// tagClear is the margin a part keeps from a rail tag's bar and text,
// render/check's (a capacitor touching a centre tap's "HT +300 V" read as
// the tag's own part, review18 a04's C8).
const tagClear = 0.5

// localBoxes are a local symbol's box and its stub's; a rail tag's box
// grown by tagClear, so a capacitor stands clear of it, not touching it.
func localBoxes(l geom.Local) []geom.Rect {
	b := l.Box
	if l.Kind == geom.LocalRail {
		b = b.Inset(tagClear)
	}
	out := []geom.Rect{b}
	for _, st := range l.Stub {
		out = append(out, st.Box())
	}
	return out
}

// chassisUp says whether a transformer winding's upper end (as drawn)
// returns to AC ground while its lower end is wired: its capacitor hangs
// under the lower end (underWinding) before anything else.
func (ly *state) chassisUp(coil *cell, p1, p2 *geom.Pin) bool {
	return coil.part.Kind == graph.Transformer && ly.c.RoleOf(p1.Net) == graph.Ground && !ly.c.RoleOf(p2.Net).IsACGround()
}

// tagsOutward turns the capacitor's rail tags that stand centred on an
// upright pin to read towards dir: away from the winding beside it, so
// the winding's own tag turned down keeps its text under the winding
// clear of the capacitor's; under the winding it hangs from.
func (ly *state) tagsOutward(cp *cell, dir geom.Dir) {
	for i, l := range cp.locals {
		if l.Kind != geom.LocalRail || l.Side != geom.Up && l.Side != geom.Down {
			continue
		}
		p := cp.shape.Pin(l.Pin)
		if p == nil || len(l.Stub) != 1 {
			continue
		}
		s := math.Abs(l.Stub[0].B.Y-l.Stub[0].A.Y) + math.Abs(l.Stub[0].B.X-l.Stub[0].A.X)
		for _, c := range localCandidates(*p, pinReturn(ly.c, cp.part, *p), pinRole(ly.c, cp.part, *p), s) {
			if c.Side == dir && !c.Box.Overlaps(cp.label.Box) {
				c.Owner, c.Faded = l.Owner, l.Faded
				cp.locals[i] = c
			}
		}
	}
}

// cloneLocals copies locals with their stubs, which cell.move shifts in
// place.
func cloneLocals(ls []geom.Local) []geom.Local {
	out := append([]geom.Local(nil), ls...)
	for i := range out {
		out[i].Stub = append([]geom.Seg(nil), out[i].Stub...)
	}
	return out
}

// overWinding stands the capacitor over the winding's upper end, hanging
// from it, when its other end is a rail drawn upwards (a transistor IF
// can's capacitor to the supply): the rail tag on top, as the trade draws
// a decoupled winding's cold end.
func (ly *state) overWinding(cp *cell, p1 *geom.Pin, dir geom.Dir, taken []geom.Rect) bool {
	if dir != geom.Left && dir != geom.Right {
		return false
	}
	base := symbol.ForMarked(ly.o.drawnPart(cp.part), ly.o.Style, ly.marksOf(cp.part))
	for i, o := range base.Turns {
		s := base.Oriented(o)
		var hot, rail *geom.Pin
		for k := range s.Pins {
			p := &s.Pins[k]
			if p.Net == p1.Net && p.Dir == geom.Down {
				hot = p
			} else if want, ok := railWant(ly.c, cp.part, *p); ok && want == geom.Up && p.Dir == geom.Up && ly.c.RoleOf(p.Net).IsACGround() {
				rail = p
			}
		}
		if hot == nil || rail == nil {
			continue
		}
		old, oldTurn, oldLocals, oldLabel := cp.shape, cp.turn, cp.locals, cp.label
		cp.shape, cp.turn, cp.locals = s, i, nil
		buildLocals(ly.c, cp)
		side := dir
		placeLabel(ly.c, cp, []geom.Dir{side, opposite4(side), geom.Up, geom.Down})
		step := -1.0
		if dir == geom.Right {
			step = 1
		}
		for k := 3.0; k <= tankReach; k++ {
			d := geom.Pt{X: math.Round(p1.At.X + step*k - hot.At.X), Y: p1.At.Y - 1 - hot.At.Y}
			cp.move(d)
			if !clashes(cp, taken) {
				return true
			}
			cp.move(geom.Pt{X: -d.X, Y: -d.Y})
		}
		cp.shape, cp.turn, cp.locals, cp.label = old, oldTurn, oldLocals, oldLabel
	}
	return false
}

// clearOf stands the capacitor clear of the whole block on its side, as
// near as it goes.
func (ly *state) clearOf(cp *cell, b *block, dir geom.Dir) {
	fp := cp.footprint()
	var d geom.Pt
	switch dir {
	case geom.Left:
		d.X = math.Floor(b.fp.X0 - 1 - fp.X1)
	case geom.Right:
		d.X = math.Ceil(b.fp.X1 + 1 - fp.X0)
	default:
		d.Y = math.Floor(b.fp.Y0 - 1 - fp.Y1)
	}
	cp.move(d)
}
