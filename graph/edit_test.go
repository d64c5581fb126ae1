package graph

import (
	"fmt"
	"math/rand"
	"path/filepath"
	"reflect"
	"sort"
	"testing"
)

// indexAgrees checks the circuit's kept index against one built from
// scratch, and the invariants the edits promise: Parts and Nets sorted,
// every pin's net exists.
func indexAgrees(t *testing.T, c *Circuit, what string) {
	t.Helper()
	fresh := NewIndex(c.Parts, c.Nets)
	kept := c.Index()
	if !reflect.DeepEqual(fresh.parts, kept.parts) || !reflect.DeepEqual(fresh.nets, kept.nets) {
		t.Fatalf("%s: part or net lookup differs from a fresh index", what)
	}
	if len(fresh.conns) != len(kept.conns) {
		t.Fatalf("%s: %d nets with terminals, a fresh index has %d", what, len(kept.conns), len(fresh.conns))
	}
	for n, want := range fresh.conns {
		// through Conns: a long list is kept in any order until read
		if got := kept.Conns(n); !reflect.DeepEqual(got, want) {
			t.Fatalf("%s: terminals on %s %v, a fresh index has %v", what, n, connNames(got), connNames(want))
		}
	}
	for k := range fresh.kinds {
		if got, want := kept.OfKind(k), fresh.OfKind(k); !reflect.DeepEqual(got, want) {
			t.Fatalf("%s: %d parts of kind %s, a fresh index has %d", what, len(got), k, len(want))
		}
	}
	for k := range kept.kinds {
		if got, want := kept.OfKind(k), fresh.OfKind(k); len(got) != len(want) {
			t.Fatalf("%s: %d parts of kind %s, a fresh index has %d", what, len(got), k, len(want))
		}
	}
	if !sort.SliceIsSorted(c.Parts, func(i, j int) bool { return c.Parts[i].Ref < c.Parts[j].Ref }) {
		t.Fatalf("%s: parts out of order", what)
	}
	if !sort.SliceIsSorted(c.Nets, func(i, j int) bool { return c.Nets[i].Name < c.Nets[j].Name }) {
		t.Fatalf("%s: nets out of order", what)
	}
	for _, p := range c.Parts {
		for _, pin := range p.Pins {
			if c.Net(pin.Net) == nil {
				t.Fatalf("%s: %s.%s is on %s, which is no net", what, p.Ref, pin.Name, pin.Net)
			}
		}
	}
}

func connNames(list []Conn) []string {
	var out []string
	for _, cn := range list {
		out = append(out, cn.Part.Ref+"."+cn.Pin)
	}
	return out
}

// TestEdits: each edit of the API on a small netlist, the state it must
// leave (read off the netlist by hand), and the index equal to a fresh one.
func TestEdits(t *testing.T) {
	cases := []struct {
		name    string
		edit    func(c *Circuit) []string // returns the nets it dropped
		dropped []string
		check   func(c *Circuit) error
	}{
		{"remove a part: its private net goes", func(c *Circuit) []string { d, _ := c.RemovePart("R2"); return d }, []string{"ht"},
			func(c *Circuit) error { return wantNets(c, "gnd", "x", "y") }},
		{"remove a part on ends only: ends stay", func(c *Circuit) []string { d, _ := c.RemovePart("R1"); return d }, nil,
			func(c *Circuit) error { return wantNets(c, "gnd", "ht", "x", "y") }},
		{"drop the last pin on a net", func(c *Circuit) []string { return c.DropPin("R2", "2") }, []string{"ht"},
			func(c *Circuit) error { return wantPins(c, "R2", "1=y") }},
		{"unconnect: the pin moves to nc, ground was C1's alone", func(c *Circuit) []string { return c.Unconnect("C1", "2") }, []string{"gnd"},
			func(c *Circuit) error { return wantPins(c, "C1", "1=x", "2=nc") }},
		{"unconnect the last pin on a net", func(c *Circuit) []string { return c.Unconnect("R2", "2") }, []string{"ht"},
			func(c *Circuit) error { return wantNets(c, "gnd", "nc", "x", "y") }},
		{"unconnect an unknown part: nothing", func(c *Circuit) []string { return c.Unconnect("Z9", "1") }, nil,
			func(c *Circuit) error { return wantNets(c, "gnd", "ht", "x", "y") }},
		{"add a part on a new net", func(c *Circuit) []string {
			c.AddPart(&Part{Ref: "A1", Kind: Resistor, Pins: []Pin{{Name: "1", Net: "new"}, {Name: "2", Net: "x"}}})
			return nil
		}, nil, func(c *Circuit) error { return wantNets(c, "gnd", "ht", "new", "x", "y") }},
		{"join y into ht: supply wins, the output follows", func(c *Circuit) []string { c.JoinNets("ht", "y"); return nil }, nil,
			func(c *Circuit) error {
				if n := c.Net("ht"); n.Role != Supply || c.Outputs[0] != "ht" {
					return fmt.Errorf("ht %+v, outputs %v", n, c.Outputs)
				}
				return wantPins(c, "R1", "1=x", "2=ht")
			}},
		{"join x into y: one output, no duplicate", func(c *Circuit) []string { c.JoinNets("y", "x"); return nil }, nil,
			func(c *Circuit) error {
				if !reflect.DeepEqual(c.Inputs, []string{"y"}) || !reflect.DeepEqual(c.Region("audio").Nets, []string{"y"}) {
					return fmt.Errorf("inputs %v, region nets %v", c.Inputs, c.Region("audio").Nets)
				}
				return nil
			}},
		{"ground an unknown net: gnd found", func(c *Circuit) []string { c.JoinNets(c.GroundNet(), "ht"); return nil }, nil,
			func(c *Circuit) error { return wantPins(c, "R2", "1=y", "2=gnd") }},
	}
	for _, tc := range cases {
		c := parseOK(t, joinSrc)
		c.Index() // built before the edit, so the edit must keep it current
		dropped := tc.edit(c)
		if !reflect.DeepEqual(dropped, tc.dropped) {
			t.Errorf("%s: dropped %v, want %v", tc.name, dropped, tc.dropped)
		}
		if err := tc.check(c); err != nil {
			t.Errorf("%s: %v", tc.name, err)
		}
		indexAgrees(t, c, tc.name)
	}
}

func wantNets(c *Circuit, names ...string) error {
	var got []string
	for _, n := range c.Nets {
		got = append(got, n.Name)
	}
	if !reflect.DeepEqual(got, names) {
		return fmt.Errorf("nets %v, want %v", got, names)
	}
	return nil
}

func wantPins(c *Circuit, ref string, pins ...string) error {
	var got []string
	for _, pin := range c.Part(ref).Pins {
		got = append(got, pin.Name+"="+pin.Net)
	}
	if !reflect.DeepEqual(got, pins) {
		return fmt.Errorf("%s pins %v, want %v", ref, got, pins)
	}
	return nil
}

// TestChooseKeep: ground first, then a declared end, a label, the stronger
// role, the smaller name (the order a technician keeps names in when
// redrawing: common practice).
func TestChooseKeep(t *testing.T) {
	cases := []struct{ a, b, keep string }{
		{"x", "gnd", "gnd"}, {"gnd", "x", "gnd"},
		{"ht", "y", "y"}, // y is an output: an end beats a rail
		{"ht", "zz", "ht"},
		{"zz", "zy", "zy"},
	}
	c := parseOK(t, joinSrc)
	for _, tc := range cases {
		if keep, _ := c.ChooseKeep(tc.a, tc.b); keep != tc.keep {
			t.Errorf("ChooseKeep(%s, %s) keeps %s, want %s", tc.a, tc.b, keep, tc.keep)
		}
	}
}

// TestRandomEditsKeepIndex: random sequences of every edit on every
// example keep the index equal to a from-scratch rebuild after each step
// (a property test; the seed is fixed so a failure reproduces).
func TestRandomEditsKeepIndex(t *testing.T) {
	rng := rand.New(rand.NewSource(1))
	for _, path := range exampleFiles(t) {
		for run := 0; run < 20; run++ {
			c := mustLoad(t, path)
			for step := 0; step < 40 && len(c.Parts) > 0; step++ {
				what := randomEdit(rng, c)
				indexAgrees(t, c, fmt.Sprintf("%s run %d step %d (%s)", filepath.Base(path), run, step, what))
			}
		}
	}
}

func randomEdit(rng *rand.Rand, c *Circuit) string {
	p := c.Parts[rng.Intn(len(c.Parts))]
	net := func() string { return c.Nets[rng.Intn(len(c.Nets))].Name }
	switch rng.Intn(6) {
	case 0:
		c.RemovePart(p.Ref)
		return "remove " + p.Ref
	case 1:
		q := p.Clone()
		q.Ref = p.Ref + "x"
		if c.Part(q.Ref) != nil || len(q.Pins) == 0 {
			return "nothing"
		}
		q.Pins[0].Net = net()
		c.AddPart(q)
		return "add " + q.Ref
	case 2:
		if len(p.Pins) == 0 {
			return "nothing"
		}
		pin := p.Pins[rng.Intn(len(p.Pins))].Name
		c.DropPin(p.Ref, pin)
		return "drop " + p.Ref + "." + pin
	case 3:
		if len(p.Pins) == 0 {
			return "nothing"
		}
		pin := p.Pins[rng.Intn(len(p.Pins))].Name
		c.Unconnect(p.Ref, pin)
		return "unconnect " + p.Ref + "." + pin
	case 4:
		a, b := net(), net()
		keep, gone := c.ChooseKeep(a, b)
		c.JoinNets(keep, gone)
		return "join " + keep + " <- " + gone
	}
	g := net()
	c.JoinNets(c.GroundNet(), g)
	return "ground " + g
}
