package stages

import (
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"pare/graph"
	"pare/graph/dc"
	"pare/rules"
)

// The blind review 12 wrote ten circuits of its own, kept under
// testdata/review12/ at the repository's top with the reviewer's ngspice
// decks in testdata/review12/spice/.

func reduceReview12(t *testing.T, name string) []Stage {
	t.Helper()
	c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", "review12", name))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return findReduced(t, c)
}

// A Colpitts VFO's tank is its coil with the gang section and trimmer
// across it and the divider's series pair: c eff is all of it, C1 10–60 pF
// + TC1 15 pF + 680 pF·680 pF/1360 pF = 365–415 pF (handbook Colpitts
// formula, docs/references.md §30), so the resonance formula agrees with
// the solver; the divider alone (340 pF) is not what the coil sees. The
// solver's f is checked against the reviewer's ngspice (3.610 and
// 3.849 MHz, testdata/review12/spice/c01.cir); no tank stage inside the
// oscillator repeats f on the gang alone.
func TestReview12ColpittsTankCountsTheGang(t *testing.T) {
	st := reduceReview12(t, "c01.toml")
	osc := stageOf(st, "colpitts-common-tap")
	if osc == nil {
		t.Fatalf("no Colpitts: %s", topologies(st))
	}
	c, ok := osc.Figures.Get("c_eff")
	if !ok || c.Range == nil || math.Abs(c.Range.Min-365e-12) > 0.5e-12 || math.Abs(c.Range.Max-415e-12) > 0.5e-12 {
		t.Errorf("c eff = %+v, want 365–415 pF", c)
	}
	f, ok := osc.Figures.Get("f")
	if !ok || f.Range == nil || math.Abs(f.Range.Min-3.610e6)/3.610e6 > 0.005 || math.Abs(f.Range.Max-3.849e6)/3.849e6 > 0.005 {
		t.Errorf("f = %+v, want 3.610–3.849 MHz within 0.5 %%", f)
	}
	if f.Check == nil || f.Check.Range == nil || math.Abs(f.Check.Range.Min-f.Range.Min)/f.Range.Min > 0.02 {
		t.Errorf("the formula's f %+v strays from the solver's %+v", f.Check, f.Range)
	}
	for _, s := range st {
		if s.Topology == "lc-tank" {
			t.Errorf("%s: a tank stage inside the oscillator: %v", s.Name, s.Parts)
		}
	}
}

// review12Text is a review 12 circuit's text with the replacements made
// (old, new pairs), each of which must apply: a variant of the reviewer's
// own circuit.
func review12Text(t *testing.T, name string, repl ...string) *graph.Circuit {
	t.Helper()
	return reviewCircuit(t, "review12", name, repl...)
}

// reviewCircuit is a blind review's circuit (testdata/DIR/NAME at the
// repository's top) with the replacements made (old, new pairs), each of
// which must apply.
func reviewCircuit(t *testing.T, dir, name string, repl ...string) *graph.Circuit {
	t.Helper()
	data, err := os.ReadFile(filepath.Join("..", "..", "testdata", dir, name))
	if err != nil {
		t.Fatal(err)
	}
	s := string(data)
	for i := 0; i+1 < len(repl); i += 2 {
		if !strings.Contains(s, repl[i]) {
			t.Fatalf("%s: %q not in the circuit", name, repl[i])
		}
		s = strings.Replace(s, repl[i], repl[i+1], 1)
	}
	c, err := graph.Parse(name, []byte(s))
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return c
}

// The triode of review 12's triode-heptode is a tuned-grid oscillator
// with its reaction winding shunt-fed (anode load R6 to HT, the winding
// through C11) and a padder C9 at the tank's cold end: a tickler
// oscillator, its tank f = 1/(2π√(LC)) with L 120 µH and C 47–400 pF in
// series with 470 pF (42.7–216.1 pF): 988.3 kHz–2.223 MHz (handbook
// formula, docs/references.md §30). Whatever the shape, a device whose loop
// runs is never titled an amplifier: with a stopper in the feed (no
// pattern names that) it is the oscillator found by its loop. With the
// reaction winding's ends swapped the loop does not start, and the stage
// says what the swap back would give, as for a regenerative detector.
func TestReview12ShuntFedTickler(t *testing.T) {
	tests := []struct {
		name     string
		repl     []string
		topology string
		flag     string
	}{
		{"as drawn", nil, "tuned-grid-tickler", ""},
		{"stopper in the feed", []string{`C11 = { c = "220p", pins = ["osc_a", "rw"]`, `R7 = { r = "100R", pins = ["rw", "rw2"] }
C11 = { c = "220p", pins = ["osc_a", "rw2"]`}, "oscillator-loop", ""},
		{"winding reversed", []string{`s1 = "gnd", s2 = "rw"`, `s1 = "rw", s2 = "gnd"`}, "tuned-grid-tickler",
			"a winding of T3 connected the wrong way round as captured: with its ends swapped the loop would give +"},
	}
	for _, tc := range tests {
		st := findReduced(t, review12Text(t, "c03.toml", tc.repl...))
		osc := topWith(st, "V1a")
		if osc == nil || osc.Topology != tc.topology {
			t.Errorf("%s: V1a's stage %+v, want %s: %s", tc.name, osc, tc.topology, topologies(st))
			continue
		}
		if strings.HasPrefix(osc.Topology, "amp-") || strings.Contains(osc.Title, "mplifier") {
			t.Errorf("%s: an oscillating triode titled %q", tc.name, osc.Title)
		}
		if tc.flag != "" && !slices.ContainsFunc(osc.Flags, func(f string) bool { return strings.HasPrefix(f, tc.flag) }) {
			t.Errorf("%s: no flag %q in %q", tc.name, tc.flag, osc.Flags)
		}
		if tc.topology != "tuned-grid-tickler" {
			continue
		}
		f, ok := osc.Figures.Get("f")
		if !ok || f.Check == nil || f.Check.Range == nil ||
			math.Abs(f.Check.Range.Min-988.3e3) > 1e3 || math.Abs(f.Check.Range.Max-2.223e6) > 2e3 {
			t.Errorf("%s: tank f %+v, want the formula's 988.3 kHz–2.223 MHz", tc.name, f)
		}
		// ngspice .ac on the tank alone, rules/stages/testdata/review12/c03-tank.cir:
		// peaks at 988.4 kHz (400 pF) and 2.2226 MHz (47 pF)
		if f.Range == nil || math.Abs(f.Range.Min-988.4e3)/988.4e3 > 0.005 || math.Abs(f.Range.Max-2.2226e6)/2.2226e6 > 0.005 {
			t.Errorf("%s: tank f in circuit %+v, want ngspice's 988.4 kHz–2.2226 MHz within 0.5 %%", tc.name, f.Range)
		}
	}
}

// The hum left at HT2 of review 12's mains supply is the reservoir
// ripple's fundamental through the choke filter: the reviewer's ngspice
// transient (testdata/review12/spice/c08.cir) gives 2 × 22.40 mV =
// 44.8 mV p-p at 100 Hz on ht2; with a sawtooth's 2/π of the ripple pare
// said 33.8 mV (docs/references.md §30).
func TestReview12HumIsTheRipplesFundamental(t *testing.T) {
	c, err := graph.LoadFile(filepath.Join("..", "..", "testdata", "review12", "c08.toml"))
	if err != nil {
		t.Fatal(err)
	}
	op, err := dc.Solve(c)
	if err != nil {
		t.Fatal(err)
	}
	r, log, err := rules.Reduce(c, rules.Options{Level: rules.LevelSignal})
	if err != nil {
		t.Fatal(err)
	}
	st := find(t, r, Options{Full: c, ACGround: log.ACGround, DC: op})
	main := stageWith(st, "L1")
	if main == nil {
		t.Fatalf("no stage holds L1: %s", topologies(st))
	}
	if got := fig(main.Figures, "hum_out_v"); math.Abs(got-44.8e-3) > 0.03*44.8e-3 {
		t.Errorf("hum at ht2 %.3g V p-p, ngspice 44.8 mV: more than 3 %% apart", got)
	}
}

// A tuned amplifier into a double-tuned can hands the next stage the
// secondary's voltage: review 12's IF strip's gain 144 runs from V1's grid
// to the detector winding (ngspice 144.4 at 465.18 kHz on the reviewer's
// testdata/review12/spice/c05.cir), and the anode gain beside it, the one a
// repairer probes, is 201.8 at 465 kHz there (docs/references.md §30).
func TestReview12AnodeGainBesideTheSecondarys(t *testing.T) {
	st := reduceReview12(t, "c05.toml")
	amp := stageOf(st, "amp-tuned")
	if amp == nil {
		t.Fatalf("no tuned amplifier: %s", topologies(st))
	}
	for _, tc := range []struct {
		name string
		want float64
	}{
		{"gain", 144.4},
		{"gain_anode", 201.8},
	} {
		f, ok := amp.Figures.Get(tc.name)
		if !ok || math.Abs(f.Value-tc.want) > 0.01*tc.want {
			t.Errorf("%s = %+v, want ngspice's %g within 1 %%", tc.name, f, tc.want)
		}
	}
}
