package layout

import (
	"path/filepath"
	"testing"

	"pare/internal/synth"
)

// TestLeastBoundsHeld: the box LeastBounds finds from the placement alone
// lies inside the laid-out sheet's Bounds (routing, grown frames and the
// figures at the pins only add to a sheet), on every example, a channel
// of a synthetic bank and its copy with DC figures at some pins (which
// take a label's DC line away); with the untangle search there is no
// such box.
func TestLeastBoundsHeld(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out every example")
	}
	files, _ := filepath.Glob("../../examples/*.toml")
	if len(files) == 0 {
		t.Fatal("no examples")
	}
	one, err := synth.Load(synth.Superhet)
	if err != nil {
		t.Fatal(err)
	}
	volts := map[string]map[string]string{}
	for _, p := range one.Parts {
		if len(p.Pins) > 2 {
			volts[p.Ref] = map[string]string{p.Pins[0].Name: "229", p.Pins[1].Name: "-1.5"}
		}
	}
	cases := []struct {
		name string
		path string
		o    Options
	}{{name: "superhet channel", o: Options{Links: true}},
		{name: "superhet channel with DC figures", o: Options{Links: true, PinVolts: volts}}}
	for _, f := range files {
		cases = append(cases, struct {
			name string
			path string
			o    Options
		}{f, f, Options{Links: true}})
	}
	for _, tc := range cases {
		c := one
		if tc.path != "" {
			c = loadFixture(t, tc.path)
		}
		least, ok := LeastBounds(c, tc.o)
		if !ok {
			t.Fatalf("%s: no box without the untangle search", tc.name)
		}
		r, err := Layout(c, tc.o)
		if err != nil {
			t.Fatal(err)
		}
		if b := r.Geom.Bounds; b.Union(least) != b {
			t.Errorf("%s: placement %v reaches past the laid-out sheet %v", tc.name, least, b)
		}
		if _, ok := LeastBounds(c, Options{Untangle: true}); ok {
			t.Errorf("%s: a box with the untangle search, which may take another placement", tc.name)
		}
	}
}
