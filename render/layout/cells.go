package layout

import (
	"pare/graph/figure"
	"strconv"
	"strings"

	"pare/graph"
	"pare/graph/value"
)

func realPart(cl *cell) *graph.Part {
	if strings.HasPrefix(cl.ref, "@") {
		return nil
	}
	return cl.part
}

// makeCells makes a cell for every part, plus input and output flags for
// signal nets named in Inputs and Outputs that no port part sits on.
func makeCells(c *graph.Circuit, o Options) []*cell {
	var out []*cell
	ported := map[string]bool{}
	for _, p := range c.Parts {
		if p.Kind == graph.Port {
			for _, pn := range p.Pins {
				ported[pn.Net] = true
			}
		}
	}
	for _, p := range c.Parts {
		cl := &cell{part: p, ref: p.Ref, faded: o.Faded[p.Ref], fadedPins: o.FadedPins[p.Ref]}
		if to, ok := o.Merged[p.Ref]; ok && to != p.Ref {
			cl.mark = mergeMark(to)
		}
		cl.label.Owner, cl.label.Faded = p.Ref, cl.faded
		cl.label.Lines = labelLines(p, o)
		out = append(out, cl)
	}
	term := func(prefix, net string, in bool) {
		if ported[net] || c.RoleOf(net).IsACGround() {
			return
		}
		ported[net] = true
		text := net
		if n := c.Net(net); n != nil && n.Label != "" {
			text = n.Label
		}
		p := &graph.Part{Ref: prefix + net, Kind: graph.Port, Label: text, Pins: []graph.Pin{{Name: "1", Net: net}}}
		cl := &cell{part: p, ref: p.Ref, edge: 1}
		if in {
			cl.edge = -1
		}
		out = append(out, cl)
	}
	for _, n := range c.Inputs {
		term(inRef, n, true)
	}
	for _, n := range c.Outputs {
		term(outRef, n, false)
	}
	return append(out, connectorCells(o)...)
}

// labelLines is the text beside a symbol: ref and value in the IEC 60062
// letter code, then a small line with the gang and where a merged part went.
func labelLines(p *graph.Part, o Options) []string {
	first := p.Ref
	add := func(s string) {
		if s != "" {
			first += " " + s
		}
	}
	switch p.Kind {
	case graph.Resistor, graph.Pot, graph.Loudspeaker:
		add(value.FormatRange(p.Value, value.Ohm, value.Code))
	case graph.Capacitor:
		add(value.FormatRange(p.Value, value.Farad, value.Code))
	case graph.Inductor:
		add(withUnit(value.Format(p.Inductance(), value.Henry, value.Code), "H"))
	case graph.Crystal:
		add(value.Format(p.Value.Max, value.Hertz, value.Code))
	case graph.Transformer:
		ks := []string{}
		for _, k := range p.Coupling {
			ks = append(ks, "k="+figure.Plain(k.K))
		}
		if len(ks) > 0 && len(ks) <= 2 {
			add(strings.Join(dedupe(ks), " "))
		}
	case graph.Valve, graph.BJT, graph.FET:
		// The type it is marked with says more at the bench than the
		// kind, which the symbol already shows.
		if p.Designation != "" {
			add(p.Designation)
		} else {
			add(p.Type)
		}
	case graph.Switch:
		if p.Set > 0 {
			add("pos " + figure.Plain(p.Set))
		}
	case graph.Generic:
		add(p.Label)
	case graph.Port:
		return nil
	}
	if len(p.From) > 1 && p.Gang == "" && strings.HasPrefix(first, p.Ref+" ") {
		// an equivalent's value is on no part of the set: the ref it
		// kept would read as that part's value ("R2 11k" where R2 is
		// 22k), so the value stands alone over what it stands for
		first = strings.TrimPrefix(first, p.Ref+" ")
	}
	var second []string
	if p.Gang != "" {
		second = append(second, "gang "+p.Gang)
	}
	if to, ok := o.Merged[p.Ref]; ok && to != p.Ref {
		second = append(second, mergeMark(to))
	}
	// A gang section drawn with its trimmer folded in is named by its gang
	// and alignment mark already; the mark is for a fixed equivalent (a
	// bias divider's 6k98) that is on no part of the set.
	if len(p.From) > 1 && p.Gang == "" {
		second = append(second, equivalentOf(p.From))
	}
	if m := o.Marks[p.Ref]; m != "" {
		second = append(second, m)
	}
	out := []string{first}
	if len(second) > 0 {
		out = append(out, strings.Join(second, ", "))
	}
	if t := o.TieLabels[p.Ref]; t != "" {
		out = append(out, t)
	}
	if v := dcLine(p, o.PinVolts[p.Ref]); v != "" {
		out = append(out, v)
	}
	return out
}

// maxEquivalentRefs is how many original refs an equivalent's label names
// before "…": a bias divider's two, a ladder's few; more crowds a sheet.
const maxEquivalentRefs = 4

// equivalentOf marks a reduced part that stands for several original ones
// ("≡ R1, R2"): its value (a bias divider's 6k98) is on no part of the
// set, and a repairer must not hunt for it.
func equivalentOf(from []string) string {
	refs := from
	more := ""
	if len(refs) > maxEquivalentRefs {
		refs, more = refs[:maxEquivalentRefs], ", \u2026"
	}
	return "\u2261 " + strings.Join(refs, ", ") + more
}

// withUnit appends the unit where the letter code has no letter of its own
// ("2" henries reads as "2H").
func withUnit(code, unit string) string {
	for _, r := range code {
		if r < '0' || r > '9' {
			if r != '.' {
				return code
			}
		}
	}
	return code + unit
}

func dedupe(s []string) []string {
	out := s[:0]
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			out = append(out, v)
		}
	}
	return out
}

func formatG(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
