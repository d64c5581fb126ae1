package pipeline

import (
	"fmt"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
	"pare/render"
	"pare/render/check"
	"pare/render/geom"
)

// supplyCase is a set's supply in the order the trade draws it (common
// practice): each step's parts, mains to rails; bridge, when there is
// one, its − diodes and its + diodes, each pair on the same AC line.
type supplyCase struct {
	path   string
	flow   [][]string
	minus  [2]string
	plus   [2]string
	bridge bool
}

func supplyCases() []supplyCase {
	review := func(dir, name string) string {
		return filepath.Join("..", "..", "..", "testdata", dir, name+".toml")
	}
	return []supplyCase{
		// bridge, resistor smoothing (a valve preamplifier's supply)
		{path: review("review13", "a05"), flow: [][]string{{"F1"}, {"S1"}, {"T1"}, {"D3", "D4"}, {"D1", "D2"}, {"C1"}, {"R1"}, {"C2"}},
			minus: [2]string{"D3", "D4"}, plus: [2]string{"D1", "D2"}, bridge: true},
		// bridge on a transistor set, its rails declared
		{path: review("review13", "b05"), flow: [][]string{{"F1"}, {"T8"}, {"D4", "D5"}, {"D2", "D3"}, {"C30"}, {"R34"}, {"C31"}},
			minus: [2]string{"D4", "D5"}, plus: [2]string{"D2", "D3"}, bridge: true},
		// full-wave double-diode valve, choke smoothing
		{path: review("review12", "c08"), flow: [][]string{{"T1"}, {"V1"}, {"C1"}, {"L1"}, {"C2"}}},
		// the same with resistor smoothing
		{path: review("review12", "c10"), flow: [][]string{{"T6"}, {"V5"}, {"C26"}, {"R17"}, {"C27"}}},
		// a directly heated rectifier whose filament winding is at HT
		{path: example("club-receiver"), flow: [][]string{{"T9"}, {"V8"}, {"C38"}, {"L3"}, {"C39"}}},
	}
}

// TestSupplyDrawnInFlowOrder: on the faded sheet a supply reads left to
// right as its current flows (mains, transformer, rectifier, reservoir,
// smoothing, rails), a bridge is a diamond (the − diodes in one column,
// the + diodes in the next, each AC line's pair level, the two lines one
// above the other), and no two wires cross inside the supply's frames;
// on A3 pages the steps come page after page, row after row, in that
// order. The old placement ranked a supply by its distance from the
// signal input and drew it backwards, the bridge as a ladder.
func TestSupplyDrawnInFlowOrder(t *testing.T) {
	for _, tc := range supplyCases() {
		r, err := stagesRun(tc.path)
		if err != nil {
			t.Fatal(err)
		}
		s := r.Sheet(render.Faded)
		g, err := render.Config{}.Geometry(s)
		if err != nil {
			t.Fatal(err)
		}
		name := filepath.Base(tc.path)
		at := symbolsOf([]*geom.Sheet{g})
		for i := 1; i < len(tc.flow); i++ {
			for _, a := range tc.flow[i-1] {
				for _, b := range tc.flow[i] {
					if ca, cb := centreOf(at[a].box), centreOf(at[b].box); !(cb.X > ca.X) {
						t.Errorf("%s: %s (x %g) not right of %s (x %g)", name, b, cb.X, a, ca.X)
					}
				}
			}
		}
		checkChainWired(t, name, g, r.Circuit, tc.flow)
		if tc.bridge {
			checkDiamond(t, name, at, tc.minus, tc.plus)
			checkSupplyCrossings(t, name+" whole sheet", g)
		}
		pages, err := render.Config{Page: a3()}.Geometries(s)
		if err != nil {
			t.Fatal(err)
		}
		checkPagedFlow(t, name, symbolsOf(pages), tc.flow)
		for i, pg := range pages {
			if tc.bridge {
				checkSupplyCrossings(t, name+" page "+string(rune('1'+i)), pg)
			}
		}
	}
}

type placed struct {
	page int
	box  geom.Rect
}

func symbolsOf(pages []*geom.Sheet) map[string]placed {
	out := map[string]placed{}
	for i, g := range pages {
		for _, sy := range g.Symbols {
			if _, ok := out[sy.Ref]; !ok {
				out[sy.Ref] = placed{page: i, box: sy.Box}
			}
		}
	}
	return out
}

func centreOf(r geom.Rect) geom.Pt { return geom.Pt{X: (r.X0 + r.X1) / 2, Y: (r.Y0 + r.Y1) / 2} }

// checkDiamond: the bridge's sides as the diamond's (see the test).
func checkDiamond(t *testing.T, name string, at map[string]placed, minus, plus [2]string) {
	t.Helper()
	m0, m1 := centreOf(at[minus[0]].box), centreOf(at[minus[1]].box)
	p0, p1 := centreOf(at[plus[0]].box), centreOf(at[plus[1]].box)
	if m0.X != m1.X || p0.X != p1.X || !(p0.X > m0.X) {
		t.Errorf("%s: bridge columns: − diodes at x %g, %g; + diodes at x %g, %g", name, m0.X, m1.X, p0.X, p1.X)
	}
	if m0.Y != p0.Y || m1.Y != p1.Y || m0.Y == m1.Y {
		t.Errorf("%s: bridge lines: %s/%s at y %g/%g, %s/%s at y %g/%g", name, minus[0], plus[0], m0.Y, p0.Y, minus[1], plus[1], m1.Y, p1.Y)
	}
}

// checkChainWired: from the rectifier on, every pin of the supply's steps
// on a wired net or a supply rail (not chassis, not a heater) ends a wire: the reservoir, the smoothing parts and the
// rails' first capacitors joined along the line, a declared rail's tag
// once at its end rather than at each part (b05 drew C30, R34 and C31
// standing alone between "reservoir" and "+12 V" tags).
func checkChainWired(t *testing.T, name string, g *geom.Sheet, c *graph.Circuit, flow [][]string) {
	t.Helper()
	ends := map[string]bool{}
	for _, w := range g.Wires {
		for _, sg := range w.Segs {
			ends[pt(sg.A)], ends[pt(sg.B)] = true, true
		}
	}
	for _, step := range flow[1:] {
		for _, ref := range step {
			if p := c.Part(ref); p == nil || p.Kind == graph.Transformer {
				continue
			}
			for _, sy := range g.Symbols {
				if sy.Ref != ref {
					continue
				}
				for _, pn := range sy.Pins {
					if role := c.RoleOf(pn.Net); (role == graph.Supply || !role.IsACGround()) && !ends[pt(pn.At)] {
						t.Errorf("%s: %s's pin %s (%s) ends no wire", name, ref, pn.Name, pn.Net)
					}
				}
			}
		}
	}
}

func pt(p geom.Pt) string { return fmt.Sprintf("%g,%g", p.X, p.Y) }

// checkSupplyCrossings: no wire crossing inside a supply frame.
func checkSupplyCrossings(t *testing.T, name string, g *geom.Sheet) {
	t.Helper()
	rep := check.Measure(g)
	for i, f := range g.Frames {
		title := strings.ToLower(strings.Join(f.Title.Lines, " "))
		if (strings.Contains(title, "rectifier") || strings.Contains(title, "smoothing")) && rep.FrameCrossings[i] > 0 {
			t.Errorf("%s: %d crossings inside %q", name, rep.FrameCrossings[i], title)
		}
	}
}

// checkPagedFlow: each step on the same page as the one before or a
// later one; on the same page right of it or on a lower row.
func checkPagedFlow(t *testing.T, name string, at map[string]placed, flow [][]string) {
	t.Helper()
	for i := 1; i < len(flow); i++ {
		for _, a := range flow[i-1] {
			for _, b := range flow[i] {
				pa, pb := at[a], at[b]
				switch {
				case pb.page > pa.page:
				case pb.page < pa.page:
					t.Errorf("%s: %s on page %d before %s on page %d", name, b, pb.page+1, a, pa.page+1)
				case centreOf(pb.box).X <= centreOf(pa.box).X && pb.box.Y0 <= pa.box.Y1:
					t.Errorf("%s: %s left of %s on the same row of page %d", name, b, a, pa.page+1)
				}
			}
		}
	}
}

func a3() *render.Paper {
	p, err := render.ParsePaper("A3")
	if err != nil {
		panic(err)
	}
	return p
}
