package pipeline

import (
	"path/filepath"
	"reflect"
	"testing"

	"pare/render"
)

// The frequency changer's pentode loses its screen (decoupled to chassis)
// and its suppressor (strapped to the cathode, as its note says) to the
// static-electrode rule: the reduced sheet is told to keep both grid lines,
// the screen at AC ground and the suppressor on the cathode; and the
// trimmers merged into the gang sections stay on them as alignment points
// (the netlist's own wiring: TC1 across VC1a, TC2 across VC1b). The other
// views get no ties: they draw every electrode (only a push-pull pair's
// suppressors are strapped there, TestPairSuppressorsStrapped).
func TestReducedSheetKeepsStaticGridsAndTrimmers(t *testing.T) {
	r, err := stagesRun(example("frequency-changer"))
	if err != nil {
		t.Fatal(err)
	}
	s := r.Sheet(render.Reduced)
	want := map[string]render.Tie{"g2": render.TieGround, "g3": render.TieCathode}
	if got := s.Ties["V1"]; !reflect.DeepEqual(got, want) {
		t.Errorf("V1 ties %v, want %v", got, want)
	}
	if got := s.Presets; !reflect.DeepEqual(got, map[string][]string{"VC1a": {"TC1"}, "VC1b": {"TC2"}}) {
		t.Errorf("presets %v, want TC1 on VC1a and TC2 on VC1b", got)
	}
	for _, v := range []render.View{render.Full, render.Faded} {
		if s := r.Sheet(v); len(s.Ties) > 0 || len(s.Presets) > 0 {
			t.Errorf("%v view: ties %v presets %v, want none", v, s.Ties, s.Presets)
		}
	}
}

// On the full and faded sheets a push-pull pair's pentodes, whose
// suppressors the netlist wires to their shared cathode net, are told to
// draw them as the internal strap (as a lead the suppressor's way to the
// cathode crosses the screen lead); no other electrode is tied and the
// reduced sheet's ties are the reduction's own.
func TestPairSuppressorsStrapped(t *testing.T) {
	r, err := stagesRun(filepath.Join("..", "..", "..", "testdata", "review17", "a04.toml"))
	if err != nil {
		t.Fatal(err)
	}
	strap := map[string]render.Tie{"g3": render.TieCathode}
	want := map[string]map[string]render.Tie{"V3": strap, "V4": strap}
	for _, v := range []render.View{render.Full, render.Faded} {
		if got := r.Sheet(v).Ties; !reflect.DeepEqual(got, want) {
			t.Errorf("%v view: ties %v, want %v", v, got, want)
		}
	}
}
