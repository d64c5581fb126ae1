package dc

import (
	"fmt"
	"math"
	"slices"

	"pare/graph"
	"pare/graph/value"
)

// Chart is the voltage chart of a set: the DC voltages at the trade's test
// points (electrodes of the active devices, each rail), the currents a
// repairer checks, the power in each resistor and the warnings.
type Chart struct {
	Meter     Meter         `json:"meter"`
	Points    []TestPoint   `json:"points"`
	Rails     []Rail        `json:"rails"`
	Supplies  []SupplyPoint `json:"supplies"` // supply test points after the rails (supplies.go)
	Currents  []DevCurrent  `json:"currents"`
	Resistors []Heat        `json:"resistors"`
	Warnings  []string      `json:"warnings,omitempty"`
	// Leads says which meter lead goes to chassis when that is not the
	// usual negative one (a positive-earth set); "" otherwise.
	Leads string `json:"leads,omitempty"`
}

// TestPoint is one electrode: the net it is on, its voltage and what the
// chart's meter would show there.
type TestPoint struct {
	Ref       string  `json:"ref"`
	Pin       string  `json:"pin"`
	Label     string  `json:"electrode"`
	Net       string  `json:"net"`
	Volts     float64 `json:"volts"`
	Reading   float64 `json:"reading"`             // what the chart's meter shows
	Elsewhere bool    `json:"elsewhere,omitempty"` // the net has no DC path on this sheet
	AC        bool    `json:"ac,omitempty"`        // a rectifier's winding end: it carries the secondary's AC
	Mains     bool    `json:"mains,omitempty"`     // with AC: the net carries the mains itself (no transformer)
}

// Rail is a held net and the current the circuit draws from it.
type Rail struct {
	Net   string  `json:"net"`
	Volts float64 `json:"volts"`
	Amps  float64 `json:"amps"` // the current the rail delivers (from its negative side for a negative rail)
	// Estimate is set for a rail estimated from a captured rectifier and
	// reservoir rather than declared: its method, ripple and load.
	Estimate *Estimate `json:"estimate,omitempty"`
}

// DevCurrent is one electrode current of an active part.
type DevCurrent struct {
	Ref  string  `json:"ref"`
	What string  `json:"what"`
	Amps float64 `json:"amps"`
}

// Heat is the power in a resistor against its rating (0 when not given).
type Heat struct {
	Ref    string  `json:"ref"`
	Watts  float64 `json:"watts"`
	Rating float64 `json:"rating,omitempty"`
	// Note says where Watts come from when not from the DC solve: a
	// resistor in a heater chain (heaterchain.go), or why they are unknown.
	Note string `json:"note,omitempty"`
}

// electrode names test points in the trade's words.
func electrode(p *graph.Part, pin string) string {
	switch p.Kind {
	case graph.Valve:
		switch {
		case pin == "a":
			return "anode"
		case pin == "a1" || pin == "a2":
			return "anode " + pin[1:]
		case pin == "k":
			return "cathode"
		case pin == "g1":
			return "grid"
		case pin == "g2" && (p.Type == "tetrode" || p.Type == "pentode"):
			return "screen"
		case pin == "g3" && p.Type == "pentode":
			return "suppressor"
		}
		return pin
	case graph.BJT:
		return map[string]string{"b": "base", "c": "collector", "e": "emitter"}[pin]
	case graph.FET:
		return map[string]string{"g": "gate", "d": "drain", "s": "source"}[pin]
	case graph.Diode:
		return map[string]string{"a": "anode", "k": "cathode"}[pin]
	}
	return pin
}

// Chart builds the voltage chart at p with readings on meter mt.
func (p *Point) Chart(mt Meter) (*Chart, error) {
	ch := &Chart{Meter: mt}
	for _, part := range p.Circuit.Parts {
		if err := p.chartPart(ch, part, mt); err != nil {
			return nil, err
		}
	}
	for i, name := range p.m.fixedNet {
		if name == "" || p.Circuit.RoleOf(name) == graph.Ground || p.Circuit.RoleOf(name) == graph.Heater {
			continue
		}
		amps := p.railCurrent(name)
		if p.m.fixedV[i] < 0 {
			amps = -amps // a negative rail delivers the current its pins return
		}
		rail := Rail{Net: name, Volts: p.m.fixedV[i], Amps: amps, Estimate: p.estimateFor(name)}
		if r := p.m.surgeFed(name); r != nil {
			// held before a surge resistor: the rail is the reservoir
			// behind it, which carries the same current
			rail.Net, rail.Estimate = r.net, p.estimateFor(r.net)
			rail.Volts, _ = p.Volts(r.net)
		}
		ch.Rails = append(ch.Rails, rail)
		if w := p.sinkingRail(name, amps); w != "" {
			ch.Warnings = append(ch.Warnings, w)
		}
	}
	sp, err := p.supplyPoints(mt)
	if err != nil {
		return nil, err
	}
	ch.Supplies = sp
	if p.PositiveEarth() {
		ch.Leads = PositiveEarthLeads
	}
	for _, n := range p.Nets {
		if n.Floating && p.isTestPoint(n.Name) {
			ch.Warnings = append(ch.Warnings, fmt.Sprintf("net %s has no DC path on this sheet: its voltage is set elsewhere (shown as 0 V)", n.Name))
		}
	}
	ch.Warnings = append(ch.Warnings, p.Notes...)
	return ch, nil
}

func (p *Point) isTestPoint(net string) bool {
	for _, c := range p.Circuit.ConnsOf(net) {
		if part := c.Part; part.IsActive() || part.Kind == graph.Diode || part.Kind == graph.Valve {
			return true
		}
	}
	return false
}

func (p *Point) chartPart(ch *Chart, part *graph.Part, mt Meter) error {
	switch part.Kind {
	case graph.Valve, graph.BJT, graph.FET, graph.Diode:
		for _, pin := range part.Pins {
			role := graph.RoleOfPin(part.Kind, pin.Name)
			if role == graph.RoleHeater || role == graph.RoleShield {
				continue
			}
			v, _ := p.Volts(pin.Net)
			rd, err := p.Reading(pin.Net, mt)
			if err != nil {
				return err
			}
			t := p.m.netTerm[pin.Net]
			ch.Points = append(ch.Points, TestPoint{Ref: part.Ref, Pin: pin.Name, Label: electrode(part, pin.Name),
				Net: pin.Net, Volts: v, Reading: rd, Elsewhere: t >= 0 && p.m.floating[t], AC: p.m.isWindingEnd(pin.Net), Mains: p.m.isMainsNet(pin.Net)})
		}
		p.deviceCurrents(ch, part)
	case graph.Resistor, graph.Pot:
		w := 0.0
		if pd := p.Part(part.Ref); pd != nil {
			w = pd.Watts
		}
		rating, _ := part.Param("watts")
		h := Heat{Ref: part.Ref, Watts: w, Rating: rating}
		if e := p.surgeEstimate(part.Ref); e != nil {
			// the charging pulses heat it, not their mean
			h.Watts, h.Note = e.PulseRMS*e.PulseRMS*e.SurgeOhms, SurgeHeatNote
			w = h.Watts
		} else if fw, ok := p.railFedSurgeHeat(part); ok {
			h.Watts, h.Note = fw, FeedHeatNote
			w = fw
		}
		if part.Kind == graph.Resistor {
			if hw, note, ok := p.heaterChainHeat(part); ok {
				h.Watts, h.Note = w+hw, note
				w = h.Watts
			}
		}
		ch.Resistors = append(ch.Resistors, h)
		if rating > 0 && w > rating {
			ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s dissipates %.3g W against its %.3g W rating", part.Ref, w, rating))
		}
	case graph.Capacitor:
		p.capWarnings(ch, part)
	}
	return nil
}

func (p *Point) deviceCurrents(ch *Chart, part *graph.Part) {
	add := func(what, pin string, sign float64) {
		if part.Pin(pin) != nil {
			ch.Currents = append(ch.Currents, DevCurrent{Ref: part.Ref, What: what, Amps: sign * p.Current(part.Ref, pin)})
		}
	}
	if amps, ok := p.rectifierShare(part.Ref); ok {
		// A rectifier's junctions carry the load in pulses the DC solve
		// cannot see (its winding is AC): each gets its share of the
		// estimated rail's current, as a mean.
		for _, pin := range []string{"a", "a1", "a2"} {
			if part.Pin(pin) != nil {
				ch.Currents = append(ch.Currents, DevCurrent{Ref: part.Ref, What: rectCurrentLabel[part.Kind][pin], Amps: amps})
			}
		}
		return
	}
	if shares, ok := p.railFedShare(part); ok {
		// A rectifier into a declared rail: its mean is the rail's draw
		// (railfed.go), not the solve's 0 A, which reads as a dead rectifier.
		for _, pin := range rectAnodes {
			if amps, ok := shares[pin]; ok {
				ch.Currents = append(ch.Currents, DevCurrent{Ref: part.Ref, What: drawCurrentLabel[part.Kind][pin], Amps: amps})
			}
		}
		return
	}
	switch part.Kind {
	case graph.Valve:
		if !part.IsActive() {
			add("anode current", "a", 1)
			add("anode 1 current", "a1", 1)
			add("anode 2 current", "a2", 1)
			return
		}
		add("anode current", "a", 1)
		if part.Type != "triode" {
			add("screen current", "g2", 1)
		}
		p.declaredCurrent(ch, part, "ia", "a", "anode")
		p.positiveGrid(ch, part)
		pd := p.Part(part.Ref)
		if pmax, ok := part.Param("pmax"); ok && pd != nil {
			va, _ := p.Volts(part.NetOf("a"))
			vk, _ := p.Volts(part.NetOf("k"))
			pa := p.Current(part.Ref, "a") * (va - vk)
			if pa > pmax {
				ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s anode dissipation %.3g W is over its %.3g W rating", part.Ref, pa, pmax))
			}
		}
	case graph.BJT:
		add("collector current", "c", 1)
		add("base current", "b", 1)
		p.declaredCurrent(ch, part, "ic", "c", "collector")
		p.saturationWarning(ch, part)
	case graph.FET:
		add("drain current", "d", 1)
	case graph.Diode:
		add(diodeCurrent(part))
	}
}

// rectCurrentLabel names a rectifier junction's mean current (an estimate).
var rectCurrentLabel = map[graph.Kind]map[string]string{
	graph.Valve: {"a": "anode, mean (est.)", "a1": "anode 1, mean (est.)", "a2": "anode 2, mean (est.)"},
	graph.Diode: {"a": "forward, mean (est.)"},
}

// drawCurrentLabel names a rectifier junction's mean current taken from
// the declared rail's draw.
var drawCurrentLabel = map[graph.Kind]map[string]string{
	graph.Valve: {"a": "anode, mean (draw)", "a1": "anode 1, mean (draw)", "a2": "anode 2, mean (draw)"},
	graph.Diode: {"a": "forward, mean (draw)"},
}

// rectifierShare is the mean current of each junction of a rectifier
// part: the estimated rail's load, shared between the two conducting
// halves of a full-wave rectifier (each diode of a bridge, each anode of a
// centre-tapped one, conducts every other half-cycle).
func (p *Point) rectifierShare(ref string) (float64, bool) {
	for _, r := range p.m.rects {
		if !slices.Contains(r.parts, ref) {
			continue
		}
		e := p.estimateFor(r.net)
		if e == nil {
			return 0, false
		}
		if r.full {
			return e.Amps / 2, true
		}
		return e.Amps, true
	}
	return 0, false
}

// capWarnings checks an electrolytic's polarity and any capacitor's voltage
// rating against the DC across it. Electrolytics stand about 1 V of reverse
// voltage at most (common practice); pare warns above 0.5 V.
func (p *Point) capWarnings(ch *Chart, part *graph.Part) {
	if len(part.Pins) != 2 {
		return
	}
	first, second := part.Pins[0], part.Pins[1]
	if part.Type == graph.CapElectrolytic {
		first, second = *part.Pin("+"), *part.Pin("-")
	}
	va, _ := p.Volts(first.Net)
	vb, _ := p.Volts(second.Net)
	d := va - vb
	if part.Type == graph.CapElectrolytic && d < -0.5 {
		ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s is an electrolytic with its + at %.3g V and its − at %.3g V: reversed", part.Ref, va, vb))
	}
	if part.Rating > 0 && math.Abs(d) > part.Rating {
		ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s has %.3g V DC across it against its %.3g V rating", part.Ref, math.Abs(d), part.Rating))
	}
}

// railCurrent is the current the parts draw from a held net.
func (p *Point) railCurrent(net string) float64 {
	total := 0.0
	for _, part := range p.Circuit.Parts {
		for _, pin := range part.Pins {
			if p.m.netTerm[pin.Net] == p.m.netTerm[net] {
				total += p.Current(part.Ref, pin.Name)
			}
		}
	}
	return total
}

// currentSpread is how far a solved anode or collector current may stand
// from the one the netlist declares before the chart says so: production
// valves and transistors spread by some ±20–30 % about their published
// operating point (common practice, no source).
const currentSpread = 0.3

// cutOff is the share of the declared current under which a part is taken
// as cut off rather than merely off its operating point.
const cutOff = 0.01

// declaredCurrent warns when the solved current into pin differs from the
// netlist's key (ia, ic) by more than currentSpread. The declared value is
// where the part's gm is stated and, on a service sheet, the current it
// should run at; a solve far from it says the bias network as captured, or
// the declared figures, are not those of the set (a wrong cathode or
// emitter resistor, a screen feed, a value misread), and the small-signal
// figures taken at the bias move with it.
func (p *Point) declaredCurrent(ch *Chart, part *graph.Part, key, pin, what string) {
	want, ok := part.Param(key)
	if !ok || want <= 0 || part.Pin(pin) == nil {
		return
	}
	got := math.Abs(p.Current(part.Ref, pin))
	if got < cutOff*want {
		ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s %s current solves to nothing (the part is cut off as captured) against the %s the netlist gives as %s: check its bias feed (a base or grid bias network left out, or an idle current set by a preset the capture does not give)",
			part.Ref, what, value.FormatPrec(want, value.Ampere, value.Symbol, 3), key))
		return
	}
	off := got/want - 1
	switch {
	case math.Abs(off) <= currentSpread:
	case off > 0 && p.oscillates(part.Ref):
		// the chart is figured with the oscillators stopped: a device
		// biased by its own grid or base current draws more stopped than
		// running, so "check the bias network" would send the repairer
		// after a sound network (review19 a01, a02: +65-67 %)
		ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s %s current solves to %s with the oscillator stopped, as the chart is figured, %+.0f %% from the %s the netlist gives as %s: an oscillator biased by its own grid (base) current draws more stopped than running; read it with the oscillator running, where it should come down towards %s, and a reading near %s means it is not oscillating",
			part.Ref, what, value.FormatPrec(got, value.Ampere, value.Symbol, 3), 100*off, value.FormatPrec(want, value.Ampere, value.Symbol, 3), key, value.FormatPrec(want, value.Ampere, value.Symbol, 3), value.FormatPrec(got, value.Ampere, value.Symbol, 3)))
	default:
		ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s %s current solves to %s, %+.0f %% from the %s the netlist gives as %s: check the bias network as captured (cathode or emitter resistor, screen or base feed) and the declared figures against the part's data",
			part.Ref, what, value.FormatPrec(got, value.Ampere, value.Symbol, 3), 100*off, value.FormatPrec(want, value.Ampere, value.Symbol, 3), key))
	}
}

// oscillates says whether ref is one of the circuit's oscillators (its
// loop starts on its own: Oscillators).
func (p *Point) oscillates(ref string) bool {
	for _, o := range p.Oscillators() {
		if o.Ref == ref {
			return true
		}
	}
	return false
}

// gridPositive is how far a valve's control grid may stand positive of its
// cathode at the operating point before the chart says so: half a volt.
// Above it the grid draws current, which the law here does not model, so
// the solved bias is not what the valve would take (common practice: a
// grid is run negative of its cathode; a grid-leak's contact potential
// leaves it a fraction of a volt negative, not positive).
const gridPositive = 0.5

// positiveGrid warns when a valve's control grid solves positive of its
// cathode by more than gridPositive: a direct-coupled stage whose cathode
// resistor, or the driving anode's volts, are not those of the set (a
// blind reviewer's cathodyne solved 1.2 V positive and the chart said
// only that its anode current was off).
func (p *Point) positiveGrid(ch *Chart, part *graph.Part) {
	g, k := part.NetOf("g1"), part.NetOf("k")
	if g == "" || k == "" {
		return
	}
	vg, okg := p.Volts(g)
	vk, okk := p.Volts(k)
	if !okg || !okk || vg-vk <= gridPositive {
		return
	}
	ch.Warnings = append(ch.Warnings, fmt.Sprintf("%s grid solves %s positive of its cathode: the valve would draw grid current and the bias as captured would not hold; check the grid's bias network and, in a direct-coupled stage, the driving anode's volts and the cathode resistor against the drawing",
		part.Ref, value.FormatPrec(vg-vk, value.Volt, value.Symbol, 3)))
}
