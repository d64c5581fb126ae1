package stages

import (
	"fmt"
	"strings"

	"pare/graph"
	"pare/graph/figure"
)

// A series resistor from a supply into a line a shunt stabiliser holds
// (a zener diode, or a gas-filled "neon" stabiliser, from the line to
// chassis) is the stabiliser's feed, not a supply decoupling filter: it
// drops the supply to the stabiliser's voltage and carries the line's
// loads' current and the stabiliser's own, which the stabiliser gives up
// as the loads take more (a shunt regulator; handbook, from memory). Its
// figures are the DC operating point's: the line's volts, the feed's
// current, what the loads draw and what is left for the stabiliser
// (review23 a01: a neon-stabilised screen feed named "Supply decoupling
// filter" with a corner that left the neon out).

// shuntStabiliserTitle names the section by its job (trade terms).
const shuntStabiliserTitle = "Shunt stabiliser: feed resistor and stabiliser"

// ShuntStabiliserTopology is a stabiliser feed's topology: the supply
// filter patterns find it, the part across its line says what it is.
const ShuntStabiliserTopology = "shunt-stabiliser"

// stabiliserWords name a two-terminal part as a shunt stabiliser in its
// description (trade terms: a gas-filled voltage stabiliser or regulator
// tube, a neon used as one, a voltage reference).
var stabiliserWords = []string{"stabiliser", "stabilizer", "regulator", "voltage reference", "neon"}

// stabiliserOn is the shunt stabiliser across line out: a zener diode, or
// a part whose description names a stabiliser, from out to chassis.
func (x *figCtx) stabiliserOn(out int) *graph.Part {
	for _, ci := range x.w.conns[out] {
		p, pins := x.w.parts[ci], x.w.pins[ci]
		if len(pins) != 2 || !(pins[0] == out && pins[1] == groundNet || pins[1] == out && pins[0] == groundNet) {
			continue
		}
		if p.Kind == graph.Diode && p.Type == "zener" || p.Kind == graph.Generic && namesStabiliser(p.Label) {
			return p
		}
	}
	return nil
}

// namesStabiliser tells whether a part's description has a stabiliserWords
// word in it.
func namesStabiliser(label string) bool {
	l := strings.ToLower(label)
	for _, w := range stabiliserWords {
		if strings.Contains(l, w) {
			return true
		}
	}
	return false
}

// stabiliserFigures writes a stabiliser feed's DC figures from the
// operating point and says whether the feed holds the stabiliser
// conducting: the feed's current (V(in) − V(out))/R must exceed what the
// line's loads draw (Kirchhoff's current law at the line), else the
// stabiliser goes out and the line is no longer held.
func (x *figCtx) stabiliserFigures(s, stab *graph.Part, in, out int) {
	inName, outName := x.netName(in), x.netName(out)
	x.st.Notes = append(x.st.Notes, fmt.Sprintf("%s feeds the line %s holds: it drops %s to it and carries the loads' current and the stabiliser's", s.Ref, stab.Ref, inName))
	op := x.dcPoint()
	if op == nil || s.Kind != graph.Resistor {
		x.st.Notes = append(x.st.Notes, "no DC operating point: the stabiliser's current is not solved")
		return
	}
	vi, ok1 := op.Volts(inName)
	vo, ok2 := op.Volts(outName)
	if !ok1 || !ok2 {
		return
	}
	feed := (vi - vo) / s.Value.Max
	load := x.lineDraw(op.Current, out, s, stab)
	x.set("v_stab", figure.Volt, vo, figure.BySolver("V("+outName+")", "DC operating point"))
	x.set("i_feed", figure.Ampere, feed, figure.BySolver("(V("+inName+") − V("+outName+"))/"+s.Ref, "DC operating point"))
	x.set("i_line", figure.Ampere, load, figure.BySolver("the currents into the loads on "+outName, "DC operating point"))
	x.set("i_stab", figure.Ampere, feed-load, figure.BySolver("the feed's current less the loads' (KCL at "+outName+")", "DC operating point"))
	x.st.Notes = append(x.st.Notes, x.heldWords(stab, out))
	if feed-load <= 0 {
		x.flag("%s cannot hold %s conducting: %s gives %s and the line's loads draw %s, nothing is left for the stabiliser, so the line is not held",
			s.Ref, stab.Ref, s.Ref, amps(feed), amps(load))
	}
}

// lineDraw is the DC current the parts on line out draw from it, but the
// feed s, the stabiliser and its capacitors (no DC): current(ref, pin) is
// the operating point's current into a pin.
func (x *figCtx) lineDraw(current func(ref, pin string) float64, out int, s, stab *graph.Part) float64 {
	total := 0.0
	for _, ci := range x.w.conns[out] {
		p := x.w.parts[ci]
		if p == s || p == stab || p.Kind == graph.Capacitor {
			continue
		}
		for j, id := range x.w.pins[ci] {
			if id == out {
				total += current(p.Ref, p.Pins[j].Name)
			}
		}
	}
	return total
}

// heldWords says where the line's volts come from: a zener's are solved
// from its breakdown law; a part pare has no model of holds nothing in the
// solve, so the line is taken at the volts the netlist declares for it,
// or is not known to be held at all.
func (x *figCtx) heldWords(stab *graph.Part, out int) string {
	if stab.Kind == graph.Diode {
		return fmt.Sprintf("the line's volts and %s's current are solved from its breakdown law", stab.Ref)
	}
	if n := x.w.c.Net(x.netName(out)); n != nil && n.HasVolts() {
		return fmt.Sprintf("%s has no model: the DC solve holds the line at its declared %s, so the stabiliser's current is what the feed gives less what the loads draw", stab.Ref, figure.Format(n.Volts, figure.Volt, figure.Text))
	}
	return fmt.Sprintf("%s has no model and the line declares no volts: pare cannot say what it holds the line at (declare the line's volts)", stab.Ref)
}

// amps writes a DC current for a note.
func amps(v float64) string { return figure.Format(v, figure.Ampere, figure.Text) }

// stabiliserFeed names the section by its job, gives it the stabiliser
// it feeds, and writes its figures: the DC point's, and the corner only
// where the solver models the stabiliser (a zener, its slope rz in the AC
// model); a part it has no model of would leave the line's hold out of
// the corner, which would then be a figure of a circuit that is not there.
func (x *figCtx) stabiliserFeed(s *graph.Part, c2 float64, in, out int, check figure.Figure) {
	stab := x.stabiliserOn(out)
	x.st.Topology, x.st.Title = ShuntStabiliserTopology, shuntStabiliserTitle
	x.claimInstead(nil, []*graph.Part{stab})
	if !x.solve {
		// the formula's corner stands for the match (the pattern's
		// guard); the solved stage has its own figures
		x.put(check)
		return
	}
	x.stabiliserFigures(s, stab, in, out)
	if stab.Kind != graph.Diode {
		x.st.Notes = append(x.st.Notes, fmt.Sprintf("no corner: %s has no AC model, and its own slope resistance, not %s, holds the line at AC", stab.Ref, refList(x.parts("c2"))))
		// the formula's corner is kept as a working value only, for the
		// pattern's guard (a match the wrong way round has none): shown
		// nowhere, since it leaves the stabiliser out
		f := x.named(check)
		f.Working = true
		x.putLabelled(f)
		return
	}
	x.filterCorner(s, c2, in, out, check)
}
