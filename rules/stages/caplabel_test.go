package stages

import (
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/dc"
	"pare/graph/figure"
)

// A supply filter's capacitance figures name their capacitors: a frame's
// figure line stands beside whichever capacitor its sheet drew nearest,
// and on a reduced sheet the reservoir is not drawn, so review17 a05's
// "c reservoir 50 µF" read as the label of the smoothing capacitor C3
// beside it. Each row: a section's series part, the figure, the part it
// must name and that part's netlist value (the capacitors the fixture
// captures; which is the reservoir is read from the wiring: it sits on the
// rectifier's output).
func TestCapFiguresNameTheirParts(t *testing.T) {
	cases := []struct {
		file, series, key, ref string
		rectifierSide          bool // the part shares a net with a rectifier diode
	}{
		{"../testdata/review17/a05.toml", "R2", "c_reservoir", "C2", true},
		{"../testdata/review17/a05.toml", "R2", "c_smoothing", "C3", false},
		{"club-receiver.toml", "L3", "c_reservoir", "C38", true},
		{"club-receiver.toml", "R4", "c_decoupling", "C6", false},
		{"club-receiver.toml", "R3", "c_screen_bypass", "C5", false},
	}
	found := map[string][]Stage{}
	fulls := map[string]*graph.Circuit{}
	for _, tc := range cases {
		if found[tc.file] == nil {
			full, reduced, log := reduceExample(t, tc.file)
			op, err := dc.Solve(full)
			if err != nil {
				t.Fatal(err)
			}
			found[tc.file], fulls[tc.file] = find(t, reduced, Options{Full: full, ACGround: log.ACGround, DC: op}), full
		}
		full := fulls[tc.file]
		s := stageWith(found[tc.file], tc.series)
		if s == nil {
			t.Fatalf("%s: no stage holds %s", tc.file, tc.series)
		}
		f, ok := s.Figures.Get(tc.key)
		if !ok {
			t.Errorf("%s %s: no %s in %v", tc.file, tc.series, tc.key, s.Figures)
			continue
		}
		item := f.Item(figure.Sheet)
		if !strings.Contains(f.Label, "("+tc.ref+")") {
			t.Errorf("%s %s: %q does not name %s", tc.file, tc.series, item, tc.ref)
		}
		p := full.Part(tc.ref)
		if p == nil || p.Kind != graph.Capacitor || p.Value.Max != f.Value {
			t.Errorf("%s %s: %q: %s is %v, want the capacitor the figure gives", tc.file, tc.series, item, tc.ref, p)
			continue
		}
		if got := onRectifier(full, p); got != tc.rectifierSide {
			t.Errorf("%s %s: %q: %s on the rectifier's output %v, want %v", tc.file, tc.series, item, tc.ref, got, tc.rectifierSide)
		}
	}
}

// onRectifier says whether p shares a net other than chassis with a
// rectifier: a diode or a valve diode.
func onRectifier(c *graph.Circuit, p *graph.Part) bool {
	for _, pn := range p.Pins {
		if c.RoleOf(pn.Net) == graph.Ground {
			continue
		}
		for _, q := range c.Parts {
			if q.Kind != graph.Diode && !(q.Kind == graph.Valve && isValveDiode(q)) {
				continue
			}
			for _, qn := range q.Pins {
				if qn.Net == pn.Net {
					return true
				}
			}
		}
	}
	return false
}
