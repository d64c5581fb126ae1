package pipeline

import (
	"strings"
	"testing"

	"pare/rules"
)

// TestUnsolvedDCWarned: review19 a05's first capture put the 47 Ω surge
// resistor between the bridge and the reservoir as a part of its own; the
// DC chart refuses that at the transformer's line, but the main job went
// on without a word. The run's warnings now carry the same message at the
// same place, and say what rests on it.
func TestUnsolvedDCWarned(t *testing.T) {
	r, err := Run(Options{Path: "../../../testdata/review19/a05-surge.toml", Until: PhaseBias, Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	if r.DCErr == nil {
		t.Fatal("the surge-resistor capture solved; the test needs a capture the DC model refuses")
	}
	for _, w := range r.Warnings {
		if strings.Contains(w.Msg, "no DC operating point") && strings.Contains(w.Msg, "R1 between the rectifier and the reservoir") && w.Pos.Line == 29 {
			return
		}
	}
	t.Errorf("no warning at line 29 for the unsolved DC point: %v", r.Warnings)
}
