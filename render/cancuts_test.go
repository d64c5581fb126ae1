package render

import (
	"testing"

	"pare/graph"
)

// TestCanFeeds: an IF can's link to the stage it feeds (cancuts.go) runs
// from the can's stretch to the stretch of the grid or detector diode on
// its secondary (common practice: an IF transformer stands between the
// two stages it couples, ../shared/DRAWING-NOTES.md). The primary, driven
// from the anode, feeds nothing; a secondary's cold end returned to a
// valve's cathode (a detector returned to its audio valve's bias) takes no
// signal in; a can with no stage after it has no link.
func TestCanFeeds(t *testing.T) {
	pn := func(name, net string) graph.Pin { return graph.Pin{Name: name, Net: net} }
	ht := &graph.Net{Name: "ht", Role: graph.Supply}
	c := &graph.Circuit{Nets: []*graph.Net{ht}, Parts: []*graph.Part{
		{Ref: "V1", Kind: graph.Valve, Type: "pentode", Pins: []graph.Pin{pn("a", "pa"), pn("g1", "in"), pn("k", "gnd")}},
		{Ref: "T1", Kind: graph.Transformer, Pins: []graph.Pin{pn("p1", "pa"), pn("p2", "ht"), pn("s1", "det"), pn("s2", "ret")},
			Windings: []graph.Winding{{Name: "pri", From: "p1", To: "p2"}, {Name: "sec", From: "s1", To: "s2"}}},
		{Ref: "R1", Kind: graph.Resistor, Pins: []graph.Pin{pn("1", "ret"), pn("2", "gnd")}},
		{Ref: "D1", Kind: graph.Diode, Pins: []graph.Pin{pn("a", "det"), pn("k", "out")}},
		{Ref: "V2", Kind: graph.Valve, Type: "triode", Pins: []graph.Pin{pn("a", "ht"), pn("g1", "out"), pn("k", "ret")}},
		{Ref: "V3", Kind: graph.Valve, Type: "pentode", Pins: []graph.Pin{pn("a", "pb"), pn("g1", "in2"), pn("k", "gnd")}},
		{Ref: "T2", Kind: graph.Transformer, Pins: []graph.Pin{pn("p1", "pb"), pn("p2", "ht"), pn("s1", "x"), pn("s2", "gnd")},
			Windings: []graph.Winding{{Name: "pri", From: "p1", To: "p2"}, {Name: "sec", From: "s1", To: "s2"}}},
	}}
	c.Sort()
	bs := []block{{refs: []string{"V1", "T1"}}, {refs: []string{"R1"}}, {refs: []string{"D1"}}, {refs: []string{"V2"}}, {refs: []string{"V3", "T2"}}}
	f := newFlow(Config{}, &Sheet{Circuit: c, View: Reduced}, bs, nil)
	got := f.feeds()
	want := []loop{{lo: 0, hi: 2}} // T1's secondary to D1; V2's cathode on the cold end is no feed
	if len(got) != len(want) || len(got) > 0 && got[0] != want[0] {
		t.Errorf("feeds %v, want %v", got, want)
	}
}
