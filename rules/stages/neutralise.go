package stages

import (
	"fmt"
	"math"
	"math/cmplx"
	"slices"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/value"
)

// A neutralising capacitor (patterns/winding-feedback-capacitor.toml): from a
// winding of the transformer a device's output electrode works into back
// to the device's control electrode, feeding back antiphase what the
// device's internal capacitance feeds in phase. The AC solver's device
// models have no internal capacitance, so the check puts the device
// class's typical one (inputCaps, from memory) from output to control
// electrode in a copy of the circuit and compares the reverse transfer
// |V(control)/V(output)| at the stage's mid-band with the capacitor in and
// taken out: it neutralises where its own feedback is in antiphase with
// the internal capacitance's. In phase (a link wired the wrong way round)
// it adds to that feedback: the stage is named a feedback capacitor and
// flagged, never "neutralising" nor a coupling between two stages.
func init() {
	calcs["neutralising"] = calc{args: []string{"device", "c"}, required: []string{"device", "c"}, fn: calcNeutralising}
}

func calcNeutralising(x *figCtx) {
	q, cn := x.part("device"), x.part("c")
	if q == nil || cn == nil {
		return
	}
	ctl := q.NetOf(q.PinWithRole(graph.RoleControl))
	out := q.NetOf(q.PinWithRole(graph.RoleOutput))
	w := farEnd(cn, ctl)
	xf := outputWindingOn(x.w.c, out, w)
	if xf == nil {
		return // the far end is on no winding the output drives: the guard drops the match
	}
	x.set("c_neutralising", figure.Farad, cn.Value.Max, figure.FromNetlist(cn.Ref))
	if !x.solve {
		return
	}
	b := x.w.c.BandOf(q)
	if b.Min <= 0 || b.Max < b.Min {
		return
	}
	f := math.Sqrt(b.Min * b.Max)
	_, cf, what := inputCaps(q)
	base := x.solverCircuit()
	withCf := base.Clone()
	withCf.AddPart(&graph.Part{Ref: q.Ref + "~cf", Kind: graph.Capacitor, Type: graph.CapFixed,
		Value: value.Range{Min: cf, Max: cf}, Pins: []graph.Pin{{Name: "1", Net: out}, {Name: "2", Net: ctl}}})
	hn, ok1 := transferAtC(base, out, ctl, f)                     // with the capacitor's own feedback
	hcf, ok2 := transferAtC(without(withCf, cn.Ref), out, ctl, f) // with the internal capacitance's instead
	hboth, ok3 := transferAtC(withCf, out, ctl, f)
	h0, ok4 := transferAtC(without(base, cn.Ref), out, ctl, f) // what reaches the control electrode by other ways
	if !ok1 || !ok2 || !ok3 || !ok4 {
		return
	}
	// The figures shown are the reverse transfer as a meter would see it,
	// with and without the capacitor (every path in); the share cancelled
	// compares the two capacitors' own paths, what reaches the control
	// electrode by other ways taken off both.
	open := cmplx.Abs(hcf)
	hn, hcf = hn-h0, hcf-h0
	if hcf == 0 {
		return
	}
	at := fmt.Sprintf("%s, %s's internal capacitance taken as %s %s", hz(f), q.Ref, what, figure.Format(cf, figure.Farad, figure.Text))
	name, cfText := "c_cancelled", figure.Format(cf, figure.Farad, figure.Text)
	x.st.Title = expandTitle("Neutralising capacitor, from the antiphase winding back to the {control} ({family})", x.st.Family)
	if real(hn*cmplx.Conj(hcf)) >= 0 {
		// in phase with the output: it adds to the internal feedback
		name = "c_added"
		x.st.Title = expandTitle("Feedback capacitor from the output winding to the {control}, in phase with the {output} ({family})", x.st.Family)
		x.flag("%s feeds %s's %s back from %s in phase with its %s: it adds to the internal capacitance's feedback, it does not neutralise (a link or winding connected the wrong way round?)",
			cn.Ref, q.Ref, ControlWord(q), xf.Ref, outputWord(q))
	}
	x.put(figure.Figure{Name: name, Unit: figure.Farad, Value: cf * cmplx.Abs(hn) / cmplx.Abs(hcf),
		Origin: figure.BySolver(cn.Ref+"'s reverse transfer V("+ctl+")/V("+out+") over that of "+cfText+" from "+out+" to "+ctl+", times "+cfText, hz(f))})
	x.put(figure.Figure{Name: "rev_transfer", Unit: figure.Ratio, Value: cmplx.Abs(hboth),
		Origin: figure.BySolver("|V("+ctl+")/V("+out+")| with "+out+" driven", at)})
	x.put(figure.Figure{Name: "rev_transfer_open", Unit: figure.Ratio, Value: open,
		Origin: figure.BySolver("the same with "+cn.Ref+" taken out", at)})
	x.st.Notes = append(x.st.Notes, neutralBasis(q, cn, name, cf, cmplx.Abs(hn)/cmplx.Abs(hcf), what, cfText))
	if cut := 1 - cmplx.Abs(hboth)/open; name == "c_cancelled" && cmplx.Abs(hn) < weakNeutral*cmplx.Abs(hcf) {
		x.flag("%s neutralises little as captured: it cancels %.2g %% of %s %s %s (the solver's reverse transfer is %.2g %% lower with it); the winding end it returns to swings little, or the device's own %s is much smaller than that",
			cn.Ref, 100*cmplx.Abs(hn)/cmplx.Abs(hcf), what, cfText, feedbackCapName(q), 100*cut, feedbackCapName(q))
	}
}

// weakNeutral: a neutralising capacitor whose antiphase feedback cancels
// less than this share of the device class's typical feedback capacitance
// is flagged as neutralising little (common practice, no source: a
// neutraliser is set to cancel the device's whole feedback capacitance;
// the typical value is a guess that may be a few times off for a given
// device, so only a share below a tenth is called little).
const weakNeutral = 0.1

// neutralBasis says what the capacitor's figure is: the feedback
// capacitance whose reverse transfer its own feedback equals, found by the
// solver against the device class's typical one (the solver's device
// models have none, and a netlist gives none), and what share of that it
// cancels or adds.
func neutralBasis(q, cn *graph.Part, name string, cf, share float64, what, cfText string) string {
	verb := "cancels"
	if name == "c_added" {
		verb = "adds to"
	}
	return fmt.Sprintf("%s %s %s of %s's %s: the %s-to-%s capacitance whose feedback %s's own equals, by the solver (the reverse transfer V(%s)/V(%s) with %s alone over that with %s %s alone, times %s); pare's device models have no internal capacitance and the netlist gives none, so the %s compared with is %s %s (from memory, not the part's data): %s %s %.2g %% of it",
		cn.Ref, verb, figure.Format(cf*share, figure.Farad, figure.Text), q.Ref, feedbackCapName(q), outputWord(q), ControlWord(q), cn.Ref,
		ControlWord(q), outputWord(q), cn.Ref, cfText, feedbackCapName(q), cfText, feedbackCapName(q), what, cfText, cn.Ref, verb, 100*share)
}

// feedbackCapName is the trade's name of the output-to-control
// capacitance: Cbc, Cgd, Cag.
func feedbackCapName(q *graph.Part) string {
	switch q.Kind {
	case graph.BJT:
		return "Cbc"
	case graph.FET:
		return "Cgd"
	}
	return "Cag"
}

// outputWindingOn is the transformer with a pin on net w and a pin on the
// output net out (another winding, or the same one tapped), w not out;
// nil when there is none or more than one.
func outputWindingOn(c *graph.Circuit, out, w string) *graph.Part {
	if w == out || w == "" || c.RoleOf(w).IsACGround() {
		return nil
	}
	var found *graph.Part
	for _, cn := range c.ConnsOf(w) {
		p := cn.Part
		if p.Kind != graph.Transformer || p == found {
			continue
		}
		if !slices.ContainsFunc(p.Pins, func(pn graph.Pin) bool { return pn.Net == out }) {
			continue
		}
		if found != nil {
			return nil
		}
		found = p
	}
	return found
}
