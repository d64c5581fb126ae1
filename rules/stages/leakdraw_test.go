package stages

import (
	"slices"
	"testing"
)

// An oscillator's drawing template stands its grid leak and its output
// electrode's feed where the trade draws them (common practice; ../shared/DRAWING-NOTES.md: "the
// grid capacitor and leak sit between the tank's hot end and the grid; an
// amplifier's load rises to the rail above the output electrode").
//   - review15 a01: the Colpitts pattern names the grid capacitor C3 (in
//     row 0 left of the valve) but not the leak R1: the leak now stands
//     in row 0 beyond the capacitor; the anode's RF choke L2 stands over
//     the valve (row -1, column 0).
//   - testdata/tanks/colpitts-bjt-choke-fed: the same for a transistor, the
//     merged base bias resistor and the collector choke.
func TestOscillatorLeakAndFeedPlaced(t *testing.T) {
	cases := []struct {
		dir, file string
		device    string // the oscillator's device
		leak      string // its grid leak or base bias resistor
		feed      string // its output electrode's feed ("" none placed)
	}{
		{"review15", "a01.toml", "V1", "R1", "L2"},
		{"tanks", "colpitts-bjt-choke-fed.toml", "Q1", "R1", "L2"},
	}
	for _, tc := range cases {
		stages := findBiased(t, reviewCircuit(t, tc.dir, tc.file))
		var osc *Stage
		for i := range stages {
			if slices.Contains(stages[i].Parts, tc.device) {
				osc = &stages[i]
			}
		}
		if osc == nil || !slices.Contains(osc.Parts, tc.leak) {
			t.Errorf("%s: the leak %s is not in %s's stage: %s", tc.file, tc.leak, tc.device, topologies(stages))
			continue
		}
		at := map[string]Place{}
		for _, p := range osc.Draw {
			at[p.Part] = p
		}
		leak, ok := at[tc.leak]
		if !ok || leak.Row != 0 || leak.Stand != "vertical" {
			t.Errorf("%s: leak %s not hung in the device's row: %+v", tc.file, tc.leak, osc.Draw)
		}
		for _, p := range osc.Draw {
			if p.Row == 0 && p.Col != 0 && p.Col*leak.Col > 0 && abs(p.Col) > abs(leak.Col) {
				t.Errorf("%s: %s stands further out than the leak %s: %+v", tc.file, p.Part, tc.leak, osc.Draw)
			}
		}
		if tc.feed != "" {
			if f, ok := at[tc.feed]; !ok || f.Row != -1 || f.Col != 0 {
				t.Errorf("%s: feed %s not over the device: %+v", tc.file, tc.feed, osc.Draw)
			}
		}
	}
}
