package pipeline

import (
	"encoding/json"
	"errors"
	"testing"

	"pare/graph"
	"pare/internal/synth"
	"pare/rules"
)

// The step proof reads its groups from the step's journal (localJournal);
// it must cut exactly the sub-circuits localPair cuts from the two whole
// circuits, flags and all, on every step of every example, the test
// fixtures, two copies of the portable front end, and a small synthetic
// bank, with every fourth step refused (so that steps start from a circuit
// a refusal put back).
func TestLocalJournalIsLocalPair(t *testing.T) {
	paths := stepProofSets(t, true)
	if !testing.Short() {
		bank, err := synth.Bank(200, 1)
		if err != nil {
			t.Fatal(err)
		}
		paths = append(paths, writeTemp(t, "bank.toml", string(bank)))
	}
	for _, p := range paths {
		c, err := graph.LoadFile(p)
		if err != nil {
			t.Fatalf("%s: %v", p, err)
		}
		for _, lvl := range []rules.Level{rules.LevelSignal, rules.LevelIdeal} {
			n := 0
			check := func(j *graph.Journal, st *rules.Step) error {
				n++
				wb, wa, wWhole, wNone := localPair(j.Before(), j.Circuit())
				gb, ga, gWhole, gNone := localJournal(j)
				if gWhole != wWhole || gNone != wNone {
					t.Fatalf("%s %v step %d (%s): whole %v none %v, localPair says %v %v", p, lvl, n, st.Rule, gWhole, gNone, wWhole, wNone)
				}
				for _, pair := range [][2]*graph.Circuit{{gb, wb}, {ga, wa}} {
					if g, w := cutText(t, pair[0]), cutText(t, pair[1]); g != w {
						t.Fatalf("%s %v step %d (%s): the journal's cut differs from localPair's\n got %s\nwant %s", p, lvl, n, st.Rule, g, w)
					}
				}
				if n%4 == 0 {
					return errors.New("refused for the test")
				}
				return nil
			}
			if _, _, err := rules.Reduce(c, rules.Options{Level: lvl, CheckStep: check}); err != nil {
				t.Fatalf("%s: %v", p, err)
			}
		}
	}
}

// cutText is a sub-circuit as text: its parts, nets, regions, ends and
// named frequencies (the crystals' marks among them).
func cutText(t *testing.T, c *graph.Circuit) string {
	t.Helper()
	if c == nil {
		return "nil"
	}
	b, err := json.Marshal(struct {
		C *graph.Circuit
		F map[string]float64
		D map[string]float64
	}{c, c.Freqs, c.DetectorLoads})
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}
