package pipeline

import (
	"path/filepath"
	"reflect"
	"testing"

	"pare/graph"
)

// TestCircuitOnlySameCircuit: on every example and fixture, the circuit and
// the caution a CircuitOnly run leaves after the bias phase are those of a
// full one (every part's figures, those the operating point fills
// included), so pare sweep and pare spice print what they printed when
// the check ran and the operating point was always solved. Some circuits
// have figures filled at the bias, some skip the solve.
func TestCircuitOnlySameCircuit(t *testing.T) {
	var paths []string
	for _, pat := range []string{"../../../examples/*.toml", "../../../testdata/good/*.toml", "../../../testdata/osc/*.toml", "../../../testdata/review13/*.toml", "../../../testdata/warn/*.toml", "../../../testdata/fuzz/netlists/*.toml", "../../../graph/ac/testdata/*.toml"} {
		m, _ := filepath.Glob(pat)
		paths = append(paths, m...)
	}
	skipped, filled := 0, 0
	for _, path := range paths {
		full, err := Run(Options{Path: path, Until: PhaseBias})
		if err != nil {
			continue
		}
		only, err := Run(Options{Path: path, Until: PhaseBias, CircuitOnly: true})
		if err != nil {
			t.Errorf("%s: %v", path, err)
			continue
		}
		if d := graph.Differences(full.Circuit, only.Circuit); len(d) > 0 {
			t.Errorf("%s: circuits differ: %v", path, d)
		}
		if !reflect.DeepEqual(full.Caution, only.Caution) || !reflect.DeepEqual(full.Biased, only.Biased) {
			t.Errorf("%s: caution or filled figures differ", path)
		}
		if only.DC == nil {
			skipped++
		}
		if len(only.Biased) > 0 {
			filled++
		}
	}
	if skipped == 0 || filled == 0 {
		t.Errorf("%d runs without the operating point, %d with figures filled: want some of each", skipped, filled)
	}
}
