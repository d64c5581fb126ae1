package dc

import (
	"testing"

	"pare/graph"
	"pare/internal/testmain"
)

// TestMain runs the tests under the command's collector setting
// (internal/testmain).
func TestMain(m *testing.M) { testmain.Main(m) }

// chartFile loads a netlist, solves its operating point and charts it
// with the ideal meter: the scaffold of the tests that read one fixture.
func chartFile(t *testing.T, path string) (*Point, *Chart) {
	t.Helper()
	c, err := graph.LoadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return chartCircuit(t, c)
}

// chartCircuit solves c's operating point and charts it with the ideal
// meter.
func chartCircuit(t *testing.T, c *graph.Circuit) (*Point, *Chart) {
	t.Helper()
	pt, err := Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	ch, err := pt.Chart(Meter{})
	if err != nil {
		t.Fatal(err)
	}
	return pt, ch
}
