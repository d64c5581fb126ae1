package stages

import (
	"fmt"

	"pare/graph"
	"pare/graph/ac"
)

// turnedFlags says of a device no pattern names and whose loop does not
// run as captured that it would oscillate with a transformer's winding
// turned over: a reversed reaction winding makes a superhet's local
// oscillator an unnamed "V1b stage", and a blind reviewer's capture with
// the reaction winding swapped drew no word from pare. None when the
// turned loop does not run either, or no transformer carries it.
func turnedFlags(lp *ac.Loops, lc *graph.Circuit, ref string) []string {
	t, err := loopTurned(lp, ref, true)
	if err != nil {
		return nil
	}
	fMin, fMax, _, best, ok := t.Range()
	through := carrier(lc, ref, t, true)
	if !ok || best < 0 || through == "" {
		return nil
	}
	span := hzText(fMin)
	if fMax > fMin {
		span += "–" + hzText(fMax)
	}
	if feedsOutput(lc, through) {
		return []string{fmt.Sprintf("%s's loop through %s is negative feedback as captured; with a winding of %s turned over it would turn positive and the set would oscillate (%s, loop gain up to %+.1f dB): after %s is replaced or rewired, check its connections match the drawing (a winding connected the wrong way round does this)",
			ref, through, through, span, best, through)}
	}
	return []string{fmt.Sprintf("%s does not oscillate as captured, but would with a winding of %s turned over (%s, loop gain up to %+.1f dB): if %s is meant to oscillate, check %s's connections (a winding connected the wrong way round does this)",
		ref, through, span, best, ref, through)}
}

// feedsOutput says whether transformer ref carries the set's output: a
// winding on a declared output net or across a loudspeaker. A loop through
// such a transformer is an amplifier's overall feedback (the output
// transformer's secondary brought back to an earlier stage), not an
// oscillator's reaction winding, however alike their physics.
func feedsOutput(c *graph.Circuit, ref string) bool {
	t := c.Part(ref)
	if t == nil {
		return false
	}
	out := map[string]bool{}
	for _, n := range c.Outputs {
		out[n] = true
	}
	for _, p := range c.Parts {
		if p.Kind == graph.Loudspeaker {
			for _, pn := range p.Pins {
				out[pn.Net] = true
			}
		}
	}
	for _, pn := range t.Pins {
		if out[pn.Net] && pn.Net != c.GroundNet() {
			return true
		}
	}
	return false
}
