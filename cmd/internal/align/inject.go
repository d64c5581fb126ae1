package align

import (
	"fmt"
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
	// from fully open); Tuned says the gang was turned for the peak or,
	// with DialTank set, that the gang does not tune the row's path and
	// stands where DialTank, the tuned circuit that reads the dial for the
	// row ("the aerial circuit (C1a)"), resonates at Freq (dialgang.go).
	// DialTank without Tuned: that tank does not reach Freq, and the gang
	// stays at mid-travel.
	Gang     float64
	Tuned    bool
	DialTank string
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
// bases and gates) and the detector's load, along the signal path from the
// input (chainOrder); a point the path does not reach keeps its place by
// its distance from the input.
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
	bias := biasDevices(c, sts, half)
	device := func(p *graph.Part) {
		if p != nil && !osc[p.Ref] && !bias[p.Ref] {
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
			if g.det != nil {
				add(point{net: g.det.load, where: g.det.stage.Name + " detector load", detector: true})
			}
			continue
		}
		for _, ref := range s.Parts {
			device(c.Part(ref))
		}
	}
	if !slices.ContainsFunc(pts, func(p point) bool { return p.detector }) && g.det != nil {
		add(point{net: g.det.load, where: g.det.stage.Name + " detector load", detector: true})
	}
	for _, p := range c.Parts {
		device(p)
	}
	dist := netDistances(c)
	slices.SortStableFunc(pts, func(a, b point) int { return dist(a.net) - dist(b.net) })
	pts = chainOrder(c, pts, g, mixer != nil)
	classify(c, pts, g, mixer != nil)
	return dropDecoupled(c, pts, g)
}

// halves maps each active device that is one of a stage's parallel halves
// to that stage's name: two active devices of one stage whose common
// electrodes (cathodes, emitters, sources) share a net (a complementary
// pair, a long-tailed pair, a push-pull pair with a shared cathode
// resistor), and the two halves of a push-pull stage the solver saw driven
// in antiphase (its drive ratio, rules/stages pushpull.go), whatever their
// common leads: a transformer-coupled pair with an emitter resistor each
// to chassis shares no net but the output winding. The signal reaches them
// side by side, never one from the other's control electrode, so one
// half's injection row gains to what follows the pair, not to the other
// half.
func halves(c *graph.Circuit, sts []stages.Stage) map[string]string {
	out := map[string]string{}
	for _, s := range sts {
		if _, ok := s.Figures.Get("drive_ratio"); ok {
			for _, ref := range s.Parts {
				if p := c.Part(ref); p != nil && p.IsActive() && out[ref] == "" {
					out[ref] = s.Name
				}
			}
			continue
		}
		byCommon := map[string][]string{}
		for _, ref := range s.Parts {
			p := c.Part(ref)
			if p == nil || !p.IsActive() {
				continue
			}
			for _, n := range commonNets(c, s, p) {
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

// commonNets are the nets p's common electrode reaches through the
// stage's own resistors (none, one): its own net and, where each half has
// an emitter or cathode resistor of its own (a complementary pair with
// 1 Ω emitter resistors), the net those resistors share.
func commonNets(c *graph.Circuit, s stages.Stage, p *graph.Part) []string {
	n := p.NetOf(p.PinWithRole(graph.RoleCommon))
	if n == "" || c.RoleOf(n).IsACGround() {
		return nil
	}
	out := []string{n}
	for _, ref := range s.Parts {
		r := c.Part(ref)
		if r == nil || r.Kind != graph.Resistor || len(r.Pins) != 2 {
			continue
		}
		a, b := r.Pins[0].Net, r.Pins[1].Net
		if a != n {
			a, b = b, a
		}
		if a == n && b != n && !c.RoleOf(b).IsACGround() && !slices.Contains(out, b) {
			out = append(out, b)
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
	pt.net, pt.where = p.NetOf(pin), fmt.Sprintf("%s %s (%s)", p.Ref, stages.ControlWord(p), pin)
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

func portOn(c *graph.Circuit, net string) string {
	for _, p := range c.Parts {
		if p.Kind == graph.Port && p.NetOf("1") == net {
			return fmt.Sprintf("%s (%s)", p.Ref, p.Label)
		}
	}
	return "the input"
}
