package render

import (
	"testing"

	"pare/graph"
)

// strandSheet is an amplifier stage (A: R5 from the decoupled line to
// the anode, V2), a rectifier stage (B: T1, V1 onto the reservoir line)
// and a smoothing stage (C: L1, C2 onto the smoothed line), with the
// anode decoupler unframed: C3 on the decoupled line, R2 from the smoothed
// line to it, a chassis-only heater bypass C9 (wired to no stage), a
// loudspeaker LS1 on the anode (no supply part) and a port. The stretches stand in the order the whole sheet's placement gave
// review15 a05's faded view: the decoupler's two parts either side of the
// rectifier.
func strandSheet() (*Sheet, []block) {
	c := &graph.Circuit{Title: "strand"}
	c.EnsureNet("gnd", graph.Pos{})
	add := func(ref string, k graph.Kind, nets ...string) {
		p := &graph.Part{Ref: ref, Kind: k}
		for i, n := range nets {
			p.Pins = append(p.Pins, graph.Pin{Name: string(rune('1' + i)), Net: n})
		}
		c.AddPart(p)
	}
	add("P1", graph.Port, "in")
	add("V2", graph.Resistor, "in", "anode")
	add("R5", graph.Resistor, "anode", "ht_dec")
	add("C3", graph.Capacitor, "ht_dec", "gnd")
	add("T1", graph.Resistor, "mains", "sec")
	add("V1", graph.Resistor, "sec", "ht_res")
	add("R2", graph.Resistor, "ht", "ht_dec")
	add("L1", graph.Resistor, "ht_res", "ht")
	add("C2", graph.Capacitor, "ht", "gnd")
	add("C9", graph.Capacitor, "gnd", "gnd")
	add("LS1", graph.Resistor, "anode", "gnd")
	s := &Sheet{Circuit: c, View: Faded, Frames: []Frame{
		{Title: "A", Parts: []string{"V2", "R5"}},
		{Title: "B", Parts: []string{"T1", "V1"}, Supply: true},
		{Title: "C", Parts: []string{"L1", "C2"}, Supply: true},
	}}
	bs := []block{{refs: []string{"P1"}, port: true}, {refs: []string{"V2", "R5"}}, {refs: []string{"C3"}},
		{refs: []string{"T1", "V1"}}, {refs: []string{"R2"}}, {refs: []string{"L1", "C2"}}, {refs: []string{"C9"}}, {refs: []string{"LS1"}}}
	return s, bs
}

// TestStrandedRows: a row that holds an unframed part with none of the
// stages it is wired to strands it (the decoupler on the rectifier's row);
// one holding one of them, or a part wired to no stage (a chassis-only
// bypass) or no supply line (a loudspeaker off a stage), does not. The stretches are 0 port, 1 A, 2 C3, 3 B, 4 R2, 5 C,
// 6 C9, 7 LS1; every expected answer follows from the wiring above, by hand.
func TestStrandedRows(t *testing.T) {
	s, bs := strandSheet()
	f := newFlow(Config{}, s, bs, nil)
	cases := []struct {
		a, b int
		want bool
		why  string
	}{
		{0, 3, false, "C3 with the amplifier it decouples"},
		{2, 4, true, "C3 on the rectifier's row"},
		{3, 5, true, "R2 on the rectifier's row"},
		{2, 5, true, "C3 and R2 together on the rectifier's row, neither stage they join there"},
		{4, 6, false, "R2 with the smoothing filter that feeds it"},
		{3, 4, false, "the rectifier alone"},
		{6, 7, false, "a part wired to no stage"},
		{6, 8, false, "a loudspeaker away from its stage: no supply part"},
		{0, 8, false, "every stretch on one row"},
	}
	for _, tc := range cases {
		if got := f.strands(tc.a, tc.b); got != tc.want {
			t.Errorf("row [%d, %d) (%s): strands %v, want %v", tc.a, tc.b, tc.why, got, tc.want)
		}
	}
	if !f.stranded([]int{3, 5, 8}) || f.stranded([]int{3, 4, 8}) {
		t.Errorf("rows [0,3) [3,5) [5,8) strand R2 and rows [0,3) [3,4) [4,8) strand nothing: got %v and %v",
			f.stranded([]int{3, 5, 8}), f.stranded([]int{3, 4, 8}))
	}
}
