package layout

import (
	"math"
	"slices"

	"pare/render/check"
	"pare/render/geom"
	"pare/render/symbol"
)

// Labels apart after routing: two parts' labels set on one text line with
// hardly any room between them read as one label (review21 b03 "C15
// 180pT1": an IF can's name against its tuning capacitor's plates, the
// capacitor's label on their far side; a02 "C8 100p T3 k=0.01"). Each label
// is placed on its own before the cells are packed (labels.go), so two
// neighbours' labels can end up so. Moving them before routing re-routes the
// page round them (label boxes are obstacles to the router) and took the
// wire counts up; so the move is made on the finished sheet, and only into
// room nothing drawn uses: clear of every symbol, local, label, pin figure,
// wire, frame edge and link, inside the frames the part is in and no other,
// nearer its own part than any other, and inside the sheet's bounds, which
// stay what they were, so the rows and pages stacked from the sheet stand
// where they stood. The wires are the router's bytes. The test of running
// together is the checker's (render/check LabelsRun), so the pass and the
// count agree; a pair with no such room stays, and the checker counts it.

const (
	// nudgeReach is how far from its part's symbol, in grid units, a label
	// moved apart may go: further and it is no longer read as the part's.
	nudgeReach = 3.0
	// nudgeGap is the least room between a moved label and its symbol:
	// the room labels.go leaves (its first gap).
	nudgeGap = 0.4
	// nudgeStep is the spacing of the candidate places.
	nudgeStep = 0.25
	// nudgeClear is the room kept round a moved label from anything drawn:
	// the gap labels.go leaves from the symbol, so a moved label is not
	// squeezed between two wires.
	nudgeClear = 0.4
	// nudgeOwn is how much nearer its own symbol than any other a moved
	// label must stand, so no reader gives it to the neighbour.
	nudgeOwn = 0.25
	// nudgeRoom is the least room a moved label keeps on a text line it
	// shares with another part's label: twice what the checker asks
	// (render/check runGap, 1.5 character widths), so a label moved apart
	// reads apart, not half a line off its neighbour's line.
	nudgeRoom = 3 * symbol.CharW
)

// apartLabels moves, for each pair of part labels on g that run together
// (label order), one of the two to a free place round its part: that of the
// part with more pins (a can's name, which then goes to the can's far side
// from its tuning capacitor, the trade's way, leaving the capacitor's label
// beside its body where the reader looks for it), on equal pins the one
// whose free place lies nearer its part; failing that the other.
func apartLabels(g *geom.Sheet) {
	if len(g.Labels) < 2 {
		return
	}
	syms := map[string]int{}
	for i, s := range g.Symbols {
		syms[s.Ref] = i
	}
	b0 := bounds(g)
	for i := range g.Labels {
		for j := i + 1; j < len(g.Labels); j++ {
			a, b := g.Labels[i], g.Labels[j]
			if !linesMeet(a, b) || !check.PartLabel(a) || !check.PartLabel(b) || check.LabelPart(a) == check.LabelPart(b) ||
				!check.LabelsRun(g, a, b) {
				continue
			}
			moveApart(g, syms, b0, i, j)
		}
	}
}

// moveApart moves label i or j of g to the best free place found for
// either, and reports whether one moved.
func moveApart(g *geom.Sheet, syms map[string]int, b0 geom.Rect, i, j int) bool {
	ci, ri := nudgeSpots(g, syms, b0, i)
	cj, rj := nudgeSpots(g, syms, b0, j)
	first, then := ci, cj
	fi, ti := i, j
	pi, pj := pinsOf(g, syms, i), pinsOf(g, syms, j)
	if len(ci) == 0 || len(cj) > 0 && (pj > pi || pj == pi && rj < ri) {
		first, then, fi, ti = cj, ci, j, i
	}
	return tryMove(g, b0, fi, first) || tryMove(g, b0, ti, then)
}

// tryMove sets label k to the first of spots that leaves the sheet's
// bounds as they were.
func tryMove(g *geom.Sheet, b0 geom.Rect, k int, spots []geom.Rect) bool {
	old := g.Labels[k].Box
	for _, r := range spots {
		g.Labels[k].Box = r
		if bounds(g) == b0 {
			return true
		}
	}
	g.Labels[k].Box = old
	return false
}

// pinsOf is the pin count of the part label k belongs to.
func pinsOf(g *geom.Sheet, syms map[string]int, k int) int {
	if s, ok := syms[g.Labels[k].Owner]; ok {
		return len(g.Symbols[s].Pins)
	}
	return 0
}

// nudgeSpots are the free places for label k round its part's symbol, best
// first, and the score of the best (+Inf when none): a part's own label
// only, never a pin figure, which pinfigs.go keeps by its pin.
func nudgeSpots(g *geom.Sheet, syms map[string]int, b0 geom.Rect, k int) ([]geom.Rect, float64) {
	l := g.Labels[k]
	si, ok := syms[l.Owner]
	if !ok || l.Small {
		return nil, math.Inf(1)
	}
	sb := g.Symbols[si].Box
	w, h := l.Box.W(), l.Box.H()
	area := nudgeArea(l, sb)
	obs := nudgeObstacles(g, k, area)
	near := nearArea(g, area)
	type spot struct {
		r     geom.Rect
		score float64
	}
	var spots []spot
	// candidates a whole number of steps from where the label stands, so
	// a label on the sheet's edge can slide along it
	kx0, kx1 := math.Ceil((area.X0-l.Box.X0)/nudgeStep), math.Floor((area.X1-w-l.Box.X0)/nudgeStep)
	ky0, ky1 := math.Ceil((area.Y0-l.Box.Y0)/nudgeStep), math.Floor((area.Y1-h-l.Box.Y0)/nudgeStep)
	for ky := ky0; ky <= ky1; ky++ {
		for kx := kx0; kx <= kx1; kx++ {
			r := l.Box.Move(geom.Pt{X: kx * nudgeStep, Y: ky * nudgeStep})
			d := boxDist(r, sb)
			if kx == 0 && ky == 0 || d < nudgeGap-geom.Eps || d > nudgeReach || !within(r, b0) || !nudgeFree(g, k, si, r, obs, near) {
				continue
			}
			// nearest its symbol first, then centred on a side of it
			spots = append(spots, spot{r, d + 0.1*centreDist(r, sb)})
		}
	}
	slices.SortStableFunc(spots, func(a, b spot) int {
		switch {
		case a.score < b.score:
			return -1
		case a.score > b.score:
			return 1
		}
		return 0
	})
	out := make([]geom.Rect, len(spots))
	for i, s := range spots {
		out[i] = s.r
	}
	if len(out) == 0 {
		return nil, math.Inf(1)
	}
	return out, spots[0].score
}

// nudgeArea is where label l may be moved round its symbol's box sb:
// within nudgeReach of it.
func nudgeArea(l geom.Label, sb geom.Rect) geom.Rect {
	w, h := l.Box.W(), l.Box.H()
	return geom.Rect{X0: sb.X0 - nudgeReach - w, Y0: sb.Y0 - nudgeReach - h, X1: sb.X1 + nudgeReach + w, Y1: sb.Y1 + nudgeReach + h}
}

// nudgeNear is what of a sheet the places tried in one area can meet: the
// wire segments that touch the area, and the symbols nearer it than a
// label may stand from its own (nudgeReach) and still be nearer its own
// (nudgeOwn). A place lies in its area, and so does its own symbol, so
// the room between them does too: a wire or symbol left out could not
// have answered either test, and the sheet's wires and symbols, scanned
// for each of the thousands of places tried round a label, were most of
// the pass's time on a whole set (docs/performance.md).
type nudgeNear struct {
	segs []geom.Seg
	syms []int // indices into the sheet's symbols, in their order
}

// nearArea is what the places tried in area can meet, with a grid unit
// to spare for rounding.
func nearArea(g *geom.Sheet, area geom.Rect) nudgeNear {
	var n nudgeNear
	grown := area.Inset(-1)
	for _, w := range g.Wires {
		for _, s := range w.Segs {
			if s.Touches(grown) {
				n.segs = append(n.segs, s)
			}
		}
	}
	for i, s := range g.Symbols {
		if boxDist(area, s.Box) < nudgeReach+nudgeOwn+1 {
			n.syms = append(n.syms, i)
		}
	}
	return n
}

// nudgeFree says whether label k of g, its part's symbol si, may stand at
// r: clear of obs, in the frames its symbol is in and no other, nearer its
// own symbol than any other part's, and running together with no other
// part's label. near is what of the sheet r's area can meet (nearArea);
// r is at most nudgeReach from its symbol.
func nudgeFree(g *geom.Sheet, k, si int, r geom.Rect, obs *obstacles, near nudgeNear) bool {
	if obs.hits(r.Inset(nudgeClear), nil) {
		return false
	}
	sb := g.Symbols[si].Box
	for _, f := range g.Frames {
		if within(sb, f.Box) != within(r, f.Box) {
			return false
		}
	}
	if wireBetween(near.segs, r, sb) {
		return false
	}
	own := boxDist(r, sb)
	for _, i := range near.syms {
		if i != si && boxDist(r, g.Symbols[i].Box) < own+nudgeOwn {
			return false
		}
	}
	moved := g.Labels[k]
	moved.Box = r
	part := check.LabelPart(moved)
	for i, l := range g.Labels {
		if i != k && linesMeet(moved, l) && check.PartLabel(l) && check.LabelPart(l) != part && check.LabelRoom(g, moved, l) < nudgeRoom {
			return false
		}
	}
	return true
}

// nudgeObstacles are what a label moved into area must keep clear of:
// everything drawn there but the label itself.
func nudgeObstacles(g *geom.Sheet, k int, area geom.Rect) *obstacles {
	others := make([]geom.Label, 0, len(g.Labels)-1)
	others = append(others, g.Labels[:k]...)
	others = append(others, g.Labels[k+1:]...)
	rest := *g
	rest.Labels = others
	return nearObstacles(&rest, nil, area)
}

// linesMeet says whether the text lines of two labels can share a line:
// the heights their lines take (check.LineBoxes: one LineH a line from the
// box's top) overlap. A cheap test before the checker's, which measures
// every pair of lines.
func linesMeet(a, b geom.Label) bool {
	a1, b1 := a.Box.Y0+float64(len(a.Lines))*symbol.LineH, b.Box.Y0+float64(len(b.Lines))*symbol.LineH
	return math.Min(a1, b1)-math.Max(a.Box.Y0, b.Box.Y0) > geom.Eps
}

// wireBetween says whether a wire segment of segs runs through the room
// between label box r and symbol box sb: across it the label reads as
// whatever stands on the wire's far side.
func wireBetween(segs []geom.Seg, r, sb geom.Rect) bool {
	gap := geom.Rect{X0: math.Max(r.X0, sb.X0), X1: math.Min(r.X1, sb.X1), Y0: math.Max(r.Y0, sb.Y0), Y1: math.Min(r.Y1, sb.Y1)}
	if gap.X0 > gap.X1 { // apart in x: the room between their facing sides
		gap.X0, gap.X1 = gap.X1, gap.X0
	}
	if gap.Y0 > gap.Y1 {
		gap.Y0, gap.Y1 = gap.Y1, gap.Y0
	}
	in := gap.Inset(-geom.Eps * 10)
	for _, s := range segs {
		if s.Touches(in) {
			return true
		}
	}
	return false
}

// within says whether box r lies inside box b.
func within(r, b geom.Rect) bool {
	return r.X0 >= b.X0-geom.Eps && r.Y0 >= b.Y0-geom.Eps && r.X1 <= b.X1+geom.Eps && r.Y1 <= b.Y1+geom.Eps
}

// boxDist is the distance between the nearest points of two boxes (0 when
// they touch or overlap).
func boxDist(a, b geom.Rect) float64 {
	dx := math.Max(math.Max(a.X0-b.X1, b.X0-a.X1), 0)
	dy := math.Max(math.Max(a.Y0-b.Y1, b.Y0-a.Y1), 0)
	return math.Hypot(dx, dy)
}

// centreDist is the distance between two boxes' centres.
func centreDist(a, b geom.Rect) float64 {
	return math.Hypot((a.X0+a.X1-b.X0-b.X1)/2, (a.Y0+a.Y1-b.Y0-b.Y1)/2)
}
