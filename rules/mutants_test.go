package rules

import (
	"math/rand"
	"os"
	"strings"
	"testing"

	"pare/graph"
)

// Mutated fixtures (lines dropped, duplicated, ground moved to a signal
// net), whatever still loads, reduce soundly at every level: no internal
// error, invariants kept, the result loads back and is a fixpoint. A fixed
// seed keeps the test repeatable; FuzzReduce explores further.
func TestMutantsReduceSoundly(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	files := fixtures(t)
	loaded := 0
	for iter := 0; iter < 600; iter++ {
		data, err := os.ReadFile(files[rng.Intn(len(files))])
		if err != nil {
			t.Fatal(err)
		}
		lines := strings.Split(string(data), "\n")
		for k := 0; k < 1+rng.Intn(4) && len(lines) > 1; k++ {
			i, j := rng.Intn(len(lines)), rng.Intn(len(lines))
			switch rng.Intn(3) {
			case 0:
				lines = append(lines[:i], lines[i+1:]...)
			case 1:
				lines[i] = lines[j]
			case 2:
				lines[i] = strings.Replace(lines[i], "gnd", "k1", 1)
			}
		}
		src := strings.Join(lines, "\n")
		c, err := graph.Parse("mutant.toml", []byte(src))
		if err != nil {
			continue
		}
		loaded++
		for _, lvl := range levels {
			r, _, err := Reduce(c, Options{Level: lvl})
			if err != nil {
				if strings.Contains(err.Error(), "internal error") {
					t.Fatalf("%s: %v\n%s", lvl, err, src)
				}
				continue
			}
			if err := invariants(r); err != nil {
				t.Fatalf("%s: %v\n%s", lvl, err, src)
			}
			back, err := graph.Parse("back.toml", []byte(written(t, r)))
			if err != nil {
				t.Fatalf("%s: the result does not load: %v\n%s", lvl, err, src)
			}
			if _, again, err := Reduce(back, Options{Level: lvl}); err == nil && again.Applied() != 0 {
				t.Fatalf("%s: not a fixpoint:\n%s\n%s", lvl, src, logText(again))
			}
		}
	}
	if loaded < 100 {
		t.Fatalf("only %d mutants loaded: the test is not testing much", loaded)
	}
}
