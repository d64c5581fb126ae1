package rules

import (
	"os"
	"slices"
	"testing"

	"pare/graph"
	"pare/graph/ac"
)

// TestSupplyFeedsApart: resistors from a supply node the reduction keeps
// (a smoothed HT whose capacitor is no bypass at the band's low edge) to
// lines it grounds are separate parts on the reduced circuit, each with its
// value as written, while a bias divider's halves and an anode load's two
// halves still merge. Check values are the circuits as written (the
// netlists' own lines; review 21's a04 reviewer: "No 20k resistor exists in
// the set"), and the reduced circuit still matches the input by AC
// analysis where a linear comparison covers the whole circuit (ac.Compare's default 0.5 dB and 5°, common practice).
func TestSupplyFeedsApart(t *testing.T) {
	for _, tc := range []struct {
		name, file string
		focus      []string          // a cut, where the merge happens only on one
		prove      bool              // a whole set's proof needs the pipeline's mixer pairs: cmd/pare's main job holds it
		apart      map[string]string // ref → value as written
		merged     [][]string        // groups that still make one part
	}{
		{"bleeder and HT decoupler (review 21 a04.toml:42, :72)", "../testdata/review21/a04.toml", nil, true,
			map[string]string{"R6": "22 kΩ", "R21": "220 kΩ"}, nil},
		{"screen feeds, decouplers and bleeder on the HT (review 17 b05)", "../testdata/review17/b05.toml", nil, false,
			map[string]string{"R3": "27 kΩ", "R8": "47 kΩ", "R9": "1 kΩ", "R16": "47 kΩ", "R20": "2.2 kΩ", "R23": "220 kΩ"}, nil},
		{"a divider's tap feeding a base through a winding", "../examples/transistor-front-end.toml", []string{"Q1"}, false,
			nil, [][]string{{"R4", "R5"}}},
		{"an anode load in two halves", "", nil, true, nil, [][]string{{"R1", "R2"}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			src := splitLoad("", "")
			if tc.file != "" {
				b, err := os.ReadFile(tc.file)
				if err != nil {
					t.Fatal(err)
				}
				src = string(b)
			}
			c := parse(t, src)
			r, _ := reduceChecked(t, c, Options{Level: LevelSignal, Focus: tc.focus})
			for ref, want := range tc.apart {
				p := r.Part(ref)
				if p == nil || len(p.From) > 0 || valueText(p) != want {
					t.Errorf("%s: want a part of its own at %s, got %v", ref, want, p)
				}
			}
			for _, g := range tc.merged {
				if !mergedAs(r, g) {
					t.Errorf("%v: want one merged part", g)
				}
			}
			if !tc.prove {
				return
			}
			rep, err := ac.Compare(c, r, ac.CompareOptions{})
			if err != nil || !rep.OK {
				t.Errorf("reduced circuit does not match the input: %v %v", err, rep)
			}
		})
	}
}

// mergedAs reports whether one part of r stands for exactly refs.
func mergedAs(r *graph.Circuit, refs []string) bool {
	for _, p := range r.Parts {
		if slices.Equal(p.From, refs) {
			return true
		}
	}
	return false
}
