package render

import (
	"testing"

	"pare/graph"
	"pare/render/check"
)

// A reduced pentode whose screen and suppressor were dropped as static
// electrodes has them on "nc", the format's not-connected net
// (docs/netlist.md). The reduced sheet must draw cathode, g1 and anode only,
// and no view may join the two "nc" electrodes by a wire (it would read as
// the screen strapped to the suppressor).
const droppedElectrodes = `
title = "Pentode with dropped electrodes"
band = "300..3k"
inputs = ["in"]
outputs = ["out"]
[parts]
C1 = { c = "10n", pins = ["in", "g"] }
R1 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "pentode", pins = { a = "out", g1 = "g", g2 = "nc", g3 = "nc", k = "k" } }
R2 = { r = "1k", pins = ["k", "gnd"] }
R3 = { r = "100k", pins = ["out", "gnd"] }
`

func TestUnconnectedElectrodes(t *testing.T) {
	c, err := graph.Parse("dropped.toml", []byte(droppedElectrodes))
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		view View
		pins []string // V1's drawn pins, in the symbol's order
	}{
		// reduced: only the electrodes that carry signal (the task's rule)
		{Reduced, []string{"a", "g1", "k"}},
		// full: every electrode the netlist names, the "nc" ones as bare leads
		{Full, []string{"a", "g3", "g2", "g1", "k"}},
	} {
		g, err := Config{}.Geometry(&Sheet{Circuit: c, View: tc.view})
		if err != nil {
			t.Fatal(err)
		}
		var got []string
		for _, s := range g.Symbols {
			if s.Ref == "V1" {
				for _, p := range s.Pins {
					got = append(got, p.Name)
				}
			}
		}
		if len(got) != len(tc.pins) {
			t.Errorf("%s view: V1 drawn with pins %v, want %v", tc.view, got, tc.pins)
		} else {
			for i := range got {
				if got[i] != tc.pins[i] {
					t.Errorf("%s view: V1 drawn with pins %v, want %v", tc.view, got, tc.pins)
					break
				}
			}
		}
		for _, w := range g.Wires {
			if w.Net == "nc" {
				t.Errorf("%s view: the not-connected electrodes are wired together: %v", tc.view, w.Segs)
			}
		}
		if p := check.Measure(g).Problems(); len(p) > 0 {
			t.Errorf("%s view: %v", tc.view, p)
		}
	}
}
