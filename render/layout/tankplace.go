package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// tankReach is how much further out than the nearest place a tank
// capacitor may stand beside its winding (render/check reports one more
// than eight grid steps from its winding).
const tankReach = 6

// labelUnderGap is how far under a tank capacitor's body its label may
// stand (below its chassis symbol) before it goes back beside it.
const labelUnderGap = 4

// tankAt is a capacitor's winding (tanks.go): the coil's cell, the
// winding's end pins and, for one across the winding and its padder, the
// end it shares.
type tankAt struct {
	coil *cell
	ends [2]string
	hot  string
}

// findTanks maps each capacitor across a winding to its winding, among
// the sheet's cells, unless the frames given put the two in different
// stages (the pipeline puts them in one, tankFrames).
func (ly *state) findTanks() map[*cell]tankAt {
	byRef := map[string]*cell{}
	for _, cl := range ly.cells {
		if cl.edge == 0 && !cl.conn {
			byRef[cl.ref] = cl
		}
	}
	frame := map[string]int{}
	for i, f := range ly.o.Frames {
		for _, r := range f.Parts {
			if _, ok := frame[r]; !ok {
				frame[r] = i
			}
		}
	}
	out := map[*cell]tankAt{}
	tanks := Tanks(ly.c)
	ly.tuned = tunedWindings(ly.c, tanks)
	for _, t := range tanks {
		cp, coil := byRef[t.Cap], byRef[t.Coil]
		fc, okc := frame[t.Coil]
		fk, okk := frame[t.Cap]
		if okc && okk && fc != fk {
			continue // framed apart by the caller: each stands in its own frame
		}
		if cp != nil && coil != nil {
			out[cp] = tankAt{coil: coil, ends: t.Ends, hot: t.Hot}
		}
	}
	return out
}

// tankRanks puts each tank capacitor in its winding's layer, never as a
// shunt before an active part: it stands beside the coil.
func (ly *state) tankRanks(rank map[string]int) {
	for cp, t := range ly.tankOf {
		if r, ok := rank[t.coil.ref]; ok {
			rank[cp.ref] = r
			delete(ly.before, cp.ref)
		}
	}
}

// orientTanks turns each tank capacitor parallel to its winding, its pin
// on the winding's upper (left) end up (left), unless that would point a
// ground or low rail up: then it keeps its own turn and still stands
// beside the winding. The untangle search's turns do not apply: a
// capacitor lying across a winding's side reads as a series part.
func (ly *state) orientTanks() {
	for _, cp := range ly.tankCells() {
		t := ly.tankOf[cp]
		top, bottom := t.coil.shape.Pin(t.ends[0]), t.coil.shape.Pin(t.ends[1])
		if top == nil || bottom == nil {
			continue
		}
		vertical := top.At.X == bottom.At.X
		if vertical && top.At.Y > bottom.At.Y || !vertical && top.At.X > bottom.At.X {
			top, bottom = bottom, top
		}
		upNet := top.Net
		if t.hot != "" && (t.hot != top.Name || !vertical) {
			// across the winding and its padder from the lower end, or
			// from one end of a coil lying down to chassis: a shunt
			continue
		}
		base := symbol.ForMarked(ly.o.drawnPart(cp.part), ly.o.Style, ly.marksOf(cp.part))
		want := geom.Up
		if !vertical {
			want = geom.Left
		}
		for i, o := range base.Turns {
			s := base.Oriented(o)
			if !groundDown(ly.c, cp.part, s) {
				continue
			}
			for _, p := range s.Pins {
				if ly.sameNet(p.Net, upNet) && p.Dir == want {
					cp.shape, cp.turn = s, i
				}
			}
		}
	}
}

// sameNet says whether two nets are one for a tank: the same net, or both
// at AC ground.
func (ly *state) sameNet(a, b string) bool {
	return a == b || ly.c.RoleOf(a).IsACGround() && ly.c.RoleOf(b).IsACGround()
}

// tankCells are the tank capacitors in cell order.
func (ly *state) tankCells() []*cell {
	var out []*cell
	for _, cl := range ly.cells {
		if _, ok := ly.tankOf[cl]; ok {
			out = append(out, cl)
		}
	}
	return out
}

// tankBlocks makes a block of each winding with capacitors across it: an
// upright two-terminal or tapped coil stands among its capacitors side by
// side (arrange), a transformer or a coil lying down has them beside its
// winding (standTank). It returns the blocks and the cells they hold.
func (ly *state) tankBlocks(chains map[*cell][]*cell) (map[*cell]*block, map[*cell]bool) {
	byCoil := map[*cell][]*cell{}
	var coils []*cell
	for _, cp := range ly.tankCells() {
		t := ly.tankOf[cp]
		if !ly.facesWinding(cp, t) {
			continue
		}
		if _, ok := byCoil[t.coil]; !ok {
			coils = append(coils, t.coil)
		}
		byCoil[t.coil] = append(byCoil[t.coil], cp)
	}
	blocks := map[*cell]*block{}
	held := map[*cell]bool{}
	for _, coil := range coils {
		if len(chains[coil]) > 0 {
			// a padder chain stands beside this coil already (stackChain):
			// a tank block would drop the chain and leave its parts on
			// top of each other, so the capacitors across it stand as
			// their own blocks in its layer
			continue
		}
		caps := byCoil[coil]
		b := &block{cells: []*cell{coil}, col: coil.col, chain: chains[coil]}
		side := coil.part.Kind != graph.Transformer && isVertical(coil) && len(b.chain) == 0
		for _, cp := range caps {
			side = side && isVertical(cp)
		}
		if side {
			b.cells = append(b.cells, caps...)
		} else {
			b.chain, b.tank = caps, true
		}
		blocks[coil] = b
		held[coil] = true
		for _, cl := range append(append([]*cell{}, caps...), chains[coil]...) {
			cl.col = coil.col
			held[cl] = true
		}
	}
	return blocks, held
}

// standTank stands each capacitor of a tank block by its winding, at the
// first of these places clear of the block (tankTaken): under the lower
// end of a transformer winding drawn chassis end up (underWinding); beside
// the winding on its outer side (left of a transformer's left coils,
// right of its right ones; above a coil lying down), its upper pin a step
// below the winding's upper pin so the wire from it turns down into the
// capacitor (besideWinding, levelTo); over the winding's upper end,
// hanging from it, when its far end is a rail drawn upwards
// (overWinding); under the lower end; beside the winding with the
// winding's own rail tags on that side turned out of its way
// (besideRetagged). Short of all of them it stands clear of the block.
func (ly *state) standTank(b *block) {
	coil := b.cells[0]
	for i, cp := range b.chain {
		t := ly.tankOf[cp]
		// another capacitor on this winding stands further out: this
		// one's label goes under it, out of the way
		inner := false
		for _, later := range b.chain[i+1:] {
			inner = inner || ly.tankOf[later].ends == t.ends
		}
		p1, p2 := coil.shape.Pin(t.ends[0]), coil.shape.Pin(t.ends[1])
		if p1 == nil || p2 == nil {
			continue
		}
		if p1.At.Y > p2.At.Y || p1.At.Y == p2.At.Y && p1.At.X > p2.At.X {
			p1, p2 = p2, p1
		}
		dir := p1.Dir
		switch {
		case lying(coil, p1, p2) && ly.live(p1.Net) && ly.live(p2.Net):
			dir = geom.Up
			if i == 0 {
				ly.labelUnderCoil(coil)
			}
		case dir == geom.Left || dir == geom.Right:
		case p1.At.X == p2.At.X: // an upright coil's ends: beside it, right
			dir = geom.Right
		default: // a coil lying down: above it
			dir = geom.Up
		}
		taken := ly.tankTaken(b, cp, nil)
		up := ly.chassisUp(coil, p1, p2)
		switch {
		case up && ly.underWinding(cp, p2, taken):
		case ly.besideWinding(cp, p1, p2, dir, inner, taken):
		case ly.overWinding(cp, p1, dir, taken):
		case !up && ly.underWinding(cp, p2, taken):
		case ly.besideRetagged(b, cp, p1, p2, dir, inner):
		default:
			ly.clearOf(cp, b, dir)
		}
		b.fp = b.fp.Union(cp.footprint())
	}
}

// clashes says whether any of a cell's boxes overlaps a taken one.
func clashes(cl *cell, taken []geom.Rect) bool {
	boxes := []geom.Rect{cl.shape.Box, cl.label.Box}
	for _, l := range cl.locals {
		boxes = append(boxes, l.Box)
		for _, st := range l.Stub {
			boxes = append(boxes, st.Box().Inset(0.1))
		}
	}
	for _, a := range boxes {
		if a == (geom.Rect{}) {
			continue
		}
		for _, t := range taken {
			// touching is fine, any overlap is not: the sheet checker
			// reports a label reaching 0.12 into a capacitor's box
			if t != (geom.Rect{}) && a.Overlaps(t) {
				return true
			}
		}
	}
	return false
}

// besideWinding tries the capacitor beside the winding, two steps out
// from its pins and up to tankReach further, and keeps the first place
// clear of the block.
func (ly *state) besideWinding(cp *cell, p1, p2 *geom.Pin, dir geom.Dir, inner bool, taken []geom.Rect) bool {
	prefs := []geom.Dir{dir, geom.Down, geom.Up, opposite4(dir)}
	switch {
	case inner && dir != geom.Up:
		// under its ground or rail symbol, however far: beside it stands
		// the next capacitor
		prefs = []geom.Dir{geom.Down}
	case dir == geom.Up:
		prefs = []geom.Dir{geom.Up, geom.Right, geom.Left, geom.Down}
	}
	placeLabel(ly.c, cp, prefs)
	top, bot := ends2(cp)
	for k := 0.0; k <= tankReach; k++ {
		var d geom.Pt
		switch dir {
		case geom.Left:
			d = geom.Pt{X: p1.At.X - 2 - k - cp.shape.Box.X1, Y: p1.At.Y + 1 - top.At.Y}
		case geom.Right:
			d = geom.Pt{X: p1.At.X + 2 + k - cp.shape.Box.X0, Y: p1.At.Y + 1 - top.At.Y}
		default:
			d = geom.Pt{X: p1.At.X - top.At.X, Y: math.Min(p1.At.Y, p2.At.Y) - 2 - k - cp.shape.Box.Y1}
		}
		d.X = math.Round(d.X)
		// the pins on the grid, the gap no smaller: a lying capacitor's
		// box reaches 0.9 past its pins, and a box-based step above the
		// coil left its pins 0.1 off the grid, where the router's wires
		// (on the grid) missed them (review16 a01's tuning capacitor and
		// trimmer read unwired, and its divider capacitor's lead was left
		// bare)
		d.Y = math.Floor(top.At.Y+d.Y+1e-9) - top.At.Y
		if dir != geom.Up {
			if y, ok := ly.levelTo(cp, p1, p2); ok {
				d.Y = y
			}
		}
		wiredBoth := !ly.c.RoleOf(p1.Net).IsACGround() && !ly.c.RoleOf(p2.Net).IsACGround()
		if dir != geom.Up && wiredBoth && p2.At.Y-p1.At.Y >= 6 {
			// a long winding: the capacitor centred on it
			d.Y = math.Round((p1.At.Y+p2.At.Y)/2 - (top.At.Y+bot.At.Y)/2)
		}
		cp.move(d)
		if !clashes(cp, taken) {
			if dir == geom.Left && ly.c.RoleOf(bot.Net) == graph.Ground && cp.part.Type == graph.CapTrimmer && p2.At.Y >= ly.tankOf[cp].coil.shape.Box.Y1 {
				// a trimmer left of its coil's lowest winding, to chassis
				ly.labelUnder(cp, taken)
			}
			return true
		}
		cp.move(geom.Pt{X: -d.X, Y: -d.Y})
	}
	return false
}

// labelUnder moves the label of a trimmer standing left of its winding,
// its lower end at chassis, from its outer side to under its chassis
// symbol when that place is close and clear of the block: on the outer
// side its two lines (value, alignment step) widened the column by their
// width (a self-oscillating mixer's stage outgrew an A3 page at 2.5 mm
// text); under it they take height. The trimmer itself stays where it
// stands. Only a trimmer, and only under the coil's lowest winding: with
// fixed capacitors too (an IF can's) and under a winding with another
// below it (a link winding's tag), the moved labels turned the untangle
// search elsewhere and more wires read as joined (misreadCeiling).
func (ly *state) labelUnder(cp *cell, taken []geom.Rect) {
	side := cp.label
	placeLabel(ly.c, cp, []geom.Dir{geom.Down})
	if cp.label.Box.Y0-cp.shape.Box.Y1 > labelUnderGap || clashes(cp, taken) {
		cp.label = side
	}
}

// ends2 is a two-terminal cell's upper (left) pin and lower (right) one.
func ends2(cl *cell) (a, b *geom.Pin) {
	a, b = &cl.shape.Pins[0], &cl.shape.Pins[1]
	if a.At.Y > b.At.Y || a.At.Y == b.At.Y && a.At.X > b.At.X {
		a, b = b, a
	}
	return a, b
}

func opposite4(d geom.Dir) geom.Dir { return geom.Dir((int(d) + 2) % 4) }

// tankFollows says whether a cell of block b is a capacitor across the
// block's winding: a stage template that places the winding moves its
// tank with it, listed or not (a Colpitts template places the coil, the
// tuning capacitor beside it is the set's own).
func (ly *state) tankFollows(cl *cell, b *block) bool {
	t, ok := ly.tankOf[cl]
	return ok && t.coil == b.cells[0]
}

// groundDown says whether no pin of a symbol returning to chassis or a
// low rail points up. A tank capacitor may point its HT end down, as the
// winding's cold end beside it does.
func groundDown(c *graph.Circuit, part *graph.Part, s symbol.Shape) bool {
	for _, p := range s.Pins {
		if want, ok := railWant(c, part, p); ok && c.RoleOf(p.Net).IsACGround() && want == geom.Down && p.Dir == geom.Up {
			return false
		}
	}
	return true
}

// levelTo is how far a capacitor standing beside a winding moves down so
// that its pin on a wired end of the winding (the upper end first) stands
// a step past that end's pin the way the capacitor's pin points: the wire
// from the winding runs out and turns into the capacitor's pin from the
// side it faces.
func (ly *state) levelTo(cp *cell, p1, p2 *geom.Pin) (float64, bool) {
	for _, p := range []*geom.Pin{p1, p2} {
		if ly.c.RoleOf(p.Net).IsACGround() {
			continue
		}
		for _, q := range cp.shape.Pins {
			if q.Net != p.Net {
				continue
			}
			switch q.Dir {
			case geom.Up:
				return p.At.Y + 1 - q.At.Y, true
			case geom.Down:
				return p.At.Y - 1 - q.At.Y, true
			}
		}
	}
	return 0, false
}

// inTank says whether a cell is a tank capacitor: the untangle search
// leaves it alone, since it turns and moves with its winding.
func (ly *state) inTank(cl *cell) bool {
	_, ok := ly.tankOf[cl]
	return ok
}

// facesWinding says whether a tank capacitor could be turned the way its
// winding runs (orientTanks): one whose winding has its chassis end on
// top stands as a shunt of its own in the winding's column, under it (a
// block beside a winding drawn chassis-up rearranged a mixer's stage into a
// crossing).
func (ly *state) facesWinding(cp *cell, t tankAt) bool {
	top, bottom := t.coil.shape.Pin(t.ends[0]), t.coil.shape.Pin(t.ends[1])
	if top == nil || bottom == nil {
		return true
	}
	if top.At.X != bottom.At.X {
		// a coil lying down: a capacitor from one of its ends to chassis
		// is that end's shunt, standing in the coil's layer on its own
		return t.hot == ""
	}
	if top.At.Y > bottom.At.Y {
		top = bottom
	}
	if ly.c.RoleOf(top.Net) != graph.Ground || t.coil.part.Kind == graph.Transformer {
		// a rail or signal end on top: beside it, facing it or not; a
		// transformer's winding drawn chassis end up: hanging under its
		// lower end (underWinding)
		return true
	}
	for _, p := range cp.shape.Pins {
		if ly.sameNet(p.Net, top.Net) && p.Dir == geom.Up {
			return true
		}
	}
	return false
}
