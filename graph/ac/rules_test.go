package ac_test

import (
	"path/filepath"
	"sort"
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
		t.Skip("no examples yet")
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
