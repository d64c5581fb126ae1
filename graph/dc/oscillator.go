package dc

import (
	"math"
	"sort"

	"pare/graph"
	"pare/graph/ac"
)

// Oscillators on the bench. A DC analysis has no oscillation, so the chart
// gives every electrode as it is with the oscillators stopped; a set on the
// bench has them running, and a running oscillator shifts the DC of its own
// electrodes (and of a stage it drives hard) by rectification: grid current
// in a valve's grid leak, the gate junction of a JFET, the base–emitter
// junction of a transistor charge the coupling capacitor and bias the
// control electrode towards cut-off (grid-leak bias, common practice). The
// device's mean current changes with it, so its other electrodes follow.
//
// pare finds the oscillators by their loop: a device whose return ratio
// (ac.FindLoop, the test the stage recognition uses for its oscillators)
// has a 0° crossing above 0 dB at some setting of the gang starts on its
// own. The loop is solved on the circuit with its small-signal figures
// taken at the stopped operating point (Point.Biased).

// Dir is the direction a running oscillator moves a reading from the
// stopped chart: −1 lower, +1 higher, 0 either way (not predictable from
// the DC laws alone).
type Dir int

// Shift is one electrode a running oscillator moves.
type Shift struct {
	Ref string `json:"ref"` // the oscillator (or the driven device)
	Pin string `json:"pin"`
	Net string `json:"net"`
	Dir Dir    `json:"dir"`
	// Bounded: the electrode moves no further than its value with the
	// device cut off (a valve's or JFET's anode or drain, cathode or
	// source: the rectified bias can at most stop the current).
	Bounded bool `json:"bounded,omitempty"`
	// Shows marks the electrode a technician reads to see the oscillator
	// running: the control electrode with a bias resistor and a coupling
	// capacitor (grid-leak bias).
	Shows bool `json:"shows,omitempty"`
}

// Oscillator is one device whose loop starts on its own, with the
// electrodes its running moves.
type Oscillator struct {
	Ref      string  `json:"ref"`
	F        float64 `json:"f_hz"`      // where its loop phase is 0° (at the best gang setting)
	MarginDB float64 `json:"margin_db"` // loop gain there
	Shifts   []Shift `json:"shifts"`    // its own electrodes, then those of the devices it drives
}

// oscGangs are the gang settings the loop is tried at: both ends and the
// middle (an oscillator that starts anywhere on the dial is one).
var oscGangs = []float64{0, 0.5, 1}

// Oscillators lists the devices whose loop starts, in part order. A loop
// that cannot be solved (a device on an unconnected winding) is taken as
// no oscillator.
func (p *Point) Oscillators() []Oscillator {
	if p.osc != nil {
		return *p.osc
	}
	out := []Oscillator{}
	bc, _ := p.Biased()
	// one elaboration per gang setting for every device (ac.Loops): a
	// fresh one per device elaborated the whole set each time, which on a
	// bank of channels grew with the square of its size
	lp := ac.NewLoops(bc)
	for _, part := range bc.Parts {
		if !part.IsActive() {
			continue
		}
		best := Oscillator{Ref: part.Ref, MarginDB: -1}
		for _, g := range oscGangs {
			l, err := lp.Find(part.Ref, ac.LoopOptions{Options: ac.Options{VarFrac: g, VarSet: true}})
			if err == nil && l.F > 0 && l.MarginDB > best.MarginDB {
				best.F, best.MarginDB = l.F, l.MarginDB
			}
		}
		if best.F > 0 && best.MarginDB > 0 {
			best.Shifts = p.ownShifts(p.Circuit.Part(part.Ref))
			out = append(out, best)
		}
	}
	out = ownLoops(bc, out)
	for i := range out {
		out[i].Shifts = append(out[i].Shifts, p.drivenShifts(out[i])...)
	}
	p.osc = &out
	return out
}

// ownLoops drops each device whose loop is another's seen through it: it
// closes no loop by its own gain (ac.OwnLoop) while another listed device
// does, near its frequency (an RC oscillator's loop read at the follower
// its collector feeds). Two devices neither of which closes a loop alone
// (a Wien bridge's pair) both stay: the loop is theirs together.
func ownLoops(bc *graph.Circuit, list []Oscillator) []Oscillator {
	if len(list) < 2 {
		return list
	}
	own := map[string]bool{}
	ownOf := func(o Oscillator) bool {
		v, ok := own[o.Ref]
		if !ok {
			// near its crossing: the others' loading moves it a little
			v, _ = ac.OwnLoop(bc, o.Ref, ac.LoopOptions{Options: ac.Options{VarFrac: 0.5, VarSet: true}, From: o.F / 2, To: o.F * 2})
			own[o.Ref] = v
		}
		return v
	}
	var out []Oscillator
	for _, o := range list {
		inherited := false
		for _, q := range list {
			if q.Ref != o.Ref && math.Abs(math.Log(q.F/o.F)) < math.Log(ac.InheritedSpan) && ownOf(q) && !ownOf(o) {
				inherited = true
				break
			}
		}
		if !inherited {
			out = append(out, o)
		}
	}
	return out
}

// AddOscillators adds the devices the stage recognition names as
// oscillators that the loop test here did not find (its loop is solved on
// the reduced circuit, with the tank's own figures), with the electrodes
// their running moves; F and MarginDB stay 0 for them.
func (p *Point) AddOscillators(refs []string) {
	have := map[string]bool{}
	list := p.Oscillators()
	for _, o := range list {
		have[o.Ref] = true
	}
	for _, ref := range refs {
		part := p.Circuit.Part(ref)
		if have[ref] || part == nil || !part.IsActive() {
			continue
		}
		have[ref] = true
		o := Oscillator{Ref: ref, Shifts: p.ownShifts(part)}
		o.Shifts = append(o.Shifts, p.drivenShifts(o)...)
		list = append(list, o)
	}
	sort.Slice(list, func(i, j int) bool { return list[i].Ref < list[j].Ref })
	p.osc = &list
}

// polarity is +1 for devices whose current rises with their control
// electrode (valves, NPN, n-channel), −1 for the others.
func (p *Point) polarity(ref string) float64 {
	for _, d := range p.m.devices {
		if d.ref != ref {
			continue
		}
		switch d.kind {
		case devBJT:
			return d.bjt.sign
		case devFET:
			return d.fet.sign
		}
	}
	return 1
}

// ownShifts are the electrodes of oscillator part: the control electrode
// goes towards cut-off (rectified bias) unless the gate is insulated (a
// MOSFET's electrodes then move with the square law's mean, in no
// direction the DC laws give); a
// valve's or JFET's current then falls, so its anode or drain rises towards
// the supply and its cathode or source falls towards chassis (for a
// p-channel device, mirrored). A transistor's collector and emitter can go
// either way: the emitter current is held by its resistor while the base
// is driven hard (a common-collector Colpitts' emitter rises), so they are
// not predicted. An electrode on a held net or tied to one through a
// winding alone (a source on the coil's tap) does not move measurably.
func (p *Point) ownShifts(part *graph.Part) []Shift {
	s := Dir(p.polarity(part.Ref))
	mos := part.Kind == graph.FET && (part.Type == "nmos" || part.Type == "pmos")
	var out []Shift
	for _, pin := range part.Pins {
		var d Dir
		switch graph.RoleOfPin(part.Kind, pin.Name) {
		case graph.RoleControl:
			if mos {
				continue
			}
			d = -s
		case graph.RoleOutput:
			if part.Kind != graph.BJT && !mos {
				d = s
			}
		case graph.RoleCommon:
			if part.Kind != graph.BJT && !mos {
				d = -s
			}
		default:
			continue
		}
		if !p.movable(pin.Net) {
			continue
		}
		sh := Shift{Ref: part.Ref, Pin: pin.Name, Net: pin.Net, Dir: d}
		sh.Bounded = d != 0 && graph.RoleOfPin(part.Kind, pin.Name) != graph.RoleControl
		sh.Shows = graph.RoleOfPin(part.Kind, pin.Name) == graph.RoleControl && p.leakBiased(pin.Net)
		out = append(out, sh)
	}
	return out
}

// movable: a net that is not held and not tied to a held net through a
// winding or coil alone (a source on the coil's tap).
func (p *Point) movable(net string) bool {
	t, ok := p.m.netTerm[net]
	if !ok || t < 0 {
		return false
	}
	for _, b := range p.m.branches {
		part := p.Circuit.Part(b.ref)
		if part == nil || (part.Kind != graph.Inductor && part.Kind != graph.Transformer) {
			continue
		}
		if (b.a == t && b.b < 0) || (b.b == t && b.a < 0) {
			return false
		}
	}
	return true
}

// leakBiased: a control net with a coupling or bias capacitor and a
// resistor on it, directly or at the far end of a winding (a base fed
// through the aerial's coupling winding from a decoupled divider): the
// grid-leak bias that turns the oscillation into a DC shift.
func (p *Point) leakBiased(net string) bool {
	var cap, res bool
	for _, n := range p.throughWindings(net) {
		for _, c := range p.Circuit.Index().Conns(n) {
			switch c.Part.Kind {
			case graph.Capacitor:
				cap = true
			case graph.Resistor, graph.Pot:
				res = true
			}
		}
	}
	return cap && res
}

// throughWindings is net and the nets one winding or coil away from it.
func (p *Point) throughWindings(net string) []string {
	out := []string{net}
	t := p.m.netTerm[net]
	for _, b := range p.m.branches {
		part := p.Circuit.Part(b.ref)
		if part == nil || (part.Kind != graph.Inductor && part.Kind != graph.Transformer) || b.g == 0 {
			continue
		}
		far := -1
		switch {
		case b.a == t && b.b >= 0:
			far = b.b
		case b.b == t && b.a >= 0:
			far = b.a
		}
		if far >= 0 {
			out = append(out, p.m.nodeNet[far])
		}
	}
	return out
}

// drivenShifts are the electrodes of the devices an oscillator drives
// through a capacitor from one of its own electrodes: driven hard, they
// rectify too (a source follower's mean current rises with the drive, a
// junction's bias falls), in a direction the DC laws do not give. An
// insulated gate behind its divider keeps its DC.
func (p *Point) drivenShifts(o Oscillator) []Shift {
	var out []Shift
	seen := map[string]bool{o.Ref: true}
	for _, sh := range p.ownNets(o.Ref) {
		for _, c := range p.Circuit.Index().Conns(sh) {
			if c.Part.Kind != graph.Capacitor || len(c.Part.Pins) != 2 {
				continue
			}
			far := c.Part.Pins[0].Net
			if far == sh {
				far = c.Part.Pins[1].Net
			}
			for _, d := range p.Circuit.Index().Conns(far) {
				if !d.Part.IsActive() || seen[d.Part.Ref] || graph.RoleOfPin(d.Part.Kind, d.Pin) != graph.RoleControl {
					continue
				}
				seen[d.Part.Ref] = true
				out = append(out, p.driven(d.Part)...)
			}
		}
	}
	return out
}

// ownNets are the oscillator's electrode nets that are not held: each
// carries the oscillation, even a source on the coil's tap whose DC does
// not move.
func (p *Point) ownNets(ref string) []string {
	var out []string
	for _, pin := range p.Circuit.Part(ref).Pins {
		if r := graph.RoleOfPin(p.Circuit.Part(ref).Kind, pin.Name); (r == graph.RoleControl || r == graph.RoleOutput || r == graph.RoleCommon) && p.m.netTerm[pin.Net] >= 0 {
			out = append(out, pin.Net)
		}
	}
	return out
}

func (p *Point) driven(part *graph.Part) []Shift {
	mos := part.Kind == graph.FET && (part.Type == "nmos" || part.Type == "pmos")
	var out []Shift
	for _, pin := range part.Pins {
		r := graph.RoleOfPin(part.Kind, pin.Name)
		if (r != graph.RoleControl && r != graph.RoleOutput && r != graph.RoleCommon) || (r == graph.RoleControl && mos) || !p.movable(pin.Net) {
			continue
		}
		out = append(out, Shift{Ref: part.Ref, Pin: pin.Name, Net: pin.Net})
	}
	return out
}

// oscRefs are the oscillators' refs.
func (p *Point) oscRefs() []string {
	var out []string
	for _, o := range p.Oscillators() {
		out = append(out, o.Ref)
	}
	return out
}

// ShiftOf returns the running-oscillator shift on net, if any.
func (p *Point) ShiftOf(net string) (Shift, bool) {
	for _, o := range p.Oscillators() {
		for _, s := range o.Shifts {
			if p.m.netTerm[s.Net] == p.m.netTerm[net] {
				return s, true
			}
		}
	}
	return Shift{}, false
}
