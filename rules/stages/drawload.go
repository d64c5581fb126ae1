// Reading a pattern's drawing template, the [draw] table: where each role
// of the stage stands relative to its active part, on a small grid of
// slots, as the trade draws the stage.

package stages

import (
	"sort"

	"pare/graph"
)

// Place is where one part of a stage is drawn relative to the stage's
// anchor (its active part, the entry at column 0, row 0): Col counts slots
// to the right (negative: left, towards the input), Row slots down
// (negative: up, towards the rails). Stand, when set, is "vertical" or
// "horizontal": the way the part's two ends should run.
type Place struct {
	Part     string // pattern part name (in a Pattern) or circuit ref (in a Stage)
	Col, Row int
	Stand    string
}

// drawKeys are the keys of one [draw] entry.
var drawKeys = []string{"col", "row", "stand"}

// stands are the values of a [draw] entry's stand.
var stands = []string{"vertical", "horizontal"}

// maxSlot bounds a template's columns and rows either side of the anchor:
// a stage is a handful of parts round one device, and a template that
// reaches further than this is a mistake, not a stage.
const maxSlot = 4

// draw reads the [draw] table: one entry per pattern part, in name order.
func (ld *patLoader) draw(k string, v any) {
	m, ok := v.(map[string]any)
	if !ok {
		ld.fail(k, "[draw] must be a table such as Q = { col = 0, row = 0 }")
		return
	}
	for _, name := range sortedKeys(m) {
		path := k + "." + name
		t, ok := m[name].(map[string]any)
		if !ok {
			ld.fail(path, "draw entry %s must be a table such as { col = -1, row = 1, stand = \"vertical\" }", name)
			continue
		}
		pl := Place{Part: name}
		for _, key := range sortedKeys(t) {
			kp := path + "." + key
			switch key {
			case "col":
				pl.Col = ld.slot(kp, t[key])
			case "row":
				pl.Row = ld.slot(kp, t[key])
			case "stand":
				pl.Stand = ld.oneOf(kp, t[key], stands)
			default:
				ld.unknown(kp, key, drawKeys)
			}
		}
		ld.p.Draw = append(ld.p.Draw, pl)
		ld.p.drawPos = append(ld.p.drawPos, ld.at.Key(path))
	}
	// the file's order, not the names': a block of several parts (a
	// tank's coil and capacitors) takes the slot of the first listed
	idx := make([]int, len(ld.p.Draw))
	for i := range idx {
		idx[i] = i
	}
	pos := ld.p.drawPos
	sort.SliceStable(idx, func(a, b int) bool {
		pa, pb := pos[idx[a]], pos[idx[b]]
		return pa.Line < pb.Line || pa.Line == pb.Line && pa.Col < pb.Col
	})
	draw, at := make([]Place, len(idx)), make([]graph.Pos, len(idx))
	for i, j := range idx {
		draw[i], at[i] = ld.p.Draw[j], pos[j]
	}
	ld.p.Draw, ld.p.drawPos = draw, at
}

// slot reads a column or row offset: a whole number within maxSlot.
func (ld *patLoader) slot(path string, v any) int {
	n, ok := v.(int64)
	if !ok {
		ld.fail(path, "%s must be a whole number of slots", lastKey(path))
		return 0
	}
	if n < -maxSlot || n > maxSlot {
		ld.fail(path, "%s %d is out of range: a template reaches at most %d slots from its anchor", lastKey(path), n, maxSlot)
		return 0
	}
	return int(n)
}

// checkDraw makes sure every [draw] entry names a part of the pattern, no
// two share a slot, and exactly one, a part the stage always has, stands
// at column 0, row 0 as the anchor.
func (ld *patLoader) checkDraw() {
	p := ld.p
	if len(p.Draw) == 0 {
		return
	}
	parts := map[string]*PPart{}
	for i := range p.Parts {
		parts[p.Parts[i].Name] = &p.Parts[i]
	}
	slots := map[[2]int]string{}
	var anchors []string
	for i, pl := range p.Draw {
		at := p.drawPos[i]
		pp := parts[pl.Part]
		if pp == nil {
			ld.errs.Add(at, "draw entry %s names no part of [parts]", pl.Part)
			continue
		}
		if pp.Shared {
			ld.errs.Add(at, "draw entry %s: a shared part belongs to two stages and is placed by neither", pl.Part)
		}
		key := [2]int{pl.Col, pl.Row}
		if other, dup := slots[key]; dup {
			ld.errs.Add(at, "draw entry %s takes the slot of %s (col %d, row %d)", pl.Part, other, pl.Col, pl.Row)
			continue
		}
		slots[key] = pl.Part
		if pl.Col == 0 && pl.Row == 0 {
			anchors = append(anchors, pl.Part)
			if pp.Optional != "" {
				ld.errs.Add(at, "draw entry %s: the anchor (col 0, row 0) must be a part the stage always has", pl.Part)
			}
		}
	}
	if len(anchors) == 0 {
		ld.fail("draw", "[draw] has no anchor: one part (the active device) stands at col = 0, row = 0")
	}
}

// Anchor is the pattern part a template places the others round ("" when
// the pattern has no template).
func (p *Pattern) Anchor() string {
	for _, pl := range p.Draw {
		if pl.Col == 0 && pl.Row == 0 {
			return pl.Part
		}
	}
	return ""
}
