package align

import (
	"strings"

	"pare/graph"
	"pare/rules/stages"
)

// detectorStage is the detector: the stage a detector pattern found, else
// a diode fed from a tuned signal winding, found by its wiring
// (stages.Detectors), as a stage of its own named after the diode and
// holding the parts on its load net. An AM set whose detector no pattern
// matched (a double-diode-triode's diodes loaded to its cathode) still has
// one: the IF is watched at its DC or the AGC line, and the rows after it
// inject audio. nil when there is neither.
func detectorStage(c *graph.Circuit, sts []stages.Stage) *stages.Stage {
	for i := range sts {
		t := sts[i].Topology
		if strings.Contains(t, "detector") || strings.Contains(t, "discriminator") {
			return &sts[i]
		}
	}
	ds := stages.Detectors(c)
	if len(ds) == 0 {
		return nil
	}
	s := &stages.Stage{Name: ds[0].Ref, Topology: "diode-detector", Parts: []string{ds[0].Ref}}
	for _, p := range c.Parts {
		if p.Kind != graph.Resistor && p.Kind != graph.Capacitor && p.Kind != graph.Pot {
			continue
		}
		for _, pin := range p.Pins {
			if pin.Net == ds[0].Load {
				s.Parts = append(s.Parts, p.Ref)
				break
			}
		}
	}
	return s
}
