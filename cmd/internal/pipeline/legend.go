package pipeline

import (
	"fmt"
	"sort"
	"strings"

	"pare/graph"
	"pare/graph/figure"
	"pare/graph/safety"
	"pare/render"
	"pare/rules"
	"pare/rules/stages"
)

// furnItem is a line of the sheet's information block and what it is
// about: parts and nets of the circuit as captured, parts of the reduced
// circuit (a stage's). A line about nothing in particular (the IF, the
// reduction level) concerns every page of a paged sheet.
type furnItem struct {
	text         string
	full, nets   []string
	reducedParts []string
	// near are the parts that stand in for the line's own on a sheet
	// that does not draw those: a switch's neighbours on the reduced
	// sheet, where the switch is gone.
	near []string
}

// Furniture is the sheet's information block, which the note repeats under
// its title: regions, named frequencies, tuning ranges, switch positions and
// the reduction level.
func Furniture(c *graph.Circuit, found []stages.Stage, lvl rules.Level) []string {
	return furnitureText(furniture(c, found, lvl))
}

func furnitureText(items []furnItem) []string {
	out := make([]string, len(items))
	for i, it := range items {
		out[i] = it.text
	}
	return out
}

// furniture is the information block line by line with what each is about.
func furniture(c *graph.Circuit, found []stages.Stage, lvl rules.Level) []furnItem {
	var items []furnItem
	for _, r := range c.Regions {
		if r.Band.Max <= 0 {
			continue
		}
		it := furnItem{text: "Region " + r.Name + ": " + figure.FormatRange(r.Band, figure.Hertz, figure.Sheet),
			full: r.Parts, nets: r.Nets}
		if len(r.Parts)+len(r.Nets) == 0 {
			// a region naming no part or net runs from its input to its
			// output (the transfer its proof compares)
			it.nets = nonEmpty(r.Input, r.Output)
		}
		items = append(items, it)
	}
	names := make([]string, 0, len(c.Freqs))
	for k := range c.Freqs {
		names = append(names, k)
	}
	sort.Strings(names)
	for _, k := range names {
		label := k
		if strings.EqualFold(k, "if") {
			label = "IF"
		}
		items = append(items, furnItem{text: label + " " + figure.Format(c.Freqs[k], figure.Hertz, figure.Sheet)})
	}
	for _, s := range found {
		if f, ok := s.Figures.Get("f"); ok && f.Range != nil && f.Range.Max > f.Range.Min {
			// "Tuning S1: …" read as a switch S1's position (a reviewer's
			// reading): the stage is called a stage.
			items = append(items, furnItem{text: "Stage " + s.Name + " tunes " + f.Text(figure.Sheet), reducedParts: s.Parts})
		}
	}
	// A reduced sheet holds for one setting of each switch only (the
	// reduction replaces a switch by the contacts closed in its set
	// position), so the sheet says which. The line concerns the switch and
	// the parts wired to it: on the reduced sheet the switch is gone, its
	// neighbours drawn.
	power := safety.PowerSwitches(c)
	for _, p := range c.Parts {
		if p.Kind == graph.Switch {
			items = append(items, furnItem{text: switchLine(p, power[p.Ref]), full: []string{p.Ref}, near: neighbours(c, p)})
		}
	}
	return append(items, furnItem{text: "Reduction level " + lvl.String()})
}

// switchLine is a switch's line of the information block. An on/off
// switch is said on or off: "at position 2 of 2" read as a band switch's
// setting (review20 a05's double-pole mains switch).
func switchLine(p *graph.Part, power bool) string {
	pos := int(p.Set)
	if !power {
		return fmt.Sprintf("Switch %s at position %d of %d", p.Ref, pos, len(p.Closes))
	}
	if pos >= 1 && pos <= len(p.Closes) && len(p.Closes[pos-1]) > 0 {
		return "On/off switch " + p.Ref + " on"
	}
	return "On/off switch " + p.Ref + " off"
}

// nonEmpty is the strings given that are not empty.
func nonEmpty(ss ...string) []string {
	var out []string
	for _, s := range ss {
		if s != "" {
			out = append(out, s)
		}
	}
	return out
}

// neighbours are the parts sharing a net with p, chassis and rails
// aside (every part is wired to those).
func neighbours(c *graph.Circuit, p *graph.Part) []string {
	var out []string
	for _, pn := range p.Pins {
		if pn.Net == "" || pn.Net == graph.NotConnected || c.RoleOf(pn.Net).IsACGround() {
			continue
		}
		for _, cn := range c.ConnsOf(pn.Net) {
			out = append(out, cn.Part.Ref)
		}
	}
	return out
}

// legend is the furniture for a paged sheet's title block, each line with
// the parts of the circuit drawn (full or reduced) it concerns, so that a
// page lists the lines about what it draws. A line whose parts are none
// of them drawn is left out (the note lists it).
func legend(items []furnItem, drawn, reduced *graph.Circuit, onReduced bool) []render.Legend {
	if drawn == nil || reduced == nil {
		return nil
	}
	m := drawnMap{drawn: drawn, reduced: reduced, onReduced: onReduced, into: map[string]string{}}
	if onReduced {
		// a captured part is drawn as the part it went into
		for _, rp := range reduced.Parts {
			for _, o := range rp.Origins() {
				m.into[o] = rp.Ref
			}
		}
	}
	out := make([]render.Legend, 0, len(items))
	for _, it := range items {
		if len(it.full)+len(it.nets)+len(it.reducedParts) == 0 {
			out = append(out, render.Legend{Text: it.text})
			continue
		}
		set := map[string]bool{}
		m.add(set, it.full, it.nets, it.reducedParts)
		if len(set) == 0 {
			m.add(set, it.near, nil, nil)
		}
		if len(set) == 0 {
			continue
		}
		parts := make([]string, 0, len(set))
		for r := range set {
			parts = append(parts, r)
		}
		sort.Strings(parts)
		out = append(out, render.Legend{Text: it.text, Parts: parts})
	}
	return out
}

// drawnMap finds the parts of the circuit drawn that stand for parts of
// the captured or the reduced circuit.
type drawnMap struct {
	drawn, reduced *graph.Circuit
	onReduced      bool
	into           map[string]string // captured ref -> the reduced part it went into
}

// add puts into set the drawn parts standing for the captured parts full,
// the parts on the nets, and the reduced parts red (their origins on a
// sheet of the captured circuit).
func (m drawnMap) add(set map[string]bool, full, nets, red []string) {
	put := func(ref string) {
		if m.drawn.Part(ref) != nil {
			set[ref] = true
		}
	}
	for _, ref := range full {
		if r, ok := m.into[ref]; ok {
			ref = r
		}
		put(ref)
	}
	for _, n := range nets {
		for _, cn := range m.drawn.ConnsOf(n) {
			put(cn.Part.Ref)
		}
	}
	for _, ref := range red {
		if rp := m.reduced.Part(ref); rp != nil && !m.onReduced {
			for _, o := range rp.Origins() {
				put(o)
			}
		}
		put(ref)
	}
}
