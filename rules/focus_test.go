package rules

import (
	"errors"
	"strings"
	"testing"

	"pare/graph"
)

// Two resistance-coupled triode stages; focusing on the second keeps its grid
// network, cathode, anode load and output, and turns the net it is fed from
// into a port labelled after the first valve's anode.
const twoStages = `
band = "20..20k"
inputs = ["in"]
outputs = ["out"]
[nets]
ht = { role = "supply", volts = 250 }
[parts]
V1 = { valve = "triode", pins = { a = "a1", g1 = "in", k = "k1" }, mu = 20, ra = "10k" }
R1 = { r = "1M", pins = ["in", "gnd"] }
R2 = { r = "1k5", pins = ["k1", "gnd"] }
C2 = { c = "100u", pins = ["k1", "gnd"] }
R3 = { r = "47k", pins = ["a1", "ht"] }
C3 = { c = "100n", pins = ["a1", "g2"] }
R4 = { r = "470k", pins = ["g2", "gnd"] }
V2 = { valve = "triode", pins = { a = "out", g1 = "g2", k = "k2" }, mu = 20, ra = "10k" }
R5 = { r = "1k5", pins = ["k2", "gnd"] }
C5 = { c = "1000u", pins = ["k2", "gnd"] }
R6 = { r = "47k", pins = ["out", "ht"] }
`

func TestFocus(t *testing.T) {
	cases := []struct {
		focus  []string
		kept   []string // refs that must survive (or be folded into survivors)
		cut    []string
		port   string // label of the port on the cut net
		portOn string
	}{
		{[]string{"V2"}, []string{"C3", "R4", "V2", "R6"}, []string{"V1", "R1", "R2", "C2", "R3"}, "from V1 anode", "a1"},
		{[]string{"R4"}, []string{"C3", "V2"}, []string{"V1", "R3"}, "from V1 anode", "a1"},
		{[]string{"V1"}, []string{"V1", "R1", "R3", "C3"}, []string{"V2", "R4", "R6"}, "to V2 grid", "g2"},
	}
	for _, tc := range cases {
		t.Run(strings.Join(tc.focus, ","), func(t *testing.T) {
			r, log := reduceChecked(t, parse(t, twoStages), Options{Level: LevelSignal, Focus: tc.focus})
			if len(log.Steps) == 0 || log.Steps[0].Rule != "focus" || log.Steps[0].N != 1 {
				t.Fatalf("the cut must be logged as step 1:\n%s", logText(log))
			}
			origin := map[string]bool{}
			for _, p := range r.Parts {
				for _, o := range p.Origins() {
					origin[o] = true
				}
			}
			for _, ref := range tc.kept {
				if !origin[ref] {
					t.Errorf("%s should be kept\n%s", ref, logText(log))
				}
			}
			for _, ref := range tc.cut {
				if origin[ref] || !contains(log.Steps[0].Removed, ref) {
					t.Errorf("%s should be cut away by the focus step\n%s", ref, logText(log))
				}
			}
			found := false
			for _, p := range r.Parts {
				if p.Kind == graph.Port && p.Label == tc.port && p.Pins[0].Net == tc.portOn {
					found = true
				}
			}
			if !found {
				t.Errorf("no port %q on %s:\n%s", tc.port, tc.portOn, written(t, r))
			}
		})
	}
}

func TestFocusBadNames(t *testing.T) {
	cases := []struct {
		focus []string
		want  string
	}{
		{[]string{"V3"}, `no part or net of that name (did you mean`},
		{[]string{"ht"}, "is AC ground"},
		{[]string{"nothing_here"}, "no part or net of that name"},
	}
	for _, tc := range cases {
		_, _, err := Reduce(parse(t, twoStages), Options{Level: LevelSignal, Focus: tc.focus})
		var list graph.ErrorList
		if !errors.As(err, &list) || !strings.Contains(err.Error(), tc.want) || !strings.HasPrefix(err.Error(), "test.toml") {
			t.Errorf("focus %v: error %v, want a graph.ErrorList naming the file and saying %q", tc.focus, err, tc.want)
		}
	}
}
