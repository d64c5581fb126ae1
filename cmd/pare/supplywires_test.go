package main

import (
	"sort"
	"testing"

	"pare/cmd/internal/pipeline"
	"pare/graph"
	"pare/render"
	"pare/render/geom"
)

// supplyWireCeiling is how many supply lines, over every example, gallery
// fixture and review circuit's full and faded A3 pages, are drawn as wires
// to three or more off-row connectors (the line and the decoupled lines
// hanging on it together). A supply line is drawn as a rail tag at each
// load's end (common practice: a service sheet names the rail at each
// stage, it never runs the HT line round the pages); review 20's a05 drew
// its smoothed HT2, which the netlist did not declare, and its decouplers
// as black wires to twelve connectors a view. 24 before the reduction took
// such a line fed from a declared supply as a rail (rules' supply-line) and
// the full and faded sheets drew it with tags, 22 after (a05's two views);
// the rest are transistor sets' decoupled Vcc lines (vcc_if, vcc_a) and
// undeclared reservoirs, wired still. 24 (+2, over the 1 % rule: the lead
// decides) once a tuned RF amplifier is one stage with its tuned collector
// transformer: review20 b02's RF frame, T2 in it, fills the second row of
// its full and faded page 1 and the mixer moves to page 2, so the mixer's
// decoupled line vcc_mix reaches it by six connectors (looked at: the RF
// stage reads whole where it was "Q1 stage" and a separate transformer
// frame on the next row).
var supplyWireCeiling = 22 // 24 before with the tapped follower's gain calc loading again and a shunt stabiliser's feed framed after its rectifier as a supply section (review15 b05)

// TestSupplyNetsAsRails counts the supply lines (declared, or smoothed
// lines fed from one, with the decoupled lines hanging on each) drawn as
// wires reaching three or more off-row connectors on one view's pages.
func TestSupplyNetsAsRails(t *testing.T) {
	files := append(readSheets(t), reviewCircuits(t)...)
	files = append(files, reviewCircuitsFrom(t, "review13", "review18", "review19", "review20")...)
	warmSheets(files, "A3")
	n := 0
	for _, f := range files {
		res, err := fileEntry(f).result(f)
		if err != nil {
			t.Fatal(err)
		}
		supply := supplyNets(res)
		for _, v := range []render.View{render.Full, render.Faded} {
			pages, err := cachedPages(f, v, "A3")
			if err != nil {
				t.Fatal(err)
			}
			for _, net := range wiredToConnectors(pages, supply, 3) {
				n++
				t.Logf("%s %v: supply net %s drawn as wires to %d off-row connectors", f, v, net.name, net.n)
			}
		}
	}
	t.Logf("supply nets drawn as wires to ≥ 3 off-row connectors: %d (ceiling %d)", n, supplyWireCeiling)
	if n > supplyWireCeiling {
		t.Errorf("%d supply nets drawn as wires to ≥ 3 off-row connectors, ceiling %d; the log lists them", n, supplyWireCeiling)
	}
}

// supplyNets maps each net of the circuit as captured that carries a supply
// to the supply line it belongs to: a declared supply; a line fed from one
// through a resistor or choke and held by a microfarad capacitor to chassis
// (a smoothed HT2, common practice: smoothing is microfarads, an RF bypass
// nanofarads), declared or not; and the decoupled lines fed from either
// through a resistor or choke with a capacitor to chassis (a can's or a
// screen's feed), which belong to the line they hang on: a distribution
// drawn as wires runs all of them out to connectors.
func supplyNets(res *pipeline.Result) map[string]string {
	c := res.Circuit
	out := map[string]string{}
	for _, n := range c.Nets {
		if n.Role == graph.Supply {
			out[n.Name] = n.Name
		}
	}
	// smoothed lines, then the decoupled lines hanging on any of them
	for _, least := range []float64{1e-6, 0} {
		var found [][2]string
		for net, root := range out {
			for _, cn := range c.ConnsOf(net) {
				p := cn.Part
				if (p.Kind != graph.Resistor && p.Kind != graph.Inductor) || len(p.Pins) != 2 {
					continue
				}
				far := p.Pins[0].Net
				if far == net {
					far = p.Pins[1].Net
				}
				if _, done := out[far]; done || c.RoleOf(far) != graph.Signal || !heldToChassis(c, far, least) {
					continue
				}
				if least > 0 {
					root = far // a smoothed line is a line of its own
				}
				found = append(found, [2]string{far, root})
			}
		}
		sort.Slice(found, func(i, j int) bool { return found[i][0] < found[j][0] })
		for _, f := range found {
			if _, done := out[f[0]]; !done {
				out[f[0]] = f[1]
			}
		}
	}
	return out
}

// heldToChassis says whether a capacitor of at least least farads runs
// from net to a ground net.
func heldToChassis(c *graph.Circuit, net string, least float64) bool {
	for _, cn := range c.ConnsOf(net) {
		p := cn.Part
		if p.Kind != graph.Capacitor || len(p.Pins) != 2 || p.Value.Max < least || p.Value.Max == 0 {
			continue
		}
		for _, pn := range p.Pins {
			if pn.Net != net && c.RoleOf(pn.Net) == graph.Ground {
				return true
			}
		}
	}
	return false
}

type netCount struct {
	name string
	n    int
}

// wiredToConnectors lists the supply lines whose nets (the line and the
// decoupled lines hanging on it) reach at least least off-row connectors
// over the pages, by name.
func wiredToConnectors(pages []*geom.Sheet, supply map[string]string, least int) []netCount {
	count := map[string]int{}
	for _, pg := range pages {
		for _, s := range pg.Symbols {
			if net, _, ok := geom.ConnectorOf(s.Ref); ok {
				if root, ok := supply[net]; ok {
					count[root]++
				}
			}
		}
	}
	var out []netCount
	for net, k := range count {
		if k >= least {
			out = append(out, netCount{net, k})
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].name < out[j].name })
	return out
}
