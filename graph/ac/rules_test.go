package ac_test

import (
	"path/filepath"
	"sort"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/rules"
)

func init() {
	ac.SetReducer(func(c *graph.Circuit) (*graph.Circuit, error) {
		red, _, err := rules.Reduce(c, rules.Options{})
		return red, err
	})
}

func examples(t *testing.T) []string {
	files, _ := filepath.Glob("../../examples/*.toml")
	sort.Strings(files)
	if len(files) == 0 {
		t.Fatal("no examples found under ../../examples")
	}
	return files
}

// Every example's default reduction keeps the signal behaviour within the
// default tolerance (0.5 dB, 5°).
func TestExampleReductionsVerify(t *testing.T) {
	for _, f := range examples(t) {
		t.Run(filepath.Base(f), func(t *testing.T) {
			c, err := graph.LoadFile(f)
			if err != nil {
				t.Fatal(err)
			}
			for _, lvl := range []rules.Level{rules.LevelTidy, rules.LevelSignal} {
				red, _, err := rules.Reduce(c, rules.Options{Level: lvl})
				if err != nil {
					t.Fatal(err)
				}
				rep, err := ac.Compare(c, red, ac.CompareOptions{})
				if err != nil {
					t.Fatal(err)
				}
				for _, p := range rep.Pairs {
					t.Logf("%s: %s", lvl, p)
				}
				if !rep.OK {
					w, _ := rep.Worst()
					t.Errorf("level %s: reduction does not verify: %s", lvl, w)
				}
			}
		})
	}
}

// dropPart is a deliberately wrong rule: it removes a capacitor that is
// neither a bypass nor a DC-only part, cutting or detuning the signal path.
func dropPart(ref string) rules.Rule {
	return rules.Rule{
		Name:    "drop-" + ref,
		Purpose: "test only: removes " + ref + " as if it did nothing",
		Level:   rules.LevelTidy,
		Kinds:   []graph.Kind{graph.Capacitor},
		Match: func(x *rules.Ctx, a rules.Anchor) *rules.Plan {
			for _, o := range a.Part.Origins() {
				if o == ref {
					return &rules.Plan{Parts: []*graph.Part{a.Part}, Why: ref + " is not needed (wrong on purpose)"}
				}
			}
			return nil
		},
		Apply: func(x *rules.Ctx, m *rules.Plan) rules.Step {
			p := m.Parts[0]
			x.Remove(p)
			return rules.Step{Removed: p.Origins()}
		},
	}
}

// A wrong step is caught and blamed on itself when the engine checks every
// step with CompareOptions.Check, and the reduction without it verifies.
func TestWrongStepIsRefused(t *testing.T) {
	c, err := graph.LoadFile("../../examples/if-detector-audio.toml")
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct{ ref, what string }{
		{"C10", "audio coupling capacitor into the preamplifier grid"},
		{"C12", "IF transformer secondary tuning capacitor"},
	}
	for _, tc := range cases {
		t.Run(tc.ref, func(t *testing.T) {
			table := append(rules.Table(), dropPart(tc.ref))
			// Unchecked, the wrong rule fires and the result fails verification.
			bad, _, err := rules.Reduce(c, rules.Options{Rules: table})
			if err != nil {
				t.Fatal(err)
			}
			if bad.Part(tc.ref) != nil {
				t.Fatalf("test premise: the wrong rule did not remove %s", tc.ref)
			}
			rep, err := ac.Compare(c, bad, ac.CompareOptions{})
			if err != nil {
				t.Fatal(err)
			}
			if rep.OK {
				t.Fatalf("removing the %s (%s) passed verification", tc.ref, tc.what)
			}
			// Checked, the engine refuses exactly that step.
			cmp := ac.CompareOptions{}
			red, log, err := rules.Reduce(c, rules.Options{Rules: table,
				Check: func(before, after *graph.Circuit, _ *rules.Step) error { return cmp.Check(before, after) }})
			if err != nil {
				t.Fatal(err)
			}
			var refused []rules.Step
			for _, s := range log.Steps {
				if s.Refused != "" {
					refused = append(refused, s)
				}
			}
			if len(refused) != 1 || refused[0].Rule != "drop-"+tc.ref || !strings.Contains(refused[0].Refused, "dB") {
				t.Fatalf("refused steps %+v, want exactly the drop-%s step, with its deviation", refused, tc.ref)
			}
			if red.Part(tc.ref) == nil {
				t.Errorf("%s was removed although its step was refused", tc.ref)
			}
			t.Logf("refused: %s", refused[0].Refused)
			rep, err = ac.Compare(c, red, ac.CompareOptions{})
			if err != nil {
				t.Fatal(err)
			}
			if !rep.OK {
				w, _ := rep.Worst()
				t.Errorf("the checked reduction does not verify: %s", w)
			}
		})
	}
}
