package check

import (
	"reflect"
	"testing"

	"pare/render/geom"
)

// TestConnectorsPaired: a net that leaves one row must come back in another
// under the same label (the pairing of continuation references is common
// practice on multi-sheet diagrams); an unpaired end is a finding.
func TestConnectorsPaired(t *testing.T) {
	sym := func(ref string) geom.Symbol { return geom.Symbol{Ref: ref} }
	cases := []struct {
		name  string
		pages [][]string
		want  []string
	}{
		{"paired on two pages", [][]string{{"R1", "@to:a"}, {"@from:a", "C1"}}, nil},
		{"through a middle row", [][]string{{"@to:a"}, {"@from:a", "@to:a"}, {"@from:a"}}, nil},
		{"outgoing alone", [][]string{{"@to:a"}, {"@from:b"}}, []string{
			"off-row connector a goes on nowhere: no incoming partner",
			"off-row connector b comes from nowhere: no outgoing partner"}},
		{"no connectors", [][]string{{"R1"}}, nil},
	}
	for _, tc := range cases {
		var pages []*geom.Sheet
		for _, refs := range tc.pages {
			g := &geom.Sheet{}
			for _, r := range refs {
				g.Symbols = append(g.Symbols, sym(r))
			}
			pages = append(pages, g)
		}
		if got := Connectors(pages); !reflect.DeepEqual(got, tc.want) {
			t.Errorf("%s: got %q, want %q", tc.name, got, tc.want)
		}
	}
}
