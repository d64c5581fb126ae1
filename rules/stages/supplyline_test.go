package stages

import (
	"path/filepath"
	"slices"
	"testing"

	"pare/graph"
)

// TestDeviceServesItsSupplyLine: a transistor no pattern names takes, as
// its own, the load and bias resistors that return to a decoupled supply
// line (a rail behind a decoupling resistor, held down by a capacitor the
// supply stage keeps on the reduced circuit), and leaves that decoupler to
// the supply stage. Before, the line counted as a signal net: the
// preamplifier's collector load and upper bias resistor of review21 b05 (a
// blind reviewer's capture, invented values) were in no stage and drawn
// inside the next coupling's and the driver's frames, and the battery
// set's decoupler was framed as its transistor's stage. Which resistor is
// a load, a bias or a decoupler is the captures' own word (their notes and
// header comments), the trade's common practice.
func TestDeviceServesItsSupplyLine(t *testing.T) {
	for _, tc := range []struct {
		file      string
		dev       string
		own, not  []string
		supplyRef string // a decoupler part the supply stage holds
	}{
		{"testdata/incircuit-battery.toml", "Q1", []string{"R2"}, []string{"R1", "C2"}, "R1"},
		{"../../testdata/review21/b05.toml", "Q4", []string{"R14", "R15", "C19"}, []string{"R25", "C25"}, "R25"},
	} {
		t.Run(filepath.Base(tc.file), func(t *testing.T) {
			c, err := graph.LoadFile(tc.file)
			if err != nil {
				t.Fatal(err)
			}
			st := findBiased(t, c)
			s := holding(st, tc.dev)
			if s == nil {
				t.Fatalf("no stage holds %s: %s", tc.dev, topologies(st))
			}
			for _, r := range tc.own {
				if !slices.Contains(s.Parts, r) {
					t.Errorf("%s's stage %s %v lacks %s", tc.dev, s.Name, s.Parts, r)
				}
			}
			for _, r := range tc.not {
				if slices.Contains(s.Parts, r) {
					t.Errorf("%s's stage %s %v holds the decoupler's %s", tc.dev, s.Name, s.Parts, r)
				}
			}
			if h := holding(st, tc.supplyRef); h == nil || h.Topology != "smoothing-filter" {
				t.Errorf("%s not in a supply decoupling stage: %s", tc.supplyRef, topologies(st))
			}
		})
	}
}
