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
	return []string{fmt.Sprintf("%s does not oscillate as captured, but would with a winding of %s turned over (%s, loop gain up to %+.1f dB): if %s is meant to oscillate, check %s's connections (a winding connected the wrong way round does this)",
		ref, through, span, best, ref, through)}
}
