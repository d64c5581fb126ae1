package layout

import (
	"math"

	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// cell is one part made ready for placement, in its own coordinates: the
// oriented symbol, the local ground and rail symbols at its pins and its
// label. Everything a cell draws lies inside its footprint, so cells that do
// not overlap cannot draw over each other.
type cell struct {
	part   *graph.Part
	ref    string
	shape  symbol.Shape
	locals []geom.Local
	label  geom.Label
	faded  bool
	// fadedPins are the pins the reduction dropped from a part it kept (a
	// valve's heaters, a static grid): their locals and wires are faded.
	fadedPins map[string]bool
	// mark is the merge mark in the label ("→ VC1a"), left out of the
	// text on a view that does not show what the reduction did.
	mark  string
	col   int
	edge  int  // -1: an input flag at the left edge, +1: an output flag at the right edge
	conn  bool // an off-row connector (rows.go), at its edge
	turns []symbol.Orient
	turn  int // index of the chosen orientation in turns
	// sig are its signal nets (state.signalNets), once sigDone
	sig     []string
	sigDone bool
	// own is the strokes and pins that move copied for the cell: while
	// the shape still has them, it is the cell's alone and later moves
	// shift it in place (a template's room moves every block right of its
	// stage, once per template; a copy per move grew with the square of a
	// set). A shape put in the cell from elsewhere (an orientation, a
	// tank's turn) has other storage and is copied on its first move.
	own ownKey
}

// ownKey names a shape's storage: its strokes' and pins' first elements.
type ownKey struct {
	prims *symbol.Prim
	pins  *geom.Pin
}

func shapeKey(s symbol.Shape) ownKey {
	var k ownKey
	if len(s.Prims) > 0 {
		k.prims = &s.Prims[0]
	}
	if len(s.Pins) > 0 {
		k.pins = &s.Pins[0]
	}
	return k
}

// ownsShape says whether the cell's shape is still the copy move made.
func (c *cell) ownsShape() bool {
	k := shapeKey(c.shape)
	return k != ownKey{} && k == c.own
}

func (c *cell) footprint() geom.Rect {
	r := c.shape.Box
	for _, l := range c.locals {
		r = r.Union(l.Box)
		for _, s := range l.Stub {
			r = r.Union(s.Box())
		}
	}
	if len(c.label.Lines) > 0 {
		r = r.Union(c.label.Box)
	}
	return r
}

func (c *cell) move(d geom.Pt) {
	if !c.ownsShape() {
		c.shape = c.shape.Owned()
		c.own = shapeKey(c.shape)
	}
	c.shape.Shift(d)
	for i := range c.locals {
		l := &c.locals[i]
		l.At = l.At.Add(d)
		l.Box = l.Box.Move(d)
		l.TextBox = l.TextBox.Move(d)
		for j := range l.Stub {
			l.Stub[j].A = l.Stub[j].A.Add(d)
			l.Stub[j].B = l.Stub[j].B.Add(d)
		}
	}
	c.label.Box = c.label.Box.Move(d)
}

// obstacles are what a new local symbol or label must keep clear of.
type obstacles struct {
	boxes []geom.Rect
	segs  []geom.Seg
}

func (o *obstacles) hits(r geom.Rect, stub []geom.Seg) bool {
	for _, b := range o.boxes {
		if r.Overlaps(b) {
			return true
		}
		for _, s := range stub {
			if s.CutsInterior(b) {
				return true
			}
		}
	}
	for _, s := range o.segs {
		if s.Touches(r) {
			return true
		}
	}
	return false
}

// corridor is the space straight out of a wired pin that its wire needs to
// leave the symbol.
func corridor(p geom.Pin) geom.Rect {
	s := p.Dir.Step()
	end := geom.Pt{X: p.At.X + 2*s.X, Y: p.At.Y + 2*s.Y}
	r := geom.R(p.At.X, p.At.Y, end.X, end.Y)
	// a full grid step either side, so that no box rounded out to the grid
	// covers the row (or column) the wire leaves along
	if s.X != 0 {
		return geom.Rect{X0: r.X0, Y0: r.Y0 - 1, X1: r.X1, Y1: r.Y1 + 1}
	}
	return geom.Rect{X0: r.X0 - 1, Y0: r.Y0, X1: r.X1 + 1, Y1: r.Y1}
}

// buildLocals attaches a local symbol to every pin on a ground, supply,
// heater or bias net: grounds first (they are compact), then rails, each at
// the shortest stub that keeps clear of everything placed so far. When a
// pin finds no clear place (a rectifier's two heater pins and its cathode a
// step apart: the first tag's centred text covered the next pin's way out,
// and the fallback drew the tags over each other), the cell is tried again
// with every tag's text beside its bar, away from its rail neighbour, and
// that is kept when fewer tags are left on top of others.
func buildLocals(c *graph.Circuit, cl *cell) {
	locals, stuck := cellLocals(c, cl, false)
	if stuck > 0 {
		if again, n := cellLocals(c, cl, true); n < stuck {
			locals = again
		}
	}
	cl.locals = append(cl.locals, locals...)
}

// cellLocals is buildLocals' one try: the locals and how many pins found no
// clear place. With sides set, an up or down rail tag's text stands beside
// its bar, on the side away from the cell's next rail pin.
func cellLocals(c *graph.Circuit, cl *cell, sides bool) ([]geom.Local, int) {
	obs := &obstacles{boxes: []geom.Rect{cl.shape.Box}}
	var wired []geom.Pin
	for _, p := range cl.shape.Pins {
		if !c.RoleOf(p.Net).IsACGround() {
			wired = append(wired, p)
		}
	}
	for _, p := range wired {
		obs.boxes = append(obs.boxes, corridor(p))
	}
	var out []geom.Local
	stuck := 0
	for pass := 0; pass < 2; pass++ {
		for _, p := range cl.shape.Pins {
			if !c.RoleOf(p.Net).IsACGround() {
				continue
			}
			ret, role := pinReturn(c, cl.part, p), pinRole(c, cl.part, p)
			if (role == graph.Ground) != (pass == 0) {
				continue
			}
			side := geom.Dir(-1)
			if sides {
				side = awaySide(c, cl, p)
			}
			// On a mains transformer (one declaring its mains frequency)
			// the earth of a winding's end keeps off the next winding's
			// lane: hung over the primary it read as the live primary
			// tied to chassis. Elsewhere the shortest stub stays, as the
			// moved earths crowded other sheets' wires into line.
			// Any earth keeps its bars from facing such a lane a step on
			// where a capacitor to chassis on the lane's net draws its
			// wire straight along it (review21 b05: a ferrite rod
			// winding's earth stood over the aerial tank's hot junction,
			// so the tank read as earthed).
			_, mains := cl.part.Params["hz"]
			sideways := p.Dir == geom.Left || p.Dir == geom.Right
			mode := laneFacing
			if mains && cl.part.Kind == graph.Transformer && role == graph.Ground && sideways {
				mode = laneNear
			}
			lanes := wired
			if mode == laneFacing {
				lanes = shunted(c, wired)
			}
			best := firstClear(obs, lanes, p, ret, role, mode, side)
			if best == nil {
				best = firstClear(obs, wired, p, ret, role, laneNone, side)
			}
			if best == nil {
				l := localCandidates(p, ret, role, 6)[0]
				best, stuck = &l, stuck+1
			}
			best.Owner, best.Faded = cl.ref, cl.faded || cl.fadedPins[p.Name]
			out = append(out, *best)
			obs.boxes = append(obs.boxes, best.Box)
			obs.segs = append(obs.segs, best.Stub...)
		}
	}
	return out, stuck
}

// awaySide is the side an up or down rail tag's text takes at pin p: away
// from the nearest other pin of the cell on a rail leaving the same way
// (left of it when that pin is to the right), -1 for no preference.
func awaySide(c *graph.Circuit, cl *cell, p geom.Pin) geom.Dir {
	if p.Dir != geom.Up && p.Dir != geom.Down {
		return -1
	}
	best, side := 0.0, geom.Dir(-1)
	for _, q := range cl.shape.Pins {
		if q.Name == p.Name || q.Dir != p.Dir || !c.RoleOf(q.Net).IsACGround() {
			continue
		}
		d := q.At.X - p.At.X
		if d == 0 || side >= 0 && math.Abs(d) >= best {
			continue
		}
		best, side = math.Abs(d), geom.Right
		if d > 0 {
			side = geom.Left
		}
	}
	return side
}

// firstClear is the first candidate local symbol for pin p, shortest stub
// first (with its text on side, when side is not -1), that keeps clear of
// the obstacles and, when lanes is set, stays
// more than a grid step from the line out of every other wired pin of the
// cell: an earth hung from a winding's end one step above the next
// winding's pin sat on that winding's wire and its junction dot, so the
// wire read as earthed.
func firstClear(obs *obstacles, wired []geom.Pin, p geom.Pin, ret *graph.Net, role graph.Role, lanes laneMode, side geom.Dir) *geom.Local {
	for s := 1.0; s <= 6; s++ {
		for _, l := range localCandidates(p, ret, role, s) {
			if side >= 0 && l.Kind == geom.LocalRail && l.Side != side {
				continue // buildLocals' second try: text beside the bar only
			}
			turnedUp := l.Kind == geom.LocalGround && !l.Down && (p.Dir == geom.Left || p.Dir == geom.Right)
			if obs.hits(l.Box.Inset(0.15), l.Stub) || (lanes == laneNear && nearLane(l, wired, p.Net)) ||
				(lanes == laneFacing && facesLane(l, wired, p.Net)) || (lanes == laneNone && turnedUp) {
				// an earth turned up only to keep off a lane: the
				// plain way down is the better drawing otherwise
				continue
			}
			if lanes == laneFacing && turnedUp && !facesLane(localCandidates(p, ret, role, s)[0], wired, p.Net) {
				continue // turned up only where the plain way faces a lane
			}
			return &l
		}
	}
	return nil
}

// nearLane says whether local l's symbol comes within half a grid step,
// or its stub's turn within two, of the line six steps straight out of a
// wired pin of another net: the wire that leaves there would run under
// the bars, or meet the stub end on and read as its continuation.
func nearLane(l geom.Local, wired []geom.Pin, net string) bool {
	near := l.Box.Inset(0.5)
	for _, q := range wired {
		if q.Net == net {
			continue
		}
		st := q.Dir.Step()
		lane := geom.R(q.At.X, q.At.Y, q.At.X+6*st.X, q.At.Y+6*st.Y)
		if near.Overlaps(lane) {
			return true
		}
		for _, s := range l.Stub[1:] {
			if s.Box().Inset(2).Overlaps(lane) {
				return true
			}
		}
	}
	return false
}

// localCandidates lists the ways a local symbol can hang from pin p with a
// stub of length s, best first: the earth symbol for chassis, else a rail
// tag saying ret, the rail the pin returns to.
func localCandidates(p geom.Pin, ret *graph.Net, role graph.Role, s float64) []geom.Local {
	step := p.Dir.Step()
	end := geom.Pt{X: p.At.X + s*step.X, Y: p.At.Y + s*step.Y}
	base := geom.Local{Net: p.Net, Pin: p.Name, Side: p.Dir}
	if role == graph.Ground {
		l := base
		l.Kind = geom.LocalGround
		switch p.Dir {
		case geom.Down:
			l.Stub = []geom.Seg{{A: p.At, B: end}}
			l.At, l.Down = end, true
		case geom.Up:
			l.Stub = []geom.Seg{{A: p.At, B: end}}
			l.At = end
		default:
			at := geom.Pt{X: end.X, Y: end.Y + 1}
			l.Stub = []geom.Seg{{A: p.At, B: end}, {A: end, B: at}}
			l.At, l.Down = at, true
			// the same turned up, for a pin whose neighbour below
			// leaves no room under the bars
			up := base
			up.Kind = geom.LocalGround
			top := geom.Pt{X: end.X, Y: end.Y - 1}
			up.Stub = []geom.Seg{{A: p.At, B: end}, {A: end, B: top}}
			up.At = top
			_, l.Box = symbol.Ground(l.At, false, symbol.IEC)
			_, up.Box = symbol.Ground(up.At, true, symbol.IEC)
			return []geom.Local{l, up}
		}
		_, l.Box = symbol.Ground(l.At, !l.Down, symbol.IEC) // the box is the same in both styles
		return []geom.Local{l}
	}
	text := railText(ret, p.Net)
	w := symbol.TextWidth(text) * symbol.SmallScale
	h := symbol.LineH * symbol.SmallScale
	l := base
	l.Kind, l.Text, l.At = geom.LocalRail, text, end
	l.Stub = []geom.Seg{{A: p.At, B: end}}
	switch p.Dir {
	case geom.Up, geom.Down:
		bar := geom.R(end.X-0.6, end.Y-0.1, end.X+0.6, end.Y+0.1)
		sgn := -1.0
		if p.Dir == geom.Down {
			sgn, l.Down = 1, true
		}
		y0 := end.Y + sgn*0.25
		y1 := y0 + sgn*h
		centred := l
		centred.TextBox = geom.R(end.X-w/2, y0, end.X+w/2, y1)
		centred.Box = bar.Union(centred.TextBox)
		// beside the bar, reading away from the stub
		right := l
		right.Side = geom.Right
		right.TextBox = geom.R(end.X+0.8, end.Y-h/2, end.X+0.8+w, end.Y+h/2)
		right.Box = bar.Union(right.TextBox)
		left := l
		left.Side = geom.Left
		left.TextBox = geom.R(end.X-0.8-w, end.Y-h/2, end.X-0.8, end.Y+h/2)
		left.Box = bar.Union(left.TextBox)
		return []geom.Local{centred, right, left}
	}
	bar := geom.R(end.X-0.1, end.Y-0.6, end.X+0.1, end.Y+0.6)
	if p.Dir == geom.Right {
		l.TextBox = geom.R(end.X+0.3, end.Y-h/2, end.X+0.3+w, end.Y+h/2)
	} else {
		l.TextBox = geom.R(end.X-0.3-w, end.Y-h/2, end.X-0.3, end.Y+h/2)
	}
	l.Box = bar.Union(l.TextBox)
	return []geom.Local{l}
}
