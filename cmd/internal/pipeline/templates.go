package pipeline

import (
	"slices"

	"pare/graph"
	"pare/render"
	"pare/rules/stages"
)

// framePlaces are the drawing templates of a top-level stage and its
// sub-stages (a self-oscillating mixer's Hartley oscillator), its own
// first. On the reduced sheet they place the parts the patterns matched;
// on the full and faded sheets (fullTemplates) each such part's one
// original (a part the reduction kept, or the one it made from a single
// original), so a reader finds the stage drawn the same way in both views. A part the reduction
// made from several originals has no single place there and is left to
// the generic placement, and so is a template whose anchor is such a part.
// loose are the full sheet's parts of supply sections no frame holds: a
// push-pull pair's shared screen feed, which the supply walk reads as a
// section serving two stages, is one, and the pair's template takes it
// (left to the generic placement it stood in the transformer's slot and
// pushed the centre tap level with the upper valve, review14 a04 faded).
func framePlaces(s stages.Stage, byName map[string]stages.Stage, reduced, full *graph.Circuit, loose []string) []render.Place {
	if full != nil && !fullTemplates[s.Topology] {
		// a feedback ladder is drawn as a ladder on every sheet: left to
		// the generic placement, review16 b01's faded view wound it round
		// the collector and the base divider; a transistor amplifier's
		// template yields to it (the ladder's ends wrap round the device)
		ladder := fullLadder(originals(s.Parts, reduced, full), reduced, full)
		if len(ladder) > 0 || !transistorTemplate(s, reduced, full) {
			return ladder
		}
	}
	var out []render.Place
	var walk func(s stages.Stage)
	walk = func(s stages.Stage) {
		out = append(out, stagePlaces(s.Draw, reduced, full)...)
		for _, c := range s.Contains {
			if sub, ok := byName[c]; ok {
				walk(sub)
			}
		}
	}
	walk(s)
	out = append(out, ladderPlaces(s.Parts, reduced)...)
	if s.Topology == "push-pull" {
		c, parts := reduced, append(slices.Clone(s.Parts), loose...)
		if full != nil {
			c, parts = full, append(originals(s.Parts, reduced, full), loose...)
		}
		out = pairPlaces(out, parts, c, true)
	}
	return out
}

// fullTemplates are the stages whose templates the full and faded sheets
// keep too: the output pairs and the phase splitter, whose devices the
// original circuit's bias and supply parts do not crowd more than the
// template's slots allow (review14's a04 and b04 drew them side by side
// and looped on those sheets). The tuned stages' templates stay on the
// reduced sheet: round an oscillator or mixer the original's heater,
// screen and AGC wiring met the moved parts (the flagship's full sheet
// read 46 more wires beside another net's with them).
// The Vbe-multiplier and quasi-complementary pairs are output pairs of
// the same kind: left to the generic placement review19 b04's faded sheet
// stood its pair upside down (the PNP over the NPN, the multiplier under
// both) where the reduced sheet drew it by its template.
var fullTemplates = map[string]bool{
	"push-pull":                           true,
	"complementary-pair":                  true,
	"complementary-pair-preset":           true,
	"complementary-pair-vbe":              true,
	"complementary-pair-vbe-preset":       true,
	"complementary-pair-vbe-preset-upper": true,
	"complementary-pair-vbe-divider":      true,
	"quasi-complementary-pair":            true,
	"cathodyne":                           true,
}

// transistorTemplates are the untuned common-emitter (source) amplifiers
// whose templates the full and faded sheets keep when the stage's device
// is a transistor: left to the generic placement, the faded sheet hung the
// collector load under the row, its collector lead down across the
// emitter's (review22 b01 and b05: "Q3's collector crosses its own
// emitter lead"); the template stands the load above the collector and
// the emitter resistor below, as on the reduced sheet. A valve's stage
// keeps the generic placement there: round it the heater and screen
// wiring met the moved parts (wire boxes and pages more on the review
// circuits' faded sheets when tried). The amplifier with overall feedback
// into its emitter is one of them: left to the generic placement its
// collector wire wound round the emitter's feedback junction (review22
// b04 Q1).
var transistorTemplates = map[string]bool{
	"amp-common":                       true,
	"amp-common-bypassed":              true,
	"amp-common-degenerated":           true,
	"amp-common-partly-bypassed":       true,
	"amp-common-series-bypassed":       true,
	"amp-common-bypassed-diode-return": true,
	"amp-common-feedback":              true,
	"amp-common-feedback-foot":         true,
}

// transistorTemplate says whether s is a transistorTemplates stage whose
// device (its template's anchor) is a bipolar or field-effect transistor
// the template serves on the drawn circuit full. Two are left to the
// generic placement: a device whose common electrode is the chassis itself
// there has no common lead for its output load's to cross (the template
// only moved the load and stretched the row, every-kind's FET boxing its
// neighbours' wires); and a device whose output returns to its own control
// electrode through resistors and capacitors (a phase-shift oscillator's
// ladder, a collector-to-base bias resistor), whose return wire the
// template's fixed slots wrapped round the device (phase-shift-two-
// sections' base wire boxing Q1).
func transistorTemplate(s stages.Stage, reduced, full *graph.Circuit) bool {
	if !transistorTemplates[s.Topology] || len(s.Draw) == 0 {
		return false
	}
	p := reduced.Part(s.Draw[0].Part)
	if p == nil || (p.Kind != graph.BJT && p.Kind != graph.FET) {
		return false
	}
	drawn := full.Part(sheetRef(p.Ref, reduced, full))
	if drawn == nil || drawn.Kind != p.Kind {
		return false
	}
	if full.RoleOf(drawn.NetOf(drawn.PinWithRole(graph.RoleCommon))) == graph.Ground {
		return false
	}
	return !returnsToControl(p, reduced)
}

// returnsToControl says whether d's output electrode reaches its control
// electrode through resistors, capacitors and inductors alone, on nets
// that are not AC ground by their role (a rail ends the walk: the load's
// and the divider's ends there are no return).
func returnsToControl(d *graph.Part, c *graph.Circuit) bool {
	from, to := d.NetOf(d.PinWithRole(graph.RoleOutput)), d.NetOf(d.PinWithRole(graph.RoleControl))
	if from == "" || to == "" {
		return false
	}
	seen := map[string]bool{from: true}
	queue := []string{from}
	for len(queue) > 0 {
		net := queue[0]
		queue = queue[1:]
		for _, cn := range c.ConnsOf(net) {
			if !passive(cn.Part) {
				continue
			}
			for _, pin := range cn.Part.Pins {
				n := pin.Net
				if n == to {
					return true
				}
				if seen[n] || c.RoleOf(n).IsACGround() {
					continue
				}
				seen[n] = true
				queue = append(queue, n)
			}
		}
	}
	return false
}

// passive says whether a part is a resistor, capacitor or plain inductor,
// the parts a return path through a network is made of.
func passive(p *graph.Part) bool {
	switch p.Kind {
	case graph.Resistor, graph.Capacitor, graph.Inductor:
		return p.IsTwoTerminal()
	}
	return false
}

// stagePlaces turns one stage's template into the sheet's; none when its
// anchor is not on the sheet.
func stagePlaces(draw []stages.Place, reduced, full *graph.Circuit) []render.Place {
	if len(draw) == 0 {
		return nil
	}
	anchor := sheetRef(draw[0].Part, reduced, full)
	if anchor == "" {
		return nil
	}
	out := []render.Place{{Ref: anchor, Anchor: anchor}}
	for _, pl := range draw[1:] {
		if ref := sheetRef(pl.Part, reduced, full); ref != "" {
			out = append(out, render.Place{Ref: ref, Anchor: anchor, Col: pl.Col, Row: pl.Row, Stand: pl.Stand})
		}
	}
	return out
}

// sheetRef is the ref a reduced part is drawn under: itself on the reduced
// sheet, its one original on the full and faded ones; "" when it has no
// single part there.
func sheetRef(ref string, reduced, full *graph.Circuit) string {
	p := reduced.Part(ref)
	if p == nil {
		return ""
	}
	if full == nil {
		return ref
	}
	var in []string
	for _, o := range p.Origins() {
		if full.Part(o) != nil {
			in = append(in, o)
		}
	}
	if len(in) != 1 {
		return ""
	}
	return in[0]
}

// originals are the full circuit's parts behind a stage's reduced parts.
func originals(refs []string, reduced, full *graph.Circuit) []string {
	var out []string
	for _, ref := range refs {
		if p := reduced.Part(ref); p != nil {
			for _, o := range p.Origins() {
				if full.Part(o) != nil {
					out = append(out, o)
				}
			}
		}
	}
	return out
}

// looseSupply are the parts no frame holds that a template may take into
// its frame: the supply sections' on a sheet of the original circuit
// (filterSection without a host: a pair's shared screen feed), and on
// every sheet the parts no stage holds (a pair's own screen stoppers to
// HT, which no pattern names: left out of the pair's template they stood
// between the anodes and the transformer on the reduced sheet, their
// wires looping round the primary, and on the supply's page of the faded
// view, review21 a04).
func looseSupply(found []stages.Stage, reduced, full *graph.Circuit, hosts map[string]string) []string {
	var out []string
	held := map[string]bool{}
	for _, s := range found {
		for _, ref := range s.Parts {
			held[ref] = true
			if p := reduced.Part(ref); full != nil && p != nil {
				for _, o := range p.Origins() {
					held[o] = true
				}
			}
		}
		if filterSection(s, full) && hosts[s.Name] == "" {
			out = append(out, s.Parts...)
		}
	}
	drawn := full
	if drawn == nil {
		drawn = reduced
	}
	for _, p := range drawn.Parts {
		if !held[p.Ref] {
			out = append(out, p.Ref)
		}
	}
	return out
}
