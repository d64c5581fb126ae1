package graph_test

import (
	"path/filepath"
	"testing"

	"pare/graph"
	"pare/internal/synth"
)

// TestRegionIndexAgrees: the region index answers RegionOf and BandOf for
// every part as Circuit.RegionOf does by walking the regions' lists (the
// definition), on every example and fixture with regions and on a bank of
// 1,000 parts, a region per valve channel's audio stage. Parts are looked
// up with an origin list too (a merged part keeps its origins' refs), and
// with only their nets (a part a region names only through a net).
func TestRegionIndexAgrees(t *testing.T) {
	files, _ := filepath.Glob("../examples/*.toml")
	more, _ := filepath.Glob("../testdata/good/*.toml")
	files = append(files, more...)
	var circuits []*graph.Circuit
	for _, f := range files {
		c, err := graph.LoadFile(f)
		if err != nil {
			t.Fatalf("%s: %v", f, err)
		}
		circuits = append(circuits, c)
	}
	bank, err := synth.BankCircuit(1000, 1)
	if err != nil {
		t.Fatal(err)
	}
	circuits = append(circuits, bank)
	withRegions := 0
	for _, c := range circuits {
		if len(c.Regions) > 0 {
			withRegions++
		}
		x := c.RegionIndex()
		for i, p := range c.Parts {
			// The part as it is, as a merge of itself and the next part,
			// and under a ref no region names (its nets decide).
			merged := *p
			merged.Ref, merged.From = "X"+p.Ref, []string{p.Ref, c.Parts[(i+1)%len(c.Parts)].Ref}
			renamed := *p
			renamed.Ref = "Y" + p.Ref
			for _, q := range []*graph.Part{p, &merged, &renamed} {
				if got, want := x.RegionOf(q), c.RegionOf(q); got != want {
					t.Fatalf("%s: part %s: index gives region %v, the lists %v", c.File, q.Ref, got, want)
				}
				if got, want := x.BandOf(q), c.BandOf(q); got != want {
					t.Fatalf("%s: part %s: index gives band %v, the lists %v", c.File, q.Ref, got, want)
				}
			}
		}
	}
	if withRegions < 2 {
		t.Fatalf("only %d circuits with regions: the test checks too little", withRegions)
	}
}
