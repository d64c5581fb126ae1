package stages

import (
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/figure"
)

// A frequency changer whose oscillator a pattern names. A pentagrid
// (heptode, octode) or any multi-grid valve that changes frequency by
// itself has two sections in one envelope: an oscillator on its first
// grids, which an oscillator pattern names by its feedback (a Hartley with
// the cathode on a tap, a tuned grid with a reaction winding, a tuned
// anode), and a signal grid further out, fed by the aerial or RF circuit,
// whose current the oscillator modulates, with the anode into the IF
// transformer. The oscillator pattern sees only the first section, and the
// overlap rule keeps it (it holds more parts than the mixer pattern that
// sees the second), so the set had an oscillator and no frequency changer:
// no signal range, no tracking, an alignment with no mixer. The class is
// told by what the device does, whatever the drawing: its loop, solved in
// circuit at each gang setting, oscillates (or is drawn to and falls
// within loopDrawnDB of it, which its flag says); its output runs to a
// stage tuned to the IF (ifOutput); and a tuned signal circuit other than
// its own tank feeds one of its grids (signalTank). Such a stage becomes
// the oscillator's and the IF transformer's parent, a self-oscillating
// mixer, as the example set's pattern-named one holds its Hartley and its
// IF can; its figures are the loop's (mixerFigures) and its tracking the
// solver's walk of the oscillator coil's tank against the signal tank
// (loopTracking).

// oscillatorMixers builds the self-oscillating mixer of each top-level
// oscillator stage a pattern named whose device changes frequency, and
// returns them; the oscillator and the IF stage it holds are marked gone
// from the top level (they are its sub-stages) and its parts claimed.
func oscillatorMixers(w *world, lp *ac.Loops, ground func(string) bool, tops []*found, claimed map[string]*found, gone map[*found]bool) []*found {
	var out []*found
	for _, f := range tops {
		if f.group != "oscillator" || gone[f] {
			continue
		}
		dev := soleDevice(w.c, f.Parts)
		if dev == nil {
			continue
		}
		ifs := ifOutput(w, dev, tops)
		if ifs == nil || ifs == f || gone[ifs] || signalTank(w, ground, dev, f, ifs, tops) == nil {
			continue
		}
		l, err := loopOf(lp, dev.Ref)
		if err != nil {
			continue
		}
		if _, _, _, best, ok := l.Range(); !ok || best < loopDrawnDB {
			continue // a loop too weak to be drawn as an oscillator: its own flag says so
		}
		m := changerStage(w, dev, l, f, ifs)
		gone[f], gone[ifs] = true, true
		for _, r := range m.Parts {
			claimed[r] = m
		}
		out = append(out, m)
	}
	return out
}

// soleDevice is the one active part among refs, nil when there are none or
// several (a two-valve oscillator is no one device's frequency changer).
func soleDevice(c *graph.Circuit, refs []string) *graph.Part {
	var dev *graph.Part
	for _, r := range refs {
		if p := c.Part(r); p != nil && p.IsActive() {
			if dev != nil {
				return nil
			}
			dev = p
		}
	}
	return dev
}

// signalTank is the top-level tuned stage, other than the oscillator osc
// and the IF stage ifs and tuned away from the IF, that feeds one of the
// device's grids (its control electrode or a further grid): on the grid's
// net, or across one capacitor outside the oscillator from it (an
// injection capacitor). nil when none does: a device with an oscillating
// loop and an IF output but no signal coming in is no frequency changer.
func signalTank(w *world, ground func(string) bool, dev *graph.Part, osc, ifs *found, tops []*found) *found {
	grids := map[string]bool{}
	for _, pin := range dev.Pins {
		if r := graph.RoleOfPin(dev.Kind, pin.Name); (r == graph.RoleControl || r == graph.RoleGrid) && !ground(pin.Net) {
			grids[pin.Net] = true
		}
	}
	for _, p := range w.c.Parts {
		if p.Kind != graph.Capacitor || len(p.Pins) != 2 || osc.set[p.Ref] {
			continue
		}
		for _, pin := range p.Pins {
			if other := otherPinNet(p, pin.Net); grids[pin.Net] && !ground(other) {
				grids[other] = true
			}
		}
	}
	fif := w.c.Freqs["if"]
	for _, t := range tops {
		if t == osc || t == ifs || t.group != "tuned" {
			continue
		}
		if fr, ok := t.Figures.Lookup("f_hz"); ok && fif > 0 && fr/fif-1 <= ifFreqTol && 1-fr/fif <= ifFreqTol {
			continue // another IF can, not the signal's circuit
		}
		for _, ref := range t.Parts {
			if q := w.c.Part(ref); q != nil && touches(q, grids) {
				return t
			}
		}
	}
	return nil
}

// otherPinNet is the net at the other end of two-terminal part p from net n.
func otherPinNet(p *graph.Part, n string) string {
	if p.Pins[0].Net == n {
		return p.Pins[1].Net
	}
	return p.Pins[0].Net
}

// changerStage is the self-oscillating mixer of device dev, whose
// oscillator stage osc (its loop l) and IF stage ifs become its
// sub-stages, oscillator first, as the signal passes through them.
func changerStage(w *world, dev *graph.Part, l Loop, osc, ifs *found) *found {
	st := &Stage{Topology: loopMixerTopology, group: "mixer", Family: osc.Family, Figures: figure.List{}}
	st.Parts = slices.Compact(slices.Sorted(slices.Values(append(slices.Clone(osc.Parts), ifs.Parts...))))
	st.Title = expandTitle("Self-oscillating mixer, "+oscillatorKind(osc.Title, osc.Family)+" ({family})", st.Family)
	m := &found{Stage: st, set: map[string]bool{}, subs: []*found{osc, ifs}}
	for _, r := range st.Parts {
		m.set[r] = true
	}
	fif := w.c.Freqs["if"]
	if loopRuns(l) {
		mixerFigures(w.c, st, l, ifs.Stage, osc.Stage) // the loop's range, where it runs
		if lo, hi, ok := loopSpan([]Loop{l}); ok {
			if s := coverageFlag(w.c.Band, lo, hi, fif); s != "" {
				st.Flags = append(st.Flags, s)
			}
		}
	} else if fif > 0 {
		if ft, ok := ifTuning(ifs.Stage); ok {
			ft.Name, ft.Label, ft.Check, ft.Why = "ift_f", "IF transformer f", nil, ""
			st.Figures.Put(ft)
		}
		st.Figures.Put(ifFigure(fif))
	}
	if coil := oscillatorCoil(w, osc.Parts); coil != "" {
		loopTracking(w, st, dev.Ref, coil, fif)
	}
	// in the one order, as a pattern's figures are (evaluate): a frame's
	// two figures are then the oscillator's and the signal's ranges
	st.figRanks = make([]figRank, len(st.Figures))
	for i, f := range st.Figures {
		st.figRanks[i] = rankOf("", f.Name, f.Unit)
	}
	sortFigures(st)
	slices.Sort(st.Flags)
	st.Draw = changerDraw(w.c, dev, ifs)
	return m
}

// oscillatorKind words an oscillator stage's title as the mixer's
// oscillator: its family dropped, its first qualifier joined by "with"
// ("Hartley oscillator, cathode tap (valve)" → "Hartley oscillator with
// cathode tap"), as the example set's mixer pattern words it.
func oscillatorKind(title, family string) string {
	t := strings.TrimSuffix(title, " ("+family+")")
	if head, rest, ok := strings.Cut(t, ", "); ok {
		return head + " with " + rest
	}
	return t
}

// oscillatorCoil is the coil among refs (a tapped inductor or a
// transformer) whose winding the gang tunes: the oscillator's tank, whose
// tracking against the signal tank the mixer gives.
func oscillatorCoil(w *world, refs []string) string {
	for _, r := range refs {
		p := w.c.Part(r)
		if p == nil || p.Kind != graph.Inductor && p.Kind != graph.Transformer {
			continue
		}
		if _, _, ok := loopTank(w, r); ok {
			return r
		}
	}
	return ""
}

// changerDraw is the mixer's drawing template, as the example set's mixer
// pattern and the injected-mixer pattern draw one: the device as its
// anchor, the IF transformer to its right (render/check's MixerOrder), the
// capacitor across its primary below it and the one across its secondary
// beside that; the oscillator's own template, walked as a sub-stage's,
// keeps its tank below the device.
func changerDraw(c *graph.Circuit, dev *graph.Part, ifs *found) []Place {
	draw := []Place{{Part: dev.Ref}}
	out := dev.NetOf(dev.PinWithRole(graph.RoleOutput))
	var xf string
	for _, r := range ifs.Parts {
		if p := c.Part(r); p != nil && p.Kind == graph.Transformer && xf == "" {
			xf = r
			draw = append(draw, Place{Part: r, Col: 1})
		}
	}
	if xf == "" {
		return draw
	}
	for _, r := range ifs.Parts {
		p := c.Part(r)
		if p == nil || p.Kind != graph.Capacitor || len(p.Pins) != 2 {
			continue
		}
		col := 2
		if p.Pins[0].Net == out || p.Pins[1].Net == out {
			col = 1
		}
		draw = append(draw, Place{Part: r, Col: col, Row: 1, Stand: "vertical"})
	}
	return draw
}

// ifFreqTol is how near the declared IF a tuned output must be for the
// device to be a mixer: 10 %, wider than any IF can's trimming range
// (common practice).
const ifFreqTol = 0.1

// ifOutput finds the tuned stage on a device's output circuit that is
// tuned to the declared IF: the IF transformer of a self-oscillating
// mixer, on the output net or beyond a winding in series with it (a
// reaction winding between the collector and the IF can).
func ifOutput(w *world, dev *graph.Part, tops []*found) *found {
	fif := w.c.Freqs["if"]
	di, ok := w.index[dev]
	out := w.pinNet(di, dev.PinWithRole(graph.RoleOutput))
	if fif <= 0 || !ok || out <= groundNet {
		return nil
	}
	reached := seriesNets(w, di, out)
	for _, f := range tops {
		if f.group != "tuned" {
			continue
		}
		t, ok := ifTuning(f.Stage)
		if fr := t.Value; !ok || t.Range != nil || (fr/fif-1 > ifFreqTol || 1-fr/fif > ifFreqTol) {
			continue
		}
		for _, ref := range f.Parts {
			if q := w.c.Part(ref); q != nil && touches(q, reached) {
				return f
			}
		}
	}
	return nil
}

// seriesNets are the nets reached from net start through at most
// windingReach windings or capacitors of parts other than the device,
// never through AC ground: the output circuit of a device as the signal
// current runs through it.
func seriesNets(w *world, dev, start int) map[string]bool {
	out := map[string]bool{w.names[start]: true}
	frontier, seen := []int{start}, map[int]bool{start: true}
	for hop := 0; hop < windingReach && len(frontier) > 0; hop++ {
		var next []int
		for _, n := range frontier {
			for _, ci := range w.conns[n] {
				if ci == dev {
					continue
				}
				for _, m := range passOn(w, ci, n) {
					if !seen[m] && m != groundNet {
						seen[m] = true
						out[w.names[m]] = true
						next = append(next, m)
					}
				}
			}
		}
		frontier = next
	}
	return out
}

// loopTank finds the tuned winding of transformer ref in w: the winding
// whose ends a capacitor network with a ganged section joins, and those
// capacitors; for a plain or tapped coil (a Hartley's), the coil end to
// end. ok is false when no winding of it is tuned by the gang.
func loopTank(w *world, ref string) (oc coilEnds, caps []*graph.Part, ok bool) {
	ci := slices.IndexFunc(w.parts, func(p *graph.Part) bool { return p.Ref == ref })
	if ci < 0 {
		return coilEnds{}, nil, false
	}
	if p := w.parts[ci]; p.Kind == graph.Inductor {
		a, b := w.pinNet(ci, "1"), w.pinNet(ci, "2")
		cs := tankCaps(w, a, b)
		if gangSection(cs) == nil {
			return coilEnds{}, nil, false
		}
		q := 0.0
		if len(p.Windings) > 0 {
			q = p.Windings[0].Q
		}
		return coilEnds{ref: ref, a: a, b: b, pinA: "1", pinB: "2", l: p.Inductance(), q: q}, cs, true
	}
	for _, cl := range w.coils[ci] {
		first, last := cl.pins[0], cl.pins[len(cl.pins)-1]
		a, b := w.pinNet(ci, first), w.pinNet(ci, last)
		cs := tankCaps(w, a, b)
		if gangSection(cs) == nil {
			continue
		}
		oc := coilEnds{ref: ref, a: a, b: b, pinA: first, pinB: last, l: cl.l, q: cl.q}
		if j, ok := extendToGround(w, ci, cl.name, oc); ok {
			if jcs := tankCaps(w, j.a, j.b); gangSection(jcs) != nil {
				return j, jcs, true
			}
		}
		return oc, cs, true
	}
	return coilEnds{}, nil, false
}
