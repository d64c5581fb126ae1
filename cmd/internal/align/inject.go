package align

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules/stages"
)

// Injection is one row of the signal-injection table: where a generator
// goes, at what frequency and level, and what that level should give.
type Injection struct {
	Net   string // the injection point
	Where string // the part and electrode there: "V3 grid (g1)", "P1 (from aerial coupling)"
	Band  string // "audio", "IF", "RF"
	Freq  float64
	// Level is the generator's RMS voltage at Net that gives RefLevel at
	// RefNet, from the AC solver on the whole circuit.
	Level    float64
	RefNet   string
	RefLevel float64
	RefWhat  string // "1 V at the detector (det_a)"
	// Gain is what the stage from Net to GainTo should show at Freq: the
	// ratio of the voltages at the two points (the solver's, on the whole
	// circuit). 0 with GainNote where it is no linear gain.
	Gain     float64
	GainTo   string
	GainNote string
	// Gang is the gang setting the row is solved at (fraction of travel
	// from fully open); Tuned says the gang was turned for the peak.
	Gang  float64
	Tuned bool
	// Why, when set, says why pare gives no numbers for this row (it could
	// not be solved, or its result is no level a bench could meet); the
	// other rows stand.
	Why string
	// BelowFloor says the level is under genFloor: no generator sets it and
	// the set's own noise hides it, so the row gives no level, only its
	// stage gain and how to use it on the bench (Caveat). Level keeps the
	// solver's figure for the rows referred to it.
	BelowFloor bool
	// Caveat says what the row's level assumes that the bench must set up
	// (a control's position, the AGC held), or that the level is below
	// what a generator gives; "" when nothing.
	Caveat string
	// Broken names the devices whose oscillator loop the row was solved
	// with broken (rfloop.go); Circuit rebuilds the circuit so.
	Broken []string
}

// Options is the AC solver's setting for the row.
func (in Injection) Options() ac.Options { return ac.Options{VarFrac: in.Gang, VarSet: true} }

// Reference outputs (common practice, no source): 50 mW into a loudspeaker
// is the customary standard output, with the carrier modulated 30 % at the
// generators' customary 400 Hz; 1 V at a section's output is a level a
// meter reads easily, kept for a set with no loudspeaker or no detector.
const (
	refSpeakerW = 0.05
	refVolts    = 1.0
	audioHz     = 400.0
	modDepth    = 0.3
)

// point is an injection point before it is solved.
type point struct {
	net, where, band string
	mixer, detector  bool
	// halves names the stage whose parallel halves this point drives one
	// of (a push-pull pair: halves), "" for none: its gain is taken past
	// the other half, never to it.
	halves string
	// unmodelled says why the solver's figure at this point is not the
	// stage's (a grid the device model does not drive).
	unmodelled string
}

// injections builds the table from the output back to the input.
func injections(c *graph.Circuit, sts []stages.Stage, g *Guide) ([]Injection, string) {
	pts := injectionPoints(c, sts, g)
	if len(pts) == 0 {
		return nil, "no active stage and no declared input to inject at"
	}
	rows := make([]Injection, len(pts))
	// Solve from the output end: an RF row's reference is the mixer row's
	// level, solved first.
	for i := len(pts) - 1; i >= 0; i-- {
		in, err := solveRow(c, sts, pts, rows, i, g)
		if err != nil {
			in = Injection{Net: pts[i].net, Where: pts[i].where, Band: pts[i].band, Freq: in.Freq, Why: err.Error()}
		}
		rows[i] = in
	}
	slices.Reverse(rows)
	return rows, ""
}

// injectionPoints are the points in signal order: the declared input, then
// each active device's control electrode (the trade injects on grids,
// bases and gates) and the detector's load, ordered by their distance from
// the input; a device no stage claimed is placed by its distance too.
func injectionPoints(c *graph.Circuit, sts []stages.Stage, g *Guide) []point {
	var pts []point
	seen := map[string]bool{}
	add := func(p point) {
		if p.net != "" && !seen[p.net] && !c.RoleOf(p.net).IsACGround() {
			seen[p.net] = true
			pts = append(pts, p)
		}
	}
	if len(c.Inputs) > 0 {
		add(point{net: c.Inputs[0], where: portOn(c, c.Inputs[0])})
	}
	mixer := mixerDevice(c, sts, g.IF)
	osc := oscillatorOnly(sts, mixer)
	half := halves(c, sts)
	device := func(p *graph.Part) {
		if p != nil && !osc[p.Ref] {
			pt := controlPoint(c, p, p == mixer)
			pt.halves = half[p.Ref]
			add(pt)
		}
	}
	for _, s := range sts {
		if s.Supply {
			continue
		}
		if isDetector(s) {
			add(point{net: detectorLoad(c, s), where: s.Name + " detector load", detector: true})
			continue
		}
		for _, ref := range s.Parts {
			device(c.Part(ref))
		}
	}
	if !slices.ContainsFunc(pts, func(p point) bool { return p.detector }) {
		if s := detectorStage(c, sts); s != nil {
			add(point{net: detectorLoad(c, *s), where: s.Name + " detector load", detector: true})
		}
	}
	for _, p := range c.Parts {
		device(p)
	}
	dist := netDistances(c)
	slices.SortStableFunc(pts, func(a, b point) int { return dist(a.net) - dist(b.net) })
	classify(c, pts, g, mixer != nil)
	return pts
}

// halves maps each active device that is one of a stage's parallel halves
// to that stage's name: two active devices of one stage whose common
// electrodes (cathodes, emitters, sources) share a net (a push-pull pair, a
// complementary pair, a long-tailed pair). The signal reaches them side by
// side, never one from the other's control electrode, so one half's
// injection row gains to what follows the pair, not to the other half.
func halves(c *graph.Circuit, sts []stages.Stage) map[string]string {
	out := map[string]string{}
	for _, s := range sts {
		byCommon := map[string][]string{}
		for _, ref := range s.Parts {
			p := c.Part(ref)
			if p == nil || !p.IsActive() {
				continue
			}
			if n := p.NetOf(p.PinWithRole(graph.RoleCommon)); n != "" {
				byCommon[n] = append(byCommon[n], ref)
			}
		}
		for _, refs := range byCommon {
			if len(refs) < 2 {
				continue
			}
			for _, ref := range refs {
				if out[ref] == "" {
					out[ref] = s.Name
				}
			}
		}
	}
	return out
}

// controlPoint is an active part's control electrode (the mixer's signal
// grid, by wiring); the zero point for anything else.
func controlPoint(c *graph.Circuit, p *graph.Part, mixer bool) point {
	if p == nil || !p.IsActive() {
		return point{}
	}
	pin := p.PinWithRole(graph.RoleControl)
	pt := point{mixer: mixer}
	if mixer {
		// The small-signal model drives a valve's anode current from g1
		// alone (graph/ac), so a heptode's signal grid on g3 has no gain
		// there: the row says so rather than quote a leak as a gain.
		if sg := signalGrid(c, p); sg != pin {
			if p.Kind == graph.Valve {
				pt.unmodelled = fmt.Sprintf("not computed: pare's small-signal valve model drives the anode from %s only, and the signal grid is %s (the mixer's gain from it is not modelled)", pin, sg)
			}
			pin = sg
		}
	}
	pt.net, pt.where = p.NetOf(pin), fmt.Sprintf("%s %s (%s)", p.Ref, controlWord(p), pin)
	return pt
}

// classify gives each point its band: RF before the mixer, the IF from the
// mixer to the detector, audio after it (a set with no IF: audio or RF by
// its band).
func classify(c *graph.Circuit, pts []point, g *Guide, hasMixer bool) {
	mixerSeen, detSeen := false, false
	for i := range pts {
		mixerSeen = mixerSeen || pts[i].mixer
		detSeen = detSeen || pts[i].detector
		switch {
		case detSeen:
			pts[i].band = "audio"
		case g.IF > 0 && (mixerSeen || !hasMixer):
			pts[i].band = "IF"
		case g.IF > 0:
			pts[i].band = "RF"
		case c.FullBand().Max <= 30e3:
			pts[i].band = "audio"
		default:
			pts[i].band = "RF"
		}
	}
}

// netDistances is how far each net is from the circuit's inputs (graph.Walk
// over nets not at AC ground); a net the walk does not reach comes last.
func netDistances(c *graph.Circuit) func(string) int {
	w := graph.NewWalk(c.View())
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	w.FromNets(c.Inputs, 0)
	return func(n string) int {
		if d, ok := w.NetDist(n); ok {
			return d
		}
		return 1 << 30
	}
}

func isDetector(s stages.Stage) bool {
	return strings.Contains(s.Topology, "detector") || strings.Contains(s.Topology, "discriminator")
}

func controlWord(p *graph.Part) string {
	switch p.Kind {
	case graph.BJT:
		return "base"
	case graph.FET:
		return "gate"
	}
	return "grid"
}

func portOn(c *graph.Circuit, net string) string {
	for _, p := range c.Parts {
		if p.Kind == graph.Port && p.NetOf("1") == net {
			return fmt.Sprintf("%s (%s)", p.Ref, p.Label)
		}
	}
	return "the input"
}

// detectorLoad is the net the detector's load sits on: a net of the
// detector stage that is neither AC ground nor the diode's anode.
func detectorLoad(c *graph.Circuit, s stages.Stage) string {
	anode := diodeAnode(c, s)
	// An FM detector's audio leaves by the secondary's centre tap; an AM
	// diode's by its cathode unless that is at AC ground (the load then
	// sits at the winding's cold end).
	for _, want := range []struct {
		kind graph.Kind
		pin  string
	}{{graph.Transformer, "st"}, {graph.Diode, "k"}} {
		for _, ref := range s.Parts {
			p := c.Part(ref)
			if p == nil || p.Kind != want.kind {
				continue
			}
			if n := p.NetOf(want.pin); n != "" && !c.RoleOf(n).IsACGround() {
				return n
			}
		}
	}
	for _, ref := range s.Parts {
		p := c.Part(ref)
		if p == nil || p.Kind == graph.Valve || p.Kind == graph.Diode {
			continue
		}
		for _, n := range netsOf(p) {
			if n != anode && !c.RoleOf(n).IsACGround() {
				return n
			}
		}
	}
	return ""
}

// diodeAnode is the detector diode's anode net.
func diodeAnode(c *graph.Circuit, s stages.Stage) string {
	for _, ref := range s.Parts {
		p := c.Part(ref)
		if p == nil {
			continue
		}
		switch {
		case p.Kind == graph.Diode:
			return p.NetOf("a")
		case p.Kind == graph.Valve && !p.IsActive():
			for _, a := range []string{"a", "a1", "a2"} {
				if n := p.NetOf(a); n != "" {
					return n
				}
			}
		}
	}
	return ""
}

// reference is what a row of a band is solved to give.
func reference(c *graph.Circuit, sts []stages.Stage, pts []point, rows []Injection, i int) (net string, level float64, what string) {
	switch pts[i].band {
	case "audio":
		for _, p := range c.Parts {
			if p.Kind == graph.Loudspeaker && p.Value.Max > 0 {
				hot := hotNet(c, p)
				return hot, math.Sqrt(refSpeakerW * p.Value.Max), fmt.Sprintf("50 mW into the loudspeaker %s", p.Ref)
			}
		}
	case "IF":
		if net, level, what := carrierRef(c, sts, pts, rows); net != "" {
			return net, level, what
		}
	case "RF":
		for j := i + 1; j < len(pts); j++ {
			if pts[j].mixer {
				word, dev := mixerWords(c, pts[j].net)
				return pts[j].net, rows[j].Level / convFraction, fmt.Sprintf("the RF at the mixer's %s (%s) that gives the mixer row's IF, through a conversion gain estimated at a quarter of its IF gain (conversion transconductance about a quarter to a third of the %s's gm, %s): an estimate, not solved", word, pts[j].net, dev, convSource)
			}
		}
	}
	if len(c.Outputs) == 0 {
		return "", 0, ""
	}
	return c.Outputs[0], refVolts, fmt.Sprintf("1 V at the output (%s)", c.Outputs[0])
}

// detEfficiency is the peak detector's efficiency (audio peak over the
// envelope's swing) the IF rows assume: 1, as pare's detector model does
// (graph/device.DetectorRd, derived from the power balance at efficiency
// 1); a valve diode into a load of some hundred kilohms gives 0.8–0.9
// (from memory), so the bench needs a little more carrier than the rows.
const detEfficiency = 1.0

// convFraction is the mixer's conversion transconductance over its gm,
// the estimate an RF row's reference rests on: the small-signal model has
// no conversion gain, only the mixer's gain at the IF as an amplifier, so
// the RF that gives the mixer row's IF is that row's level over this.
const (
	convFraction = 0.25
	convSource   = "a handbook rule from memory"
)

// mixerWords names the control electrode on net and the kind of the device
// it drives, for the RF rows' reference: a transistor mixer's base and
// gm are not a valve's grid and gm. Without a device there, the valve's
// words, as before.
func mixerWords(c *graph.Circuit, net string) (control, device string) {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if graph.RoleOfPin(p.Kind, cn.Pin) != graph.RoleControl {
			continue
		}
		switch p.Kind {
		case graph.BJT:
			return "base", "transistor"
		case graph.FET:
			return "gate", "FET"
		case graph.Valve:
			return "grid", "valve"
		}
	}
	return "grid", "valve"
}

// carrierRef is the IF rows' reference: the carrier at the detector's
// diode that, modulated modDepth, gives the audio the detector-load row
// needs for the standard output (an envelope of RMS carrier Vc modulated m
// gives m·Vc RMS of audio through a detector of efficiency 1). "" when
// there is no solved detector row.
func carrierRef(c *graph.Circuit, sts []stages.Stage, pts []point, rows []Injection) (string, float64, string) {
	det := detectorStage(c, sts)
	if det == nil {
		return "", 0, ""
	}
	anode := diodeAnode(c, *det)
	for j := range pts {
		if !pts[j].detector || anode == "" || rows[j].Why != "" || rows[j].Level <= 0 {
			continue
		}
		level := rows[j].Level / (modDepth * detEfficiency)
		return anode, level, fmt.Sprintf("%s of carrier at the detector (%s), modulated 30 %% at 400 Hz: its audio, %s on %s (detector efficiency taken as 1, pare's detector model: a valve diode gives about 0.8–0.9, so the bench needs a little more carrier), gives %s",
			volts(level), anode, volts(rows[j].Level), rows[j].Net, rows[j].RefWhat)
	}
	return "", 0, ""
}
