package render

import (
	"bytes"
	"strings"
	"testing"

	"pare/graph"
	"pare/render/geom"
)

// railsSheet is a stage whose HT (with a hostile label) and negative bias
// rail a reduction has tied to AC ground (invented values).
const railsSheet = `title = "rails"
band = "20..20k"
inputs = ["in"]
outputs = ["a"]

[nets]
ht = { role = "supply", volts = 250, label = "<HT> & \"live\" \u202e" }
vb = { role = "bias", volts = -6 }

[parts]
C1 = { c = "22n", pins = ["in", "g"] }
R1 = { r = "1M", pins = ["g", "vb"] }
R2 = { r = "100k", pins = ["ht", "a"] }
R3 = { r = "1k5", pins = ["k", "gnd"] }
V1 = { valve = "triode", mu = 100, ra = "62k5", pins = { a = "a", g1 = "g", k = "k" } }
`

// TestRailTags: a pin the reduction moved from a rail onto ground is drawn
// with a tag naming the rail and its declared voltage, never with the earth
// symbol; true ground keeps the earth symbol; the rail's text reaches the
// SVG escaped, in both symbol styles (docs/netlist.md, "Nets"; common
// practice: rails are labelled tags, chassis the earth symbol).
func TestRailTags(t *testing.T) {
	c, err := graph.Parse("rails.toml", []byte(railsSheet))
	if err != nil {
		t.Fatal(err)
	}
	c.JoinNets(c.GroundNet(), "ht") // what the rail-ground rule does
	c.JoinNets(c.GroundNet(), "vb")
	want := map[string]struct {
		kind geom.LocalKind
		text string // a part of the tag's text; the voltage as declared
	}{
		"R2.1": {geom.LocalRail, "(+250 V)"},
		"R1.2": {geom.LocalRail, "−6 V"}, // U+2212, the typeset minus
		"R3.2": {geom.LocalGround, ""},
	}
	for _, st := range []Style{IEC, IEEE} {
		s := &Sheet{Circuit: c, View: Reduced}
		g, err := Config{Style: st}.Geometry(s)
		if err != nil {
			t.Fatal(err)
		}
		seen := 0
		for _, l := range g.Locals {
			w, ok := want[l.Owner+"."+l.Pin]
			if !ok {
				continue
			}
			seen++
			if l.Kind != w.kind || !strings.Contains(l.Text, w.text) {
				t.Errorf("%s: %s.%s drawn as kind %d %q, want kind %d with %q", st, l.Owner, l.Pin, l.Kind, l.Text, w.kind, w.text)
			}
		}
		if seen != len(want) {
			t.Errorf("%s: %d of the %d local symbols drawn", st, seen, len(want))
		}
		var b bytes.Buffer
		if err := (Config{Style: st}).Fprint(&b, s); err != nil {
			t.Fatal(err)
		}
		svg := b.String()
		if strings.Contains(svg, "<HT>") || strings.Contains(svg, "\u202e") || !strings.Contains(svg, "&lt;HT&gt; &amp;") {
			t.Errorf("%s: the rail's label is not escaped in the SVG", st)
		}
	}
}
