package stages

import (
	"os"
	"regexp"
	"slices"
	"strings"
	"testing"

	"pare/graph"
)

// TestMainsTransformerNotTuned: a mains transformer is never a tuned stage
// (common practice: it works at the mains frequency; the capacitors across
// its windings are suppression and buffer capacitors). Found with no DC
// point, as when the DC model refuses a capture (the HT rail is then not
// AC ground and the transformer stays on the reduced circuit), review19
// a05's T1 was named "Double-tuned transformer", 562.7 and 807.4 Hz.
// Cases: a05 and its first capture (surge resistor), and that capture with
// its reservoir out (refused by the DC model); T1 declares vac and hz, its
// region is the 50..300 Hz supply and it feeds the bridge, and each of
// these alone makes it a mains transformer. Near miss: the IF transformers
// of the examples stay double-tuned (TestExamplesFindTuned).
func TestMainsTransformerNotTuned(t *testing.T) {
	b, err := os.ReadFile("../../testdata/review19/a05-surge.toml")
	if err != nil {
		t.Fatal(err)
	}
	noRes := regexp.MustCompile(`(?m)^C2 = .*$`).ReplaceAllString(string(b), "# C2 out")
	noRes = strings.Replace(noRes, `"C2", `, "", 1)
	t1 := regexp.MustCompile(`(?m)^T1 = .*$`)
	only := func(text, keep string) string {
		line := t1.FindString(text)
		for _, drop := range []string{`, vac = "250"`, `, hz = "50"`} {
			if drop != keep {
				line = strings.Replace(line, drop, "", 1)
			}
		}
		return t1.ReplaceAllLiteralString(text, line)
	}
	a05, err := os.ReadFile("../../testdata/review19/a05.toml")
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct{ name, text string }{
		{"a05", string(a05)},
		{"a05 first capture", string(b)},
		{"a05 first capture, no reservoir", noRes},
		{"no reservoir, hz only", only(noRes, `, hz = "50"`)},
		{"no reservoir, vac only", only(noRes, `, vac = "250"`)},
		{"no reservoir, neither: the region and the bridge", only(noRes, "")},
	} {
		t.Run(tc.name, func(t *testing.T) {
			c, err := graph.Parse(tc.name+".toml", []byte(tc.text))
			if err != nil {
				t.Fatal(err)
			}
			for _, st := range findReduced(t, c) {
				if st.group == "tuned" && slices.Contains(st.Parts, "T1") {
					t.Errorf("%s %q (%s) holds the mains transformer T1", st.Name, st.Title, st.Topology)
				}
			}
		})
	}
}
