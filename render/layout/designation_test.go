package layout

import (
	"testing"

	"pare/graph"
)

// A device's label beside its ref is the type it is marked with when the
// netlist gives one (invented designation), else its kind.
func TestDeviceLabel(t *testing.T) {
	cases := []struct {
		p    graph.Part
		want string
	}{
		{graph.Part{Ref: "V1", Kind: graph.Valve, Type: "pentode", Designation: "XV12"}, "V1 XV12"},
		{graph.Part{Ref: "V2", Kind: graph.Valve, Type: "pentode"}, "V2 pentode"},
		{graph.Part{Ref: "Q1", Kind: graph.BJT, Type: "npn", Designation: "ZT 9"}, "Q1 ZT 9"},
	}
	for _, tc := range cases {
		if got := labelLines(&tc.p, Options{}); len(got) == 0 || got[0] != tc.want {
			t.Errorf("%s: label %q, want %q", tc.p.Ref, got, tc.want)
		}
	}
}
