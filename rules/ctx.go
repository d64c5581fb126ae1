package rules

import (
	"fmt"

	"pare/graph"
)

// Ctx is a reduction in progress: the circuit being rewritten and what the
// rule engine adds to it (the ratio and level in force, the nets each step
// dropped, the nets grounded so far, and the problems found in the input).
// Every lookup and every edit is the circuit's own (graph's editing API and
// its connection index, kept current by the edits), so rules ask "what is on
// this net" in time proportional to the answer.
type Ctx struct {
	c        *graph.Circuit
	orig     *graph.Circuit // the input (after a focus cut), for describing parts as written
	ratio    float64
	level    Level
	dropped  []string        // nets the edits of the current step deleted
	grounded map[string]bool // nets (by the names they had) joined to ground
	// newGround lists the nets the current step added to grounded, for
	// undoing a refused step.
	newGround []string
	errs      graph.ErrorList
	errSeen   map[string]bool
	// focusPorts are the ports a focus cut made: they mark where the
	// signal enters and leaves the stage even when no declared end is left.
	focusPorts map[string]bool
	// rx indexes rxOf's regions for the band judgements: a whole set has a
	// region per channel, and walking them all per part made the
	// reduction quadratic in the set. A join renames nets in the regions'
	// lists, which Join follows; a refused step puts another circuit in c.
	rx   *graph.RegionIndex
	rxOf *graph.Circuit
	// ends is the set of declared ends of endsOf for IsEnd, kept by Join.
	ends   map[string]bool
	endsOf *graph.Circuit
}

func newCtx(c *graph.Circuit, ratio float64, level Level) *Ctx {
	return &Ctx{c: c, ratio: ratio, level: level, grounded: map[string]bool{}, errSeen: map[string]bool{}}
}

// Circuit is the circuit being reduced.
func (x *Ctx) Circuit() *graph.Circuit { return x.c }

// Ratio is the bypass ratio in force.
func (x *Ctx) Ratio() float64 { return x.ratio }

// Conns lists the terminals on a net, by ref then pin.
func (x *Ctx) Conns(net string) []graph.Conn { return x.c.ConnsOf(net) }

// Part returns a part by ref, or nil.
func (x *Ctx) Part(ref string) *graph.Part { return x.c.Part(ref) }

// Net returns a net by name, or nil.
func (x *Ctx) Net(name string) *graph.Net { return x.c.Net(name) }

// RoleOf is the role of a net; unknown nets are signal nets.
func (x *Ctx) RoleOf(name string) graph.Role { return x.c.RoleOf(name) }

// IsACGround reports whether a net is at AC ground by its role (ground, or a
// rail assumed stiff).
func (x *Ctx) IsACGround(net string) bool { return x.RoleOf(net).IsACGround() }

// IsEnd reports whether a net is a declared signal input or output of the
// circuit or of a region (graph.Circuit.IsEnd). The rules ask it of nearly
// every part they are offered, and a whole set declares ends per channel:
// the answer comes from a set of the ends, taken once and kept by Join.
func (x *Ctx) IsEnd(net string) bool {
	if x.endsOf != x.c {
		x.ends, x.endsOf = map[string]bool{}, x.c
		for _, n := range x.c.Inputs {
			x.ends[n] = true
		}
		for _, n := range x.c.Outputs {
			x.ends[n] = true
		}
		for _, r := range x.c.Regions {
			x.ends[r.Input], x.ends[r.Output] = true, true
		}
	}
	return x.ends[net]
}

// Ends gives the nets of a two-terminal part's first two pins, swapped when flip is set.
func Ends(p *graph.Part, flip bool) (string, string) {
	if len(p.Pins) < 2 {
		return "", ""
	}
	a, b := p.Pins[0].Net, p.Pins[1].Net
	if flip {
		return b, a
	}
	return a, b
}

// ground returns the name of the circuit's ground net, creating "gnd" when
// there is none.
func (x *Ctx) ground() string { return x.c.GroundNet() }

// fail records a problem with the input that stops the reduction (a part
// with no band where a rule needs one); each is reported once.
func (x *Ctx) fail(pos graph.Pos, format string, args ...any) {
	msg := fmt.Sprintf(format, args...)
	if x.errSeen[msg] {
		return
	}
	x.errSeen[msg] = true
	x.errs.Add(pos, "%s", msg)
}

// ---- edits: each delegates to graph's editing API and notes what it dropped ----

// Remove takes a part out of the circuit; nets it leaves empty go too.
func (x *Ctx) Remove(p *graph.Part) {
	dropped, _ := x.c.RemovePart(p.Ref)
	x.dropped = append(x.dropped, dropped...)
}

// Add puts a part into the circuit, creating the nets its pins name.
func (x *Ctx) Add(p *graph.Part) { x.c.AddPart(p) }

// DropPin removes one terminal from a part (a static electrode).
func (x *Ctx) DropPin(p *graph.Part, name string) {
	x.dropped = append(x.dropped, x.c.DropPin(p.Ref, name)...)
}

// Unconnect moves a terminal to "nc", the netlist's "not connected".
func (x *Ctx) Unconnect(p *graph.Part, name string) {
	x.dropped = append(x.dropped, x.c.Unconnect(p.Ref, name)...)
}

// Join moves every terminal on net gone onto net keep and deletes gone,
// with graph.Circuit.JoinNets' rules for roles, labels, inputs, outputs and
// regions.
func (x *Ctx) Join(keep, gone string) {
	x.c.JoinNets(keep, gone)
	if x.rx != nil && x.rxOf == x.c {
		x.rx.Joined(keep, gone)
	}
	if x.endsOf == x.c && keep != gone && x.ends[gone] {
		delete(x.ends, gone) // JoinNets renamed gone to keep in every end
		x.ends[keep] = true
	}
}

// undo puts the circuit back as it was before a refused step
// (graph.Journal.Undo) with what the context keeps beside it: a refused
// step grounded nothing, so the log's AC-ground list (and the note's "At
// AC ground") must not name its nets, and the index of the regions, which
// followed the step's joins, is taken afresh.
func (x *Ctx) undo(jr *graph.Journal) {
	jr.Undo()
	for _, n := range x.newGround {
		delete(x.grounded, n)
	}
	x.newGround = x.newGround[:0]
	x.rx, x.rxOf = nil, nil
	x.endsMoved()
}

// endsMoved drops the set of ends after a direct write to the circuit's
// end lists (the focus cut, the finish), which Join does not see.
func (x *Ctx) endsMoved() { x.ends, x.endsOf = nil, nil }

// regionOf is the region a part of the circuit being reduced works in
// (graph.Circuit.RegionOf), through the index of its regions.
func (x *Ctx) regionOf(p *graph.Part) *graph.Region {
	if x.rx == nil || x.rxOf != x.c {
		x.rx, x.rxOf = x.c.RegionIndex(), x.c
	}
	return x.rx.RegionOf(p)
}

// GroundNet joins a net to the ground net and remembers it as AC ground. A
// net fed from a rail through a resistor or choke is marked as a decoupled
// rail first (graph.Circuit.MarkDecoupled), so that its terminals are still
// drawn returning to that rail, not to chassis.
func (x *Ctx) GroundNet(net string) string {
	g := x.ground()
	if !x.grounded[net] {
		x.grounded[net] = true
		x.newGround = append(x.newGround, net)
	}
	x.c.MarkDecoupled(net)
	x.Join(g, net)
	return g
}

// ChooseKeep decides which of two nets keeps its name when they are joined
// (graph.Circuit.ChooseKeep).
func (x *Ctx) ChooseKeep(a, b string) (keep, gone string) { return x.c.ChooseKeep(a, b) }
