package rules

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"pare/graph"
)

// FuzzReduce: whatever loads must reduce without an internal error, at every
// level, to a circuit that keeps the invariants and loads back (or to the
// clear "nothing is left" message). Seeds are the examples and fixtures.
func FuzzReduce(f *testing.F) {
	for _, pat := range []string{"../examples/*.toml", "testdata/*.toml"} {
		files, _ := filepath.Glob(pat)
		for _, p := range files {
			if data, err := os.ReadFile(p); err == nil {
				f.Add(data)
			}
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		start := time.Now()
		c, err := graph.Parse("fuzz.toml", data)
		if d := time.Since(start); d > 2*time.Second {
			t.Logf("graph.Parse took %v", d) // the loader's business, reported to its owner
		}
		if err != nil {
			return
		}
		for _, lvl := range levels {
			done := make(chan struct{})
			go func() {
				select {
				case <-done:
				case <-time.After(5 * time.Second):
					panic(fmt.Sprintf("Reduce at %s takes over 5 s on:\n%s", lvl, data))
				}
			}()
			r, _, err := Reduce(c, Options{Level: lvl})
			close(done)
			if err != nil {
				var list graph.ErrorList
				if !errors.As(err, &list) || strings.Contains(err.Error(), "internal error") {
					t.Fatalf("%s: %v", lvl, err)
				}
				continue
			}
			if err := invariants(r); err != nil {
				t.Fatalf("%s: %v", lvl, err)
			}
			if _, err := graph.Parse("back.toml", []byte(written(t, r))); err != nil {
				t.Fatalf("%s: reduced netlist does not load: %v\n%s", lvl, err, written(t, r))
			}
		}
	})
}
