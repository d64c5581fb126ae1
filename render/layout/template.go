package layout

import (
	"math"
	"slices"

	"pare/graph"

	"pare/render/geom"
)

// Stage templates: a recognised stage's parts drawn where the trade draws
// them round its active part (the tank beside the valve, the load above
// the anode, the cathode resistor and bypass below), from the stage
// pattern's [draw] table (docs/patterns.md). The generic placement runs
// first; the template then moves each of the stage's blocks to its slot
// round the anchor, a grid of columns and rows sized by the blocks in
// them, and a block whose slot would touch another block, or stretch the
// stage's frame over another stage or an unframed part, keeps its generic
// place. The router then wires the result as any other placement.

// Place is one part of a stage template: Ref drawn Col slots right and Row
// slots down of Anchor (the stage's active part, whose own place is Col 0,
// Row 0). Stand, when set, is "vertical" or "horizontal": the way a
// two-terminal part runs; or StandFlipped for a device.
type Place struct {
	Ref, Anchor string
	Col, Row    int
	Stand       string
	// Line marks a series part of a ladder laid along a row: its pins
	// turn towards the ladder's shunts on its nets (lineScore).
	Line bool
}

// StandFlipped stands a device upside down (mirrored top to bottom, its
// control electrode still on the left): the lower half of a push-pull
// pair, its common electrode up towards the upper half's, so the two meet
// on the centre line (common practice in service sheets).
const StandFlipped = "flipped"

// Gaps between a template's slots, in grid steps: as between the generic
// placement's columns and stacked blocks.
const (
	slotGapX = colGap + 1
	slotGapY = rowGap
)

// slotReach bounds a template's columns and rows either side of its
// anchor (the pattern language allows as many); a place beyond is ignored.
const slotReach = 4

// slotted is a block a template moves, with its slot and where it goes.
type slotted struct {
	b        *block
	col, row int
	d        geom.Pt
	keep     bool    // false once the slot is refused: the block stays put
	hang     float64 // the step under (over) the anchor's wire levelWith gave it
}

// templates applies every frame's templates, frame by frame, each
// template in the order the frame lists them (a stage's own before its
// sub-stages'); a block moved once is not moved again.
func (ly *state) templates(cols [][]*block) {
	blockOf := map[string]*block{}
	var all []*block
	for _, col := range cols {
		for _, b := range col {
			all = append(all, b)
			for _, cl := range b.cells {
				blockOf[cl.ref] = b
			}
			for _, cl := range b.chain {
				blockOf[cl.ref] = b
			}
		}
	}
	moved := map[*block]bool{}
	ly.tplMoved = map[string]bool{}
	for fi, f := range ly.o.Frames {
		// each template starts with its anchor's own place
		start := 0
		for i := 1; i <= len(f.Places); i++ {
			if i == len(f.Places) || f.Places[i].Ref == f.Places[i].Anchor {
				ly.template(fi, f.Places[start:i], blockOf, all, moved)
				start = i
			}
		}
	}
}

// template places one stage template's blocks round its anchor's block.
func (ly *state) template(stage int, places []Place, blockOf map[string]*block, all []*block, moved map[*block]bool) {
	anchor := blockOf[places[0].Anchor]
	if anchor == nil || len(anchor.cells) != 1 || len(anchor.chain) > 0 && !anchor.tank {
		return
	}
	// a block of several parts (a tank's L and C) takes the slot of the
	// first of its parts the template lists
	placeOf := map[string]Place{}
	for _, p := range places {
		placeOf[p.Ref] = p
	}
	var slots []*slotted
	seen := map[*block]bool{anchor: true}
	for _, p := range places {
		b := blockOf[p.Ref]
		if b == nil || seen[b] || moved[b] || !ly.movable(b, stage, placeOf) {
			continue
		}
		seen[b] = true
		if (p.Col == 0 && p.Row == 0) || max(p.Col, -p.Col, p.Row, -p.Row) > slotReach {
			continue
		}
		slots = append(slots, &slotted{b: b, col: p.Col, row: p.Row, keep: true})
	}
	if len(slots) == 0 {
		return
	}
	ly.slotMoves(anchor, slots)
	var after map[*block]bool
	gap := -1.0
	if ly.o.CloseGaps {
		after, gap = ly.rightOf(stage, all)
	}
	ly.makeRoom(stage, slots, all)
	ly.refuseCollisions(stage, slots, all)
	unhang(slots)
	ly.closeIn(anchor, slots, all)
	for _, s := range slots {
		if s.keep {
			s.b.move(s.d)
			moved[s.b] = true
			for _, cl := range append(append([]*cell{}, s.b.cells...), s.b.chain...) {
				ly.tplMoved[cl.ref] = true
			}
		}
	}
	span := anchor.fp
	for _, s := range slots {
		if s.keep {
			span = span.Union(s.b.fp)
		}
	}
	ly.clearRails(span, all)
	ly.giveBack(stage, after, gap, all)
}

// clearRails moves each block that yields to a template (yields) and that
// stands within the template's span (its anchor and moved blocks) or
// touches another block straight down to the nearest place clear of both
// (up when there is none), where the router can wire the template's parts
// past it:
// a faded reservoir capacitor yields its place to the stage drawn round
// it.
func (ly *state) clearRails(span geom.Rect, all []*block) {
	hits := func(b *block, d geom.Pt) bool {
		r := b.fp.Move(d).Inset(1)
		if r.Overlaps(span.Inset(-2)) {
			return true
		}
		for _, o := range all {
			if o != b && o.fp.Overlaps(r) {
				return true
			}
		}
		return false
	}
	for _, b := range all {
		if !ly.yields(b) || !hits(b, geom.Pt{}) {
			continue
		}
		for _, dy := range clearMoves() {
			if !hits(b, geom.Pt{Y: dy}) {
				b.move(geom.Pt{Y: dy})
				break
			}
		}
	}
}

// movable says whether a template may move a block: every part in it is
// one the template places (a block that holds another part too, a second
// tank's coil stacked beside this one, stays where the generic placement
// put it), of this stage, and none is a flag or connector at the edge.
func (ly *state) movable(b *block, stage int, placed map[string]Place) bool {
	for _, cl := range append(append([]*cell{}, b.cells...), b.chain...) {
		if _, ok := placed[cl.ref]; !ok && !ly.tankFollows(cl, b) {
			return false
		}
		// a part of no stage (a bypass no pattern claimed) moves with
		// the stage whose template places it
		if s, ok := ly.stageOf[cl.ref]; ok && s != stage || cl.edge != 0 || cl.conn {
			return false
		}
	}
	return true
}

// slotMoves sets each block's move to its slot: columns and rows as wide
// and tall as their widest and tallest block, packed outwards from the
// anchor's with the gaps; a block narrower than its column keeps to the
// anchor's side of it, one in the anchor's column is centred on the anchor, one in the anchor's row keeps the height the generic placement
// gave it (level with the wire it hangs from), and the rows above and
// below clear that row.
func (ly *state) slotMoves(anchor *block, slots []*slotted) {
	w, h := map[int]float64{0: anchor.fp.W()}, map[int]float64{}
	row0 := anchor.fp
	for _, s := range slots {
		w[s.col] = math.Max(w[s.col], s.b.fp.W())
		if s.row == 0 {
			s.d.Y, s.hang = ly.levelWith(anchor.cells[0], s.b)
			row0 = row0.Union(s.b.fp.Move(s.d))
		} else {
			h[s.row] = math.Max(h[s.row], s.b.fp.H())
		}
	}
	mid := (anchor.fp.X0 + anchor.fp.X1) / 2
	lo, hi, under := ly.pairColumn(anchor, slots, mid-w[0]/2, mid+w[0]/2)
	cx := centres(w, lo, hi, slotGapX)
	cy := centres(h, row0.Y0, row0.Y1, ly.gapY())
	for _, s := range slots {
		// a block narrower than its column keeps to the anchor's side
		slack := (w[s.col] - s.b.fp.W()) / 2
		switch {
		case s == under:
			// in line with the anchor already (pairColumn)
		case s.col < 0:
			s.d.X = math.Round(cx[s.col] + slack - (s.b.fp.X0+s.b.fp.X1)/2)
		case s.col > 0:
			s.d.X = math.Round(cx[s.col] - slack - (s.b.fp.X0+s.b.fp.X1)/2)
		default:
			s.d.X = math.Round(cx[s.col] - (s.b.fp.X0+s.b.fp.X1)/2)
		}
		if s.row != 0 {
			s.d.Y = math.Round(cy[s.row] - (s.b.fp.Y0+s.b.fp.Y1)/2)
			if y, ok := commonTop(anchor.cells[0], s.b); ok && ly.flippedBelow(slots) {
				// a mirrored pair's common network hangs from the
				// centre line, where the two common leads meet
				s.d.Y = math.Round(cy[s.row] - y)
			}
		}
	}
	ly.hangCommon(anchor, slots)
	ly.levelLying(slots)
	ly.alignChains(anchor, slots)
}

// hangCommon stands a mirrored pair's common network (the blocks whose top
// pin is on the anchor's common net, off column 0) with that pin level
// with the middle of the two devices' common pins, where their leads meet
// on the centre line. Centred in its row instead, it stood where the
// row's tallest block put it (the output transformer's label above or
// beside it), and its wire jogged to meet the centre line (review13 a04).
func (ly *state) hangCommon(anchor *block, slots []*slotted) {
	if !ly.flippedBelow(slots) {
		return
	}
	pa := commonPin(anchor.cells[0])
	if pa == nil {
		return
	}
	var yb float64
	found := false
	stands := ly.stands()
	for _, s := range slots {
		if s.col == 0 && len(s.b.cells) == 1 && stands[s.b.cells[0].ref] == StandFlipped {
			if p := commonPin(s.b.cells[0]); p != nil && p.Net == pa.Net {
				yb, found = p.At.Y+s.d.Y, true
			}
		}
	}
	if !found {
		return
	}
	mid := math.Round((pa.At.Y + yb) / 2)
	for _, s := range slots {
		if s.row == 0 || s.col == 0 {
			continue // under the upper device it hangs from its common lead
		}
		if y, ok := netTop(s.b, pa.Net); ok {
			s.d.Y = mid - y
		}
	}
}

// netTop is the y of the highest pin, pointing up, of a block's parts on
// net (a cathode resistor and its bypass drawn as one block); false for
// none.
func netTop(b *block, net string) (float64, bool) {
	top, ok := 0.0, false
	for _, cl := range b.cells {
		for _, p := range cl.shape.Pins {
			if p.Net == net && p.Dir == geom.Up && (!ok || p.At.Y < top) {
				top, ok = p.At.Y, true
			}
		}
	}
	return top, ok
}

// commonPin is a device cell's common electrode's pin (a pentode's
// suppressor may share its net: the cathode's own pin is meant), nil for
// none.
func commonPin(a *cell) *geom.Pin {
	name := a.part.PinWithRole(graph.RoleCommon)
	for i, p := range a.shape.Pins {
		if name != "" && p.Name == name {
			return &a.shape.Pins[i]
		}
	}
	return nil
}

// pairColumn is the span of the anchor's column, from lo to hi as its
// blocks' widths give it, widened to hold the lower half of a mirrored
// pair (StandFlipped) moved in line with the anchor, common pin under
// common pin; that slot, moved, is returned too (nil for none). The two
// halves' labels may stand on opposite sides of their valves, so centring
// the two blocks in one column stood the lower valve a column left
// (review13 and review14 a04's full and faded sheets); a column wide
// enough for both keeps the neighbouring columns clear of the lower
// half's label.
func (ly *state) pairColumn(anchor *block, slots []*slotted, lo, hi float64) (float64, float64, *slotted) {
	stands := ly.stands()
	for _, s := range slots {
		if s.col != 0 || len(s.b.cells) != 1 || len(s.b.chain) > 0 || stands[s.b.cells[0].ref] != StandFlipped {
			continue
		}
		dx, ok := ly.lineUp(s.b.cells[0], []colPart{{anchor.cells[0], geom.Pt{}}})
		if !ok {
			continue
		}
		s.d.X = dx
		r := s.b.fp.Move(geom.Pt{X: dx})
		return math.Min(lo, r.X0), math.Max(hi, r.X1), s
	}
	return lo, hi, nil
}

// alignChains stands the parts of a template column in line: a block of
// one part in a column moves sideways, within its column's slack, until
// its pin on a net it shares with the part nearer the anchor's row in the
// same column (the anchor itself in column 0) is straight below or above
// that part's pin there. An emitter resistor then hangs straight from its
// emitter, the PNP of a complementary pair stands under the NPN, and a bias
// chain of diodes and a preset is one straight wire; centred, each part's
// leads jogged by the width of its label or wiper.
func (ly *state) alignChains(anchor *block, slots []*slotted) {
	order := slices.Clone(slots)
	slices.SortStableFunc(order, func(a, b *slotted) int { return max(a.row, -a.row) - max(b.row, -b.row) })
	byCol := map[int][]colPart{0: {{anchor.cells[0], geom.Pt{}}}}
	stands := ly.stands()
	for _, s := range order {
		if len(s.b.cells) != 1 || len(s.b.chain) > 0 || s.row == 0 {
			continue
		}
		cl := s.b.cells[0]
		// the lower half of a mirrored pair lines up with the upper
		// however far apart their labels put the centres of their
		// blocks (one label left, one right of its valve: review13
		// and review14 a04's lower valve a column left)
		reach := float64(2 * slotGapX)
		if stands[cl.ref] == StandFlipped {
			reach = math.Inf(1)
		}
		if dx, ok := ly.lineUp(cl, byCol[s.col]); ok && math.Abs(dx-s.d.X) <= reach {
			s.d.X = dx
		}
		byCol[s.col] = append(byCol[s.col], colPart{cl, s.d})
	}
	for _, s := range slots {
		if s.col != 0 && s.row != 0 && len(s.b.cells) == 1 && len(s.b.chain) == 0 {
			if dy, ok := ly.between(s.b.cells[0], byCol[0]); ok {
				s.d.Y = dy
			}
		}
	}
}

// between is the move down that centres a part joining two devices of the
// anchor's column (an output transformer's primary ends on the anodes of
// a push-pull pair) between them: the mean of its two pins there level
// with the middle of their symbols, so a winding's centre tap stands at
// the pair's middle whatever its label and locals add to its box.
func (ly *state) between(cl *cell, col0 []colPart) (float64, bool) {
	var mine, theirs []float64
	for _, p := range cl.shape.Pins {
		if p.Net == "" || p.Net == notConnected || ly.c.RoleOf(p.Net).IsACGround() {
			continue
		}
		for _, o := range col0 {
			if q := pinOn(o.cl, p.Net); q != nil && o.cl != cl && o.cl.part.IsActive() {
				mine = append(mine, p.At.Y)
				theirs = append(theirs, (o.cl.shape.Box.Y0+o.cl.shape.Box.Y1)/2+o.d.Y)
				break
			}
		}
	}
	if len(mine) != 2 || theirs[0] == theirs[1] {
		return 0, false
	}
	return math.Round((theirs[0]+theirs[1])/2 - (mine[0]+mine[1])/2), true
}

// colPart is a part of a template column and the move it is given.
type colPart struct {
	cl *cell
	d  geom.Pt
}

// lineUp is the sideways move that puts cl's pin on a wired net straight
// in line with the same net's pin of one of the parts already in its
// column (each at its own move), the latest first.
func (ly *state) lineUp(cl *cell, col []colPart) (float64, bool) {
	for i := len(col) - 1; i >= 0; i-- {
		o := col[i]
		for _, p := range cl.shape.Pins {
			if p.Dir != geom.Up && p.Dir != geom.Down || p.Net == "" || p.Net == notConnected || ly.c.RoleOf(p.Net).IsACGround() {
				continue
			}
			for _, q := range o.cl.shape.Pins {
				if q.Net == p.Net && (q.Dir == geom.Up || q.Dir == geom.Down) && q.Dir != p.Dir {
					return math.Round(q.At.X + o.d.X - p.At.X), true
				}
			}
		}
	}
	return 0, false
}

// levelWith is how far a block in the anchor's row moves down to put its
// first pin on one of the anchor's wires level with the anchor's pin
// there, and the step of that move that stands a part hanging from a
// sideways wire under it (a grid leak's top a step under the grid wire:
// the wire runs straight and turns into its pin; level with it, the wire
// left the pin the way it points and jogged a step to meet the anchor's
// pin); 0, where the generic placement put it, when it has none.
func (ly *state) levelWith(a *cell, b *block) (dy, hang float64) {
	for _, cl := range b.cells {
		for _, p := range cl.shape.Pins {
			if !ly.anchorNet(a, p.Net) {
				continue
			}
			for _, q := range a.shape.Pins {
				if q.Net != p.Net {
					continue
				}
				switch {
				case q.Dir == geom.Up || q.Dir == geom.Down:
				case p.Dir == geom.Up:
					hang = 1
				case p.Dir == geom.Down:
					hang = -1
				}
				return q.At.Y + hang - p.At.Y, hang
			}
		}
	}
	return 0, 0
}

// unhang takes the step under the wire back from the kept parts of the
// anchor's row once a part of that row is refused its slot: the refused
// part stays where the generic placement put it, its pins level with the
// anchor's, and a kept part a step lower stood its far lead in line with
// that part's wire (a Hartley VFO's grid capacitor beside its leak).
func unhang(slots []*slotted) {
	refused := false
	for _, s := range slots {
		refused = refused || s.row == 0 && !s.keep
	}
	if !refused {
		return
	}
	for _, s := range slots {
		if s.row == 0 && s.keep {
			s.d.Y -= s.hang
			s.hang = 0
		}
	}
}

// centres lays slots of the given sizes out either side of slot 0, which
// spans lo to hi, each next one gap beyond the last, and gives each slot's
// centre; an empty slot between takes the gap alone.
func centres(size map[int]float64, lo, hi, gap float64) map[int]float64 {
	out := map[int]float64{0: (lo + hi) / 2}
	up, down := hi, lo
	for i := 1; i <= slotReach; i++ {
		out[i] = up + gap + size[i]/2
		up += gap + size[i]
		out[-i] = down - gap - size[-i]/2
		down -= gap + size[-i]
	}
	return out
}

// pinOn is cl's first pin on net, nil for none.
func pinOn(cl *cell, net string) *geom.Pin {
	for i, p := range cl.shape.Pins {
		if p.Net == net {
			return &cl.shape.Pins[i]
		}
	}
	return nil
}
