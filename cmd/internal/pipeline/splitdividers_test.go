package pipeline

import (
	"slices"
	"strings"
	"testing"

	"pare/render"
	"pare/render/geom"
)

// A bias divider the reduction merged is drawn on the reduced sheet as its
// two halves, each to its own return: review15 b01's "R2 13k2 ≡ R2, R3"
// under the tag "+12 V via R1, +11.72 V" read as a 13k2 fed from the line,
// a bias the set does not have (the reviewer's ngspice .op puts the base
// at 22/(33+22) of the line, less the base current: a divider, not a
// feed). The upper half ends at the line's tag, the lower at an earth, both
// in the merged part's stage frame; the reduced netlist stays merged (its
// figures and its fixpoint are the reduction's), and the hover pairs each
// half on the sheet with itself.
func TestMergedDividerDrawnAsHalves(t *testing.T) {
	cases := []struct {
		upper, lower, line, tag string
	}{
		{"R2", "R3", "vcc_osc", "+12 V via R1, +11.72 V"}, // the line's own volts from the operating point
		{"R5", "R6", "vcc", "+12 V"},                      // the declared rail's label
	}
	res, err := stagesRun("../../../testdata/review15/b01.toml")
	if err != nil {
		t.Fatal(err)
	}
	s := res.Sheet(render.Reduced)
	g, err := render.Config{}.Geometry(s)
	if err != nil {
		t.Fatal(err)
	}
	for _, l := range g.Labels {
		if s := strings.Join(l.Lines, " / "); strings.Contains(s, "\u2261") {
			t.Errorf("%s is labelled %q: a merged part on the sheet", l.Owner, s)
		}
	}
	for _, tc := range cases {
		if res.Reduced.Part(tc.upper) == nil || res.Reduced.Part(tc.lower) != nil {
			t.Errorf("the reduced netlist no longer merges %s and %s: the figures and the fixpoint rest on it", tc.upper, tc.lower)
		}
		ends := map[string]string{}
		for _, l := range g.Locals {
			switch {
			case l.Owner == tc.upper && l.Kind == geom.LocalRail:
				ends[tc.upper] = l.Text
			case l.Owner == tc.lower && l.Kind == geom.LocalGround:
				ends[tc.lower] = "earth"
			case l.Owner == tc.upper || l.Owner == tc.lower:
				t.Errorf("%s.%s ends at a %v symbol %q", l.Owner, l.Pin, l.Kind, l.Text)
			}
		}
		if ends[tc.upper] != tc.tag {
			t.Errorf("%s ends at %q, want the tag of %s, %q", tc.upper, ends[tc.upper], tc.line, tc.tag)
		}
		if ends[tc.lower] != "earth" {
			t.Errorf("%s does not end at an earth: %v", tc.lower, ends)
		}
		framed := 0
		for _, f := range s.Frames {
			in := slices.Contains(f.Parts, tc.upper)
			if in != slices.Contains(f.Parts, tc.lower) {
				t.Errorf("frame %q holds one half of %s/%s: %v", f.Title, tc.upper, tc.lower, f.Parts)
			}
			if in {
				framed++
			}
		}
		if framed != 1 {
			t.Errorf("%s/%s stand in %d frames, want 1", tc.upper, tc.lower, framed)
		}
	}
	if _, split := res.withDividersApart(res.withSupplyReturns(res.Reduced), stageFrames(res.Stages, res.Reduced, nil)); len(split) != len(cases) {
		t.Errorf("drawn apart: %v, want the %d dividers", split, len(cases))
	}
}

// Resistors merged from one net to different lines (review16 b05: R19, R30
// and R31 feeding three lines from the supply, merged into "R19 9R51 ≡
// R19, R30, R31"; R5 from the supply line and R6 from the AGC line into one
// base-bias resistance tagged with the supply alone) are drawn apart too:
// the reviewer read the lump as three decouplers merged and the AGC return
// hidden. The reduced sheet labels no merged part holding them.
func TestMergedLineFeedsDrawnApart(t *testing.T) {
	res, err := stagesRun("../../../testdata/review16/b05.toml")
	if err != nil {
		t.Fatal(err)
	}
	g, err := render.Config{}.Geometry(res.Sheet(render.Reduced))
	if err != nil {
		t.Fatal(err)
	}
	for _, l := range g.Labels {
		if s := strings.Join(l.Lines, " / "); strings.Contains(s, "\u2261 R19") || strings.Contains(s, "\u2261 R5, R6") {
			t.Errorf("%s is labelled %q: merged feeds from different lines drawn as one", l.Owner, s)
		}
	}
}

// A smoothing resistor and its line's bleeder merged in parallel (review18
// a05: R2 470R from the reservoir, R3 220k to chassis, one 469R: 470 ∥
// 220k = 468.998 Ω, Ohm's law) are drawn once, as the reduced netlist holds
// them, with the merged value and the mark listing both, to the chassis
// the netlist names: not apart as a bias divider (no bias is set on an HT
// line) and not under the reservoir's tag, which only R2 returned to.
func TestMergedLineBleederDrawnOnce(t *testing.T) {
	res, err := stagesRun("../../../testdata/review18/a05.toml")
	if err != nil {
		t.Fatal(err)
	}
	s := res.Sheet(render.Reduced)
	if s.Circuit.Part("R3") != nil {
		t.Error("R3 drawn apart on the reduced sheet: the netlist merged it into R2")
	}
	p := s.Circuit.Part("R2")
	if p == nil || !slices.Equal(p.From, []string{"R2", "R3"}) {
		t.Fatalf("R2 = %+v, want the merge of R2 and R3", p)
	}
	for _, pn := range p.Pins {
		if pn.Rail != "" {
			t.Errorf("R2 pin %s drawn to the %s tag: only one member returned there", pn.Name, pn.Rail)
		}
	}
	g, err := render.Config{}.Geometry(s)
	if err != nil {
		t.Fatal(err)
	}
	found := false
	for _, l := range g.Labels {
		found = found || strings.Contains(strings.Join(l.Lines, " / "), "469R / \u2261 R2, R3")
	}
	if !found {
		t.Error("no label reads 469R ≡ R2, R3")
	}
}
