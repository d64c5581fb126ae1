package stages

import (
	"errors"
	"os"
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/internal/fuzzgen"
	"pare/rules"
)

// FuzzMatcher loads a user pattern from arbitrary text and runs it on a
// generated circuit. A refused pattern must come with positioned messages;
// an accepted one must find stages or stop at the search limits (steps,
// matches held), never panic or fail otherwise. Seeds: every built-in
// pattern with a few circuits; regressions under testdata/fuzz/FuzzMatcher.
func FuzzMatcher(f *testing.F) {
	files, _ := filepath.Glob("patterns/*.toml")
	for i, p := range files {
		if data, err := os.ReadFile(p); err == nil {
			f.Add(data, []byte{byte(i), 4, 1, 2, 3, 5, 6, 7, 8, 9, 0, 1, 2, 3, 4, 5, 6, 7})
		}
	}
	f.Fuzz(func(t *testing.T, pat, gen []byte) {
		p, err := ParsePattern("user.toml", pat)
		if err != nil {
			var l graph.ErrorList
			if !errors.As(err, &l) || len(l) == 0 {
				t.Fatalf("refusal is not a positioned list: %v", err)
			}
			for _, e := range l {
				if !e.Pos.IsValid() {
					t.Fatalf("message without a position: %v", e)
				}
			}
			return
		}
		c, err := graph.Parse("gen.toml", []byte(fuzzgen.Netlist(gen)))
		if err != nil {
			return
		}
		reduced, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
		if err != nil {
			return
		}
		lib := &Library{Patterns: []*Pattern{p}}
		_, err = Find(reduced, Options{Library: lib, Full: c, ACGround: log.ACGround, Limit: 1_000_000})
		if err != nil && !errors.Is(err, ErrSearchLimit) {
			t.Fatalf("%v", err)
		}
	})
}
