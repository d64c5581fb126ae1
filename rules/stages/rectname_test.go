package stages

import (
	"strings"
	"testing"
)

// A rectifier is named from what it is: two diodes on a centre-tapped
// winding are two parts (review22 a04 D1 and D2), four diodes a bridge
// (review13 a05), a half-wave valve straight off the mains one anode
// (review22 a05 V5). The near miss: a double-diode-triode's detector
// diodes (review13 a03) are no rectifier stage at all.
func TestRectifierNamedFromItsParts(t *testing.T) {
	cases := []struct {
		dir, file string
		note      string // a supply note that must be there
		stage     string // a topology that must be found ("" none asked)
		parts     string
	}{
		{"review22", "a04.toml", "full-wave rectifier D1 and D2 (two diodes on the winding's ends)", "rectifier-full-wave", ""},
		{"review13", "a05.toml", "bridge rectifier D1, D2, D3 and D4,", "rectifier-bridge", ""},
		{"review22", "a05.toml", "half-wave rectifier V5 (one anode path", "", ""},
	}
	for _, tc := range cases {
		st := findReduced(t, reviewCircuit(t, tc.dir, tc.file))
		if notes := strings.Join(supplyNotes(st), "\n"); !strings.Contains(notes, tc.note) {
			t.Errorf("%s/%s: no note %q in\n%s", tc.dir, tc.file, tc.note, notes)
		}
		if tc.stage == "" {
			continue
		}
		s := stageOf(st, tc.stage)
		if s == nil {
			t.Errorf("%s/%s: no %s stage", tc.dir, tc.file, tc.stage)
			continue
		}
		if tc.parts != "" && strings.Join(s.Parts, " ") != tc.parts {
			t.Errorf("%s/%s: %s holds %v, want %s", tc.dir, tc.file, tc.stage, s.Parts, tc.parts)
		}
	}
	for _, s := range findReduced(t, reviewCircuit(t, "review13", "a03.toml")) {
		if strings.HasPrefix(s.Topology, "rectifier-") {
			t.Errorf("review13 a03: detector diodes taken for a rectifier: %s %v", s.Topology, s.Parts)
		}
	}
}
