package align

import (
	"fmt"
	"slices"
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// The IF strip's input is the control electrode of the device whose output
// feeds the first IF transformer: in a superhet the mixer's signal grid or
// base (common practice: the IF generator goes there, through a small
// capacitor, so every IF can is in the path), never the aerial.

// ifFeeder is the active part whose output electrode sits on the first IF
// transformer in signal order, or nil.
func ifFeeder(c *graph.Circuit, sts []stages.Stage, ifHz float64) *graph.Part {
	cans := ifTransformers(c, sts, ifHz)
	if len(cans) == 0 {
		return nil
	}
	return outputFeeder(c, cans[0])
}

// mixerDevice is the set's mixer: the device feeding the first IF
// transformer when a stage names it a mixer or the set has ganged tuning
// (a front end), else the first active part of a mixer stage that no IF
// can drives (one that an IF can drives is an IF amplifier); nil for an IF
// strip captured on its own.
func mixerDevice(c *graph.Circuit, sts []stages.Stage, ifHz float64) *graph.Part {
	if p := ifFeeder(c, sts, ifHz); p != nil && (inMixerStage(sts, p.Ref) || len(gangSections(c)) >= 2) {
		return p
	}
	cans := ifTransformers(c, sts, ifHz)
	if mix := mixerStage(sts); mix != nil {
		for _, ref := range mix.Parts {
			if p := c.Part(ref); p != nil && p.IsActive() && !downstreamOfIF(c, cans, p) {
				return p
			}
		}
	}
	return nil
}

func inMixerStage(sts []stages.Stage, ref string) bool {
	for _, s := range sts {
		if strings.Contains(s.Topology, "mixer") && slices.Contains(s.Parts, ref) {
			return true
		}
	}
	return false
}

// oscillatorOnly are the devices that run an oscillator loop and are not
// the mixer: their grid is no stage of the signal path.
func oscillatorOnly(sts []stages.Stage, mixer *graph.Part) map[string]bool {
	out := map[string]bool{}
	for _, s := range sts {
		for _, l := range s.Loop {
			if mixer == nil || l.Device != mixer.Ref {
				out[l.Device] = true
			}
		}
	}
	return out
}

// ifInto is where the IF generator goes: the IF strip's input, through a
// small capacitor (common practice).
func ifInto(c *graph.Circuit, sts []stages.Stage, ifHz float64) string {
	whose := "the mixer's "
	p := mixerDevice(c, sts, ifHz)
	if p == nil {
		whose = "the IF strip's input, the device feeding the first IF transformer: its "
		p = ifFeeder(c, sts, ifHz)
	}
	if p != nil {
		pin := signalGrid(c, p)
		return fmt.Sprintf("%s%s (%s %s, net %s) through a small capacitor", whose, stages.ControlWord(p), p.Ref, pin, p.NetOf(pin))
	}
	if len(c.Inputs) > 0 {
		return fmt.Sprintf("the IF strip's input (net %s)", c.Inputs[0])
	}
	return "the mixer's input"
}

// ifIntoNet is the net ifInto sends the IF generator to, "" when it names
// none: the mixer's (or IF strip's) control electrode, else the input.
func ifIntoNet(c *graph.Circuit, sts []stages.Stage, ifHz float64) string {
	p := mixerDevice(c, sts, ifHz)
	if p == nil {
		p = ifFeeder(c, sts, ifHz)
	}
	if p != nil {
		return p.NetOf(signalGrid(c, p))
	}
	if len(c.Inputs) > 0 {
		return c.Inputs[0]
	}
	return ""
}
