// Package align turns what pare knows of a superhet (its IF, the IF
// transformers and their cores, the oscillator and signal ranges, the
// tracking points, the gains of every stage) into the bench guide a
// repairer works from after a recap or a valve change: the alignment
// procedure in the trade's order, a signal-injection table for finding a
// dead stage, and what common faults look like in those readings.
//
// Every frequency the procedure quotes is one of the stage figures
// (rules/stages), read by name; every level in the injection table is the
// AC solver's on the whole circuit as captured (graph/ac). The package
// never prints: `pare align` and the repair note write a Guide.
package align

import (
	"slices"
	"strconv"
	"strings"

	"pare/graph"
	"pare/graph/ac"
	"pare/graph/safety"
	"pare/rules/stages"
)

// Guide is the bench guide of one circuit.
type Guide struct {
	Title string
	// Caution is the caution of the set's class for work on a live set
	// (graph/safety): alignment and signal tracing are done switched on.
	Caution []string
	// AGC is the set's AGC line ("" when none is found): the injection
	// table, a linear model, holds with it held at its no-signal voltage.
	AGC string
	// band are the parts the wavechange switch puts in circuit at its set
	// position only (bandParts): a band's own trimmers.
	band map[string]bool
	// det is the detector's sides as wired (detSides), with the DC
	// solver's word on them once Build has asked it; nil without one.
	det *detSides
	// IF is the set's intermediate frequency in hertz (0: none known) and
	// IFFrom where it was read ("S2 IF", "[freqs] if"); FM marks an FM IF
	// strip (a discriminator or ratio detector recognised).
	IF     float64
	IFFrom string
	FM     bool
	// Steps is the procedure, numbered from 1 in the order they are done.
	Steps []Step
	// Repeat says which steps are repeated until both ends hold.
	Repeat []string
	// Ends are the dial ends the oscillator and signal ranges should reach.
	Ends []End
	// Warnings: what the circuit cannot do or the capture does not show.
	Warnings []string
	// TrackNote says plainly why a set with ganged tuning has no tracking
	// steps, and what to turn instead; empty when the steps are there.
	TrackNote string
	// LeftOut names each trimmer and adjustable core no step turns, with
	// why and what the trade turns it for (account.go).
	LeftOut []string
	// Nothing is set, with the reason, when there is nothing to align.
	Nothing string
	// Inject is the signal-injection table from the output back to the
	// input; InjectErr says why it could not be made.
	Inject    []Injection
	InjectErr string
	// dials are the RF rows' gang settings, by tank and frequency: the
	// rows of one set share them (dialGang).
	dials map[string][2]float64
	// Hints are the symptom hints for the kinds of stage this circuit has.
	Hints []Hint
	// Presets are the procedures for the circuit's presets, in the order
	// they are set (presets.go).
	Presets []Preset
	// solved answers the injection rows' responses of the circuit Build
	// was given (response): one elaboration per gang setting for every
	// row, where a fresh one per row made the table cost the square of
	// the set.
	solved *ac.Responses
	of     *graph.Circuit
	// reaches are the reach searches shared with the other guides of the
	// same circuit (nil: each searched afresh).
	reaches *Reaches

	aerialInto string // where the RF generator goes, for the tracking steps
}

// Step is one adjustment.
type Step struct {
	N     int
	Phase string // "IF", "oscillator", "aerial/RF"
	Part  string // the part turned: "T2", "TC2"
	// Winding is the winding whose core is turned ("s", "p"), empty for a
	// whole core or a trimmer: a sheet's mark tells the two apart.
	Winding string
	What    string // "core of T2's secondary (s)", "oscillator trimmer TC2"
	// Freq is the generator frequency in hertz; Dial, when not zero, the
	// dial (signal) frequency the set is tuned to, and Osc the oscillator
	// frequency expected there.
	Freq, Dial, Osc float64
	Into            string // where the generator goes: "the mixer's grid (V1 g1, net osc_g)"
	// Counter, for a lone oscillator's coverage (vfo.go), is where a
	// frequency counter reads it: no generator is used.
	Counter string
	Watch   string // what to watch and for what
	From    string // where the frequency comes from: "S2 track_fit"
	// Band names the wavechange position the step is done at ("" for the
	// set as captured): "band 2 (S1a, S1b at position 2)".
	Band string
}

// End is what one end of the dial should show.
type End struct {
	Where    string // "gang fully meshed (low end)"
	Sig, Osc float64
}

// Build makes the guide of a circuit as captured (the original, not the
// reduced one) from the stages pare found, under the caution of its class.
func Build(title string, c *graph.Circuit, sts []stages.Stage, caution safety.Caution) *Guide {
	return build(title, c, sts, caution, nil)
}

// build is Build with the reach searches of rs (nil: none shared).
func build(title string, c *graph.Circuit, sts []stages.Stage, caution safety.Caution, rs *Reaches) *Guide {
	g := procedure(c, sts, rs)
	g.Title, g.Caution = title, caution.Alignment()
	g.AGC = agcNet(c)
	g.confirmDetector(c)
	g.solved, g.of = ac.NewResponses(c), c
	g.Inject, g.InjectErr = injections(c, sts, g)
	g.solved, g.of = nil, nil
	g.Hints = hintsFor(c, sts, g.IF, g.det)
	return g
}

// procedure is the numbered procedure alone: what a sheet marks. Its
// reach searches are rs's (nil: searched afresh).
func procedure(c *graph.Circuit, sts []stages.Stage, rs *Reaches) *Guide {
	g := &Guide{reaches: rs}
	mix := mixerStage(sts)
	g.IF, g.IFFrom = setIF(c, mix)
	g.det = detectorSides(c, sts)
	g.FM = fmDetector(sts) || g.IF >= fmIFMin
	g.ifSteps(c, sts)
	g.trapSteps(switched(c))
	g.tracking(c, sts)
	g.calibrate(c, sts)
	g.coverage(c, sts)
	g.signalTrack(c, sts)
	for i := range g.Steps {
		g.Steps[i].N = i + 1
	}
	g.account(switched(c), sts)
	if len(g.Steps) == 0 {
		g.Nothing = g.nothingReason(c, sts)
	}
	return g
}

// Marks are the step numbers turned at each part of the circuit, by ref,
// as a sheet labels them ("align 1, 2"; "align 3 sec, 4 pri" where two
// windings of one transformer are turned): the parts of the circuit as
// captured, in step order, with every other band's steps from run (as
// AddBands numbers them; nil: the set's own band only), so a band's own
// trimmers, switched out as captured, carry their marks too.
func Marks(c *graph.Circuit, sts []stages.Stage, run Runner) map[string]string {
	return marks(c, sts, run, nil)
}

// marks is Marks with the reach searches of rs (nil: none shared).
func marks(c *graph.Circuit, sts []stages.Stage, run Runner, rs *Reaches) map[string]string {
	g := procedure(c, sts, rs)
	g.AddBands(c, sts, run)
	steps := map[string][]Step{}
	var refs []string
	for _, s := range g.Steps {
		if steps[s.Part] == nil {
			refs = append(refs, s.Part)
		}
		steps[s.Part] = append(steps[s.Part], s)
	}
	out := make(map[string]string, len(refs))
	for _, ref := range refs {
		out[ref] = "align " + markNumbers(steps[ref])
	}
	return out
}

// markNumbers are one part's step numbers, each with its winding's short
// word when the steps turn more than one winding.
func markNumbers(steps []Step) string {
	var nums []string
	for _, s := range steps {
		n := strconv.Itoa(s.N)
		if s.Winding != "" && slices.ContainsFunc(steps, func(o Step) bool { return o.Winding != s.Winding }) {
			n += " " + windingShort(s.Winding)
		}
		nums = append(nums, n)
	}
	return strings.Join(nums, ", ")
}

// fmIFMin separates an FM IF (10.7 MHz) from an AM one (455–470 kHz): any
// IF above 5 MHz is taken as FM (common practice, no source).
const fmIFMin = 5e6

// mixerStage is the first stage that carries the mixer's figures (an IF
// and an oscillator range), or nil.
func mixerStage(sts []stages.Stage) *stages.Stage {
	for i := range sts {
		if _, ok := sts[i].Figures.Get("if"); ok {
			return &sts[i]
		}
	}
	return nil
}

// setIF is the IF the set is aligned to: the mixer's IF figure, else the
// netlist's own [freqs] if (an IF strip on its own).
func setIF(c *graph.Circuit, mix *stages.Stage) (float64, string) {
	if mix != nil {
		if f, ok := mix.Figures.Get("if"); ok && f.Value > 0 {
			return f.Value, mix.Name + " IF"
		}
	}
	if f := c.Freqs["if"]; f > 0 {
		return f, "[freqs] if"
	}
	return 0, ""
}

func fmDetector(sts []stages.Stage) bool {
	for _, s := range sts {
		if s.Topology == "fm-ratio-detector" || s.Topology == "fm-phase-discriminator" {
			return true
		}
	}
	return false
}

// nothingReason says why a circuit has no numbered steps: nothing to
// align at all, or no step pare could work out for the adjusters the
// tracking note and LeftOut name.
func (g *Guide) nothingReason(c *graph.Circuit, sts []stages.Stage) string {
	ifHz := g.IF
	trimmers, cores := 0, 0
	for _, p := range c.Parts {
		if p.Type == graph.CapTrimmer {
			trimmers++
		}
		cores += len(p.Adjust)
	}
	why := "no trimmer capacitor and no adjustable core is captured"
	if trimmers+cores > 0 {
		why = "its trimmers and cores tune no IF transformer and no ganged oscillator pare recognised"
	}
	if len(ifTransformers(c, sts, ifHz)) == 0 && mixerStage(sts) == nil {
		why += ", and pare recognised no IF transformer and no frequency changer"
	}
	if trimmers+cores > 0 {
		return "no numbered steps: " + why + "; what to turn by the usual method is said below."
	}
	return "nothing to align: " + why + "."
}
