package rules

import (
	"math"
	"sort"
	"strconv"
	"strings"

	"pare/graph"
	"pare/graph/value"
)

// Numbers in a justification: part values as marked (3 significant digits),
// computed values with 5, so a reader can redo the sum.
func ohms(v float64) string {
	if math.IsInf(v, 1) {
		return "∞"
	}
	return value.FormatPrec(v, value.Ohm, value.Symbol, 5)
}

func hz(f float64) string { return value.FormatPrec(f, value.Hertz, value.Symbol, 4) }

func farads(c float64) string { return value.Format(c, value.Farad, value.Symbol) }

func henries(l float64) string { return value.Format(l, value.Henry, value.Symbol) }

func num(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }

func pct(f float64) string { return strconv.FormatFloat(f*100, 'g', 5, 64) + " %" }

// valueText is a part's value as a technician reads it off the diagram.
func valueText(p *graph.Part) string {
	switch p.Kind {
	case graph.Resistor, graph.Pot:
		return value.Format(p.Value.Max, value.Ohm, value.Symbol) + tolText(p)
	case graph.Capacitor:
		s := value.FormatRange(p.Value, value.Farad, value.Symbol)
		switch p.Type {
		case graph.CapTrimmer:
			s += " trimmer set " + farads(p.Set)
		case graph.CapVariable:
			s += " variable"
		case graph.CapElectrolytic:
			s += " electrolytic"
		}
		return s + tolText(p)
	case graph.Inductor:
		s := henries(p.Inductance())
		if p.Type == graph.IndChoke {
			s += " RF choke"
		}
		return s + tolText(p)
	case graph.Valve, graph.BJT, graph.FET, graph.Diode:
		return p.Type
	case graph.Crystal:
		return hz(p.Value.Max) + " crystal"
	case graph.Loudspeaker:
		return value.Format(p.Value.Max, value.Ohm, value.Symbol) + " loudspeaker"
	case graph.Port, graph.Generic:
		return strconv.Quote(p.Label)
	}
	return string(p.Kind)
}

func tolText(p *graph.Part) string {
	if p.Tol == (value.Tolerance{}) {
		return ""
	}
	return " " + p.Tol.String()
}

// describe prints "C12 (100 µF, k–gnd)", with the nets as they were written
// in the input when the part is still as it was, so the reader recognises it
// even after the rails were joined to ground.
func (x *Ctx) describe(p *graph.Part) string {
	nets := x.netsAsWritten(p)
	return p.Ref + " (" + valueText(p) + ", " + strings.Join(nets, "–") + ")"
}

func (x *Ctx) netsAsWritten(p *graph.Part) []string {
	src := p
	if x.orig != nil && len(p.From) == 0 {
		if o := x.orig.Part(p.Ref); o != nil && len(o.Pins) == len(p.Pins) {
			src = o
		}
	}
	out := make([]string, 0, len(src.Pins))
	for _, pin := range src.Pins {
		out = append(out, pin.Net)
	}
	return out
}

// origins flattens the original refs of parts, sorted and unique.
func origins(parts ...*graph.Part) []string {
	seen := map[string]bool{}
	var out []string
	for _, p := range parts {
		for _, o := range p.Origins() {
			if !seen[o] {
				seen[o] = true
				out = append(out, o)
			}
		}
	}
	sort.Strings(out)
	return out
}

// refLess orders refs the way a technician counts them: letters, then the
// number as a number (C2 before C12), then the section letter.
func refLess(a, b string) bool {
	pa, na, sa := splitRef(a)
	pb, nb, sb := splitRef(b)
	if pa != pb {
		return pa < pb
	}
	if na != nb {
		return na < nb
	}
	if sa != sb {
		return sa < sb
	}
	return a < b
}

func splitRef(r string) (string, int, string) {
	i := 0
	for i < len(r) && (r[i] < '0' || r[i] > '9') {
		i++
	}
	j := i
	for j < len(r) && r[j] >= '0' && r[j] <= '9' {
		j++
	}
	n, _ := strconv.Atoi(r[i:j])
	return r[:i], n, r[j:]
}

// electrode names a terminal of an active part in the trade's words.
func electrode(p *graph.Part, pin string) string {
	switch p.Kind {
	case graph.Valve:
		switch {
		case pin == "a" || pin == "a1" || pin == "a2":
			return "anode"
		case pin == "k":
			return "cathode"
		case pin == "g1":
			return "grid"
		case pin == "h" || pin == "h1" || pin == "h2":
			return "heater"
		case pin == "s":
			return "shield"
		case strings.HasPrefix(pin, "g"):
			return "grid " + pin
		}
	case graph.BJT:
		switch pin {
		case "b":
			return "base"
		case "c":
			return "collector"
		case "e":
			return "emitter"
		}
	case graph.Diode:
		switch pin {
		case "a":
			return "anode"
		case "k":
			return "cathode"
		}
	case graph.FET:
		switch pin {
		case "g":
			return "gate"
		case "d":
			return "drain"
		case "s":
			return "source"
		case "b":
			return "body"
		}
	}
	return "terminal " + pin
}
