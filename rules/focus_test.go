package rules

import (
	"errors"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/ac"
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
		// The focused circuit's ends: a cut net the signal enters by is an
		// input, and when the original output is cut away the net the
		// signal leaves by is the output (so the cut verifies on its own).
		inputs, outputs string
	}{
		{[]string{"V2"}, []string{"C3", "R4", "V2", "R6"}, []string{"V1", "R1", "R2", "C2", "R3"}, "from V1 anode", "a1", "a1", "out"},
		{[]string{"R4"}, []string{"C3", "V2"}, []string{"V1", "R3"}, "from V1 anode", "a1", "a1", "out"},
		// from V1's anode its load is followed up to the next valve: the coupling capacitor and V2's grid leak
		{[]string{"V1"}, []string{"V1", "R1", "R3", "C3", "R4"}, []string{"V2", "R5", "R6"}, "to V2 grid", "g2", "in", "g2"},
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
			if got := strings.Join(r.Inputs, ",") + " -> " + strings.Join(r.Outputs, ","); got != tc.inputs+" -> "+tc.outputs {
				t.Errorf("ends %s, want %s -> %s", got, tc.inputs, tc.outputs)
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

// An interstage transformer ends a stage: focusing on the transistor
// example's IF amplifier keeps T3 (its input) but not the mixer beyond it.
func TestFocusStopsAtTransformerCoupling(t *testing.T) {
	c, err := graph.LoadFile("../examples/transistor-front-end.toml")
	if err != nil {
		t.Fatal(err)
	}
	r, log := reduceChecked(t, c, Options{Level: LevelSignal, Focus: []string{"Q2"}})
	if r.Part("T3") == nil || r.Part("Q1") != nil || r.Part("T2") != nil {
		t.Fatalf("want T3 kept and Q1, T2 cut:\n%s", logText(log))
	}
}

// Focus results are sound netlists too: for every active device of every
// fixture, the cut reduces, loads back, is a fixpoint, and accounts for
// every original part.
func TestFocusProperties(t *testing.T) {
	for _, path := range fixtures(t) {
		c := loadFile(t, path)
		for _, p := range c.Parts {
			if !p.IsActive() {
				continue
			}
			r, log := reduceChecked(t, c, Options{Level: LevelSignal, Focus: []string{p.Ref}})
			text := written(t, r)
			back, err := graph.Parse("focus.toml", []byte(text))
			if err != nil {
				t.Fatalf("%s focus %s: does not load back: %v\n%s", path, p.Ref, err, text)
			}
			if _, again := reduceChecked(t, back, Options{Level: LevelSignal}); again.Applied() != 0 {
				t.Errorf("%s focus %s: not a fixpoint:\n%s", path, p.Ref, logText(again))
			}
			// The cut declares where the signal enters and leaves, and its
			// AC model solves, so it can be verified and swept on its own.
			if len(back.Inputs) == 0 || len(back.Outputs) == 0 {
				t.Errorf("%s focus %s: inputs %v, outputs %v: the cut should declare both\n%s", path, p.Ref, back.Inputs, back.Outputs, text)
			} else if _, err := ac.Compare(back, back.Clone(), ac.CompareOptions{Points: 10}); err != nil {
				t.Errorf("%s focus %s: the cut cannot be analysed: %v\n%s", path, p.Ref, err, text)
			}
			kept := map[string]bool{}
			for _, q := range r.Parts {
				for _, o := range q.Origins() {
					kept[o] = true
				}
			}
			removed := map[string]int{}
			for _, s := range log.Steps {
				for _, ref := range s.Removed {
					removed[ref]++
				}
			}
			for _, q := range c.Parts {
				if kept[q.Ref] == (removed[q.Ref] == 1) || removed[q.Ref] > 1 {
					t.Errorf("%s focus %s: %s kept=%v, removed %d times", path, p.Ref, q.Ref, kept[q.Ref], removed[q.Ref])
				}
			}
		}
	}
}

// A transformer kept by a focus keeps the capacitor that tunes each of its
// windings, even on the winding the walk does not follow: focusing on an
// oscillator coil keeps the IF transformer its valve feeds, and its
// secondary must stay tuned (C5, to a decoupled AGC line) rather than
// resonate with nothing. What lies beyond the secondary (R9) is still cut.
func TestFocusKeepsWindingTuning(t *testing.T) {
	const src = `
band = "530k..1.6M"
inputs = ["in"]
outputs = ["if_out"]
[nets]
ht = { role = "supply", volts = 250 }
agc = { role = "bias" }
[parts]
C1 = { c = "10p", pins = ["in", "g"] }
R1 = { r = "47k", pins = ["g", "gnd"] }
C2 = { c = "100p", pins = ["tank", "g"] }
L1 = { l = "120u", tap = 0.1, pins = ["gnd", "k", "tank"], q = 80 }
C3 = { c = "200p", pins = ["tank", "gnd"] }
V1 = { valve = "triode", pins = { a = "a", g1 = "g", k = "k" }, mu = 20, ra = "10k" }
C4 = { c = "100p", pins = ["a", "ht"] }
T2 = { windings = { p = "1m", s = "1m" }, k = 0.01, pins = { p1 = "a", p2 = "ht", s1 = "if_out", s2 = "agc" } }
C5 = { c = "100p", pins = ["if_out", "agc"] }
R9 = { r = "1M", pins = ["if_out", "g2"] }
V2 = { valve = "triode", pins = { a = "ht", g1 = "g2", k = "gnd" }, mu = 20, ra = "10k" }
`
	r, log := reduceChecked(t, parse(t, src), Options{Level: LevelSignal, Focus: []string{"L1"}})
	for _, ref := range []string{"L1", "V1", "T2", "C4", "C5"} {
		if r.Part(ref) == nil {
			t.Errorf("%s cut, want it kept:\n%s", ref, logText(log))
		}
	}
	for _, ref := range []string{"R9", "V2"} {
		if r.Part(ref) != nil {
			t.Errorf("%s kept, want it cut:\n%s", ref, logText(log))
		}
	}
}
