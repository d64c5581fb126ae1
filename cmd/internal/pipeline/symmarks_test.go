package pipeline

import (
	"path/filepath"
	"reflect"
	"testing"

	"pare/render"
)

// The frequency changer's pentode loses its screen (fed from the HT
// through R3, decoupled to chassis by C7) and its suppressor (strapped to
// the cathode, as its note says) to the static-electrode rule: the reduced
// sheet is told to keep both grid lines, the screen at its line (a rail
// bar, the valve's label naming the line "HT via R3") and the suppressor
// on the cathode; and the
// trimmers merged into the gang sections stay on them as alignment points
// (the netlist's own wiring: TC1 across VC1a, TC2 across VC1b). The other
// views draw every electrode the netlist wires, the suppressor as the
// strap to its cathode (TestCathodeGridsStrapped), and no presets.
func TestReducedSheetKeepsStaticGridsAndTrimmers(t *testing.T) {
	r, err := stagesRun(example("frequency-changer"))
	if err != nil {
		t.Fatal(err)
	}
	s := r.Sheet(render.Reduced)
	want := map[string]render.Tie{"g2": render.TieRail, "g3": render.TieCathode}
	if got := s.Ties["V1"]; !reflect.DeepEqual(got, want) {
		t.Errorf("V1 ties %v, want %v", got, want)
	}
	if got := s.TieLabels["V1"]; got != "g2 HT via R3" {
		t.Errorf("V1 tie label %q, want %q", got, "g2 HT via R3")
	}
	if got := s.Presets; !reflect.DeepEqual(got, map[string][]string{"VC1a": {"TC1"}, "VC1b": {"TC2"}}) {
		t.Errorf("presets %v, want TC1 on VC1a and TC2 on VC1b", got)
	}
	strap := map[string]map[string]render.Tie{"V1": {"g3": render.TieCathode}}
	for _, v := range []render.View{render.Full, render.Faded} {
		if s := r.Sheet(v); !reflect.DeepEqual(s.Ties, strap) || len(s.Presets) > 0 {
			t.Errorf("%v view: ties %v presets %v, want %v and none", v, s.Ties, s.Presets, strap)
		}
	}
}

// On the full and faded sheets every valve's grids the netlist wires to
// its own cathode are drawn as the internal strap (as a lead, the grid's
// way to the cathode crosses the screen or anode lead): a push-pull pair's
// suppressors (review17 a04) and a triode-heptode's outer grid (review19
// b05's heptode's g5, on the cathode it shares with its triode, and its IF
// and output pentodes' suppressors); no other electrode is tied.
func TestCathodeGridsStrapped(t *testing.T) {
	strap := map[string]render.Tie{"g3": render.TieCathode}
	cases := []struct {
		file string
		want map[string]map[string]render.Tie
	}{
		{"review17/a04.toml", map[string]map[string]render.Tie{"V3": strap, "V4": strap}},
		{"review19/b05.toml", map[string]map[string]render.Tie{"V1a": {"g5": render.TieCathode}, "V2": strap, "V4": strap}},
	}
	for _, tc := range cases {
		r, err := stagesRun(filepath.Join("..", "..", "..", "testdata", tc.file))
		if err != nil {
			t.Fatal(err)
		}
		for _, v := range []render.View{render.Full, render.Faded} {
			if got := r.Sheet(v).Ties; !reflect.DeepEqual(got, tc.want) {
				t.Errorf("%s %v view: ties %v, want %v", tc.file, v, got, tc.want)
			}
		}
	}
}
