package stages

import (
	"math"
	"path/filepath"
	"strings"
	"testing"

	"pare/graph"
)

// TestLongTailedPairSplitter: a long-tailed pair driven on one grid, the
// other grid held at AC ground, both anodes taken on, is a phase splitter
// whatever its drawing: a bias resistor between the cathodes and the tail
// with both grid leaks returned to the tail's top and the second grid
// bypassed to chassis (review20 a04, a blind reviewer's circuit, named
// "V2a stage" and "Grounded-grid amplifier" before), or the tail straight
// from the cathodes with both leaks on a decoupled grid line
// (rules/stages/testdata/ltp/split-grid-line.toml, of our own). Check
// values are ngspice-39 (Debian) on linear decks of each: the reviewer's
// testdata/review20/spice/a/c04.cir (RESULTS.md: V(a1)/V(g1) 7.29,
// V(a2)/V(g1) 6.95 at 1 kHz) and rules/stages/testdata/ltp/split-grid-line.cir
// (at 632 Hz: V(a1)/V(g1) -14.41, V(a2)/V(g1) +14.65); 2 %.
func TestLongTailedPairSplitter(t *testing.T) {
	for _, tc := range []struct {
		file, driven    string
		parts           []string
		gain, otherHalf float64
	}{
		{"../../testdata/review20/a04.toml", "V2a", []string{"V2a", "V2b", "R7", "R8", "R9", "R11", "R12"}, -7.29, 6.95},
		{"testdata/ltp/split-grid-line.toml", "V1a", []string{"V1a", "V1b", "R5", "R1", "R2"}, -14.41, 14.65},
	} {
		c, err := graph.LoadFile(filepath.FromSlash(tc.file))
		if err != nil {
			t.Fatal(err)
		}
		st := findBiased(t, c)
		s := holding(st, tc.driven)
		if s == nil || s.Topology != "long-tailed-pair" || !strings.Contains(s.Title, "phase splitter") {
			t.Errorf("%s: %s not in a long-tailed-pair phase splitter: %s", tc.file, tc.driven, topologies(st))
			continue
		}
		for _, p := range tc.parts {
			if !strings.Contains(" "+strings.Join(s.Parts, " ")+" ", " "+p+" ") {
				t.Errorf("%s: the splitter lacks %s: %v", tc.file, p, s.Parts)
			}
		}
		for name, want := range map[string]float64{"gain": tc.gain, "gain_other_half": tc.otherHalf} {
			if got := fig(s.Figures, name); math.IsNaN(got) || !within(got, want, 0.02) {
				t.Errorf("%s: %s %g, ngspice %g (2 %%)", tc.file, name, got, want)
			}
		}
	}
}

// The splitter's name rests on the behaviour, on every family: one half
// driven, the other's control electrode at AC ground, the two outputs
// equal and opposite within splitBalance. Both halves driven (a
// differential input) or loads far apart (outputs 10 k against 47 k, more
// than 1.3 apart) keep the shape's name, long-tailed pair, and no splitter.
func TestLongTailedPairSplitterNeedsTheSplit(t *testing.T) {
	const pair = `@Q1(g1, k, o1)
@Q2(gnd, k, o2)
C1 = { c = "100n", pins = ["in", "g1"] }
R1 = { r = "470", pins = ["k", "t"] }
R2 = { r = "22k", pins = ["t", "gnd"] }
R3 = { r = "1M", pins = ["g1", "t"] }
R4 = { r = "10k", pins = ["o1", "ht"] }
`
	for _, tc := range []struct {
		name, parts string
		split       bool
	}{
		{"one half driven, equal loads", pair + `R5 = { r = "10k", pins = ["o2", "ht"] }`, true},
		{"loads far apart", pair + `R5 = { r = "47k", pins = ["o2", "ht"] }`, false},
		{"both halves driven", strings.Replace(pair, "@Q2(gnd, k, o2)", "@Q2(g2, k, o2)", 1) +
			`R5 = { r = "10k", pins = ["o2", "ht"] }
C2 = { c = "100n", pins = ["inb", "g2"] }
R6 = { r = "1M", pins = ["g2", "t"] }`, false},
	} {
		for _, fam := range allFamilies {
			st := find(t, circuit(t, fam, tc.parts), Options{})
			s := stageOf(st, "long-tailed-pair")
			if s == nil {
				t.Errorf("%s/%s: no long-tailed pair: %s", tc.name, fam, topologies(st))
				continue
			}
			if got := strings.Contains(s.Title, "phase splitter"); got != tc.split {
				t.Errorf("%s/%s: named %q, splitter %v want %v", tc.name, fam, s.Title, got, tc.split)
			}
		}
	}
}
