package pipeline

import (
	"fmt"
	"strings"

	"pare/graph"
)

// switchesHeader opens the top line saySwitches adds.
const switchesHeader = " Switches as reduced:"

// saySwitches writes at the top of the reduced netlist the position of
// each switch the reduction took out: the reduced circuit is the wiring
// those positions close, hard-wired, and nothing in the file says which it
// was. The club receiver reduced with --switch S1=2 is the LW circuit,
// while its header (the user's, kept) says "shown on MW": without this line
// a reader sweeping the file takes LW responses for MW ones.
func saySwitches(c, orig *graph.Circuit, set []SwitchSetting) {
	var at []string
	for _, p := range orig.Parts {
		if p.Kind != graph.Switch || c.Part(p.Ref) != nil {
			continue
		}
		at = append(at, fmt.Sprintf("%s at %d", p.Ref, int(p.Set)))
	}
	if len(at) == 0 {
		return
	}
	line := switchesHeader + " " + strings.Join(at, ", ") + " (taken out: the file is the wiring these positions close)"
	if len(set) > 0 {
		var given []string
		for _, s := range set {
			given = append(given, fmt.Sprintf("%s=%d", s.Name, s.Position))
		}
		line += "; turned for this run by --switch " + strings.Join(given, " ")
	}
	addHeader(c, line+".")
}
