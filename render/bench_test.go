package render

import (
	"fmt"
	"io"
	"testing"

	"pare/graph"
	"pare/graph/value"
	"pare/render/check"
)

// stageChain builds a chain of RC-coupled common-cathode triode stages
// (coupling C, grid leak, valve, cathode R and bypass C, anode load to HT):
// six parts a stage, as a long audio or IF strip would be, for the layout's
// scaling benchmarks.
func stageChain(parts int) *graph.Circuit {
	c := &graph.Circuit{Title: fmt.Sprintf("chain of %d parts", parts), Inputs: []string{"in"}}
	c.EnsureNet("gnd", graph.Pos{})
	ht := c.EnsureNet("ht", graph.Pos{})
	ht.Role, ht.Volts, ht.Label = graph.Supply, 250, "HT +250 V"
	prev := "in"
	for i := 1; len(c.Parts)+6 <= parts; i++ {
		g, k, a := fmt.Sprintf("g%d", i), fmt.Sprintf("k%d", i), fmt.Sprintf("a%d", i)
		two := func(ref string, kind graph.Kind, v float64, n1, n2 string) {
			c.AddPart(&graph.Part{Ref: ref, Kind: kind, Value: rangeOf(v), Pins: []graph.Pin{{Name: "1", Net: n1}, {Name: "2", Net: n2}}})
		}
		two(fmt.Sprintf("C%da", i), graph.Capacitor, 10e-9, prev, g)
		two(fmt.Sprintf("R%dg", i), graph.Resistor, 1e6, g, "gnd")
		c.AddPart(&graph.Part{Ref: fmt.Sprintf("V%d", i), Kind: graph.Valve, Type: "triode",
			Pins: []graph.Pin{{Name: "a", Net: a}, {Name: "g1", Net: g}, {Name: "k", Net: k}}})
		two(fmt.Sprintf("R%dk", i), graph.Resistor, 1.5e3, k, "gnd")
		two(fmt.Sprintf("C%dk", i), graph.Capacitor, 25e-6, k, "gnd")
		two(fmt.Sprintf("R%da", i), graph.Resistor, 100e3, "ht", a)
		prev = a
	}
	c.Outputs = []string{prev}
	return c
}

func benchDraw(b *testing.B, parts int) {
	c := stageChain(parts)
	s := &Sheet{Circuit: c, View: Full}
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if err := (Config{}).Fprint(io.Discard, s); err != nil {
			b.Fatal(err)
		}
	}
}

// go test -bench Draw ./render: the layout should grow about as N log N.
func BenchmarkDraw500(b *testing.B)  { benchDraw(b, 500) }
func BenchmarkDraw1000(b *testing.B) { benchDraw(b, 1000) }
func BenchmarkDraw2000(b *testing.B) { benchDraw(b, 2000) }
func BenchmarkDraw4000(b *testing.B) { benchDraw(b, 4000) }

// The big chain must still draw cleanly, not just fast.
func TestStageChainIsClean(t *testing.T) {
	if testing.Short() {
		t.Skip("long")
	}
	g, err := Config{}.Geometry(&Sheet{Circuit: stageChain(600), View: Full})
	if err != nil {
		t.Fatal(err)
	}
	r := check.Measure(g)
	t.Logf("600-part chain: %s", r.Summary())
	for _, p := range r.Problems() {
		t.Error(p)
	}
}

func rangeOf(v float64) value.Range { return value.Range{Min: v, Max: v} }
