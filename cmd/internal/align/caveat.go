package align

import (
	"fmt"
	"math"
	"strings"

	"pare/graph"
)

// genFloor is the least level a row may ask of a generator (common
// practice, no source): about 1 µV is where a service generator's
// attenuator stops being trustworthy and where a valve receiver's own noise
// at its first grid lies; a row asking less is the linear model's
// arithmetic, not a level anyone can set or hear above the hiss.
const genFloor = 1e-6

// potStep is how far each control's wiper is moved to see whether a row
// depends on it, and potSens the change in the row's response that counts
// as depending (1 %).
const (
	potStep = 0.25
	potSens = 0.01
)

// caveats says what a solved row assumes that a bench does not give for
// free: the controls whose setting its level depends on (at their set
// positions), and a level below genFloor with what to do instead (the AGC
// is said once for the table, Guide.injectNote).
func caveats(c *graph.Circuit, in Injection) string {
	var out []string
	if pots := potsOnRow(c, in); len(pots) > 0 {
		out = append(out, "assumes "+strings.Join(pots, " and ")+" (set positions as captured; the level changes with them)")
	}
	if in.Level > 0 && in.Level < genFloor {
		out = append(out, fmt.Sprintf("below %s, the least a generator sets reliably and about the set's own noise (common practice): a linear model's figure; on the bench inject %s, expect more than the reference, and compare stages by their gain",
			volts(genFloor), volts(genFloor)))
	}
	return strings.Join(out, "; ")
}

// potsOnRow lists, as "RV1 at 50 % of its travel", each control whose
// wiper changes the row's response by more than potSens when moved by
// potStep (the AC solver on the whole circuit, the rest as captured).
func potsOnRow(c *graph.Circuit, in Injection) []string {
	base, err := Response(c, in.Net, in.RefNet, in.Freq, in.Gang)
	if err != nil || base == 0 {
		return nil
	}
	var out []string
	for _, p := range c.Parts {
		if p.Kind != graph.Pot {
			continue
		}
		moved := c.Clone()
		q := moved.Part(p.Ref)
		q.Set = p.Set + potStep
		if q.Set > 1 {
			q.Set = p.Set - potStep
		}
		h, err := Response(moved, in.Net, in.RefNet, in.Freq, in.Gang)
		if err != nil || math.Abs(h-base) <= potSens*base {
			continue
		}
		out = append(out, fmt.Sprintf("%s at %.0f %% of its travel", p.Ref, p.Set*100))
	}
	return out
}
