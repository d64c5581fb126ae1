// What Compare compares: each transfer and driving-point impedance of the
// original, mapped to its net names in the reduced circuit.

package ac

import (
	"fmt"
	"sort"

	"pare/graph"
	"pare/graph/value"
)

// quantity is one thing to compare: a transfer from→to, or an impedance at from.
type quantity struct {
	what     string
	tank     bool   // an impedance at a tank net (characterise.go)
	from, to string // names in the original
	rFrom    string // names in the reduced circuit
	rTo      string
	bands    []value.Range
}

// quantities lists what to compare, mapping each net to its name in the
// reduced circuit and noting what cannot be mapped.
func quantities(orig, reduced *graph.Circuit, rep *Report) []quantity {
	ql := &quantityList{orig: orig, reduced: reduced, rep: rep, bandsAt: netBands(orig), seen: map[string]bool{}}
	ql.skip = ql.detectorTransfers()
	ql.inputTransfers()
	ql.regionTransfers()
	ql.portImpedances()
	ql.characterise()
	sort.Strings(rep.Notes)
	rep.Notes = dedupeStrings(rep.Notes)
	return ql.qs
}

// quantityList gathers the quantities in order, once each, and writes the
// notes about nets the reduction renamed or removed into the report.
type quantityList struct {
	orig, reduced *graph.Circuit
	rep           *Report
	bandsAt       func(net string) []value.Range
	seen          map[string]bool
	qs            []quantity
	skip          map[string]bool // input\x00output transfers judged past a detector (detpairs.go)
	view          *graph.View     // the original's, for the walks to frequency changers (changer.go)
}

// mapped finds a net of the original in the reduced circuit: under its own
// name, else under the name alt suggests (a declared input or output in the
// same position), else not at all.
func (ql *quantityList) mapped(name string, alt func() string) (string, bool) {
	if ql.reduced.Net(name) != nil {
		return name, true
	}
	if a := alt(); a != "" && ql.reduced.Net(a) != nil {
		ql.rep.Notes = append(ql.rep.Notes, fmt.Sprintf("net %s is %s in the reduced circuit: compared there", name, a))
		return a, true
	}
	ql.rep.Notes = append(ql.rep.Notes, fmt.Sprintf("net %s of the original is gone from the reduced circuit: its pairs are not compared", name))
	return "", false
}

// inputAlt suggests the reduced circuit's i-th input, when both circuits
// declare the same number of inputs.
func (ql *quantityList) inputAlt(i int) func() string {
	list := ql.reduced.Inputs
	return func() string {
		if len(list) == len(ql.orig.Inputs) && list != nil && i < len(list) {
			return list[i]
		}
		return ""
	}
}

// outputAlt suggests the reduced circuit's i-th output, when both circuits
// declare the same number of outputs.
func (ql *quantityList) outputAlt(i int) func() string {
	return func() string {
		if len(ql.reduced.Outputs) == len(ql.orig.Outputs) && i < len(ql.reduced.Outputs) {
			return ql.reduced.Outputs[i]
		}
		return ""
	}
}

func noAlt() string { return "" }

func (ql *quantityList) add(q quantity) {
	key := q.what + "\x00" + q.from + "\x00" + q.to
	if ql.seen[key] || len(q.bands) == 0 {
		return
	}
	ql.seen[key] = true
	ql.qs = append(ql.qs, q)
}

// inputTransfers: every declared input to every declared output.
func (ql *quantityList) inputTransfers() {
	for i, in := range ql.orig.Inputs {
		rin, ok := ql.mapped(in, ql.inputAlt(i))
		if !ok {
			continue
		}
		for j, out := range ql.orig.Outputs {
			if out == in {
				continue
			}
			if ql.skip[in+"\x00"+out] {
				continue
			}
			rout, ok := ql.mapped(out, ql.outputAlt(j))
			if ok {
				ql.add(quantity{what: "transfer", from: in, to: out, rFrom: rin, rTo: rout, bands: ql.bandsAt(in)})
			}
		}
	}
}

// regionTransfers: each region's input to its output, over the region's band.
func (ql *quantityList) regionTransfers() {
	for _, r := range ql.orig.Regions {
		if r.Input == "" || r.Output == "" || r.Input == r.Output || r.Band.Min <= 0 {
			continue
		}
		rr := ql.reduced.Region(r.Name)
		rin, ok1 := ql.mapped(r.Input, func() string {
			if rr != nil {
				return rr.Input
			}
			return ""
		})
		rout, ok2 := ql.mapped(r.Output, func() string {
			if rr != nil {
				return rr.Output
			}
			return ""
		})
		if ok1 && ok2 {
			ql.add(quantity{what: "transfer", from: r.Input, to: r.Output, rFrom: rin, rTo: rout, bands: []value.Range{r.Band}})
		}
	}
}

// portImpedances: the impedance at each input and each port that is not a
// declared rail.
func (ql *quantityList) portImpedances() {
	orig := ql.orig
	var ports []string
	ports = append(ports, orig.Inputs...)
	for _, n := range orig.Nets {
		if n.Role == graph.PortN {
			ports = append(ports, n.Name)
		}
	}
	for _, p := range orig.Parts {
		if p.Kind == graph.Port {
			for _, pin := range p.Pins {
				ports = append(ports, pin.Net)
			}
		}
	}
	portSeen := map[string]bool{}
	for i, net := range ports {
		if portSeen[net] || !usable(net) || orig.RoleOf(net).IsACGround() {
			continue
		}
		portSeen[net] = true
		alt := noAlt
		if i < len(orig.Inputs) {
			alt = ql.inputAlt(i)
		}
		if rn, ok := ql.mapped(net, alt); ok {
			ql.add(quantity{what: "impedance", from: net, rFrom: rn, bands: ql.bandsAt(net)})
		}
	}
}

func dedupeStrings(s []string) []string {
	out := s[:0]
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			out = append(out, v)
		}
	}
	return out
}
