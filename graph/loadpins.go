// Reading a part's pins (list or table), checking the terminals a kind needs,
// and the net names they connect to.

package graph

import (
	"fmt"
	"sort"
	"strconv"
	"strings"
)

func (ld *loader) pins(path string, p *Part, v any) {
	pp := path + ".pins"
	if v == nil {
		ld.errKey(path, "part %s has no pins", p.Ref)
		return
	}
	switch t := v.(type) {
	case []any:
		names := ArrayPins(p.Kind, p.Type, len(t))
		if len(p.Windings) == 2 && p.Kind == Inductor && len(t) != 3 {
			ld.errVal(pp, "a tapped coil has three pins: [end, tap, end]")
			return
		}
		if names == nil {
			ld.errVal(pp, "%s %s cannot take %s as a list; %s", p.Kind, p.Ref, plural(len(t), "pin"), pinHint(p))
			return
		}
		if len(t) > 0 {
			p.Pins = make([]Pin, 0, len(t)) // sized once: a part's pins were a fifth of its allocations
		}
		for i, e := range t {
			net, ok := e.(string)
			if !ok || !isNetName(net) { // the path only for the message
				net = ld.netName(pp+"["+strconv.Itoa(i)+"]", e)
			}
			p.Pins = append(p.Pins, Pin{Name: names[i], Net: net, Pos: ld.ix.elemVal(pp, i)})
		}
	case map[string]any:
		allowed := Terminals(p.Kind, p.Type)
		switch p.Kind {
		case Transformer:
			for _, w := range p.Windings {
				allowed = appendNew(allowed, w.From, w.To)
			}
		case Switch:
			for _, pos := range p.Closes {
				for _, pr := range pos {
					allowed = appendNew(allowed, pr[0], pr[1])
				}
			}
		}
		var guessed []string // terminals a misspelt name was taken for: not reported missing as well
		if len(t) > 0 {
			p.Pins = make([]Pin, 0, len(t))
		}
		for _, name := range sortedKeys(t) {
			ep := pp + "." + name
			if allowed != nil && p.Kind != Generic && p.Kind != Switch && !contains(allowed, name) {
				// A misspelt terminal is most likely one not written yet:
				// "p3" beside p1 means p2.
				var unused []string
				for _, a := range allowed {
					if _, given := t[a]; !given {
						unused = append(unused, a)
					}
				}
				g := Suggest(name, unused)
				if g == "" {
					g = Suggest(name, allowed)
				}
				hint := ""
				if g != "" {
					hint = fmt.Sprintf(" (did you mean %q?)", g)
					guessed = append(guessed, g)
				}
				ld.errKey(ep, "%s %s has no terminal %q%s; terminals: %s", kindLabel(p), p.Ref, name, hint, strings.Join(allowed, " "))
				continue
			}
			p.Pins = append(p.Pins, Pin{Name: name, Net: ld.netName(ep, t[name]), Pos: ld.ix.key(ep)})
		}
		ld.requiredPins(pp, p, guessed)
		sortPins(p)
	default:
		ld.errVal(pp, "pins must be a list of nets or a table of terminal = net")
	}
}

func pinHint(p *Part) string {
	switch p.Kind {
	case Valve, BJT, FET, Transformer, Switch, Generic:
		return "name the terminals in a table, e.g. pins = { " + examplePins(p) + " }"
	}
	return "give " + strconv.Itoa(len(Terminals(p.Kind, p.Type))) + " nets"
}

func examplePins(p *Part) string {
	switch p.Kind {
	case Valve:
		return `a = "anode", g1 = "grid", k = "cathode"`
	case BJT:
		return `b = "base", c = "coll", e = "emit"`
	case FET:
		return `g = "gate", d = "drain", s = "source"`
	case Transformer:
		return `p1 = "a", p2 = "ht", s1 = "out", s2 = "gnd"`
	}
	return `"1" = "a", "2" = "b"`
}

func kindLabel(p *Part) string {
	if p.Type != "" && p.Kind != Capacitor && p.Kind != Inductor {
		return p.Type
	}
	return string(p.Kind)
}

func appendNew(list []string, names ...string) []string {
	for _, n := range names {
		if !contains(list, n) {
			list = append(list, n)
		}
	}
	return list
}

// requiredPins checks that a part written with a pin table names every terminal it must have.
func (ld *loader) requiredPins(path string, p *Part, guessed []string) {
	var need []string
	switch p.Kind {
	case Valve:
		need = valveElectrodes[p.Type]
	case BJT:
		need = []string{"b", "c", "e"}
	case FET:
		need = []string{"g", "d", "s"}
	case Transformer:
		for _, w := range p.Windings {
			need = appendNew(need, w.From, w.To)
		}
	case Resistor, Capacitor, Crystal, Diode, Pot, Port, Loudspeaker:
		need = Terminals(p.Kind, p.Type)
	case Inductor:
		need = []string{"1", "2"}
		if len(p.Windings) == 2 {
			need = []string{"1", "t", "2"}
		}
	}
	var missing []string
	for _, n := range need {
		if p.Pin(n) == nil && !contains(guessed, n) {
			missing = append(missing, n)
		}
	}
	if len(missing) > 0 {
		ld.errVal(path, "%s %s: terminal %s not connected (write it to a net, or to \"nc\" if it is really unconnected)", kindLabel(p), p.Ref, strings.Join(missing, ", "))
	}
}

// sortPins puts pins in the kind's terminal order, then by name.
func sortPins(p *Part) {
	order := Terminals(p.Kind, p.Type)
	rank := func(n string) int {
		for i, o := range order {
			if o == n {
				return i
			}
		}
		return len(order)
	}
	sort.SliceStable(p.Pins, func(i, j int) bool {
		ri, rj := rank(p.Pins[i].Name), rank(p.Pins[j].Name)
		if ri != rj {
			return ri < rj
		}
		return p.Pins[i].Name < p.Pins[j].Name
	})
}

func (ld *loader) netName(path string, v any) string {
	s, ok := v.(string)
	if !ok {
		ld.errVal(path, "a pin's net must be a name in quotes, not %s", typeName(v))
		return ""
	}
	if !isNetName(s) {
		ld.errVal(path, "net name %q: use letters, digits and _ + - . only", s)
	}
	return s
}
