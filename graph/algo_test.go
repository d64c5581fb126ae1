package graph

import (
	"path/filepath"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/graph/topo"
)

// TestView: one node per part and per net, one edge per part–net pair with
// at least one terminal (gonum's simple edges: a part with two terminals on
// one net has one edge there), IDs parts first in the order given, then
// nets by name. The counts are read off the netlist by hand.
func TestView(t *testing.T) {
	c := parseOK(t, `band = "20..20k"
[parts]
R1 = { r = "1k", pins = ["a", "b"] }
R2 = { r = "1k", pins = ["b", "gnd"] }
C1 = { c = "1n", pins = ["a", "a"] }
V1 = { valve = "triode", pins = { a = "a", g1 = "b", k = "gnd", h1 = "h", h2 = "gnd" } }
`)
	v := c.View()
	// 4 parts + 4 nets (a, b, gnd, h).
	if n := v.Nodes().Len(); n != 8 {
		t.Errorf("%d nodes, want 8", n)
	}
	// R1: a b; R2: b gnd; C1: a; V1: a b gnd h: 9 part–net pairs.
	edges := 0
	for _, p := range c.Parts {
		pid, _ := v.PartNode(p)
		edges += v.From(pid).Len()
	}
	if edges != 9 {
		t.Errorf("%d edges, want 9", edges)
	}
	id, ok := v.PartNode(c.Part("C1"))
	if !ok || id != 0 || v.PartOf(id) != c.Part("C1") {
		t.Fatalf("C1 is node %d (%v), want 0 (parts in ref order first)", id, ok)
	}
	nid, ok := v.NetNode("a")
	if !ok || nid != 4 || v.NetOf(nid) != "a" || v.PartOf(nid) != nil {
		t.Fatalf("net a is node %d (%v), want 4", nid, ok)
	}
	if !v.HasEdgeBetween(id, nid) || !v.HasEdgeBetween(nid, id) || v.Edge(id, nid) == nil {
		t.Error("C1–a: no edge, or not both ways")
	}
	if h, _ := v.NetNode("h"); v.HasEdgeBetween(id, h) || v.Edge(id, h) != nil {
		t.Error("C1–h: an edge where C1 has no terminal")
	}
	// gonum's own algorithms run on it: one connected group here.
	if cc := topo.ConnectedComponents(v); len(cc) != 1 {
		t.Errorf("%d connected components, want 1", len(cc))
	}
}

const walkSrc = `band = "20..20k"
inputs = ["in"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
R1 = { r = "1k", pins = ["in", "g"] }
R2 = { r = "1M", pins = ["g", "gnd"] }
V1 = { valve = "triode", pins = { a = "an", g1 = "g", k = "gnd" } }
R3 = { r = "100k", pins = ["an", "ht"] }
C1 = { c = "10n", pins = ["an", "out"] }
R4 = { r = "470k", pins = ["out", "gnd"] }
R5 = { r = "1k", pins = ["x", "y"] }
R6 = { r = "1k", pins = ["y", "gnd"] }
`

// TestWalk: distances counted in parts passed, by hand from the netlist
// above (breadth-first distance, the textbook definition, from memory).
func TestWalk(t *testing.T) {
	notGround := func(c *Circuit) func(string) bool {
		return func(n string) bool { return !c.RoleOf(n).IsACGround() }
	}
	// A device is crossed from its control or common terminal to its output only.
	enter := func(p *Part, pin string) bool { return !p.IsActive() || RoleOfPin(p.Kind, pin) != RoleOutput }
	leave := func(p *Part, pin string) bool { return !p.IsActive() || RoleOfPin(p.Kind, pin) == RoleOutput }
	cases := []struct {
		name     string
		from     []string
		directed bool
		want     map[string]int // part ref → distance; absent = not reached
	}{
		// R2 and V1 share g with R1; R3 and C1 share an with V1; R4 is past C1.
		// Ground and HT carry nothing, so R5/R6 (on y and gnd) are not reached.
		{"from the input", []string{"in"}, false, map[string]int{"R1": 0, "R2": 1, "V1": 1, "R3": 2, "C1": 2, "R4": 3}},
		// Undirected, the anode reaches back through V1 to the grid side.
		{"from the anode", []string{"an"}, false, map[string]int{"V1": 0, "R3": 0, "C1": 0, "R1": 1, "R2": 1, "R4": 1}},
		// Directed, the walk does not enter V1 by its anode.
		{"from the anode, directed", []string{"an"}, true, map[string]int{"R3": 0, "C1": 0, "R4": 1}},
		{"from the input, directed", []string{"in"}, true, map[string]int{"R1": 0, "R2": 1, "V1": 1, "R3": 2, "C1": 2, "R4": 3}},
		// A start on ground is entered although ground is not followed.
		{"from ground", []string{"gnd"}, false, map[string]int{"R2": 0, "V1": 0, "R4": 0, "R6": 0, "R1": 1, "R3": 1, "C1": 1, "R5": 1}},
		{"from nothing known", []string{"zz"}, false, map[string]int{}},
	}
	for _, tc := range cases {
		c := parseOK(t, walkSrc)
		w := NewWalk(c.View())
		w.Follow = notGround(c)
		if tc.directed {
			w.Enter, w.Leave = enter, leave
		}
		w.FromNets(tc.from, 0)
		got := map[string]int{}
		for _, p := range c.Parts {
			if d, ok := w.PartDist(p); ok {
				got[p.Ref] = d
			}
		}
		if !reflect.DeepEqual(got, tc.want) {
			t.Errorf("%s: distances %v, want %v", tc.name, got, tc.want)
		}
	}
}

// TestWalkSkipsNC: "nc" marks terminals connected to nothing, so two
// valves whose screens the reduction moved there are not neighbours: the
// second stage is as far from the input as the signal path makes it (the
// netlist format's definition of nc; distances by hand).
func TestWalkSkipsNC(t *testing.T) {
	c := parseOK(t, `band = "20..20k"
[parts]
R1 = { r = "1k", pins = ["in", "g1"] }
V1 = { valve = "pentode", pins = { a = "a1", g1 = "g1", g2 = "nc", g3 = "gnd", k = "gnd" } }
C1 = { c = "10n", pins = ["a1", "g2"] }
R2 = { r = "1M", pins = ["g2", "x"] }
V2 = { valve = "pentode", pins = { a = "a2", g1 = "x", g2 = "nc", g3 = "gnd", k = "gnd" } }
`)
	w := NewWalk(c.View())
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	w.FromNets([]string{"in"}, 0)
	got := map[string]int{}
	for _, p := range c.Parts {
		if d, ok := w.PartDist(p); ok {
			got[p.Ref] = d
		}
	}
	// Through nc V2 would be 2, beside C1; along the signal it is 4.
	if want := map[string]int{"R1": 0, "V1": 1, "C1": 2, "R2": 3, "V2": 4}; !reflect.DeepEqual(got, want) {
		t.Errorf("distances %v, want %v", got, want)
	}
}

// TestWalkPieces: a later walk ranks only what the earlier ones left, from
// its own base; net distances are those of the parts reached through them.
func TestWalkPieces(t *testing.T) {
	c := parseOK(t, walkSrc)
	w := NewWalk(c.View())
	w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
	w.FromNets([]string{"in"}, 1)
	w.FromPart(c.Part("R5"), 10)
	w.FromPart(c.Part("R1"), 20) // already reached: nothing changes
	want := map[string]int{"R1": 1, "R2": 2, "V1": 2, "R3": 3, "C1": 3, "R4": 4, "R5": 10, "R6": 11}
	for ref, d := range want {
		if got, ok := w.PartDist(c.Part(ref)); !ok || got != d {
			t.Errorf("%s at %d (%v), want %d", ref, got, ok, d)
		}
	}
	nets := map[string]int{"in": 1, "g": 2, "an": 3, "out": 4, "x": 11, "y": 11}
	for n, d := range nets {
		if got, ok := w.NetDist(n); !ok || got != d {
			t.Errorf("net %s at %d (%v), want %d", n, got, ok, d)
		}
	}
	if _, ok := w.NetDist("gnd"); ok {
		t.Error("ground was walked onto although Follow refuses it")
	}
}

// refDistances is breadth-first search written out plainly (a queue of
// nets, the textbook algorithm from memory): the reference the gonum walk
// is checked against on every example.
func refDistances(c *Circuit, starts []string) map[string]int {
	dist := map[string]int{}
	depth := map[string]int{}
	var queue []string
	for _, n := range starts {
		if _, ok := depth[n]; !ok {
			depth[n] = 0
			queue = append(queue, n)
		}
	}
	for len(queue) > 0 {
		n := queue[0]
		queue = queue[1:]
		for _, p := range c.Parts {
			on := false
			for _, pin := range p.Pins {
				on = on || pin.Net == n
			}
			if _, seen := dist[p.Ref]; !on || seen {
				continue
			}
			dist[p.Ref] = depth[n]
			for _, pin := range p.Pins {
				if _, seen := depth[pin.Net]; !seen && !c.RoleOf(pin.Net).IsACGround() && pin.Net != NotConnected {
					depth[pin.Net] = depth[n] + 1
					queue = append(queue, pin.Net)
				}
			}
		}
	}
	return dist
}

// TestWalkMatchesReference: on every example and fixture, from the inputs
// and from every single net, the walk agrees with plain breadth-first search.
func TestWalkMatchesReference(t *testing.T) {
	for _, path := range exampleFiles(t) {
		c := mustLoad(t, path)
		starts := [][]string{c.Inputs}
		for _, n := range c.Nets {
			starts = append(starts, []string{n.Name})
		}
		for _, s := range starts {
			w := NewWalk(c.View())
			w.Follow = func(n string) bool { return !c.RoleOf(n).IsACGround() }
			w.FromNets(s, 0)
			got := map[string]int{}
			for _, p := range c.Parts {
				if d, ok := w.PartDist(p); ok {
					got[p.Ref] = d
				}
			}
			if want := refDistances(c, s); !reflect.DeepEqual(got, want) {
				t.Errorf("%s from %v: walk %v, reference %v", filepath.Base(path), s, got, want)
			}
		}
	}
}

// exampleFiles lists the bundled examples and the good fixtures.
func exampleFiles(t *testing.T) []string {
	t.Helper()
	var out []string
	for _, pat := range []string{"examples/*.toml", "testdata/good/*.toml"} {
		m, err := filepath.Glob(filepath.Join(repo, pat))
		if err != nil {
			t.Fatal(err)
		}
		out = append(out, m...)
	}
	if len(out) < 3 {
		t.Fatalf("found %d example files, want the three examples at least", len(out))
	}
	return out
}

// TestComponents: two stages that share only ground and HT are one group in
// the plain graph and two when AC-ground nets are split off (read off the
// netlist by hand).
func TestComponents(t *testing.T) {
	c := parseOK(t, `band = "20..20k"
[nets]
ht = { role = "supply", volts = 250 }
[parts]
R1 = { r = "100k", pins = ["a1", "ht"] }
R2 = { r = "1k", pins = ["a1", "gnd"] }
R3 = { r = "100k", pins = ["a2", "ht"] }
C1 = { c = "1n", pins = ["a2", "gnd"] }
R4 = { r = "1M", pins = ["x", "y"] }
`)
	if got, want := Components(c, false), [][]string{{"C1", "R1", "R2", "R3"}, {"R4"}}; !reflect.DeepEqual(got, want) {
		t.Errorf("Components(no split) = %v, want %v", got, want)
	}
	if got, want := Components(c, true), [][]string{{"C1", "R3"}, {"R1", "R2"}, {"R4"}}; !reflect.DeepEqual(got, want) {
		t.Errorf("Components(split) = %v, want %v", got, want)
	}
}

// TestDisjointSets: joins merge sets, the smallest member names each set
// whatever the order of the joins (union–find, the textbook structure, from
// memory), and keys never joined stand alone.
func TestDisjointSets(t *testing.T) {
	cases := []struct {
		joins [][2]string
		want  map[string]string // key → representative
	}{
		{nil, map[string]string{"a": "a"}},
		{[][2]string{{"b", "a"}}, map[string]string{"a": "a", "b": "a"}},
		{[][2]string{{"d", "c"}, {"b", "d"}, {"x", "y"}}, map[string]string{"b": "b", "c": "b", "d": "b", "x": "x", "y": "x", "z": "z"}},
		{[][2]string{{"z", "y"}, {"y", "x"}, {"x", "w"}, {"w", "z"}}, map[string]string{"z": "w", "y": "w", "x": "w", "w": "w"}},
	}
	for i, tc := range cases {
		var s NamedSets
		for _, j := range tc.joins {
			s.Union(j[0], j[1])
		}
		for k, rep := range tc.want {
			if got := s.Find(k); got != rep {
				t.Errorf("case %d: Find(%s) = %s, want %s", i, k, got, rep)
			}
		}
	}
	var n DisjointSets
	n.Union(7, 3)
	n.Union(3, 9)
	if n.Find(9) != 3 || n.Find(5) != 5 {
		t.Errorf("ints: Find(9) = %d, Find(5) = %d; want 3 and 5", n.Find(9), n.Find(5))
	}
}
