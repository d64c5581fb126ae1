package rules

import (
	"math"

	"pare/graph"
)

// supply-line: a line fed from a supply rail through a resistor or choke and
// held to AC ground by a capacitor of its own (a smoothed HT2 after the
// reservoir, a decoupled Vcc line) is a supply, not a signal net. The bypass
// rule misses such a line at an audio band's low edge: its bound counts every
// feed and decoupler hanging on the line, each a resistor to a rail, as
// something the capacitor must swamp, and a screen's stopper as if nothing
// stood behind it, so a 50 µF smoothing capacitor on a line carrying six
// decouplers was "no bypass" (a five-valve AC/DC set's HT2: 63.7 Ω at 50 Hz
// against 77 Ω), the line stayed a signal net, its feeds merged with the
// decouplers into one made-up resistor and the capacitor joined an audio
// stage. What makes the line a supply is the section itself: the capacitor,
// not the feed, sets the line's impedance at every signal frequency (its
// reactance at the band's low edge below lineCorner times the feed's), and
// whether what is left on the line matters to the signal is the solver's
// call: the step is proven by AC analysis like every other, and refused
// when grounding the line moves the response. Lines the bypass rule grounds
// are left to it, so a decoupler at an IF can keeps its usual reason.
var supplyLine = Rule{
	Name:      "supply-line",
	Purpose:   "a line fed from a supply through a resistor or choke and held by its own capacitor is a supply rail, AC ground",
	Level:     LevelSignal,
	Kinds:     []graph.Kind{graph.Capacitor},
	Symmetric: true,
	Match: func(x *Ctx, a Anchor) *Plan {
		p, net, gnd, ok := shuntToGround(x, a)
		if !ok {
			return nil
		}
		if x.RoleOf(net) != graph.Signal || !x.onlySupplied(net) {
			return nil
		}
		feed, _ := x.lineFeed(net, 0)
		if feed == nil {
			return nil
		}
		return &Plan{Parts: []*graph.Part{p}, Nets: []string{net, gnd}}
	},
	Guard: supplyLineGuard,
	Apply: groundThroughCap,
}

// lineCorner bounds a smoothing or decoupling section's capacitor against
// its feed at the lowest signal frequency: |Xc| at most half the feed's
// impedance puts the section's corner at or below half the band's low edge,
// so the capacitor holds the line over the whole band (judgement: a smoothing
// section is designed with its corner far below the audio band, common
// practice; the step's AC proof decides the rest).
const lineCorner = 0.5

func supplyLineGuard(x *Ctx, m *Plan) (bool, string) {
	p, net := m.Parts[0], m.Nets[0]
	if ok, _ := bypassGuard(x, m); ok {
		return false, "" // a bypass by its own bound: that rule's step, with its reason
	}
	lo, hi, from, ok := x.bandOn([]*graph.Part{p}, net)
	if !ok {
		return false, ""
	}
	d := x.describe(p)
	if l, lh, fLo, fHi, tuned := x.resonance([]string{net}, capMin(p), capMax(p), lo, hi, p); tuned {
		return false, d + ": with " + l.Ref + " (" + henries(lh) + ") it resonates at " + hz(fLo) + rangeTail(fLo, fHi) + ": a tuned circuit, not a supply line"
	}
	feed, zf := x.lineFeed(net, lo)
	xc := 1 / (omega(lo) * capMin(p))
	rail := x.c.ReturnOf(*feedPin(feed, net))
	name := net
	if rail != nil {
		name = rail.Name
		if rail.Label != "" {
			name += " (" + rail.Label + ")"
		}
	}
	at := "|Xc| at " + x.bandWhy(lo, from, p) + " = " + ohms(xc)
	fed := net + " is fed from " + name + " through " + feed.Ref + " (" + ohms(zf) + ")"
	if xc <= lineCorner*zf {
		return true, d + ": " + fed + "; " + at + " ≤ " + num(lineCorner) + " × " + ohms(zf) +
			": the capacitor holds the line at every signal frequency → " + net + " is a supply line, AC ground (the step's AC proof checks what is left on it)"
	}
	if xc > zf {
		return false, "" // a load fed from the supply (an anode and its bypass), no section at all
	}
	return false, d + ": " + fed + "; " + at + " > " + num(lineCorner) + " × " + ohms(zf) + ": the feed, not the capacitor, sets the line's impedance at the band's low edge; not a supply line"
}

// lineFeed is the resistor or choke that feeds net from a declared supply
// rail (a supply net, or an AC-ground net its terminal returned to such a
// rail on), the one of least impedance at f, with that impedance; nil when
// none feeds the net. A line fed from a reservoir the netlist leaves
// undeclared (estimated from its rectifier for the small-signal work) is
// left to the bypass rule, as its reservoir is drawn wired: the note on
// that reservoir asks for both to be declared.
func (x *Ctx) lineFeed(net string, f float64) (*graph.Part, float64) {
	var best *graph.Part
	bestZ := math.Inf(1)
	for _, cn := range x.Conns(net) {
		q := cn.Part
		if len(q.Pins) != 2 || !(q.Kind == graph.Resistor || q.Kind == graph.Inductor && len(q.Windings) <= 1) {
			continue
		}
		far := q.Pins[0]
		if far.Name == cn.Pin {
			far = q.Pins[1]
		}
		if far.Net == net {
			continue
		}
		if ret := x.c.ReturnOf(far); ret == nil || ret.Role != graph.Supply || !ret.Declared {
			continue // no supply, or one the netlist does not declare (a reservoir estimated from its rectifier)
		}
		z := q.Value.Max
		if q.Kind == graph.Inductor {
			z = omega(f) * q.Inductance()
		}
		if best == nil || z < bestZ || z == bestZ && q.Ref < best.Ref {
			best, bestZ = q, z
		}
	}
	return best, bestZ
}

// feedPin is the feed's terminal away from net.
func feedPin(q *graph.Part, net string) *graph.Pin {
	if q.Pins[0].Net == net {
		return &q.Pins[1]
	}
	return &q.Pins[0]
}

// onlySupplied reports whether net is a line that supplies devices and
// nothing else: it carries supply current on (a screen on the line, or an
// anode, screen or collector one resistor, choke or winding away), no
// device takes its control, common or output electrode from the line
// itself (a grid, base or cathode held by a capacitor is a bias point or a
// bypassed cathode; an anode so held is a follower's, the bypass rule's to
// judge), no winding leads from it to a control electrode (the cold end of
// an input winding carries the signal's return), and the capacitor judged
// is the only one to AC ground on it (two in parallel merge first, then the
// bypass rule judges them as one).
func (x *Ctx) onlySupplied(net string) bool {
	supplied, caps := false, 0
	for _, cn := range x.Conns(net) {
		q := cn.Part
		switch {
		case q.IsActive():
			if graph.RoleOfPin(q.Kind, cn.Pin) != graph.RoleGrid {
				return false
			}
			supplied = true
		case q.Kind == graph.Capacitor && len(q.Pins) == 2:
			if far := otherPin(q, cn.Pin); x.IsACGround(far.Net) {
				caps++
			}
		case q.Kind == graph.Resistor || q.Kind == graph.Inductor || q.Kind == graph.Transformer:
			for _, far := range farEnds(q, cn.Pin) {
				if far.Net == net || far.Net == "nc" || x.IsACGround(far.Net) {
					continue
				}
				s, control := x.electrodesOn(far.Net)
				if control && len(q.Pins) > 2 || control && q.Kind != graph.Resistor {
					return false // a winding into a grid or base: the signal's return
				}
				supplied = supplied || s
			}
		}
	}
	return supplied && caps == 1
}

// farEnds are the terminals a two-pin resistor or choke, or the winding of a
// coil or transformer on pin, lead to from pin.
func farEnds(q *graph.Part, pin string) []graph.Pin {
	if len(q.Windings) == 0 {
		if len(q.Pins) != 2 {
			return nil
		}
		return []graph.Pin{otherPin(q, pin)}
	}
	var out []graph.Pin
	for _, w := range q.Windings {
		far := ""
		switch pin {
		case w.From:
			far = w.To
		case w.To:
			far = w.From
		default:
			continue
		}
		if pn := q.Pin(far); pn != nil {
			out = append(out, *pn)
		}
	}
	return out
}

func otherPin(q *graph.Part, pin string) graph.Pin {
	if q.Pins[0].Name == pin {
		return q.Pins[1]
	}
	return q.Pins[0]
}

// electrodesOn says whether a device's output electrode or further grid (an
// anode, a screen, a collector) is on net, and whether a control electrode
// is.
func (x *Ctx) electrodesOn(net string) (supplied, control bool) {
	for _, cn := range x.Conns(net) {
		if !cn.Part.IsActive() {
			continue
		}
		switch graph.RoleOfPin(cn.Part.Kind, cn.Pin) {
		case graph.RoleOutput, graph.RoleGrid:
			supplied = true
		case graph.RoleControl:
			control = true
		}
	}
	return supplied, control
}
