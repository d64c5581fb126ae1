package pipeline

import (
	"pare/graph"
	"pare/render"
	"pare/rules/stages"
)

// chainedFilters are the topologies of passive filter sections whose first
// shunt capacitor is the stage's before them: a pi filter's capacitor
// across its source (the detector's load capacitor), a ladder section's
// the section before's. Drawn on two rows, the filter's first capacitor
// stood on one page and its resistor and second capacitor on the next
// (review14 b03, a03): a technician reads neither half as a pi filter.
var chainedFilters = map[string]bool{"rc-pi-filter": true, "rc-low-pass": true}

// joinChained marks Joined the frame of each chained filter section whose
// input net holds a capacitor to chassis of the frame just before it, so a
// page cut keeps the section with the capacitor it shares. c is the sheet's
// circuit (the original one on full and faded sheets); names[i] is the
// stage of frames[i], tops the stages by name.
func joinChained(frames []render.Frame, names []string, tops map[string]stages.Stage, c *graph.Circuit) {
	for i := 1; i < len(frames); i++ {
		if s, ok := tops[names[i]]; !ok || !chainedFilters[s.Topology] || frames[i].Joined {
			continue
		}
		if sharesShunt(c, frames[i-1].Parts, frames[i].Parts) {
			frames[i].Joined = true
		}
	}
}

// sharesShunt tells whether a capacitor of before, with one end on chassis,
// has its other end on a net a part of after is on.
func sharesShunt(c *graph.Circuit, before, after []string) bool {
	on := map[string]bool{}
	for _, ref := range after {
		if p := c.Part(ref); p != nil {
			for _, pn := range p.Pins {
				on[pn.Net] = true
			}
		}
	}
	for _, ref := range before {
		p := c.Part(ref)
		if p == nil || p.Kind != graph.Capacitor || len(p.Pins) != 2 {
			continue
		}
		a, b := p.Pins[0].Net, p.Pins[1].Net
		if isGroundNet(c, b) && on[a] || isGroundNet(c, a) && on[b] {
			return true
		}
	}
	return false
}
