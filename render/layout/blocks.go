package layout

import (
	"math"
	"sort"

	"pare/graph"
	"pare/render/geom"
)

// block is one or more cells placed as a unit: a single part, or parts in
// parallel across the same two nets standing side by side (a tuned
// circuit's L and C, a cathode resistor and its bypass).
type block struct {
	cells []*cell
	// chain is a series pair standing beside the block's coil, one above
	// the other (a padder over its tuning capacitor): a tuned circuit
	// whose C is two parts still stands beside its L
	chain []*cell
	// tank says the chain holds the capacitors across the block's winding
	// (tankplace.go), each standing beside the winding it tunes
	tank bool
	col  int
	fp   geom.Rect // footprint in block coordinates
	pos  float64   // barycentre key while ordering
}

// outer returns the two end pins of a part that can stand in parallel with
// others: a two-terminal part's pins, a tapped coil's ends.
func outer(cl *cell) (a, b *geom.Pin, ok bool) {
	switch {
	case len(cl.shape.Pins) == 2:
		return &cl.shape.Pins[0], &cl.shape.Pins[1], true
	case cl.part.Kind == graph.Inductor && len(cl.shape.Pins) == 3:
		a, b = cl.shape.Pin("1"), cl.shape.Pin("2")
		return a, b, a != nil && b != nil
	}
	return nil, nil, false
}

func isVertical(cl *cell) bool {
	a, b, ok := outer(cl)
	return ok && a.At.X == b.At.X
}

func pairKey(cl *cell) string {
	a, b, _ := outer(cl)
	if a.At.Y > b.At.Y {
		a, b = b, a
	}
	return a.Net + "\x00" + b.Net
}

// sidePins says whether a cell has pins leaving left or right.
func sidePins(cl *cell) (left, right bool) {
	for _, p := range cl.shape.Pins {
		left = left || p.Dir == geom.Left
		right = right || p.Dir == geom.Right
	}
	return
}

// ends returns the upper and lower pin of a vertical cell.
func ends(cl *cell) (top, bottom *geom.Pin) {
	a, b, _ := outer(cl)
	if a.At.Y > b.At.Y {
		a, b = b, a
	}
	return a, b
}

// padChains finds, for each tuned coil standing vertically from a signal net
// to AC ground, a series pair across it: a vertical part from the coil's hot
// net down to a net only the two share, then a vertical part from there to
// AC ground. The pair is drawn beside the coil, so the tank's L and C stand
// side by side joined at the top.
func (ly *state) padChains() map[*cell][]*cell {
	vertical := func(cl *cell) bool {
		return cl.edge == 0 && cl.part.Kind != graph.Port && !cl.part.IsActive() && isVertical(cl)
	}
	byTop := map[string][]*cell{}
	for _, cl := range ly.cells {
		if vertical(cl) && len(cl.shape.Pins) == 2 {
			top, _ := ends(cl)
			byTop[top.Net] = append(byTop[top.Net], cl)
		}
	}
	used := map[*cell]bool{}
	out := map[*cell][]*cell{}
	for _, l := range ly.cells {
		if !vertical(l) || l.part.Kind != graph.Inductor {
			continue
		}
		hot, cold := ends(l)
		if ly.c.RoleOf(hot.Net).IsACGround() || !ly.c.RoleOf(cold.Net).IsACGround() {
			continue
		}
		for _, a := range byTop[hot.Net] {
			_, mid := ends(a)
			if used[a] || a == l || ly.netCount[mid.Net] != 2 || ly.c.RoleOf(mid.Net).IsACGround() {
				continue
			}
			var b *cell
			for _, cand := range byTop[mid.Net] {
				if _, low := ends(cand); !used[cand] && cand != a && ly.c.RoleOf(low.Net).IsACGround() {
					b = cand
				}
			}
			if b != nil {
				used[a], used[b] = true, true
				out[l] = []*cell{a, b}
				break
			}
		}
	}
	return out
}

func (ly *state) blocks() [][]*block {
	chains := ly.padChains()
	inChain := map[*cell]bool{}
	for l, ch := range chains {
		for _, cl := range ch {
			cl.col = l.col
			inChain[cl] = true
		}
	}
	tanks, held := ly.tankBlocks(chains)
	nCols := 0
	for _, cl := range ly.cells {
		nCols = max(nCols, cl.col+1)
	}
	cols := make([][]*block, nCols)
	group := map[string]*block{}
	for _, cl := range ly.cells {
		if b, ok := tanks[cl]; ok {
			cols[cl.col] = append(cols[cl.col], b)
			continue
		}
		if inChain[cl] || held[cl] {
			continue
		}
		if ch, ok := chains[cl]; ok {
			b := &block{cells: []*cell{cl}, chain: ch, col: cl.col}
			cols[cl.col] = append(cols[cl.col], b)
			continue
		}
		if cl.edge == 0 && isVertical(cl) && cl.part.Kind != graph.Port {
			k := string(rune(cl.col)) + pairKey(cl)
			if b, ok := group[k]; ok && len(b.cells) < 4 {
				b.cells = append(b.cells, cl)
				continue
			}
			b := &block{cells: []*cell{cl}, col: cl.col}
			group[k] = b
			cols[cl.col] = append(cols[cl.col], b)
			continue
		}
		cols[cl.col] = append(cols[cl.col], &block{cells: []*cell{cl}, col: cl.col})
	}
	for _, col := range cols {
		for _, b := range col {
			ly.arrange(b)
		}
	}
	return cols
}

// arrange sets the cells of a block side by side, labels outwards: the first
// part's label on its left, the last one's on its right.
func (ly *state) arrange(b *block) {
	if len(b.cells) > 1 {
		// inductors first, then capacitors, then the rest: the tank reads L, C
		// a part with a pin to the left goes first and one with a pin to
		// the right last, so side pins face out of the block
		rank := func(cl *cell) int {
			l, r := sidePins(cl)
			side := 1
			if l {
				side = 0
			} else if r {
				side = 2
			}
			kind := 2
			switch cl.part.Kind {
			case graph.Inductor:
				kind = 0
			case graph.Capacitor:
				kind = 1
			}
			return side*3 + kind
		}
		sort.SliceStable(b.cells, func(i, j int) bool { return rank(b.cells[i]) < rank(b.cells[j]) })
		for i, cl := range b.cells {
			switch {
			case i == 0:
				placeLabel(ly.c, cl, []geom.Dir{geom.Left, geom.Up, geom.Down, geom.Right})
			case i == len(b.cells)-1:
				placeLabel(ly.c, cl, []geom.Dir{geom.Right, geom.Up, geom.Down, geom.Left})
			default:
				placeLabel(ly.c, cl, []geom.Dir{geom.Down, geom.Up, geom.Right, geom.Left})
			}
		}
	}
	x := 0.0
	b.fp = geom.Rect{}
	for i, cl := range b.cells {
		fp := cl.footprint()
		if i > 0 {
			gap := float64(blockGap)
			_, r := sidePins(b.cells[i-1])
			l, _ := sidePins(cl)
			if r || l {
				gap += 3 // room for the side pin's wire
			}
			dx := math.Ceil(x + gap - fp.X0)
			cl.move(geom.Pt{X: dx})
			fp = cl.footprint()
		}
		x = fp.X1
		b.fp = b.fp.Union(fp)
	}
	switch {
	case b.tank:
		ly.standTank(b)
	case len(b.chain) == 2:
		ly.stackChain(b)
	}
}

// stackChain stands the block's series pair beside its coil: the upper
// part's top pin level with the coil's hot end, the lower part two steps
// under it, on the coil's right unless its tap leaves on that side, labels
// away from the coil.
func (ly *state) stackChain(b *block) {
	l := b.cells[0]
	hot, _ := ends(l)
	a, c := b.chain[0], b.chain[1]
	left, right := sidePins(l)
	// the coil's tap leaving on the right, the pair stands on its left, so
	// the tap's wire does not cut between the hot ends; labels outwards
	onLeft := right && !left
	prefs := []geom.Dir{geom.Right, geom.Left, geom.Up, geom.Down}
	if onLeft {
		prefs = []geom.Dir{geom.Left, geom.Right, geom.Up, geom.Down}
	}
	for _, cl := range b.chain {
		placeLabel(ly.c, cl, prefs)
	}
	gap := float64(blockGap + 1)
	at, _ := ends(a)
	dx := math.Ceil(b.fp.X1 + gap - a.footprint().X0)
	if onLeft {
		dx = math.Floor(b.fp.X0 - gap - a.footprint().X1)
	} else if right {
		dx += 3
	}
	a.move(geom.Pt{X: dx, Y: hot.At.Y - at.At.Y})
	at, ab := ends(a)
	ct, _ := ends(c)
	dx = at.At.X - ct.At.X
	dy := ab.At.Y + 2 - ct.At.Y
	if fa, fc := a.footprint(), c.footprint().Move(geom.Pt{X: dx, Y: dy}); fc.Y0 < fa.Y1+1 {
		dy += math.Ceil(fa.Y1 + 1 - fc.Y0)
	}
	c.move(geom.Pt{X: dx, Y: dy})
	b.fp = b.fp.Union(a.footprint()).Union(c.footprint())
}

func (b *block) move(d geom.Pt) {
	for _, cl := range b.cells {
		cl.move(d)
	}
	for _, cl := range b.chain {
		cl.move(d)
	}
	b.fp = b.fp.Move(d)
}
