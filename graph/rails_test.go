package graph

import (
	"strings"
	"testing"
)

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
R9 = { r = "1k", pins = ["d", "e"] }
C4 = { c = "10u", pins = ["b", "e"] }
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
		// its rail without the rail's voltage (its own is lower by R5's
		// drop, which only the DC solution knows) and the part it comes
		// through, so the tag does not claim to be HT itself
		{"a decoupled line", [][2]string{{"mark", "d"}, {"gnd", "d"}}, [2]string{"R6", "1"}, "d", 0, "HT via R5"},
		// t is a divider's tap (R7 from HT, R8 to chassis): a bias point
		{"a divider's tap", [][2]string{{"mark", "t"}, {"gnd", "t"}}, [2]string{"C3", "1"}, "", 0, ""},
		// e is fed from the decoupled line d through R9: the chain from HT
		{"a line fed from a decoupled line", [][2]string{{"mark", "d"}, {"gnd", "d"}, {"mark", "e"}, {"gnd", "e"}}, [2]string{"C4", "2"}, "e", 0, "HT via R5, R9"},
		{"a decoupled line after HT went", [][2]string{{"gnd", "ht"}, {"mark", "d"}, {"gnd", "d"}}, [2]string{"R6", "1"}, "d", 0, "HT via R5"},
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
		{"LT 6.3 V~", "LT"},
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
	if n := c.Net("d"); n.Fed != "ht" || n.Label != "HT via R5" || n.Volts != 0 || n.Role != Supply {
		t.Errorf("d: fed %q label %q volts %g role %s, want fed ht, label HT via R5, no voltage, supply", n.Fed, n.Label, n.Volts, n.Role)
	}
}

// biasLineNetlist: a transistor IF stage's base fed through its input
// winding from a line that a resistor feeds from the decoupled supply and
// another from the detector (a simple AGC), the line bypassed to chassis;
// and a collector line fed the same way (invented values).
const biasLineNetlist = `title = "bias line"
band = "440k..470k"
inputs = ["in"]
outputs = ["c"]

[nets]
vcc = { role = "supply", volts = 6, label = "battery 6 V" }
vb = { role = "bias", volts = -2 }

[parts]
T1 = { windings = { p = "400u", s = "10u" }, k = 0.15, pins = { p1 = "in", p2 = "gnd", s1 = "b", s2 = "agc" } }
Q1 = { bjt = "npn", pins = { b = "b", c = "c", e = "gnd" } }
R1 = { r = "68k", pins = ["vcc", "agc"] }
R2 = { r = "4k7", pins = ["agc", "det"] }
C1 = { c = "47n", pins = ["agc", "gnd"] }
D1 = { diode = "signal", pins = ["det", "c"] }
R3 = { r = "1k", pins = ["vcc", "cd"] }
R4 = { r = "2k2", pins = ["cd", "c"] }
C2 = { c = "47n", pins = ["cd", "gnd"] }
R5 = { r = "1M", pins = ["vb", "gb"] }
R6 = { r = "10k", pins = ["gb", "in"] }
C3 = { c = "47n", pins = ["gb", "gnd"] }
`

// A line whose DC paths reach only control electrodes (a base through its
// winding), or that a bias rail feeds, sets a bias: it is a bias line, not
// a supply line, and its tag must not name the battery it is fed from
// (a blind review's IF strip tagged its AGC line "battery … +0.72 V").
// Fed through R2 from the detector D1's load, agc is the AGC line and is
// tagged so (graph.Circuit.AGCFeed), though R1 brings a standing bias from
// the battery.
// A line that feeds a collector through its load stays a supply line.
func TestMarkDecoupledBiasLine(t *testing.T) {
	for _, tc := range []struct {
		net, label string
		role       Role
	}{
		{"agc", "AGC line", Bias},
		{"cd", "battery via R3", Supply},
		{"gb", "−2 V via R5", Bias}, // a rail known only by its voltage is named by it
	} {
		c, err := Parse("bias.toml", []byte(biasLineNetlist))
		if err != nil {
			t.Fatal(err)
		}
		if !c.MarkDecoupled(tc.net) {
			t.Errorf("%s not marked", tc.net)
			continue
		}
		if n := c.Net(tc.net); n.Role != tc.role || n.Label != tc.label {
			t.Errorf("%s: role %s label %q, want %s %q", tc.net, n.Role, n.Label, tc.role, tc.label)
		}
	}
}

// A decoupled line is named for the rail that feeds it without the rail
// label's bracketed remarks: a line fed through a resistor from "HT1 +265 V
// (reservoir)" is no reservoir (a blind review's output stage), and "-6 V
// battery (neg. earth drawn positive)" made a 50-character tag beside every
// winding end of another review circuit's IF stage.
func TestDecoupledTagDropsRemarks(t *testing.T) {
	for _, tc := range []struct{ label, want string }{
		{"HT1 +265 V (reservoir)", "HT1 via R5"},
		{"-6 V battery (neg. earth drawn positive)", "battery via R5"},
		{"HT (main (smoothed)) +250 V", "HT via R5"},
		{"HT +250 V", "HT via R5"},
		{"(reservoir)", "(reservoir) via R5"},
	} {
		const ht = `label = "HT +250 V"`
		if !strings.Contains(railsNetlist, ht) {
			t.Fatal("rails netlist has no HT label to replace")
		}
		src := strings.Replace(railsNetlist, ht, `label = "`+tc.label+`"`, 1)
		c, err := Parse("rails.toml", []byte(src))
		if err != nil {
			t.Fatal(err)
		}
		if !c.MarkDecoupled("d") {
			t.Fatalf("%q: d not marked", tc.label)
		}
		if got := c.Net("d").Label; got != tc.want {
			t.Errorf("rail %q: line tagged %q, want %q", tc.label, got, tc.want)
		}
	}
}

// A decoupled line's tag keeps what its rail's label means: the voltage
// goes only where other words name the rail. A blind reviewer read "line
// via R4" on a sheet whose rail was labelled "+9 V line" (review18 b05).
// The labels are the kinds service sheets print (common practice).
func TestDecoupledTagKeepsRailMeaning(t *testing.T) {
	for _, tc := range []struct{ label, want string }{
		{"+9 V line", "+9 V line via R5"},
		{"HT +300 V", "HT via R5"},
		{"ht", "ht via R5"},
		{"+12V", "+12V via R5"},
		{"LT 6.3 V~", "LT via R5"},
		{"supply", "supply via R5"},
		{"+12 V supply rail", "+12 V supply rail via R5"},
		{"−6 V bias", "bias via R5"},
		{"+24 V DC", "+24 V DC via R5"},
	} {
		if got := decoupledTag(t, tc.label); got != tc.want {
			t.Errorf("rail %q: line tagged %q, want %q", tc.label, got, tc.want)
		}
	}
}

// decoupledTag is the tag MarkDecoupled gives the rails netlist's line d
// when its HT rail is labelled label.
func decoupledTag(t *testing.T, label string) string {
	t.Helper()
	const ht = `label = "HT +250 V"`
	if !strings.Contains(railsNetlist, ht) {
		t.Fatal("rails netlist has no HT label to replace")
	}
	c, err := Parse("rails.toml", []byte(strings.Replace(railsNetlist, ht, `label = "`+label+`"`, 1)))
	if err != nil {
		t.Fatal(err)
	}
	if !c.MarkDecoupled("d") {
		t.Fatalf("%q: d not marked", label)
	}
	return c.Net("d").Label
}

// FeedName: a line is named after the rail feeding it without the rail's
// voltage and remarks; a rail known only by its voltage keeps that, its
// remark dropped (a blind reviewer's "+9 V (stabilised)" fed lines tagged
// "(stabilised) via R14").
func TestFeedName(t *testing.T) {
	for _, tc := range []struct {
		net  Net
		want string
	}{
		{Net{Name: "ht", Label: "HT +250 V (reservoir)", Volts: 250}, "HT"},
		{Net{Name: "vcc", Label: "+9 V (stabilised)", Volts: 9}, "+9 V"},
		{Net{Name: "vcc", Label: "+9 V", Volts: 9}, "+9 V"},
		{Net{Name: "vcc", Volts: -6}, "−6 V"},
		{Net{Name: "batt", Label: "battery (neg. earth)"}, "battery"},
		{Net{Name: "x", Label: "(spare)"}, "(spare)"},
		{Net{Name: "l2", Label: "+12 V via R10", Fed: "vcc"}, "+12 V via R10"},
	} {
		if got := FeedName(&tc.net); got != tc.want {
			t.Errorf("%q: %q, want %q", tc.net.Label, got, tc.want)
		}
	}
}
