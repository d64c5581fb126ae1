package ac

import (
	"path/filepath"
	"testing"

	"pare/graph"
)

// reduceDefault is set by the external test package (rules_test.go), which
// may import the rules engine without an import cycle: it reduces a circuit
// at the default level.
var reduceDefault func(c *graph.Circuit) (*graph.Circuit, error)

// reducedCases adds each example's default reduction to the reference decks.
func reducedCases(t testing.TB) []spiceCase {
	if reduceDefault == nil {
		return nil
	}
	var cases []spiceCase
	for _, f := range exampleFiles(t) {
		red, err := reduceDefault(load(t, f))
		if err != nil {
			t.Fatalf("%s: reduce: %v", f, err)
		}
		cases = append(cases, casesFor(filepath.Base(f)+" reduced", red)...)
	}
	return cases
}
