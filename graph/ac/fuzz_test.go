package ac

import (
	"math"
	"math/cmplx"
	"os"
	"path/filepath"
	"testing"

	"pare/graph"
)

// FuzzSolve: any netlist the loader accepts is solved, compared with itself
// and written as a deck without a panic, and a solution is finite or an error.
func FuzzSolve(f *testing.F) {
	files, _ := filepath.Glob("testdata/*.toml")
	ex, _ := filepath.Glob("../../examples/*.toml")
	for _, p := range append(files, ex...) {
		if data, err := os.ReadFile(p); err == nil {
			f.Add(data)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		c, err := graph.Parse("fuzz.toml", data)
		if err != nil || len(c.Parts) > 200 {
			return
		}
		freqs := []float64{1, 1e3, 1e6}
		// Every net, not just the first: a NaN that only one node's
		// drive brings out must be caught too.
		for _, n := range c.Nets {
			z, err := Impedance(c, n.Name, freqs, Options{})
			if err != nil {
				continue
			}
			for _, v := range z {
				if cmplx.IsNaN(v) || math.IsNaN(real(v)) {
					t.Fatalf("NaN impedance at %s with no error", n.Name)
				}
			}
		}
		if len(c.Inputs) > 0 && len(c.Outputs) > 0 {
			h, err := Transfer(c, c.Inputs[0], c.Outputs[0], freqs, Options{})
			if err == nil {
				for _, v := range h {
					if cmplx.IsNaN(v) || cmplx.IsInf(v) {
						t.Fatalf("non-finite transfer with no error: %v", h)
					}
				}
			}
			var sink discard
			_ = WriteSpice(&sink, c, SpiceOptions{})
			_, _ = Compare(c, c.Clone(), CompareOptions{Points: 8})
		}
	})
}

type discard struct{}

func (discard) Write(p []byte) (int, error) { return len(p), nil }
