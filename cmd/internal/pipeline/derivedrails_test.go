package pipeline

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/render"
	"pare/rules"
)

// TestSmoothedLineIsASupply: review 20's a05 (an AC/DC set) leaves its
// smoothed HT2 undeclared: fed from the reservoir HT1 through R21 and held
// by C27 (50 µF). It was taken for a signal net: C27 in the first audio
// stage, R21 merged with five decouplers into "339R", HT2 drawn as wires to
// off-row connectors. A line fed from a supply and held by its own
// capacitor is a supply (common practice): the reduction grounds it by a
// proven step, no signal stage holds its parts, no merged part takes its
// feed, and the full sheet draws it as a rail named after its feed. The
// variant is the same set drawn another way: the line smoothed by a choke
// and named otherwise.
func TestSmoothedLineIsASupply(t *testing.T) {
	path := filepath.Join("..", "..", "..", "testdata", "review20", "a05.toml")
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	choke := strings.ReplaceAll(string(b), `"ht2"`, `"bplus"`)
	choke = strings.Replace(choke, `R21 = { r = "1k2", pins = ["ht1", "bplus"], watts = 2, note = "smoothing resistor" }`,
		`L1 = { l = "10", rdc = "250", pins = ["ht1", "bplus"], note = "smoothing choke" }`, 1)
	choke = strings.Replace(choke, `"R21", "C27"`, `"L1", "C27"`, 1)
	if choke == string(b) || !strings.Contains(choke, "L1 = ") {
		t.Fatal("the variant did not take")
	}
	for _, tc := range []struct{ name, src, line, feed string }{
		{"a05", string(b), "ht2", "R21"},
		{"choke-fed variant", choke, "bplus", "L1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			file := filepath.Join(dir, "set.toml")
			if err := os.WriteFile(file, []byte(tc.src), 0o644); err != nil {
				t.Fatal(err)
			}
			res, err := Run(Options{Path: file, Until: PhaseStages, Level: rules.LevelSignal})
			if err != nil {
				t.Fatal(err)
			}
			fired := false
			for _, st := range res.Log.Steps {
				if st.Rule == SupplyLineRule && st.Refused == "" && slices.Contains(st.Grounded, tc.line) && slices.Contains(st.Refs, "C27") {
					fired = true
				}
			}
			if !fired {
				t.Errorf("no proven supply-line step grounds %s through C27", tc.line)
			}
			for _, s := range res.Stages {
				if !s.Supply && (slices.Contains(s.Parts, "C27") || slices.Contains(s.Parts, tc.feed)) {
					t.Errorf("signal stage %q holds the smoothing parts: %v", s.Title, s.Parts)
				}
			}
			for _, p := range res.Reduced.Parts {
				if o := p.Origins(); len(o) > 1 && slices.Contains(o, tc.feed) {
					t.Errorf("%s merges the line's feed %s with %v", p.Ref, tc.feed, o)
				}
			}
			c := res.Sheet(render.Faded).Circuit
			n := c.Net(tc.line)
			if n == nil || n.Role != graph.Supply || !strings.Contains(n.Label, "via "+tc.feed) {
				t.Errorf("the faded sheet's %s: %+v, want a supply rail named via %s", tc.line, n, tc.feed)
			}
		})
	}
}
