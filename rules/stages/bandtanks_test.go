package stages

import (
	"path/filepath"
	"slices"
	"testing"

	"pare/graph"
)

// TestBandTanksApart: a wavechange set's oscillator stage holds the
// oscillator's tank on every band, never the aerial circuit's gang
// section, coil or trimmers, as on the band a pattern names its aerial
// circuit (common practice: one tank per gang section). review21 b05 on LW
// (S1a open puts the rod's LW winding in series with the MW winding, so no
// single-winding pattern names the aerial tank) had its self-oscillating
// mixer gather T1, VC1a, TC4 and C28 through the base winding, and the
// alignment then took VC1a for the oscillator's section. The variant
// (cmd/internal/align/testdata) has a separate LW loading coil and the
// gang's sections lettered the other way round.
func TestBandTanksApart(t *testing.T) {
	for _, tc := range []struct {
		path          string
		osc           string   // the oscillator's gang section
		aerial        []string // the aerial tank's parts
		positionsOf   []string // the wavechange wafers, turned to LW
		positionValue float64
	}{
		{filepath.Join("..", "..", "testdata", "review21", "b05.toml"), "VC1b", []string{"VC1a", "T1", "TC4"}, []string{"S1a", "S1b", "S1c"}, 2},
		{filepath.Join("..", "..", "cmd", "internal", "align", "testdata", "lw-loading-coil.toml"), "VC1a", []string{"VC1b", "T1", "L1", "TC4"}, []string{"S1a", "S1b", "S1c"}, 2},
	} {
		t.Run(filepath.Base(tc.path), func(t *testing.T) {
			c, err := graph.LoadFile(tc.path)
			if err != nil {
				t.Fatal(err)
			}
			for _, s := range tc.positionsOf {
				c.Part(s).Set = tc.positionValue
			}
			st := findReduced(t, c)
			mix := holding(st, "Q1")
			if mix == nil || mix.Topology != loopMixerTopology {
				t.Fatalf("Q1 not a self-oscillating mixer: %s", topologies(st))
			}
			if !slices.Contains(mix.Parts, tc.osc) {
				t.Errorf("%s lacks the oscillator's section %s: %v", mix.Name, tc.osc, mix.Parts)
			}
			for _, r := range tc.aerial {
				if slices.Contains(mix.Parts, r) {
					t.Errorf("%s holds the aerial tank's %s: %v", mix.Name, r, mix.Parts)
				}
			}
		})
	}
}
