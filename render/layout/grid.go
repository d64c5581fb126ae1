package layout

import (
	"math"
	"sort"

	"pare/graph"
	"pare/render/geom"
)

// Routing costs, in grid steps: a bend costs three steps, a crossing thirty,
// so a wire goes a fair way round rather than cross another (crossings hurt
// a reader most: Purchase 1997). Every cost is a whole number of steps, so
// the search can keep its open states in buckets by cost (queue.go).
const (
	stepCost  = 1
	bendCost  = 3
	crossCost = 30
	// while removing crossings a wire may go a long way round instead
	wideCrossCost = 120
	// a step beside another net's wire, on the neighbouring grid line and
	// running the same way, or along a stage frame's dashed edge half a step
	// away: at print size the two lines blur into one, so a wire keeps a
	// grid step of clear space when a short detour allows
	nearCost = 3
	// a bend where the wire's run stops short in line with another net's
	// wire, across a gap of at most inLineReach steps: the reader sees one
	// wire broken, the two nets joined (render/check counts gaps up to six
	// steps; looking further, or at the run a bend starts, cost the router
	// more than its budget on the symbol bench)
	inLineCost  = 3
	inLineReach = 3
	// a bend where the wire's run stops, or where its next run starts,
	// within closeReach steps in line with another net's wire, terminal,
	// junction or local symbol's stub, or where a wire's last run into its
	// tree points on at one: the two ends read as one wire (the blind
	// reviewers read an earth stub running on into the wire a step beyond
	// it as joined); render/check counts such ends up to two steps apart
	// even with a part beside the gap. While crossings are removed (wide
	// windows) it costs no more than inLineCost: a crossing is worse.
	closeCost  = 15
	closeReach = 2
	// a crossing within a step (diagonals too) of a junction of either net,
	// or a wire joining its net's tree (a new junction) beside a crossing:
	// the crossing reads as part of the junction (render/check counts
	// crossings nearer a dot than two grid steps)
	dotCost = 20
	// a step beside another net's pin tip (across its lead): the tip reads
	// as joined to a wire that close (render/check's symbol ends near)
	tipCost = 20
	// a step through a stage frame's edge: a wire of the stage stays inside
	// its frame rather than run round outside it
	edgeCost = 6
	// a step inside a stage frame that holds none of the net's pins: the
	// wire would read as part of that stage (render/check's foreign
	// frames); a crossing still costs more than a short passage
	foreignCost = 3
)

// arm bits: which neighbours a wire cell connects to
const (
	armW = 1 << geom.Left
	armN = 1 << geom.Up
	armE = 1 << geom.Right
	armS = 1 << geom.Down
)

// alongArms are the arms of a straight run in each direction's axis.
var alongArms = [4]uint8{armE | armW, armN | armS, armE | armW, armN | armS}

func opposite(d int) int { return d ^ 2 }

// Grid cell flags.
const (
	fBlocked uint16 = 1 << iota // a symbol, local, label or title: no wire
	fPin                        // a pin tip: only its own net's wire starts here
	fHugH                       // half a step from a frame edge running horizontally
	fHugV                       // half a step from a frame edge running vertically
	fCutE                       // the step east passes through a frame edge
	fCutS                       // the step south passes through a frame edge
	fFadedE                     // the wire step east is drawn faded
	fFadedS                     // the wire step south is drawn faded
	fStub                       // a local symbol's stub (blocked too)
	fNearPin                    // beside a pin tip (whose net the search looks up)
)

// frameShift is where a cell's flags keep the number (1 to maxFrameMarks) of
// the stage frame whose interior holds it; 0 is none.
const (
	frameShift    = 10
	maxFrameMarks = 63
)

// gridCell is one grid point: the nets whose wires use it (two where wires
// cross), their arms, the net reserved there (a pin tip and the point just
// outside it) and the flags above. Kept together so that the search reads
// one small record per point it looks at.
type gridCell struct {
	own   [2]int32
	resv  int32
	arm   [2]uint8
	flags uint16
}

type wirePin struct {
	ref   string
	pin   geom.Pin
	faded bool
	lead  bool // a part's pin, drawn with a lead (not a sheet's flag or connector)
	conn  bool // an off-row connector's pin
	cell  int
}

type netRoute struct {
	name  string
	pins  []wirePin
	cells []int // cells the net's wires use, in the order they were laid
	ok    bool
	home  uint64 // the marked frames (bit n-1 for frame n) holding a pin of the net
}

// router is a grid of cells one grid step apart over the sheet.
type router struct {
	ly           *state
	x0, y0, w, h int
	g            []gridCell
	nets         []*netRoute // index = id-1
	flags        []geom.Local
	sc           *scratch // the search's memory, shared by the layouts of one sheet
	wide         bool     // search wide windows first (while removing crossings)
	strict       bool     // price in-line ends above a crossing (while clearing them, unline.go)
	shy          bool     // price a crossing beside a junction or a lead high (while clearing them, undot.go)
	farFirst     bool     // grow a net's tree from its last pin in reading order (undot.go's second try)
	along        bool     // price a run beside a part of the net's own (while clearing them, alongpart.go)
	pops         int      // states taken off the queue so far: the work budget
	alongAt      []int32  // per point, 1 + its index in alongSets, or 0 (alongpart.go)
	alongSets    [][]alongMark
	alongCells   []int     // the marked points, in grid order
	sib          [][]int32 // per net (id-1), the nets of the same valve's other leads (siblings.go)
}

func newRouter(ly *state, sc *scratch) *router {
	b := geom.Rect{}
	for _, cl := range ly.cells {
		b = b.Union(cl.footprint())
	}
	for _, f := range ly.frames {
		b = b.Union(f.Box)
	}
	rt := &router{ly: ly, sc: sc}
	rt.x0, rt.y0 = int(math.Floor(b.X0))-4, int(math.Floor(b.Y0))-4
	rt.w = int(math.Ceil(b.X1)) + 5 - rt.x0
	rt.h = int(math.Ceil(b.Y1)) + 5 - rt.y0
	rt.g = make([]gridCell, rt.w*rt.h)
	rt.collectNets()
	rt.siblingNets()
	rt.blockObstacles()
	rt.reservePins()
	rt.markAlong()
	return rt
}

// collectNets makes a route for every wired net, in name order.
func (rt *router) collectNets() {
	byName := map[string]*netRoute{}
	var names []string
	for _, cl := range rt.ly.cells {
		for _, p := range cl.shape.Pins {
			if rt.ly.c.RoleOf(p.Net).IsACGround() || p.Net == "" || p.Net == notConnected {
				continue
			}
			nr := byName[p.Net]
			if nr == nil {
				nr = &netRoute{name: p.Net}
				byName[p.Net] = nr
				names = append(names, p.Net)
			}
			lead := realPart(cl) != nil && !cl.conn
			nr.pins = append(nr.pins, wirePin{ref: cl.ref, pin: p, faded: cl.faded || cl.fadedPins[p.Name], lead: lead, conn: cl.conn, cell: rt.index(p.At)})
		}
	}
	sort.Strings(names)
	for _, n := range names {
		rt.nets = append(rt.nets, byName[n])
	}
}

// blockObstacles blocks symbol bodies, locals, labels and frame titles, and
// marks the grid lines beside frame edges.
func (rt *router) blockObstacles() {
	for _, cl := range rt.ly.cells {
		rt.block(cl.shape.Box)
		for _, l := range cl.locals {
			rt.blockLocal(l)
			for _, s := range l.Stub {
				rt.block(s.Box())
				rt.mark(s.Box(), fStub)
			}
		}
		if len(cl.label.Lines) > 0 {
			rt.block(cl.label.Box)
		}
		rt.blockTip(cl)
	}
	for i, f := range rt.ly.frames {
		rt.block(f.Title.Box)
		rt.markHugs(f.Box)
		if i < maxFrameMarks {
			rt.markFrame(i+1, f.Box)
		}
	}
}

// markCells gives the cells inside b the frame number n.
func (rt *router) markCells(b geom.Rect, n int) {
	for y := int(math.Ceil(b.Y0)); y <= int(math.Floor(b.Y1)); y++ {
		for x := int(math.Ceil(b.X0)); x <= int(math.Floor(b.X1)); x++ {
			if x-rt.x0 >= 0 && y-rt.y0 >= 0 && x-rt.x0 < rt.w && y-rt.y0 < rt.h {
				g := &rt.g[(y-rt.y0)*rt.w+x-rt.x0]
				g.flags = g.flags&(1<<frameShift-1) | uint16(n)<<frameShift
			}
		}
	}
}

// markFrame numbers the cells inside frame n's box, and marks it home to
// every net with a pin there.
func (rt *router) markFrame(n int, b geom.Rect) {
	rt.markCells(b, n)
	for _, nr := range rt.nets {
		for _, wp := range nr.pins {
			if b.Contains(wp.pin.At) {
				nr.home |= 1 << (n - 1)
			}
		}
	}
}

// reservePins frees every pin tip for its own net and reserves the point
// just outside it, so that no other wire closes a pin's way out.
func (rt *router) reservePins() {
	for id, nr := range rt.nets {
		for _, wp := range nr.pins {
			g := &rt.g[wp.cell]
			g.flags = g.flags&^fBlocked | fPin
			g.resv = int32(id + 1)
			for d := range dirStep {
				if n := rt.neighbour(wp.cell, d); n >= 0 {
					rt.g[n].flags |= fNearPin
				}
			}
		}
	}
	for id, nr := range rt.nets {
		if len(nr.pins) < 2 {
			continue
		}
		for _, wp := range nr.pins {
			e := rt.neighbour(wp.cell, int(wp.pin.Dir))
			if e >= 0 && rt.g[e].flags&fBlocked == 0 && rt.g[e].resv == 0 {
				rt.g[e].resv = int32(id + 1)
			}
			rt.markLead(wp.cell, e, int(wp.pin.Dir))
		}
	}
}

// markLead marks the grid lines either side of a pin's lead (its tip and
// the point just outside) as crowded for wires running the lead's way: the
// lead leaves that way whatever its net's route, so a wire laid there first
// would run one step beside it (render/check's reader reads the two as
// one).
func (rt *router) markLead(tip, out, d int) {
	hug := fHugH << (d & 1)
	for _, c := range []int{tip, out} {
		if c < 0 {
			continue
		}
		for _, side := range []int{(d + 1) & 3, (d + 3) & 3} {
			if n := rt.neighbour(c, side); n >= 0 {
				rt.g[n].flags |= hug
			}
		}
	}
}

// markHugs marks the grid lines on either side of a frame's edges.
func (rt *router) markHugs(b geom.Rect) {
	set := func(x, y int, f uint16) {
		x, y = x-rt.x0, y-rt.y0
		if x >= 0 && y >= 0 && x < rt.w && y < rt.h {
			rt.g[y*rt.w+x].flags |= f
		}
	}
	for _, ey := range []float64{b.Y0, b.Y1} {
		for x := int(math.Ceil(b.X0)); x <= int(math.Floor(b.X1)); x++ {
			set(x, int(math.Floor(ey)), fHugH|fCutS)
			set(x, int(math.Ceil(ey)), fHugH)
		}
	}
	for _, ex := range []float64{b.X0, b.X1} {
		for y := int(math.Ceil(b.Y0)); y <= int(math.Floor(b.Y1)); y++ {
			set(int(math.Floor(ex)), y, fHugV|fCutE)
			set(int(math.Ceil(ex)), y, fHugV)
		}
	}
}

// runsAlong says whether another net's wire at this cell has an arm along
// the given axis: a wire stepping beside it would be crowded (the search's
// stepExtra).
func (g *gridCell) runsAlong(along uint8, net int32) bool {
	return (g.own[0] != 0 && g.own[0] != net && g.arm[0]&along != 0) ||
		(g.own[1] != 0 && g.own[1] != net && g.arm[1]&along != 0)
}

func (rt *router) index(p geom.Pt) int {
	x, y := int(math.Round(p.X))-rt.x0, int(math.Round(p.Y))-rt.y0
	return y*rt.w + x
}

func (rt *router) point(i int) geom.Pt {
	return geom.Pt{X: float64(i%rt.w + rt.x0), Y: float64(i/rt.w + rt.y0)}
}

var dirStep = [4][2]int{{-1, 0}, {0, -1}, {1, 0}, {0, 1}}

func (rt *router) neighbour(i, d int) int {
	x, y := i%rt.w+dirStep[d][0], i/rt.w+dirStep[d][1]
	if x < 0 || y < 0 || x >= rt.w || y >= rt.h {
		return -1
	}
	return y*rt.w + x
}

// block marks every grid point inside or on the integer hull of r, so that
// no wire between free points can enter r.
// blockLocal blocks a local symbol's cells, across its pin's direction
// only the grid lines the symbol really covers: a rail tag's bar and text
// stand ±0.6 about their pin's line, and blocking every line they touch
// closed the line of a wired pin between two tagged neighbours (a valve's
// grid between two screen grids on a rail), leaving it no way out.
func (rt *router) blockLocal(l geom.Local) {
	b := l.Box
	m := 0.35 // the clearance a wire keeps from a tag beside its line
	if n := len(l.Stub); l.Kind == geom.LocalRail && n > 0 && l.Stub[n-1].A.X == l.Stub[n-1].B.X && (l.Side == geom.Left || l.Side == geom.Right) {
		// a tag on a stub going up or down with its text beside the bar
		// (buildLocals' second try, pins a step apart): a wire passing
		// the next grid line would run under the bar and read as its rail
		m = 0.99
	}
	if l.Side == geom.Left || l.Side == geom.Right {
		b.Y0, b.Y1 = math.Ceil(b.Y0-m), math.Floor(b.Y1+m)
	} else {
		b.X0, b.X1 = math.Ceil(b.X0-m), math.Floor(b.X1+m)
	}
	if b.Y0 > b.Y1 || b.X0 > b.X1 {
		b = l.Box
	}
	rt.block(b)
}

// blockTip blocks the grid point one step beyond the far end of a symbol
// with one pin (a flag, a socket), on the pin's line: another net's wire
// passing there would meet the tip end on and read as its continuation (a
// socket flag whose tip stopped one step short of the tone control's wire
// read as feeding it). That point and the tipLine-1 after it are marked
// as a stub too: a run of another net that stops or starts a few steps
// further on, in line, reads as the flag's line carried on just the same
// (review19 b05: the tone control's feed began two steps past the
// extension speaker socket's flag), and the search prices a run ending
// within closeReach of a mark as it prices one in line with a stub
// (ahead, inLineEnd), which keeps such ends inLineGap (render/check, six
// steps) from the tip. Only flags draw a line of their net to their tip
// (render/check's flagBodies): a one-pin part keeps the one point.
func (rt *router) blockTip(cl *cell) {
	sh := cl.shape
	if len(sh.Pins) != 1 {
		return
	}
	line, block := 1, 1
	if realPart(cl) == nil || cl.part.Kind == graph.Port {
		line = tipLine
		if !cl.conn {
			block = flagBlock
		}
	}
	p, b := sh.Pins[0], sh.Box
	var at, on geom.Pt // the point beyond the tip, and the step on from it
	switch p.Dir {
	case geom.Left:
		at, on = geom.Pt{X: b.X1 + 1, Y: p.At.Y}, geom.Pt{X: 1}
	case geom.Right:
		at, on = geom.Pt{X: b.X0 - 1, Y: p.At.Y}, geom.Pt{X: -1}
	case geom.Up:
		at, on = geom.Pt{X: p.At.X, Y: b.Y1 + 1}, geom.Pt{Y: 1}
	default:
		at, on = geom.Pt{X: p.At.X, Y: b.Y0 - 1}, geom.Pt{Y: -1}
	}
	for i := 0; i < line; i++ {
		q := geom.Pt{X: at.X + float64(i)*on.X, Y: at.Y + float64(i)*on.Y}
		f := uint16(0)
		if line > 1 {
			f = fStub
		}
		if i < block {
			f |= fBlocked
		}
		rt.mark(geom.Rect{X0: q.X, Y0: q.Y, X1: q.X, Y1: q.Y}, f)
	}
}

// tipLine is how many grid points beyond a flag's tip, on its line, read
// as its stub: with closeReach they keep a run's end in line with the tip
// at least inLineGap (render/check) steps from it.
const tipLine = 3

// flagBlock is how many of them no wire may pass beyond a flag (an input,
// output or socket flag; one beyond an off-row connector, whose tip points
// off the row): a wire across a flag's line two steps from its tip reads
// as what the flag points into. Two beyond a connector too sent one
// fixture's connector wires across each other (TestConnectorWiresStraight).
const flagBlock = 2

func (rt *router) block(r geom.Rect) { rt.mark(r, fBlocked) }

// mark sets flag f on every grid point inside or on the integer hull of r.
func (rt *router) mark(r geom.Rect, f uint16) {
	x0, x1 := int(math.Floor(r.X0+geom.Eps))-rt.x0, int(math.Ceil(r.X1-geom.Eps))-rt.x0
	y0, y1 := int(math.Floor(r.Y0+geom.Eps))-rt.y0, int(math.Ceil(r.Y1-geom.Eps))-rt.y0
	for y := max(y0, 0); y <= min(y1, rt.h-1); y++ {
		for x := max(x0, 0); x <= min(x1, rt.w-1); x++ {
			rt.g[y*rt.w+x].flags |= f
		}
	}
}

func (rt *router) arms(i int, net int32) uint8 {
	switch net {
	case rt.g[i].own[0]:
		return rt.g[i].arm[0]
	case rt.g[i].own[1]:
		return rt.g[i].arm[1]
	}
	return 0
}

func (rt *router) owns(i int, net int32) bool { return rt.g[i].own[0] == net || rt.g[i].own[1] == net }

func (rt *router) foreign(i int, net int32) bool {
	g := &rt.g[i]
	return (g.own[0] != 0 && g.own[0] != net) || (g.own[1] != 0 && g.own[1] != net)
}

func (rt *router) addArm(i int, net int32, bit uint8) {
	g := &rt.g[i]
	switch {
	case g.own[0] == net:
		g.arm[0] |= bit
	case g.own[1] == net:
		g.arm[1] |= bit
	case g.own[0] == 0:
		g.own[0], g.arm[0] = net, bit
	default:
		g.own[1], g.arm[1] = net, bit
	}
}

// setFaded records whether the step east (or south) of cell i is faded.
func (rt *router) setFaded(i int, f uint16, faded bool) {
	if faded {
		rt.g[i].flags |= f
	} else {
		rt.g[i].flags &^= f
	}
}

func (rt *router) faded(i int, f uint16) bool { return rt.g[i].flags&f != 0 }
