package layout

import (
	"math"
	"sort"
	"strings"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// Spacing, in grid steps.
const (
	rowGap    = 3 // between blocks stacked in a column
	colGap    = 3 // least gap between columns, before routing tracks
	stageGap  = 3 // extra gap between stage frames
	framePad  = 1 // frame margin round its parts
	blockGap  = 1 // between the parts of one block (a tuned circuit's L and C)
	maxTracks = 8 // routing tracks reserved between columns, at most
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
	col   int
	fp    geom.Rect // footprint in block coordinates
	pos   float64   // barycentre key while ordering
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
	nCols := 0
	for _, cl := range ly.cells {
		nCols = max(nCols, cl.col+1)
	}
	cols := make([][]*block, nCols)
	group := map[string]*block{}
	for _, cl := range ly.cells {
		if inChain[cl] {
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
	if len(b.chain) == 2 {
		ly.stackChain(b)
	}
}

// stackChain stands the block's series pair beside its coil: the upper
// part's top pin level with the coil's hot end, the lower part two steps
// under it, labels to the right.
func (ly *state) stackChain(b *block) {
	l := b.cells[0]
	hot, _ := ends(l)
	a, c := b.chain[0], b.chain[1]
	for _, cl := range b.chain {
		placeLabel(ly.c, cl, []geom.Dir{geom.Right, geom.Left, geom.Up, geom.Down})
	}
	gap := float64(blockGap + 1)
	if _, r := sidePins(l); r {
		gap += 3
	}
	at, _ := ends(a)
	a.move(geom.Pt{X: math.Ceil(b.fp.X1 + gap - a.footprint().X0), Y: hot.At.Y - at.At.Y})
	at, ab := ends(a)
	ct, _ := ends(c)
	dx := at.At.X - ct.At.X
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

// place orders the blocks in each column, then gives columns their x and
// blocks their y, and draws the stage frames round their parts.
func (ly *state) place() {
	cols := ly.blocks()
	ly.order(cols)
	// routing tracks between columns: one per net that spans the gap
	lo, hi := map[string]int{}, map[string]int{}
	for _, cl := range ly.cells {
		for _, n := range ly.signalNets(cl) {
			if v, ok := lo[n]; !ok || cl.col < v {
				lo[n] = cl.col
			}
			if v, ok := hi[n]; !ok || cl.col > v {
				hi[n] = cl.col
			}
		}
	}
	spans := make([]int, len(cols)+1)
	for n, l := range lo {
		spans[l]++
		spans[hi[n]]--
	}
	colStage := make([]int, len(cols))
	for i, col := range cols {
		colStage[i] = -1
		for _, b := range col {
			if s, ok := ly.stageOf[b.cells[0].ref]; ok && b.cells[0].edge == 0 && len(ly.o.Frames) > 0 {
				colStage[i] = s
			}
		}
	}
	x := 0.0
	running := 0
	stageStart := map[int]float64{}
	for i, col := range cols {
		w := 0.0
		for _, b := range col {
			w = math.Max(w, b.fp.W())
		}
		if s := colStage[i]; s >= 0 {
			if _, ok := stageStart[s]; !ok {
				stageStart[s] = x
			}
		}
		for _, b := range col {
			dx := math.Round(x + (w-b.fp.W())/2 - b.fp.X0)
			b.move(geom.Pt{X: dx})
		}
		running += spans[i]
		gap := float64(colGap + min(running, maxTracks))
		if i+1 < len(cols) && colStage[i] != colStage[i+1] {
			gap += stageGap
			if s := colStage[i]; s >= 0 && s < len(ly.o.Frames) {
				// leave room for a frame title wider than its parts
				have := x + w - stageStart[s]
				if tw := titleWidth(ly.o.Frames[s], have); tw > have {
					gap += math.Ceil(tw - have)
				}
			}
		}
		x += w + gap
	}
	// y: line each block's first wired pin up with a pin already placed on
	// the same net, else stack; blocks in a column keep their order
	pinY := map[string]float64{}
	for _, col := range cols {
		bottom := math.Inf(-1)
		for _, b := range col {
			want, found := 0.0, false
			// parts in the signal path (active parts, series parts,
			// transformers) put their first wired left pin on the sheet's
			// signal line, y = 0, so a long chain does not climb stage by
			// stage; shunt parts hang from the net they sit on
			if cl := b.cells[0]; !ly.free && len(b.cells) == 1 && !isVertical(cl) {
				for _, p := range cl.shape.Pins {
					if p.Dir == geom.Left && !ly.c.RoleOf(p.Net).IsACGround() {
						want, found = -p.At.Y, true
						break
					}
				}
			}
			for _, d := range []geom.Dir{geom.Left, geom.Up, geom.Down, geom.Right} {
				for _, cl := range b.cells {
					for _, p := range cl.shape.Pins {
						if p.Dir != d || found {
							continue
						}
						if y, ok := pinY[p.Net]; ok && !ly.c.RoleOf(p.Net).IsACGround() {
							want, found = y-p.At.Y, true
						}
					}
				}
			}
			dy := math.Round(want)
			if b.fp.Y0+dy < bottom+rowGap {
				dy = math.Ceil(bottom + rowGap - b.fp.Y0)
			}
			b.move(geom.Pt{Y: dy})
			bottom = b.fp.Y1
			for _, cl := range b.cells {
				for _, p := range cl.shape.Pins {
					if _, ok := pinY[p.Net]; !ok {
						pinY[p.Net] = p.At.Y
					}
				}
			}
		}
	}
	ly.makeFrames()
}

// minTitleChars is the narrowest a frame title is wrapped to.
const minTitleChars = 24

// titleLines wraps a frame's title and figures to the width of its parts
// (but no narrower than minTitleChars); head is the number of title lines.
func titleLines(f Frame, width float64) (lines []string, head int) {
	chars := int(math.Max(minTitleChars, math.Floor(width/symbol.CharW)))
	lines = WrapWords(f.Title, chars)
	head = len(lines)
	if f.Subtitle != "" {
		lines = append(lines, WrapWords(f.Subtitle, int(float64(chars)/symbol.SmallScale))...)
	}
	return lines, head
}

// halfGrid rounds a box out to half-grid lines, so that a frame's edge
// never lies along a wire (wires run on whole grid lines).
func halfGrid(r geom.Rect) geom.Rect {
	return geom.Rect{X0: math.Floor(r.X0) - 0.5, Y0: math.Floor(r.Y0) - 0.5, X1: math.Ceil(r.X1) + 0.5, Y1: math.Ceil(r.Y1) + 0.5}
}

func titleWidth(f Frame, width float64) float64 {
	lines, head := titleLines(f, width)
	w := 0.0
	for i, l := range lines {
		lw := symbol.TextWidth(l)
		if i >= head {
			lw *= symbol.SmallScale
		}
		w = math.Max(w, lw)
	}
	return w + 2*framePad
}

// WrapWords breaks text into lines of at most n characters at spaces (frame
// titles here, the caution line in render).
func WrapWords(s string, n int) []string {
	var out []string
	line := ""
	for _, w := range strings.Fields(s) {
		if line != "" && len([]rune(line))+1+len([]rune(w)) > n {
			out = append(out, line)
			line = w
			continue
		}
		if line != "" {
			line += " "
		}
		line += w
	}
	if line != "" {
		out = append(out, line)
	}
	return out
}

// order sorts the blocks of each column by the barycentre of their
// neighbours in the columns before (sweeping right) and after (sweeping
// left), the crossing reduction of layered drawing.
func (ly *state) order(cols [][]*block) {
	blockOf := map[string]*block{}
	for _, col := range cols {
		kind := func(b *block) int {
			cl := b.cells[0]
			switch {
			case cl.part.IsActive():
				return 0
			case !isVertical(cl):
				return 1
			}
			return 2
		}
		sort.SliceStable(col, func(i, j int) bool { return kind(col[i]) < kind(col[j]) })
		for i, b := range col {
			b.pos = float64(i)
			for _, cl := range b.cells {
				blockOf[cl.ref] = b
			}
		}
	}
	byNet := map[string][]*block{}
	var nets []string
	for _, col := range cols {
		for _, b := range col {
			for _, cl := range b.cells {
				for _, n := range ly.signalNets(cl) {
					if _, ok := byNet[n]; !ok {
						nets = append(nets, n)
					}
					byNet[n] = append(byNet[n], b)
				}
			}
		}
	}
	sort.Strings(nets)
	sweep := func(i, from int) {
		col := cols[i]
		if len(col) < 2 {
			return
		}
		key := make(map[*block]float64, len(col))
		for _, b := range col {
			sum, n := 0.0, 0.0
			for _, cl := range b.cells {
				for _, net := range ly.signalNets(cl) {
					for _, nb := range byNet[net] {
						if nb.col == from {
							sum += nb.pos
							n++
						}
					}
				}
			}
			if n > 0 {
				key[b] = sum / n
			} else {
				key[b] = b.pos
			}
		}
		sort.SliceStable(col, func(a, c int) bool { return key[col[a]] < key[col[c]] })
		for k, b := range col {
			b.pos = float64(k)
		}
	}
	for it := 0; it < 2; it++ {
		for i := 1; i < len(cols); i++ {
			sweep(i, i-1)
		}
		for i := len(cols) - 2; i >= 0; i-- {
			sweep(i, i+1)
		}
	}
	// the signal path stays on top of its column (active parts, then series
	// parts, then the shunts hanging below), in barycentre order within
	// each kind; parts the orientation search sent down go last
	for _, col := range cols {
		rank := func(b *block) int {
			k := 0
			switch cl := b.cells[0]; {
			case cl.part.IsActive():
			case !isVertical(cl):
				k = 1
			default:
				k = 2
			}
			if _, sunk := ly.turns[sinkKey+b.cells[0].ref]; sunk {
				k += 3
			}
			return k
		}
		sort.SliceStable(col, func(a, b int) bool { return rank(col[a]) < rank(col[b]) })
	}
}

// makeFrames draws a frame round each stage's parts with its title inside
// the top edge.
func (ly *state) makeFrames() {
	for i, f := range ly.o.Frames {
		b := geom.Rect{}
		for _, cl := range ly.cells {
			if s, ok := ly.stageOf[cl.ref]; ok && s == i && cl.edge == 0 {
				b = b.Union(cl.footprint())
			}
		}
		if b == (geom.Rect{}) {
			continue
		}
		lines, head := titleLines(f, b.W())
		h := symbol.LineH * float64(len(lines))
		w := titleWidth(f, b.W()) - 2*framePad
		title := geom.Label{Owner: "frame:" + f.Title, Lines: lines, Small: true, Head: head,
			Box: geom.Rect{X0: b.X0, Y0: b.Y0 - 2.2 - h, X1: b.X0 + w, Y1: b.Y0 - 2.2}}
		box := halfGrid(b.Union(title.Box).Inset(framePad + 0.5))
		ly.frames = append(ly.frames, geom.Frame{Box: box, Title: title})
		ly.frameStage = append(ly.frameStage, i)
	}
}

// links joins ganged sections by a dashed line where one can be drawn clear
// of every symbol, label and local symbol; the gang is named in the labels
// in any case.
func (ly *state) links(g *geom.Sheet) []geom.Link {
	byGang := map[string][]*cell{}
	var names []string
	for _, cl := range ly.cells {
		if p := realPart(cl); p != nil && p.Gang != "" {
			if _, ok := byGang[p.Gang]; !ok {
				names = append(names, p.Gang)
			}
			byGang[p.Gang] = append(byGang[p.Gang], cl)
		}
	}
	sort.Strings(names)
	// a link between far-apart sections runs above everything drawn
	top := math.Inf(1)
	for _, s := range g.Symbols {
		top = math.Min(top, s.Box.Y0)
	}
	for _, l := range g.Labels {
		top = math.Min(top, l.Box.Y0)
	}
	for _, f := range g.Frames {
		top = math.Min(top, f.Box.Y0)
	}
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			top = math.Min(top, s.Box().Y0)
		}
	}
	over := math.Floor(top) - 1.5
	var out []geom.Link
	for _, name := range names {
		cs := byGang[name]
		for i := 0; i+1 < len(cs); i++ {
			a, b := cs[i], cs[i+1]
			pa := center(a.shape.Box)
			pb := center(b.shape.Box)
			for _, path := range [][]geom.Pt{
				{pa, {X: pb.X, Y: pa.Y}, pb},
				{pa, {X: pa.X, Y: pb.Y}, pb},
				{pa, {X: pa.X, Y: over}, {X: pb.X, Y: over}, pb},
			} {
				if ly.linkClear(g, path, a.ref, b.ref) {
					out = append(out, geom.Link{Name: name, Path: path})
					break
				}
			}
		}
	}
	return out
}

func center(r geom.Rect) geom.Pt { return geom.Pt{X: (r.X0 + r.X1) / 2, Y: (r.Y0 + r.Y1) / 2} }

func (ly *state) linkClear(g *geom.Sheet, path []geom.Pt, a, b string) bool {
	for k := 0; k+1 < len(path); k++ {
		s := geom.Seg{A: path[k], B: path[k+1]}
		for _, sym := range g.Symbols {
			if sym.Ref != a && sym.Ref != b && s.Touches(sym.Box) {
				return false
			}
		}
		for _, l := range g.Labels {
			if s.Touches(l.Box) {
				return false
			}
		}
		for _, l := range g.Locals {
			if s.Touches(l.Box) {
				return false
			}
		}
	}
	return true
}
