package pipeline

import (
	"slices"
	"sort"

	"pare/graph"
	"pare/render"
)

// withDividersApart is the reduced circuit for its sheet with every merged
// resistor whose members return to different places (a supply or bias
// line and chassis, or two lines), drawn as those members again, each from
// the merged part's signal end to its own return (the line's tag, or an
// earth). The reduction merges a bias divider's halves, R2 33k from a
// decoupled line and R3 22k to chassis, into one 13k2 on the line's tag,
// and a figure or a proof wants it so; on a sheet that part reads as a
// 13k2 fed from the line, which sets a bias the set does not have (review15
// b01: "R2 13k2 ≡ R2, R3" under "+12 V via R1, +11.73 V"). Drawn apart the
// reader sees the divider as built and where each half goes. Only the
// drawing changes: the reduced netlist, its figures and its fixpoint stay
// merged. So does a merged part a stage template places (frames): the
// template draws it as one of its pattern's parts (a phase-shift ladder's
// last leg, whose figure reads the two halves as one), and its halves
// drawn round that slot tangled the ladder. split maps each merged ref
// drawn apart to its members.
func (r *Result) withDividersApart(c *graph.Circuit, frames []render.Frame) (out *graph.Circuit, split map[string][]string) {
	slotted := map[string]bool{}
	for _, f := range frames {
		for _, pl := range f.Places {
			slotted[pl.Ref] = true
		}
	}
	lines := r.supplyLines()
	for _, p := range c.Parts {
		if slotted[p.Ref] {
			continue
		}
		members := r.dividerMembers(c, p, lines)
		if members == nil {
			if i := r.bundleRail(p); i >= 0 {
				if out == nil {
					out, split = c.Clone(), map[string][]string{}
				}
				out.Part(p.Ref).Pins[i].Rail = ""
			}
			continue
		}
		if out == nil {
			out, split = c.Clone(), map[string][]string{}
		}
		refs := make([]string, len(members))
		for i, m := range members {
			refs[i] = m.Ref
		}
		sort.Strings(refs)
		split[p.Ref] = refs
		out.RemovePart(p.Ref)
		for _, m := range members {
			out.AddPart(m)
		}
	}
	if out == nil {
		return c, nil
	}
	return out, split
}

// bundleRail is the terminal of the merged part p, drawn merged, that the
// reduction left on the survivor's rail though not every member returned
// there, or -1. Review18 a05's smoothing R2 from the reservoir and bleeder
// R3 to chassis, merged into one 469R, stood under the reservoir's tag and
// read as fed from there alone; its return is drawn to the AC ground the
// reduced netlist names. A part a template places keeps its slot's return.
func (r *Result) bundleRail(p *graph.Part) int {
	if len(p.From) < 2 {
		return -1
	}
	for i, pn := range p.Pins {
		if pn.Rail != "" && !allReturnTo(r.Circuit, p, pn.Rail) {
			return i
		}
	}
	return -1
}

// dividerMembers are the original members of the merged resistor p, each
// moved onto p's two nets with its own return, when they return to
// different places (a line and chassis, or two lines: a bias point fed from
// the supply and from the AGC line); nil when p is not such a merge. A member's return is its end off p's signal end: chassis when it
// was on a ground net, else the line it was on, which must be one the
// drawing knows (Circuit.ReturnOf finds it among the rails). A member whose
// signal end is not p's (a merge across nets the reduction joined) leaves p
// merged: the drawing could not say where that member stands. So does a
// merge on a supply line (lines) whose members return only to one line
// and chassis (a smoothing resistor from the reservoir and the line's
// bleeder, review18 a05's R2 470R and R3 220k): no divider sets a bias
// there, the merged part is the line's source impedance the reduction
// proved, and drawn as its members the reduced sheet showed two parts
// where its netlist holds one. Feeds from two lines are drawn apart.
func (r *Result) dividerMembers(c *graph.Circuit, p *graph.Part, lines map[string]supplyLine) []*graph.Part {
	from := p.Origins()
	if p.Kind != graph.Resistor || len(p.Pins) != 2 || len(from) < 2 {
		return nil
	}
	ret := -1
	for i, pn := range p.Pins {
		if c.RoleOf(pn.Net).IsACGround() {
			ret = i
		}
	}
	if ret < 0 || c.RoleOf(p.Pins[1-ret].Net).IsACGround() {
		return nil
	}
	sig, back := p.Pins[1-ret].Net, p.Pins[ret].Net
	var out []*graph.Part
	returns := map[string]bool{} // "" for chassis
	for _, ref := range from {
		o := r.Circuit.Part(ref)
		if o == nil || o.Kind != graph.Resistor || len(o.Pins) != 2 || c.Part(ref) != nil && ref != p.Ref {
			return nil
		}
		m := o.Clone()
		m.From = nil
		end := -1
		for i, pn := range o.Pins {
			if pn.Net == sig {
				end = i
			}
		}
		if end < 0 {
			return nil
		}
		was := o.Pins[1-end].Net
		m.Pins[end].Rail = ""
		m.Pins[1-end].Net, m.Pins[1-end].Rail = back, ""
		switch {
		case r.Circuit.RoleOf(was) == graph.Ground:
			returns[""] = true
		default:
			m.Pins[1-end].Rail = was
			if n := c.ReturnOf(m.Pins[1-end]); n == nil || n.Name != was || !n.Role.IsRail() {
				return nil
			}
			returns[was] = true
		}
		out = append(out, m)
	}
	if _, line := lines[sig]; line {
		delete(returns, "") // a line's bleeder is no divider's lower half
	}
	if len(returns) < 2 {
		return nil
	}
	return out
}

// framesApart puts the members of each merged part drawn apart in every
// frame that holds the merged part (the stage stands for both halves of
// its divider), with slots of their own where a template is drawn round
// the device they bias (halfSlots).
func framesApart(frames []render.Frame, split map[string][]string, drawn *graph.Circuit) []render.Frame {
	if len(split) == 0 {
		return frames
	}
	for i := range frames {
		var add []string
		for _, ref := range frames[i].Parts {
			add = append(add, split[ref]...)
			frames[i].Places = halfSlots(frames[i].Places, drawn, split[ref], ref)
		}
		if len(add) == 0 {
			continue
		}
		parts := slices.Concat(frames[i].Parts, add)
		sort.Strings(parts)
		frames[i].Parts = slices.Compact(parts)
	}
	return frames
}

// halfSlots stands a divider drawn as its halves (members, merged into
// ref, which no template places: withDividersApart) straight across the
// wire into the device it biases, as a divider is drawn by hand: the half
// to the line above the wire, the half to chassis hanging below it, in one
// column left of the leftmost of the template anchored on that device, so
// the lower half does not stand where the template's parts go (a base
// divider's lower leg where an oscillator's feedback capacitors go).
// Places are unchanged for a divider next to no template's device.
func halfSlots(places []render.Place, drawn *graph.Circuit, members []string, ref string) []render.Place {
	var low, high *graph.Part
	for _, m := range members {
		p := drawn.Part(m)
		if p == nil {
			return places
		}
		if slices.ContainsFunc(p.Pins, func(pn graph.Pin) bool { return pn.Rail == "" && drawn.RoleOf(pn.Net) == graph.Ground }) {
			low = cmpOr(low, p)
		} else {
			high = cmpOr(high, p)
		}
	}
	if low == nil || high == nil || len(members) != 2 {
		return places
	}
	sig := ""
	for _, pn := range low.Pins {
		if !drawn.RoleOf(pn.Net).IsACGround() {
			sig = pn.Net
		}
	}
	for start := 0; start < len(places); {
		end := start + 1
		for end < len(places) && places[end].Ref != places[end].Anchor {
			end++
		}
		a := drawn.Part(places[start].Anchor)
		if a == nil || !a.IsActive() || !slices.ContainsFunc(a.Pins, func(p graph.Pin) bool { return p.Net == sig }) {
			start = end
			continue
		}
		at := render.Place{Anchor: a.Ref, Stand: "vertical"}
		for _, p := range places[start:end] {
			at.Col = min(at.Col, p.Col-1)
		}
		lo, hi := at, at
		lo.Ref, hi.Ref, hi.Col, hi.Row = low.Ref, high.Ref, -1, -1
		return slices.Insert(slices.Clone(places), end, lo, hi)
	}
	return places
}

// cmpOr is a when it is set, else b.
func cmpOr(a, b *graph.Part) *graph.Part {
	if a != nil {
		return a
	}
	return b
}

// ReducedDrawn is the reduced circuit as its sheet draws it, before the
// line voltages join the tags: a merged bias divider drawn as its members
// (withDividersApart). The note's hover pairs the reduced sheet's parts
// with the original's on it.
func (r *Result) ReducedDrawn() *graph.Circuit {
	c, _ := r.withDividersApart(r.withSupplyReturns(r.Reduced), stageFrames(r.Stages, r.Reduced, nil))
	return c
}
