package align

import (
	"slices"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// Hint is what a common fault of one kind of stage looks like on the
// bench, for a stage of this circuit.
type Hint struct {
	Stages   []string // "S6", "S8": every stage of the kind, in order
	Parts    []string // the parts of those stages, in order, each once
	Fault    string
	Readings string // in the DC readings
	Inject   string // in the injection table
}

// hintRow is one fault of a kind of stage (common practice, no source: the
// faults a service bench meets most, in our own words).
type hintRow struct {
	kinds    []string // topology words that select the row
	atIF     bool     // only a stage tuned to the IF
	fault    string
	readings string
	inject   string
}

// openDetector is the detector's fault, whose readings quote the DC
// solver's figure for the detector load where it has one.
const openDetector = "open detector diode or load"

var hintTable = []hintRow{
	{[]string{"hartley", "colpitts", "clapp", "tickler", "pierce", "self-oscillating-mixer"}, false,
		"dead oscillator",
		"no negative voltage on the oscillator grid (or base bias not pulled back); the cathode or emitter current rises to its no-signal value",
		"the IF row gives its output, the RF row gives none at any setting of the dial"},
	{[]string{"mixer"}, false,
		"mixer not converting",
		"anode or collector voltage normal but screen or emitter readings off the chart",
		"IF injected at the mixer input passes, RF at the aerial gives nothing though the oscillator runs"},
	{[]string{"double-tuned", "tuned-winding", "amp-tuned"}, true,
		"detuned IF transformer (cores moved, a tuning capacitor gone low)",
		"DC readings normal",
		"the IF row at the IF needs far more level than the table says; rocking the generator finds a peak away from the IF"},
	{[]string{"amp-common-bypassed"}, false,
		openBypass,
		"DC readings normal",
		bypassUnsolved}, // worded per stage with its solved fall (bypass.go)
	{[]string{"oscillator-loop-capacitor"}, false,
		"open or failing capacitor in an oscillator's loop (a padder, a feedback or DC-blocking capacitor)",
		"open, the oscillator stops or runs off frequency: a stopped one's grid or base loses the bias its running gives, and its cathode or emitter current rises to its no-signal value",
		"the oscillator stops (the RF rows give nothing at any dial setting) or runs off frequency (stations come in at the wrong dial places)"},
	{[]string{"rc-coupling", "coupling-capacitor"}, false,
		"leaky coupling capacitor",
		"the next grid sits positive (a valve) or the next base is pulled off its bias; that stage's anode or collector voltage drops",
		"the stage after it distorts or gains little; injection before the capacitor needs more level than after it by more than the table's gain"},
	{[]string{"rc-coupling", "coupling-capacitor"}, false,
		"open coupling capacitor",
		"DC readings normal",
		"injection after the capacitor works, before it nothing (or a faint signal by stray capacity)"},
	{[]string{"speaker-coupling"}, false,
		"open or dried-out output capacitor",
		"DC readings normal: the output's mid-point keeps its chart reading",
		"the rows up to the output reach it at their level, yet the loudspeaker gives nothing, or thin sound with the bass gone"},
	{[]string{"speaker-coupling"}, false,
		"leaky output capacitor",
		"DC flows through the loudspeaker: the output's mid-point is pulled off its chart reading towards the loudspeaker's return and the cone sits pushed off centre",
		"the output distorts early, on one half of the wave, at levels the table's gain should pass clean"},
	{[]string{"detector"}, false,
		openDetector,
		"no DC on the detector load and the AGC line with a carrier in",
		"the IF rows reach the detector at their level, the audio rows work, yet no audio comes from an IF injection"},
	{[]string{"discriminator", "ratio-detector"}, false,
		"misaligned FM detector",
		"the DC at the audio output is not zero with an unmodulated carrier at the IF",
		"an FM signal at the IF gives distorted audio; AM on the carrier is heard"},
	{[]string{"volume-control"}, false,
		wornVolume,
		"DC readings normal",
		"injection at the top of the control gives a crackling or missing output that changes as the control is moved"},
	{[]string{"agc-filter"}, false,
		"leaky AGC decoupling capacitor",
		"the AGC line stays near zero volts on a strong carrier",
		"strong signals overload: the output stops rising with level long before the IF rows' reference"},
}

// ownOutput is the injection wording of the oscillator faults for an
// oscillator that is the circuit's output (common practice: an oscillator
// is checked running on an oscilloscope or a counter; injection cannot
// stand in for it).
var ownOutput = map[string]string{
	"dead oscillator": "nothing at {out}; no injection row stands in for an oscillator: look at {out} on an oscilloscope or a counter",
	"open or failing capacitor in an oscillator's loop (a padder, a feedback or DC-blocking capacitor)": "nothing at {out} (the oscillator stops), or its frequency on a counter moves away from the loop's figure",
}

// outputName is the circuit's first output for a hint, "the output" when
// none is declared.
func outputName(c *graph.Circuit) string {
	if len(c.Outputs) > 0 {
		return "the output (" + c.Outputs[0] + ")"
	}
	return "the output"
}

// hintsFor are the hints for the stages the circuit has, in stage order;
// a sub-stage does not repeat a fault its parent already shows.
func hintsFor(c *graph.Circuit, sts []stages.Stage, ifHz float64, sides *detSides) []Hint {
	var out []Hint
	family, det := setFamily(c), sides.signOf()
	for _, s := range sts {
		if s.Supply {
			continue
		}
		for _, row := range hintTable {
			if !slices.ContainsFunc(row.kinds, func(k string) bool { return strings.Contains(s.Topology, k) }) ||
				(row.atIF && !tunedAt(s, ifHz)) || shown(out, row.fault, s.Parts) {
				continue
			}
			row.readings = readingsFor(row, family, det)
			if w := sides.dcWords(); w != "" && row.fault == openDetector {
				row.readings += " (healthy: " + w + ")"
			}
			if row.fault == wornVolume {
				row = potRow(c, s, row)
			}
			if alone, ok := ownOutput[row.fault]; ok && ifHz <= 0 && mixerStage(sts) == nil {
				// No IF and no mixer: the oscillator is the circuit's
				// own output (a test-tone board, a VFO), not a local
				// oscillator; there are no RF rows and no dial.
				row.inject = strings.ReplaceAll(alone, "{out}", outputName(c))
			}
			out = addHint(out, s, row)
		}
	}
	for i := range out {
		if out[i].Fault == openBypass {
			out[i].Inject = bypassInject(c, sts, out[i].Stages)
		}
	}
	return out
}

// addHint adds a stage to the hint of its fault, or starts one: a large set
// with forty coupling capacitors gets one line for them, not forty.
func addHint(hs []Hint, s stages.Stage, row hintRow) []Hint {
	for i := range hs {
		if hs[i].Fault == row.fault {
			hs[i].Stages = append(hs[i].Stages, s.Name)
			for _, p := range s.Parts {
				if !slices.Contains(hs[i].Parts, p) {
					hs[i].Parts = append(hs[i].Parts, p)
				}
			}
			return hs
		}
	}
	return append(hs, Hint{Stages: []string{s.Name}, Parts: slices.Clone(s.Parts), Fault: row.fault, Readings: row.readings, Inject: row.inject})
}

// shown tells whether a hint for fault already covers all of parts.
func shown(hs []Hint, fault string, parts []string) bool {
	for _, h := range hs {
		if h.Fault == fault && !slices.ContainsFunc(parts, func(p string) bool { return !slices.Contains(h.Parts, p) }) {
			return true
		}
	}
	return false
}

const wornVolume = "worn volume track"

// potRow words the worn-track fault for the pot the stage holds: a volume
// control fed from a detector (its track the detector's load, in a
// receiver) says where its top is; one the stages named a level control
// (a pot above the audio range, an RF generator's output attenuator) is
// worded as one; any other keeps the name without the receiver's words.
func potRow(c *graph.Circuit, s stages.Stage, row hintRow) hintRow {
	for _, ref := range s.Parts {
		p := c.Part(ref)
		if p == nil || p.Kind != graph.Pot {
			continue
		}
		for _, pin := range p.Pins {
			if c.DetectorFeeds(pin.Net, "") {
				row.inject = strings.Replace(row.inject, "top of the control", "top of the control (the detector load)", 1)
				return row
			}
		}
	}
	if s.Title == stages.LevelTitle {
		row.fault = "worn level-control track"
	}
	return row
}
