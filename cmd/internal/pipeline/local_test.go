package pipeline

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/internal/synth"
	"pare/rules"
)

// The local step proof is the whole-circuit proof: on every example, the
// test fixtures and two copies of the portable front end side by side, the
// step log (every step, applied or refused, with its reason) is the same
// whichever way each step is proven (the independence of groups joined only
// through AC ground: superposition, common practice).
func TestLocalStepProofIsWhole(t *testing.T) {
	paths := stepProofSets(t, !testing.Short())
	for _, p := range paths {
		for _, lvl := range []rules.Level{rules.LevelSignal, rules.LevelIdeal} {
			local, err := mainReduction(t, p, lvl)
			if err != nil {
				t.Fatalf("%s: %v", p, err)
			}
			o := mainReductionOptions(p, lvl)
			o.wholeSteps = true
			whole, err := Run(o)
			if err != nil {
				t.Fatalf("%s: %v", p, err)
			}
			a, b := stepLines(local.Log), stepLines(whole.Log)
			if !slices.Equal(a, b) {
				t.Errorf("%s at %s: the local proof's log differs from the whole proof's:\nlocal:\n%s\nwhole:\n%s", p, lvl,
					strings.Join(a, "\n"), strings.Join(b, "\n"))
			}
		}
	}
}

func stepLines(l *rules.Log) []string {
	var out []string
	for _, s := range l.Steps {
		out = append(out, s.Rule+" "+strings.Join(s.Refs, ",")+": "+s.Why+" | refused: "+s.Refused)
	}
	return out
}

// A wrong step in one copy is refused by the local proof as by the whole
// one, with the same worst pair, and the local comparison holds that copy
// alone. The wrong step detunes the second copy's IF primary (180 pF to
// 120 pF moves 455 kHz to about 557 kHz: f = 1/(2π√LC), far outside 0.5 dB).
func TestLocalProofRefusesWrongStep(t *testing.T) {
	src, err := os.ReadFile("../../../examples/transistor-front-end.toml")
	if err != nil {
		t.Fatal(err)
	}
	two, err := synth.Copies(src, 2)
	if err != nil {
		t.Fatal(err)
	}
	res, err := Run(Options{Path: writeTemp(t, "two.toml", string(two)), Until: PhaseLoad})
	if err != nil {
		t.Fatal(err)
	}
	before := res.Circuit
	after := before.Clone()
	after.Part("C205").Value.Min, after.Part("C205").Value.Max = 120e-12, 120e-12
	b, a, whole, none := localPair(before, after)
	if whole || none {
		t.Fatalf("whole %v, none %v: want the second copy alone", whole, none)
	}
	for _, p := range append(b.Parts, a.Parts...) {
		if !strings.HasPrefix(p.Ref[strings.IndexAny(p.Ref, "0123456789"):], "2") {
			t.Errorf("%s of another copy is in the local comparison", p.Ref)
		}
	}
	if len(b.Parts) == 0 || len(b.Parts) >= len(before.Parts)/2+1 {
		t.Errorf("local comparison holds %d of %d parts", len(b.Parts), len(before.Parts))
	}
	r := &Result{}
	local, err := r.compare(b, a, nil)
	if err != nil {
		t.Fatal(err)
	}
	full, err := r.compare(before, after, nil)
	if err != nil {
		t.Fatal(err)
	}
	lw, _ := local.Worst()
	fw, _ := full.Worst()
	if local.OK || full.OK {
		t.Fatalf("the detuned IF passed: local %v, whole %v", local.OK, full.OK)
	}
	if lw.Label() != fw.Label() || lw.AtHz != fw.AtHz || lw.MaxDB-fw.MaxDB > 1e-9 || fw.MaxDB-lw.MaxDB > 1e-9 {
		t.Errorf("worst pair: local %v, whole %v", lw, fw)
	}
}

// Terminals on "nc" are connected to nothing in the small-signal model
// (docs/netlist.md), so they join no groups: with the aerial coupling capacitor of each copy
// moved to "nc" (as a reduction moves every static electrode), a step in
// the second copy still compares the second copy alone.
func TestLocalPairLeavesNCApart(t *testing.T) {
	src, err := os.ReadFile("../../../examples/transistor-front-end.toml")
	if err != nil {
		t.Fatal(err)
	}
	two, err := synth.Copies(src, 2)
	if err != nil {
		t.Fatal(err)
	}
	res, err := Run(Options{Path: writeTemp(t, "two.toml", string(two)), Until: PhaseLoad})
	if err != nil {
		t.Fatal(err)
	}
	before := res.Circuit
	for _, ref := range []string{"C101", "C201"} {
		p := before.Part(ref)
		if p == nil {
			t.Fatalf("no %s in the copies", ref)
		}
		before.Unconnect(ref, p.Pins[0].Name)
	}
	after := before.Clone()
	after.Part("C205").Value.Min, after.Part("C205").Value.Max = 120e-12, 120e-12
	b, a, whole, none := localPair(before, after)
	if whole || none {
		t.Fatalf("whole %v, none %v: want the second copy alone", whole, none)
	}
	for _, p := range append(b.Parts, a.Parts...) {
		if !strings.HasPrefix(p.Ref[strings.IndexAny(p.Ref, "0123456789"):], "2") {
			t.Errorf("%s of another copy is in the local comparison", p.Ref)
		}
	}
}

// stepProofSets is what the local step proof is held to the whole one on:
// every example, the test fixtures, the edge-coupled pair and, with
// copies, two copies of the portable front end side by side.
func stepProofSets(t *testing.T, copies bool) []string {
	t.Helper()
	paths, _ := filepath.Glob("../../../examples/*.toml")
	good, _ := filepath.Glob("../../../testdata/good/*.toml")
	paths = append(paths, good...)
	if copies {
		src, err := os.ReadFile("../../../examples/transistor-front-end.toml")
		if err != nil {
			t.Fatal(err)
		}
		two, err := synth.Copies(src, 2)
		if err != nil {
			t.Fatal(err)
		}
		paths = append(paths, writeTemp(t, "two.toml", string(two)))
	}
	return append(paths, writeTemp(t, "edge.toml", edgeCoupling))
}
