package layout

import (
	"math"

	"pare/render/geom"
)

// Spacing, in grid steps.
const (
	rowGap    = 3 // between blocks stacked in a column
	colGap    = 3 // least gap between columns, before routing tracks
	stageGap  = 3 // extra gap between stage frames
	framePad  = 1 // frame margin round its parts
	blockGap  = 1 // between the parts of one block (a tuned circuit's L and C)
	maxTracks = 8 // routing tracks reserved between columns, at most
	stackGap  = 2 // between blocks stacked in a column of a compact row (Options.Compact)
)

// place orders the blocks in each column, then gives columns their x and
// blocks their y, puts the rail sockets under them (feet.go), and draws
// the stage frames round their parts.
func (ly *state) place() {
	cols, feet := ly.footSockets(ly.blocks())
	ly.order(cols)
	ly.placeColumns(cols, feet)
	ly.placeRows(cols)
	ly.diamonds(cols)
	ly.templates(cols)
	ly.makeFrames()
	ly.levelConnectors(cols)
	ly.placeFeet(feet)
}

// placeColumns sets the columns side by side, each block centred in its
// column, with a gap for the routing tracks the column's nets need and
// more between stages (enough for a frame title wider than its parts); a
// column the rail sockets left is as narrow as footWidth allows.
func (ly *state) placeColumns(cols [][]*block, feet []*block) {
	spans := ly.trackSpans(len(cols))
	colStage := ly.columnStages(cols)
	x := 0.0
	running := 0
	stageStart := map[int]float64{}
	for i, col := range cols {
		w := 0.0
		for _, b := range col {
			w = math.Max(w, b.fp.W())
		}
		w = footWidth(w, i, feet)
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
}

// trackSpans counts, as differences from one column to the next, the nets
// that span each gap between columns: each needs a routing track there.
func (ly *state) trackSpans(n int) []int {
	lo, hi := map[string]int{}, map[string]int{}
	for _, cl := range ly.cells {
		for _, net := range ly.signalNets(cl) {
			if v, ok := lo[net]; !ok || cl.col < v {
				lo[net] = cl.col
			}
			if v, ok := hi[net]; !ok || cl.col > v {
				hi[net] = cl.col
			}
		}
	}
	spans := make([]int, n+1)
	for net, l := range lo {
		spans[l]++
		spans[hi[net]]--
	}
	return spans
}

// columnStages is the stage of each column's framed parts, -1 for a column
// without any.
func (ly *state) columnStages(cols [][]*block) []int {
	colStage := make([]int, len(cols))
	for i, col := range cols {
		colStage[i] = -1
		for _, b := range col {
			if s, ok := ly.stageOf[b.cells[0].ref]; ok && b.cells[0].edge == 0 && len(ly.o.Frames) > 0 {
				colStage[i] = s
			}
		}
	}
	return colStage
}

// gapY is the gap between blocks stacked in a column, and between a
// level edge, a device's foot or a slot row and what it clears: stackGap
// on a compact row, else rowGap.
func (ly *state) gapY() float64 {
	if ly.o.Compact {
		return stackGap
	}
	return rowGap
}

// placeRows gives each block its y: its first wired pin level with a pin
// already placed on the same net, else stacked under the block above;
// blocks in a column keep their order.
func (ly *state) placeRows(cols [][]*block) {
	pinY := map[string]geom.Pin{}
	for _, col := range cols {
		bottom := math.Inf(-1)
		var above *block
		for _, b := range col {
			dy := math.Round(ly.rowOf(b, pinY))
			if b.fp.Y0+dy < bottom+ly.gapY() {
				dy = math.Ceil(bottom + ly.gapY() - b.fp.Y0)
			}
			b.move(geom.Pt{Y: dy})
			if above != nil {
				b.move(geom.Pt{Y: ly.laneGap(above, b)})
			}
			bottom, above = b.fp.Y1, b
			for _, cl := range b.cells {
				for _, p := range cl.shape.Pins {
					if _, ok := pinY[p.Net]; !ok {
						pinY[p.Net] = p
					}
				}
			}
		}
	}
}

// rowOf is how far a block wants to move down. Parts in the signal path
// (active parts, series parts, transformers) put their first wired left pin
// on the sheet's signal line, y = 0, so a long chain does not climb stage by
// stage; other blocks line a pin up with one placed on its net, looking at
// left pins first, then up, down and right, and standing off that level
// by hangOff when the two pins face different ways.
func (ly *state) rowOf(b *block, pinY map[string]geom.Pin) float64 {
	if cl := b.cells[0]; !ly.free && len(b.cells) == 1 && !isVertical(cl) {
		for _, p := range cl.shape.Pins {
			if p.Dir == geom.Left && !ly.c.RoleOf(p.Net).IsACGround() {
				return -p.At.Y
			}
		}
	}
	for _, d := range []geom.Dir{geom.Left, geom.Up, geom.Down, geom.Right} {
		for _, cl := range b.cells {
			for _, p := range cl.shape.Pins {
				if p.Dir != d {
					continue
				}
				if q, ok := pinY[p.Net]; ok && !ly.c.RoleOf(p.Net).IsACGround() {
					return q.At.Y - p.At.Y + hangOff(q.Dir, d)
				}
			}
		}
	}
	return 0
}

// hangOff is how far below (above) the level of a placed pin leaving the
// way placed a block's pin leaving upwards (downwards) stands, so that the
// wire reaches it with a plain T or bend: level with a pin on a horizontal
// wire, an upward pin would have the wire climb over it and come down (a
// loudspeaker on its secondary's wire drew a bump that ran one step under
// the anode's wire above it); level with a downward pin, the wire would
// turn back on itself. Pins leaving the same way, or sideways, stay level.
func hangOff(placed, d geom.Dir) float64 {
	sign := 0.0
	switch d {
	case geom.Up:
		sign = 1
	case geom.Down:
		sign = -1
	default:
		return 0
	}
	switch placed {
	case d:
		return 0
	case geom.Left, geom.Right:
		return sign
	}
	return 2 * sign
}

// laneGap is how much further down block b must stand under the block
// above it so that the wires leaving the upper block's downward pins and
// those leaving b's upward pins, on other nets and in other columns, run
// two grid steps apart: one step apart, two unrelated wires read as one
// (render/check's reader).
func (ly *state) laneGap(above, b *block) float64 {
	wired := func(bl *block, d geom.Dir) []geom.Pin {
		var out []geom.Pin
		for _, cl := range append(append([]*cell{}, bl.cells...), bl.chain...) {
			for _, p := range cl.shape.Pins {
				if p.Dir == d && p.Net != notConnected && !ly.c.RoleOf(p.Net).IsACGround() {
					out = append(out, p)
				}
			}
		}
		return out
	}
	if len(b.cells)+len(b.chain) < 2 {
		return 0 // a lone part's lead rises a step; a tank's bridge runs across
	}
	need := 0.0
	for _, d := range wired(above, geom.Down) {
		for _, u := range wired(b, geom.Up) {
			if d.Net != u.Net && d.At.X != u.At.X && u.At.Y-d.At.Y < 4 {
				need = max(need, 4-(u.At.Y-d.At.Y))
			}
		}
	}
	return need
}
