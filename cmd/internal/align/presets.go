package align

import (
	"fmt"
	"slices"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/dc"
	"pare/rules/stages"
)

// Presets. A set whose only adjustments are presets (a bias preset on a
// complementary output pair, a hum-balance preset across the heater
// winding, an oscillator's amplitude preset) still has a procedure: what
// each preset sets, where to measure it, in what order and with what
// caution. A preset's job is read from its place in the circuit and from
// what the solvers show it do over its travel, never from its name or
// note: in an oscillator's loop it sets the loop gain (the start); across
// a winding with its wiper at chassis it is an artificial centre tap (hum
// balance); moving a device's quiescent current it sets the bias, of an
// output pair when the device's common electrode meets another's at the
// mid-point. Where none of these holds pare says it cannot tell.

// Preset is the procedure for one preset.
type Preset struct {
	Part string
	// Job is what it sets, in a repairer's words; "" when pare cannot tell
	// (Why then says why).
	Job     string
	Measure string   // where and how to measure while turning it
	Points  []string // test points: the solver's DC at the nominal setting and over the travel
	Caution string
	Why     string
	order   int // bias first, then hum balance, then oscillator amplitude, then the rest
}

// Preset jobs, in the order they are set: the bias before anything is
// driven (an output pair's current is set with no signal, before a scope
// or a speaker load hides a runaway), hum with the bias right, the
// oscillator's start last (common practice).
const (
	jobBias = iota
	jobHum
	jobOscillator
	jobUnknown
)

// biasShift is how far a preset must move a device's quiescent current
// over its travel to be called that device's bias preset: 20 % (common
// practice, no source: a smaller change is the preset's load on the
// device, not its job).
const biasShift = 0.2

// AddPresets gives the guide the procedure for each preset of c. op is
// the operating point of the circuit as captured, before the small-signal
// figures were filled in at the bias (nil: not solved; the presets are
// then classed by their wiring alone and carry no readings): the travel
// is solved afresh from it, so each device keeps its own large-signal law.
func (g *Guide) AddPresets(c *graph.Circuit, op *dc.Point, sts []stages.Stage) {
	if op != nil {
		c = op.Circuit
	}
	g.Presets = presets(c, sts, op)
	if g.Nothing != "" && len(g.Presets) > 0 {
		g.Nothing += " Its presets are set as below, before any signal tracing."
	}
}

// presets is the procedure for every preset of c, in the order they are
// set; op is c's operating point at the nominal settings (nil: not
// solved, and the steps then carry no readings).
func presets(c *graph.Circuit, sts []stages.Stage, op *dc.Point) []Preset {
	var out []Preset
	for _, p := range c.Parts {
		if p.Kind != graph.Pot || p.Type != graph.PotPreset || len(p.Pins) != 3 {
			continue
		}
		out = append(out, presetOf(c, sts, op, p))
	}
	slices.SortStableFunc(out, func(a, b Preset) int { return a.order - b.order })
	return out
}

// presetOf classes one preset by its circuit role, in turn.
func presetOf(c *graph.Circuit, sts []stages.Stage, op *dc.Point, p *graph.Part) Preset {
	if ps, ok := humBalance(c, p); ok {
		return ps
	}
	if ps, ok := oscillatorPreset(c, sts, op, p); ok {
		return ps
	}
	if ps, ok := biasPreset(c, op, p); ok {
		return ps
	}
	ps := Preset{Part: p.Ref, order: jobUnknown,
		Why: fmt.Sprintf("%s: pare cannot tell what it sets: it is in no oscillator's loop, not across a winding with its wiper at chassis, and over its travel it moves no device's quiescent current by %.0f %% or more", p.Ref, 100*biasShift)}
	if op != nil {
		ps.Points = netPoints(op, p)
	}
	return ps
}

// humBalance: a preset whose two ends are the two ends of one transformer
// winding, its wiper at chassis, is the winding's artificial centre tap:
// set for least hum. The solver models no hum (heater–cathode leakage and
// stray fields are not in a netlist), so the step is by ear or meter.
func humBalance(c *graph.Circuit, p *graph.Part) (Preset, bool) {
	a, w, b := p.Pins[0].Net, p.Pins[1].Net, p.Pins[2].Net
	if a == b || !c.RoleOf(w).IsACGround() || c.RoleOf(w) == graph.Heater {
		return Preset{}, false
	}
	for _, t := range c.Parts {
		if t.Kind != graph.Transformer {
			continue
		}
		for _, wd := range t.Windings {
			x, y := t.NetOf(wd.From), t.NetOf(wd.To)
			if x == a && y == b || x == b && y == a {
				return Preset{Part: p.Ref, order: jobHum,
					Job:     fmt.Sprintf("hum balance: %s is the artificial centre tap of %s's winding %s (its ends across the winding, its wiper at chassis)", p.Ref, t.Ref, wd.Name),
					Measure: "no signal in (input shorted or the volume at minimum): turn it for least hum, by ear at the loudspeaker or on an AC millivoltmeter across it; the least is usually near mid-travel",
					Points:  []string{fmt.Sprintf("%s's wiper at chassis, 0 V DC; its ends carry the winding's AC, no DC the solver sets", p.Ref), "pare's solvers model no hum (heater–cathode leakage and stray fields are not in the netlist): the setting is found on the bench"},
					Caution: "the winding is mains-derived: turn the preset with an insulated tool, the set live"}, true
			}
		}
	}
	return Preset{}, false
}

// oscillatorPreset: a preset on an electrode net of a device whose stage
// runs a loop sets that loop's gain: the margin over its travel from the
// loop solver, with the device's bias at each end from the DC solver. A
// preset inside the stage's feedback network (an arm of a phase-shift
// ladder), on none of the device's nets, sets where the loop's phase
// comes round as well: its frequency with its gain.
func oscillatorPreset(c *graph.Circuit, sts []stages.Stage, op *dc.Point, p *graph.Part) (Preset, bool) {
	for _, st := range sts {
		for _, l := range st.Loop {
			d := c.Part(l.Device)
			if d == nil {
				continue
			}
			on := onDevice(c, d, p)
			if !on && !slices.Contains(st.Parts, p.Ref) {
				continue
			}
			ps := Preset{Part: p.Ref, order: jobOscillator,
				Job:     fmt.Sprintf("oscillator gain: %s is in %s's loop (%s) and sets how hard it runs: a reliable start without clipping", p.Ref, d.Ref, st.Name),
				Measure: fmt.Sprintf("a scope on the oscillator's output: from the end that stops it, turn until it starts, then on a little further, until it starts at once on every switch-on (and with the supply 10 %% low) with no flattening of the peaks; too far and the wave clips"),
				Caution: "more gain than it needs clips the wave and raises the distortion; too little and it stops when cold or as the supply falls"}
			if !on {
				ps.Job = fmt.Sprintf("oscillator frequency and gain: %s is in %s's feedback network (%s) and sets both where it runs and how hard", p.Ref, d.Ref, st.Name)
				ps.Measure = "a frequency counter and a scope on the oscillator's output: turn it for the frequency wanted, then check it starts at once on every switch-on (and with the supply 10 % low) with no flattening of the peaks"
			}
			if op != nil {
				ps.Points = append(netPoints(op, p), loopTravel(c, p, l)...)
			}
			return ps, true
		}
	}
	return Preset{}, false
}

// onDevice says whether a preset has a pin on a non-ground net of one of
// the device's electrodes.
func onDevice(c *graph.Circuit, d, p *graph.Part) bool {
	for _, dp := range d.Pins {
		if c.RoleOf(dp.Net).IsACGround() {
			continue
		}
		if slices.ContainsFunc(p.Pins, func(q graph.Pin) bool { return q.Net == dp.Net }) {
			return true
		}
	}
	return false
}

// presetEnds are the settings a preset's travel is solved at: both ends.
var presetEnds = []float64{0, 1}

// atSetting is c with preset ref's wiper at set (0..1) and its operating
// point there; ok false when the DC solver fails.
func atSetting(c *graph.Circuit, ref string, set float64) (*graph.Circuit, *dc.Point, bool) {
	cl := c.Clone()
	// a Set of 0 reads as unset: the travel's 0 % end is a hair above it
	cl.Part(ref).Set = max(set, 1e-9)
	op, err := dc.Solve(cl)
	return cl, op, err == nil
}

// loopTravel is the loop's margin at both ends of the preset's travel
// and at its nominal setting: at each, the operating point solved afresh
// and the small-signal figures the netlist leaves open taken there
// (dc.Point.Biased), as the main job takes them at the nominal setting.
// A loop through several devices is read where the stage reads it
// (stages.Loop.BrokenAt: the Wien series arm, or one control electrode
// alone): a device's gm margin would read the open amplifier's gain.
func loopTravel(c *graph.Circuit, p *graph.Part, sl stages.Loop) []string {
	var out []string
	dev, what, gain := sl.Device, sl.Device+"'s loop", sl.Device+"'s loop gain"
	if sl.BrokenAt != "" {
		what = "the loop broken at " + sl.BrokenAt
		gain = "the loop gain broken at " + sl.BrokenAt + ","
	}
	for _, s := range []float64{presetEnds[0], p.Set, presetEnds[1]} {
		_, at, ok := atSetting(c, p.Ref, s)
		if !ok {
			continue
		}
		biased, _ := at.Biased()
		l, err := ac.FindLoop(biased, dev, sl.Break(ac.LoopOptions{}))
		if err != nil || l.F == 0 {
			out = append(out, fmt.Sprintf("%s at %.0f %% of its travel: %s has no 0° crossing (does not start), from the loop solver", p.Ref, 100*s, what))
			continue
		}
		state := "starts"
		if l.MarginDB < 0 {
			state = "does not start"
		}
		out = append(out, fmt.Sprintf("%s at %.0f %% of its travel: %s %+.1f dB at %s (%s), from the loop solver", p.Ref, 100*s, gain, l.MarginDB, hz(l.F), state))
	}
	return out
}

// netPoints are the preset's nets' DC volts at the nominal setting.
func netPoints(op *dc.Point, p *graph.Part) []string {
	var out []string
	seen := map[string]bool{}
	for _, pin := range p.Pins {
		v, ok := op.Volts(pin.Net)
		if !ok || seen[pin.Net] || op.Circuit.RoleOf(pin.Net) == graph.Ground {
			continue
		}
		seen[pin.Net] = true
		out = append(out, fmt.Sprintf("%s (%s's %s) %s DC", pin.Net, p.Ref, pinWord(pin.Name), signedVolts(v)))
	}
	if len(out) == 0 {
		return nil
	}
	return []string{fmt.Sprintf("at the nominal setting (%.0f %% of its travel), from the DC solver: %s", 100*p.Set, joinList(out))}
}

func pinWord(name string) string {
	if name == "w" {
		return "wiper"
	}
	return "end " + name
}

func mA(a float64) string { return fmt.Sprintf("%.3g mA", a*1e3) }

func joinList(s []string) string {
	out := ""
	for i, x := range s {
		if i > 0 {
			out += ", "
		}
		out += x
	}
	return out
}
