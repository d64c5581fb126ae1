package stages

import (
	"fmt"
	"slices"

	"pare/graph"
	"pare/graph/ac"
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

// loopTopology is the topology id of an oscillator found by its loop, and
// loopMixerTopology of one whose output is tuned to the IF: a
// self-oscillating mixer however its feedback is coupled.
const (
	loopTopology      = "oscillator-loop"
	loopMixerTopology = "self-oscillating-mixer-loop"
)

// loopStages returns the stages of oscillators no pattern named, and flags
// the stages that hold a device of such a loop. The loops are solved on
// lc (the original circuit); the stages' parts come from the reduced c.
// A coupling-group stage on the loop (a padder or a link capacitor that
// the coupling patterns took for a coupling capacitor) is absorbed: it is
// returned in gone, and its parts belong to the oscillator.
func loopStages(c *graph.Circuit, lp *ac.Loops, acg map[string]bool, tops []*found, orig *world) (out []*found, gone map[*found]bool) {
	lc := lp.Circuit()
	claimed, named := claims(tops)
	gone = map[*found]bool{}
	w := newWorld(c, false, acg)
	w.orig = orig
	out = oscillatorMixers(w, lp, groundOf(c, acg), tops, claimed, gone)
	var inLoop []pendingAmp
	for _, p := range c.Parts {
		if f := claimed[p.Ref]; f != nil && injectedMixer(f.Topology) {
			selfOscillating(w, lp, acg, p, f, tops, claimed, gone)
			continue
		}
		if !p.IsActive() || named[p.Ref] || claimed[p.Ref] != nil && hasLoop(claimed[p.Ref].Stage, p.Ref) {
			continue
		}
		l, err := loopOf(lp, p.Ref)
		if err != nil {
			continue // no loop to speak of: the stage it is in says the rest
		}
		_, _, _, mMax, ok := l.Range()
		if !ok || mMax < loopReachDB && (claimed[p.Ref] != nil || !drawnConverter(w, lc, p, l, tops)) {
			continue
		}
		if mMax >= 0 && inheritedLoop(lp, c, p.Ref, l) {
			// Another device's oscillation seen through this one (a
			// follower on an RC oscillator's collector): the loop is
			// that device's, and its stage says so.
			continue
		}
		if mMax < 0 && claimed[p.Ref] == nil && sharedLoop(lp, c, p.Ref, l) {
			// Short of starting, at the frequency another device's loop
			// runs at: that oscillator's tank seen through this device (a
			// mixer the oscillator injects into), not a dead oscillator.
			continue
		}
		if f := claimed[p.Ref]; mMax >= 0 && amplifierOf(c, f, tops, p.Ref) && !sharedLoop(lp, c, p.Ref, l) {
			// Named an amplifier by its shape (a shunt-fed anode load, a
			// bypassed cathode) but its loop runs: it is an oscillator,
			// and a title that said gain would mislead; the loop's stage
			// takes its parts.
			gone[f] = true
			for _, r := range f.Parts {
				delete(claimed, r)
			}
		}
		if f := claimed[p.Ref]; mMax >= 0 && amplifierOf(c, f, tops, p.Ref) {
			// An amplifier whose loop another device's shares (a Wien
			// bridge's second stage): decided once every oscillator is
			// found (joinAmplifiers).
			inLoop = append(inLoop, pendingAmp{p, f, l})
			continue
		}
		if f, in := claimed[p.Ref]; in {
			flagClaimed(lc, f, l)
			continue
		}
		f := loopStage(w, lc, acg, p, l, tops, claimed, gone)
		if j := joinedLoop(lp, out, p.Ref, l); j != nil {
			// the same loop seen from a second device: one oscillator
			joinLoop(w, lc, acg, j, f, l)
			for _, r := range j.Parts {
				j.set[r] = true
				claimed[r] = j
			}
			continue
		}
		for _, r := range f.Parts {
			f.set[r] = true
			claimed[r] = f
		}
		out = append(out, f)
	}
	joinAmplifiers(w, lp, acg, inLoop, out, claimed, gone)
	return out, gone
}

// amplifierOf reports whether f is a top-level amplifier stage whose only
// active part is dev: the stage is then dev's and nothing else's.
func amplifierOf(c *graph.Circuit, f *found, tops []*found, dev string) bool {
	if f == nil || f.group != "amplifier" || !slices.Contains(tops, f) {
		return false
	}
	for _, r := range f.Parts {
		if q := c.Part(r); r != dev && q != nil && q.IsActive() {
			return false
		}
	}
	return true
}

// loopReachDB is how far below 0 dB a loop that reaches 0° of loop phase
// is still reported: −10 dB, a gm about three times short. That is within
// what a repairer meets on the bench (a transistor's hFE and a valve's
// emission spread by 2–3× between samples and with age, a resistor or a
// capacitor a tolerance band off), so such a loop is an oscillator that
// fails to start or an amplifier that a new device may set off (common
// practice, no source); lower than that the loop is only the stray
// feedback every amplifier has.
const loopReachDB = -10.0

// claimedLoopFlags are the sentences for the loop of a device that a stage
// other than an oscillator holds: it oscillates, or its loop falls just
// short (found by the loop, named by no pattern), with the squegging risk
// any oscillator found by its loop carries.
func claimedLoopFlags(lc *graph.Circuit, l Loop) []string {
	fMin, fMax, _, mMax, _ := l.Range()
	at := hzText(fMin)
	if fMax/fMin-1 > 1e-4 {
		at = hzText(fMin) + "–" + hzText(fMax)
	}
	if mMax < 0 {
		return []string{shortLoopFlag(l) + "; a frequency-selective feedback loop short of starting, or an oscillator no pattern names"}
	}
	out := []string{fmt.Sprintf("%s oscillates: loop phase 0° at %s, loop gain %+.1f dB (%s): an amplifier that oscillates, or an oscillator no pattern names",
		l.Device, at, mMax, gmMargin(l.Device, mMax))}
	if s := squeggFlag(lc, l); s != "" {
		out = append(out, s)
	}
	return out
}

// claims maps each part to the stage (or sub-stage) that first holds it,
// and marks the devices an oscillator or mixer stage holds.
func claims(tops []*found) (claimed map[string]*found, named map[string]bool) {
	claimed, named = map[string]*found{}, map[string]bool{}
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
	return claimed, named
}

// loopStage builds the stage of device p's unnamed oscillator: its parts,
// the transformer its feedback goes through, a mixer's title and figures
// when its output is tuned to the IF, the tank stage as a sub-stage.
func loopStage(w *world, lc *graph.Circuit, acg map[string]bool, p *graph.Part, l Loop, tops []*found, claimed map[string]*found, gone map[*found]bool) *found {
	c := w.c
	through := feedbackThrough(lc, p.Ref, l)
	var parts []string
	fb, rc := rcNet{}, false
	if through == "" {
		fb, rc = rcFeedback(c, lc, groundOf(c, acg), p)
	}
	if rc {
		parts = rcLoopParts(c, acg, p, fb, claimed, gone)
	} else {
		parts = loopParts(w, acg, p, through, claimed, gone)
	}
	word := through
	switch {
	case word != "":
	case holdsCoil(c, parts):
		// an LC network no pattern names (a Colpitts with a lead no
		// pattern takes): never called RC, which its coil contradicts
		word = "a tuned circuit"
	default:
		word = "an RC network"
	}
	st := &Stage{Topology: loopTopology, group: "oscillator", Family: deviceFamily(p),
		Parts: parts, Figures: figure.List{}, Loop: []Loop{l}}
	st.Title = expandTitle("Oscillator, feedback through "+word+" ({family})", st.Family)
	if _, _, _, _, runs := l.Range(); rc && runs && fb.sections >= phaseShiftSections {
		phaseShiftStage(st, p, l, fb)
	}
	f := &found{Stage: st, set: map[string]bool{}}
	// The tank the feedback transformer tunes, named by its own pattern,
	// is the oscillator's sub-stage, as a tank found inside a Hartley is.
	var tank *Stage
	if t := claimed[through]; t != nil && t.group == "tuned" && !gone[t] && slices.Contains(tops, t) {
		gone[t] = true
		f.subs = append(f.subs, t)
		st.Parts = slices.Compact(slices.Sorted(slices.Values(append(st.Parts, t.Parts...))))
		tank = t.Stage
	}
	if ifStage := ifOutput(w, p, tops); ifStage != nil {
		st.Topology, st.group = loopMixerTopology, "mixer"
		st.Title = mixerTitle(w, p, through, st.Family)
		if _, _, _, mMax, _ := l.Range(); mMax >= 0 {
			mixerFigures(c, st, l, ifStage.Stage, tank) // a loop that runs: where it runs
		} else {
			if ft, ok := ifTuning(ifStage.Stage); ok {
				ft.Name, ft.Label, ft.Check, ft.Why = "ift_f", "IF transformer f", nil, ""
				st.Figures.Put(ft)
			}
			st.Figures.Put(ifFigure(c.Freqs["if"]))
		}
		loopTracking(w, st, p.Ref, through, c.Freqs["if"])
	} else {
		loopOscFigures(st, l, tank)
	}
	st.Flags = append(st.Flags, loopFlags(lc, st, l)...) // the tracking's flags kept
	slices.Sort(st.Flags)
	return f
}

// loopHops is how far from the device's nets (and the feedback
// transformer's) an unnamed oscillator's parts are gathered: the padder
// beyond the tank, the coupling capacitor beyond the link winding.
const loopHops = 2

// loopParts gathers an unnamed oscillator's parts: the device, the
// transformer that carries its feedback, and, within loopHops of their
// nets through capacitors and windings, the parts that no stage holds or
// that a coupling stage holds (which is then marked gone). Tuned stages
// and amplifiers keep their parts: an IF transformer is the next stage's
// input, an amplifier in the loop (a Wien bridge's second valve) is a stage
// of its own. Nor does it take another gang section's tank (loopapart.go).
func loopParts(w *world, acg map[string]bool, dev *graph.Part, through string, claimed map[string]*found, gone map[*found]bool) []string {
	return loopPartsFrom(w.c, acg, dev, through, claimed, gone, func(graph.Pin) bool { return true }, otherSections(w, through))
}

// groundOf says which nets of c are AC ground, with the nets acg names.
func groundOf(c *graph.Circuit, acg map[string]bool) func(string) bool {
	return func(net string) bool { return acg[net] || c.RoleOf(net).IsACGround() }
}

// loopPartsFrom is loopParts gathering from the device's pins from says
// (a mixer's signal grid leads to the aerial circuit, not the oscillator)
// and leaving out the parts skip says (nil: none).
func loopPartsFrom(c *graph.Circuit, acg map[string]bool, dev *graph.Part, through string, claimed map[string]*found, gone map[*found]bool, from func(graph.Pin) bool, skip func(*graph.Part) bool) []string {
	ground := groundOf(c, acg)
	nets := map[string]bool{}
	in := map[string]bool{dev.Ref: true}
	addNets := func(q *graph.Part) {
		for _, pin := range q.Pins {
			if !ground(pin.Net) && (q != dev || from(pin)) {
				nets[pin.Net] = true
			}
		}
	}
	addNets(dev)
	// The feedback transformer's nets lead to the tank's padder and
	// gang section, also when its tuned winding is a tank stage of its
	// own (which the oscillator then holds as its sub-stage).
	if t := c.Part(through); t != nil && (claimed[through] == nil || claimed[through].group == "tuned") {
		in[through] = claimed[through] == nil
		addNets(t)
	}
	takeable := func(q *graph.Part) bool {
		f := claimed[q.Ref]
		return f == nil || f.group == "coupling" || gone[f]
	}
	for range loopHops {
		var grown []*graph.Part
		for _, q := range c.Parts {
			if in[q.Ref] || q.IsActive() || !touches(q, nets) || !takeable(q) || skip != nil && skip(q) {
				continue
			}
			in[q.Ref] = true
			if f := claimed[q.Ref]; f != nil && !gone[f] {
				gone[f] = true
				for _, r := range f.Parts {
					in[r] = true
				}
			}
			if q.Kind != graph.Resistor {
				grown = append(grown, q)
			}
		}
		for _, q := range grown {
			addNets(q)
		}
	}
	var refs []string
	for r := range in {
		refs = append(refs, r)
	}
	slices.Sort(refs)
	return refs
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

// feedbackThrough names the transformer that carries a loop: the one whose
// coupling, set to zero in a copy of the circuit, leaves the loop short of
// 0 dB at every setting; for a loop short of 0 dB already, the one without
// whose coupling it loses its 0° crossing or 20 dB of its best gain.
// "" when no single transformer does.
func feedbackThrough(lc *graph.Circuit, ref string, l Loop) string { return carrier(lc, ref, l, false) }

// carrier is feedbackThrough for the loop as solved, or for the loop
// turned over (loopTurned) when inverted.
func carrier(lc *graph.Circuit, ref string, l Loop, inverted bool) string {
	_, _, _, best, _ := l.Range()
	below := 0.0
	if best < 0 {
		below = best + loopDrawnDB
	}
	for _, q := range lc.Parts {
		if len(q.Coupling) == 0 {
			continue
		}
		cp := lc.Clone()
		for i := range cp.Part(q.Ref).Coupling {
			cp.Part(q.Ref).Coupling[i].K = 0
		}
		cut, err := loopTurned(ac.NewLoops(cp), ref, inverted)
		if err != nil {
			continue
		}
		if _, _, _, m, ok := cut.Range(); !ok || m < below {
			return q.Ref
		}
	}
	return ""
}

// holdsCoil reports whether any of refs is a coil (not an RF choke, which
// feeds a supply and tunes nothing) or a transformer.
func holdsCoil(c *graph.Circuit, refs []string) bool {
	for _, r := range refs {
		if p := c.Part(r); p != nil && (p.Kind == graph.Inductor && p.Type != graph.IndChoke || p.Kind == graph.Transformer) {
			return true
		}
	}
	return false
}
