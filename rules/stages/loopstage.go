package stages

import (
	"fmt"
	"slices"

	"pare/graph"
	"pare/graph/figure"
)

// Oscillators found by their loop. A pattern describes one drawing of a
// topology; a real set may couple its feedback another way (a link winding
// to the emitter instead of a tap, a bridge arm on the cathode). Whatever
// the drawing, a device whose loop gain reaches 0 dB at 0° of loop phase
// oscillates, so every active part that no oscillator or mixer stage holds
// has its loop solved: one in no stage becomes an oscillator stage of its
// own ("Oscillator, feedback through T1"); one inside another stage (an
// amplifier) gets a flag, for an amplifier that oscillates is a fault.

// loopTopology is the topology id of an oscillator found by its loop.
const loopTopology = "oscillator-loop"

// loopStages returns the stages of oscillators no pattern named, and flags
// the stages that hold a device of such a loop. The loops are solved on
// lc (the original circuit); the stages' parts come from the reduced c.
func loopStages(c, lc *graph.Circuit, acg map[string]bool, tops []*found) []*found {
	claimed := map[string]*found{}
	named := map[string]bool{} // devices an oscillator or mixer stage holds
	var walk func(f *found)
	walk = func(f *found) {
		for _, r := range f.Parts {
			if _, ok := claimed[r]; !ok {
				claimed[r] = f
			}
			if f.group == "oscillator" || f.group == "mixer" {
				named[r] = true
			}
		}
		for _, s := range f.subs {
			walk(s)
		}
	}
	for _, f := range tops {
		walk(f)
	}
	var out []*found
	for _, p := range c.Parts {
		if !p.IsActive() || named[p.Ref] {
			continue
		}
		l, err := loopOf(lc, p.Ref)
		if err != nil {
			continue // no loop to speak of: the stage it is in says the rest
		}
		_, _, _, mMax, ok := l.Range()
		if !ok || mMax < 0 {
			continue
		}
		if f, in := claimed[p.Ref]; in {
			f.Loop = append(f.Loop, l)
			f.Flags = append(f.Flags, fmt.Sprintf("%s oscillates: loop gain %+.1f dB with 0° loop phase: an amplifier that oscillates, or an oscillator no pattern names", p.Ref, mMax))
			slices.Sort(f.Flags)
			continue
		}
		parts, through := loopParts(c, acg, p, claimed)
		st := &Stage{Topology: loopTopology, group: "oscillator", Family: deviceFamily(p),
			Parts: parts, Figures: figure.List{}, Loop: []Loop{l}}
		st.Title = expandTitle("Oscillator, feedback through "+through+" ({family})", st.Family)
		st.Flags = loopFlags(lc, st, l)
		slices.Sort(st.Flags)
		f := &found{Stage: st, set: map[string]bool{}}
		for _, r := range parts {
			f.set[r] = true
			claimed[r] = f
		}
		out = append(out, f)
	}
	return out
}

// loopParts gathers an unnamed oscillator's parts: the device, and the
// parts no stage holds that touch its signal nets, going on through a
// winding to the nets of the transformer's other windings (the feedback
// winding's far side). It names what the feedback goes through: the
// transformer or coil, else "an RC network".
func loopParts(c *graph.Circuit, acg map[string]bool, dev *graph.Part, claimed map[string]*found) ([]string, string) {
	ground := func(net string) bool { return acg[net] || c.RoleOf(net).IsACGround() }
	nets := map[string]bool{}
	for _, pin := range dev.Pins {
		if !ground(pin.Net) {
			nets[pin.Net] = true
		}
	}
	in := map[string]bool{dev.Ref: true}
	through := ""
	for range 2 { // the device's nets, then one step beyond a winding
		grown := false
		for _, q := range c.Parts {
			if in[q.Ref] || q.IsActive() || !touches(q, nets) {
				continue
			}
			if claimed[q.Ref] != nil {
				// Another stage's winding (the tank's transformer, named
				// by its own pattern) still carries the feedback.
				if q.Kind == graph.Transformer && through == "" {
					through = q.Ref
				}
				continue
			}
			in[q.Ref] = true
			if q.Kind == graph.Transformer || q.Kind == graph.Inductor {
				if through == "" || q.Kind == graph.Transformer {
					through = q.Ref
				}
				for _, pin := range q.Pins {
					if !ground(pin.Net) && !nets[pin.Net] {
						nets[pin.Net], grown = true, true
					}
				}
			}
		}
		if !grown {
			break
		}
	}
	if through == "" {
		through = "an RC network"
	}
	var refs []string
	for r := range in {
		refs = append(refs, r)
	}
	slices.Sort(refs)
	return refs, through
}

func touches(p *graph.Part, nets map[string]bool) bool {
	for _, pin := range p.Pins {
		if nets[pin.Net] {
			return true
		}
	}
	return false
}

func deviceFamily(p *graph.Part) string {
	switch p.Kind {
	case graph.Valve:
		return "valve"
	case graph.BJT:
		return "bjt"
	case graph.FET:
		return "fet"
	}
	return "passive"
}
