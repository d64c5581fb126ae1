package stages

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// Capacitors inside an oscillator's loop. The coupling patterns take any
// series capacitor between two signal nets for a coupling capacitor; in an
// oscillator that shape is also a padder in series with the tuning
// section, a Colpitts divider's arm, a phase-shift ladder's capacitor or
// the DC block between the tank and the base. Their fault is not a next
// stage pulled off its bias but an oscillator that stops or runs off its
// frequency, and the solver says which: with the capacitor open (taken out
// of a copy of the circuit) the device's loop is solved again at every
// gang setting where it ran.

// loopCapTopology is the topology of a capacitor the open test puts in an
// oscillator's loop.
const loopCapTopology = "oscillator-loop-capacitor"

// loopCapDetune is how far the loop's frequency must move with the
// capacitor open for the capacitor to be part of the frequency-setting
// network: 5 %, more than a core or trimmer pulls back on the dial
// (common practice, no source); a light coupling to a buffer moves it far
// less.
const loopCapDetune = 0.05

// couplingTopologies are the stages the open test may rename.
var couplingTopologies = []string{"coupling-capacitor", "rc-coupling"}

// loopCapacitors renames the coupling stages whose capacitor, opened,
// stops or detunes an oscillating device's loop: "part of Q1's
// oscillator loop", with what the open capacitor does, and no coupling
// corner (a padder or a feedback capacitor sets none).
func loopCapacitors(lp *ac.Loops, out []Stage) {
	lc := lp.Circuit()
	var loops []Loop
	for _, s := range out {
		for _, l := range s.Loop {
			if _, _, _, m, ok := l.Range(); ok && m >= 0 && !slices.ContainsFunc(loops, func(k Loop) bool { return k.Device == l.Device }) {
				loops = append(loops, l)
			}
		}
	}
	if len(loops) == 0 {
		return
	}
	near := map[string]map[string]bool{} // device → its loop's nets, worked out once
	for _, l := range loops {
		near[l.Device] = loopNets(lc, l.Device)
	}
	// A capacitor on a declared input or output is the circuit's coupling
	// to what lies outside it (an aerial, the next stage), whatever it
	// does to a loop the solver closes through an ideal source there. The
	// set is the circuit's, made once: made per stage and loop it grew
	// with the square of a bank.
	ends := map[string]bool{}
	for _, n := range append(slices.Clone(lc.Inputs), lc.Outputs...) {
		ends[n] = true
	}
	for i := range out {
		st := &out[i]
		if !slices.Contains(couplingTopologies, st.Topology) {
			continue
		}
		for _, l := range loops {
			if what, ref := openedLoop(lc, st, l, near[l.Device], ends); what != "" {
				markLoopCap(st, l.Device, ref, what)
				break
			}
		}
	}
}

// openedLoop is what opening a capacitor of stage st does to loop l,
// worded for the stage ("stops the oscillator: …"), and the capacitor;
// "" when no capacitor of the stage matters to the loop. Only capacitors
// on the loop's nets (near) and on none of the circuit's inputs and
// outputs (ends) are tried.
func openedLoop(lc *graph.Circuit, st *Stage, l Loop, near, ends map[string]bool) (what, ref string) {
	for _, r := range st.Parts {
		p := lc.Part(r)
		if p == nil || p.Kind != graph.Capacitor || !touches(p, near) || touches(p, ends) {
			continue
		}
		cp := lc.Clone()
		cp.RemovePart(r)
		lo := ac.NewLoops(cp)
		for _, s := range l.Settings {
			if s.F == 0 || s.MarginDB < 0 {
				continue
			}
			o, err := lo.Find(l.Device, ac.LoopOptions{Options: ac.Options{VarFrac: s.Gang, VarSet: true}})
			if err != nil {
				break // the open part leaves the model unsolvable: say nothing
			}
			place := dialPlace(s.Gang, len(l.Settings))
			switch {
			case o.F == 0 || o.MarginDB < 0:
				return fmt.Sprintf("open, it stops the oscillator%s (loop gain %+.1f dB → %s)", place, s.MarginDB, openGain(o)), r
			case math.Abs(o.F/s.F-1) > loopCapDetune:
				return fmt.Sprintf("open, it detunes the oscillator%s (%s → %s)", place, hzText(s.F), hzText(o.F)), r
			}
		}
	}
	return "", ""
}

// openGain words the loop left with a capacitor open.
func openGain(o ac.Loop) string {
	if o.F == 0 {
		return "no 0° of loop phase"
	}
	return fmt.Sprintf("%+.1f dB", o.MarginDB)
}

// loopNets are the nets within loopHops of a device's own nets through
// passive parts, never crossing AC ground: where its loop's capacitors are.
func loopNets(c *graph.Circuit, ref string) map[string]bool {
	p := c.Part(ref)
	nets := map[string]bool{}
	if p == nil {
		return nets
	}
	ground := func(n string) bool { return n == "nc" || c.RoleOf(n).IsACGround() }
	for _, pin := range p.Pins {
		if !ground(pin.Net) {
			nets[pin.Net] = true
		}
	}
	for range loopHops {
		var grown []string
		for n := range nets {
			for _, cn := range c.ConnsOf(n) {
				if cn.Part.IsActive() {
					continue
				}
				for _, pin := range cn.Part.Pins {
					if !ground(pin.Net) && !nets[pin.Net] {
						grown = append(grown, pin.Net)
					}
				}
			}
		}
		for _, n := range grown {
			nets[n] = true
		}
	}
	return nets
}

// markLoopCap renames a coupling stage found in device dev's loop.
func markLoopCap(st *Stage, dev, ref, what string) {
	st.Topology = loopCapTopology
	st.Title = "Part of " + dev + "'s oscillator loop"
	var kept figure.List
	var ranks []figRank
	for i, f := range st.Figures {
		if f.Name == "c" {
			kept = append(kept, f)
			if i < len(st.figRanks) {
				ranks = append(ranks, st.figRanks[i])
			}
		}
	}
	// The coupling calc's corner and its notes are about a coupling the
	// capacitor is not.
	st.Figures, st.figRanks = kept, ranks
	st.Notes = append([]string(nil), fmt.Sprintf("%s is in %s's oscillator loop, not a coupling between stages: %s", ref, dev, what))
}
