package pipeline

import (
	"bytes"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/ac"
	"pare/internal/synth"
	"pare/rules"
)

// The step proofs solve each response on the piece of the circuit the
// voltage read depends on (ac.CompareOptions.ReadPieces): the same
// equations block-triangularised, so the same verdicts. On every example
// and every fixture that loads, at both levels, the step log (every step,
// applied or refused, with its reason) and the reduced circuit are the
// same whether the steps are proven on pieces or on whole blocks.
//
// The final proof is not run here: it lends no memo and solves afresh on
// whole blocks (Result.compare with a nil memo), from the circuit as
// loaded and the reduced one, so the same reduced circuit, part for part
// and in the same order (sameReduced), gives the same report. The runs
// proven on pieces are the main job's reductions TestLocalStepProofIsWhole
// made (mainReduction); with the final proofs left out, the two tests take
// some 30 % less CPU (docs/performance.md, issue 13, session 12).
func TestReadPieceStepsAreBlockSteps(t *testing.T) {
	paths := stepProofSets(t, !testing.Short())
	if !testing.Short() {
		for _, d := range []string{"osc", "pairs", "phase-shift", "review12", "review13", "review14", "review15", "safety", "tanks", "warn"} {
			more, _ := filepath.Glob(filepath.Join("../../../testdata", d, "*.toml"))
			paths = append(paths, more...)
		}
	}
	for _, p := range paths {
		for _, lvl := range []rules.Level{rules.LevelSignal, rules.LevelIdeal} {
			piece, perr := mainReduction(t, p, lvl)
			o := mainReductionOptions(p, lvl)
			o.blockSteps = true
			block, berr := Run(o)
			if (perr == nil) != (berr == nil) || (perr != nil && perr.Error() != berr.Error()) {
				t.Errorf("%s at %s: pieces: %v, blocks: %v", p, lvl, perr, berr)
				continue
			}
			if perr != nil {
				continue // a fixture the reduction refuses, the same way both times
			}
			if a, b := stepLines(piece.Log), stepLines(block.Log); !slices.Equal(a, b) {
				t.Errorf("%s at %s: the step log differs:\npieces:\n%s\nblocks:\n%s", p, lvl, strings.Join(a, "\n"), strings.Join(b, "\n"))
			}
			if why := sameReduced(t, piece.Reduced, block.Reduced); why != "" {
				t.Errorf("%s at %s: the reduced circuits differ: %s", p, lvl, why)
			}
		}
	}
}

// sameReduced says how two reduced circuits differ in what the final
// proof reads, "" when they do not: the netlist as written, every field
// the JSON form holds (parts, pins, windings and nets, in their order,
// which sets the order of the solver's unknowns) and each winding's
// derived q frequency, which neither form writes.
func sameReduced(t *testing.T, a, b *graph.Circuit) string {
	t.Helper()
	if netlistText(t, a) != netlistText(t, b) {
		return "the netlists"
	}
	ja, err := json.Marshal(a)
	if err != nil {
		t.Fatal(err)
	}
	jb, err := json.Marshal(b)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(ja, jb) {
		return "the parts or nets, or their order"
	}
	for i, p := range a.Parts {
		for k, w := range p.Windings {
			if w.QAt != b.Parts[i].Windings[k].QAt {
				return p.Ref + "'s q frequency"
			}
		}
	}
	return ""
}

func netlistText(t *testing.T, c *graph.Circuit) string {
	t.Helper()
	var b strings.Builder
	if err := graph.Write(&b, c); err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// A deliberately wrong step is refused by the step check wherever it lies
// along a chain of one-way stages, with the worst pair the whole-block
// comparison finds. Two copies of the IF strip, detector and audio
// preamplifier; each wrong step is made in the second copy through the
// editing API, journaled as a rule's step is:
//   - the preamplifier's anode load 100 kΩ to 10 kΩ: the stage gain
//     gm·(ra ∥ RL) falls from 1.6 mA/V × 38.5 kΩ to 1.6 mA/V × 8.6 kΩ, some
//     13 dB (the triode's gain, common practice), beyond the valve's grid:
//     no response read before the grid can see it, and the region and
//     overall transfers must;
//   - the second IF can's secondary tuning 100 pF to 70 pF: its resonance
//     moves from 470 kHz by √(100/70), to some 560 kHz (f = 1/(2π√LC)),
//     before the detector and the audio stage.
//
// A step check weakened to nothing (no comparison, or pieces that leave
// out what the step changed) passes these steps, and this test fails.
func TestStepCheckRefusesWrongSteps(t *testing.T) {
	src, err := os.ReadFile("../../../examples/if-detector-audio.toml")
	if err != nil {
		t.Fatal(err)
	}
	two, err := synth.Copies(src, 2)
	if err != nil {
		t.Fatal(err)
	}
	path := writeTemp(t, "two.toml", string(two))
	cases := []struct {
		ref   string
		value float64
	}{
		{"R209", 10e3},
		{"C212", 70e-12},
	}
	for _, tc := range cases {
		res, err := Run(Options{Path: path, Until: PhaseLoad})
		if err != nil {
			t.Fatal(err)
		}
		ac.KeepDetectorLoads(res.Circuit)
		c := res.Circuit.Clone()
		old := c.Part(tc.ref)
		if old == nil {
			t.Fatalf("no %s in the copies", tc.ref)
		}
		j := c.StartJournal()
		wrong := old.Clone()
		wrong.Value.Min, wrong.Value.Max = tc.value, tc.value
		if _, ok := c.RemovePart(tc.ref); !ok {
			t.Fatalf("%s not removed", tc.ref)
		}
		c.AddPart(wrong)
		b, a, whole, none := localJournal(j)
		if whole || none {
			t.Fatalf("%s: whole %v, none %v: want the second copy alone", tc.ref, whole, none)
		}
		check := res.stepChecker(AgainstPrevious, false)
		err = check(j, &rules.Step{Rule: "wrong", Refs: []string{tc.ref}})
		var te *ac.ToleranceError
		if !errors.As(err, &te) {
			t.Fatalf("%s %g: the step check let the wrong step through (%v)", tc.ref, tc.value, err)
		}
		block, err := ac.Compare(b, a, ac.CompareOptions{AboveRounding: true})
		if err != nil {
			t.Fatal(err)
		}
		bw, _ := block.Worst()
		if block.OK || bw.Label() != te.Pair.Label() || bw.Setting != te.Pair.Setting ||
			!near(bw.MaxDB, te.Pair.MaxDB) || !near(bw.MaxDeg, te.Pair.MaxDeg) {
			t.Errorf("%s: step check's worst %v, whole blocks' %v", tc.ref, te.Pair, bw)
		}
		j.Stop()
	}
}

// near is agreement to the rounding of two eliminations of one system.
func near(x, y float64) bool {
	d := x - y
	return d < 1e-9*(1+max(x, y, -x, -y)) && -d < 1e-9*(1+max(x, y, -x, -y))
}
