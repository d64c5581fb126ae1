package pipeline

import (
	"fmt"
	"math"

	"pare/graph"
	"pare/graph/dc"
)

// A reservoir that pare estimates from a captured rectifier (graph/dc,
// rectifier.go) is a supply rail as much as a declared one: the rectifier
// holds it up, and its capacitor is there to be AC ground for what it
// feeds. Left a signal net, the reduction judged its capacitor by its
// reactance alone (32 µF is 99 Ω at 50 Hz, more than a tenth of an output
// transformer's primary), kept it, and the whole mains supply (the mains
// transformer, the fuse, the rectifier) landed on the small-signal sheet,
// where the output valve's anode load through the reservoir was read as a
// tone control. The small-signal work (the reduction, its step proofs, the
// verification) therefore starts from the circuit with each such net a
// supply, tagged with its estimate, and a note says so with the fix.

// acBase is the circuit the small-signal work starts from: r.Circuit, or a
// copy with each estimated reservoir that is not declared made a supply
// rail (with a note for each).
func (r *Result) acBase() *graph.Circuit {
	if r.base != nil {
		return r.base
	}
	r.base = r.Circuit
	if r.DC == nil {
		return r.base
	}
	var nets []dc.Estimate
	for _, e := range r.DC.Estimates {
		if n := r.Circuit.Net(e.Net); n != nil && n.Role == graph.Signal && e.Volts > 0 {
			nets = append(nets, e)
		}
	}
	if len(nets) == 0 {
		return r.base
	}
	c := r.Circuit.Clone()
	for _, e := range nets {
		n := c.Net(e.Net)
		v := math.Round(e.Volts*10) / 10
		n.Role, n.Volts = graph.Supply, v
		n.Label = fmt.Sprintf("%s est. +%.4g V", e.Net, v)
		msg := fmt.Sprintf("%s is not declared a supply but is the reservoir of %s's %s rectifier (estimated +%.4g V): the reduction takes it as a supply rail, AC ground for the signal; declare it to say so: [nets] %s = { role = \"supply\" }",
			e.Net, rectifierOf(e), e.Wave, v, e.Net)
		r.Notes = append(r.Notes, &graph.Error{Pos: n.Pos, Msg: msg})
		r.reservoirNotes = append(r.reservoirNotes, msg)
		for _, msg := range smoothedLineNotes(r.Circuit, e.Net) {
			r.Notes = append(r.Notes, &graph.Error{Pos: n.Pos, Msg: msg})
			r.reservoirNotes = append(r.reservoirNotes, msg)
		}
	}
	c.Sort()
	r.base = c
	return c
}

// rectifierOf names what an estimate comes from: its transformer or the
// mains inlet, else its net.
func rectifierOf(e dc.Estimate) string {
	if e.Transformer != "" || e.Mains != "" {
		return e.Source()
	}
	return e.Net
}
