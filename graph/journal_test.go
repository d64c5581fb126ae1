package graph

import (
	"encoding/json"
	"fmt"
	"math/rand"
	"path/filepath"
	"testing"
)

// TestJournalUndoesRandomEdits: runs of random edits of every kind (and
// MarkDecoupled) on every example, recorded by a journal, then undone: the
// circuit must be what it was (parts, pins with their rails, nets with
// roles and labels, regions, ends, retired rails, compared as JSON), with
// the same part and net objects, and its index equal to a fresh one; and
// Before, read before the undo, must already have been that circuit.
func TestJournalUndoesRandomEdits(t *testing.T) {
	rng := rand.New(rand.NewSource(2))
	for _, path := range exampleFiles(t) {
		for run := 0; run < 20; run++ {
			c := mustLoad(t, path)
			want := circuitJSON(t, c)
			objs := map[string]*Part{}
			for _, p := range c.Parts {
				objs[p.Ref] = p
			}
			j := c.StartJournal()
			var what []string
			for step := 0; step < 1+run%8 && len(c.Parts) > 0; step++ {
				what = append(what, randomEdit(rng, c))
				if step%3 == 0 {
					n := c.Nets[rng.Intn(len(c.Nets))].Name
					if c.MarkDecoupled(n) {
						what = append(what, "decouple "+n)
					}
				}
			}
			j.Stop()
			name := fmt.Sprintf("%s run %d %v", filepath.Base(path), run, what)
			if got := circuitJSON(t, j.Before()); got != want {
				t.Fatalf("%s: Before is not the circuit before the edits:\n got %s\nwant %s", name, got, want)
			}
			j.Undo()
			if got := circuitJSON(t, c); got != want {
				t.Fatalf("%s: undone, the circuit differs:\n got %s\nwant %s", name, got, want)
			}
			for _, p := range c.Parts {
				if objs[p.Ref] != p {
					t.Fatalf("%s: undone, %s is another object", name, p.Ref)
				}
			}
			indexAgrees(t, c, name+" undone")
		}
	}
}

func circuitJSON(t *testing.T, c *Circuit) string {
	t.Helper()
	b, err := json.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}
