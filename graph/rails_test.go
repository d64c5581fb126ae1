package graph

import "testing"

// railsNetlist has a main HT rail, a decoupled B+ line declared as a rail of
// its own, a negative bias rail and a signal net (invented values).
const railsNetlist = `title = "rails"
band = "20..20k"
inputs = ["in"]
outputs = ["a"]

[nets]
ht = { role = "supply", volts = 250, label = "HT +250 V" }
b2 = { role = "supply", volts = 200, label = "B+ 2 (decoupled)" }
vb = { role = "bias", volts = -6 }

[parts]
C1 = { c = "22n", pins = ["in", "a"] }
R1 = { r = "100k", pins = ["a", "ht"] }
R2 = { r = "10k", pins = ["b2", "ht"] }
R3 = { r = "1M", pins = ["in", "vb"] }
R4 = { r = "1k", pins = ["a", "x"] }
C2 = { c = "10u", pins = ["x", "gnd"] }
R5 = { r = "2k2", pins = ["ht", "d"] }
R6 = { r = "100k", pins = ["d", "a"] }
R7 = { r = "47k", pins = ["ht", "t"] }
R8 = { r = "10k", pins = ["t", "gnd"] }
C3 = { c = "10u", pins = ["t", "b"] }
`

// TestJoinRemembersRails: a terminal moved off a rail by a join keeps the
// first rail it returned to, with the rail's volts and label, through later
// joins and a Clone; a terminal that never sat on a rail has none. A
// drawing relies on it to label a return to HT as HT, not chassis
// (docs/netlist.md, "Nets": supply and bias nets are rails).
func TestJoinRemembersRails(t *testing.T) {
	tests := []struct {
		name  string
		joins [][2]string // keep, gone, in order; keep "mark": MarkDecoupled(gone)
		pin   [2]string   // part, pin name
		rail  string      // want Pin.Rail
		volts float64     // want the volts ReturnOf gives
		label string      // want the label ReturnOf gives
	}{
		{"HT to ground", [][2]string{{"gnd", "ht"}}, [2]string{"R1", "2"}, "ht", 250, "HT +250 V"},
		{"bias to ground", [][2]string{{"gnd", "vb"}}, [2]string{"R3", "2"}, "vb", -6, ""},
		{"B+ 2 into HT, then HT to ground", [][2]string{{"ht", "b2"}, {"gnd", "ht"}}, [2]string{"R2", "1"}, "b2", 200, "B+ 2 (decoupled)"},
		{"HT side of the same part", [][2]string{{"ht", "b2"}, {"gnd", "ht"}}, [2]string{"R2", "2"}, "ht", 250, "HT +250 V"},
		{"a bypassed signal net", [][2]string{{"mark", "x"}, {"gnd", "x"}}, [2]string{"R4", "2"}, "", 0, ""},
		// d is fed from HT by R5 and bypassed: a decoupled line, named after
		// its rail without the rail's voltage: its own is lower by R5's
		// drop, which only the DC solution knows
		{"a decoupled line", [][2]string{{"mark", "d"}, {"gnd", "d"}}, [2]string{"R6", "1"}, "d", 0, "HT"},
		// t is a divider's tap (R7 from HT, R8 to chassis): a bias point
		{"a divider's tap", [][2]string{{"mark", "t"}, {"gnd", "t"}}, [2]string{"C3", "1"}, "", 0, ""},
		{"a decoupled line after HT went", [][2]string{{"gnd", "ht"}, {"mark", "d"}, {"gnd", "d"}}, [2]string{"R6", "1"}, "d", 0, "HT"},
	}
	for _, tc := range tests {
		c, err := Parse("rails.toml", []byte(railsNetlist))
		if err != nil {
			t.Fatal(err)
		}
		for _, j := range tc.joins {
			if j[0] == "mark" {
				c.MarkDecoupled(j[1])
				continue
			}
			c.JoinNets(j[0], j[1])
		}
		c = c.Clone()
		pn := c.Part(tc.pin[0]).Pin(tc.pin[1])
		if pn.Rail != tc.rail {
			t.Errorf("%s: %s.%s returns to %q, want %q", tc.name, tc.pin[0], tc.pin[1], pn.Rail, tc.rail)
			continue
		}
		n := c.ReturnOf(*pn)
		if n == nil || n.Volts != tc.volts || (tc.rail != "" && n.Label != tc.label) {
			t.Errorf("%s: ReturnOf gives %+v, want a net at %g V labelled %q", tc.name, n, tc.volts, tc.label)
		}
		if g := c.Net("gnd"); g.Role != Ground || g.Label != "" || g.Volts != 0 {
			t.Errorf("%s: ground took a rail's role, label or volts: %+v", tc.name, *g)
		}
	}
	c, _ := Parse("rails.toml", []byte(railsNetlist))
	c.JoinNets("ht", "b2")
	c.JoinNets("gnd", "ht")
	if len(c.Rails) != 2 || c.Rails[0].Name != "b2" || c.Rails[1].Name != "ht" || c.Rails[1].Label != "HT +250 V" {
		t.Errorf("Rails = %+v, want b2 and ht, sorted, with their labels", c.Rails)
	}
}

// A decoupled line is named after the rail that feeds it without that
// rail's voltage, whether the voltage is declared or only written in the
// label; a label with no voltage is left whole.
func TestWithoutVolts(t *testing.T) {
	for _, tc := range []struct{ in, want string }{
		{"HT +250 V", "HT"},
		{"B+ 2 (decoupled)", "B+ 2 (decoupled)"},
		{"+9 V", ""},
		{"−6V bias", "bias"},
		{"HT 250 V line", "HT line"},
	} {
		if got := WithoutVolts(tc.in); got != tc.want {
			t.Errorf("WithoutVolts(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}

// MarkDecoupled records the rail that feeds the line, so the sheet can tag
// it with its own solved voltage.
func TestMarkDecoupledRecordsFeed(t *testing.T) {
	c, err := Parse("rails.toml", []byte(railsNetlist))
	if err != nil {
		t.Fatal(err)
	}
	if !c.MarkDecoupled("d") {
		t.Fatal("d not marked")
	}
	if n := c.Net("d"); n.Fed != "ht" || n.Label != "HT" || n.Volts != 0 {
		t.Errorf("d: fed %q label %q volts %g, want fed ht, label HT, no voltage", n.Fed, n.Label, n.Volts)
	}
}
