// Package layout places a circuit's symbols on the grid and routes its wires,
// producing the geometry (package geom) that the renderer draws and the
// checker measures.
//
// The method is pare's own arrangement of published ones. Parts are put in
// layers along the signal flow, input on the left (layered placement after
// Sugiyama, Tagawa and Toda 1981): a breadth-first rank from the input nets,
// grouped by stage when stage frames are given, ordered inside each layer by
// the barycentre of their neighbours, and given vertical positions that line
// each part's signal pin up with the part it comes from (a greedy form of the
// alignment in Brandes and Köpf 2001). Ground and rail connections become
// local symbols at the pins, as technicians draw them, so only signal nets are
// wired. Wires are routed on the grid by A* search (Lee 1961 with a
// heuristic) with costs for bends and crossings, nets with the most pins
// first, with rip-up and reroute of failed and crossing nets; a net that
// still cannot be wired is drawn with net-name flags at its pins. On a
// reduced sheet a bounded local search tries other orientations and places
// of the parts on crossing nets, and the other net order, and keeps the
// layout with the fewest crossings.
//
// The pipeline, by file: cells.go (a cell per part, its label text), rank.go
// and columns.go (layers, stages, columns), orient.go (orientations),
// cell.go and labels.go (local ground and rail symbols, label candidates;
// rails.go: the rail each pin returns to, its tag text and direction),
// blocks.go, order.go and place.go (blocks, their order in a column, x and
// y), template.go and template_orient.go (a recognised stage's parts moved
// to the slots its pattern's drawing template gives round its active
// part, and oriented for them), frames.go and links.go (stage frames, gang links), sheet.go (one
// placement routed and assembled; labelnudge.go: two parts' labels that run
// together set apart after routing), fade.go (the faded view's greying of
// the full view's wires, and the plain full view), untangle.go (the search for fewer
// crossings), rows.go (off-row connectors of a row of a paged sheet), and the router: grid.go (the grid and its costs), search.go
// and queue.go (A*), reroute.go (net order, rip-up and reroute), emit.go
// (wires, dots and flags).
package layout

import (
	"pare/graph"
	"pare/render/geom"
	"pare/render/symbol"
)

// Frame is a stage to be framed: its title lines and the refs it holds.
type Frame struct {
	Title, Subtitle string
	Parts           []string
	// Places are the stage's templates (template.go): each one's parts
	// round its anchor, the templates one after another.
	Places []Place
	// Supply marks a power supply's stage: its parts, and the unframed
	// mains parts before its transformer, are ranked along the supply's
	// own flow (mains, transformer, rectifier, reservoir, smoothing) rather
	// than by their distance from the signal input, and a four-diode bridge
	// is drawn as the trade's diamond (supplyflow.go).
	Supply bool
}

// Options says what to draw.
type Options struct {
	Style symbol.Style
	// DeviceStages stands an unframed part wired to a framed device's
	// control electrode (or through a winding to it) in that device's
	// stage where the plain spread gave it a stage without a device
	// (deviceStages): set on the rows of a paged sheet. An unframed
	// transformer so wired stands there on every sheet.
	DeviceStages bool
	// Faded refs are drawn faded; Merged maps a ref to the part it went into.
	Faded  map[string]bool
	Merged map[string]string
	// FadedPins are, per ref of a part the reduction kept, the pins it
	// dropped (heaters, a static grid): their locals and the wires that
	// serve only them are faded.
	FadedPins map[string]map[string]bool
	// LeadsApart prices a crossing of two leads of one valve above a plain
	// crossing (siblings.go): set on the full and faded sheets, where the
	// reviews rejected anode leads across their own valve's screen and
	// cathode leads. The reduced sheet's untangle search already trades
	// placements for crossings; with the price there too, the kitchen-sink
	// fixture's reduced A3 pages were cut elsewhere and drew one more
	// transformer left of the device feeding it.
	LeadsApart bool
	// Plain lays the sheet out exactly as with Faded, FadedPins and Merged
	// but draws nothing faded and no merge mark: the full view, which is
	// the faded view's layout in plain ink (fade.go).
	Plain bool
	// Quiet are the nets of the original circuit the reduction tied to AC
	// ground (a decoupled supply line, an AGC line behind its filter
	// capacitor): wired on the full and faded sheets, but no signal passes
	// through them, so the rank along the signal flow does not either (a
	// transformer's cold end on a decoupled line ranked the IF can before
	// the transistor feeding it, review16 b03 and b05). Non-nil, if
	// empty, on a sheet of the original circuit (fedNets).
	Quiet map[string]bool
	// Returns are the bias points bypassed to chassis (BiasReturns) of
	// the whole circuit, given when the sheet is a row of it, whose
	// circuit may lack the bypass; nil: those of the circuit laid out.
	Returns map[string]bool
	Frames  []Frame
	// Links draws ganged sections joined by a dashed mechanical link.
	Links bool
	// Untangle tries other orientations of the parts on crossing nets until
	// no crossing is left (bounded); worth its time on small reduced sheets.
	Untangle bool
	// HideUnconnected leaves out the valve electrodes on "nc" (the format's
	// not-connected net): a reduced sheet draws a pentode whose screen and
	// suppressor were dropped as static electrodes with cathode, g1 and
	// anode only. Other views draw such an electrode as a bare lead.
	HideUnconnected bool
	// PinVolts holds, per ref and pin, the DC voltage at an electrode in
	// volts in the trade's short form ("229"): drawn small beside the pin on the
	// full and faded views (pinfigs.go).
	PinVolts map[string]map[string]string
	// Marks holds, per ref, the alignment steps turned at a part ("align
	// 3, 4"): drawn in the small line of its label on every view, so the
	// label placement keeps it clear of wires and other labels.
	Marks map[string]string
	// Ties holds, per ref and pin, where a valve electrode the reduction
	// made static is held (HideUnconnected sheets): its grid line stays,
	// stubbed to a chassis mark or strapped to the cathode, with no pin.
	// On the other views it holds only grids wired to their own cathode
	// that the sheet draws as the internal strap (drawnPart).
	Ties map[string]map[string]symbol.Tie
	// TieLabels holds, per ref, a line of its label naming the rails its
	// electrodes tied to a rail are held at (symbol.TieRail).
	TieLabels map[string]string
	// Presets holds, per ref, the trimmers merged into the part: the merged
	// symbol keeps the preset mark, so the alignment point stays on the
	// sheet (the alignment mark in its label names the trimmer, "align 3
	// (TC2)").
	Presets map[string][]string
	// Continues are the nets of a row that run on in another row: each
	// ends at an off-row connector at the row's edge (rows.go).
	Continues []Continuation
	// RankFromFirst ranks a row from its first part by name, as a piece
	// the inputs do not reach, rather than from the nets of its incoming
	// Continues: the caller's fallback for a row the signal's ranking
	// makes too big for its page (render/flow.go)
	RankFromFirst bool
	// Compact stacks the blocks of a column stackGap apart, not rowGap:
	// the caller's retry of a row whose height alone takes a page more
	// (render/compactrows.go), kept only where the checker finds the row
	// no worse for it
	Compact bool
	// CloseGaps moves the stages after a template back left by the
	// columns its moves left empty (giveBack): the caller's retry of a
	// row of one stretch too wide for its page (render/flow.go), which
	// would otherwise be drawn smaller than the 2.5 mm text rule
	CloseGaps bool
	// SupplyFlow gives, on a row of a paged sheet, each supply part's step
	// along the whole sheet's supply flow (SupplyFlow); nil: found here.
	SupplyFlow map[string]int
	// Placed is the plain placement of the same circuit with the same
	// options, made by Extents or LeastBounds: Layout takes it instead of
	// placing the circuit again (nil: placed here).
	Placed *Placement
}

// Placement is a circuit placed without routing (Extents, LeastBounds),
// kept for the Layout of the same circuit with the same options: placing
// is deterministic, so it is the placement Layout would make. A paged
// sheet's row is placed to test its fit and then laid out, and a sheet
// that fits is placed for its extents and then laid out. Layout takes it
// for one layout only, as the layout adds to what it holds.
type Placement struct{ ly *state }

// notConnected is the netlist format's net for a terminal that is really not
// connected (docs/netlist.md): it never joins the pins on it, so it is never
// wired, ranked or checked as a net.
const notConnected = "nc"

// drawnPart is the part as its symbol shows it: with HideUnconnected, a
// valve without its electrodes on "nc"; on the other views, without the
// grids Ties straps to the cathode (the symbol draws the strap inside the
// envelope instead of a lead round the valve).
func (o Options) drawnPart(p *graph.Part) *graph.Part {
	if p.Kind != graph.Valve {
		return p
	}
	var keep []graph.Pin
	for _, pn := range p.Pins {
		nc := pn.Net == notConnected || pn.Net == ""
		strapped := !o.HideUnconnected && o.Ties[p.Ref][pn.Name] == symbol.TieCathode
		if !(o.HideUnconnected && nc) && !strapped {
			keep = append(keep, pn)
		}
	}
	if len(keep) == len(p.Pins) {
		return p
	}
	q := *p
	q.Pins = keep
	return &q
}

// marksOf is what the symbol of a part shows beyond its netlist entry:
// its merged presets, its static electrodes' ties, and the windings the
// sheet's capacitors tune (so one adjustable core is marked on the tuned
// winding, not on a feedback or link winding drawn first).
func (ly *state) marksOf(p *graph.Part) symbol.Marks {
	o := ly.o
	m := symbol.Marks{Preset: len(o.Presets[p.Ref]) > 0}
	m.Ties = o.Ties[p.Ref]
	if p.Kind == graph.Transformer {
		if ly.tuned == nil {
			ly.tuned = tunedWindings(ly.c, Tanks(ly.c))
		}
		m.Tuned = ly.tuned[p.Ref]
	}
	return m
}

// Placed is a symbol at its place on the sheet, for the renderer.
type Placed struct {
	Ref   string
	Part  *graph.Part // nil for the sheet's own input and output flags
	Shape symbol.Shape
	Faded bool
}

// Result is a laid-out sheet.
type Result struct {
	Geom   geom.Sheet
	Placed []Placed
}

// Terminal refs are the flags pare adds for input and output nets that have
// no port part; the prefix cannot occur in a netlist ref.
const (
	inRef  = "@in:"
	outRef = "@out:"
)

// state is the layout in progress.
type state struct {
	c       *graph.Circuit
	o       Options
	cells   []*cell
	rankOf  map[string]int // ref -> layer rank
	netCol  map[string]float64
	stageOf map[string]int
	before  map[string]bool // shunts placed just before their active part
	// the columns of decouplers at a winding's foot (markFeet)
	footCol  map[string]int
	refCell  map[string]*cell // the cells by ref, for the stage spread
	netCount map[string]int
	frames   []geom.Frame
	// orientation search: fixed turns by ref, and refs on crossing nets
	turns    map[string]int
	crossing map[string]bool
	// returns are the bias points bypassed to chassis (BiasReturns)
	returns map[string]bool
	free    bool // no common signal line: every part lines up along its nets
	// shortFirst routes the nets shortest first rather than most pins first
	shortFirst bool
	// slot is, per ref a stage template places, where (template.go), for
	// orienting it before the template moves it
	slot map[string]tplSlot
	// slotMates are, per template anchor, the cells its template slots, in
	// cell order: the orientation scores ask for a part's template mates
	// once per part, and scanning every cell for them grew with the square
	// of a whole set
	slotMates map[*cell][]*cell
	// pinCells are the cells on each net by any pin (cellsOn), built on
	// first use: the cells and their pins stay as made while a layout runs
	pinCells map[string][]*cell
	// slotNetSum sums, per net, the columns of its pins' parts, a templated
	// part's at its slot
	slotNetSum map[string]float64
	// tplMoved are the refs a template moved; tplOff those whose template
	// is not let orient them (a first placement left them where they were)
	tplMoved, tplOff map[string]bool
	// standsOf is stands, once worked out.
	standsOf map[string]string
	// frameStage is the stage (index into Options.Frames) of each frame drawn
	frameStage []int
	// tankOf is, per capacitor across a winding, the winding (tankplace.go)
	tankOf map[*cell]tankAt
	// tuned is, per transformer ref, the ends of its windings with a
	// capacitor across them (marksOf), found on first use
	tuned map[string][][2]string
	// bridges are the four-diode bridges of the supply frames, drawn as
	// diamonds; supplyPorts the mains ports that open a supply's flow
	// rather than stand at the sheet's edge (supplyflow.go)
	bridges     []bridge
	supplyPorts map[string]bool
	// quietIn are the quiet nets entering a row by a connector from an
	// earlier row (quietConnectors)
	quietIn map[string]bool
	// supplyRanked are the refs ranked along a supply's flow: the only
	// unframed parts a supply frame's stage is passed on to (stages)
	supplyRanked map[string]bool
}

// signalNets of a cell: the nets of its pins that are wired. A cell's part
// and the circuit's roles never change while it is placed, and placement
// asks for them again and again, so they are found once per cell; the
// slice is shared: read it, never change it.
func (ly *state) signalNets(cl *cell) []string {
	if cl.sigDone {
		return cl.sig
	}
	var out []string
	for _, pn := range cl.part.Pins {
		if pn.Net != notConnected && pn.Net != "" && !ly.c.RoleOf(pn.Net).IsACGround() {
			out = append(out, pn.Net)
		}
	}
	cl.sig, cl.sigDone = out[:len(out):len(out)], true
	return cl.sig
}
