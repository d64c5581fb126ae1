package graph

import (
	"fmt"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"pare/graph/value"
)

// plausible value ranges per kind, in SI units. Outside them a value is far
// more likely a slip of the pen (47 F for 47 nF, 1 mΩ for 1 MΩ) than a real
// part. The limits are generous on purpose (common practice, no source).
var plausible = map[Kind][2]float64{
	Resistor:  {0.1, 100e6},
	Capacitor: {0.1e-12, 0.1},
	Inductor:  {10e-9, 1000},
	Crystal:   {1e3, 500e6},
	// 2–16 Ω moving coils and the 600–800 Ω of early high-impedance
	// speakers, with room either side (common practice, no source).
	Loudspeaker: {1, 5e3},
	Pot:         {1, 50e6},
}

// limitText prints a plausibility limit; farads from a millifarad up are
// printed in farads ("0.1 F", not "100000 µF").
func limitText(v float64, u value.Unit) string {
	if u == value.Farad && v >= 1e-3 {
		return fmt.Sprintf("%g F", v)
	}
	return value.Format(v, u, value.Symbol)
}

// unitOf gives the unit of a kind's main value, for messages.
func unitOf(k Kind) value.Unit {
	switch k {
	case Resistor, Pot, Loudspeaker:
		return value.Ohm
	case Capacitor:
		return value.Farad
	case Inductor:
		return value.Henry
	case Crystal:
		return value.Hertz
	}
	return value.None
}

// Check looks for the transcription mistakes people make when copying a
// paper diagram: things that load fine but are almost surely wrong. Each
// finding is a warning with the position of the part or net concerned.
func Check(c *Circuit) ErrorList {
	var w ErrorList
	transistors := false
	for _, p := range c.Parts {
		if p.Kind == BJT || p.Kind == FET {
			transistors = true
		}
	}
	for _, n := range c.Nets {
		if n.Name == "nc" {
			continue
		}
		cs := c.ConnsOf(n.Name)
		switch {
		case len(cs) == 0 && !c.IsEnd(n.Name):
			w.Add(n.Pos, "net %s is declared but nothing connects to it", n.Name)
		case len(cs) == 1 && !n.Role.IsACGround() && n.Role != PortN && !c.IsEnd(n.Name) && cs[0].Part.Kind != Port &&
			!isCommonPin(cs[0]): // a lone cathode/emitter/source gets its own, plainer warning below
			w.Add(cs[0].Part.Pin(cs[0].Pin).Pos, "net %s has only one connection (%s.%s): a wire missing, or a typo in the net name?", n.Name, cs[0].Part.Ref, cs[0].Pin)
		}
	}
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			if pin.Net == "nc" && RoleOfPin(p.Kind, pin.Name) != RoleHeater && RoleOfPin(p.Kind, pin.Name) != RoleShield {
				w.Add(pin.Pos, "%s terminal %s is marked unconnected (nc)", p.Ref, pin.Name)
			}
		}
		if p.IsActive() {
			common := p.PinWithRole(RoleCommon)
			if net := p.NetOf(common); net != "" && net != "nc" && len(c.ConnsOf(net)) == 1 && !c.RoleOf(net).IsACGround() {
				w.Add(p.Pin(common).Pos, "%s's %s (%s) goes nowhere: net %s has no other connection", p.Ref, electrodeName(p, common), common, net)
			}
		}
		implausible := false
		if msg := bareCapacitor(p); msg != "" {
			w.Add(p.bareValue, "%s", msg)
			implausible = true // one warning per part
		}
		if lim, ok := plausible[p.Kind]; ok && !implausible {
			u := unitOf(p.Kind)
			for _, v := range []float64{p.Value.Min, p.Value.Max} {
				if v != 0 && (v < lim[0] || v > lim[1]) {
					w.Add(p.Pos, "%s = %s is far outside the usual range for a %s (%s to %s): check the multiplier", p.Ref,
						value.Format(v, u, value.Symbol), p.Kind, limitText(lim[0], u), limitText(lim[1], u))
					implausible = true
					break
				}
			}
		}
		// Valve interstage coupling capacitors are nanofarads to a fraction of
		// a microfarad (common practice); transistor stages use 10 µF and more,
		// so the check holds for valve-only circuits. One warning per part.
		if !implausible && !transistors && p.Kind == Capacitor && p.Type == CapFixed && p.Value.Max > 2e-6 && strings.Contains(strings.ToLower(p.Note), "coupling") {
			w.Add(p.Pos, "%s: a %s coupling capacitor is unusually large", p.Ref, value.Format(p.Value.Max, value.Farad, value.Symbol))
		}
		if p.Kind != Port && p.Kind != Generic && len(p.Pins) > 0 {
			same := true
			for _, pin := range p.Pins {
				if pin.Net != p.Pins[0].Net {
					same = false
				}
			}
			if same && len(p.Pins) > 1 {
				w.Add(p.Pos, "%s has every terminal on net %s: it is shorted out", p.Ref, p.Pins[0].Net)
			}
		}
	}
	w = append(w, checkEnds(c)...)
	w = append(w, checkRefs(c)...)
	w = append(w, checkGangs(c)...)
	w = append(w, checkPorts(c)...)
	w = append(w, checkEnvelopes(c)...)
	w = append(w, checkRegionStrays(c)...)
	w = append(w, checkOutputDCPaths(c)...)
	w = append(w, checkZeners(c)...)
	w.Sort()
	return w
}

// isCommonPin reports whether a terminal is the common electrode of an active part.
func isCommonPin(cn Conn) bool {
	return cn.Part.IsActive() && RoleOfPin(cn.Part.Kind, cn.Pin) == RoleCommon
}

// refLetters splits a reference designator into its letters: "VC1a" → "VC".
var refLetters = regexp.MustCompile(`^([A-Za-z]+?)[0-9]+[A-Za-z]?$`)

func electrodeName(p *Part, pin string) string {
	switch p.Kind {
	case Valve:
		return "cathode"
	case BJT:
		return "emitter"
	case FET:
		return "source"
	}
	return pin
}

// refPrefixes are the usual letters for each kind (IEC 60617 / IEEE 315
// practice is loose here; these are the common ones, common practice, no source).
var refPrefixes = map[Kind][]string{
	Resistor:    {"R"},
	Capacitor:   {"C", "VC", "TC"},
	Inductor:    {"L", "RFC"},
	Transformer: {"T", "L", "IFT"},
	Valve:       {"V"},
	BJT:         {"Q", "T", "TR"},
	FET:         {"Q", "T", "TR", "J", "M"},
	Diode:       {"D"},
	Crystal:     {"X", "XTAL", "Y"},
	Loudspeaker: {"LS", "SP", "SPK"},
	Pot:         {"RV", "VR", "R", "P"},
	Switch:      {"S", "SW"},
	Port:        {"P", "J", "X", "K"},
}

func checkRefs(c *Circuit) ErrorList {
	var w ErrorList
	lower := map[string][]*Part{}
	for _, p := range c.Parts {
		k := strings.ToLower(p.Ref)
		lower[k] = append(lower[k], p)
		if pre, ok := refPrefixes[p.Kind]; ok {
			letters := p.Ref
			if m := refLetters.FindStringSubmatch(p.Ref); m != nil {
				letters = m[1]
			}
			if !contains(pre, strings.ToUpper(letters)) {
				w.Add(p.Pos, "%s is a %s but its letter suggests otherwise (usual: %s)", p.Ref, p.Kind, strings.Join(pre, ", "))
			}
		}
	}
	for _, k := range sortedKeys(lower) {
		if ps := lower[k]; len(ps) > 1 {
			var refs []string
			for _, p := range ps {
				refs = append(refs, p.Ref)
			}
			w.Add(ps[1].Pos, "reference designators %s differ only in case: one part entered twice?", strings.Join(refs, " and "))
		}
	}
	return w
}

// NoInputWarning is the warning for a circuit with no signal input
// anywhere. A caller that can show the circuit makes its own signal (an
// oscillator found by its loop) turns it into a note.
const NoInputWarning = "no signal input declared: add inputs = [\"net\"] (the reduction keeps what lies between inputs and outputs)"

// checkEnds warns when the file says nowhere where the signal enters or
// leaves: the reduction keeps only what lies between the two, and the AC
// proof compares transfers between them.
func checkEnds(c *Circuit) ErrorList {
	var w ErrorList
	top := Pos{File: c.File, Line: 1, Col: 1}
	in, out := len(c.Inputs) > 0, len(c.Outputs) > 0
	for _, r := range c.Regions {
		in = in || r.Input != ""
		out = out || r.Output != ""
	}
	for _, p := range c.Parts {
		if p.Kind == Port {
			// A port marks where the circuit meets the rest of the set, which
			// is as good a signal end as a declared one.
			in, out = true, true
		}
	}
	if !in {
		w.Add(top, "%s", NoInputWarning)
	}
	if !out {
		w.Add(top, "no signal output declared: add outputs = [\"net\"] (the reduction keeps what lies between inputs and outputs)")
	}
	return w
}

func checkGangs(c *Circuit) ErrorList {
	var w ErrorList
	gangs := map[string][]*Part{}
	for _, p := range c.Parts {
		if p.Gang != "" {
			gangs[p.Gang] = append(gangs[p.Gang], p)
		}
	}
	loose := looseVariables(c)
	for _, g := range sortedKeys(gangs) {
		ps := gangs[g]
		if len(ps) == 1 && len(loose) > 0 {
			w.Add(ps[0].Pos, "gang %q has only one member (%s), and %s is a variable capacitor in no gang: its gang mark is missing?", g, ps[0].Ref, strings.Join(loose, ", "))
		}
		for _, p := range ps {
			if p.Kind != Capacitor || p.Type != CapVariable {
				if p.Kind != Pot && p.Kind != Switch && p.Kind != Inductor {
					w.Add(p.Pos, "%s is in gang %q but is not a variable part", p.Ref, g)
				}
			}
		}
	}
	return w
}

func checkPorts(c *Circuit) ErrorList {
	var w ErrorList
	for _, p := range c.Parts {
		if p.Kind != Port || len(p.Pins) == 0 {
			continue
		}
		if len(c.ConnsOf(p.Pins[0].Net)) < 2 && !c.RoleOf(p.Pins[0].Net).IsACGround() {
			w.Add(p.Pos, "port %s (%q) connects to net %s, which no other part uses", p.Ref, p.Label, p.Pins[0].Net)
		}
	}
	return w
}

// checkEnvelopes warns when the sections of one envelope disagree about the
// heater (a multi-section valve shares one heater).
func checkEnvelopes(c *Circuit) ErrorList {
	var w ErrorList
	env := map[string][]*Part{}
	for _, p := range c.Parts {
		if p.Envelope != "" {
			env[p.Envelope] = append(env[p.Envelope], p)
		}
	}
	for _, e := range sortedKeys(env) {
		ps := env[e]
		if len(ps) == 1 {
			w.Add(ps[0].Pos, "envelope %q has one section only (%s)", e, ps[0].Ref)
			continue
		}
		heaters := map[string]bool{}
		for _, p := range ps {
			var h []string
			for _, pin := range p.Pins {
				if RoleOfPin(p.Kind, pin.Name) == RoleHeater {
					h = append(h, pin.Net)
				}
			}
			sort.Strings(h)
			if len(h) > 0 {
				heaters[strings.Join(h, ",")] = true
			}
		}
		if len(heaters) > 1 {
			w.Add(ps[0].Pos, "sections of envelope %q show different heater connections (%s)", e, strings.Join(sortedKeys(heaters), " / "))
		}
	}
	return w
}

// Summary is the one-line description `pare check` prints per file.
func Summary(c *Circuit, warnings int) string {
	return fmt.Sprintf("%d parts, %d nets, %d warnings", len(c.Parts), len(c.Nets), warnings)
}

// bareCapacitor words the warning for a capacitor written as a bare
// fraction of a farad from a millifarad up (c = 0.05): old diagrams give
// capacitors with no unit, and a fraction there is microfarads (common
// practice), while pare reads a bare number in farads. A whole number
// (pF on old diagrams, but not always) is left to the range check. "" when
// there is nothing to say.
func bareCapacitor(p *Part) string {
	if v := p.Value.Max; p.Kind != Capacitor || !p.bareValue.IsValid() || v < 1e-3 || v >= 1 {
		return ""
	}
	n := strconv.FormatFloat(p.Value.Max, 'g', -1, 64)
	return fmt.Sprintf("%s = %s F: a capacitor written without a unit is read in farads (did you mean %s µF? write \"%su\")",
		p.Ref, n, n, n)
}

// CheckNotes is what the check finds worth saying that is no mistake: a
// gang of one tuning capacitor, where no other variable capacitor stands
// outside a gang, is a set with one tuned circuit (a VFO, a TRF with one
// section), normal, not a lost gang mark. Where such a capacitor does
// stand alone, Check warns instead.
func CheckNotes(c *Circuit) ErrorList {
	var n ErrorList
	if len(looseVariables(c)) > 0 {
		return n
	}
	gangs := map[string][]*Part{}
	for _, p := range c.Parts {
		if p.Gang != "" {
			gangs[p.Gang] = append(gangs[p.Gang], p)
		}
	}
	for _, g := range sortedKeys(gangs) {
		if ps := gangs[g]; len(ps) == 1 {
			n.Add(ps[0].Pos, "gang %q has one member (%s): a single tuning capacitor; if it has more sections, give them the same gang", g, ps[0].Ref)
		}
	}
	return n
}

// looseVariables are the variable capacitors (not trimmers) in no gang,
// by ref: a section whose gang mark may have been lost.
func looseVariables(c *Circuit) []string {
	var refs []string
	for _, p := range c.Parts {
		if p.Kind == Capacitor && p.Type == CapVariable && p.Gang == "" {
			refs = append(refs, p.Ref)
		}
	}
	return refs
}
