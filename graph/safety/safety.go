// Package safety decides what kind of set a circuit belongs to for the
// bench (mains or valve HT, AC/DC with a possibly live chassis, battery
// only) and holds the one set of caution texts that pare prints: on the
// sheets, in the repair note and under every text report. It reads only the
// circuit model, so the renderer and the commands can share it without
// knowing about reductions or stages.
//
// The choice is made from the original circuit, never from a reduced one: a
// reduction removes heaters, rails and supplies, which is exactly the
// evidence this package looks at. When the netlist does not show what
// powers the set, the caution says so and assumes the worst.
package safety

import (
	"fmt"
	"math"
	"regexp"
	"strings"

	"pare/graph"
)

// Class is what the netlist shows of how the set is powered.
type Class int

// Classes, from the least known to the most dangerous; the order is used
// nowhere but in tests.
const (
	// Unknown: no valves, no mains parts and no rail voltage declared, so
	// nothing says the set is low voltage. The caution assumes mains and HT.
	Unknown Class = iota
	// Battery: no valves, nothing from the mains, every declared rail at
	// or below LowVolts.
	Battery
	// MainsHT: valves, a mains transformer, a rectifier or a mains input,
	// or a rail above LowVolts.
	MainsHT
	// LiveChassis: fed from the mains without a mains transformer: a
	// series heater chain, a rectifier on the mains input, or a mains input
	// that feeds no transformer (an AC/DC or "universal" set).
	LiveChassis
	// BatteryValve: valves, every source a battery (the netlist names a
	// battery), and nothing from the mains: no mains input or transformer,
	// no rectifier, no heater chain. Its HT (45–135 V) can still shock,
	// and HT on the filament line blows every valve.
	BatteryValve
	// OutsideSupply: as Battery, but a port or rail names the low-voltage
	// supply it comes from (a bench supply, an adaptor, a supply board)
	// and nothing names a battery: the circuit is low voltage, the supply
	// feeding it may be mains equipment, and "never short the battery"
	// said of a board fed from a supply is wrong about the set.
	OutsideSupply
)

var classNames = [...]string{Unknown: "unknown", Battery: "battery", MainsHT: "mains-ht", LiveChassis: "live-chassis",
	BatteryValve: "battery-valve", OutsideSupply: "outside-supply"}

// String gives the class's name as tests and JSON show it.
func (c Class) String() string {
	if c >= 0 && int(c) < len(classNames) {
		return classNames[c]
	}
	return fmt.Sprintf("Class(%d)", int(c))
}

// LowVolts is the highest rail voltage a set may have and still count as
// low voltage: the 50 V of the extra-low-voltage band (IEC 60449, band I,
// stated there for AC; applied to DC rails too, which errs on the safe side).
const LowVolts = 50

// Assessment is the class of a circuit with the evidence for it.
type Assessment struct {
	Class Class
	// MaxVolts is the largest declared rail voltage (magnitude), 0 when
	// none is declared.
	MaxVolts float64
	// Valves counts the valves (sections of one envelope each count).
	Valves int
	// Mains is set when the netlist shows a mains input or a mains
	// transformer: the caution then speaks of the mains side, whatever
	// the set's own rails are.
	Mains bool
	// Evidence names what the choice rests on, in the order found
	// ("valve V1", "rail above 50 V: ht 250 V"); empty for Unknown.
	Evidence []string
	// HotHeaters names each transformer winding that feeds a valve's
	// heater and sits on the HT ("T9 winding r, V8's heater, on ht_res"):
	// a directly heated rectifier's filament is its cathode, at full HT.
	HotHeaters []string
}

// evidence is what Assess collects while walking the circuit once: one
// list of short items per kind of finding, in circuit order.
type evidence struct {
	valves, highRails, lowRails []string
	mainsNets                   map[string]bool
	mainsInputs                 []string // parts or nets that bring the mains in
	mainsTransformers           []string
	rectifiers                  []string
	mainsRectifiers             []string        // rectifiers with a pin on a mains net
	chain                       []string        // heaters in series, or a heater net above LowVolts
	hot                         map[string]bool // nets at HT: rails above LowVolts, rectifier cathodes
	hotHeaters                  []string        // heater windings on a hot net
	acdc                        []string        // labels that say AC/DC outright
	batteries                   []string        // nets, ports and parts a label calls a battery
	outside                     []string        // ports and rails a label calls an outside supply
	maxVolts                    float64
}

// Assess classifies a circuit. A nil circuit is Unknown.
func Assess(c *graph.Circuit) Assessment {
	if c == nil {
		return Assessment{Class: Unknown}
	}
	ev := collect(c)
	a := Assessment{MaxVolts: ev.maxVolts, Valves: len(ev.valves), HotHeaters: ev.hotHeaters,
		Mains: len(ev.mainsInputs)+len(ev.mainsTransformers) > 0}
	var unfed []string // a mains input that feeds no transformer
	if len(ev.mainsTransformers) == 0 {
		unfed = ev.mainsInputs
	}
	switch {
	case len(ev.acdc)+len(ev.chain)+len(ev.mainsRectifiers)+len(unfed) > 0:
		a.Class = LiveChassis
		a.Evidence = summary(
			group{"said AC/DC by", ev.acdc}, group{"series heaters:", ev.chain},
			group{"rectifier(s) on the mains:", ev.mainsRectifiers}, group{"mains input(s) with no mains transformer:", unfed},
			group{"valve(s)", ev.valves}, group{"rail(s) above 50 V:", ev.highRails})
	case len(ev.valves) > 0 && len(ev.batteries) > 0 && len(ev.mainsInputs)+len(ev.mainsTransformers)+len(ev.rectifiers) == 0:
		a.Class = BatteryValve
		a.Evidence = summary(
			group{"valve(s)", ev.valves}, group{"battery source(s):", ev.batteries})
		a.Evidence = append(a.Evidence, "no mains input, mains transformer or rectifier")
	case len(ev.valves)+len(ev.highRails)+len(ev.mainsInputs)+len(ev.mainsTransformers)+len(ev.rectifiers) > 0:
		a.Class = MainsHT
		a.Evidence = summary(
			group{"valve(s)", ev.valves}, group{"rail(s) above 50 V:", ev.highRails},
			group{"mains transformer(s)", ev.mainsTransformers}, group{"rectifier(s)", ev.rectifiers},
			group{"mains input(s)", ev.mainsInputs})
	case len(ev.lowRails) > 0 && len(ev.batteries) == 0 && len(ev.outside) > 0:
		a.Class = OutsideSupply
		a.Evidence = summary(group{"no valves, no mains parts, rail(s) at 50 V or below:", ev.lowRails},
			group{"fed from outside by", ev.outside})
	case len(ev.lowRails) > 0:
		a.Class = Battery
		a.Evidence = summary(group{"no valves, no mains parts, rail(s) at 50 V or below:", ev.lowRails})
	}
	return a
}

// group is one kind of evidence and the items found for it; "(s)" in what
// becomes a plural "s" for more than one item.
type group struct {
	what  string
	items []string
}

// summary writes each non-empty group as one line, naming at most four
// items: a set with twelve valves needs no list of twelve to be believed.
func summary(gs ...group) []string {
	var out []string
	for _, g := range gs {
		if len(g.items) == 0 {
			continue
		}
		items := g.items
		more := ""
		if len(items) > 4 {
			items, more = items[:4], fmt.Sprintf(" and %d more", len(g.items)-4)
		}
		plural := ""
		if len(g.items) > 1 {
			plural = "s"
		}
		out = append(out, strings.ReplaceAll(g.what, "(s)", plural)+" "+strings.Join(items, ", ")+more)
	}
	return out
}

func collect(c *graph.Circuit) *evidence {
	ev := &evidence{mainsNets: map[string]bool{}, hot: map[string]bool{}}
	// Mains ports and parts first: a net they already name is not listed
	// again on its own.
	for _, p := range c.Parts {
		if (p.Kind == graph.Port || p.Kind == graph.Generic) && saysMains(p.Label) {
			for _, pin := range p.Pins {
				ev.mainsNets[pin.Net] = true
			}
			what := p.Ref + " " + quote(p.Label)
			ev.mainsInputs = append(ev.mainsInputs, what)
			if offSheetTransformer.MatchString(p.Label) {
				// "from the mains transformer": the transformer is there,
				// only cut away from this sheet.
				ev.mainsTransformers = append(ev.mainsTransformers, "off the sheet ("+p.Ref+")")
			}
		}
		if saysACDC(p.Label) {
			ev.acdc = append(ev.acdc, p.Ref)
		}
		if (p.Kind == graph.Port || p.Kind == graph.Generic) && batteryWord.MatchString(p.Label) {
			ev.batteries = append(ev.batteries, p.Ref)
		}
		if (p.Kind == graph.Port || p.Kind == graph.Generic) && outsideSupplyWord.MatchString(p.Label) {
			ev.outside = append(ev.outside, p.Ref+" "+quote(p.Label))
		}
	}
	for _, n := range c.Nets {
		if n.Role == graph.Supply || n.Role == graph.Bias || n.Role == graph.Heater {
			railEvidence(ev, n)
		}
		if (saysMains(n.Name) || saysMains(n.Label)) && !ev.mainsNets[n.Name] {
			ev.mainsNets[n.Name] = true
			ev.mainsInputs = append(ev.mainsInputs, "net "+n.Name)
			if offSheetTransformer.MatchString(n.Label) {
				ev.mainsTransformers = append(ev.mainsTransformers, "off the sheet (net "+n.Name+")")
			}
		}
		if saysACDC(n.Label) {
			ev.acdc = append(ev.acdc, "net "+n.Name)
		}
		if n.Role != graph.Signal && (batteryWord.MatchString(n.Name) || batteryWord.MatchString(n.Label)) {
			ev.batteries = append(ev.batteries, "net "+n.Name)
		}
		if n.Role == graph.Supply && outsideSupplyWord.MatchString(n.Label) {
			ev.outside = append(ev.outside, "net "+n.Name+" "+quote(n.Label))
		}
	}
	if saysACDC(c.Title) {
		ev.acdc = append(ev.acdc, "the title")
	}
	spreadMains(c, ev.mainsNets)
	supply := map[string]bool{}
	for _, n := range c.Nets {
		if n.Role == graph.Supply {
			supply[n.Name] = true
		}
	}
	for _, p := range c.Parts {
		partEvidence(ev, c, p, supply)
	}
	for _, t := range []struct{ what, text string }{{"the title", c.Title}, {"the netlist's note", c.Note}} {
		// "The 18 V rail comes from a mains transformer and bridge in the
		// set (not on this sheet)": with no mains transformer drawn, the
		// sheet is cut from a set fed through one (review19 b04 got the
		// battery caution). A note that denies the transformer is no
		// evidence.
		if len(ev.mainsTransformers) == 0 && mainsTransformerWord.MatchString(t.text) && !noTransformer.MatchString(t.text) {
			ev.mainsTransformers = append(ev.mainsTransformers, "off the sheet ("+t.what+")")
		}
	}
	ev.chain = append(ev.chain, seriesHeaters(c)...)
	ev.hotHeaters = hotHeaterWindings(c, ev.hot)
	return ev
}

// fuseWord finds a fuse in a generic part's label ("fuse 1 A", "F1 fuse").
var fuseWord = regexp.MustCompile(`(?i)\bfuse`)

// passes lists the terminal pairs of a part that carry the mains through:
// every contact pair a switch closes in some position, and both ends of a
// two-terminal generic part called a fuse.
func passes(p *graph.Part) [][2]string {
	switch {
	case p.Kind == graph.Switch:
		var out [][2]string
		for _, pos := range p.Closes {
			out = append(out, pos...)
		}
		return out
	case p.Kind == graph.Generic && len(p.Pins) == 2 && fuseWord.MatchString(p.Label):
		return [][2]string{{p.Pins[0].Name, p.Pins[1].Name}}
	}
	return nil
}

// railEvidence sorts a declared rail into high or low; a heater net
// declared above LowVolts is a series chain across the mains.
func railEvidence(ev *evidence, n *graph.Net) {
	v := math.Abs(n.Volts)
	if v == 0 {
		return
	}
	ev.maxVolts = math.Max(ev.maxVolts, v)
	what := fmt.Sprintf("%s %s V", n.Name, volts(n.Volts))
	switch {
	case n.Role == graph.Heater && v > LowVolts:
		ev.chain = append(ev.chain, fmt.Sprintf("heater net %s at %s V", n.Name, volts(n.Volts)))
	case v > LowVolts:
		ev.highRails = append(ev.highRails, what)
		ev.hot[n.Name] = n.Role == graph.Supply
	default:
		ev.lowRails = append(ev.lowRails, what)
	}
}

// partEvidence looks at one part: valves, rectifiers, mains transformers.
func partEvidence(ev *evidence, c *graph.Circuit, p *graph.Part, supply map[string]bool) {
	onMains := false
	for _, pin := range p.Pins {
		onMains = onMains || ev.mainsNets[pin.Net]
	}
	switch p.Kind {
	case graph.Valve:
		ev.valves = append(ev.valves, p.Ref)
		// A valve diode with its cathode on a supply rail charges the
		// reservoir: a rectifier. One on a signal net is a detector.
		if (p.Type == "diode" || p.Type == "double-diode") && (supply[p.NetOf("k")] || fedByMainsWinding(c, p)) {
			ev.rectifiers = append(ev.rectifiers, p.Ref)
			ev.hot[p.NetOf("k")] = true // the HT it charges, declared or estimated
			if onMains {
				ev.mainsRectifiers = append(ev.mainsRectifiers, p.Ref)
			}
		}
	case graph.Diode:
		if p.Type == "rectifier" {
			ev.rectifiers = append(ev.rectifiers, p.Ref)
			if onMains {
				ev.mainsRectifiers = append(ev.mainsRectifiers, p.Ref)
			}
		}
	case graph.Transformer:
		if onMains {
			ev.mainsTransformers = append(ev.mainsTransformers, p.Ref)
		}
	}
}

var (
	mainsWord           = regexp.MustCompile(`(?i)(^|[^a-z])mains([^a-z]|$)`)
	mainsAC             = regexp.MustCompile(`(?i)\b(\d{3})\s*v\s*(~|ac\b|a\.c\.)`)
	offSheetTransformer = regexp.MustCompile(`(?i)transformer`)
	// mainsTransformerWord finds a set's text naming its mains
	// transformer ("from a mains transformer and bridge"; a "mains
	// adaptor" is not one: a battery set may be run from a safe
	// extra-low-voltage adaptor), noTransformer one that denies it ("no
	// mains transformer", "without a mains transformer", "transformerless").
	mainsTransformerWord = regexp.MustCompile(`(?i)\bmains[\s-]+transformer`)
	noTransformer        = regexp.MustCompile(`(?i)\b(no|not|without|never)\s+(a\s+|any\s+)?mains[\s-]+transformer|transformerless`)
	// mainsUnitWord names a unit that makes a low voltage from the mains.
	mainsUnitWord = regexp.MustCompile(`(?i)\bmains\s+(unit|adapt[oe]r|psu|pack|power\s+unit|supply\s+unit)\b`)
	// statedVolts finds a voltage a label states, with an AC mark if any.
	statedVolts = regexp.MustCompile(`(?i)([+-]?\d+(?:\.\d+)?)\s*v(\s*(?:~|ac\b|a\.c\.))?(?:[^a-z]|$)`)
	acdcWord    = regexp.MustCompile(`(?i)\bac\s*[/-]\s*dc\b|\buniversal\b`)
	// batteryWord finds a battery named as a source ("HT +90 V battery",
	// "LT cell", "B+ batt"); a battery set's supplies say so.
	batteryWord = regexp.MustCompile(`(?i)\bbatt(ery|eries)?\b|\bcells?\b`)
	// outsideSupplyWord finds a low-voltage supply named as coming from
	// outside the circuit ("+12 V from the supply board", "bench PSU",
	// "9 V adaptor", "regulated 15 V"), not the bare word "supply", which
	// a battery set's rail may carry too.
	outsideSupplyWord = regexp.MustCompile(`(?i)\bbench\b|\bpsu\b|\badapt[oe]r\b|\b(supply|mains|power)\s+(board|unit|module)\b|` +
		`\bpower\s+supply\b|\bfrom\s+(the|a|an)\s+([\w+.-]+\s+)?supply\b|\bregulat(or|ed)\b`)
)

func saysMains(s string) bool {
	if s == "" {
		return false
	}
	if mainsWord.MatchString(s) && !lowVoltsFromMainsUnit(s) {
		return true
	}
	for _, m := range mainsAC.FindAllStringSubmatch(s, -1) {
		var v int
		fmt.Sscan(m[1], &v)
		if v >= 100 && v <= 250 {
			return true
		}
	}
	return false
}

// lowVoltsFromMainsUnit is a label naming a low DC voltage that a mains
// unit makes ("+12 V from the mains unit", "9 V mains adaptor"): the
// circuit is fed the low voltage, not the mains (a bench oscillator whose
// port said so got the live-chassis caution). A voltage marked AC, or one
// over 50 V, is no such feed.
func lowVoltsFromMainsUnit(s string) bool {
	if !mainsUnitWord.MatchString(s) || mainsAC.MatchString(s) {
		return false
	}
	low := false
	for _, m := range statedVolts.FindAllStringSubmatch(s, -1) {
		var v float64
		fmt.Sscan(strings.TrimPrefix(m[1], "+"), &v)
		if m[2] != "" || v > 50 || v < -50 {
			return false
		}
		low = true
	}
	return low
}

func saysACDC(s string) bool { return s != "" && acdcWord.MatchString(s) }

func quote(s string) string { return "“" + strings.TrimSpace(s) + "”" }

// volts prints a rail voltage without trailing zeros: 250, 90.5, -12.
func volts(v float64) string { return fmt.Sprintf("%g", v) }
