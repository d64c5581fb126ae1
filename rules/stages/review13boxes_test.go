package stages

import (
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
)

// The blind review 13 wrote five circuits of its own, kept under
// testdata/review13/ at the repository's top with the reviewer's ngspice
// decks in testdata/review13/spice/.

func reduceReview13(t *testing.T, name string) []Stage {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", "review13", name))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return findReduced(t, c)
}

// holding is the top-level stage (no dot in its name) that holds ref.
func holding(st []Stage, ref string) *Stage {
	for i := range st {
		if !strings.Contains(st[i].Name, ".") && slices.Contains(st[i].Parts, ref) {
			return &st[i]
		}
	}
	return nil
}

// A coupling capacitor couples signal between two stages, a DC block
// (common practice, any valve or transistor handbook's RC coupling): a
// capacitor with a resistor straight across it bypasses that resistor (a04
// C2 across the upper part of a split cathode resistor), and one whose end
// a capacitor thousands of times larger holds at AC ground is a bypass (a03
// C14, C15: 100 pF IF bypasses into a cathode a 25 µF capacitor holds). No
// coupling pattern takes either, whatever resistance lies beyond.
func TestReview13BypassIsNoCoupling(t *testing.T) {
	cases := []struct{ file, ref string }{
		{"a03.toml", "C14"},
		{"a03.toml", "C15"},
		{"a04.toml", "C2"},
	}
	found := map[string][]Stage{}
	for _, tc := range cases {
		t.Run(tc.file+"/"+tc.ref, func(t *testing.T) {
			st, ok := found[tc.file]
			if !ok {
				st = reduceReview13(t, tc.file)
				found[tc.file] = st
			}
			for _, s := range st {
				if slices.Contains(s.Parts, tc.ref) && (s.Topology == "coupling-capacitor" || s.Topology == "rc-coupling") {
					t.Errorf("%s is called a coupling: %s %s %v", tc.ref, s.Name, s.Title, s.Parts)
				}
			}
		})
	}
}

// A valve no pattern recognises gets a stage of its own titled by the
// device, and the parts that serve a valve are held by its stage: loads,
// cathode resistors and bypasses, the split cathode resistor's foot (a04),
// the splitter's anode load (a04), grid stoppers nested in the output
// stage they stop (a04). A
// box titled by a passive pattern held the detector and the audio triode
// (a03) and the driver and the splitter (a04) before.
func TestReview13DevicesKeepTheirParts(t *testing.T) {
	cases := []struct {
		file, dev, title string
		with             []string
	}{
		// the triode of the double-diode-triode, named for its work since
		// its cathode, the diodes' return, is recognised as bypassed
		{"a03.toml", "V2b", "Audio amplifier: common-cathode amplifier, cathode bypassed, a detector diode returned to it (valve)", []string{"R10", "R11", "C17"}},
		// the driver takes the feedback at the foot of its cathode lead
		// (amp-common-feedback-foot), confirmed by the loop lowering its gain
		{"a04.toml", "V1a", "Common-cathode amplifier, overall negative feedback into its cathode (valve)", []string{"R2", "R3", "R4", "C2"}},
		// the splitter is named for its work (TestReview13Cathodyne)
		{"a04.toml", "V1b", "Cathodyne phase splitter (valve)", []string{"R6", "R7"}},
		{"a04.toml", "V2", "Push-pull output stage (valve)", []string{"R11", "R12"}},
	}
	found := map[string][]Stage{}
	for _, tc := range cases {
		t.Run(tc.file+"/"+tc.dev, func(t *testing.T) {
			st, ok := found[tc.file]
			if !ok {
				st = reduceReview13(t, tc.file)
				found[tc.file] = st
			}
			s := holding(st, tc.dev)
			if s == nil {
				t.Fatalf("no stage holds %s: %s", tc.dev, topologies(st))
			}
			if s.Title != tc.title {
				t.Errorf("%s's stage %s titled %q, want %q", tc.dev, s.Name, s.Title, tc.title)
			}
			for _, ref := range tc.with {
				if !slices.Contains(s.Parts, ref) {
					t.Errorf("%s's stage %s %v lacks %s: %s", tc.dev, s.Name, s.Parts, ref, topologies(st))
				}
			}
		})
	}
}
