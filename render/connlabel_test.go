package render

import (
	"fmt"
	"strings"
	"testing"

	"pare/graph"
	"pare/render/check"
)

// numberedChain is chainSheet(stages) with every signal net renamed to a
// bare number, as a capture tool writes them ("n1", "n2", ...).
func numberedChain(stages int) *Sheet {
	s := chainSheet(stages)
	c := &graph.Circuit{Title: s.Circuit.Title}
	c.EnsureNet("gnd", graph.Pos{})
	ht := c.EnsureNet("ht", graph.Pos{})
	ht.Role, ht.Volts, ht.Label = graph.Supply, 250, "HT +250 V"
	names := map[string]string{"gnd": "gnd", "ht": "ht"}
	rename := func(n string) string {
		if _, ok := names[n]; !ok {
			names[n] = fmt.Sprintf("n%d", len(names)-1)
		}
		return names[n]
	}
	for _, n := range s.Circuit.Inputs {
		c.Inputs = append(c.Inputs, rename(n))
	}
	for _, p := range s.Circuit.Parts {
		q := *p
		q.Pins = append([]graph.Pin{}, p.Pins...)
		for i := range q.Pins {
			q.Pins[i].Net = rename(q.Pins[i].Net)
		}
		c.AddPart(&q)
	}
	for _, n := range s.Circuit.Outputs {
		c.Outputs = append(c.Outputs, rename(n))
	}
	s.Circuit = c
	return s
}

// TestConnectorsNameWhatTheReaderFinds: an off-row connector on a net the
// netlist only numbered ("n7") says instead where the net starts, the
// stage and the terminal (IEC 81346 writes a terminal "-T1:s1"), and both
// its ends say the same; a named net keeps its name (the chain's "a1").
// A number tells a technician nothing to look for on the other row (the
// blind review of issue 12: a winding alone behind four connectors named
// by such nets).
func TestConnectorsNameWhatTheReaderFinds(t *testing.T) {
	a4, _ := ParsePaper("A4")
	for _, tc := range []struct {
		name  string
		sheet *Sheet
		want  func(label string) bool
	}{
		{"numbered", numberedChain(3), func(l string) bool {
			var st, v int
			n, _ := fmt.Sscanf(l, "S%d V%d:a", &st, &v)
			return n == 2 && st == v && l == fmt.Sprintf("S%d V%d:a", st, v)
		}},
		{"named", chainSheet(3), func(l string) bool { return strings.HasPrefix(l, "a") && !numbered.MatchString(l) }},
	} {
		cfg := Config{Page: a4}
		f, ends, _, err := cfg.flowRows(tc.sheet)
		if err != nil {
			t.Fatal(err)
		}
		if len(ends) < 2 {
			t.Fatalf("%s: three stages on A4 in %d row(s)", tc.name, len(ends))
		}
		label := map[string]string{}
		for i := range ends {
			for _, k := range f.sheet(start(ends, i), ends[i], false).continues {
				if !tc.want(k.Label) {
					t.Errorf("%s row %d: connector of %s says %q", tc.name, i+1, k.Net, k.Label)
				}
				if l, ok := label[k.Net]; ok && l != k.Label {
					t.Errorf("%s: the ends of %s say %q and %q", tc.name, k.Net, l, k.Label)
				}
				label[k.Net] = k.Label
			}
		}
		if len(label) == 0 {
			t.Errorf("%s: no off-row connector", tc.name)
		}
	}
}

// TestLineFedOnIsNotLedAcrossARow: a line every stage takes (an AGC line)
// leaves the row it starts on by one outgoing connector and enters each
// later row by an incoming one with the same label; a row it only passes
// through does not lead it on from its left edge to its right (the review
// of issue 12: off-row leads looping over a whole row). The connectors
// still pair up across the pages.
func TestLineFedOnIsNotLedAcrossARow(t *testing.T) {
	s := chainSheet(3)
	c := &graph.Circuit{Title: s.Circuit.Title, Inputs: s.Circuit.Inputs, Outputs: s.Circuit.Outputs}
	c.EnsureNet("gnd", graph.Pos{})
	ht := c.EnsureNet("ht", graph.Pos{})
	ht.Role, ht.Volts, ht.Label = graph.Supply, 250, "HT +250 V"
	for _, p := range s.Circuit.Parts {
		c.AddPart(p)
	}
	for i := range s.Frames {
		ref := fmt.Sprintf("R%dx", i+1)
		c.AddPart(&graph.Part{Ref: ref, Kind: graph.Resistor, Value: rangeOf(1e6),
			Pins: []graph.Pin{{Name: "1", Net: fmt.Sprintf("g%d", i+1)}, {Name: "2", Net: "agc"}}})
		s.Frames[i].Parts = append(s.Frames[i].Parts, ref)
	}
	s.Circuit = c
	a4, _ := ParsePaper("A4")
	cfg := Config{Page: a4}
	f, ends, laid, err := cfg.flowRows(s)
	if err != nil {
		t.Fatal(err)
	}
	if len(ends) < 3 {
		t.Fatalf("three stages on A4 in %d row(s), want one a row", len(ends))
	}
	outs := 0
	for i := range ends {
		in := map[string]bool{}
		for _, k := range f.sheet(start(ends, i), ends[i], false).continues {
			if k.In {
				in[k.Net] = true
			}
		}
		for _, k := range f.sheet(start(ends, i), ends[i], false).continues {
			if !k.In && in[k.Net] && len(laid[i].Geom.Failed) == 0 {
				t.Errorf("row %d: %s comes in and goes on", i+1, k.Net)
			}
			if !k.In && k.Net == "agc" {
				outs++
			}
		}
	}
	if outs != 1 {
		t.Errorf("agc leaves %d rows, want the one it starts on", outs)
	}
	gs, err := cfg.Geometries(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range check.Connectors(gs) {
		t.Error(p)
	}
}
