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
// first, with one round of rip-up and reroute; a net that still cannot be
// wired is drawn with net-name flags at its pins.
package layout

import (
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"pare/graph"
	"pare/graph/value"
	"pare/render/geom"
	"pare/render/symbol"
)

// Frame is a stage to be framed: its title lines and the refs it holds.
type Frame struct {
	Title, Subtitle string
	Parts           []string
}

// Options says what to draw.
type Options struct {
	Style symbol.Style
	// Faded refs are drawn faded; Merged maps a ref to the part it went into.
	Faded  map[string]bool
	Merged map[string]string
	Frames []Frame
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
}

// notConnected is the netlist format's net for a terminal that is really not
// connected (docs/netlist.md): it never joins the pins on it, so it is never
// wired, ranked or checked as a net.
const notConnected = "nc"

// drawnPart is the part as its symbol shows it: with HideUnconnected, a
// valve without its electrodes on "nc".
func (o Options) drawnPart(p *graph.Part) *graph.Part {
	if !o.HideUnconnected || p.Kind != graph.Valve {
		return p
	}
	var keep []graph.Pin
	for _, pn := range p.Pins {
		if pn.Net != notConnected && pn.Net != "" {
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

func formatG(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// Terminal refs are the flags pare adds for input and output nets that have
// no port part; the prefix cannot occur in a netlist ref.
const (
	inRef  = "@in:"
	outRef = "@out:"
)

func realPart(cl *cell) *graph.Part {
	if strings.HasPrefix(cl.ref, "@") {
		return nil
	}
	return cl.part
}

// makeCells makes a cell for every part, plus input and output flags for
// signal nets named in Inputs and Outputs that no port part sits on.
func makeCells(c *graph.Circuit, o Options) []*cell {
	var out []*cell
	ported := map[string]bool{}
	for _, p := range c.Parts {
		if p.Kind == graph.Port {
			for _, pn := range p.Pins {
				ported[pn.Net] = true
			}
		}
	}
	for _, p := range c.Parts {
		cl := &cell{part: p, ref: p.Ref, faded: o.Faded[p.Ref]}
		cl.label.Owner, cl.label.Faded = p.Ref, cl.faded
		cl.label.Lines = labelLines(p, o)
		out = append(out, cl)
	}
	term := func(prefix, net string, in bool) {
		if ported[net] || c.RoleOf(net).IsACGround() {
			return
		}
		ported[net] = true
		text := net
		if n := c.Net(net); n != nil && n.Label != "" {
			text = n.Label
		}
		p := &graph.Part{Ref: prefix + net, Kind: graph.Port, Label: text, Pins: []graph.Pin{{Name: "1", Net: net}}}
		cl := &cell{part: p, ref: p.Ref, edge: 1}
		if in {
			cl.edge = -1
		}
		out = append(out, cl)
	}
	for _, n := range c.Inputs {
		term(inRef, n, true)
	}
	for _, n := range c.Outputs {
		term(outRef, n, false)
	}
	return out
}

// labelLines is the text beside a symbol: ref and value in the IEC 60062
// letter code, then a small line with the gang and where a merged part went.
func labelLines(p *graph.Part, o Options) []string {
	first := p.Ref
	add := func(s string) {
		if s != "" {
			first += " " + s
		}
	}
	switch p.Kind {
	case graph.Resistor, graph.Pot:
		add(value.FormatRange(p.Value, value.Ohm, value.Code))
	case graph.Capacitor:
		add(value.FormatRange(p.Value, value.Farad, value.Code))
	case graph.Inductor:
		add(withUnit(value.Format(p.Inductance(), value.Henry, value.Code), "H"))
	case graph.Crystal:
		add(value.Format(p.Value.Max, value.Hertz, value.Code))
	case graph.Transformer:
		ks := []string{}
		for _, k := range p.Coupling {
			ks = append(ks, "k="+formatG(k.K))
		}
		if len(ks) > 0 && len(ks) <= 2 {
			add(strings.Join(dedupe(ks), " "))
		}
	case graph.Valve, graph.BJT, graph.FET:
		add(p.Type)
	case graph.Switch:
		if p.Set > 0 {
			add("pos " + formatG(p.Set))
		}
	case graph.Generic:
		add(p.Label)
	case graph.Port:
		return nil
	}
	var second []string
	if p.Gang != "" {
		second = append(second, "gang "+p.Gang)
	}
	if to, ok := o.Merged[p.Ref]; ok && to != p.Ref {
		second = append(second, "\u2192 "+to)
	}
	if len(second) > 0 {
		return []string{first, strings.Join(second, ", ")}
	}
	return []string{first}
}

// withUnit appends the unit where the letter code has no letter of its own
// ("2" henries reads as "2H").
func withUnit(code, unit string) string {
	for _, r := range code {
		if r < '0' || r > '9' {
			if r != '.' {
				return code
			}
		}
	}
	return code + unit
}

func dedupe(s []string) []string {
	out := s[:0]
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			out = append(out, v)
		}
	}
	return out
}

// labelPrefs orders the label candidates: beside vertical parts, above
// horizontal ones, and away from the side most pins leave on.
func labelPrefs(cl *cell) []geom.Dir {
	if cl.part != nil && cl.part.IsActive() {
		return []geom.Dir{geom.Up, geom.Down, geom.Right, geom.Left}
	}
	b := cl.shape.Box
	if b.H() > b.W() {
		return []geom.Dir{geom.Right, geom.Left, geom.Up, geom.Down}
	}
	return []geom.Dir{geom.Up, geom.Down, geom.Right, geom.Left}
}

// state is the layout in progress.
type state struct {
	c        *graph.Circuit
	o        Options
	cells    []*cell
	rankOf   map[string]int // ref -> layer rank
	netCol   map[string]float64
	stageOf  map[string]int
	before   map[string]bool // shunts placed just before their active part
	netCount map[string]int
	frames   []geom.Frame
	// orientation search: fixed turns by ref, and refs on crossing nets
	turns    map[string]int
	crossing map[string]bool
	free     bool // no common signal line: every part lines up along its nets
	// shortFirst routes the nets shortest first rather than most pins first
	shortFirst bool
	// frameStage is the stage (index into Options.Frames) of each frame drawn
	frameStage []int
}

// growFrames widens each frame (a copy of the placed frames) to hold the
// wires of nets that lie wholly inside its stage, so that a detour never
// leaves its own frame.
func (ly *state) growFrames(g *geom.Sheet) []geom.Frame {
	frames := append([]geom.Frame(nil), ly.frames...)
	if len(frames) == 0 {
		return frames
	}
	stageOfNet := map[string]int{}
	for _, cl := range ly.cells {
		s, ok := ly.stageOf[cl.ref]
		if !ok || cl.edge != 0 {
			s = -1
		}
		for _, p := range cl.shape.Pins {
			if prev, seen := stageOfNet[p.Net]; seen && prev != s {
				s = -1
			}
			stageOfNet[p.Net] = s
		}
	}
	frameOf := map[int]int{}
	for i, s := range ly.frameStage {
		frameOf[s] = i
	}
	for _, w := range g.Wires {
		s, ok := stageOfNet[w.Net]
		f, drawn := frameOf[s]
		if !ok || s < 0 || !drawn {
			continue
		}
		// grow up or down only: frames stand side by side, so growing
		// sideways could run one into the next
		fb := &frames[f].Box
		for _, seg := range w.Segs {
			sb := seg.Box()
			if sb.X1 < fb.X0 || sb.X0 > fb.X1 {
				continue
			}
			// a grid step and a half: the edge never runs along the wire
			// half a step from it
			fb.Y0 = math.Min(fb.Y0, sb.Y0-framePad-0.5)
			fb.Y1 = math.Max(fb.Y1, sb.Y1+framePad+0.5)
		}
	}
	return frames
}

// signalNets of a cell: the nets of its pins that are wired.
func (ly *state) signalNets(cl *cell) []string {
	var out []string
	for _, pn := range cl.part.Pins {
		if pn.Net != notConnected && pn.Net != "" && !ly.c.RoleOf(pn.Net).IsACGround() {
			out = append(out, pn.Net)
		}
	}
	return out
}

// rank gives every cell a layer: the breadth-first distance from the input
// nets over shared signal nets. Pieces the inputs do not reach continue to
// the right; parts with no signal net sit next to a part sharing a rail.
func (ly *state) rank() {
	byNet := map[string][]*cell{} // for the ports' sides below
	for _, cl := range ly.cells {
		for _, n := range ly.signalNets(cl) {
			byNet[n] = append(byNet[n], cl)
		}
	}
	rank := ly.signalRank()
	// parts on rails only: beside the lowest-ranked part sharing a non-ground net
	railNets := map[string][]*cell{}
	for _, cl := range ly.cells {
		for _, pn := range cl.part.Pins {
			if ly.c.RoleOf(pn.Net) != graph.Ground && pn.Net != notConnected {
				railNets[pn.Net] = append(railNets[pn.Net], cl)
			}
		}
	}
	for _, cl := range ly.cells {
		if _, ok := rank[cl.ref]; ok {
			continue
		}
		best := -1
		for _, pn := range cl.part.Pins {
			for _, nb := range railNets[pn.Net] {
				if r, ok := rank[nb.ref]; ok && nb != cl && (best < 0 || r < best) {
					best = r
				}
			}
		}
		if best < 0 {
			best = 0
		}
		rank[cl.ref] = best
	}
	// the parts from an active part's common terminal to ground (cathode or
	// emitter resistor and bypass) stand under it, in its layer
	common := map[string]int{}
	for _, cl := range ly.cells {
		if cl.part.IsActive() {
			if pin := cl.part.PinWithRole(graph.RoleCommon); pin != "" {
				n := cl.part.NetOf(pin)
				if !ly.c.RoleOf(n).IsACGround() {
					common[n] = rank[cl.ref]
				}
			}
		}
	}
	for _, cl := range ly.cells {
		if cl.part.IsActive() {
			continue
		}
		nets := ly.signalNets(cl)
		if len(nets) == 1 && len(cl.part.Pins) == 2 {
			if r, ok := common[nets[0]]; ok {
				rank[cl.ref] = r
			}
		}
	}
	// a shunt from an active part's control electrode to AC ground (a grid
	// leak, a base bias resistor) stands in a column of its own just before
	// the active part, hanging from the wire into the grid, not stacked
	// under the valve with the cathode parts
	control := map[string]int{}
	for _, cl := range ly.cells {
		if cl.part.IsActive() {
			if pin := cl.part.PinWithRole(graph.RoleControl); pin != "" {
				if n := cl.part.NetOf(pin); n != "" && n != notConnected && !ly.c.RoleOf(n).IsACGround() {
					if r, ok := control[n]; !ok || rank[cl.ref] < r {
						control[n] = rank[cl.ref]
					}
				}
			}
		}
	}
	ly.before = map[string]bool{}
	for _, cl := range ly.cells {
		if cl.part.IsActive() || len(cl.part.Pins) != 2 || cl.part.Kind == graph.Port {
			continue
		}
		nets := ly.signalNets(cl)
		if len(nets) != 1 {
			continue
		}
		if r, ok := control[nets[0]]; ok && r == rank[cl.ref] {
			ly.before[cl.ref] = true
		}
	}
	for _, cl := range ly.cells {
		if d, ok := ly.turns[shiftKey+cl.ref]; ok && rank[cl.ref]+d >= 0 {
			rank[cl.ref] += d
		}
	}
	ly.rankOf = rank
	// Output flags and ports on output nets go to the right edge, ports on
	// input nets to the left; other ports by the side their net is nearer.
	maxRank := 0
	for _, r := range rank {
		maxRank = max(maxRank, r)
	}
	outputs := map[string]bool{}
	for _, n := range ly.c.Outputs {
		outputs[n] = true
	}
	inputs := map[string]bool{}
	for _, n := range ly.c.Inputs {
		inputs[n] = true
	}
	for _, cl := range ly.cells {
		if cl.part.Kind != graph.Port || cl.edge != 0 || len(cl.part.Pins) == 0 {
			continue
		}
		net := cl.part.Pins[0].Net
		switch {
		case inputs[net]:
			cl.edge = -1
		case outputs[net]:
			cl.edge = 1
		default:
			lo := maxRank
			for _, nb := range byNet[net] {
				if nb != cl {
					lo = min(lo, rank[nb.ref])
				}
			}
			if len(byNet[net]) <= 1 || 2*lo <= maxRank {
				cl.edge = -1
			} else {
				cl.edge = 1
			}
		}
	}
	ly.assignColumns()
}

// signalRank is the breadth-first distance of every cell from the signal
// input nets over shared signal nets (graph.Walk): the parts on an input at
// 1, input flags and ports there at 0; each piece the inputs do not reach
// follows, from its first cell, one layer after the highest so far.
func (ly *state) signalRank() map[string]int {
	parts := make([]*graph.Part, len(ly.cells))
	for i, cl := range ly.cells {
		parts[i] = cl.part
	}
	w := graph.NewWalk(graph.NewView(graph.NewIndex(parts, nil), parts))
	w.Follow = func(n string) bool { return n != notConnected && n != "" && !ly.c.RoleOf(n).IsACGround() }
	var inputs []string
	for _, in := range ly.c.Inputs {
		if w.Follow(in) {
			inputs = append(inputs, in)
		}
	}
	w.FromNets(inputs, 1)
	rank := map[string]int{}
	maxR := 0
	collect := func() {
		for _, cl := range ly.cells {
			if r, ok := w.PartDist(cl.part); ok {
				if _, done := rank[cl.ref]; !done {
					rank[cl.ref] = r
					if cl.part.Kind == graph.Port && slices.Contains(inputs, cl.part.NetOf("1")) {
						rank[cl.ref] = 0 // an input flag or port (cl.edge < 0 is one)
					}
					maxR = max(maxR, rank[cl.ref])
				}
			}
		}
	}
	collect()
	for _, cl := range ly.cells {
		if _, ok := rank[cl.ref]; !ok && len(ly.signalNets(cl)) > 0 {
			w.FromPart(cl.part, maxR+1)
			collect()
		}
	}
	return rank
}

// assignColumns turns ranks (and stages, when frames are given) into columns.
func (ly *state) assignColumns() {
	stage := map[string]int{}
	for i, f := range ly.o.Frames {
		for _, r := range f.Parts {
			if _, ok := stage[r]; !ok {
				stage[r] = i
			}
		}
	}
	stageOf := func(cl *cell) (int, bool) {
		if s, ok := stage[cl.ref]; ok {
			return s, true
		}
		if to, ok := ly.o.Merged[cl.ref]; ok {
			if s, ok := stage[to]; ok {
				return s, true
			}
		}
		return 0, false
	}
	st := map[string]int{}
	if len(ly.o.Frames) > 0 {
		// unframed parts join the stage of their nearest framed neighbour
		byNet := map[string][]*cell{}
		for _, cl := range ly.cells {
			for _, n := range ly.signalNets(cl) {
				byNet[n] = append(byNet[n], cl)
			}
		}
		var queue []*cell
		for _, cl := range ly.cells {
			if s, ok := stageOf(cl); ok && cl.part.Kind != graph.Port {
				st[cl.ref] = s
				queue = append(queue, cl)
			}
		}
		for len(queue) > 0 {
			cl := queue[0]
			queue = queue[1:]
			for _, n := range ly.signalNets(cl) {
				for _, nb := range byNet[n] {
					if _, ok := st[nb.ref]; !ok && nb.edge == 0 {
						st[nb.ref] = st[cl.ref]
						queue = append(queue, nb)
					}
				}
			}
		}
	}
	if len(ly.o.Frames) > 0 {
		// parts no frame reaches get columns of their own after the frames
		for _, cl := range ly.cells {
			if _, ok := st[cl.ref]; !ok && cl.edge == 0 {
				st[cl.ref] = len(ly.o.Frames)
			}
		}
	}
	type key struct{ stage, rank int }
	keys := map[key]bool{}
	for _, cl := range ly.cells {
		if cl.edge != 0 {
			continue
		}
		keys[key{st[cl.ref], ly.column(cl)}] = true
	}
	list := make([]key, 0, len(keys))
	for k := range keys {
		list = append(list, k)
	}
	sort.Slice(list, func(i, j int) bool {
		if list[i].stage != list[j].stage {
			return list[i].stage < list[j].stage
		}
		return list[i].rank < list[j].rank
	})
	colOf := map[key]int{}
	for i, k := range list {
		colOf[k] = i + 1
	}
	for _, cl := range ly.cells {
		switch cl.edge {
		case -1:
			cl.col = 0
		case 1:
			cl.col = len(list) + 1
		default:
			cl.col = colOf[key{st[cl.ref], ly.column(cl)}]
		}
	}
	ly.netCol = map[string]float64{}
	sum, cnt := map[string]float64{}, map[string]float64{}
	ly.netCount = map[string]int{}
	for _, cl := range ly.cells {
		for _, pn := range cl.part.Pins {
			if pn.Net == notConnected {
				continue
			}
			sum[pn.Net] += float64(cl.col)
			cnt[pn.Net]++
			ly.netCount[pn.Net]++
		}
	}
	for n, s := range sum {
		ly.netCol[n] = s / cnt[n]
	}
	ly.stageOf = st
}

// column is a cell's place along the signal flow: two per rank, the first
// for the shunts that stand before an active part's control electrode.
func (ly *state) column(cl *cell) int {
	c := 2 * ly.rankOf[cl.ref]
	if ly.before[cl.ref] {
		c--
	}
	return c
}

// orient picks each cell's orientation by scoring where its pins point:
// ground and bias down, rails up, signal pins towards the parts they lead to.
func (ly *state) orient() {
	for _, cl := range ly.cells {
		base := symbol.For(ly.o.drawnPart(cl.part), ly.o.Style)
		if cl.part.Kind == graph.Port && len(cl.part.Pins) == 1 {
			in := cl.edge <= 0
			base = symbol.Flag(cl.part.Label, in)
			for i := range base.Pins {
				base.Pins[i].Net = cl.part.Pins[0].Net
			}
			cl.shape = base
			continue
		}
		best, bestScore := base, math.Inf(-1)
		cl.turns = base.Turns
		for i, o := range base.Turns {
			s := base.Oriented(o)
			score := ly.score(cl, s)
			if t, ok := ly.turns[cl.ref]; ok && upright(ly.c, base.Oriented(base.Turns[t])) {
				score = 0
				if t == i {
					score = 1
				}
			}
			if score > bestScore+1e-9 {
				best, bestScore, cl.turn = s, score, i
			}
		}
		cl.shape = best
	}
}

// upright says whether a symbol keeps grounds from pointing up and rails
// from pointing down: the search for fewer crossings may only choose such.
func upright(c *graph.Circuit, s symbol.Shape) bool {
	for _, p := range s.Pins {
		switch c.RoleOf(p.Net) {
		case graph.Ground, graph.Bias:
			if p.Dir == geom.Up {
				return false
			}
		case graph.Supply, graph.Heater:
			if p.Dir == geom.Down {
				return false
			}
		}
	}
	return true
}

func (ly *state) score(cl *cell, s symbol.Shape) float64 {
	score := 0.0
	horizontalSignal := 0
	signal := 0
	for _, p := range s.Pins {
		switch ly.c.RoleOf(p.Net) {
		case graph.Ground, graph.Bias:
			switch p.Dir {
			case geom.Down:
				score += 4
			case geom.Up:
				score -= 4
			default:
				score -= 1
			}
		case graph.Supply, graph.Heater:
			switch p.Dir {
			case geom.Up:
				score += 4
			case geom.Down:
				score -= 4
			default:
				score -= 1
			}
		default:
			signal++
			// the mean column of the net without this part
			n := ly.netCol[p.Net]
			here := float64(cl.col)
			others := float64(ly.netCount[p.Net] - 1)
			if others > 0 {
				tot := n*(others+1) - here
				n = tot / others
			}
			switch {
			case n < here-0.01:
				if p.Dir == geom.Left {
					score += 2
				} else if p.Dir == geom.Right {
					score -= 2
				}
			case n > here+0.01:
				if p.Dir == geom.Right {
					score += 2
				} else if p.Dir == geom.Left {
					score -= 2
				}
			}
			if p.Dir == geom.Left || p.Dir == geom.Right {
				horizontalSignal++
			}
		}
	}
	if signal == len(s.Pins) && horizontalSignal == signal {
		score += 1 // a part in the signal path lies along it
	}
	return score
}
